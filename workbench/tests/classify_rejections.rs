//! Every geometry no family fits is rejected with the property that fails, the joints by
//! number and name, the measured numbers in the file's units, and the offending joint's place
//! in the file; never a panic.

mod classify_support;

use armforge_compiler::classify::{
    classify, ArmEvidence, Family, Note, Reason, Rejection, Tolerances,
};
use armforge_compiler::model::Model;
use armforge_compiler::units::{AngleUnit, LengthUnit, Units};
use classify_support::arms;

fn reject(model: &Model) -> Rejection {
    match classify(model, &Tolerances::default()) {
        Ok(g) => panic!("expected a rejection, got {:?}", g.family),
        Err(e) => e,
    }
}

fn in_mm_deg(mut m: Model) -> Model {
    m.units = Units {
        length: LengthUnit::Millimetre,
        angle: AngleUnit::Degree,
    };
    m
}

#[test]
fn offset_wrist_names_the_pair_and_the_gap_in_file_units() {
    let e = reject(&in_mm_deg(arms::offset_wrist(0.02)));
    assert!(
        matches!(
            e.reason,
            Reason::WristAxesMiss {
                first: 4,
                second: 6,
                ..
            }
        ),
        "{e}"
    );
    let text = e.to_string();
    assert!(
        text.starts_with("error: test.toml:60:1: "),
        "located at joint 6's table: {text}"
    );
    assert!(
        text.contains("axes of joint 4 (\"j4\") and joint 6 (\"j6\") pass 20 mm apart"),
        "{text}"
    );
    assert!(text
        .contains("kinematic decoupling needs the axes of joints 4, 5 and 6 to meet in one point"));
}

#[test]
fn three_parallel_axes_with_axes_5_and_6_apart_make_an_offset_hand_arm() {
    // Pieper's criterion (Pieper 1968) covers three consecutive parallel axes whatever the
    // hand: axes 5 and 6 passing apart are the offset-hand family's.
    let g = classify(
        &in_mm_deg(arms::three_parallel_skew()),
        &Tolerances::default(),
    )
    .unwrap_or_else(|e| panic!("rejected: {e}"));
    assert_eq!(g.family, Family::OffsetHand);
    let ArmEvidence::OffsetHand(e) = &g.arm else {
        panic!("{:?}", g.arm);
    };
    // The gap: axis 6 moved 50 mm along x, across axis 5 (vertical) and itself (along y).
    assert!((e.gap_5_6 - 0.05).abs() < 1e-12, "{}", e.gap_5_6);
    assert_eq!(g.solutions.total, 8);
}

#[test]
fn three_axes_meeting_at_joints_2_to_4_make_a_mid_wrist_arm() {
    // Pieper's criterion (Pieper 1968) covers any three consecutive axes meeting in a point;
    // this arm's middle wrist has a 45° angle (it reaches fewer orientations, as such a wrist
    // at joints 4–6 does), and it is accepted all the same.
    let g = classify(
        &in_mm_deg(arms::middle_three_meet()),
        &Tolerances::default(),
    )
    .unwrap_or_else(|e| panic!("a mid-wrist arm: {e}"));
    assert_eq!(g.family, Family::MidWrist);
}

/// The geometric Jacobian (rows: angular, then linear velocity of the base origin's point)
/// of `model`'s six revolute joints at joint values `q`, every axis carried by the joints
/// before it.
fn jacobian(model: &Model, q: &[f64; 6]) -> nalgebra::Matrix6<f64> {
    let mut frame = armforge_runtime::Pose::IDENTITY;
    let mut j = nalgebra::Matrix6::zeros();
    for (i, joint) in model.joints.iter().enumerate() {
        let w = frame.rotate(&joint.joint.axis);
        let p = frame.transform_point(&joint.joint.point);
        let w = nalgebra::Vector3::from(w);
        let v = nalgebra::Vector3::from(p).cross(&w) * -1.0;
        j.fixed_view_mut::<3, 1>(0, i).copy_from(&w);
        j.fixed_view_mut::<3, 1>(3, i).copy_from(&v);
        frame = frame.compose(&armforge_runtime::joint_motion(&joint.joint, q[i]));
    }
    j
}

