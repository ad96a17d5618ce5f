//! Classification must not depend on where the arm stands or how its frames were written:
//! the same arm moved rigidly at random, re-described (axis points slid along their axes, axis
//! directions flipped with their joint's sign) or given another base pose classifies the same,
//! with the same evidence within 1e-9 (metres, radians).

mod classify_support;

use armforge_compiler::classify::{classify, Tolerances};
use armforge_runtime::Pose;
use classify_support::{
    arms, assert_same_numbers, invariant_numbers, moved, redescribed, rng, Motion,
};

const SAMPLES: usize = 25;

#[test]
fn rigid_motion_keeps_class_and_evidence() {
    let mut rng = rng(0x5eed_0001);
    for (name, model) in arms::solvable() {
        let g = classify(&model, &Tolerances::default()).expect(name);
        let numbers = invariant_numbers(&model, &g);
        for _ in 0..SAMPLES {
            let m = Motion::random(&mut rng);
            let model2 = moved(&model, &m);
            let g2 = classify(&model2, &Tolerances::default())
                .unwrap_or_else(|e| panic!("{name} moved: {e}"));
            assert_eq!(g.family, g2.family, "{name}");
            assert_same_numbers(&numbers, &invariant_numbers(&model2, &g2), 1e-9);
            // The wrist center moves with the arm.
            let expected = m.point(g.wrist_center);
            for (got, want) in g2.wrist_center.iter().zip(expected) {
                assert!((got - want).abs() < 1e-9, "{name}");
            }
        }
    }
}

#[test]
fn redescription_keeps_class_and_evidence() {
    let mut rng = rng(0x5eed_0002);
    for (name, model) in arms::solvable() {
        let g = classify(&model, &Tolerances::default()).expect(name);
        let numbers = invariant_numbers(&model, &g);
        for _ in 0..SAMPLES {
            let model2 = redescribed(&model, &mut rng);
            let g2 = classify(&model2, &Tolerances::default())
                .unwrap_or_else(|e| panic!("{name} re-described: {e}"));
            assert_eq!(g.family, g2.family, "{name}");
            assert_same_numbers(&numbers, &invariant_numbers(&model2, &g2), 1e-9);
            for i in 0..3 {
                assert!(
                    (g2.wrist_center[i] - g.wrist_center[i]).abs() < 1e-9,
                    "{name}"
                );
            }
        }
    }
}

#[test]
fn base_pose_alone_changes_nothing() {
    for (name, model) in arms::solvable() {
        let g = classify(&model, &Tolerances::default()).expect(name);
        let mut wall = model.clone();
        // Mounted on a wall: base z along the world x, 1.5 m up.
        wall.base = Pose {
            rotation: [[0.0, 0.0, 1.0], [0.0, 1.0, 0.0], [-1.0, 0.0, 0.0]],
            translation: [0.0, 0.0, 1.5],
        };
        assert_eq!(
            classify(&wall, &Tolerances::default()).expect(name),
            g,
            "{name}"
        );
    }
}

#[test]
fn rejections_do_not_move_either() {
    let mut rng = rng(0x5eed_0003);
    let rejected = [
        ("offset wrist", arms::offset_wrist(0.02)),
        ("degenerate wrist", arms::degenerate_wrist()),
        ("slide first", arms::slide_first()),
        ("general 6R", arms::general_six_revolute()),
    ];
    for (name, model) in rejected {
        let e = classify(&model, &Tolerances::default()).expect_err(name);
        for _ in 0..SAMPLES {
            let model2 = moved(&model, &Motion::random(&mut rng));
            let e2 = classify(&model2, &Tolerances::default()).expect_err(name);
            assert_eq!(e.reason.kind(), e2.reason.kind(), "{name}");
            assert_eq!(e.notes, e2.notes, "{name}");
            assert_eq!(e.joint, e2.joint, "{name}");
            let (a, b) = (e.reason.measures(), e2.reason.measures());
            for ((ka, qa), (_, qb)) in a.iter().zip(&b) {
                let diff = match (qa, qb) {
                    (
                        armforge_compiler::classify::reject::Quantity::Length(x),
                        armforge_compiler::classify::reject::Quantity::Length(y),
                    )
                    | (
                        armforge_compiler::classify::reject::Quantity::Angle(x),
                        armforge_compiler::classify::reject::Quantity::Angle(y),
                    ) => (x - y).abs(),
                    _ => 0.0,
                };
                assert!(diff < 1e-9, "{name} {ka}: {qa:?} vs {qb:?}");
            }
        }
    }
}

/// The starting description `armforge new` writes, in its three conventions (standard DH,
/// modified DH, joint axes), is one arm: it classifies the same with the same evidence.
#[test]
fn three_conventions_classify_the_same() {
    use armforge_compiler::description::load_str;
    use armforge_workbench::scaffold::{starting_description, Convention};
    let mut reference: Option<(armforge_compiler::classify::Family, Vec<(String, f64)>)> = None;
    for convention in Convention::ALL {
        let text = starting_description("starter", convention);
        let model = load_str(&text, "starter.toml").expect("the starting description loads");
        let g = classify(&model, &Tolerances::default())
            .unwrap_or_else(|e| panic!("{convention:?}: {e}"));
        let numbers = invariant_numbers(&model, &g);
        match &reference {
            None => reference = Some((g.family, numbers)),
            Some((family, expected)) => {
                assert_eq!(*family, g.family, "{convention:?}");
                assert_same_numbers(expected, &numbers, 1e-9);
            }
        }
    }
}

/// The solver's random sample arms (random lengths, offsets, twists, mountings, joint
/// directions and offsets of every family, built by their own generator) classify as they were
/// built: `sample_arm` asks the classifier and panics on any disagreement in family or wrist
/// center. Each sample is also moved at random and must keep its evidence.
#[test]
fn solver_sample_arms_classify_as_built() {
    use armforge_compiler::plan::samples::{sample_arm, SampleOptions};
    let mut rng = rng(0x5eed_0005);
    let families = [
        armforge_compiler::classify::Family::Elbow,
        armforge_compiler::classify::Family::Polar,
        armforge_compiler::classify::Family::Cylindrical,
        armforge_compiler::classify::Family::Cartesian,
    ];
    let options = [
        SampleOptions::default(),
        SampleOptions {
            orthogonal_wrist: true,
            shoulder_axes_meet: true,
            ..SampleOptions::default()
        },
    ];
    for family in families {
        for option in &options {
            for seed in 0..60 {
                let (model, g) = sample_arm(family, seed, option);
                let moved_model = moved(&model, &Motion::random(&mut rng));
                let g2 = classify(&moved_model, &Tolerances::default())
                    .unwrap_or_else(|e| panic!("{family:?} {seed} moved: {e}"));
                assert_same_numbers(
                    &invariant_numbers(&model, &g),
                    &invariant_numbers(&moved_model, &g2),
                    1e-9,
                );
            }
        }
    }
}
