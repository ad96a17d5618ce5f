//! The base-parallel family: six revolute joints whose axes 1, 2 and 3 are parallel (Pieper
//! 1968: parallel axes meet at infinity). Joints 1–3 keep every point's height along the
//! parallel axes, so joints 4–6 must turn the plane of axis 4's point at that height back onto
//! itself: joints 5 and 6 by the shared plane–line quartic, joint 4 by Paden–Kahan subproblem
//! 1, then joints 1–3 as a planar chain. Where axes 4 and 5 meet or are parallel every root of
//! that quartic is double; those placements have their own closed forms ([`axes_4_5`]: joint
//! 6 from one trigonometric equation, then joints 4 and 5 by Paden–Kahan subproblem 2 or by a
//! sum and a second equation). Recognition and evidence here; the plan in [`plan`], the review
//! sheet's steps in [`steps`].
//!
//! Covered: axes 4, 5 and 6 at any angles and offsets as long as axis 4 is not parallel to
//! axes 1–3, axes 4 and 5 are not one line and axes 5 and 6 are not one line; axes 4 and 5
//! apart, meeting or parallel. Rejected with the reason: four parallel axes (1–4), two of the
//! parallel axes one line, a spherical wrist behind the parallel axes (it cannot change its
//! height along them), axes 4–6 parallel too, axes 4 and 5 one line, axes 5 and 6 one line.
//! Arms whose axes 4–6 are parallel are this family's arms read from the tool: the tool-first
//! family solves them through [`plan::target_step`].

pub mod axes_4_5;
pub mod plan;
mod steps;

use std::f64::consts::PI;

use armforge_runtime::Joint;

use super::data::{Distance, Judged, Part, Role, SamplerBoundary, Steps, Value, VerifyHints};
use super::{Family, FamilyModule, Found, Recognition};
use crate::classify::context::Context;
use crate::classify::decoupled::{gap, line_angle};
use crate::classify::evidence::{arr, show_joint_values, wrap};
use crate::classify::lines::signed_angle_about;
use crate::classify::reject::{Quantity, Reason};
use crate::classify::{ArmEvidence, Geometry, Singularity};
use crate::model::Model;
use crate::plan::Plan;
use axes_4_5::Placement;

/// The base-parallel family.
pub struct BaseParallel;

/// The registry's entry.
pub static BASE_PARALLEL: BaseParallel = BaseParallel;

/// Evidence of an arm with parallel axes 1–3, measured on the joint lines (metres, radians).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct BaseParallelEvidence {
    /// The common direction of axes 1, 2 and 3 (axis 1's), base frame.
    pub direction: [f64; 3],
    /// The largest angle between axes 1–2 and 2–3 (zero for exactly parallel axes).
    pub parallel_miss: f64,
    /// The distance between axes 1 and 2.
    pub link_1_2: f64,
    /// The distance between axes 2 and 3.
    pub link_2_3: f64,
    /// The point of axis 3 joints 1 and 2 place (the one nearest axis 4's point), metres.
    pub axis_3_point: [f64; 3],
    /// The distance of axis 3 from axis 1, `[|link_1_2 − link_2_3|, link_1_2 + link_2_3]`.
    pub reach_from_axis_1: [f64; 2],
    /// The model value of joint 2 (radians) at which axis 3 is farthest from axis 1.
    pub stretched_at: f64,
    /// The angle between axis 4 and the parallel axes, `[0, π/2]`.
    pub angle_4_to_parallel: f64,
    /// The angle between axes 4 and 5, `[0, π/2]`.
    pub angle_4_5: f64,
    /// The length of the common normal of axes 4 and 5.
    pub gap_4_5: f64,
    /// The angle between axes 5 and 6, `[0, π/2]`.
    pub angle_5_6: f64,
    /// The length of the common normal of axes 5 and 6.
    pub gap_5_6: f64,
    /// Model values of joint 4 (radians) at which axis 5 is parallel to axes 1–3.
    pub aligned_at: Vec<f64>,
}

