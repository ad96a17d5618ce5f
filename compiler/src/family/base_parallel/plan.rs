//! The base-parallel plan: axes 1, 2 and 3 parallel (Pieper 1968: parallel axes meet at
//! infinity), axes 4, 5 and 6 any revolute axes with axes 4 and 5 apart and not parallel
//! (meeting or parallel axes 4 and 5: [`super::axes_4_5`], chosen in [`target_step`]).
//!
//! # Joints 5 and 6: a plane and a line
//!
//! With `G = B⁻¹ T M⁻¹ = E1 ⋯ E6` and `h = h1` (`h2`, `h3 = ±h`), the motion
//! `A = E1 E2 E3 = G E6⁻¹ E5⁻¹ E4⁻¹` keeps every point's component along `h` and turns every
//! direction about `h` by `Φ = θ1 + s2 θ2 + s3 θ3` (`s_i = h_i · h`). So the plane
//! `Π0 = {y : h · y = h · p4}` through axis 4's point `p4` is kept by `A`, and
//!
//! ```text
//! E4 E5 E6 π = Π0,   π = G⁻¹ Π0   (unit normal n = Rᵀ h, a point q = G⁻¹ p4).
//! ```
//!
//! Joint 4 turns a plane about axis 4 keeping the cosine of its normal to axis 4 and the
//! signed distance of `p4` from it; so joints 5 and 6 must bring `E6 π` and the line of axis 4
//! turned by `E5⁻¹` to `n′ · a′ = h · h4` and `n′ · (o′ − q′) = 0`: the shared plane–line
//! step ([`crate::plan::plane_line`]: a quartic in θ6, θ5 by Cramer's rule, up to 4 roots),
//! with the line's turn `ψL = −θ5` about `h5` and the plane's `ψP = θ6` about `h6`.
//!
//! # Joint 4 and joints 1–3
//!
//! Joint 4 turns `R5 R6 n` onto `h` (Paden–Kahan subproblem 1; never free, since axis 4 is
//! not parallel to `h`). Then `R(h, Φ) = rot(G) R6ᵀ R5ᵀ R4ᵀ`, read on a direction `x ⟂ h`;
//! joints 1 and 2 put axis 3's point `p3` at `A p3 = G E6⁻¹ E5⁻¹ E4⁻¹ p3` (the planar
//! two-link step, law of cosines, 0–2 roots) and joint 3 takes the rest of `Φ`: up to
//! 4 × 2 = 8 solutions.
//!
//! The quartic's roots are routed to four labelled slots ([`crate::plan::route`]) by two signs
//! a controller can hold: the sign of the plane–line Jacobian's determinant (it changes only
//! where two roots merge) and the side of axis 6, turned by joint 5, relative to the plane of
//! axes 4 and 5. Two roots can share both signs, so labels are read by solving.

use armforge_runtime::internal::{BranchRule, CheckKind, ElbowRule, ShoulderRule, WristRule};
use armforge_runtime::plan::{CandidateLayout, CheckLayout};
use armforge_runtime::{Branch, Elbow, Shoulder, Wrist};

use super::axes_4_5::Placement;
use crate::classify::Geometry;
use crate::family::TargetSolution;
use crate::model::Model;
use crate::plan::arm::Arm;
use crate::plan::decouple::{self, Target};
use crate::plan::graph::{Graph, Id};
use crate::plan::planar::{self, TwoLink};
use crate::plan::plane_line::{self, Aim, PlaneLine};
use crate::plan::pose::{self, Motion};
use crate::plan::route;
use crate::plan::subproblems::rotate_onto;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{unit_pair, Plan};

/// Two roots of the quartic whose turns of joints 5 and 6 lie within this (sum of squared
/// differences of cosines and sines, about 1e-7 rad) are one root found twice.
const COPIES: f64 = 1e-14;

