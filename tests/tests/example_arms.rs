//! The example arms in `arms/` are what later stages rely on: every one meets Pieper's
//! criterion (a spherical wrist, a wrist at the base, or three parallel axes with axes 5 and
//! 6 meeting), and the first three joints of those with a spherical wrist form one of the
//! solvable families (elbow, polar, cylindrical, cartesian). Checked here from the model's
//! lines directly, independent of the classifier.

use std::collections::BTreeSet;

use armforge_compiler::model::Model;
use armforge_compiler::pipeline::load_model;
use armforge_runtime::math::{cross, dot, norm, sub};
use armforge_runtime::{joint_motion, JointKind};
use armforge_tests::example_arm_paths;

const ON_LINE: f64 = 1e-9;
const NOT_PARALLEL: f64 = 1e-3;

fn arms() -> Vec<(String, Model)> {
    example_arm_paths()
        .into_iter()
        .map(|p| {
            let model = load_model(&p, "arm").unwrap_or_else(|d| panic!("{d}"));
            (p.display().to_string(), model)
        })
        .collect()
}

fn axis(model: &Model, i: usize) -> [f64; 3] {
    model.joints[i].joint.axis
}

fn distance_from_line(model: &Model, i: usize, p: &[f64; 3]) -> f64 {
    let j = &model.joints[i].joint;
    norm(&cross(&sub(p, &j.point), &j.axis))
}

/// The point where the lines of joints `i` and `k` meet (closest point on line `i`).
fn meeting_point(model: &Model, i: usize, k: usize) -> [f64; 3] {
    let (a, b) = (&model.joints[i].joint, &model.joints[k].joint);
    // Closest points of two lines (common practice): solve for s along a.
    let w = sub(&a.point, &b.point);
    let (aa, ab, bb) = (
        dot(&a.axis, &a.axis),
        dot(&a.axis, &b.axis),
        dot(&b.axis, &b.axis),
    );
    let (aw, bw) = (dot(&a.axis, &w), dot(&b.axis, &w));
    let s = (ab * bw - bb * aw) / (aa * bb - ab * ab);
    [
        a.point[0] + s * a.axis[0],
        a.point[1] + s * a.axis[1],
        a.point[2] + s * a.axis[2],
    ]
}

/// Where the axes of joints `first..first + 3` (0-based) meet, when they turn, no two
/// consecutive ones are parallel and one point lies on all three lines.
fn meeting_of(model: &Model, first: usize) -> Option<[f64; 3]> {
    let joints = first..first + 3;
    if joints
        .clone()
        .any(|i| model.joints[i].joint.kind != JointKind::Revolute)
    {
        return None;
    }
    for i in first..first + 2 {
        if norm(&cross(&axis(model, i), &axis(model, i + 1))) <= NOT_PARALLEL {
            return None;
        }
    }
    let center = meeting_point(model, first, first + 1);
    joints
        .clone()
        .all(|i| distance_from_line(model, i, &center) < ON_LINE)
        .then_some(center)
}

/// True when joints `first..first + 3` (0-based) turn about parallel axes.
fn parallel_from(model: &Model, first: usize) -> bool {
    (first..first + 3).all(|i| model.joints[i].joint.kind == JointKind::Revolute)
        && (first..first + 2).all(|i| norm(&cross(&axis(model, i), &axis(model, i + 1))) < ON_LINE)
}

/// Pieper: the motions of three joints whose axes meet leave the meeting point where it is.
fn holds_still(model: &Model, first: usize, center: &[f64; 3], path: &str) {
    let moved = [0.7, -1.2, 2.9];
    let mut c = *center;
    for (i, q) in (first..first + 3).zip(moved).rev() {
        c = joint_motion(&model.joints[i].joint, q).transform_point(&c);
    }
    assert!(
        norm(&sub(&c, center)) < 1e-12,
        "{path}: {c:?} vs {center:?}"
    );
}

