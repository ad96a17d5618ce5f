//! Link-time proof that the emitted solve paths cannot panic.
//!
//! Each public function of two example arms' emitted solvers (an elbow arm and an arm whose
//! wrist sits at the base, read backwards), in `f64` and in `f32`, is wrapped in a function
//! carrying the `no-panic` crate's `#[no_panic]` attribute: if the optimizer cannot remove
//! every path to a panic from a wrapped function, linking this binary fails with an error
//! naming it. The proof holds for release builds, where the solvers run in firmware.
//!
//! CI runs `cargo run --release -p armforge-no-panic-check`; the workspace builds this crate
//! in one codegen unit (`[profile.release.package.armforge-no-panic-check]`), since across
//! units the optimizer must assume a call can unwind. What made the solve paths fail before:
//! a bounds check in `free_joint_1`'s sort (now fixed loop bounds) and its `&dyn Fn`
//! argument (an indirect call may unwind; now a generic `impl Fn`).

use armforge_runtime::{Branch, Pose, Solution, Unreachable};
use no_panic::no_panic;

armforge_runtime::solver!(
    /// The bench elbow arm in `f64`.
    mod bench = "../../arms/bench-elbow-dh.toml";
);
armforge_runtime::solver!(
    /// The bench elbow arm in `f32`.
    mod bench_f32 = "../../arms/bench-elbow-dh.toml", scalar = f32;
);
armforge_runtime::solver!(
    /// The hotel loader (wrist at the base) in `f64`.
    mod hotel = "../../arms/hotel-loader-axes.toml";
);
armforge_runtime::solver!(
    /// The hotel loader in `f32`.
    mod hotel_f32 = "../../arms/hotel-loader-axes.toml", scalar = f32;
);

/// The `#[no_panic]` wrappers of one emitted module, in its scalar.
macro_rules! wrappers {
    ($module:ident, $scalar:ty, $forward:ident, $solve:ident, $branch:ident, $near:ident, $label:ident) => {
        #[no_panic]
        #[inline(never)]
        fn $forward(joints: &[$scalar; 6]) -> Pose<$scalar> {
            $module::forward(joints)
        }

        #[no_panic]
        #[inline(never)]
        fn $solve(target: &Pose<$scalar>) -> usize {
            $module::solve(target).len()
        }

        #[no_panic]
        #[inline(never)]
        fn $branch(
            target: &Pose<$scalar>,
            branch: Branch,
        ) -> Result<Solution<$scalar>, Unreachable<$scalar>> {
            $module::solve_branch(target, branch)
        }

        #[no_panic]
        #[inline(never)]
        fn $near(
            target: &Pose<$scalar>,
            current: &[$scalar; 6],
        ) -> Result<Solution<$scalar>, Unreachable<$scalar>> {
            $module::solve_near(target, current)
        }

        #[no_panic]
        #[inline(never)]
        fn $label(joints: &[$scalar; 6]) -> Branch {
            $module::branch_of(joints)
        }
    };
}

wrappers!(
    bench,
    f64,
    forward_bench,
    solve_bench,
    branch_bench,
    near_bench,
    label_bench
);
wrappers!(
    bench_f32,
    f32,
    forward_bench_f32,
    solve_bench_f32,
    branch_bench_f32,
    near_bench_f32,
    label_bench_f32
);
wrappers!(
    hotel,
    f64,
    forward_hotel,
    solve_hotel,
    branch_hotel,
    near_hotel,
    label_hotel
);
wrappers!(
    hotel_f32,
    f32,
    forward_hotel_f32,
    solve_hotel_f32,
    branch_hotel_f32,
    near_hotel_f32,
    label_hotel_f32
);

/// Calls every wrapper once (inputs through `black_box`, so nothing is folded away) and prints
/// how many solutions each solver found for the pose of a configuration of its own.
fn main() {
    use std::hint::black_box;
    let q = black_box([0.1, -0.4, 0.7, 0.2, 0.5, -0.3]);
    let q32 = q.map(|x| x as f32);
    let b = bench_f32::branch_of(&q32);
    let counts = [
        solve_bench(&forward_bench(&q))
            + usize::from(branch_bench(&forward_bench(&q), label_bench(&q)).is_ok())
            + usize::from(near_bench(&forward_bench(&q), &q).is_ok()),
        solve_bench_f32(&forward_bench_f32(&q32))
            + usize::from(
                branch_bench_f32(&forward_bench_f32(&q32), label_bench_f32(&q32)).is_ok(),
            )
            + usize::from(near_bench_f32(&forward_bench_f32(&q32), &q32).is_ok()),
        solve_hotel(&forward_hotel(&q))
            + usize::from(branch_hotel(&forward_hotel(&q), label_hotel(&q)).is_ok())
            + usize::from(near_hotel(&forward_hotel(&q), &q).is_ok()),
        solve_hotel_f32(&forward_hotel_f32(&q32))
            + usize::from(
                branch_hotel_f32(&forward_hotel_f32(&q32), label_hotel_f32(&q32)).is_ok(),
            )
            + usize::from(near_hotel_f32(&forward_hotel_f32(&q32), &q32).is_ok()),
    ];
    let _ = b;
    println!("no panic path in any wrapped call; solutions + branch + near per solver: {counts:?}");
    // The footprint README reports: bytes of a solution set and of one solution.
    use core::mem::size_of;
    for (name, set, one) in [
        (
            "bench f64",
            size_of::<bench::Solutions>(),
            size_of::<Solution<f64>>(),
        ),
        (
            "bench f32",
            size_of::<bench_f32::Solutions>(),
            size_of::<Solution<f32>>(),
        ),
        (
            "hotel f64",
            size_of::<hotel::Solutions>(),
            size_of::<Solution<f64>>(),
        ),
        (
            "hotel f32",
            size_of::<hotel_f32::Solutions>(),
            size_of::<Solution<f32>>(),
        ),
    ] {
        println!("{name}: solution set {set} bytes, one solution {one} bytes");
    }
}
