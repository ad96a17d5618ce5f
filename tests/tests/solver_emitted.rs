//! Emitted solver modules compiled as a user crate would (`#![deny(warnings)]`, decoy types
//! named like the runtime's next to them), run against the interpreter: the two back ends of
//! one plan must give bit-identical solutions.
//!
//! The modules under `generated/` are written by the generator's `solver_emit` test (which
//! fails when they are stale).
#![deny(warnings)]

macro_rules! emitted {
    ($name:ident, $file:literal) => {
        mod $name {
            // Decoys: the emitted code must use absolute paths and not pick these up.
            #[allow(dead_code)]
            struct Pose;
            #[allow(dead_code)]
            struct Joint;
            #[allow(dead_code)]
            type Result<T> = core::result::Result<T, ()>;
            #[allow(dead_code)]
            fn sqrt(_: f64) -> f64 {
                f64::NAN
            }

            include!($file);
        }
    };
}

emitted!(elbow_orthogonal, "generated/elbow_orthogonal.rs");
emitted!(elbow_twisted, "generated/elbow_twisted.rs");
emitted!(elbow_two_turns, "generated/elbow_two_turns.rs");
emitted!(polar, "generated/polar.rs");
emitted!(cylindrical, "generated/cylindrical.rs");
emitted!(cartesian, "generated/cartesian.rs");

use armforge_compiler::classify::Family;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::{Branch, Pose, Solution, SolutionSet, Unreachable};

/// The emitted module's API, so one test body serves every module.
struct Emitted<const CAP: usize> {
    forward: fn(&[f64; 6]) -> Pose,
    solve: fn(&Pose) -> SolutionSet<CAP>,
    solve_near: fn(&Pose, &[f64; 6]) -> Result<Solution, Unreachable>,
    solve_branch: fn(&Pose, Branch) -> Result<Solution, Unreachable>,
    branch_of: fn(&[f64; 6]) -> Branch,
}

fn compare<const CAP: usize>(m: Emitted<CAP>, family: Family, seed: u64, options: SampleOptions) {
    let (model, geometry) = sample_arm(family, seed, &options);
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(seed * 31 + 5);
    let samples = if std::env::var_os("ARMFORGE_HEAVY").is_some() {
        2000
    } else {
        100
    };
    for _ in 0..samples {
        let q = sample_configuration(&model, &mut rng);
        let target = model.forward(&q);
        // The emitted forward folds the arm's constants (other rounding than the generic
        // product of exponentials): equal to 1e-12.
        let (a, b) = ((m.forward)(&q), solver.forward(&q));
        for r in 0..3 {
            assert!(
                (a.translation[r] - b.translation[r]).abs() < 1e-12,
                "{a:?} {b:?}"
            );
            for c in 0..3 {
                assert!(
                    (a.rotation[r][c] - b.rotation[r][c]).abs() < 1e-12,
                    "{a:?} {b:?}"
                );
            }
        }
        let emitted = (m.solve)(&target);
        let interpreted = solver.solve(&target).expect("reachable by construction");
        assert_eq!(emitted.as_slice(), interpreted.as_slice());
        for s in emitted.iter() {
            assert_eq!((m.branch_of)(&s.joints), solver.branch_of(&s.joints));
            assert_eq!(
                (m.solve_branch)(&target, s.branch),
                solver.solve_branch(&target, s.branch)
            );
        }
        let current = rng_configuration(&model, &mut rng);
        assert_eq!(
            (m.solve_near)(&target, &current),
            solver.solve_near(&target, &current)
        );
    }
    let bad = Pose {
        rotation: [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, f64::NAN]],
        translation: [0.0; 3],
    };
    assert_eq!((m.solve)(&bad).reason(), solver.solve(&bad).err());
}

fn rng_configuration(model: &armforge_compiler::model::Model, rng: &mut SampleRng) -> [f64; 6] {
    sample_configuration(model, rng)
}

macro_rules! api {
    ($m:ident) => {
        Emitted {
            forward: $m::forward,
            solve: $m::solve,
            solve_near: $m::solve_near,
            solve_branch: $m::solve_branch,
            branch_of: $m::branch_of,
        }
    };
}

#[test]
fn emitted_modules_agree_with_the_interpreter_bit_for_bit() {
    let plain = SampleOptions::default();
    let dextrous = SampleOptions {
        orthogonal_wrist: true,
        shoulder_axes_meet: true,
        ..plain
    };
    let two_turns = SampleOptions {
        revolute_range: std::f64::consts::TAU,
        orthogonal_wrist: true,
        ..plain
    };
    compare(api!(elbow_orthogonal), Family::Elbow, 11, dextrous);
    compare(api!(elbow_twisted), Family::Elbow, 12, plain);
    compare(api!(elbow_two_turns), Family::Elbow, 13, two_turns);
    compare(api!(polar), Family::Polar, 14, plain);
    compare(api!(cylindrical), Family::Cylindrical, 15, plain);
    compare(api!(cartesian), Family::Cartesian, 16, plain);
}

#[test]
fn emitted_elbow_module_has_eight_solutions_with_plain_labels() {
    let mut rng = SampleRng::new(99);
    let (model, _) = sample_arm(
        Family::Elbow,
        11,
        &SampleOptions {
            orthogonal_wrist: true,
            shoulder_axes_meet: true,
            ..SampleOptions::default()
        },
    );
    for _ in 0..50 {
        let q = sample_configuration(&model, &mut rng);
        let set = elbow_orthogonal::solve(&elbow_orthogonal::forward(&q));
        assert_eq!(set.len(), 8);
        let mut labels: Vec<String> = set.iter().map(|s| s.branch.to_string()).collect();
        labels.sort();
        labels.dedup();
        assert_eq!(labels.len(), 8, "every branch once: {labels:?}");
    }
    assert_eq!(elbow_orthogonal::JOINTS, 6);
}