#[test]
fn every_example_arm_meets_pieper_s_criterion() {
    // Pieper 1968: a closed form when three consecutive axes meet in a point or are parallel.
    // The example arms use six shapes: a spherical wrist (axes 4–6 meet), a wrist at the
    // base (axes 1–3 meet), a wrist in the middle (axes 2–4 meet), three parallel axes 2–4
    // (axes 5 and 6 meeting or apart), three parallel axes 3–5, and three parallel axes 1–3
    // with axes 4 and 5 apart (meeting or parallel are solved too).
    for (path, model) in arms() {
        assert_eq!(model.joints.len(), 6, "{path}");
        if let Some(center) = meeting_of(&model, 3) {
            holds_still(&model, 3, &center, &path);
        } else if let Some(center) = meeting_of(&model, 0) {
            holds_still(&model, 0, &center, &path);
        } else if let Some(center) = meeting_of(&model, 1) {
            holds_still(&model, 1, &center, &path);
        } else if parallel_from(&model, 1) {
            // Joints 2–4 keep every point's component along their common direction.
            let h = axis(&model, 1);
            let p = [0.3, -0.2, 0.5];
            let mut c = p;
            for (i, q) in (1..4).zip([0.7, -1.2, 2.9]).rev() {
                c = joint_motion(&model.joints[i].joint, q).transform_point(&c);
            }
            assert!((dot(&h, &c) - dot(&h, &p)).abs() < 1e-12, "{path}");
        } else if parallel_from(&model, 2) {
            // The same shape read from the tool: joints 3–5 keep every point's component along
            // their common direction, and axes 1 and 2 meet.
            let h = axis(&model, 2);
            let p = [0.3, -0.2, 0.5];
            let mut c = p;
            for (i, q) in (2..5).zip([0.7, -1.2, 2.9]).rev() {
                c = joint_motion(&model.joints[i].joint, q).transform_point(&c);
            }
            assert!((dot(&h, &c) - dot(&h, &p)).abs() < 1e-12, "{path}");
            let q = meeting_point(&model, 0, 1);
            assert!(
                distance_from_line(&model, 1, &q) < ON_LINE,
                "{path}: axes 1, 2 meet"
            );
        } else if parallel_from(&model, 0) {
            // Three parallel axes at the base: joints 1–3 keep every point's component along
            // their common direction; axes 4 and 5 neither meet nor are parallel.
            let h = axis(&model, 0);
            let p = [0.3, -0.2, 0.5];
            let mut c = p;
            for (i, q) in (0..3).zip([0.7, -1.2, 2.9]).rev() {
                c = joint_motion(&model.joints[i].joint, q).transform_point(&c);
            }
            assert!((dot(&h, &c) - dot(&h, &p)).abs() < 1e-12, "{path}");
            let q = meeting_point(&model, 3, 4);
            assert!(
                distance_from_line(&model, 4, &q) > ON_LINE,
                "{path}: axes 4, 5 apart"
            );
        } else {
            panic!("{path}: no three consecutive axes meet or are parallel");
        }
    }
}

