//! Singular and unreachable targets: the wrist aligned, the wrist center on axis 1, targets at
//! the reach boundary; every reason for no solution; what the labels mean; `solve_near` and
//! `solve_branch`.

mod common;

use common::pose_error;

use std::f64::consts::TAU;

use armforge_compiler::classify::Family;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, upright_elbow_arm, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::{
    joint_motion, Elbow, Flags, Pose, PoseProblem, Shoulder, Solution, Unreachable,
};

fn sub(a: &[f64; 3], b: &[f64; 3]) -> [f64; 3] {
    [a[0] - b[0], a[1] - b[1], a[2] - b[2]]
}

fn dot(a: &[f64; 3], b: &[f64; 3]) -> f64 {
    a[0] * b[0] + a[1] * b[1] + a[2] * b[2]
}

fn cross(a: &[f64; 3], b: &[f64; 3]) -> [f64; 3] {
    [
        a[1] * b[2] - a[2] * b[1],
        a[2] * b[0] - a[0] * b[2],
        a[0] * b[1] - a[1] * b[0],
    ]
}

fn wrapped(d: f64) -> f64 {
    (d - TAU * (d / TAU).round()).abs()
}

fn no_nan(solutions: &[Solution]) {
    for s in solutions {
        assert!(s.joints.iter().all(|v| v.is_finite()), "NaN in {s:?}");
    }
}

fn reproduces(solver: &Solver, solutions: &[Solution], target: &Pose, tol: f64) {
    let reach = solver.plan().arm.scale;
    for s in solutions {
        let e = pose_error(&solver.forward(&s.joints), target, reach);
        assert!(e < tol, "solution {s:?} misses the pose by {e:e}");
    }
}

/// The joint value of joint 5 at which axes 4 and 6 line up (a wrist with h4 ⟂ h5 ⟂ h6).
fn aligned_joint5(solver: &Solver) -> f64 {
    let arm = &solver.plan().arm;
    let (h4, h5, h6) = (arm.joints[3].axis, arm.joints[4].axis, arm.joints[5].axis);
    let cross = [
        h6[1] * h4[2] - h6[2] * h4[1],
        h6[2] * h4[0] - h6[0] * h4[2],
        h6[0] * h4[1] - h6[1] * h4[0],
    ];
    let dot = |a: [f64; 3], b: [f64; 3]| a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    let model = dot(h5, cross).atan2(dot(h6, h4));
    arm.joints[4].joint_value(model)
}

#[test]
fn wrist_aligned_gives_flagged_representatives_and_keeps_joint_4_near() {
    let options = SampleOptions {
        orthogonal_wrist: true,
        shoulder_axes_meet: true,
        ..SampleOptions::default()
    };
    let mut checked = 0;
    for seed in 0..20 {
        let (model, geometry) = sample_arm(Family::Elbow, seed, &options);
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(seed + 500);
        let aligned = aligned_joint5(&solver);
        for delta in [0.0, 1e-12, -1e-12, 1e-9, -1e-7, 1e-5, -1e-3] {
            let mut q = sample_configuration(&model, &mut rng);
            q[4] = aligned + delta;
            let target = model.forward(&q);
            let solutions = solver.solve(&target).expect("reachable by construction");
            no_nan(&solutions);
            reproduces(&solver, &solutions, &target, 1e-8);
            assert_eq!(
                solutions.len(),
                8,
                "never a missing branch (delta {delta:e})"
            );
            // The original's arm posture is there, with joint 5 at its value; joints 4 and 6
            // may split the turn differently when the wrist is aligned.
            let posture = solutions.iter().find(|s| {
                (0..3).all(|i| wrapped(s.joints[i] - q[i]) < 1e-6)
                    && wrapped(s.joints[4] - q[4]) < 1e-6
            });
            let posture = posture.unwrap_or_else(|| panic!("posture of {q:?} missing"));
            if !posture.flags.contains(Flags::WRIST_ALIGNED) {
                // The original's branch is found.
                let branch = solver.branch_of(&q);
                assert!(solutions
                    .iter()
                    .any(|s| s.branch == branch
                        && (0..3).all(|i| wrapped(s.joints[i] - q[i]) < 1e-6)));
            }
            if delta.abs() >= 1e-7 {
                // Away from the singularity the split of joints 4 and 6 is well conditioned:
                // the original configuration itself is found.
                assert!(solutions
                    .iter()
                    .any(|s| (0..6).all(|i| wrapped(s.joints[i] - q[i]) < 1e-6)));
            }
            if delta == 0.0 {
                // The original's posture is aligned (the others turn the wrist elsewhere).
                assert!(posture.flags.contains(Flags::WRIST_ALIGNED));
                // solve_near keeps joint 4 at its current value.
                let near = solver.solve_near(&target, &q).unwrap();
                assert!(wrapped(near.joints[3] - q[3]) < 1e-12, "{near:?} vs {q:?}");
                reproduces(&solver, &[near], &target, 1e-8);
                // solve keeps joint 4 at zero joint value.
                assert!(solutions.iter().any(|s| s.joints[3].abs() < 1e-12));
            }
            checked += 1;
        }
    }
    assert_eq!(checked, 140);
}

