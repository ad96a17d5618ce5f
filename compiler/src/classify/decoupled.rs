//! What the families with a spherical wrist at joints 4–6 share: recognition (the pattern of
//! joints 1–3, the wrist, the family's own check and evidence), the wrist's review conditions
//! and `verify` hints. Each family calls these from its own folder ([`crate::family`]).

use armforge_runtime::{Joint, JointKind};
use nalgebra::Point3;

use super::context::Context;
use super::evidence::Measured;
use super::reject::Rejection;
use super::{wrist, Geometry, Singularity, WRIST_SOLUTIONS};
use crate::family::{
    Distance, FamilyModule, Found, Part, Recognition, Role, SamplerBoundary, VerifyHints,
};
use crate::plan::vec3::num;
use crate::plan::Arm;

/// What conditions each joint of a decoupled arm: joint 1 by the wrist center's distance from
/// axis 1, joint 2 from axis 2, joint 3 by the bend, joint 5 is the wrist's middle joint and
/// joints 4 and 6 split a rotation when it lines up.
pub const ROLES: [Role; 6] = [
    Role::Axis(0),
    Role::Axis(1),
    Role::Bend,
    Role::WristSplit,
    Role::WristMiddle,
    Role::WristSplit,
];

/// The kinds a pattern such as `R R P` names.
pub fn kinds_of(pattern: &str) -> Vec<JointKind> {
    pattern
        .split_whitespace()
        .map(|k| {
            if k == "P" {
                JointKind::Prismatic
            } else {
                JointKind::Revolute
            }
        })
        .collect()
}

/// Recognises an arm whose joints 1–3 have `module`'s pattern and whose wrist is spherical:
/// `check` tests the conditions the family's solve needs, `measure` its evidence.
pub fn recognise(
    ctx: &Context,
    module: &dyn FamilyModule,
    check: fn(&Context, &Point3<f64>) -> Result<(), Rejection>,
    measure: fn(&Context, &Point3<f64>) -> Measured,
) -> Recognition {
    let kinds = [ctx.kind(1), ctx.kind(2), ctx.kind(3)];
    if kinds_of(module.pattern()) != kinds {
        return Recognition::NotMine(None);
    }
    let wrist = match wrist::analyse(ctx) {
        Ok(w) => w,
        Err(r) => return Recognition::NotMine(Some(r)),
    };
    let center = Point3::from(wrist.center);
    if let Err(r) = check(ctx, &center) {
        return Recognition::Degenerate(r);
    }
    let measured = measure(ctx, &center);
    let mut singularities = vec![wrist_singularity(&wrist.aligned_at)];
    singularities.extend(measured.singularities);
    Recognition::Mine(Found {
        center: wrist.center,
        wrist: Some(wrist),
        arm: measured.arm,
        reach: measured.reach,
        singularities,
        solutions: [module.position_solutions(), WRIST_SOLUTIONS],
    })
}

/// The wrist's singular configuration: aligned at these joint-5 model values, or never.
pub fn wrist_singularity(aligned_at: &[f64]) -> Singularity {
    if aligned_at.is_empty() {
        Singularity::WristNeverAligned
    } else {
        Singularity::WristAligned {
            joint_5_at: aligned_at.to_vec(),
        }
    }
}

/// The angle between the lines of axes `i` and `j` (1-based) of the plan's arm, `[0, π/2]`.
pub fn line_angle(arm: &Arm, i: usize, j: usize) -> f64 {
    let (a, b) = (arm.axis(i - 1), arm.axis(j - 1));
    let c = num::dot(&a, &b).abs().min(1.0);
    let s = num::norm(&num::cross(&a, &b));
    s.atan2(c)
}

/// The length of the common normal of axes `i` and `j` (1-based; the distance for parallel
/// axes) of the plan's arm.
pub fn gap(arm: &Arm, i: usize, j: usize) -> f64 {
    let (hi, hj) = (arm.axis(i - 1), arm.axis(j - 1));
    let d = num::sub(&arm.point(j - 1), &arm.point(i - 1));
    let n = num::cross(&hi, &hj);
    let nn = num::norm(&n);
    if nn < 1e-12 {
        num::norm(&num::perpendicular(&d, &hi))
    } else {
        num::dot(&d, &n).abs() / nn
    }
}

/// The distance of `x` from axis `n` (1-based) of the plan's arm.
pub fn distance_from_axis(arm: &Arm, n: usize, x: &[f64; 3]) -> f64 {
    let d = num::sub(x, &arm.point(n - 1));
    num::norm(&num::perpendicular(&d, &arm.axis(n - 1)))
}

/// The wrist's lines of the review's conditions.
pub fn wrist_conditions(geometry: &Geometry) -> Vec<Vec<Part>> {
    let Some(w) = &geometry.wrist else {
        return Vec::new();
    };
    vec![
        vec![
            Part::text("axes 4, 5, 6 meet: the wrist center is "),
            Part::length(w.miss),
            Part::text(" from the farthest of them"),
        ],
        vec![
            Part::text("axis 4 ∦ axis 5 and axis 5 ∦ axis 6: angles "),
            Part::angle(w.angle_4_5),
            Part::text(" and "),
            Part::angle(w.angle_5_6),
        ],
    ]
}

/// The wrist center's distance from axis `axis` (0-based, 0 or 1) as joints 3 and 2 move it.
pub fn center_distance(geometry: &Geometry, axis: usize) -> Distance {
    Distance {
        point: geometry.wrist_center,
        moved_by: vec![(2, false), (1, false)],
        axis,
    }
}

/// The `verify` hints every decoupled family shares: the wrist's aligned positions, the wrist
/// center's distances from axes 1 and 2, the wrist center on axis 1 and the shoulder's reach
/// boundary. Families add their own reach boundaries.
pub fn verify_hints(joints: &[Joint], geometry: &Geometry) -> VerifyHints {
    let revolute = |n: usize| joints.get(n).is_some_and(|j| j.kind == JointKind::Revolute);
    let mut on_axis = None;
    let mut boundaries = Vec::new();
    for s in &geometry.singularities {
        match s {
            Singularity::WristCenterOnAxis1 { reachable } if *reachable != Some(false) => {
                // Joint 2 moves the wrist center toward axis 1 (elbow, polar); for a
                // cylindrical arm the slide with more sideways travel does.
                on_axis = Some(SamplerBoundary {
                    distance: center_distance(geometry, 0),
                    joint: if revolute(1) { 1 } else { 2 },
                    at: 0.0,
                    side: 1.0,
                });
            }
            Singularity::Shoulder {
                perpendicular: true,
                offset,
                ..
            } if revolute(1) => boundaries.push(SamplerBoundary {
                distance: center_distance(geometry, 0),
                joint: 1,
                at: *offset,
                side: 1.0,
            }),
            _ => {}
        }
    }
    VerifyHints {
        aligned_joint: 4,
        aligned_at: geometry
            .wrist
            .as_ref()
            .map(|w| w.aligned_at.clone())
            .unwrap_or_default(),
        axes: [0, 1].map(|a| revolute(a).then(|| center_distance(geometry, a))),
        on_axis,
        boundaries,
        roles: ROLES,
    }
}
