//! The three-parallel family: six revolute joints, axes 2, 3 and 4 parallel, axes 5 and 6
//! meeting in a point (at any angles to each other and to the parallel axes). Pieper (1968):
//! parallel axes meet at infinity, so the arm has a closed form without a spherical wrist.
//! Recognition, evidence, the review's conditions and `verify` hints here; the plan (and the
//! label rule) in [`plan`].
//!
//! Covered: the layout with axis 1 and axis 5 each ⟂ the parallel axes and axis 6 ⟂ axis 5,
//! and every other angle of axes 1, 5 and 6 to the parallel axes, with any offsets, as long as
//! axes 5 and 6 meet. Axes 5 and 6 passing apart are the offset-hand family's
//! ([`super::offset_hand`], which shares this family's checks, planar chain and labels). Axes
//! 3–5 parallel with axes 1 and 2 meeting are this family's arms read from the tool: the
//! tool-first family solves them through [`plan::target_step`].

pub mod plan;
pub(crate) mod steps;

use std::f64::consts::PI;

use armforge_runtime::{Joint, JointKind};
use nalgebra::{Point3, Vector3};

use super::data::{Distance, Judged, Part, Role, SamplerBoundary, Steps, Value, VerifyHints};
use super::{Family, FamilyModule, Found, Recognition};
use crate::classify::context::Context;
use crate::classify::decoupled::{gap, line_angle};
use crate::classify::evidence::{arr, shoulder, show_joint_values, wrap, Shoulder};
use crate::classify::lines::signed_angle_about;
use crate::classify::reject::{Quantity, Reason};
use crate::classify::{ArmEvidence, Geometry, Reach, ReachOrigin, Singularity};
use crate::model::Model;
use crate::plan::wrist::ALIGNED_SINE;
use crate::plan::Plan;
use plan::{meeting_point, Layout};

/// The three-parallel family.
pub struct ThreeParallel;

/// The registry's entry.
pub static THREE_PARALLEL: ThreeParallel = ThreeParallel;

/// Evidence of a three-parallel arm, measured on the joint lines (metres, radians).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct ThreeParallelEvidence {
    /// The common direction of axes 2, 3 and 4 (axis 2's), base frame.
    pub direction: [f64; 3],
    /// The largest angle between axes 2–3 and 3–4 (zero for exactly parallel axes).
    pub parallel_miss: f64,
    /// Joints 1 and 2, measured with the meeting point of axes 5 and 6 as the placed point.
    pub shoulder: Shoulder,
    /// The angle between axis 5 and the parallel axes, `[0, π/2]`.
    pub angle_5_to_parallel: f64,
    /// The angle between axes 5 and 6, `[0, π/2]`.
    pub angle_5_6: f64,
    /// How far axes 5 and 6 pass apart (zero when they meet), metres.
    pub gap_5_6: f64,
    /// Where axes 5 and 6 meet, base frame at zero, metres.
    pub meeting_point: [f64; 3],
    /// Upper arm: the distance between axes 2 and 3, metres.
    pub upper_arm: f64,
    /// Forearm: the distance between axes 3 and 4, metres.
    pub forearm: f64,
    /// A point of axis 4 at zero (the one nearest axis 3's point), metres.
    pub axis_4_point: [f64; 3],
    /// The distance of axis 4 from axis 2, `[|upper − fore|, upper + fore]`, metres.
    pub reach_from_axis_2: [f64; 2],
    /// The model value of joint 3 (radians) at which axis 4 is farthest from axis 2.
    pub stretched_at: f64,
    /// Model values of joint 5 (radians) at which axis 6 is parallel to axes 2–4.
    pub aligned_at: Vec<f64>,
}

