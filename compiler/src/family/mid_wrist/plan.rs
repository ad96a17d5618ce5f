//! The mid-wrist plan: axes 2, 3, 4 meet in a point `b` (Pieper 1968: three consecutive axes
//! meeting), axes 1, 5, 6 are any revolute axes.
//!
//! # The point `b`
//!
//! With `G = B⁻¹ T M⁻¹ = E1 E2 E3 E4 E5 E6` and joints 2–4 turning about lines through `b`
//! (so `E2 E3 E4 b = b`):
//!
//! ```text
//! G E6⁻¹ E5⁻¹ b = E1 b   ⇔   b = E5(θ5) E6(θ6) G⁻¹ E1(θ1) b.
//! ```
//!
//! Read from the right, this is a three-joint chain placing one point at a fixed target: joint 1
//! moves `b` on a circle about axis 1, `G⁻¹` carries that circle into the frame where axes 5
//! and 6 keep their zero positions, and joints 6 then 5 must bring it back onto `b`. It is the
//! general family's position problem (Pieper's quartic, [`crate::family::general::plan`]) with
//! its "axis 1" axis 5, its "axis 2" axis 6, the target `b`, and a "joint 3" that moves the point
//! on the circle `r(θ1) = G⁻¹ E1(θ1) b − f2 = r0 + cos θ1 rc + sin θ1 rs`, whose center and
//! radii follow the target:
//!
//! ```text
//! r0 = Rᵀ (o1 − t) − f2,   rc = Rᵀ v⊥,   rs = Rᵀ (h1 × v⊥),
//! ```
//!
//! with `G = (R, t)`, `v = b − p1`, `o1 = p1 + (h1 · v) h1` the circle's center and `v⊥` its
//! radius at zero. Up to 4 roots `(θ5, θ6, θ1)` (the general family's routing to four
//! labelled slots, one Newton step each).
//!
//! # The middle wrist
//!
//! Joints 2–4 then make the rotation that is left, `R2 R3 R4 = R1ᵀ rot(G) R6ᵀ R5ᵀ`: a
//! spherical wrist with axes 2, 3, 4, solved as every wrist is ([`crate::plan::wrist`]): two
//! solutions each, 8 in all.

use armforge_runtime::internal::BranchRule;
use armforge_runtime::plan::{CandidateLayout, CheckLayout};
use armforge_runtime::Branch;

use crate::classify::Geometry;
use crate::family::general::plan::{self as general, Circle, Constants};
use crate::family::TargetSolution;
use crate::model::Model;
use crate::plan::arm::Arm;
use crate::plan::decouple::{self, Target};
use crate::plan::graph::Graph;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{pose, wrist, ArmSolution, Plan, Turn};

use super::polish;

/// The position chain in the general family's terms: its lines (axis 5, axis 6, axis 1) and
/// the placed point `b`.
///
/// Two roots count as one only within about 1e-7 rad (the general family's 1e-5 rad would
/// merge the two real roots of a near-double pair): joints 2–4 come after the chain here, and
/// where the middle wrist nearly lines up, 1e-6 rad in the chain is tens of degrees in them.
/// The polish ([`super::polish`]) brings a complex pair's real part onto its real root well
/// within that.
pub fn chain(arm: &Arm) -> Constants {
    let lines = [4, 5, 0].map(|i| (arm.axis(i), arm.point(i)));
    Constants {
        copies: 1e-14,
        ..general::constants_of(lines, arm.wrist_center, arm.scale)
    }
}

/// The arm with its joints 2–4 in the places of a wrist (joints 4–6), for the wrist's solve
/// and label rule; the other places hold joints 1, 5, 6.
pub fn wrist_arm(arm: &Arm) -> Arm {
    let j = &arm.joints;
    Arm {
        joints: [j[0], j[4], j[5], j[1], j[2], j[3]],
        ..arm.clone()
    }
}