#[test]
fn three_parallel_last_axes_leave_the_arm_full_rank_and_are_solved_from_the_tool() {
    // Three parallel axes 4–6 cannot orient the tool by themselves, but the arm is not
    // degenerate: at generic joint values its geometric Jacobian (Murray, Li & Sastry 1994,
    // §3.4; the smallest singular value from nalgebra's SVD) has full rank 6, since joints 1–3
    // turn the tool too. Read from the tool it is a base-parallel arm whose axes 4 and 5 (here
    // 3 and 2) are parallel, which has a closed form (Pieper 1968): the tool-first family
    // solves it, and the pose of `q` comes back with `q` among its solutions.
    let model = arms::last_three_parallel();
    let q = [0.3, -0.5, 0.9, 0.4, -0.7, 1.1];
    let sv = jacobian(&model, &q).svd(false, false).singular_values;
    assert!(sv.min() > 1e-3 * sv.max(), "singular values {sv}");
    let model = in_mm_deg(model);
    let geometry = classify(&model, &Tolerances::default()).expect("solved from the tool");
    assert_eq!(geometry.family, Family::ToolFirst);
    let solver = armforge_compiler::solver::Solver::new(&model, &geometry);
    let solutions = solver.solve(&model.forward(&q)).expect("solved");
    let turns = std::f64::consts::TAU;
    let same = |a: f64, b: f64| ((a - b) - turns * ((a - b) / turns).round()).abs() < 1e-6;
    assert!(
        solutions
            .iter()
            .any(|s| s.joints.iter().zip(&q).all(|(&a, &b)| same(a, b))),
        "{q:?} not among {solutions:?}"
    );
}

#[test]
fn degenerate_wrist() {
    let e = reject(&in_mm_deg(arms::degenerate_wrist()));
    assert!(
        matches!(
            e.reason,
            Reason::WristAxesParallel {
                first: 4,
                second: 5,
                ..
            }
        ),
        "{e}"
    );
    assert_eq!(e.location.line, 50);
    let text = e.to_string();
    assert!(
        text.contains("are parallel (angle 0°, 100 mm apart)"),
        "{text}"
    );
    assert!(
        text.contains("cannot orient the tool by themselves"),
        "{text}"
    );
}

#[test]
fn first_three_meet_with_a_hand_of_no_family() {
    // Axes 1–3 meet; read from the tool, joints 6, 5, 4 are P R P: no family of joints 1–3
    // (P R R is the base-slide family's, P P R the carriage family's).
    let mut m = arms::first_three_meet();
    m.joints[5].joint.kind = armforge_runtime::JointKind::Prismatic;
    m.joints[3].joint.kind = armforge_runtime::JointKind::Prismatic;
    let e = reject(&m);
    assert_eq!(e.reason.kind(), "base_wrist_hand_unsolved", "{e}");
    assert!(
        e.to_string()
            .contains("meet in one point (a wrist at the base)"),
        "{e}"
    );
    assert!(e.to_string().contains("joint 7 − i"), "{e}");
}

#[test]
fn joint_count() {
    let e = reject(&arms::five_joints());
    assert_eq!(e.reason, Reason::JointCount { count: 5 });
    assert!(e.to_string().contains("the arm has 5 joints"), "{e}");
    assert_eq!(e.location.line, 50, "points at the last joint");
    let mut seven = arms::plain_elbow();
    seven.joints.push(seven.joints[5].clone());
    let e = reject(&seven);
    assert_eq!(e.reason, Reason::JointCount { count: 7 });
    assert_eq!(e.location.line, 60, "points at the seventh joint");
    let mut none = arms::plain_elbow();
    none.joints.clear();
    let e = reject(&none);
    assert_eq!((e.location.line, e.location.column), (1, 1));
}