/// A rejection of a three-parallel arm with the family's own words.
fn reject(
    ctx: &Context,
    kind: &'static str,
    joint: usize,
    message: String,
    measures: Vec<(&'static str, Quantity)>,
) -> Recognition {
    let reason = Reason::Family {
        name: kind,
        message,
        measures,
    };
    Recognition::Degenerate(ctx.reject(reason, joint, Vec::new()))
}

/// The conditions every arm with axes 2–4 parallel must meet (this family's and the
/// offset-hand family's), in the order they are checked; the first that fails is the reason.
pub(crate) fn degenerate(ctx: &Context) -> Option<Recognition> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    for n in [1, 5] {
        if ctx.parallel(n, 2) {
            let angle = ctx.angle(n, 2);
            let (first, last) = if n == 1 { (1, 4) } else { (2, 5) };
            return Some(reject(
                ctx,
                "four_parallel_axes",
                n,
                format!(
                    "axes of joints {first}–{last} are parallel ({} makes {} with {}): four \
                     joints turning about parallel axes move the arm in one plane with three \
                     degrees of freedom, so one of them is redundant and the arm lacks one \
                     everywhere (a degenerate arm)",
                    label(n),
                    u.show_angle(angle),
                    label(2)
                ),
                vec![("angle", Quantity::Angle(angle))],
            ));
        }
    }
    for (a, b) in [(2, 3), (3, 4)] {
        let distance = ctx.gap(a, b);
        if distance <= ctx.tol.distance {
            return Some(reject(
                ctx,
                "parallel_axes_coincide",
                b,
                format!(
                    "axes of {} and {} are one line ({} apart): two joints turning about one \
                     line add one motion, not two, so the arm lacks one degree of freedom \
                     everywhere (a degenerate arm)",
                    label(a),
                    label(b),
                    u.show_length(distance)
                ),
                vec![("distance", Quantity::Length(distance))],
            ));
        }
    }
    None
}

/// True when axes 5 and 6 pass apart (the offset-hand family's arms, not this family's).
pub(crate) fn axes_5_6_apart(ctx: &Context) -> bool {
    ctx.gap(5, 6) > ctx.tol.distance
}

/// The three-parallel conditions beyond [`degenerate`] for meeting axes 5 and 6.
fn check(ctx: &Context) -> Option<Recognition> {
    if let Some(rejected) = degenerate(ctx) {
        return Some(rejected);
    }
    if ctx.parallel(5, 6) {
        let u = &ctx.model.units;
        let label = |n: usize| ctx.model.joint_label(n - 1);
        let angle = ctx.angle(5, 6);
        return Some(reject(
            ctx,
            "axes_5_and_6_one_line",
            6,
            format!(
                "axes 2–4 are parallel, and the axes of {} and {} are one line (angle {}, {} \
                 apart): two joints turning about one line add one motion, not two, so the arm \
                 lacks one degree of freedom everywhere (a degenerate arm)",
                label(5),
                label(6),
                u.show_angle(angle),
                u.show_length(ctx.gap(5, 6))
            ),
            vec![("angle", Quantity::Angle(angle))],
        ));
    }
    None
}

fn point(p: &Point3<f64>) -> [f64; 3] {
    [p.x, p.y, p.z]
}

/// Joint-5 model values at which axis 6 is parallel to `h` (either sense).
pub(crate) fn aligned_at(ctx: &Context, h: &Vector3<f64>) -> Vec<f64> {
    let h5 = ctx.line(5).direction;
    let h6 = ctx.line(6).direction.into_inner();
    let mut at: Vec<f64> = [*h, -h]
        .iter()
        .filter_map(|target| {
            let off = (h5.dot(&h6) - h5.dot(target)).abs();
            (off <= ctx.tol.angle)
                .then(|| signed_angle_about(&h5, &h6, target, ctx.tol.angle.sin()))?
        })
        .collect();
    at.sort_by(f64::total_cmp);
    at
}

/// The planar chain of joints 2–4 at zero: its two lengths, the point of axis 4 the two-link
/// step places, where it is stretched, and how far from axis 2 axis 4 can be.
#[derive(Clone, Copy)]
pub(crate) struct Chain {
    /// The distance between axes 2 and 3.
    pub upper_arm: f64,
    /// The distance between axes 3 and 4.
    pub forearm: f64,
    /// The point of axis 4 in the plane ⟂ `h` through axis 3's foot.
    pub on_4: Point3<f64>,
    /// The model value of joint 3 at which axis 4 is farthest from axis 2.
    pub stretched_at: f64,
    /// `[|upper − fore|, upper + fore]`.
    pub rho: [f64; 2],
}

/// The planar chain of an arm whose axes 2–4 are parallel.
pub(crate) fn chain(ctx: &Context) -> Chain {
    let upper_arm = ctx.gap(2, 3);
    let forearm = ctx.gap(3, 4);
    let axis3 = ctx.line(3);
    let on_4 = ctx.line(4).project(&axis3.point);
    let on_3 = axis3.project(&on_4);
    let upper = on_3 - ctx.line(2).project(&on_3);
    let fore = on_4 - on_3;
    let stretched_at =
        signed_angle_about(&axis3.direction, &fore, &upper, ctx.tol.distance).unwrap_or(0.0);
    Chain {
        upper_arm,
        forearm,
        on_4,
        stretched_at,
        rho: [(upper_arm - forearm).abs(), upper_arm + forearm],
    }
}