/// A rejection with the family's own words.
fn reject(
    ctx: &Context,
    name: &'static str,
    joint: usize,
    message: String,
    measures: Vec<(&'static str, Quantity)>,
) -> Recognition {
    let reason = Reason::Family {
        name,
        message,
        measures,
    };
    Recognition::Degenerate(ctx.reject(reason, joint, Vec::new()))
}

/// Axis 4 parallel to axes 1–3, or two of the parallel axes one line.
fn check_parallel_axes(ctx: &Context) -> Option<Recognition> {
    let u = &ctx.model.units;
    let label = |n: usize| ctx.model.joint_label(n - 1);
    if ctx.parallel(4, 1) {
        let angle = ctx.angle(4, 1);
        return Some(reject(
            ctx,
            "four_parallel_axes",
            4,
            format!(
                "axes of joints 1–4 are parallel ({} makes {} with {}): four joints turning \
                 about parallel axes move the arm in one plane with three degrees of freedom, \
                 so one of them is redundant and the arm lacks one everywhere (a degenerate arm)",
                label(4),
                u.show_angle(angle),
                label(1)
            ),
            vec![("angle", Quantity::Angle(angle))],
        ));
    }
    for (a, b) in [(1, 2), (2, 3)] {
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

/// Axes 4 and 5 meeting or parallel (a spherical wrist, axes 4–6 parallel, or the quartic's
/// roots all double), axes 5 and 6 one line.
fn check_last_axes(ctx: &Context) -> Option<Recognition> {
    let u = &ctx.model.units;
    let tol = ctx.tol.distance;
    if ctx.three_meet(4) {
        let m = ctx.meeting(&[4, 5, 6]).map_or(0.0, |m| m.miss);
        return Some(reject(
            ctx,
            "spherical_wrist_behind_parallel_axes",
            4,
            format!(
                "axes of joints 1–3 are parallel and axes 4, 5 and 6 meet in one point (within \
                 {}): a spherical wrist behind three parallel axes cannot change its height \
                 along them, so the tool reaches only the poses whose wrist center lies at one \
                 height (a degenerate arm)",
                u.show_length(m)
            ),
            vec![("distance", Quantity::Length(m))],
        ));
    }
    if ctx.parallel(4, 5) && ctx.parallel(5, 6) {
        let angle = ctx.angle(4, 5).max(ctx.angle(5, 6));
        return Some(reject(
            ctx,
            "parallel_axes_1_3_and_4_6",
            5,
            format!(
                "axes 1–3 are parallel and axes 4–6 are parallel too (largest angle {}): the \
                 tool turns only about the two directions, so the arm cannot reach every \
                 orientation (a degenerate arm)",
                u.show_angle(angle)
            ),
            vec![("angle", Quantity::Angle(angle))],
        ));
    }
    let (gap_4_5, parallel_4_5) = (ctx.gap(4, 5), ctx.parallel(4, 5));
    if parallel_4_5 && gap_4_5 <= tol {
        return Some(reject(
            ctx,
            "axes_4_5_one_line",
            5,
            format!(
                "axes 4 and 5 are one line ({} apart): joints 4 and 5 turn about the same \
                 line, so the arm lacks one degree of freedom everywhere (a degenerate arm)",
                u.show_length(gap_4_5)
            ),
            vec![("distance", Quantity::Length(gap_4_5))],
        ));
    }
    let gap_5_6 = ctx.gap(5, 6);
    if gap_5_6 <= tol && ctx.parallel(5, 6) {
        return Some(reject(
            ctx,
            "axes_5_6_one_line",
            6,
            format!(
                "axes 5 and 6 are one line ({} apart): joints 5 and 6 turn about the same line, \
                 so the arm lacks one degree of freedom everywhere (a degenerate arm)",
                u.show_length(gap_5_6)
            ),
            vec![("distance", Quantity::Length(gap_5_6))],
        ));
    }
    None
}

/// Joint-4 model values at which axis 5 is parallel to `h` (either sense).
fn aligned_at(ctx: &Context, h: &nalgebra::Vector3<f64>) -> Vec<f64> {
    let h4 = ctx.line(4).direction;
    let h5 = ctx.line(5).direction.into_inner();
    let mut at: Vec<f64> = [*h, -h]
        .iter()
        .filter_map(|target| {
            let off = (h4.dot(&h5) - h4.dot(target)).abs();
            (off <= ctx.tol.angle)
                .then(|| signed_angle_about(&h4, &h5, target, ctx.tol.angle.sin()))?
        })
        .collect();
    at.sort_by(f64::total_cmp);
    at
}

/// The family's singular configurations: axis 5 along axes 1–3, joints 1–2 stretched or
/// folded, and those of joints 4–6 for the placement of axes 4 and 5.
fn singularities(
    model: &Model,
    e: &BaseParallelEvidence,
    placement: Placement,
) -> Vec<Singularity> {
    let u = &model.units;
    let mut out = vec![if e.aligned_at.is_empty() {
        Singularity::Described {
            name: "axis_5_never_parallel",
            text: "axis 5 never parallel to axes 1–3 (the angles of axes 4–5 and 4–1 differ)"
                .into(),
            equation: "`h · R4 h5` never reaches ±1.".into(),
        }
    } else {
        Singularity::Described {
            name: "axis_5_parallel",
            text: format!(
                "axis 5 parallel to axes 1–3 at joint 4 = {}: joints 1, 2, 3 and 5 turn about \
                 parallel axes, so the arm loses a degree of freedom there",
                show_joint_values(model, 4, &e.aligned_at)
            ),
            equation: "`|h × R4 h5| = 0`: the plane–line step has no isolated roots there and \
                       the solver holds no joint at its reference, so a pose at the alignment \
                       may be answered with no solution (keep joint 4 away from these values)"
                .into(),
        }
    }];
    for (kind, at, words, reach) in [
        (
            "stretched",
            e.stretched_at,
            "stretched (axis 3 farthest from axis 1)",
            e.reach_from_axis_1[1],
        ),
        (
            "folded",
            wrap(e.stretched_at + PI),
            "folded (axis 3 nearest axis 1)",
            e.reach_from_axis_1[0],
        ),
    ] {
        out.push(Singularity::Described {
            name: kind,
            text: format!(
                "arm {words} at joint 2 = {}: the two elbow solutions merge",
                show_joint_values(model, 2, &[at])
            ),
            equation: format!(
                "`cos ψ = {}` in the law of cosines of joints 1–2: `d = {}` from axis 1{}",
                if kind == "stretched" { "1" } else { "−1" },
                u.show_length(reach),
                if kind == "folded" && reach <= 1e-9 {
                    " (axis 3 on axis 1: joint 1 is free and takes the rest of `Φ` with joint 3)"
                } else {
                    "."
                }
            ),
        });
    }
    out.extend(joints_4_to_6_singularities(placement));
    out
}

/// The singular configurations of joints 4–6 for each placement of axes 4 and 5.
fn joints_4_to_6_singularities(placement: Placement) -> Vec<Singularity> {
    let described = |name: &'static str, text: &str, equation: &str| Singularity::Described {
        name,
        text: text.to_string(),
        equation: equation.to_string(),
    };
    let axis_6 = described(
        "axis_6_parallel",
        "axis 6 parallel to axes 1–3: joint 6 then changes no height along them, so it is not \
         fixed by the height equation (joints 6 and 1–3 share what the equation cannot tell)",
        "`a = b = 0` in `a cos θ6 + b sin θ6 = e` (`|n × h6| = 0`): joint 6 is held at its \
         reference (the second root a half turn from it) and the candidates are flagged",
    );
    match placement {
        Placement::Apart => vec![described(
            "plane_line_merge",
            "two roots of joints 5 and 6 merge (a double root of the plane–line quartic): the \
             plane of axis 4's point at its height, seen from the tool, is at a reach boundary \
             of joints 4–6",
            "det[∂(e1, e2)/∂(ψL, ψP)] = 0 for the plane–line equations e1 = n′ · a′ − h · h4, \
             e2 = n′ · (o′ − q′): the candidates are flagged at the reach limit",
        )],
        Placement::Meeting => vec![
            described(
                "joint_6_roots_merge",
                "the two roots of joint 6 merge: the meeting point of axes 4 and 5 is at the \
                 highest or lowest height joint 6 can give it",
                "`a² + b² = e²` in `a cos θ6 + b sin θ6 = e` (its derivative `−a sin θ6 + b cos \
                 θ6` vanishes): the candidates are flagged at the reach limit",
            ),
            axis_6,
            described(
                "joints_4_5_roots_merge",
                "the two solutions of joints 4 and 5 merge: `R5 w` lies in the plane of axes 4 \
                 and 5 (Paden–Kahan subproblem 2 with one solution)",
                "`γ = 0` in `z = α h4 + β h5 ± γ (h4 × h5)`: the candidates are flagged at the \
                 reach limit",
            ),
        ],
        Placement::Parallel => vec![
            described(
                "joint_6_roots_merge",
                "the two roots of joint 6 merge: axis 6 turned by joint 6 brings `R6 n` to the \
                 cone around axes 4–5 only tangentially",
                "`a² + b² = e²` in `a cos θ6 + b sin θ6 = e` (`g · R6 n = g · h`; its derivative \
                 vanishes): the candidates are flagged at the reach limit",
            ),
            axis_6,
            described(
                "joint_5_roots_merge",
                "the two roots of joint 5 merge: axis 4's point is at the highest or lowest \
                 height joint 5 can give it",
                "`a5² + b5² = e5²` in `a5 cos θ5 + b5 sin θ5 = e5`: the candidates are flagged \
                 at the reach limit",
            ),
        ],
    }
}

/// Where axes 4 and 5 lie, with the classifier's tolerances (the plan decides alike from the
/// arm's constants: [`axes_4_5::Placement::of`]).
fn placement(ctx: &Context) -> Placement {
    if ctx.parallel(4, 5) {
        Placement::Parallel
    } else if ctx.gap(4, 5) <= ctx.tol.distance {
        Placement::Meeting
    } else {
        Placement::Apart
    }
}

fn measure(ctx: &Context) -> Found {
    let h = ctx.line(1).direction.into_inner();
    let link_1_2 = ctx.gap(1, 2);
    let link_2_3 = ctx.gap(2, 3);
    let axis2 = ctx.line(2);
    let on_3 = ctx.line(3).project(&ctx.line(4).point);
    let on_2 = axis2.project(&on_3);
    let upper = on_2 - ctx.line(1).project(&on_2);
    let fore = on_3 - on_2;
    let stretched_at =
        signed_angle_about(&axis2.direction, &fore, &upper, ctx.tol.distance).unwrap_or(0.0);
    let evidence = BaseParallelEvidence {
        direction: arr(&h),
        parallel_miss: ctx.angle(1, 2).max(ctx.angle(2, 3)),
        link_1_2,
        link_2_3,
        axis_3_point: arr(&on_3.coords),
        reach_from_axis_1: [(link_1_2 - link_2_3).abs(), link_1_2 + link_2_3],
        stretched_at,
        angle_4_to_parallel: ctx.angle(4, 1),
        angle_4_5: ctx.angle(4, 5),
        gap_4_5: ctx.gap(4, 5),
        angle_5_6: ctx.angle(5, 6),
        gap_5_6: ctx.gap(5, 6),
        aligned_at: aligned_at(ctx, &h),
    };
    Found {
        center: evidence.axis_3_point,
        wrist: None,
        reach: None,
        singularities: singularities(ctx.model, &evidence, placement(ctx)),
        solutions: [4, 2],
        arm: ArmEvidence::BaseParallel(evidence),
    }
}

impl FamilyModule for BaseParallel {
    fn family(&self) -> Family {
        Family::BaseParallel
    }

    fn name(&self) -> &'static str {
        "base-parallel"
    }

    fn pattern(&self) -> &'static str {
        "R R R R R R"
    }

    /// The plane–line quartic: at most 4 roots of joints 5 and 6 (each with one joint 4 and
    /// two bends of joints 1–2).
    fn position_solutions(&self) -> u32 {
        4
    }

    fn recognise(&self, ctx: &Context) -> Recognition {
        let all_turn = (1..=6).all(|n| ctx.revolute(n));
        if !all_turn || !ctx.three_parallel(1) {
            return Recognition::NotMine(None);
        }
        if let Some(rejected) = check_parallel_axes(ctx).or_else(|| check_last_axes(ctx)) {
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
        let ArmEvidence::BaseParallel(e) = arm else {
            return Vec::new();
        };
        vec![
            Judged::new(
                "parallel_direction",
                "direction of the parallel axes 1, 2 and 3",
                Value::Direction(e.direction),
            ),
            Judged::new(
                "parallel_miss",
                "largest angle between axes 1–2 and 2–3",
                Value::Angle(e.parallel_miss),
            ),
            Judged::new(
                "link_1_2",
                "distance between axes 1 and 2",
                Value::Length(e.link_1_2),
            ),
            Judged::new(
                "link_2_3",
                "distance between axes 2 and 3",
                Value::Length(e.link_2_3),
            ),
            Judged::new(
                "axis_3_point",
                "point of axis 3 joints 1 and 2 place (base frame, every joint at zero)",
                Value::Point(e.axis_3_point),
            ),
            Judged::new(
                "angle_4_to_parallel",
                "angle between axis 4 and the parallel axes",
                Value::Angle(e.angle_4_to_parallel),
            ),
            Judged::new(
                "angle_4_5",
                "angle between axes 4 and 5",
                Value::Angle(e.angle_4_5),
            ),
            Judged::new(
                "gap_4_5",
                "common normal of axes 4 and 5 (how far they pass apart)",
                Value::Length(e.gap_4_5),
            ),
            Judged::new(
                "angle_5_6",
                "angle between axes 5 and 6",
                Value::Angle(e.angle_5_6),
            ),
            Judged::new(
                "gap_5_6",
                "common normal of axes 5 and 6",
                Value::Length(e.gap_5_6),
            ),
        ]
    }

    fn placed_point(&self) -> &'static str {
        "point of axis 3"
    }

    fn summary(&self) -> &'static str {
        "no spherical wrist: axes 1, 2, 3 parallel (joints 4–6 turn the plane of axis 4's point \
         at its height back onto itself)"
    }

    fn solution_parts(&self) -> [&'static str; 2] {
        ["joints 4–6", "joints 1–3"]
    }

    fn label_words(&self) -> [&'static str; 3] {
        [
            "det J",
            "the sign of the plane–line Jacobian's determinant for the shoulder label, the bend \
             of joints 1–2 for the elbow label, the side of axis 6 turned by joint 5 for the \
             wrist label; the labels are read by solving",
            "h4 × h5",
        ]
    }

    fn decoupling(&self) -> &'static str {
        "No spherical wrist: axes 1, 2 and 3 are parallel (they meet at infinity, Pieper 1968); \
         joints 4–6 turn the plane through axis 4's point at its height along them back onto \
         itself (the plane–line quartic), joints 1–3 are a planar chain."
    }

    fn conditions(&self, plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        let arm = &plan.arm;
        let a = |i: usize, j: usize| Part::angle(line_angle(arm, i, j));
        vec![
            vec![
                Part::text("axes 1, 2, 3 parallel: angles "),
                a(1, 2),
                Part::text(" (1–2) and "),
                a(2, 3),
                Part::text(" (2–3)"),
            ],
            vec![Part::text("axis 4 ∦ axes 1–3: angle "), a(1, 4)],
            vec![
                Part::text(match Placement::of_plan(plan) {
                    Placement::Apart => "axes 4 and 5 neither meet nor are parallel: ",
                    Placement::Meeting => "axes 4 and 5 meet (axis 6 not through their point): ",
                    Placement::Parallel => "axes 4 and 5 parallel, not one line: ",
                }),
                Part::length(gap(arm, 4, 5)),
                Part::text(" apart, at angle "),
                a(4, 5),
            ],
            vec![
                Part::text("axes 5 and 6 not one line: "),
                Part::length(gap(arm, 5, 6)),
                Part::text(" apart, at angle "),
                a(5, 6),
            ],
            vec![
                Part::text("two links: "),
                Part::length(gap(arm, 1, 2)),
                Part::text(" from axis 1 to axis 2, "),
                Part::length(gap(arm, 2, 3)),
                Part::text(" from axis 2 to axis 3"),
            ],
        ]
    }

    fn steps(&self, plan: &Plan) -> Steps {
        steps::steps(plan)
    }

    fn labels_by_solving(&self) -> bool {
        true
    }

    /// Axis 3's distance from axis 1 conditions joints 1 and 3 (on it, joint 1 is free); its
    /// reach boundaries are where the two bends merge. Joints 4–6 are set by the plane–line
    /// step, whose roots merge at boundaries no single distance measures: judged as bends.
    fn verify_hints(&self, _joints: &[Joint], geometry: &Geometry) -> VerifyHints {
        let from_axis_1 = |e: &BaseParallelEvidence| Distance {
            point: e.axis_3_point,
            moved_by: vec![(1, false)],
            axis: 0,
        };
        let mut hints = VerifyHints {
            aligned_joint: 3,
            aligned_at: Vec::new(),
            axes: [None, None],
            on_axis: None,
            boundaries: Vec::new(),
            // Where axis 5 lines up with axes 1–3, joint 5 joins the planar chain of joints
            // 1–3: they share what the chain alone cannot fix.
            roles: [
                Role::AxisAndSplit(0),
                Role::BendAndSplit,
                Role::AxisAndSplit(0),
                Role::Bend,
                Role::WristSplit,
                Role::WristSplit,
            ],
        };
        let ArmEvidence::BaseParallel(e) = &geometry.arm else {
            return hints;
        };
        hints.axes[0] = Some(from_axis_1(e));
        hints.aligned_at = e.aligned_at.clone();
        for (at, side) in [
            (e.reach_from_axis_1[1], -1.0),
            (e.reach_from_axis_1[0], 1.0),
        ] {
            hints.boundaries.push(SamplerBoundary {
                distance: from_axis_1(e),
                joint: 1,
                at,
                side,
            });
        }
        if e.reach_from_axis_1[0] <= geometry.resolved.distance {
            hints.on_axis = Some(SamplerBoundary {
                distance: from_axis_1(e),
                joint: 1,
                at: 0.0,
                side: 1.0,
            });
        }
        hints
    }
}
