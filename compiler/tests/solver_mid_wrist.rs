//! A wrist in the middle (axes 2–4 meet): round trips on random arms whose axes 5 and 6 are
//! apart, meeting or parallel (the three layouts of the position chain), classified and
//! planned through the registry, and the family's rejections.
//!
//! Check values: Pieper (1968), three consecutive axes meeting: at most 4 placements of the
//! meeting point, each with 2 wrist solutions, so at most 8 solutions (from memory); random
//! poses of random arms reach 8.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::{classify, ArmEvidence, Family, Tolerances};
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// Poses with 8 solutions, by layout of axes 5 and 6 (apart, meeting, parallel), on random
/// arms built with `options`.
fn round_trips(options: SampleOptions) -> [usize; 3] {
    let mut full = [0; 3];
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::MidWrist, seed, &options);
        assert_eq!(geometry.solutions.total, 8, "arm {seed}");
        let ArmEvidence::MidWrist(e) = &geometry.arm else {
            panic!("arm {seed}: evidence {:?}", geometry.arm);
        };
        assert_eq!(
            e.wrist.reaches_every_orientation, options.orthogonal_wrist,
            "arm {seed}"
        );
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let mut rng = SampleRng::new(4000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("mid-wrist arm {seed}");
            if check_round_trip(&solver, &model, &q, 8, &what) == 8 {
                full[(seed % 3) as usize] += 1;
            }
        }
    }
    full
}

#[test]
fn random_arms_round_trip_in_every_layout() {
    let right_angled = SampleOptions {
        orthogonal_wrist: true,
        ..SampleOptions::default()
    };
    let full = round_trips(right_angled);
    eprintln!(
        "right-angled middle wrist, poses with 8 solutions (apart, meeting, parallel): {full:?}"
    );
    // Pieper 1968: 4 placements × 2 wrist solutions are reached at generic poses.
    assert!(full[0] > 0, "{full:?}");
    let full = round_trips(SampleOptions::default());
    eprintln!("middle wrist at any angles, poses with 8 solutions: {full:?}");
}

/// Axis 5 through the meeting point of axes 2–4: joint 5 cannot move it; rejected. (Axis 1
/// through it makes axes 1–3 meet as well: the wrist-at-base family rejects that arm.)
#[test]
fn axis_5_through_the_meeting_point_is_rejected() {
    let (mut model, geometry) = sample_arm(Family::MidWrist, 4, &SampleOptions::default());
    model.joints[4].joint.point = geometry.wrist_center;
    let r = classify(&model, &Tolerances::default()).expect_err("rejected");
    assert_eq!(r.reason.kind(), "mid_wrist_on_axis_5", "{r}");
    assert!(r.message.contains("joint 5"), "{r}");
}

/// A sliding joint 6: rejected with the joint named.
#[test]
fn a_sliding_joint_6_is_rejected() {
    let (mut model, _) = sample_arm(Family::MidWrist, 5, &SampleOptions::default());
    model.joints[5].joint.kind = armforge_runtime::JointKind::Prismatic;
    let r = classify(&model, &Tolerances::default()).expect_err("rejected");
    assert_eq!(r.reason.kind(), "mid_wrist_slide", "{r}");
}

/// Axes 3–5 meeting: the mirror of a mid-wrist arm, read from the tool by the tool-first
/// family through the mid-wrist family's target step. Round trips on random arms.
#[test]
fn arms_whose_axes_3_to_5_meet_round_trip_read_from_the_tool() {
    let options = SampleOptions {
        orthogonal_wrist: true,
        ..SampleOptions::default()
    };
    let mut full = 0;
    for seed in 0..arms() {
        let (inner, _) = sample_arm(Family::MidWrist, seed, &options);
        let mut model = armforge_compiler::family::mirror::mirrored_model(&inner);
        let mut rng = SampleRng::new(7100 + seed);
        model.tool = rng.pose(0.5);
        model.base = rng.pose(1.0);
        let geometry = classify(&model, &Tolerances::default())
            .unwrap_or_else(|r| panic!("arm {seed}: rejected: {r}"));
        assert_eq!(geometry.family, Family::ToolFirst, "arm {seed}");
        assert_eq!(geometry.solutions.total, 8, "arm {seed}");
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("axes 3–5 meeting, arm {seed}");
            if check_round_trip(&solver, &model, &q, 8, &what) == 8 {
                full += 1;
            }
        }
    }
    eprintln!("axes 3–5 meeting: {full} poses with 8 solutions");
    assert!(full > 0);
}
