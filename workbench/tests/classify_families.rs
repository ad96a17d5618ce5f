//! Each family of joints 1–3 on several invented arms, with the evidence checked against
//! values worked out by hand from elementary geometry and against forward kinematics.

mod classify_support;

use std::f64::consts::{FRAC_PI_2, FRAC_PI_3, PI};

use armforge_compiler::classify::{
    classify, ArmEvidence, Family, Geometry, ReachOrigin, Singularity, Tolerances,
};
use armforge_compiler::model::Model;
use armforge_runtime::joint_motion;
use classify_support::arms::{
    cartesian_arm, cylindrical_arm, oblique_wrist_elbow, offset_tilted_elbow, plain_elbow,
    polar_arm,
};

fn ok(model: &Model) -> Geometry {
    match classify(model, &Tolerances::default()) {
        Ok(g) => g,
        Err(e) => panic!("expected a solvable arm, got: {e}"),
    }
}

fn close(a: f64, b: f64, what: &str) {
    assert!((a - b).abs() < 1e-12, "{what}: {a} vs {b}");
}

fn close3(a: [f64; 3], b: [f64; 3], what: &str) {
    for i in 0..3 {
        close(a[i], b[i], what);
    }
}

#[test]
fn plain_elbow_evidence() {
    let m = plain_elbow();
    let g = ok(&m);
    assert_eq!(g.family, Family::Elbow);
    close3(g.wrist_center, [0.4, 0.0, 0.75], "wrist center");
    // At most 8 solutions: 2 shoulder × 2 elbow × 2 wrist (Craig, Introduction to Robotics,
    // 3rd ed., 2005, §4; Siciliano, Sciavicco, Villani & Oriolo, Robotics: Modelling, Planning
    // and Control, 2009, §2.12).
    assert_eq!((g.solutions.position, g.solutions.wrist), (4, 2));
    assert_eq!(g.solutions.total, 8);
    let ArmEvidence::Elbow(e) = &g.arm else {
        panic!("elbow evidence expected")
    };
    assert!(e.shoulder.axes_1_2_meet);
    close(e.shoulder.offset, 0.0, "shoulder offset");
    close(e.shoulder.angle_1_2, FRAC_PI_2, "angle 1–2");
    close3(e.shoulder.point, [0.0, 0.0, 0.4], "shoulder point");
    close(e.shoulder.sideways_offset, 0.0, "sideways offset");
    close(e.upper_arm, 0.35, "upper arm");
    close(e.forearm, 0.4, "forearm");
    // Turning the forearm (+x) about +y by −90° points it up (+z), along the upper arm.
    close(e.stretched_at, -FRAC_PI_2, "stretched");
    close(e.folded_at, FRAC_PI_2, "folded");
    // Triangle inequality / law of cosines: |0.35 − 0.4| to 0.35 + 0.4 (hand-worked).
    let reach = g.reach.expect("elbow has a reach");
    assert_eq!(reach.from, ReachOrigin::ShoulderPoint);
    close(reach.min, 0.05, "reach min");
    close(reach.max, 0.75, "reach max");
    // Roll–pitch–roll wrist at 90° twists: every orientation; aligned at joint 5 = 0 and π.
    close(
        g.wrist.as_ref().expect("spherical wrist").angle_4_5,
        FRAC_PI_2,
        "angle 4–5",
    );
    close(
        g.wrist.as_ref().expect("spherical wrist").angle_5_6,
        FRAC_PI_2,
        "angle 5–6",
    );
    assert!(
        g.wrist
            .as_ref()
            .expect("spherical wrist")
            .reaches_every_orientation
    );
    let Singularity::WristAligned { joint_5_at } = &g.singularities[0] else {
        panic!("wrist aligned expected: {:?}", g.singularities)
    };
    assert_eq!(joint_5_at.len(), 2);
    close(joint_5_at[0], 0.0, "aligned at 0");
    close(joint_5_at[1].abs(), PI, "aligned at π");
    assert!(g
        .singularities
        .contains(&Singularity::WristCenterOnAxis1 { reachable: None }));
}