/// The constants of a base-parallel arm's plan.
#[derive(Clone, Copy, Debug)]
pub struct Layout {
    /// The common direction of axes 1–3 (axis 1's).
    pub h: [f64; 3],
    /// `±1`: axis 3 is `sense3 · h`.
    pub sense3: f64,
    /// The point of axis 3 the two-link step places.
    pub on_axis_3: [f64; 3],
    /// The point of axis 4 the plane `Π0` passes through.
    pub on_axis_4: [f64; 3],
    /// A unit direction ⟂ `h`, on which the sum Φ is read.
    pub across: [f64; 3],
    /// `h · h4`: the cosine joint 4 keeps.
    pub cos_4: f64,
    /// Joints 1–2 placing `on_axis_3`.
    pub two_link: TwoLink,
    /// Joints 5 (the line's) and 6 (the plane's).
    pub plane_line: PlaneLine,
    /// `h4 × h5`: the normal of the plane of axes 4 and 5 at zero (the wrist label's side).
    pub side_normal: [f64; 3],
    /// A unit direction ⟂ `h5` fixed in link 5: axis 6's part ⟂ `h5`, or, for axes 5 and 6
    /// parallel, the direction from axis 5 to axis 6. Turned by joint 5, its side of the plane
    /// of axes 4 and 5 is the wrist label.
    pub side_direction: [f64; 3],
}

impl Layout {
    /// The layout of an arm whose axes 1–3 are parallel.
    pub fn of(arm: &Arm) -> Layout {
        let h = arm.axis(0);
        let on_axis_3 = arm.point(2);
        Layout {
            h,
            sense3: crate::plan::sign(num::dot(&arm.axis(2), &h)),
            on_axis_3,
            on_axis_4: arm.point(3),
            across: num::any_perpendicular(&h),
            cos_4: num::dot(&h, &arm.axis(3)),
            two_link: TwoLink::new(h, arm.point(0), arm.axis(1), arm.point(1), on_axis_3),
            plane_line: PlaneLine {
                line_joint: (arm.axis(4), arm.point(4)),
                plane_joint: (arm.axis(5), arm.point(5)),
                scale: arm.scale,
            },
            side_normal: num::cross(&arm.axis(3), &arm.axis(4)),
            side_direction: side_direction(arm),
        }
    }
}

/// [`Layout::side_direction`].
fn side_direction(arm: &Arm) -> [f64; 3] {
    let h5 = arm.axis(4);
    let along_6 = num::perpendicular(&arm.axis(5), &h5);
    if num::norm(&along_6) > 1e-6 {
        num::unit(&along_6)
    } else {
        num::unit(&num::perpendicular(
            &num::sub(&arm.point(5), &arm.point(4)),
            &h5,
        ))
    }
}

/// One routed root of the quartic: joints 5 and 6.
struct Hand {
    angles: [Id; 2],
    turns: [(Id, Id); 2],
    aspect: Shoulder,
    side: Wrist,
    check: CheckLayout,
}

/// The four roots of joints 5 and 6, routed to their labelled slots.
fn hands(g: &mut Graph, arm: &Arm, k: &Layout, motion: &Motion) -> Vec<Hand> {
    let (h4, h5) = (arm.axis(3), arm.axis(4));
    let ginv = motion.inverse(g);
    let hk = vec3::constant(g, k.h);
    let normal = motion.rotate_back(g, hk);
    let normal = vec3::name(g, normal, "n", "n = Rᵀ h: the normal of π = G⁻¹ Π0");
    let p4 = vec3::constant(g, k.on_axis_4);
    let on_plane = ginv.apply(g, p4);
    let on_plane = vec3::name(g, on_plane, "q", "q = G⁻¹ p4: a point of π");
    let aim = Aim {
        direction: vec3::constant(g, h4),
        point: p4,
        normal,
        on_plane,
        cos: g.constant(k.cos_4),
        distance: g.constant(0.0),
    };
    let roots = plane_line::solve(g, &k.plane_line, &aim, "pl");
    let near = g.exact_once(COPIES);
    let tol = 1e-10 * arm.scale;
    let tol2 = g.exact(tol * tol);
    let mut routed = Vec::with_capacity(4);
    let mut earlier: Vec<([(Id, Id); 2], Id)> = Vec::with_capacity(4);
    for r in &roots {
        // θ5 = −ψL: the line is turned back by joint 5.
        let (cl, sl) = r.line_turn;
        let turn5 = (cl, g.neg(sl));
        let turns = [turn5, r.plane_turn];
        let before = earlier.iter().map(|(t, res)| (&t[..], *res));
        let residual = route::penalised(g, r.residual, before, &turns, (near, tol2));
        earlier.push((turns, r.residual));
        let side = {
            let d = vec3::constant(g, k.side_direction);
            let turned = vec3::rotate(g, h5, turn5.0, turn5.1, d);
            vec3::dot_const(g, k.side_normal, turned)
        };
        // Among roots with both labels alike, the smaller sin θ6 first: two distinct roots
        // differ in it by more than rounding (|det| would not: a near-double pair has two
        // small determinants of nearly one size).
        let rank = r.plane_turn.1;
        routed.push(route::Root {
            values: vec![turn5.0, turn5.1, r.plane_turn.0, r.plane_turn.1, r.merge],
            residual,
            labels: [r.aspect, side],
            rank,
        });
    }
    route::route(g, &routed, tol)
        .into_iter()
        .map(|slot| {
            let [facing, leading] = slot.labels;
            let tag = slot.tag([["f", "a"], ["l", "t"]]);
            let score = slot.named_score(
                g,
                &tag,
                "the residual of this label's root of the plane–line step (or of a spare root)",
            );
            let v = &slot.values;
            let theta5 = g.atan2(v[1], v[0]);
            let theta5 = g.name(theta5, &format!("q5_{tag}"), "θ5 = −ψL (this label's root)");
            let theta6 = g.atan2(v[3], v[2]);
            let theta6 = g.name(theta6, &format!("q6_{tag}"), "θ6 = ψP (this label's root)");
            Hand {
                angles: [theta5, theta6],
                turns: [(v[0], v[1]), (v[2], v[3])],
                aspect: if facing {
                    Shoulder::Facing
                } else {
                    Shoulder::Across
                },
                side: if leading {
                    Wrist::Leading
                } else {
                    Wrist::Trailing
                },
                check: CheckLayout {
                    kind: CheckKind::Residual,
                    have_squared: score,
                    limit: v[4],
                },
            }
        })
        .collect()
}