/// A target whose wrist center is `offset` metres from axis 1 of the upright arm.
fn target_near_axis_1(offset: f64, height: f64, rotation: [[f64; 3]; 3], tool_x: f64) -> Pose {
    // The tool frame is the wrist frame shifted by 0.09 m along its own x axis.
    let c = [offset, 0.0, height];
    Pose {
        rotation,
        translation: [
            c[0] + rotation[0][0] * tool_x,
            c[1] + rotation[1][0] * tool_x,
            c[2] + rotation[2][0] * tool_x,
        ],
    }
}

#[test]
fn wrist_center_on_axis_1_is_flagged_and_keeps_every_branch() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(4);
    for offset in [0.0, 1e-12, 1e-9, 1e-6, 1e-3] {
        for _ in 0..10 {
            let rotation = rng.rotation();
            let target = target_near_axis_1(offset, 1.0, rotation, 0.09);
            let solutions = solver.solve(&target).expect("reachable");
            no_nan(&solutions);
            reproduces(&solver, &solutions, &target, 1e-8);
            assert_eq!(solutions.len(), 8, "offset {offset:e}: {solutions:#?}");
            if offset == 0.0 {
                assert!(solutions.iter().all(|s| s.flags.contains(Flags::ON_AXIS_1)));
                let current = [0.7, 0.1, 0.2, 0.3, 0.4, 0.5];
                let near = solver.solve_near(&target, &current).unwrap();
                assert!(
                    (near.joints[0] - 0.7).abs() < 1e-12,
                    "joint 1 kept: {near:?}"
                );
            }
        }
    }
}

/// The upright arm stretched (forearm in line with the upper arm) at joint values `q`, and
/// the world direction in which stretching further would move the wrist center.
fn stretched(solver: &Solver, q1: f64, q2: f64) -> ([f64; 6], [f64; 3]) {
    let plan = solver.plan();
    let arm = &plan.arm;
    // Stretched: ψ = 0, i.e. θ3 (model) = sense · φ0.
    let (sense, stretched) = match plan.rule.elbow {
        armforge_runtime::internal::ElbowRule::Bend {
            sense, stretched, ..
        } => (sense, stretched),
        _ => unreachable!(),
    };
    let q3 = arm.joints[2].joint_value(sense * stretched);
    let q = [q1, q2, q3, 0.3, 0.8, -0.4];
    let e1 = joint_motion(&arm.joints[0], q1);
    let e2 = joint_motion(&arm.joints[1], q2);
    let e3 = joint_motion(&arm.joints[2], q3);
    let w = e1.transform_point(&e2.transform_point(&e3.transform_point(&arm.wrist_center)));
    let p2 = e1.transform_point(&arm.joints[1].point);
    let h2 = e1.rotate(&arm.joints[1].axis);
    let r = [w[0] - p2[0], w[1] - p2[1], w[2] - p2[2]];
    let along = r[0] * h2[0] + r[1] * h2[1] + r[2] * h2[2];
    let radial = [
        r[0] - along * h2[0],
        r[1] - along * h2[1],
        r[2] - along * h2[2],
    ];
    let n = (radial[0].powi(2) + radial[1].powi(2) + radial[2].powi(2)).sqrt();
    (q, [radial[0] / n, radial[1] / n, radial[2] / n])
}

fn shifted(pose: &Pose, d: [f64; 3], by: f64) -> Pose {
    let mut p = *pose;
    for (t, k) in p.translation.iter_mut().zip(d) {
        *t += k * by;
    }
    p
}