#[test]
fn rrr_without_parallel_axes_2_and_3_meeting_at_the_shoulder_is_general() {
    // Axes 1 and 2 meet, axis 3 tilted 10°: Pieper's criterion (Pieper, 1968, PhD thesis,
    // Stanford University) holds through the spherical wrist, and the distance from the
    // meeting point fixes joint 3 (the general family's meeting sub-case).
    let g = classify(
        &in_mm_deg(arms::tilted_axis_3(10f64.to_radians())),
        &Tolerances::default(),
    )
    .expect("solvable");
    assert_eq!(g.family, armforge_compiler::classify::Family::General);
}

#[test]
fn rrr_with_axes_1_to_3_meeting_and_a_spherical_wrist_is_degenerate() {
    // Axis 3 through the point where axes 1 and 2 meet: no joint changes the wrist center's
    // distance from it.
    let mut m = arms::tilted_axis_3(10f64.to_radians());
    m.joints[2].joint.point = [0.0, 0.0, 0.4];
    let e = reject(&in_mm_deg(m));
    assert!(
        matches!(e.reason, Reason::GeneralAxes1To3Meet { distance } if distance < 1e-9),
        "{e}"
    );
    assert!(e.to_string().contains("cannot reach a volume"), "{e}");
}

#[test]
fn rrr_with_axes_1_and_2_on_one_line_is_degenerate() {
    let mut m = arms::tilted_axis_3(10f64.to_radians());
    m.joints[1].joint.axis = [0.0, 0.0, 1.0];
    m.joints[1].joint.point = [0.0, 0.0, 0.4];
    let e = reject(&in_mm_deg(m));
    assert!(
        matches!(e.reason, Reason::GeneralAxes1And2OneLine { .. }),
        "{e}"
    );
}

#[test]
fn unsupported_pattern() {
    // P R R with axes 2 and 3 parallel and ⟂ the slide: the base-slide family's degenerate
    // layout, in its own words.
    let e = reject(&arms::slide_first());
    assert!(
        e.to_string().contains("height along the parallel axes"),
        "{e}"
    );
    // P R P: joint 3 is where it leaves the patterns starting with P R (P R R).
    let mut m = arms::slide_first();
    m.joints[2].joint.kind = armforge_runtime::JointKind::Prismatic;
    m.joints[2].joint.limits = [0.0, 0.5];
    let e = reject(&m);
    assert_eq!(
        e.reason,
        Reason::UnsupportedPattern {
            pattern: "P R P".into()
        }
    );
    assert_eq!(e.joint, Some(3));
    // The message lists the registry's families of joints 1–3, each with its pattern.
    for family in [
        "elbow (R R R)",
        "cylindrical (R P P)",
        "cartesian (P P P)",
        "base-slide (P R R)",
    ] {
        assert!(e.to_string().contains(family), "{family}: {e}");
    }
    // Every pattern starting with R, and P P R, now has a family (R P R the middle-slide
    // family's, P P R the carriage family's): no pattern leaves at joint 3 any more.
}

#[test]
fn general_six_revolute_mentions_sixteen_solutions() {
    let e = reject(&arms::general_six_revolute());
    assert_eq!(e.notes, vec![Note::GeneralSixRevolute]);
    // At most 16 solutions for a general 6R arm (Raghavan & Roth 1990; from memory).
    assert!(e.to_string().contains("up to 16 solutions"));
}

#[test]
fn a_slide_not_perpendicular_to_axis_2_is_the_general_slide_family() {
    // The polar family needs the slide ⟂ axis 2; the general-slide family takes the rest.
    let g = classify(
        &in_mm_deg(arms::polar_arm([0.0, 1.0, 0.0], [1.0, 0.3, 0.0])),
        &Tolerances::default(),
    )
    .expect("recognised");
    assert_eq!(g.family, Family::GeneralSlide);
    let ArmEvidence::GeneralSlide(e) = g.arm else {
        panic!("{:?}", g.arm)
    };
    // The slide (1, 0.3, 0) makes atan(1/0.3) with y.
    assert!((e.slide_angle_to_axis_2 - (1.0f64 / 0.3).atan()).abs() < 1e-12);
}