#[test]
fn offset_tilted_elbow_evidence() {
    let g = ok(&offset_tilted_elbow());
    assert_eq!(g.family, Family::Elbow);
    let ArmEvidence::Elbow(e) = &g.arm else {
        panic!("elbow evidence expected")
    };
    assert!(!e.shoulder.axes_1_2_meet);
    close(e.shoulder.offset, 0.1, "shoulder offset");
    close(e.shoulder.angle_1_2, FRAC_PI_3, "angle 1–2");
    close3(e.shoulder.point, [0.1, 0.0, 0.4], "shoulder point");
    close(e.upper_arm, 0.3, "upper arm");
    close(e.forearm, 0.35, "forearm");
    close(e.shoulder.sideways_offset, 0.05, "sideways offset");
    let reach = g.reach.expect("reach");
    close(reach.min, 0.05f64.hypot(0.05), "reach min");
    close(reach.max, 0.65f64.hypot(0.05), "reach max");
    // Axes 1 and 2 are not perpendicular: joint 1 is free at one point of axis 1.
    assert!(g.singularities.iter().any(|s| matches!(
        s,
        Singularity::Shoulder {
            perpendicular: false,
            free_point: Some(_),
            ..
        }
    )));
}

/// Forward kinematics check of the reach: turn joints 2 and 3 over a fine grid and measure
/// the wrist center's distance from the shoulder point (which joints 2 and 3 do not move).
#[test]
fn elbow_reach_agrees_with_forward_kinematics() {
    for m in [plain_elbow(), offset_tilted_elbow()] {
        let g = ok(&m);
        let ArmEvidence::Elbow(e) = &g.arm else {
            panic!("elbow")
        };
        let s = nalgebra::Point3::from(e.shoulder.point);
        let (mut lo, mut hi) = (f64::INFINITY, 0.0f64);
        let steps = 2000;
        for k in 0..steps {
            let q3 = -PI + 2.0 * PI * k as f64 / steps as f64;
            let q2 = 0.7 * k as f64;
            let t =
                joint_motion(&m.joints[1].joint, q2).compose(&joint_motion(&m.joints[2].joint, q3));
            let c = nalgebra::Point3::from(t.transform_point(&g.wrist_center));
            let d = (c - s).norm();
            lo = lo.min(d);
            hi = hi.max(d);
        }
        let reach = g.reach.expect("reach");
        // The grid step is π/1000: the extremes are within (step²/2)·size of the sampled ones.
        assert!(
            lo >= reach.min - 1e-12 && lo - reach.min < 1e-5,
            "{lo} vs {}",
            reach.min
        );
        assert!(
            hi <= reach.max + 1e-12 && reach.max - hi < 1e-5,
            "{hi} vs {}",
            reach.max
        );
        // And the stretched configuration really is the farthest one.
        let t = joint_motion(&m.joints[2].joint, e.stretched_at);
        let c = nalgebra::Point3::from(t.transform_point(&g.wrist_center));
        assert!(((c - s).norm() - reach.max).abs() < 1e-12);
    }
}

/// A wrist with 60° and 45° twists: it never aligns and cannot reach every orientation; the
/// directions of axes 4 and 6 make from 15° to 105° (hand-worked: |60° − 45°| to 60° + 45°),
/// so their lines make from 15° to 90°.
#[test]
fn oblique_wrist() {
    // h6 at 45° from h5 in the plane of h5 and z.
    let b = std::f64::consts::FRAC_PI_4;
    let g = ok(&oblique_wrist_elbow());
    close(
        g.wrist.as_ref().expect("spherical wrist").angle_4_5,
        FRAC_PI_3,
        "angle 4–5",
    );
    close(
        g.wrist.as_ref().expect("spherical wrist").angle_5_6,
        b,
        "angle 5–6",
    );
    close(
        g.wrist
            .as_ref()
            .expect("spherical wrist")
            .axis_4_6_angle_range[0],
        PI / 12.0,
        "range min",
    );
    close(
        g.wrist
            .as_ref()
            .expect("spherical wrist")
            .axis_4_6_angle_range[1],
        FRAC_PI_2,
        "range max",
    );
    assert!(
        !g.wrist
            .as_ref()
            .expect("spherical wrist")
            .reaches_every_orientation
    );
    assert_eq!(g.singularities[0], Singularity::WristNeverAligned);
}