#[test]
fn reach_boundary_returns_the_double_root_once_and_reports_beyond() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let solver = Solver::new(&model, &geometry);
    let (q, radial) = stretched(&solver, 0.4, 0.3);
    let target = model.forward(&q);
    let tol = solver.plan().settings.length_tolerance;
    // Inside by 1e-12 … 1e-6: both elbows, distinct, the original's branch among them.
    for inside in [1e-12, 1e-9, 1e-6] {
        let t = shifted(&target, radial, -inside);
        let s = solver.solve(&t).unwrap();
        no_nan(&s);
        reproduces(&solver, &s, &t, 1e-8);
        let want = solver.branch_of(&q);
        assert!(s.iter().any(|x| x.branch.shoulder == want.shoulder));
    }
    // Exactly at the boundary and beyond by less than the tolerance: the double root once.
    let shoulder = solver.branch_of(&q).shoulder;
    for outside in [0.0, 1e-12, 0.5 * tol] {
        let t = shifted(&target, radial, outside);
        let s = solver.solve(&t).unwrap();
        no_nan(&s);
        reproduces(&solver, &s, &t, 1e-8);
        // The back posture reaches other distances (shoulder offset): only the original's
        // shoulder side is at its boundary.
        let s: Vec<Solution> = s
            .into_iter()
            .filter(|x| x.branch.shoulder == shoulder)
            .collect();
        assert!(s.iter().all(|x| x.flags.contains(Flags::AT_REACH_LIMIT)));
        for (i, a) in s.iter().enumerate() {
            for b in &s[i + 1..] {
                assert!((0..6).any(|k| wrapped(a.joints[k] - b.joints[k]) > 1e-9));
            }
        }
        assert_eq!(
            s.len(),
            2,
            "one elbow, two wrists: the double root once: {s:#?}"
        );
    }
    // Beyond by 1e-6: unreachable, by that much.
    let t = shifted(&target, radial, 1e-6);
    match solver.solve(&t) {
        Err(Unreachable::BeyondReach { by }) => assert!((by - 1e-6).abs() < 1e-12, "{by:e}"),
        other => panic!("expected beyond reach, got {other:?}"),
    }
}

#[test]
fn far_targets_are_beyond_reach_by_the_distance_to_move_back() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let solver = Solver::new(&model, &geometry);
    let (q, radial) = stretched(&solver, -1.1, 0.7);
    let target = shifted(&model.forward(&q), radial, 0.25);
    match solver.solve(&target) {
        Err(Unreachable::BeyondReach { by }) => {
            assert!((by - 0.25).abs() < 1e-9, "{by}");
            let back = shifted(&target, radial, -by - 1e-9);
            assert!(solver.solve(&back).is_ok());
        }
        other => panic!("expected beyond reach, got {other:?}"),
    }
}

#[test]
fn inner_holes_are_reported() {
    // Lateral offset 0.1 m: the wrist center cannot come closer than 0.1 m to axis 1.
    let (model, geometry) = upright_elbow_arm(0.12, 0.1);
    let solver = Solver::new(&model, &geometry);
    let target = target_near_axis_1(0.02, 1.0, Pose::IDENTITY.rotation, 0.09);
    match solver.solve(&target) {
        Err(Unreachable::InsideHole { by }) => assert!((by - 0.08).abs() < 1e-9, "{by}"),
        other => panic!("expected the shoulder hole, got {other:?}"),
    }
    // Upper arm 0.4 m, forearm √(0.075² + 0.38²) m: nothing closer to axis 2 than the
    // difference. Without a shoulder offset, put the wrist center where axes 1 and 2 meet.
    let (model, geometry) = upright_elbow_arm(0.0, 0.0);
    let solver = Solver::new(&model, &geometry);
    let forearm = (0.075f64.powi(2) + 0.38f64.powi(2)).sqrt();
    let hole = (forearm - 0.4f64).abs();
    let on_axis_2 = Pose {
        rotation: Pose::IDENTITY.rotation,
        translation: [0.09, 0.0, 0.45],
    };
    match solver.solve(&on_axis_2) {
        Err(Unreachable::InsideHole { by }) => assert!((by - hole).abs() < 1e-9, "{by} vs {hole}"),
        other => panic!("expected the elbow's hole, got {other:?}"),
    }
}

