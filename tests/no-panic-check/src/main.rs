//! Link-time proof that the emitted solve paths cannot panic.
//!
//! Each public function of every example arm's emitted solver, in `f64` and in `f32`, is
//! wrapped in a function
//! carrying the `no-panic` crate's `#[no_panic]` attribute: if the optimizer cannot remove
//! every path to a panic from a wrapped function, linking this binary fails with an error
//! naming it. The proof holds for release builds, where the solvers run in firmware.
//!
//! The runtime is used without `std`, as firmware uses it: its math goes through the `libm`
//! crate. CI runs `cargo run --profile no-panic -p armforge-no-panic-check`; that profile links
//! in one codegen unit with fat LTO (root `Cargo.toml`), since across
//! units the optimizer must assume a call can unwind. What made the solve paths fail before:
//! a bounds check in `free_joint_1`'s sort (now fixed loop bounds) and its `&dyn Fn`
//! argument (an indirect call may unwind; now a generic `impl Fn`).

use armforge_runtime::{Branch, Pose, Solution, Unreachable};
use no_panic::no_panic;

/// For one example arm in one scalar: its emitted module and the `#[no_panic]` wrappers of
/// its public functions (named `forward`, `solve`, `solve_branch`, `solve_near`, `branch_of`
/// inside a module of the wrappers, so that the symbol table names them
/// `armforge_no_panic_check::ARM::checked::solve` and so on), plus `run`, which calls each once
/// and returns how many solutions and answers it got, and `sizes`, the bytes of a solution
/// set and of one solution.
macro_rules! checked_arm {
    ($module:ident = $path:literal, $scalar:ident) => {
        pub mod $module {
            use super::*;

            armforge_runtime::solver!(
                #[allow(dead_code)]
                pub mod arm = $path, scalar = $scalar;
            );

            /// The `#[no_panic]` wrappers.
            pub mod checked {
                use super::*;

                #[no_panic]
                #[inline(never)]
                pub fn forward(joints: &[$scalar; 6]) -> Pose<$scalar> {
                    arm::forward(joints)
                }

                #[no_panic]
                #[inline(never)]
                pub fn solve(target: &Pose<$scalar>) -> usize {
                    arm::solve(target).len()
                }

                #[no_panic]
                #[inline(never)]
                pub fn solve_branch(
                    target: &Pose<$scalar>,
                    branch: Branch,
                ) -> Result<Solution<$scalar>, Unreachable<$scalar>> {
                    arm::solve_branch(target, branch)
                }

                #[no_panic]
                #[inline(never)]
                pub fn solve_near(
                    target: &Pose<$scalar>,
                    current: &[$scalar; 6],
                ) -> Result<Solution<$scalar>, Unreachable<$scalar>> {
                    arm::solve_near(target, current)
                }

                #[no_panic]
                #[inline(never)]
                pub fn branch_of(joints: &[$scalar; 6]) -> Branch {
                    arm::branch_of(joints)
                }
            }

            /// Calls every wrapper once; solutions + branch + near found.
            pub fn run(q: [f64; 6]) -> usize {
                let q = std::hint::black_box(q.map(|x| x as $scalar));
                let pose = checked::forward(&q);
                checked::solve(&pose)
                    + usize::from(checked::solve_branch(&pose, checked::branch_of(&q)).is_ok())
                    + usize::from(checked::solve_near(&pose, &q).is_ok())
            }

            /// Bytes of a solution set and of one solution.
            pub fn sizes() -> (usize, usize) {
                (
                    core::mem::size_of::<arm::Solutions>(),
                    core::mem::size_of::<Solution<$scalar>>(),
                )
            }
        }
    };
}

