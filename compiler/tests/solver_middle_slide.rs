//! The middle-slide family (R P R, joint 2 a slide, spherical wrist): round trips on random
//! arms of both layouts (the slide tilted to axis 1: a quartic; the slide ⟂ axis 1: a
//! trigonometric-linear equation and a quadratic), the count of solutions (at most 4
//! positions × 2 wrists, and 4 positions on some poses: a quartic has at most 4 real roots,
//! Pieper 1968), the example arm, and degenerate arms rejected with their reason.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, Tolerances};
use armforge_compiler::family::middle_slide::plan::{constants, Layout};
use armforge_compiler::family::Family;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, sample_count, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// Round trips on `arms()` random arms of one layout (even seeds level, odd tilted), 10 poses
/// each; returns (poses with 8 solutions, poses, most solutions).
fn round_trips(level: bool) -> (usize, usize, usize) {
    let (mut eight, mut poses, mut most) = (0, 0, 0);
    let what = if level { "level" } else { "tilted" };
    for i in 0..arms() {
        let seed = 2 * i + u64::from(!level);
        let (model, geometry) = sample_arm(Family::MiddleSlide, seed, &SampleOptions::default());
        assert_eq!(geometry.family, Family::MiddleSlide);
        let solver = Solver::new(&model, &geometry);
        let layout = constants(&solver.plan().arm).layout;
        assert_eq!(layout == Layout::Level, level, "arm {seed}");
        let mut rng = SampleRng::new(7100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            // Pieper 1968: at most 4 positions, each with 2 wrist solutions.
            let n = check_round_trip(&solver, &model, &q, 8, &format!("{what} arm {seed}"));
            most = most.max(n);
            if n == 8 {
                eight += 1;
            }
        }
    }
    eprintln!("middle slide, {what}: {eight} of {poses} poses with 8 solutions, most {most}");
    (eight, poses, most)
}

#[test]
fn tilted_slide_arms_round_trip_with_at_most_four_positions() {
    let (eight, _, most) = round_trips(false);
    assert!(most <= 8);
    assert!(eight > 0, "no pose reached 4 positions");
}

#[test]
fn level_slide_arms_round_trip_with_at_most_four_positions() {
    let (eight, _, most) = round_trips(true);
    assert!(most <= 8);
    assert!(eight > 0, "no pose reached 4 positions");
}

/// Near the merging of two roots (a reach boundary: the position Jacobian singular) the
/// round trip still holds: poses of configurations moved toward `det = 0` along joint 3.
#[test]
fn near_singular_bands_round_trip() {
    let mut checked = 0;
    for seed in 0..sample_count(60) as u64 {
        let (model, geometry) = sample_arm(Family::MiddleSlide, seed, &SampleOptions::default());
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(9100 + seed);
        let q0 = sample_configuration(&model, &mut rng);
        // Scan joint 3 for a sign change of the Jacobian label, then bisect toward it.
        let label = |q: &[f64; 6]| solver.branch_of(q).elbow;
        let mut a = q0;
        let mut b = q0;
        b[2] += 0.05;
        let mut found = false;
        for _ in 0..120 {
            if label(&a) != label(&b) {
                found = true;
                break;
            }
            a = b;
            b[2] += 0.05;
        }
        if !found {
            continue;
        }
        for _ in 0..30 {
            let mut m = a;
            m[2] = 0.5 * (a[2] + b[2]);
            if label(&m) == label(&a) {
                a = m;
            } else {
                b = m;
            }
        }
        for offset in [1e-3, 1e-5, 1e-7] {
            for q in [a, b] {
                let mut q = q;
                q[2] += offset * if q == a { -1.0 } else { 1.0 };
                let target = model.forward(&q);
                let solutions = solver.solve(&target).unwrap_or_default();
                let reach = solver.plan().arm.scale;
                for s in &solutions {
                    let e = common::pose_error(&solver.forward(&s.joints), &target, reach);
                    assert!(e < 1e-9, "arm {seed} near a merge: {s:?} misses by {e:e}");
                }
                assert!(solutions.len() <= 8);
                checked += 1;
            }
        }
    }
    eprintln!("middle slide: {checked} poses near merging roots");
    assert!(checked > 0);
}

/// A classified copy of the sample arm `seed` with its joints changed by `change`.
fn changed(seed: u64, change: impl Fn(&mut armforge_compiler::model::Model)) -> String {
    let (mut model, _) = sample_arm(Family::MiddleSlide, seed, &SampleOptions::default());
    change(&mut model);
    match classify(&model, &Tolerances::default()) {
        Ok(g) => format!("accepted as {:?}", g.family),
        Err(r) => r.to_string(),
    }
}

#[test]
fn degenerate_arms_are_rejected_with_their_reason() {
    // The wrist center on axis 3: axis 3 moved through the wrist center.
    let on_axis_3 = changed(1, |m| {
        let c = m.joints[3].joint.point;
        m.joints[2].joint.point = c;
    });
    assert!(
        on_axis_3.contains("joint 3 cannot move the wrist center"),
        "{on_axis_3}"
    );
    // A level slide with axis 3 ∥ axis 1: nothing changes the height.
    let height = changed(0, |m| {
        m.joints[2].joint.axis = m.joints[0].joint.axis;
    });
    assert!(height.contains("no joint changes"), "{height}");
    // The slide along axis 1 and axis 3 on axis 1.
    let one_line = changed(1, |m| {
        let j1 = m.joints[0].joint;
        m.joints[1].joint.axis = j1.axis;
        m.joints[2].joint.axis = j1.axis;
        m.joints[2].joint.point = j1.point;
    });
    assert!(one_line.contains("turn about one line"), "{one_line}");
}

#[test]
fn the_boom_swiveller_reaches_four_positions() {
    // The invented example arm of our lab: a level telescoping boom through a turning column.
    let path =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../arms/boom-swiveller-axes.toml");
    let model = armforge_compiler::pipeline::load_model(&path, "boom-swiveller")
        .unwrap_or_else(|e| panic!("{e}"));
    let solver = Solver::for_model(&model).unwrap_or_else(|r| panic!("{r}"));
    assert_eq!(solver.plan().arm.family, Family::MiddleSlide);
    let mut rng = SampleRng::new(31);
    let (mut eight, poses) = (0, sample_count(300));
    for _ in 0..poses {
        let q = sample_configuration(&model, &mut rng);
        if check_round_trip(&solver, &model, &q, 8, "boom-swiveller") == 8 {
            eight += 1;
        }
    }
    eprintln!("boom-swiveller: {eight} of {poses} poses with 8 solutions");
    // Two swivel angles × two boom lengths (within the stroke) on some poses.
    assert!(eight > 0);
}