#[test]
fn orientations_a_twisted_wrist_cannot_reach_are_reported() {
    // Axis 5 at 45° from axis 4 and from axis 6: axis 6 can only point within 90° of axis 4.
    let (mut model, geometry) = upright_elbow_arm(0.12, 0.0);
    let k = std::f64::consts::FRAC_1_SQRT_2;
    model.joints[4].joint.axis = [k, k, 0.0];
    model.joints[5].joint.axis = [0.0, 1.0, 0.0];
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(8);
    let q = [0.3, 0.2, -0.4, 0.1, 0.2, 0.3];
    let reachable = model.forward(&q);
    let mut wrist_misses = 0;
    for _ in 0..200 {
        // The same wrist center, another orientation.
        let mut t = reachable;
        t.rotation = rng.rotation();
        let c_tool = {
            let m = &model.tool;
            let d = [
                geometry.wrist_center[0] - m.translation[0],
                geometry.wrist_center[1] - m.translation[1],
                geometry.wrist_center[2] - m.translation[2],
            ];
            [
                m.rotation[0][0] * d[0] + m.rotation[1][0] * d[1] + m.rotation[2][0] * d[2],
                m.rotation[0][1] * d[0] + m.rotation[1][1] * d[1] + m.rotation[2][1] * d[2],
                m.rotation[0][2] * d[0] + m.rotation[1][2] * d[1] + m.rotation[2][2] * d[2],
            ]
        };
        let world_center = reachable.transform_point(&c_tool);
        let turned = t.rotate(&c_tool);
        t.translation = [
            world_center[0] - turned[0],
            world_center[1] - turned[1],
            world_center[2] - turned[2],
        ];
        match solver.solve(&t) {
            Ok(s) => reproduces(&solver, &s, &t, 1e-9),
            Err(Unreachable::WristOrientation { by }) => {
                // Angle between axis 6's requested direction and axis 4 (after joints 1–3) must
                // lie in [|45° − 45°|, 45° + 45°]; the miss is at most 90°.
                assert!(
                    by > 0.0 && by <= std::f64::consts::FRAC_PI_2 + 1e-12,
                    "{by}"
                );
                wrist_misses += 1;
            }
            Err(other) => panic!("unexpected {other}"),
        }
    }
    assert!(
        wrist_misses > 0,
        "a wrist with twists ≠ 90° misses some orientations"
    );
}

#[test]
fn limits_drop_solutions_and_name_the_joint() {
    let (mut model, geometry) = upright_elbow_arm(0.12, 0.0);
    model.joints[0].joint.limits = [0.1, 0.2];
    let solver = Solver::new(&model, &geometry);
    let q = [0.15, 0.2, -0.3, 0.1, 0.5, 0.2];
    let target = model.forward(&q);
    let s = solver.solve(&target).unwrap();
    assert!(!s.is_empty() && s.len() < 8);
    assert!(s.iter().all(|x| x.joints[0] >= 0.1 && x.joints[0] <= 0.2));
    let (unlimited, _) = upright_elbow_arm(0.12, 0.0);
    let away = unlimited.forward(&[1.2, 0.2, -0.3, 0.1, 0.5, 0.2]);
    // Ignoring the limits, the configurations are there, each with joint 1 in violation.
    let all = solver.solve_ignoring_limits(&away).unwrap();
    let free = Solver::new(&unlimited, &geometry).solve(&away).unwrap();
    assert_eq!(all.len(), free.len());
    assert!(all
        .iter()
        .all(|(_, v)| v.iter().any(|x| x.joint == 0 && x.by > 0.0)));
    assert!(all
        .iter()
        .any(|(s, v)| (s.joints[0] - 1.2).abs() < 1e-9 && (v[0].by - 1.0).abs() < 1e-9));
    match solver.solve(&away) {
        Err(Unreachable::OutsideLimits { joint, by }) => {
            assert_eq!(joint, 0);
            assert!(
                (by - 1.0).abs() < 1e-9,
                "joint 1 needs 1.2, limit 0.2: {by}"
            );
        }
        other => panic!("expected outside limits, got {other:?}"),
    }
}