#[test]
fn a_slide_across_parallel_axes_1_and_2_cannot_change_the_height() {
    // Axes 1 and 2 vertical and the slide level: every joint keeps the wrist center's height.
    let mut m = arms::polar_arm([0.0, 0.0, 1.0], [1.0, 0.3, 0.0]);
    m.joints[1].joint.point = [0.2, 0.0, 0.3];
    let e = reject(&in_mm_deg(m));
    assert_eq!(e.reason.kind(), "general_slide_no_height", "{e}");
    assert!(e.to_string().contains("makes 90° with them"), "{e}");
}

#[test]
fn cylindrical_slides_both_across_axis_1() {
    let e = reject(&arms::cylindrical_arm([0.0, 1.0, 0.0], [1.0, 0.0, 0.0]));
    assert!(matches!(
        e.reason,
        Reason::CylindricalSlidesPerpendicularToAxis1 { .. }
    ));
    let e = reject(&arms::cylindrical_arm([1.0, 0.0, 0.0], [-1.0, 0.0, 0.0]));
    assert!(matches!(e.reason, Reason::CylindricalSlidesParallel { .. }));
}

#[test]
fn cartesian_slides_in_one_plane() {
    let e = reject(&arms::cartesian_arm([
        [1.0, 0.0, 0.0],
        [0.0, 1.0, 0.0],
        [1.0, 1.0, 0.0],
    ]));
    assert!(matches!(
        e.reason,
        Reason::CartesianSlidesDependent {
            parallel_pair: None,
            ..
        }
    ));
    let e = reject(&arms::cartesian_arm([
        [1.0, 0.0, 0.0],
        [0.0, 1.0, 0.0],
        [0.0, -1.0, 0.0],
    ]));
    assert!(matches!(
        e.reason,
        Reason::CartesianSlidesDependent {
            parallel_pair: Some([2, 3]),
            ..
        }
    ));
}

#[test]
fn elbow_needs_a_forearm() {
    // Move the wrist onto axis 3: all three wrist axes through (0, 0, 0.75).
    let mut m = arms::plain_elbow();
    for j in 3..6 {
        m.joints[j].joint.point = [0.0, 0.0, 0.75];
    }
    let e = reject(&m);
    assert!(matches!(e.reason, Reason::WristCenterOnAxis3 { .. }), "{e}");
}

#[test]
fn a_sliding_wrist_joint() {
    let mut m = arms::plain_elbow();
    m.joints[4].joint.kind = armforge_runtime::JointKind::Prismatic;
    let e = reject(&m);
    assert_eq!(e.reason, Reason::WristJointNotRevolute { joint: 5 });
}

#[test]
fn bad_axes_are_bad_input_not_a_panic() {
    for bad in [
        [0.0, 0.0, 0.0],
        [f64::NAN, 0.0, 1.0],
        [f64::INFINITY, 0.0, 0.0],
    ] {
        let mut m = arms::plain_elbow();
        m.joints[2].joint.axis = bad;
        let e = reject(&m);
        assert_eq!(e.reason, Reason::InvalidAxis { joint: 3 });
        assert!(e.is_bad_input());
    }
}