/// Joint 4 for one root: turn `R5 R6 n` onto `h` about `h4` (Paden–Kahan subproblem 1).
fn joint_4(g: &mut Graph, arm: &Arm, k: &Layout, n: V3, hand: &Hand, tag: &str) -> (Id, (Id, Id)) {
    let (h4, h5, h6) = (arm.axis(3), arm.axis(4), arm.axis(5));
    let [(c5, s5), (c6, s6)] = hand.turns;
    let x = vec3::rotate(g, h6, c6, s6, n);
    let x = vec3::rotate(g, h5, c5, s5, x);
    let along = vec3::dot_const(g, h4, x);
    let back = vec3::scale_const(g, along, h4);
    let x_perp = vec3::sub(g, x, back);
    let hk = vec3::constant(g, k.h);
    let (nc, ns) = rotate_onto(g, h4, x_perp, hk);
    let turn = unit_pair(g, nc, ns);
    let theta4 = g.atan2(ns, nc);
    let theta4 = g.name(
        theta4,
        &format!("q4_{tag}"),
        "Paden–Kahan 1: θ4 = atan2(h4 · (x⊥ × h), x⊥ · h), x = R5 R6 n",
    );
    (theta4, turn)
}

/// Joints 1–3 for joints 4–6 (turns `[4, 5, 6]`): `Φ` from the orientation, the two-link step
/// placing `p3` at `A p3` (law of cosines), and `≥ 0` where axis 3 is on axis 1.
fn joints_1_to_3(
    g: &mut Graph,
    arm: &Arm,
    (k, motion): (&Layout, &Motion),
    turns: [(Id, Id); 3],
    tag: &str,
) -> (Id, planar::TwoLinkRoots, Id) {
    let (h4, p4) = (arm.axis(3), arm.point(3));
    let (h5, p5) = (arm.axis(4), arm.point(4));
    let (h6, p6) = (arm.axis(5), arm.point(5));
    let [(c4, s4), (c5, s5), (c6, s6)] = turns;
    let y = {
        let x = vec3::constant(g, k.across);
        let a = vec3::rotate_back(g, h4, c4, s4, x);
        let b = vec3::rotate_back(g, h5, c5, s5, a);
        let c = vec3::rotate_back(g, h6, c6, s6, b);
        motion.rotate(g, c)
    };
    let sum = planar::angle_about(g, k.h, k.across, y);
    let sum = g.name(
        sum,
        &format!("phi123_{tag}"),
        "Φ = θ1 + s2 θ2 + s3 θ3 (about h) = atan2(h · (x × y), x · y), y = R R6ᵀ R5ᵀ R4ᵀ x",
    );
    let placed = {
        let a = pose::undo_revolute_const(g, h4, p4, (c4, s4), k.on_axis_3);
        let b = pose::undo_revolute(g, h5, p5, (c5, s5), a);
        let c = pose::undo_revolute(g, h6, p6, (c6, s6), b);
        let d = motion.apply(g, c);
        vec3::add_const(g, d, num::scale(&arm.point(0), -1.0))
    };
    let placed = vec3::name(
        g,
        placed,
        &format!("w3_{tag}"),
        "G E6(−θ6) E5(−θ5) E4(−θ4) p3 − p1: where joints 1 and 2 must put axis 3",
    );
    let d2 = planar::distance_squared(g, k.h, placed);
    let d2 = g.name(
        d2,
        &format!("d2_{tag}"),
        "d² = |(w3 − p1)⊥h|²: squared distance of axis 3 from axis 1",
    );
    let tol = 1e-10 * arm.scale;
    let floor = g.exact(tol * tol);
    let on_axis = g.sub(floor, d2);
    let on_axis = g.name(
        on_axis,
        &format!("on_axis_1_{tag}"),
        "≥ 0 when axis 3 is on axis 1 (joint 1 free: held at its reference)",
    );
    (
        sum,
        planar::solve(g, &k.two_link, placed, d2, tol, tag),
        on_axis,
    )
}

