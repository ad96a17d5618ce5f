//! The base-slide family (P R R, axes 2 and 3 skew, spherical wrist, a quartic in the slide):
//! round trips on random arms, the count of solutions (at most 4 positions × 2 wrists, and 4
//! positions on some poses: Pieper 1968), and the label pairs.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::context::Context;
use armforge_compiler::classify::{classify, Tolerances};
use armforge_compiler::family::base_slide::BASE_SLIDE;
use armforge_compiler::family::{Family, FamilyModule, Recognition};
use armforge_compiler::model::Model;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, sample_count, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::internal;

#[test]
fn base_slide_arms_round_trip_with_at_most_eight_solutions() {
    let (mut eight, mut poses, mut most) = (0, 0, 0);
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::BaseSlide, seed, &SampleOptions::default());
        assert_eq!(geometry.family, Family::BaseSlide);
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(7100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            // Pieper 1968: a quartic, so at most 4 positions, each with 2 wrist solutions.
            let n = check_round_trip(&solver, &model, &q, 8, &format!("base-slide arm {seed}"));
            most = most.max(n);
            if n == 8 {
                eight += 1;
            }
        }
    }
    eprintln!("base-slide: {eight} of {poses} poses with 8 solutions (4 positions), most {most}");
    assert!(eight > 0, "no pose reached 4 positions");
}

/// The example arm: a carriage on a rail along the bench reaches trays with the carriage at
/// four places on some poses (4 positions × 2 wrists).
#[test]
fn the_bench_rail_picker_reaches_four_positions() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/../arms/bench-rail-picker-axes.toml"
    );
    let model = armforge_compiler::pipeline::load_model(std::path::Path::new(path), "arm")
        .unwrap_or_else(|d| panic!("{d}"));
    let solver = Solver::for_model(&model).unwrap_or_else(|r| panic!("{r}"));
    assert_eq!(solver.plan().arm.family, Family::BaseSlide);
    let mut rng = SampleRng::new(31);
    let (mut eight, mut poses) = (0, 0);
    for _ in 0..sample_count(300) {
        let q = sample_configuration(&model, &mut rng);
        poses += 1;
        if check_round_trip(&solver, &model, &q, 8, "bench-rail-picker") == 8 {
            eight += 1;
        }
    }
    eprintln!("bench-rail-picker: {eight} of {poses} poses with 8 solutions");
    assert!(eight > 0, "no pose reached 4 positions");
}

/// How often the two geometric labels (the side of the plane ⟂ the slide, the Jacobian's
/// sign) already separate the roots, read by the plan's rule rather than by solving: on poses
/// with 4 positions, the share whose 4 roots have 4 different labels.
#[test]
fn the_side_and_the_aspect_separate_most_roots() {
    let (mut separated, mut four) = (0, 0);
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::BaseSlide, seed, &SampleOptions::default());
        let solver = Solver::new(&model, &geometry);
        let plan = solver.plan();
        let mut rng = SampleRng::new(7200 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let solutions = solver.solve(&model.forward(&q)).unwrap_or_default();
            if solutions.len() != 8 || solutions.iter().any(|s| !s.flags.is_empty()) {
                continue;
            }
            four += 1;
            let mut labels: Vec<_> = solutions
                .iter()
                .map(|s| {
                    let b = internal::branch_of(&plan.rule, &plan.arm.joints, &s.joints);
                    (b.shoulder, b.elbow)
                })
                .collect();
            labels.sort_by_key(|l| format!("{l:?}"));
            labels.dedup();
            if labels.len() == 4 {
                separated += 1;
            }
        }
    }
    eprintln!(
        "base-slide: the geometric labels separate the 4 roots on {separated} of {four} poses"
    );
    assert!(four > 0);
    assert!(separated * 10 >= four * 8, "{separated} of {four}");
}

/// The rejection of `model`, by the family's own recognition: its kind and message, and
/// whether it is degenerate (rather than not built).
fn family_verdict(model: &Model) -> (String, String, bool) {
    let ctx = Context::new(model, &Tolerances::default()).expect("six joints");
    match BASE_SLIDE.recognise(&ctx) {
        Recognition::Degenerate(r) => (r.reason.kind().to_string(), r.to_string(), true),
        Recognition::NotMine(Some(r)) => (r.reason.kind().to_string(), r.to_string(), false),
        _ => panic!("recognised"),
    }
}

fn arm(seed: u64) -> Model {
    sample_arm(Family::BaseSlide, seed, &SampleOptions::default()).0
}

/// The wrist center on axis 3: joint 3 does not move it (degenerate).
#[test]
fn the_wrist_center_on_axis_3_is_rejected() {
    let mut model = arm(3);
    let c = model.joints[3].joint.point;
    model.joints[2].joint.point = c;
    let (kind, message, degenerate) = family_verdict(&model);
    assert_eq!(kind, "base_slide_wrist_center_on_axis_3", "{message}");
    assert!(degenerate && message.contains("degenerate"), "{message}");
    assert!(classify(&model, &Tolerances::default()).is_err());
}