#[test]
fn invalid_poses_are_rejected_with_the_problem() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let solver = Solver::new(&model, &geometry);
    let good = model.forward(&[0.1, 0.2, 0.3, 0.4, 0.5, 0.6]);
    let mut nan = good;
    nan.translation[1] = f64::NAN;
    assert_eq!(
        solver.solve(&nan),
        Err(Unreachable::InvalidPose(PoseProblem::NotFinite))
    );
    let mut inf = good;
    inf.rotation[0][0] = f64::INFINITY;
    assert_eq!(
        solver.solve(&inf),
        Err(Unreachable::InvalidPose(PoseProblem::NotFinite))
    );
    let mut skew = good;
    skew.rotation[1][2] += 1e-5;
    assert!(matches!(
        solver.solve(&skew),
        Err(Unreachable::InvalidPose(PoseProblem::NotOrthonormal { .. }))
    ));
    let mut slightly = good;
    slightly.rotation[1][2] += 1e-9;
    assert!(solver.solve(&slightly).is_ok(), "within 1e-6 is accepted");
    let mut mirror = good;
    for r in 0..3 {
        mirror.rotation[r][2] = -mirror.rotation[r][2];
    }
    assert_eq!(
        solver.solve(&mirror),
        Err(Unreachable::InvalidPose(PoseProblem::Reflection))
    );
}

#[test]
fn labels_mean_what_they_say_on_an_upright_arm() {
    // Shoulder facing: the wrist center lies ahead of axis 1 in the direction the shoulder
    // offset points; elbow up: the elbow lies above the line from shoulder to wrist center.
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let solver = Solver::new(&model, &geometry);
    let arm = &solver.plan().arm;
    let mut rng = SampleRng::new(21);
    let mut seen = std::collections::BTreeSet::new();
    let mut level = 0;
    for _ in 0..200 {
        let q = sample_configuration(&model, &mut rng);
        for s in solver.solve(&model.forward(&q)).unwrap() {
            let e1 = joint_motion(&arm.joints[0], s.joints[0]);
            let e2 = joint_motion(&arm.joints[1], s.joints[1]);
            let e3 = joint_motion(&arm.joints[2], s.joints[2]);
            let shoulder = e1.transform_point(&arm.joints[1].point);
            let elbow = e1.transform_point(&e2.transform_point(&arm.joints[2].point));
            let wrist =
                e1.transform_point(&e2.transform_point(&e3.transform_point(&arm.wrist_center)));
            let forward = e1.rotate(&[1.0, 0.0, 0.0]);
            let ahead = forward[0] * wrist[0] + forward[1] * wrist[1];
            assert_eq!(ahead > 0.0, s.branch.shoulder == Shoulder::Facing, "{s:?}");
            // Up: seen from the side with the reaching direction to the right and axis 1 up,
            // the elbow lies left of the directed line from shoulder to wrist center.
            let reach = if s.branch.shoulder == Shoulder::Facing {
                forward
            } else {
                [-forward[0], -forward[1], -forward[2]]
            };
            let d = sub(&wrist, &shoulder);
            let e = sub(&elbow, &shoulder);
            let side = dot(&cross(&d, &e), &cross(&reach, &[0.0, 0.0, 1.0]));
            assert_eq!(side > 0.0, s.branch.elbow == Elbow::Up, "{s:?}");
            // Where the line runs ahead within 45° of level, that is "above the line".
            if dot(&d, &reach) > d[2].abs() {
                let t = dot(&d, &e) / dot(&d, &d);
                let above = e[2] - t * d[2];
                assert_eq!(above > 0.0, s.branch.elbow == Elbow::Up, "{s:?}");
                level += 1;
            }
            seen.insert(s.branch);
        }
    }
    assert_eq!(seen.len(), 8);
    assert!(level > 100);
}

#[test]
fn solve_near_and_solve_branch_pick_one_configuration() {
    let (model, geometry) = sample_arm(Family::Elbow, 5, &SampleOptions::default());
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(3);
    for _ in 0..100 {
        let q = sample_configuration(&model, &mut rng);
        let target = model.forward(&q);
        let mut current = q;
        for v in current.iter_mut() {
            *v += rng.range(-1e-3, 1e-3);
        }
        let near = solver.solve_near(&target, &current).unwrap();
        assert!(
            (0..6).all(|i| wrapped(near.joints[i] - q[i]) < 1e-6),
            "{near:?} vs {q:?}"
        );
        let branch = solver.branch_of(&q);
        let held = solver.solve_branch(&target, branch).unwrap();
        assert_eq!(held.branch, branch);
        assert!((0..6).all(|i| wrapped(held.joints[i] - q[i]) < 1e-6));
    }
}
