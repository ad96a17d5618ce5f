//! Emitted solver modules compiled as a user crate would (`#![deny(warnings)]`, decoy types
//! named like the runtime's next to them), run against the interpreter: the two back ends of
//! one plan must give bit-identical solutions.
//!
//! The modules under `generated/` are the emitted modules of the sample arms in
//! `armforge_compiler::plan::samples::fixtures` (`generated_fresh.rs` fails when they are
//! stale).
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
emitted!(general, "generated/general.rs");
emitted!(general_meeting, "generated/general_meeting.rs");
emitted!(general_parallel, "generated/general_parallel.rs");
emitted!(three_parallel_layout, "generated/three_parallel_layout.rs");
emitted!(
    three_parallel_general,
    "generated/three_parallel_general.rs"
);
emitted!(offset_hand, "generated/offset_hand.rs");
emitted!(base_wrist_elbow, "generated/base_wrist_elbow.rs");
emitted!(base_wrist_polar, "generated/base_wrist_polar.rs");
emitted!(mid_wrist, "generated/mid_wrist.rs");
emitted!(tool_first_layout, "generated/tool_first_layout.rs");
emitted!(tool_first_general, "generated/tool_first_general.rs");
emitted!(base_parallel, "generated/base_parallel.rs");
emitted!(carriage, "generated/carriage.rs");
emitted!(general_slide, "generated/general_slide.rs");
emitted!(general_slide_meeting, "generated/general_slide_meeting.rs");
emitted!(
    general_slide_parallel,
    "generated/general_slide_parallel.rs"
);
emitted!(base_slide, "generated/base_slide.rs");
emitted!(middle_slide_level, "generated/middle_slide_level.rs");
emitted!(middle_slide_tilted, "generated/middle_slide_tilted.rs");

use armforge_compiler::plan::samples::{fixtures, sample_configuration, SampleRng};
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

/// Compares module `m` with the interpreter on the fixture arm named `name`; returns the name.
fn compare<const CAP: usize>(m: Emitted<CAP>, name: &'static str) -> &'static str {
    let fixture = fixtures()
        .into_iter()
        .find(|f| f.name == name)
        .unwrap_or_else(|| panic!("{name} is not in the fixture table"));
    let (model, geometry) = fixture.arm();
    let seed = fixture.seed;
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(seed * 31 + 5);
    let samples = armforge_compiler::plan::samples::sample_count(100);
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
    name
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
    let compared = [
        compare(api!(elbow_orthogonal), "elbow_orthogonal"),
        compare(api!(elbow_twisted), "elbow_twisted"),
        compare(api!(elbow_two_turns), "elbow_two_turns"),
        compare(api!(polar), "polar"),
        compare(api!(cylindrical), "cylindrical"),
        compare(api!(cartesian), "cartesian"),
        compare(api!(general), "general"),
        compare(api!(general_meeting), "general_meeting"),
        compare(api!(general_parallel), "general_parallel"),
        compare(api!(three_parallel_layout), "three_parallel_layout"),
        compare(api!(three_parallel_general), "three_parallel_general"),
        compare(api!(offset_hand), "offset_hand"),
        compare(api!(base_wrist_elbow), "base_wrist_elbow"),
        compare(api!(base_wrist_polar), "base_wrist_polar"),
        compare(api!(mid_wrist), "mid_wrist"),
        compare(api!(tool_first_layout), "tool_first_layout"),
        compare(api!(tool_first_general), "tool_first_general"),
        compare(api!(base_parallel), "base_parallel"),
        compare(api!(carriage), "carriage"),
        compare(api!(general_slide), "general_slide"),
        compare(api!(general_slide_meeting), "general_slide_meeting"),
        compare(api!(general_slide_parallel), "general_slide_parallel"),
        compare(api!(base_slide), "base_slide"),
        compare(api!(middle_slide_level), "middle_slide_level"),
        compare(api!(middle_slide_tilted), "middle_slide_tilted"),
    ];
    let table: Vec<&str> = fixtures().iter().map(|f| f.name).collect();
    assert_eq!(
        compared.as_slice(),
        table.as_slice(),
        "every fixture compiled and compared"
    );
}

#[test]
fn emitted_elbow_module_has_eight_solutions_with_plain_labels() {
    let mut rng = SampleRng::new(99);
    let (model, _) = fixtures()[0].arm();
    assert_eq!(fixtures()[0].name, "elbow_orthogonal");
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