/// Axes 2 and 3 parallel: a lift then two parallel hinges (not built); with the slide ⟂ them
/// nothing changes the height along them (degenerate).
#[test]
fn parallel_axes_2_and_3_are_not_built_or_degenerate() {
    let mut model = arm(4);
    model.joints[2].joint.axis = model.joints[1].joint.axis;
    let (kind, message, degenerate) = family_verdict(&model);
    assert_eq!(kind, "base_slide_parallel_hinges", "{message}");
    assert!(
        !degenerate && message.contains("law of cosines"),
        "{message}"
    );
    assert!(classify(&model, &Tolerances::default()).is_err());
    let h = model.joints[1].joint.axis;
    let e1 = armforge_compiler::plan::vec3::num::any_perpendicular(&h);
    model.joints[0].joint.axis = e1;
    let (kind, message, degenerate) = family_verdict(&model);
    assert_eq!(kind, "base_slide_no_height", "{message}");
    assert!(degenerate && message.contains("one plane"), "{message}");
}

/// Axes 2 and 3 meeting: `Δ = 0`, a quadratic then a trigonometric-linear equation (not
/// built).
#[test]
fn meeting_axes_2_and_3_are_not_built() {
    let mut model = arm(5);
    model.joints[2].joint.point = model.joints[1].joint.point;
    let (kind, message, degenerate) = family_verdict(&model);
    assert_eq!(kind, "base_slide_axes_2_3_meet", "{message}");
    assert!(!degenerate && message.contains("meeting"), "{message}");
    assert!(classify(&model, &Tolerances::default()).is_err());
}

/// Near-singular bands: configurations at `ε` from one where two roots merge (the position
/// Jacobian `det[e1, h2 × (w − p2), h3' × (w − p3')]` vanishes, found by bisection along a
/// random joint direction between two configurations of opposite sign) still round trip.
#[test]
fn poses_near_merging_roots_round_trip() {
    let (mut bands, mut checked) = (0, 0);
    for seed in 0..arms() / 4 {
        let (model, geometry) = sample_arm(Family::BaseSlide, seed, &SampleOptions::default());
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(7300 + seed);
        let a = sample_configuration(&model, &mut rng);
        let b = sample_configuration(&model, &mut rng);
        let det = |q: &[f64; 6]| aspect(&model, q);
        if det(&a) * det(&b) >= 0.0 {
            continue;
        }
        let at = |t: f64| {
            let mut q = a;
            for i in 0..6 {
                q[i] = a[i] + t * (b[i] - a[i]);
            }
            q
        };
        let (mut lo, mut hi) = (0.0, 1.0);
        for _ in 0..60 {
            let mid = 0.5 * (lo + hi);
            if det(&at(mid)) * det(&a) > 0.0 {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        bands += 1;
        for eps in [1e-3, 1e-5, 1e-7] {
            for t in [lo - eps, hi + eps] {
                let q = at(t);
                let target = model.forward(&q);
                let solutions = solver.solve(&target).unwrap_or_default();
                let reach = solver.plan().arm.scale;
                for s in &solutions {
                    let e = common::pose_error(&solver.forward(&s.joints), &target, reach);
                    assert!(e < 1e-9, "arm {seed}, ε {eps}: {s:?} misses by {e:e}");
                }
                // The original is found to within what the merging roots' conditioning
                // allows (about √(ε_machine / ε)).
                let near = solutions
                    .iter()
                    .map(|s| common::joint_gap(&model, &s.joints, &q))
                    .fold(f64::INFINITY, f64::min);
                assert!(
                    near < 1e-4,
                    "arm {seed}, ε {eps}: nearest solution {near:e} away"
                );
                checked += 1;
            }
        }
    }
    eprintln!("base-slide: {bands} merge points, {checked} poses near them");
    assert!(bands > 0);
}

/// The sign of the position Jacobian's determinant at `q` with nalgebra, the columns by
/// definition (the slide's direction; `h × (w − p)` for a revolute joint, axis and point
/// carried by the joints before it: Murray, Li & Sastry 1994, §3.4, from memory).
fn aspect(model: &Model, q: &[f64; 6]) -> f64 {
    use nalgebra::{Matrix3, Rotation3, Unit, Vector3};
    let j = |i: usize| &model.joints[i].joint;
    let m = |i: usize| j(i).model_value(q[i]);
    let e1 = Vector3::from(j(0).axis);
    let r2 = Rotation3::from_axis_angle(&Unit::new_normalize(Vector3::from(j(1).axis)), m(1));
    let r3 = Rotation3::from_axis_angle(&Unit::new_normalize(Vector3::from(j(2).axis)), m(2));
    let p2 = Vector3::from(j(1).point);
    let p3 = Vector3::from(j(2).point);
    let c = Vector3::from(j(3).point);
    // Joint 1 slides everything alike: leave it out; w = E2 E3 c.
    let e3c = p3 + r3 * (c - p3);
    let w = p2 + r2 * (e3c - p2);
    let h2 = Vector3::from(j(1).axis);
    let h3 = r2 * Vector3::from(j(2).axis);
    let p3m = p2 + r2 * (p3 - p2);
    Matrix3::from_columns(&[e1, h2.cross(&(w - p2)), h3.cross(&(w - p3m))]).determinant()
}
