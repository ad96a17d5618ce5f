//! Hand-checkable forward kinematics: textbook closed forms and values worked out by hand
//! from the example arms' tables, and files in mm/deg equal to their m/rad twins.

use std::f64::consts::{FRAC_PI_2, PI};

use armforge_compiler::description::load_str;
use armforge_compiler::pipeline::load_model;
use armforge_tests::{fixture, pose_difference_of, workspace_root, ReferenceArm};
use rand::rngs::StdRng;
use rand::SeedableRng;

const PLANAR_DH_M_RAD: &str = r#"
name = "planar"
convention = "dh"
[[joint]]
type = "revolute"
a = 0.7
[[joint]]
type = "revolute"
a = 0.4
"#;

const PLANAR_DH_MM_DEG: &str = r#"
name = "planar-mm"
length_unit = "mm"
angle_unit = "deg"
convention = "dh"
[[joint]]
type = "revolute"
a = 700
[[joint]]
type = "revolute"
a = 400
"#;

const PLANAR_AXES: &str = r#"
name = "planar-axes"
convention = "axes"
[[joint]]
type = "revolute"
axis = [0, 0, 1]
point = [0, 0, 0]
[[joint]]
type = "revolute"
axis = [0, 0, 1]
point = [0.7, 0, 0]
[tool]
translation = [1.1, 0, 0]
"#;

/// The planar two-link arm's tool position:
/// `(l1 cos θ1 + l2 cos(θ1+θ2), l1 sin θ1 + l2 sin(θ1+θ2))`
/// (Spong, Hutchinson & Vidyasagar 2006, §1.3 / Craig 2005, ex. 4.1 — from memory).
fn planar_closed_form(l1: f64, l2: f64, t1: f64, t2: f64) -> [f64; 2] {
    [
        l1 * t1.cos() + l2 * (t1 + t2).cos(),
        l1 * t1.sin() + l2 * (t1 + t2).sin(),
    ]
}

#[test]
fn a_planar_two_link_arm_follows_the_textbook_closed_form() {
    for text in [PLANAR_DH_M_RAD, PLANAR_AXES] {
        let model = load_str(text, "planar.toml").unwrap_or_else(|d| panic!("{d}"));
        for (t1, t2) in [
            (0.0, 0.0),
            (FRAC_PI_2, 0.0),
            (0.3, -1.1),
            (-2.5, 2.9),
            (PI, PI),
        ] {
            let pose = model.forward(&[t1, t2]);
            let [x, y] = planar_closed_form(0.7, 0.4, t1, t2);
            assert!((pose.translation[0] - x).abs() < 1e-14, "{t1} {t2}");
            assert!((pose.translation[1] - y).abs() < 1e-14, "{t1} {t2}");
            assert!(pose.translation[2].abs() < 1e-14);
            // The tool x axis points along the second link: angle θ1 + θ2.
            assert!((pose.rotation[0][0] - (t1 + t2).cos()).abs() < 1e-14);
            assert!((pose.rotation[1][0] - (t1 + t2).sin()).abs() < 1e-14);
        }
    }
}

#[test]
fn a_planar_arm_in_mm_and_degrees_reads_its_joint_values_and_answers_in_its_units() {
    let model = load_str(PLANAR_DH_MM_DEG, "planar-mm.toml").unwrap_or_else(|d| panic!("{d}"));
    // Worked by hand: θ1 = 90°, θ2 = −90° puts the elbow at (0, 700) and the tool at (400, 700).
    let pose = model.forward_in_file_units(&[90.0, -90.0]);
    assert!((pose.translation[0] - 400.0).abs() < 1e-9);
    assert!((pose.translation[1] - 700.0).abs() < 1e-9);
    // θ1 = 30°, θ2 = 60°: the closed form in mm.
    let pose = model.forward_in_file_units(&[30.0, 60.0]);
    let [x, y] = planar_closed_form(700.0, 400.0, 30f64.to_radians(), 60f64.to_radians());
    assert!((pose.translation[0] - x).abs() < 1e-9);
    assert!((pose.translation[1] - y).abs() < 1e-9);
}

#[test]
fn the_bench_elbow_at_zero_is_where_its_dh_table_puts_it() {
    // By hand from arms/bench-elbow-dh.toml: reach x = a1 + d4 + d6 + tool = 120 + 380 + 90 +
    // 120 = 710 mm; height z = d1 + a2 + a3 = 450 + 400 + 75 = 925 mm; the tool z axis points
    // along the base x axis.
    let model = load_model(&workspace_root().join("arms/bench-elbow-dh.toml"), "arm").unwrap();
    let pose = model.forward_in_file_units(&[0.0; 6]);
    let expected = [710.0, 0.0, 925.0];
    for (found, expected) in pose.translation.iter().zip(expected) {
        assert!((found - expected).abs() < 1e-9, "{pose:?}");
    }
    let tool_z = [
        pose.rotation[0][2],
        pose.rotation[1][2],
        pose.rotation[2][2],
    ];
    assert!((tool_z[0] - 1.0).abs() < 1e-12, "{tool_z:?}");
}