#[test]
fn every_example_arm_has_a_solvable_family_for_its_first_three_joints() {
    let mut families = BTreeSet::new();
    for (path, model) in arms() {
        let Some(center) = meeting_of(&model, 3) else {
            // Not a spherical wrist at joints 4–6 (checked above).
            continue;
        };
        let kinds: Vec<JointKind> = (0..3).map(|i| model.joints[i].joint.kind).collect();
        let (h1, h2, h3) = (axis(&model, 0), axis(&model, 1), axis(&model, 2));
        use JointKind::{Prismatic as P, Revolute as R};
        let family = match kinds.as_slice() {
            [R, R, R] if norm(&cross(&h2, &h3)) < ON_LINE => {
                assert!(
                    norm(&cross(&h1, &h2)) > NOT_PARALLEL,
                    "{path}: axis 1 ∦ axis 2"
                );
                "elbow"
            }
            // Any other R R R before a spherical wrist: Pieper's criterion (Pieper 1968) gives
            // a closed form, a quartic in general.
            [R, R, R] => "general",
            [R, R, P] if dot(&h2, &h3).abs() < ON_LINE => {
                assert!(
                    norm(&cross(&h1, &h2)) > NOT_PARALLEL,
                    "{path}: axis 1 ∦ axis 2"
                );
                "polar"
            }
            // A slide not ⟂ axis 2: the general family's quartic in the slide (Pieper's
            // criterion, Pieper 1968). Something must change the height along axis 1.
            [R, R, P] => {
                assert!(
                    norm(&cross(&h1, &h2)) > NOT_PARALLEL || dot(&h1, &h3).abs() > NOT_PARALLEL,
                    "{path}: the height along axis 1 changes"
                );
                "general-slide"
            }
            [R, P, P] => {
                assert!(
                    norm(&cross(&h2, &h3)) > NOT_PARALLEL,
                    "{path}: slides not parallel"
                );
                let both_perpendicular =
                    dot(&h1, &h2).abs() < ON_LINE && dot(&h1, &h3).abs() < ON_LINE;
                assert!(!both_perpendicular, "{path}: not both slides ⟂ axis 1");
                "cylindrical"
            }
            [P, P, P] => {
                assert!(
                    dot(&h1, &cross(&h2, &h3)).abs() > NOT_PARALLEL,
                    "{path}: independent slides"
                );
                "cartesian"
            }
            [P, P, R] => {
                // Joint 3 alone moves the wrist center across the slides: its axis is not
                // along their normal (common practice for a carriage carrying a hinge).
                let normal = cross(&h1, &h2);
                assert!(norm(&normal) > NOT_PARALLEL, "{path}: slides not parallel");
                let along = dot(&h3, &normal).abs() / norm(&normal);
                assert!(along < 1.0 - ON_LINE, "{path}: axis 3 not ⟂ both slides");
                "carriage"
            }
            [P, R, R] => {
                // Axes 2 and 3 skew: neither parallel nor meeting (a quartic in the slide).
                assert!(
                    norm(&cross(&h2, &h3)) > NOT_PARALLEL,
                    "{path}: axes 2 and 3 not parallel"
                );
                "base-slide"
            }
            [R, P, R] => {
                // Pieper's criterion: the wrist's axes meet. Joint 3 must move the wrist
                // center and, with the slide ⟂ axis 1, change its height along axis 1.
                let from_3 = cross(&h3, &sub(&center, &model.joints[2].joint.point));
                assert!(
                    norm(&from_3) > NOT_PARALLEL,
                    "{path}: wrist center off axis 3"
                );
                if dot(&h1, &h2).abs() < ON_LINE {
                    assert!(
                        norm(&cross(&h1, &h3)) > NOT_PARALLEL,
                        "{path}: level slide, axis 3 ∦ axis 1"
                    );
                }
                "middle-slide"
            }
            other => panic!("{path}: first three joints {other:?} are no solvable family"),
        };
        families.insert(family);
    }
    assert!(
        families.contains("elbow") && families.contains("cartesian"),
        "{families:?}"
    );
}

#[test]
fn the_example_arms_cover_conventions_units_bases_and_wide_ranges() {
    let texts: Vec<String> = example_arm_paths()
        .iter()
        .map(|p| std::fs::read_to_string(p).unwrap())
        .collect();
    for convention in ["\"dh\"", "\"modified-dh\"", "\"axes\""] {
        assert!(texts
            .iter()
            .any(|t| t.contains(&format!("convention = {convention}"))));
    }
    assert!(texts.iter().any(|t| t.contains("length_unit = \"mm\"")));
    assert!(texts.iter().any(|t| t.contains("angle_unit = \"deg\"")));
    assert!(texts
        .iter()
        .any(|t| t.contains("convention = \"axes\"") && t.contains("[base]")));
    assert!(
        texts.iter().all(|t| t.starts_with('#')),
        "each file starts with its scenario"
    );
    let arms = arms();
    let wider_than_a_turn = arms.iter().any(|(_, m)| {
        m.joints.iter().any(|j| {
            j.joint.kind == JointKind::Revolute
                && j.joint.limits[1] - j.joint.limits[0] > 2.0 * std::f64::consts::PI
        })
    });
    assert!(wider_than_a_turn);
    for (path, model) in &arms {
        for (i, joint) in model.joints.iter().enumerate() {
            assert_ne!(
                joint.name,
                format!("joint {}", i + 1),
                "{path}: every joint is named"
            );
        }
    }
}
