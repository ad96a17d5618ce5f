//! A `#![no_std]` crate without `alloc` that holds emitted solvers (`f64` and `f32`) next to decoy items named
//! like the ones the module uses (`Pose`, `Result`, `Option`, `core`, `f64` helpers), all under
//! `#![deny(warnings)]`: the emitted code must use absolute paths and compile cleanly.
//!
//! Built alone (`cargo build -p armforge-nostd-check --features standalone`, as CI does), the
//! runtime is compiled without its `std` feature, on `libm`, and the crate defines its own
//! `#[panic_handler]`: if anything in its dependency graph linked `std`, the build would fail
//! with "duplicate lang item `panic_impl`". (In a workspace build other crates turn `std` on,
//! so the feature stays off there.) `cargo clippy --workspace --all-targets -- -D warnings`
//! lints the emitted code here too.
#![no_std]
#![deny(warnings)]
#![allow(dead_code)]

/// Decoy: a user type named like the runtime's pose.
pub struct Pose;
/// Decoy: a user type named like the prelude's `Result`.
pub struct Result;
/// Decoy: a user type named like the prelude's `Option`.
pub struct Option;
/// Decoy: a user type named like the runtime's solution.
pub struct Solution;
/// Decoy: a user module named like `core`.
pub mod core {}
/// Decoy: a user module named like the runtime crate.
pub mod armforge_runtime {}

armforge_macros::solver!(
    /// The bench elbow arm's solver.
    pub mod bench_elbow = "../../arms/bench-elbow-dh.toml";
);

armforge_macros::solver!(
    /// The cylindrical centrifuge loader's solver.
    pub mod centrifuge_loader = "../../arms/centrifuge-loader-dh.toml";
);

armforge_macros::solver!(
    /// The bench elbow arm's solver in single precision, for a single-precision FPU.
    pub mod bench_elbow_f32 = "../../arms/bench-elbow-dh.toml", scalar = f32;
);

armforge_macros::solver!(
    /// The hotel loader's solver in single precision.
    pub mod hotel_loader_f32 = "../../arms/hotel-loader-axes.toml", scalar = f32;
);

armforge_macros::solver!(
    /// The hood corner's solver (general family, axes 1 and 2 meeting) in single precision.
    pub mod hood_corner_f32 = "../../arms/hood-corner-axes.toml", scalar = f32;
);

armforge_macros::solver!(
    /// The lid lifter's solver (three parallel axes).
    pub mod lid_lifter = "../../arms/lid-lifter-axes.toml";
);

armforge_macros::solver!(
    /// The shelf reacher's solver (a wrist at the base) in single precision.
    pub mod shelf_reacher_f32 = "../../arms/shelf-reacher-axes.toml", scalar = f32;
);

/// The panic handler of a firmware image: only a build without `std` may define one.
#[cfg(feature = "standalone")]
#[panic_handler]
fn halt(_: &::core::panic::PanicInfo) -> ! {
    loop {}
}

/// Uses the emitted module without `std`: the number of solutions of the zero pose.
pub fn solutions_at_zero() -> usize {
    let target = bench_elbow::forward(&[0.0; bench_elbow::JOINTS]);
    let lid = lid_lifter::forward(&[0.0; lid_lifter::JOINTS]);
    bench_elbow::solve(&target).len()
        + centrifuge_loader::solve(&target).len()
        + lid_lifter::solve(&lid).len()
}

/// The same in single precision: the number of solutions of the f32 solvers at zero.
pub fn solutions_at_zero_f32() -> usize {
    let target = bench_elbow_f32::forward(&[0.0; bench_elbow_f32::JOINTS]);
    let near = bench_elbow_f32::solve_near(&target, &[0.0; bench_elbow_f32::JOINTS]);
    let hotel = hotel_loader_f32::forward(&[0.0; hotel_loader_f32::JOINTS]);
    let hood = hood_corner_f32::forward(&[0.0; hood_corner_f32::JOINTS]);
    let shelf = shelf_reacher_f32::forward(&[0.0; shelf_reacher_f32::JOINTS]);
    bench_elbow_f32::solve(&target).len()
        + hotel_loader_f32::solve(&hotel).len()
        + hood_corner_f32::solve(&hood).len()
        + shelf_reacher_f32::solve(&shelf).len()
        + usize::from(near.is_ok())
}