/// The circle joint 1 moves `b` on, carried by `G⁻¹` and seen from `f2`.
fn circle(g: &mut Graph, arm: &Arm, k: &Constants, ginv: &pose::Motion) -> Circle {
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let v = num::sub(&arm.wrist_center, &p1);
    let center = num::add(&p1, &num::scale(&h1, num::dot(&h1, &v)));
    let v_perp = num::perpendicular(&v, &h1);
    let turned = num::cross(&h1, &v_perp);
    let f2 = num::add(&k.f1, &num::scale(&k.n, k.a));
    let o = vec3::constant(g, center);
    let o = ginv.apply(g, o);
    let r0 = vec3::add_const(g, o, num::scale(&f2, -1.0));
    let rc = vec3::constant(g, v_perp);
    let rs = vec3::constant(g, turned);
    let r = Circle {
        r0: vec3::name(
            g,
            r0,
            "r0",
            "r0 = G⁻¹ o1 − f2: the circle of b about axis 1, center",
        ),
        rc: ginv.rotate(g, rc),
        rs: ginv.rotate(g, rs),
    };
    Circle {
        rc: vec3::name(g, r.rc, "rc", "rc = rot(G)ᵀ v⊥: its radius at θ1 = 0"),
        rs: vec3::name(g, r.rs, "rs", "rs = rot(G)ᵀ (h1 × v⊥): a quarter turn on"),
        ..r
    }
}

/// The root `s` of the chain after [`polish::polish`]: its angles, turns and check, and the
/// flag of a free joint 6.
fn polished(
    g: &mut Graph,
    arm: &Arm,
    circle: (&Circle, [f64; 3]),
    t: &Target,
    s: &ArmSolution,
    n: usize,
) -> ArmSolution {
    let turns = [0, 1, 2].map(|i| (s.undo[i].cos, s.undo[i].sin));
    let check = s.checks[0];
    let p = polish::polish(g, arm, circle, t, (turns, check.have_squared), n);
    let notes = [
        "θ5, polished",
        "θ6, fitted again (held at its reference when free)",
        "θ1, polished",
    ];
    let names = ["q5", "q6", "q1"];
    let angles = [0, 1, 2].map(|i| {
        let (c, s) = p.turns[i];
        let a = g.atan2(s, c);
        g.name(a, &format!("{}_{n}", names[i]), notes[i])
    });
    let residual = g.name(
        p.residual,
        &format!("miss_{n}"),
        "|E5 E6 G⁻¹ E1 b − b|² (and the routing's penalty)",
    );
    ArmSolution {
        angles,
        undo: [0, 1, 2]
            .map(|i| Turn::about(s.undo[i].axis, p.turns[i]))
            .to_vec(),
        shoulder: s.shoulder,
        elbow: s.elbow,
        checks: vec![CheckLayout {
            have_squared: residual,
            ..check
        }],
        on_axis_1: Some(p.free6),
    }
}

/// `R2 R3 R4 d = R1ᵀ rot(G) R6ᵀ R5ᵀ d` for a constant direction `d`.
fn left_for_wrist(
    g: &mut Graph,
    arm: &Arm,
    s: &ArmSolution,
    rot_g: &pose::Motion,
    d: [f64; 3],
) -> V3 {
    // The chain's turns are (joint 5, joint 6, joint 1).
    let [t5, t6, t1] = [&s.undo[0], &s.undo[1], &s.undo[2]];
    let x = vec3::constant(g, d);
    let x = vec3::rotate_back(g, t5.axis, t5.cos, t5.sin, x);
    let x = vec3::rotate_back(g, t6.axis, t6.cos, t6.sin, x);
    let x = rot_g.rotate(g, x);
    let h1 = arm.axis(0);
    vec3::rotate_back(g, h1, t1.cos, t1.sin, x)
}