/// The layout, the motion `G` and joint 1's reference angle: what every placement starts from.
pub(super) fn start(g: &mut Graph, arm: &Arm, t: &Target) -> (Layout, Motion, Id) {
    let k = Layout::of(arm);
    let motion = pose::joint_motions(g, arm, t);
    let motion: Motion = pose::name(g, motion, "g", "G = B⁻¹ T M⁻¹ = E1 ⋯ E6");
    let held = g.atan2(t.reference1.1, t.reference1.0);
    let held = g.name(
        held,
        "q1_ref",
        "joint 1's reference (held where it is free)",
    );
    (k, motion, held)
}

/// The candidates of a base-parallel arm for the target `t`: four roots of the plane–line
/// step, two bends of joints 1–2 each.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target) -> Vec<CandidateLayout> {
    let (k, motion, held) = start(g, arm, t);
    let mut out = Vec::with_capacity(8);
    for hand in hands(g, arm, &k, &motion) {
        let tag = format!(
            "{}{}",
            if hand.aspect == Shoulder::Facing {
                "f"
            } else {
                "a"
            },
            if hand.side == Wrist::Leading {
                "l"
            } else {
                "t"
            }
        );
        let n = {
            let hk = vec3::constant(g, k.h);
            motion.rotate_back(g, hk)
        };
        let (theta4, turn4) = joint_4(g, arm, &k, n, &hand, &tag);
        let hand = Joints4To6 {
            angles: [theta4, hand.angles[0], hand.angles[1]],
            turns: [turn4, hand.turns[0], hand.turns[1]],
            shoulder: hand.aspect,
            wrist: hand.side,
            checks: [Some(hand.check), None],
            free: None,
        };
        finish_hand(g, arm, (&k, &motion, held), &hand, &tag, &mut out);
    }
    out
}

/// One solution of joints 4–6, ready for joints 1–3.
pub(super) struct Joints4To6 {
    /// θ4, θ5, θ6 (model values).
    pub angles: [Id; 3],
    /// Their (cos, sin) pairs.
    pub turns: [(Id, Id); 3],
    /// The shoulder label.
    pub shoulder: Shoulder,
    /// The wrist label.
    pub wrist: Wrist,
    /// The checks of joints 4–6: the first before the two-link step's, the second after.
    pub checks: [Option<CheckLayout>; 2],
    /// `≥ 0` where a joint of 4–6 is free (held at its reference).
    pub free: Option<Id>,
}