/// Equal 60° twists: axes 4 and 6 line up at one joint-5 value, found by turning axis 6 about
/// axis 5 and checking it lands on axis 4 (forward kinematics of joint 5 alone).
#[test]
fn equal_twist_wrist_aligns_where_forward_kinematics_says() {
    let c = [0.4, 0.0, 0.75];
    let h5 = [FRAC_PI_3.cos(), FRAC_PI_3.sin(), 0.0];
    // 60° from h5 towards z: h6 = cos 60° h5 + sin 60° z.
    let (c60, s60) = (FRAC_PI_3.cos(), FRAC_PI_3.sin());
    let h6 = [c60 * h5[0], c60 * h5[1], s60];
    let mut m = plain_elbow();
    m.joints[4].joint.axis = h5;
    m.joints[4].joint.point = c;
    m.joints[5].joint.axis = h6;
    m.joints[5].joint.point = c;
    let g = ok(&m);
    let Singularity::WristAligned { joint_5_at } = &g.singularities[0] else {
        panic!("aligned expected")
    };
    assert_eq!(joint_5_at.len(), 1);
    let turned = joint_motion(&m.joints[4].joint, joint_5_at[0]).rotate(&h6);
    close3(turned, [1.0, 0.0, 0.0], "axis 6 on axis 4");
}

#[test]
fn polar_evidence() {
    let g = ok(&polar_arm([0.0, 1.0, 0.0], [1.0, 0.0, 0.0]));
    assert_eq!(g.family, Family::Polar);
    assert_eq!(g.solutions.total, 8);
    let ArmEvidence::Polar(e) = &g.arm else {
        panic!("polar")
    };
    assert!(e.shoulder.axes_1_2_meet);
    close(
        e.shoulder.sideways_offset,
        0.05,
        "sideways offset along axis 2",
    );
    close(e.slide_angle_to_axis_2, FRAC_PI_2, "slide ⟂ axis 2");
    // The wrist center travels along x at height 0.05 above axis 2: nearest 0.05 at −0.1.
    close(e.closest_to_axis_2, 0.05, "closest");
    close(e.closest_at, -0.1, "closest at");
    // Within the stroke [0.2, 0.9]: |(0.3, 0.05)| to |(1.0, 0.05)| from axis 2.
    close(e.reach_from_axis_2[0], 0.3f64.hypot(0.05), "ρ min");
    close(e.reach_from_axis_2[1], 1.0f64.hypot(0.05), "ρ max");
    let reach = g.reach.expect("reach");
    close(reach.min, 0.3f64.hypot(0.05).hypot(0.05), "reach min");
}

#[test]
fn polar_with_tilted_axis_2() {
    // Axis 2 at 70° to axis 1 (in the y–z plane); the slide along x stays ⟂ axis 2.
    let t = 70f64.to_radians();
    let g = ok(&polar_arm([0.0, t.sin(), t.cos()], [1.0, 0.0, 0.0]));
    assert_eq!(g.family, Family::Polar);
    let ArmEvidence::Polar(e) = &g.arm else {
        panic!("polar")
    };
    close(e.shoulder.angle_1_2, t, "angle 1–2");
}