/// The candidates of a mid-wrist arm for the target `t`: four roots of the position chain,
/// two middle-wrist solutions each.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target) -> (Vec<CandidateLayout>, BranchRule) {
    let k = chain(arm);
    let motion = pose::joint_motions(g, arm, t);
    let motion = pose::name(g, motion, "g", "G = B⁻¹ T M⁻¹ = E1 ⋯ E6");
    let ginv = motion.inverse(g);
    let r = circle(g, arm, &k, &ginv);
    let b = vec3::constant(g, arm.wrist_center);
    let f2 = num::add(&k.f1, &num::scale(&k.n, k.a));
    let mut roots: Vec<ArmSolution> = general::solve_on(g, (arm.scale, &k, &r), t, b)
        .iter()
        .enumerate()
        .map(|(i, s)| polished(g, arm, (&r, f2), t, s, i + 1))
        .collect();
    polish::drop_copies(g, &mut roots, k.copies, 1e-10 * arm.scale);
    let shifted = wrist_arm(arm);
    let axes = wrist::WristAxes::of(&shifted);
    let mut candidates = Vec::new();
    for (i, s) in roots.iter().enumerate() {
        let tag = format!("b{}", i + 1);
        let v = left_for_wrist(g, arm, s, &motion, axes.h6);
        let v = vec3::name(
            g,
            v,
            &format!("v_{tag}"),
            "v = R234 h4 = R1ᵀ rot(G) R6ᵀ R5ᵀ h4",
        );
        let xv = left_for_wrist(g, arm, s, &motion, axes.x6);
        let xv = vec3::name(
            g,
            xv,
            &format!("xv_{tag}"),
            "R234 x4 = R1ᵀ rot(G) R6ᵀ R5ᵀ x4",
        );
        let [q5, q6, q1] = s.angles;
        for w in wrist::solve(g, &shifted, v, xv, t.reference4, &tag) {
            let mut checks = [None; 4];
            for (slot, c) in checks.iter_mut().zip(s.checks.iter().chain(w.check.iter())) {
                *slot = Some(*c);
            }
            candidates.push(CandidateLayout {
                model_values: [q1, w.angles[0], w.angles[1], w.angles[2], q5, q6],
                branch: Branch {
                    shoulder: s.shoulder,
                    elbow: s.elbow,
                    wrist: w.wrist,
                },
                checks,
                wrist_aligned: Some(w.aligned),
                on_axis_1: s.on_axis_1,
            });
        }
    }
    let (shoulder, elbow) = general::rules(arm, &k);
    let rule = BranchRule {
        shoulder,
        elbow,
        wrist: wrist::rule(&shifted),
        mirrored: false,
    };
    (candidates, rule)
}

/// The solve of a mid-wrist arm for the target `t` (the family's
/// [`crate::family::TargetStep`], which the tool-first family reuses for arms whose axes 3–5
/// meet). Joint 2 is held at its reference where the middle wrist lines up, joint 6 where `b`
/// is on axis 6 (the free joints `[5, 1]`: the target's reference inputs are theirs).
pub fn target_step(
    g: &mut Graph,
    model: &Model,
    geometry: &Geometry,
    t: &Target,
) -> TargetSolution {
    let arm = Arm::with_center(model, geometry.family, geometry.wrist_center);
    let (candidates, rule) = solve(g, &arm, t);
    let w = wrist::WristAxes::of(&wrist_arm(&arm));
    TargetSolution {
        arm,
        candidates,
        rule,
        twist: [num::dot(&w.h4, &w.h5), num::dot(&w.h5, &w.h6)],
        free: [5, 1],
    }
}

/// The plan of a mid-wrist arm. Two roots of the quartic can share a geometric label: labels
/// are read by solving.
pub fn build(model: &Model, geometry: &Geometry) -> Plan {
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let s = target_step(&mut g, model, geometry, &t);
    let mut plan = crate::plan::assemble(s.arm, &g, &s.candidates, s.rule, s.twist, s.free);
    plan.labels_by_solving = true;
    plan
}