/// The planar chain stretched and folded: where its two elbow solutions merge.
pub(crate) fn bend_singularities(ctx: &Context, c: &Chain) -> Vec<Singularity> {
    let u = &ctx.model.units;
    let joint_angles = |n: usize, values: &[f64]| show_joint_values(ctx.model, n, values);
    let mut out = Vec::new();
    for (kind, at, words) in [
        (
            "stretched",
            c.stretched_at,
            "stretched (axis 4 farthest from axis 2)",
        ),
        (
            "folded",
            wrap(c.stretched_at + PI),
            "folded (axis 4 nearest axis 2)",
        ),
    ] {
        out.push(Singularity::Described {
            name: kind,
            text: format!(
                "arm {words} at joint 3 = {}: the two elbow solutions merge",
                joint_angles(3, &[at])
            ),
            equation: format!(
                "`cos ψ = {}` in the law of cosines of joints 2–3: `d = {}` from axis 2.",
                if kind == "stretched" { "1" } else { "−1" },
                u.show_length(if kind == "stretched" {
                    c.upper_arm + c.forearm
                } else {
                    (c.upper_arm - c.forearm).abs()
                })
            ),
        });
    }
    out
}

fn measure(ctx: &Context) -> Found {
    let h = ctx.line(2).direction.into_inner();
    let q = meeting_point(
        arr(&ctx.line(5).point.coords),
        arr(&ctx.line(5).direction.into_inner()),
        arr(&ctx.line(6).point.coords),
        arr(&ctx.line(6).direction.into_inner()),
    );
    let qp = Point3::from(q);
    let s = shoulder(ctx, &qp);
    let planar = chain(ctx);
    let Chain {
        upper_arm,
        forearm,
        on_4,
        stretched_at,
        rho,
    } = planar;
    let aligned = aligned_at(ctx, &h);
    let u = &ctx.model.units;
    let joint_angles = |n: usize, values: &[f64]| show_joint_values(ctx.model, n, values);
    let h1 = ctx.line(1).direction.into_inner();
    let p1 = ctx.line(1).point;
    let e = h.dot(&(qp - p1));
    let perpendicular = s.angle_1_2 >= std::f64::consts::FRAC_PI_2 - ctx.tol.angle;
    let shoulder_text = if perpendicular && e.abs() <= ctx.tol.distance {
        "meeting point of axes 5 and 6 on axis 1: joint 1 is free (shoulder singularity)"
            .to_string()
    } else if perpendicular {
        format!(
            "meeting point of axes 5 and 6 {} from axis 1: the two joint-1 solutions merge; it \
             cannot come nearer axis 1",
            u.show_length(e.abs())
        )
    } else {
        let free = p1.coords + h1 * (e / h1.dot(&h));
        format!(
            "meeting point of axes 5 and 6 at ({}, {}, {}) {} on axis 1: joint 1 is free; \
             around it the two joint-1 solutions merge on a cone about axis 1",
            crate::units::tidy(u.length_from_si(free.x)),
            crate::units::tidy(u.length_from_si(free.y)),
            crate::units::tidy(u.length_from_si(free.z)),
            u.length.symbol()
        )
    };
    let mut singularities = vec![if aligned.is_empty() {
        Singularity::Described {
            name: "axis_6_never_parallel",
            text: "axis 6 never parallel to axes 2–4 (the angles of axes 5–6 and 5–2 differ)"
                .into(),
            equation: "`h · R5 h6` never reaches ±1: joints 5 and 6 always fix the orientation \
                       apart from the sum of joints 2–4."
                .into(),
        }
    } else {
        Singularity::Described {
            name: "axis_6_parallel",
            text: format!(
                "axis 6 parallel to axes 2–4 at joint 5 = {}: joint 6 and the sum of joints \
                 2–4 turn about parallel axes, only their sum is fixed",
                joint_angles(5, &aligned)
            ),
            equation: format!(
                "`|h6 × w|² = 0` (`w = Rᵀ R1 h`): within a sine of {ALIGNED_SINE:e} the solver \
                 keeps joint 6 at the reference (plus a half turn for the second root of joint \
                 5) and the sum `Φ` takes the rest."
            ),
        }
    }];
    singularities.push(Singularity::Described {
        name: "shoulder",
        text: shoulder_text,
        equation: "`k² = r² − e² = 0` in joint 1's equation `a cos θ1 + b sin θ1 = e` (the two \
                   roots merge), or `r² = 0` (the target point on axis 1: the solver keeps \
                   joint 1 at the reference)."
            .into(),
    });
    singularities.extend(bend_singularities(ctx, &planar));
    let reach = Reach {
        from: ReachOrigin::ShoulderPoint,
        min: rho[0].hypot(s.sideways_offset),
        max: rho[1].hypot(s.sideways_offset),
    };
    let evidence = ThreeParallelEvidence {
        direction: arr(&h),
        parallel_miss: ctx.angle(2, 3).max(ctx.angle(3, 4)),
        shoulder: s,
        angle_5_to_parallel: ctx.angle(5, 2),
        angle_5_6: ctx.angle(5, 6),
        gap_5_6: ctx.gap(5, 6),
        meeting_point: q,
        upper_arm,
        forearm,
        axis_4_point: point(&on_4),
        reach_from_axis_2: rho,
        stretched_at,
        aligned_at: aligned,
    };
    Found {
        center: q,
        wrist: None,
        arm: ArmEvidence::ThreeParallel(evidence),
        reach: Some(reach),
        singularities,
        solutions: [4, 2],
    }
}

