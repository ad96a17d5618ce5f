//! Axes 2, 3, 4 parallel and axes 5, 6 passing apart: joints 1, 5 and 6 through the shared
//! plane–line quartic ([`crate::plan::plane_line`]; Pieper 1968: parallel axes meet at
//! infinity), joints 2–4 as the three-parallel family's planar chain.
//!
//! Joints 2–4 turn about lines parallel to `h`: they keep every plane ⟂ `h` with its offset
//! along `h`. With `G = B⁻¹ T M⁻¹ = E1 ⋯ E6` and `Π` the plane ⟂ `h` through the point `p1` of
//! axis 1, `E1⁻¹ G E6⁻¹ E5⁻¹` must keep `Π`; so `G E6⁻¹ E5⁻¹ Π = E1 Π`, a plane with the cosine
//! `h · h1` to axis 1 and through `p1`. Read from link 4, with axis 1 seen from the tool
//! (`ℓ = G⁻¹ L1`: direction `a = Rᵀ h1`, point `o = G⁻¹ p1`):
//!
//! ```text
//! the plane Π turned by E5⁻¹ (ψP = −θ5) and the line ℓ turned by E6 (ψL = θ6) have
//! n′ · a′ = h · h1   and   n′ · (o′ − q′) = 0,
//! ```
//!
//! a quartic in `θ5` with `θ6` back-substituted (up to 4 roots). Then:
//!
//! 1. Joint 1, Paden–Kahan subproblem 1: turn `h` onto `R R6ᵀ R5ᵀ h` about axis 1.
//! 2. Joints 2–4: the sum `Φ` and the planar two-link step, as in the three-parallel family.
//!
//! Up to 4 × 2 = 8 solutions. Joint 6 is free where axis 6 lines up with the parallel axes
//! (held at the reference, the sum `Φ` takes the rest). Roots merge where axis 1 and axis 6
//! lie in one plane (a force along `h` through their meeting point meets every axis).
//!
//! Labels: the shoulder label is the three-parallel family's (the side of the plane through
//! axis 1 that `E2 ⋯ E6 q` is on, `q` the midpoint of the common normal of axes 5 and 6), the
//! wrist label the side of axis 6 from the plane of axis 5 and the parallel axes; each root of
//! the quartic is routed to the slot of its labels ([`crate::plan::route`]), so labels are
//! read by solving.

use armforge_runtime::internal::{CheckKind, ShoulderRule};
use armforge_runtime::plan::{CandidateLayout, CheckLayout};
use armforge_runtime::{Shoulder, Wrist};

use crate::classify::Geometry;
use crate::family::three_parallel::plan::{joints_2_to_4, rules, Layout, Outer};
use crate::family::TargetSolution;
use crate::model::Model;
use crate::plan::arm::Arm;
use crate::plan::decouple::{self, Target};
use crate::plan::graph::{Graph, Id};
use crate::plan::plane_line::{self, Aim, PlaneLine};
use crate::plan::pose::{self, Motion};
use crate::plan::route;
use crate::plan::subproblems::rotate_onto;
use crate::plan::vec3::{self, num, V3};
use crate::plan::wrist::ALIGNED_SINE;
use crate::plan::{unit_pair, Plan};
use crate::units::tidy;

/// Two roots whose turns lie closer than this (sum of squared differences of cosines and
/// sines) are one root found twice (about 1e-5 rad; as the general family's).
const COPIES: f64 = 1e-10;

/// The three-parallel family's shoulder rule, as `(normal, point, center, facing)`.
fn shoulder_plane(arm: &Arm) -> ([f64; 3], [f64; 3], [f64; 3], f64) {
    match rules(arm).shoulder {
        ShoulderRule::Plane {
            normal,
            point,
            wrist_center,
            facing,
        } => (normal, point, wrist_center, facing),
        // The elbow family's rule is a plane; a radial rule reads alike with its direction.
        ShoulderRule::Radial {
            direction,
            point,
            wrist_center,
        } => (direction, point, wrist_center, 1.0),
        ShoulderRule::Only => ([0.0; 3], [0.0; 3], [0.0; 3], 1.0),
    }
}

/// Joints 1, 5, 6 of one root, with its labels' signs.
struct Hand {
    angles: [Id; 3],
    turns: [(Id, Id); 3],
    /// `≥ 0` where axis 6 lines up with the parallel axes (joint 6 held).
    aligned: Id,
    /// `≥ 0` for the `Facing` shoulder.
    shoulder: Id,
    /// `≥ 0` for the `Leading` wrist.
    wrist: Id,
}