checked_arm!(bench_f64 = "../../arms/bench-elbow-dh.toml", f64);
checked_arm!(bench_f32 = "../../arms/bench-elbow-dh.toml", f32);
checked_arm!(ceiling_f64 = "../../arms/ceiling-transfer-axes.toml", f64);
checked_arm!(ceiling_f32 = "../../arms/ceiling-transfer-axes.toml", f32);
checked_arm!(centrifuge_f64 = "../../arms/centrifuge-loader-dh.toml", f64);
checked_arm!(centrifuge_f32 = "../../arms/centrifuge-loader-dh.toml", f32);
checked_arm!(hotel_f64 = "../../arms/hotel-loader-axes.toml", f64);
checked_arm!(hotel_f32 = "../../arms/hotel-loader-axes.toml", f32);
checked_arm!(rack_f64 = "../../arms/rack-loader-mdh.toml", f64);
checked_arm!(rack_f32 = "../../arms/rack-loader-mdh.toml", f32);
checked_arm!(gantry_f64 = "../../arms/tray-gantry-axes.toml", f64);
checked_arm!(gantry_f32 = "../../arms/tray-gantry-axes.toml", f32);
checked_arm!(lid_f64 = "../../arms/lid-lifter-axes.toml", f64);
checked_arm!(lid_f32 = "../../arms/lid-lifter-axes.toml", f32);
checked_arm!(shelf_f64 = "../../arms/shelf-reacher-axes.toml", f64);
checked_arm!(shelf_f32 = "../../arms/shelf-reacher-axes.toml", f32);
checked_arm!(hood_f64 = "../../arms/hood-corner-axes.toml", f64);
checked_arm!(hood_f32 = "../../arms/hood-corner-axes.toml", f32);
checked_arm!(
    reagent_f64 = "../../arms/reagent-rack-reacher-axes.toml",
    f64
);
checked_arm!(
    reagent_f32 = "../../arms/reagent-rack-reacher-axes.toml",
    f32
);
checked_arm!(
    incubator_f64 = "../../arms/incubator-threader-axes.toml",
    f64
);
checked_arm!(
    incubator_f32 = "../../arms/incubator-threader-axes.toml",
    f32
);
checked_arm!(tipper_f64 = "../../arms/tray-tipper-axes.toml", f64);
checked_arm!(turner_f64 = "../../arms/plate-turner-axes.toml", f64);
checked_arm!(turner_f32 = "../../arms/plate-turner-axes.toml", f32);
checked_arm!(tipper_f32 = "../../arms/tray-tipper-axes.toml", f32);
checked_arm!(drawer_f64 = "../../arms/drawer-puller-axes.toml", f64);
checked_arm!(drawer_f32 = "../../arms/drawer-puller-axes.toml", f32);
checked_arm!(dipper_f64 = "../../arms/bath-dipper-axes.toml", f64);
checked_arm!(dipper_f32 = "../../arms/bath-dipper-axes.toml", f32);
checked_arm!(rail_f64 = "../../arms/bench-rail-picker-axes.toml", f64);
checked_arm!(rail_f32 = "../../arms/bench-rail-picker-axes.toml", f32);
checked_arm!(boom_f64 = "../../arms/boom-swiveller-axes.toml", f64);
checked_arm!(boom_f32 = "../../arms/boom-swiveller-axes.toml", f32);
checked_arm!(telescope_f64 = "../../arms/tray-telescope-axes.toml", f64);
checked_arm!(telescope_f32 = "../../arms/tray-telescope-axes.toml", f32);

/// One checked arm: its name, `run` and `sizes`.
type Checked = (&'static str, fn([f64; 6]) -> usize, fn() -> (usize, usize));

/// Calls every wrapper once (inputs through `black_box`, so nothing is folded away) and prints
/// how many solutions each solver found for the pose of a configuration of its own, then the
/// footprint README reports: bytes of a solution set and of one solution.
fn main() {
    let q = [0.1, -0.4, 0.7, 0.2, 0.5, -0.3];
    let arms: &[Checked] = &[
        ("bench f64", bench_f64::run, bench_f64::sizes),
        ("bench f32", bench_f32::run, bench_f32::sizes),
        ("ceiling f64", ceiling_f64::run, ceiling_f64::sizes),
        ("ceiling f32", ceiling_f32::run, ceiling_f32::sizes),
        ("centrifuge f64", centrifuge_f64::run, centrifuge_f64::sizes),
        ("centrifuge f32", centrifuge_f32::run, centrifuge_f32::sizes),
        ("hotel f64", hotel_f64::run, hotel_f64::sizes),
        ("hotel f32", hotel_f32::run, hotel_f32::sizes),
        ("rack f64", rack_f64::run, rack_f64::sizes),
        ("rack f32", rack_f32::run, rack_f32::sizes),
        ("gantry f64", gantry_f64::run, gantry_f64::sizes),
        ("gantry f32", gantry_f32::run, gantry_f32::sizes),
        ("lid f64", lid_f64::run, lid_f64::sizes),
        ("lid f32", lid_f32::run, lid_f32::sizes),
        ("shelf f64", shelf_f64::run, shelf_f64::sizes),
        ("shelf f32", shelf_f32::run, shelf_f32::sizes),
        ("hood f64", hood_f64::run, hood_f64::sizes),
        ("hood f32", hood_f32::run, hood_f32::sizes),
        ("reagent f64", reagent_f64::run, reagent_f64::sizes),
        ("reagent f32", reagent_f32::run, reagent_f32::sizes),
        ("incubator f64", incubator_f64::run, incubator_f64::sizes),
        ("incubator f32", incubator_f32::run, incubator_f32::sizes),
        ("tipper f64", tipper_f64::run, tipper_f64::sizes),
        ("tipper f32", tipper_f32::run, tipper_f32::sizes),
        ("turner f64", turner_f64::run, turner_f64::sizes),
        ("turner f32", turner_f32::run, turner_f32::sizes),
        ("drawer f64", drawer_f64::run, drawer_f64::sizes),
        ("drawer f32", drawer_f32::run, drawer_f32::sizes),
        ("dipper f64", dipper_f64::run, dipper_f64::sizes),
        ("dipper f32", dipper_f32::run, dipper_f32::sizes),
        ("rail f64", rail_f64::run, rail_f64::sizes),
        ("rail f32", rail_f32::run, rail_f32::sizes),
        ("boom f64", boom_f64::run, boom_f64::sizes),
        ("boom f32", boom_f32::run, boom_f32::sizes),
        ("telescope f64", telescope_f64::run, telescope_f64::sizes),
        ("telescope f32", telescope_f32::run, telescope_f32::sizes),
    ];
    let counts: Vec<usize> = arms.iter().map(|(_, run, _)| run(q)).collect();
    println!("no panic path in any wrapped call; solutions + branch + near per solver: {counts:?}");
    for (name, _, sizes) in arms {
        let (set, one) = sizes();
        println!("{name}: solution set {set} bytes, one solution {one} bytes");
    }
}