impl FamilyModule for ThreeParallel {
    fn family(&self) -> Family {
        Family::ThreeParallel
    }

    fn name(&self) -> &'static str {
        "three-parallel"
    }

    fn pattern(&self) -> &'static str {
        "R R R R R R"
    }

    /// Two roots of joint 1 × two bends of joints 2–3 (each with two of joint 5).
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        let all_turn = (1..=6).all(|n| ctx.kind(n) == JointKind::Revolute);
        if !all_turn || !ctx.three_parallel(2) {
            return Recognition::NotMine(None);
        }
        if axes_5_6_apart(ctx) && degenerate(ctx).is_none() {
            return Recognition::NotMine(None);
        }
        if let Some(rejected) = check(ctx) {
            return rejected;
        }
        Recognition::Mine(measure(ctx))
    }

    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan {
        plan::build(model, geometry)
    }

    fn target_step(&self) -> Option<super::TargetStep> {
        Some(plan::target_step)
    }

    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged> {
        let ArmEvidence::ThreeParallel(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "parallel_direction",
                "direction of the parallel axes 2, 3 and 4",
                Value::Direction(e.direction),
            ),
            Judged::new(
                "parallel_miss",
                "largest angle between axes 2–3 and 3–4",
                Value::Angle(e.parallel_miss),
            ),
            Judged::new(
                "angle_1_2",
                "angle between axis 1 and the parallel axes",
                Value::Angle(e.shoulder.angle_1_2),
            ),
            Judged::new(
                "shoulder_offset",
                "shoulder offset (length of the common normal of axes 1 and 2)",
                Value::Length(e.shoulder.offset),
            ),
            Judged::new(
                "upper_arm",
                "upper arm (distance between axes 2 and 3)",
                Value::Length(e.upper_arm),
            ),
            Judged::new(
                "forearm",
                "forearm (distance between axes 3 and 4)",
                Value::Length(e.forearm),
            ),
            Judged::new(
                "angle_5_to_parallel",
                "angle between axis 5 and the parallel axes",
                Value::Angle(e.angle_5_to_parallel),
            ),
            Judged::new(
                "angle_5_6",
                "angle between axes 5 and 6",
                Value::Angle(e.angle_5_6),
            ),
            Judged::new(
                "gap_5_6",
                "common normal of axes 5 and 6 (how far they pass apart)",
                Value::Length(e.gap_5_6),
            ),
            Judged::new(
                "meeting_point",
                "meeting point of axes 5 and 6 (base frame, every joint at zero)",
                Value::Point(e.meeting_point),
            ),
            Judged::new(
                "sideways_offset",
                "sideways offset (distance of that point from the plane through the shoulder \
                 point perpendicular to the parallel axes)",
                Value::Length(e.shoulder.sideways_offset),
            ),
        ]
    }

    fn placed_point(&self) -> &'static str {
        "meeting point of axes 5 and 6"
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "E2 E3 E4 q",
            "the meeting point of axes 5 and 6 moved by joints 2–4 (joint 1 undone); the elbow \
             label reads the bend of joints 2–3 placing axis 4",
            "h5 × h2",
        ]
    }

    fn summary(&self) -> &'static str {
        "no spherical wrist: axes 2, 3, 4 parallel, axes 5 and 6 meet in one point"
    }

    fn solution_parts(&self) -> [&'static str; 2] {
        ["joints 1–4", "joints 5–6"]
    }

    fn decoupling(&self) -> &'static str {
        "No spherical wrist: axes 2, 3 and 4 are parallel (they meet at infinity, Pieper 1968) \
         and axes 5 and 6 meet in a point."
    }

    fn conditions(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        parallel_conditions(
            plan,
            vec![
                Part::text("axes 5 and 6 meet: "),
                Part::length(gap(arm, 5, 6)),
                Part::text(" apart, at angle "),
                Part::angle(line_angle(arm, 5, 6)),
            ],
        )
    }

    fn steps(&self, plan: &Plan) -> Steps {
        steps::steps(plan)
    }

    fn verify_hints(&self, _joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let ArmEvidence::ThreeParallel(e) = &geometry.arm else {
            return VerifyHints {
                aligned_joint: 4,
                aligned_at: Vec::new(),
                axes: [None, None],
                on_axis: None,
                boundaries: Vec::new(),
                roles: crate::classify::decoupled::ROLES,
            };
        };
        // The meeting point moves with joints 4, 3, 2; the point of axis 4 nearest axis 3's
        // foot with joints 3 and 2.
        let from_axis_1 = Distance {
            point: e.meeting_point,
            moved_by: vec![(3, false), (2, false), (1, false)],
            axis: 0,
        };
        let from_axis_2 = Distance {
            point: e.axis_4_point,
            moved_by: vec![(2, false), (1, false)],
            axis: 1,
        };
        let perpendicular = e.shoulder.angle_1_2 >= std::f64::consts::FRAC_PI_2 - 1e-9;
        let offset = {
            let h = Vector3::from(e.direction);
            let p1 = Vector3::from(e.shoulder.point_on_axis_1);
            h.dot(&(Vector3::from(e.meeting_point) - p1)).abs()
        };
        let tol = geometry.resolved.distance;
        let mut boundaries = Vec::new();
        let mut on_axis = None;
        if perpendicular && offset <= tol {
            on_axis = Some(SamplerBoundary {
                distance: from_axis_1.clone(),
                joint: 1,
                at: 0.0,
                side: 1.0,
            });
        } else if perpendicular {
            boundaries.push(SamplerBoundary {
                distance: from_axis_1.clone(),
                joint: 1,
                at: offset,
                side: 1.0,
            });
        }
        for (at, side) in [
            (e.reach_from_axis_2[1], -1.0),
            (e.reach_from_axis_2[0], 1.0),
        ] {
            boundaries.push(SamplerBoundary {
                distance: from_axis_2.clone(),
                joint: 2,
                at,
                side,
            });
        }
        VerifyHints {
            aligned_joint: 4,
            aligned_at: e.aligned_at.clone(),
            axes: [Some(from_axis_1), Some(from_axis_2)],
            on_axis,
            boundaries,
            // Where axis 6 lines up with axes 2–4, joint 6 joins the planar chain of joints
            // 2–4: all four share what joint 6 alone cannot fix.
            roles: [
                Role::Axis(0),
                Role::AxisAndSplit(1),
                Role::BendAndSplit,
                Role::WristSplit,
                Role::WristMiddle,
                Role::WristSplit,
            ],
        }
    }
}

/// The review's conditions of an arm whose axes 2–4 are parallel (this family's and the
/// offset-hand family's), with the line on axes 5 and 6 (`hand`) in its place.
pub(crate) fn parallel_conditions(plan: &Plan, hand: Vec<Part>) -> Vec<Vec<Part>> {
    let arm = &plan.arm;
    let k = Layout::of(arm);
    let (upper, fore) = k.two_link.lengths();
    let a = |i: usize, j: usize| Part::angle(line_angle(arm, i, j));
    vec![
        vec![
            Part::text("axes 2, 3, 4 parallel: angles "),
            a(2, 3),
            Part::text(" (2–3) and "),
            a(3, 4),
            Part::text(" (3–4)"),
        ],
        vec![Part::text("axis 1 ∦ axes 2–4: angle "), a(1, 2)],
        vec![Part::text("axis 5 ∦ axes 2–4: angle "), a(2, 5)],
        hand,
        vec![
            Part::text("an upper arm and a forearm: "),
            Part::length(upper),
            Part::text(" from axis 2 to axis 3, "),
            Part::length(fore),
            Part::text(" from axis 3 to axis 4"),
        ],
    ]
}