/// Joints 6, 5 and 1 of one root of the quartic.
fn hand(
    g: &mut Graph,
    (arm, k, motion): (&Arm, &Layout, &Motion),
    root: &plane_line::Root,
    (reference, center): ((Id, Id), V3),
    n: usize,
) -> Hand {
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let h6 = arm.axis(5);
    // ψP = −θ5: the plane's normal turned is m = R5ᵀ h.
    let (c5, s5) = (root.plane_turn.0, g.neg(root.plane_turn.1));
    let m = root.normal;
    // |h6 × m|² from the cross product: 1 − (h6·m)² would round to zero 1e-8 rad from the
    // alignment.
    let aligned = {
        let h6k = vec3::constant(g, h6);
        let x = vec3::cross(g, h6k, m);
        let perp2 = vec3::dot(g, x, x);
        let floor = g.exact(ALIGNED_SINE * ALIGNED_SINE);
        g.sub(floor, perp2)
    };
    let aligned = g.name(
        aligned,
        &format!("aligned_{n}"),
        format!("≥ 0 when axis 6 is within {ALIGNED_SINE:e} of the parallel axes' direction"),
    );
    let c6 = g.select(aligned, reference.0, root.line_turn.0);
    let s6 = g.select(aligned, reference.1, root.line_turn.1);
    let theta5 = g.atan2(s5, c5);
    let theta5 = g.name(
        theta5,
        &format!("q5_{n}"),
        "θ5 = −ψP (the plane turned by E5⁻¹)",
    );
    let theta6 = g.atan2(s6, c6);
    let theta6 = g.name(
        theta6,
        &format!("q6_{n}"),
        "θ6 = ψL (the reference where axis 6 lines up with the parallel axes)",
    );
    // Joint 1 turns h onto R R6ᵀ R5ᵀ h about axis 1.
    let seen = {
        let back = vec3::rotate_back(g, h6, c6, s6, m);
        motion.rotate(g, back)
    };
    let seen = vec3::name(
        g,
        seen,
        &format!("n1_{n}"),
        "R R6ᵀ R5ᵀ h: the parallel axes' direction that joint 1 must produce",
    );
    let h_perp = {
        let along = num::dot(&k.h, &h1);
        num::sub(&k.h, &num::scale(&h1, along))
    };
    let hp = vec3::constant(g, h_perp);
    let (nc, ns) = rotate_onto(g, h1, hp, seen);
    let (c1, s1) = unit_pair(g, nc, ns);
    let theta1 = g.atan2(s1, c1);
    let theta1 = g.name(
        theta1,
        &format!("q1_{n}"),
        "Paden–Kahan 1: θ1 turns h onto R R6ᵀ R5ᵀ h about axis 1",
    );
    let (normal, point, _, facing) = shoulder_plane(arm);
    let shoulder = {
        let undone = pose::undo_revolute(g, h1, p1, (c1, s1), center);
        let rel = vec3::add_const(g, undone, num::scale(&point, -1.0));
        let side = vec3::dot_const(g, normal, rel);
        let f = g.constant(facing);
        g.mul(f, side)
    };
    let shoulder = g.name(shoulder, &format!("side_{n}"), "≥ 0: shoulder facing");
    let wrist = g.name(
        root.aspect,
        &format!("aspect_{n}"),
        "≥ 0: wrist leading (the sign of the two equations' Jacobian in θ6, −θ5)",
    );
    Hand {
        angles: [theta1, theta5, theta6],
        turns: [(c1, s1), (c5, s5), (c6, s6)],
        aligned,
        shoulder,
        wrist,
    }
}