#[test]
fn the_gantry_moves_its_tool_by_exactly_its_slide_values() {
    // arms/tray-gantry-axes.toml: the slides are x, y and −z; with the wrist at zero the tool
    // sits at base (0, 0, 2000) + (150, 100, −510) + (q1, q2, −q3) mm.
    let model = load_model(&workspace_root().join("arms/tray-gantry-axes.toml"), "arm").unwrap();
    let pose = model.forward_in_file_units(&[1000.0, 250.0, 300.0, 0.0, 0.0, 0.0]);
    let expected = [1150.0, 350.0, 2000.0 - 510.0 - 300.0];
    for (found, expected) in pose.translation.iter().zip(expected) {
        assert!((found - expected).abs() < 1e-9, "{pose:?}");
    }
}

#[test]
fn files_in_mm_and_degrees_equal_their_m_and_rad_twins() {
    let pairs = [
        ("arms/bench-elbow-dh.toml", "units/bench-elbow-m-rad.toml"),
        (
            "arms/ceiling-transfer-axes.toml",
            "units/ceiling-transfer-mm-deg.toml",
        ),
    ];
    for (arm, twin) in pairs {
        let a = load_model(&workspace_root().join(arm), "arm").unwrap_or_else(|d| panic!("{d}"));
        let b = load_model(&fixture(twin), "arm").unwrap_or_else(|d| panic!("{d}"));
        let reference = ReferenceArm::load(&fixture(twin));
        let mut rng = StdRng::seed_from_u64(11);
        for _ in 0..200 {
            let q = reference.random_configuration(&mut rng);
            let (r, t) = pose_difference_of(&a.forward(&q), &b.forward(&q));
            assert!(r < 1e-12 && t < 1e-12, "{arm}: {r:e} {t:e}");
            // And through the file units: joints in, translation out.
            let qa = a.joint_values_from_si(&q);
            let qb = b.joint_values_from_si(&q);
            let pa = a.units.pose_to_si(&a.forward_in_file_units(&qa));
            let pb = b.units.pose_to_si(&b.forward_in_file_units(&qb));
            let (r, t) = pose_difference_of(&pa, &pb);
            assert!(r < 1e-12 && t < 1e-12, "{arm} in file units: {r:e} {t:e}");
        }
        for (ja, jb) in a.joints.iter().zip(&b.joints) {
            for k in 0..2 {
                assert!((ja.joint.limits[k] - jb.joint.limits[k]).abs() < 1e-12);
            }
            assert!((ja.joint.offset - jb.joint.offset).abs() < 1e-12);
        }
    }
}

#[test]
fn a_revolute_joint_without_limits_has_one_turn_and_a_prismatic_one_is_unlimited() {
    let text = r#"
name = "defaults"
convention = "axes"
[[joint]]
type = "revolute"
axis = [0, 0, 1]
point = [0, 0, 0]
[[joint]]
type = "prismatic"
axis = [0, 0, 3]
"#;
    let model = load_str(text, "defaults.toml").unwrap();
    assert_eq!(model.joints[0].joint.limits, [-PI, PI]);
    assert_eq!(
        model.joints[1].joint.limits,
        [f64::NEG_INFINITY, f64::INFINITY]
    );
    assert_eq!(model.joints[1].joint.axis, [0.0, 0.0, 1.0]);
    assert_eq!(model.joints[0].name, "joint 1");
}

#[test]
fn sixteen_joints_read_and_move() {
    // Sixteen unit links about parallel z axes: at zero the tool is 16 m out along x.
    let mut text = String::from("name = \"snake\"\nconvention = \"dh\"\n");
    for _ in 0..16 {
        text.push_str("[[joint]]\ntype = \"revolute\"\na = 1\n");
    }
    let model = load_str(&text, "snake.toml").unwrap_or_else(|d| panic!("{d}"));
    assert_eq!(model.joints.len(), 16);
    assert!((model.forward(&[0.0; 16]).translation[0] - 16.0).abs() < 1e-12);
    // A quarter turn at the first joint only: the arm points along y.
    let mut q = [0.0; 16];
    q[0] = FRAC_PI_2;
    assert!((model.forward(&q).translation[1] - 16.0).abs() < 1e-12);
}
