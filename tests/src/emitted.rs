//! Every example arm's solver, emitted at compile time by `armforge_runtime::solver!` (the `macros` feature, re-exporting `armforge_macros::solver!`) from the
//! files in `arms/` — the same modules `armforge emit` writes (see `emitted_matches_cli`).
//!
//! [`EMITTED_ARMS`] puts each module's functions behind plain function pointers so that tests
//! and benchmarks can loop over the arms. The modules' own `#[cfg(test)]` round trips run
//! with this crate's unit tests.

use armforge_runtime::{Branch, Joint, Pose, Scalar, Solution, Unreachable, JOINTS};

/// One solution or why there is none, in the scalar `S`.
pub type OneSolution<S> = Result<Solution<S>, Unreachable<S>>;
/// Every solution or why there is none, in the scalar `S`.
pub type AllSolutions<S> = Result<Vec<Solution<S>>, Unreachable<S>>;

/// One emitted solver in the scalar `S`, behind function pointers (SI units).
#[derive(Clone, Copy)]
pub struct EmittedArm<S: Scalar = f64> {
    /// The description's path as written in the macro call (relative to `tests/`).
    pub path: &'static str,
    /// The module's `CAPACITY`.
    pub capacity: usize,
    /// `solve`, as a list or the reason.
    pub solve: fn(&Pose<S>) -> AllSolutions<S>,
    /// `solve`, counting the solutions (no heap: what a benchmark times).
    pub solve_count: fn(&Pose<S>) -> usize,
    /// The module's `JOINT_TABLE`.
    pub joints: &'static [Joint<S>; JOINTS],
    /// `solve_near`.
    pub solve_near: fn(&Pose<S>, &[S; JOINTS]) -> OneSolution<S>,
    /// `solve_branch`.
    pub solve_branch: fn(&Pose<S>, Branch) -> OneSolution<S>,
    /// `branch_of`.
    pub branch_of: fn(&[S; JOINTS]) -> Branch,
    /// `forward`.
    pub forward: fn(&[S; JOINTS]) -> Pose<S>,
}

impl<S: Scalar> EmittedArm<S> {
    /// The description file (absolute).
    pub fn file(&self) -> std::path::PathBuf {
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(self.path)
    }
}

impl EmittedArm {
    /// `count` random joint vectors inside the limits (clipped to ±10 rad or m), reproducible
    /// from `seed`: the configurations benchmarks pose the solver with.
    pub fn random_joints(&self, count: usize, seed: u64) -> Vec<[f64; JOINTS]> {
        use rand::{Rng, SeedableRng};
        let mut rng = rand::rngs::StdRng::seed_from_u64(seed);
        (0..count)
            .map(|_| {
                let mut q = [0.0; JOINTS];
                for (v, j) in q.iter_mut().zip(self.joints.iter()) {
                    let [lo, hi] = j.limits;
                    *v = rng.random_range(lo.max(-10.0)..hi.min(10.0));
                }
                q
            })
            .collect()
    }
}

macro_rules! emitted_arms {
    ($(#[$doc:meta])* $list:ident: $scalar:ident; $($name:ident = $path:tt;)*) => {
        $(
            armforge_runtime::solver!(
                #[allow(missing_docs)]
                pub mod $name = $path, scalar = $scalar;
            );
        )*

        $(#[$doc])*
        pub const $list: &[EmittedArm<$scalar>] = &[$(
            EmittedArm {
                path: $path,
                capacity: $name::CAPACITY,
                solve: |target| $name::solve(target).status().map(<[Solution<$scalar>]>::to_vec),
                solve_count: |target| $name::solve(target).len(),
                joints: &$name::JOINT_TABLE,
                solve_near: $name::solve_near,
                solve_branch: $name::solve_branch,
                branch_of: $name::branch_of,
                forward: $name::forward,
            },
        )*];
    };
}

emitted_arms! {
    /// Every example arm's emitted solver, in file-name order (arms added since at the end).
    EMITTED_ARMS: f64;
    bench_elbow = "../arms/bench-elbow-dh.toml";
    ceiling_transfer = "../arms/ceiling-transfer-axes.toml";
    centrifuge_loader = "../arms/centrifuge-loader-dh.toml";
    hood_corner = "../arms/hood-corner-axes.toml";
    hotel_loader = "../arms/hotel-loader-axes.toml";
    incubator_threader = "../arms/incubator-threader-axes.toml";
    lid_lifter = "../arms/lid-lifter-axes.toml";
    plate_turner = "../arms/plate-turner-axes.toml";
    rack_loader = "../arms/rack-loader-mdh.toml";
    reagent_rack_reacher = "../arms/reagent-rack-reacher-axes.toml";
    shelf_reacher = "../arms/shelf-reacher-axes.toml";
    tray_gantry = "../arms/tray-gantry-axes.toml";
    tray_tipper = "../arms/tray-tipper-axes.toml";
    // Out of file-name order: the round-trip tests seed each arm by its place here, and the
    // arms before it keep their samples.
    drawer_puller = "../arms/drawer-puller-axes.toml";
    bath_dipper = "../arms/bath-dipper-axes.toml";
    bench_rail_picker = "../arms/bench-rail-picker-axes.toml";
    boom_swiveller = "../arms/boom-swiveller-axes.toml";
    tray_telescope = "../arms/tray-telescope-axes.toml";
}

emitted_arms! {
    /// Every example arm's emitted solver in single precision (`scalar = f32`), in file-name
    /// order (arms added since at the end).
    EMITTED_ARMS_F32: f32;
    bench_elbow_f32 = "../arms/bench-elbow-dh.toml";
    ceiling_transfer_f32 = "../arms/ceiling-transfer-axes.toml";
    centrifuge_loader_f32 = "../arms/centrifuge-loader-dh.toml";
    hood_corner_f32 = "../arms/hood-corner-axes.toml";
    hotel_loader_f32 = "../arms/hotel-loader-axes.toml";
    incubator_threader_f32 = "../arms/incubator-threader-axes.toml";
    lid_lifter_f32 = "../arms/lid-lifter-axes.toml";
    plate_turner_f32 = "../arms/plate-turner-axes.toml";
    rack_loader_f32 = "../arms/rack-loader-mdh.toml";
    reagent_rack_reacher_f32 = "../arms/reagent-rack-reacher-axes.toml";
    shelf_reacher_f32 = "../arms/shelf-reacher-axes.toml";
    tray_gantry_f32 = "../arms/tray-gantry-axes.toml";
    tray_tipper_f32 = "../arms/tray-tipper-axes.toml";
    drawer_puller_f32 = "../arms/drawer-puller-axes.toml";
    bath_dipper_f32 = "../arms/bath-dipper-axes.toml";
    bench_rail_picker_f32 = "../arms/bench-rail-picker-axes.toml";
    boom_swiveller_f32 = "../arms/boom-swiveller-axes.toml";
    tray_telescope_f32 = "../arms/tray-telescope-axes.toml";
}

/// The bench arm (`arms/bench-elbow-dh.toml`) through the compiler: its plan and module, as
/// the benchmarks compare them.
pub fn bench_arm_generated() -> armforge_compiler::pipeline::Generated {
    let file = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../arms/bench-elbow-dh.toml");
    match armforge_compiler::pipeline::generate_module(
        &file,
        "../arms/bench-elbow-dh.toml",
        &armforge_compiler::classify::Tolerances::default(),
    ) {
        Ok(generated) => generated,
        Err(e) => panic!("the bench arm must generate: {e}"),
    }
}