/// Joints 1–3 for one solution of joints 4–6 (two bends of joints 1–2), appended to `out`.
pub(super) fn finish_hand(
    g: &mut Graph,
    arm: &Arm,
    (k, motion, held): (&Layout, &Motion, Id),
    hand: &Joints4To6,
    tag: &str,
    out: &mut Vec<CandidateLayout>,
) {
    let (sum, two, on_axis) = joints_1_to_3(g, arm, (k, motion), hand.turns, tag);
    for bend in &two.bends {
        let btag = format!("{tag}{}", if bend.bend > 0.0 { "a" } else { "b" });
        // Axis 3 on axis 1: joint 1 is free, held at its reference; joint 3 takes the rest.
        let theta1 = g.select(on_axis, held, bend.first);
        let theta1 = g.name(
            theta1,
            &format!("q1_{btag}"),
            "θ1 (the reference where axis 3 is on axis 1)",
        );
        // θ3 = s3 (Φ − θ1 − φ2), φ2 = s2 θ2.
        let phi2 = if k.two_link.sense > 0.0 {
            bend.second
        } else {
            g.neg(bend.second)
        };
        let rest = g.sub(sum, theta1);
        let rest = g.sub(rest, phi2);
        let theta3 = if k.sense3 > 0.0 { rest } else { g.neg(rest) };
        let theta3 = g.name(
            theta3,
            &format!("q3_{btag}"),
            format!("θ3 = {} (Φ − θ1 − φ2)", k.sense3),
        );
        let [theta4, theta5, theta6] = hand.angles;
        out.push(CandidateLayout {
            model_values: [theta1, bend.second, theta3, theta4, theta5, theta6],
            branch: Branch {
                shoulder: hand.shoulder,
                elbow: if bend.bend > 0.0 {
                    Elbow::Up
                } else {
                    Elbow::Down
                },
                wrist: hand.wrist,
            },
            checks: [
                hand.checks[0],
                Some(two.checks[0]),
                Some(two.checks[1]),
                hand.checks[1],
            ],
            wrist_aligned: hand.free,
            on_axis_1: Some(on_axis),
        });
    }
}

/// The fallback label rule (labels are read by solving; this rule is used only where no
/// solution is found): the wrist label from the side of axis 6 turned by joint 5 relative to
/// the plane of axes 4 and 5; the other two are read by solving only.
pub fn rule(arm: &Arm) -> BranchRule {
    let k = Layout::of(arm);
    BranchRule {
        shoulder: ShoulderRule::Only,
        elbow: ElbowRule::Only,
        wrist: WristRule {
            normal: k.side_normal,
            axis5: arm.axis(4),
            axis6: k.side_direction,
        },
        mirrored: false,
    }
}

/// The solve of a base-parallel arm for the target `t` (the family's
/// [`crate::family::TargetStep`], which the tool-first family reuses for arms whose axes 4–6
/// are parallel). Joint 1 is held at its reference where axis 3 is on axis 1 (the free joints
/// `[0, 3]`: joint 4 is never free); where two roots merge the solver flags the candidates at
/// the reach limit.
pub fn target_step(
    g: &mut Graph,
    model: &Model,
    geometry: &Geometry,
    t: &Target,
) -> TargetSolution {
    let arm = Arm::with_center(model, geometry.family, geometry.wrist_center);
    let tol = &geometry.resolved;
    let placement = Placement::of(&arm, tol.distance, tol.angle);
    if placement != Placement::Apart {
        // Joint 6 is held at its reference where it is free (axis 6 along axes 1–3); the
        // wrist check compares the cone of `z` around `h4` (cosine `h4 · h`) with axis 5.
        let candidates = super::axes_4_5::solve(g, &arm, t, placement);
        let twist = [
            num::dot(&arm.axis(3), &arm.axis(0)),
            num::dot(&arm.axis(3), &arm.axis(4)),
        ];
        return TargetSolution {
            rule: rule(&arm),
            arm,
            candidates,
            twist,
            free: [0, 5],
        };
    }
    let candidates = solve(g, &arm, t);
    let rule = rule(&arm);
    let twist = [
        num::dot(&arm.axis(3), &arm.axis(4)),
        num::dot(&arm.axis(4), &arm.axis(5)),
    ];
    TargetSolution {
        arm,
        candidates,
        rule,
        twist,
        free: [0, 3],
    }
}

/// The plan of a base-parallel arm; labels are read by solving.
pub fn build(model: &Model, geometry: &Geometry) -> Plan {
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let s = target_step(&mut g, model, geometry, &t);
    let mut plan = crate::plan::assemble(s.arm, &g, &s.candidates, s.rule, s.twist, s.free);
    plan.labels_by_solving = true;
    plan
}