/// The quartic's roots for the target behind `motion`, each carried through joints 6, 5, 1,
/// routed to the four labelled slots: `(values, score)`, values
/// `[θ1, θ5, θ6, c1, s1, c5, s5, c6, s6, merge, aligned]`.
fn slots(
    g: &mut Graph,
    (arm, k, motion): (&Arm, &Layout, &Motion),
    reference: (Id, Id),
) -> Vec<route::Slot> {
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let line = {
        let hk = vec3::constant(g, h1);
        motion.rotate_back(g, hk)
    };
    let line = vec3::name(
        g,
        line,
        "a1",
        "a = Rᵀ h1: axis 1's direction seen from the tool",
    );
    let inverse = motion.inverse(g);
    let through = {
        let pk = vec3::constant(g, p1);
        inverse.apply(g, pk)
    };
    let through = vec3::name(
        g,
        through,
        "o1",
        "o = G⁻¹ p1: axis 1's point seen from the tool",
    );
    let cos = num::dot(&k.h, &h1);
    let aim = Aim {
        direction: line,
        point: through,
        normal: vec3::constant(g, k.h),
        on_plane: vec3::constant(g, p1),
        cos: g.constant(cos),
        distance: g.constant(0.0),
    };
    let step = PlaneLine {
        line_joint: (arm.axis(5), arm.point(5)),
        plane_joint: (arm.axis(4), arm.point(4)),
        scale: arm.scale,
    };
    let roots = plane_line::solve(g, &step, &aim, "j56");
    let center = {
        let q = vec3::constant(g, k.meeting);
        motion.apply(g, q)
    };
    let center = vec3::name(
        g,
        center,
        "gq",
        &format!(
            "G q, q = ({}, {}, {}) m: the midpoint of the common normal of axes 5 and 6",
            tidy(k.meeting[0]),
            tidy(k.meeting[1]),
            tidy(k.meeting[2])
        ),
    );
    let hands: Vec<Hand> = roots
        .iter()
        .enumerate()
        .map(|(i, r)| hand(g, (arm, k, motion), r, (reference, center), i + 1))
        .collect();
    let tol = 1e-10 * arm.scale;
    let near = g.exact_once(COPIES);
    let tol2 = g.exact(tol * tol);
    let tie_weight = g.constant(1e-6 * arm.scale);
    let mut routed = Vec::with_capacity(4);
    for (j, (r, h)) in roots.iter().zip(&hands).enumerate() {
        let before = roots[..j]
            .iter()
            .zip(&hands)
            .map(|(earlier, e)| (&e.turns[1..3], earlier.residual));
        let residual = route::penalised(g, r.residual, before, &h.turns[1..3], (near, tol2));
        let side = g.abs(h.shoulder);
        let tie = g.mul(tie_weight, h.angles[1]);
        let rank = g.sub(tie, side);
        let mut values = h.angles.to_vec();
        values.extend(h.turns.iter().flat_map(|&(c, s)| [c, s]));
        values.extend([r.merge, h.aligned]);
        routed.push(route::Root {
            values,
            residual,
            labels: [h.shoulder, h.wrist],
            rank,
        });
    }
    route::route(g, &routed, tol)
}

/// The candidates of an offset-hand arm (every branch), from the target `t`.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target) -> Vec<CandidateLayout> {
    let k = Layout::of(arm);
    let motion = pose::joint_motions(g, arm, t);
    let motion: Motion = pose::name(g, motion, "g", "G = B⁻¹ T M⁻¹ = E1 ⋯ E6");
    let mut out = Vec::with_capacity(8);
    for slot in slots(g, (arm, &k, &motion), t.reference4) {
        let [facing, leading] = slot.labels;
        let tag = slot.tag([["f", "a"], ["l", "t"]]);
        let score = slot.named_score(g, &tag, route::SPARE_NOTE);
        let v = &slot.values;
        let angles = [(0, 1), (1, 5), (2, 6)]
            .map(|(i, joint)| g.name(v[i], &format!("q{joint}_{tag}"), "this label's root"));
        let outer = Outer {
            angles,
            turns: [(v[3], v[4]), (v[5], v[6]), (v[7], v[8])],
            shoulder: if facing {
                Shoulder::Facing
            } else {
                Shoulder::Across
            },
            wrist: if leading {
                Wrist::Leading
            } else {
                Wrist::Trailing
            },
            checks: [
                Some(CheckLayout {
                    kind: CheckKind::Residual,
                    have_squared: score,
                    limit: v[9],
                }),
                None,
            ],
            wrist_aligned: Some(v[10]),
            on_axis_1: None,
        };
        out.extend(joints_2_to_4(g, arm, (&k, &motion), &outer, &tag));
    }
    out
}

/// The solve of an offset-hand arm for the target `t` (the family's
/// [`crate::family::TargetStep`]); joint 6 is held at the reference when free.
pub fn target_step(
    g: &mut Graph,
    model: &Model,
    geometry: &Geometry,
    t: &Target,
) -> TargetSolution {
    let probe = Arm::with_center(model, geometry.family, [0.0; 3]);
    let k = Layout::of(&probe);
    let arm = Arm::with_center(model, geometry.family, k.meeting);
    let candidates = solve(g, &arm, t);
    TargetSolution {
        rule: rules(&arm),
        twist: k.twist_cosines(&arm),
        arm,
        candidates,
        free: [0, 5],
    }
}

/// The plan of an offset-hand arm. Two roots of the quartic can share a geometric label:
/// labels are read by solving.
pub fn build(model: &Model, geometry: &Geometry) -> Plan {
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let s = target_step(&mut g, model, geometry, &t);
    let mut plan = crate::plan::assemble(s.arm, &g, &s.candidates, s.rule, s.twist, s.free);
    plan.labels_by_solving = true;
    plan
}