/// An arm whose wrist axes miss by just over the tolerance is rejected; just under, accepted.
/// The miss is linear in the offset of axis 6, so it is scaled to land 1 % either side.
#[test]
fn tolerance_boundary() {
    let tol = Tolerances::default();
    let loose = Tolerances {
        distance: 1e-3,
        angle: tol.angle,
    };
    let unit = 1e-6;
    let g = classify(&arms::offset_wrist(unit), &loose).expect("loose tolerance accepts");
    let miss_per_metre = g.wrist.as_ref().expect("spherical wrist").miss / unit;
    let limit = tol.distance * g.resolved.arm_size;
    let under = classify(&arms::offset_wrist(0.99 * limit / miss_per_metre), &tol)
        .expect("just under the tolerance is accepted");
    assert!(under.wrist.as_ref().expect("spherical wrist").miss <= under.resolved.distance);
    assert!(under.wrist.as_ref().expect("spherical wrist").miss > 0.98 * under.resolved.distance);
    let over = classify(&arms::offset_wrist(1.01 * limit / miss_per_metre), &tol)
        .expect_err("just over the tolerance is rejected");
    let Reason::WristAxesMiss { miss, .. } = over.reason else {
        panic!("{over}")
    };
    assert!(miss > limit && miss < 1.02 * limit);
}

#[test]
fn overriding_the_tolerance_accepts_a_small_offset() {
    let m = arms::offset_wrist(1e-4);
    assert!(classify(&m, &Tolerances::default()).is_err());
    let generous = Tolerances {
        distance: 1e-3,
        ..Tolerances::default()
    };
    assert!(classify(&m, &generous).is_ok());
}

/// Whatever lines a file gives, classification answers (a geometry or a located rejection)
/// and never panics: random kinds, axes, points, joint counts and a few broken numbers.
#[test]
fn random_arms_never_panic() {
    use rand::Rng;
    let mut rng = classify_support::rng(0x5eed_0004);
    let specials = [0.0, f64::NAN, f64::INFINITY, -f64::INFINITY, 1e300, 1e-300];
    let mut solvable = 0;
    for _ in 0..3000 {
        let count = if rng.random_bool(0.5) {
            6
        } else {
            rng.random_range(0..9)
        };
        let pick = |rng: &mut rand::rngs::StdRng| -> f64 {
            if rng.random_bool(0.03) {
                specials[rng.random_range(0..specials.len())]
            } else if rng.random_bool(0.3) {
                // Axis-aligned values make parallel and meeting lines common.
                f64::from(rng.random_range(-1i32..=1))
            } else {
                rng.random_range(-1.0..1.0)
            }
        };
        let lines: Vec<classify_support::Line> = (0..count)
            .map(|_| {
                let axis = [pick(&mut rng), pick(&mut rng), pick(&mut rng)];
                let point = [pick(&mut rng), pick(&mut rng), pick(&mut rng)];
                let kind = if rng.random_bool(0.25) {
                    armforge_runtime::JointKind::Prismatic
                } else {
                    armforge_runtime::JointKind::Revolute
                };
                classify_support::Line {
                    kind,
                    axis,
                    point,
                    limits: [pick(&mut rng), pick(&mut rng)],
                }
            })
            .collect();
        let mut lines = lines;
        if count == 6 && rng.random_bool(0.7) {
            // Give it a spherical wrist, and often axis 3 parallel to axis 2.
            let c = [pick(&mut rng), pick(&mut rng), pick(&mut rng)];
            for line in &mut lines[3..] {
                line.kind = armforge_runtime::JointKind::Revolute;
                line.point = c;
            }
            if rng.random_bool(0.5) {
                lines[2].axis = lines[1].axis;
            }
        }
        let model = classify_support::arm(&lines, [pick(&mut rng), pick(&mut rng), 0.3]);
        match classify(&model, &Tolerances::default()) {
            Ok(g) => {
                solvable += 1;
                assert!(g.wrist_center.iter().all(|x| x.is_finite()));
                let report =
                    armforge_workbench::report::build(&model, &Tolerances::default(), &Ok(g));
                assert!(report.to_text().contains("family: "));
            }
            Err(e) => {
                assert!(e.to_string().starts_with("error: test.toml:"), "{e}");
            }
        }
    }
    // Enough of them are solvable that the report is exercised too.
    assert!(solvable > 100, "{solvable} of 3000 random arms solvable");
}