#[test]
fn cylindrical_evidence() {
    let g = ok(&cylindrical_arm([0.0, 0.0, 1.0], [1.0, 0.0, 0.0]));
    assert_eq!(g.family, Family::Cylindrical);
    assert_eq!(g.solutions.total, 4);
    let reach = g.reach.expect("reach");
    assert_eq!(reach.from, ReachOrigin::Axis1);
    // Distance from axis 1 is 0.2 + d3 for d3 in [0.1, 0.6].
    close(reach.min, 0.3, "reach min");
    close(reach.max, 0.8, "reach max");
    assert!(g.singularities.contains(&Singularity::WristCenterOnAxis1 {
        reachable: Some(false)
    }));
}

#[test]
fn cylindrical_with_tilted_slides() {
    let t = 10f64.to_radians();
    let g = ok(&cylindrical_arm([t.sin(), 0.0, t.cos()], [1.0, 0.0, 0.2]));
    assert_eq!(g.family, Family::Cylindrical);
    let ArmEvidence::Cylindrical(e) = &g.arm else {
        panic!("cylindrical")
    };
    close(e.slide_angles_to_axis_1[0], t, "slide 2 tilt");
}

#[test]
fn cartesian_evidence() {
    let g = ok(&cartesian_arm([
        [1.0, 0.0, 0.0],
        [0.0, 1.0, 0.0],
        [0.0, 0.0, 1.0],
    ]));
    assert_eq!(g.family, Family::Cartesian);
    assert_eq!(g.solutions.total, 2);
    assert!(g.reach.is_none());
    let ArmEvidence::Cartesian(e) = &g.arm else {
        panic!("cartesian")
    };
    close(e.independence, 1.0, "orthonormal slides");
    close(e.slide_3_out_of_plane, FRAC_PI_2, "out of plane");
}

#[test]
fn oblique_cartesian() {
    let g = ok(&cartesian_arm([
        [1.0, 0.0, 0.0],
        [1.0, 1.0, 0.0],
        [0.0, 1.0, 1.0],
    ]));
    assert_eq!(g.family, Family::Cartesian);
    let ArmEvidence::Cartesian(e) = &g.arm else {
        panic!("cartesian")
    };
    close(e.angles[0], std::f64::consts::FRAC_PI_4, "angle 1–2");
    // Slide 3 = (0, 1, 1)/√2 against the plane z = 0: 45° out of it.
    close(
        e.slide_3_out_of_plane,
        std::f64::consts::FRAC_PI_4,
        "out of plane",
    );
}

/// Kinematic decoupling (Pieper 1968; Craig, Introduction to Robotics, 3rd ed., 2005, §4):
/// joints 4, 5, 6 of an accepted arm never move the wrist center. Checked with the runtime's
/// forward kinematics (product of exponentials) at a spread of joint values.
#[test]
fn accepted_wrist_centers_stay_put_under_joints_4_to_6() {
    for (name, m) in classify_support::arms::solvable() {
        let g = ok(&m);
        if g.wrist.is_none() {
            // No spherical wrist (three parallel axes): nothing to hold still.
            continue;
        }
        for k in 0..50 {
            let q = [
                0.37 * k as f64,
                -1.3 + 0.11 * k as f64,
                2.9 - 0.23 * k as f64,
            ];
            let t = joint_motion(&m.joints[3].joint, q[0])
                .compose(&joint_motion(&m.joints[4].joint, q[1]))
                .compose(&joint_motion(&m.joints[5].joint, q[2]));
            let moved = t.transform_point(&g.wrist_center);
            for (a, b) in moved.iter().zip(g.wrist_center) {
                assert!((a - b).abs() < 1e-12, "{name}");
            }
        }
    }
    // And on the offset wrist (axis 6 20 mm beside the point where axes 4 and 5 cross),
    // turning joint 6 does move that point: decoupling fails there.
    let m = classify_support::arms::offset_wrist(0.02);
    let t = joint_motion(&m.joints[5].joint, 1.0);
    let c = [0.4, 0.0, 0.75];
    let moved = t.transform_point(&c);
    assert!(
        (moved[1] - c[1]).abs() > 1e-3,
        "axis 6 misses the point, so turning it moves it"
    );
}
