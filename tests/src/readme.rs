//! The macro example of README.md ("In your crate, at compile time"), compiled here: the test
//! `tests/tests/readme.rs` checks that the README shows exactly the code between the markers
//! below, so the example always names an existing arm and always builds.

// README example begins
armforge_runtime::solver!(pub mod bench_elbow = "../arms/bench-elbow-dh.toml");

/// Prints every solution for a world tool pose (SI units), with its branch.
pub fn print_solutions(target: &armforge_runtime::Pose) {
    let solutions = bench_elbow::solve(target);
    for s in solutions.iter() {
        println!("{:?} {:?}", s.branch, s.joints);
    }
}
// README example ends
