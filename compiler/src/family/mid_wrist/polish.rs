//! Two Newton steps on the mid-wrist's three position equations, and joint 6 held where it is
//! free.
//!
//! The general family's quartic polishes each root on the two equations joint 5 (its joint 1)
//! leaves, in joints 6 and 1. Where the meeting point `b` nears axis 6 (a singular
//! configuration of this family: joint 6 cannot move `b`), joint 6's column of those equations
//! vanishes, the step is refused, and the root keeps the quartic's near-double-root error
//! (about √ε: a miss of nanometres). Here, per root:
//!
//! ```text
//! x(θ5, θ6, θ1) = E5(θ5) E6(θ6) m(θ1),   m(θ1) = G⁻¹ E1(θ1) b,   F = x − b = 0,
//! J = [h5 × (x − p5),  R5 (h6 × (E6 m − p6)),  R5 R6 ∂m/∂θ1],   (δ5, δ6, δ1) = −J⁻¹ F,
//! ```
//!
//! joints 5 and 1 take their steps (two, each kept when short and when it lowers the miss;
//! the second matters in `f32`, whose quartic leaves √ε₃₂ ≈ 3e-4 rad near a double root),
//! and joint 6 is fitted again (Paden–Kahan subproblem 1 about axis 6: `E6 m` onto `E5⁻¹ b`). Near axis 6
//! its column is small and its step large but harmless: joint 6 barely moves `b` there. With
//! `m` within the length tolerance of axis 6, joint 6 is free: it is held at its reference
//! (its current value in `solve_near`) and the candidate is flagged.
//!
//! Within 1e-6 of the arm's size of axis 6 the roots stay double-root accurate (about √ε in
//! the joints); there the check accepts a miss up to 5e-9 of the arm's size (measured: up to
//! 6e-10 on the incubator-threader example), and the candidate is flagged at the reach limit.

use crate::family::general::plan::Circle;
use crate::plan::graph::{Graph, Id};
use crate::plan::pose;
use crate::plan::quartic::away_from_zero;
use crate::plan::route;
use crate::plan::subproblems::rotate_onto;
use crate::plan::turn_by;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{unit_pair, Arm, ArmSolution, Target};

/// One position root of the chain, polished: the turns of joints 5, 6, 1, its miss
/// `|x − b|²`, and `≥ 0` when joint 6 is free.
pub struct Polished {
    /// `(cos, sin)` of joints 5, 6, 1 (model values).
    pub turns: [(Id, Id); 3],
    /// `|E5 E6 m − b|²`.
    pub residual: Id,
    /// `≥ 0` when `m` is on axis 6 (within the length tolerance): joint 6 held.
    pub free6: Id,
}

/// The chain's pieces for one set of turns.
struct Placed {
    /// `m(θ1)`.
    m: V3,
    /// `E6 m`.
    y: V3,
    /// `E5 E6 m`.
    x: V3,
}

fn place(
    g: &mut Graph,
    arm: &Arm,
    (r, f2): (&Circle, [f64; 3]),
    [t5, t6, t1]: [(Id, Id); 3],
) -> Placed {
    let (h5, p5) = (arm.axis(4), arm.point(4));
    let (h6, p6) = (arm.axis(5), arm.point(5));
    let m = {
        let a = vec3::scale(g, t1.0, r.rc);
        let b = vec3::scale(g, t1.1, r.rs);
        let ab = vec3::add(g, a, b);
        let around = vec3::add(g, ab, r.r0);
        vec3::add_const(g, around, f2)
    };
    let y = {
        let rel = vec3::add_const(g, m, num::scale(&p6, -1.0));
        let turned = vec3::rotate(g, h6, t6.0, t6.1, rel);
        vec3::add_const(g, turned, p6)
    };
    let x = {
        let rel = vec3::add_const(g, y, num::scale(&p5, -1.0));
        let turned = vec3::rotate(g, h5, t5.0, t5.1, rel);
        vec3::add_const(g, turned, p5)
    };
    Placed { m, y, x }
}

/// `|x − b|²`.
fn miss(g: &mut Graph, x: V3, b: [f64; 3]) -> Id {
    let d = vec3::add_const(g, x, num::scale(&b, -1.0));
    vec3::dot(g, d, d)
}

/// Joint 6 fitted: `E6 m` turned onto `E5(−θ5) b` about axis 6, and `|m⊥h6|²` (from axis 6).
fn fit_joint_6(g: &mut Graph, arm: &Arm, t5: (Id, Id), m: V3) -> ((Id, Id), Id) {
    let (h5, p5) = (arm.axis(4), arm.point(4));
    let (h6, p6) = (arm.axis(5), arm.point(5));
    let b = vec3::constant(g, arm.wrist_center);
    let back = pose::undo_revolute(g, h5, p5, t5, b);
    let want = vec3::add_const(g, back, num::scale(&p6, -1.0));
    let have = vec3::add_const(g, m, num::scale(&p6, -1.0));
    let along = vec3::dot_const(g, h6, have);
    let axial = vec3::scale_const(g, along, h6);
    let have_perp = vec3::sub(g, have, axial);
    let (c, s) = rotate_onto(g, h6, have_perp, want);
    let off_axis = vec3::dot(g, have_perp, have_perp);
    (unit_pair(g, c, s), off_axis)
}

/// One Newton step from `turns`, kept when short and when it lowers the miss; joint 6 fitted
/// again with the step. `n` names the step's flag.
fn step(
    g: &mut Graph,
    arm: &Arm,
    (r, f2): (&Circle, [f64; 3]),
    turns: [(Id, Id); 3],
    n: &str,
) -> [(Id, Id); 3] {
    let (h5, p5) = (arm.axis(4), arm.point(4));
    let (h6, p6) = (arm.axis(5), arm.point(5));
    let b = arm.wrist_center;
    let before = place(g, arm, (r, f2), turns);
    let miss0 = miss(g, before.x, b);
    let [t5, t6, t1] = turns;
    // J's columns and F.
    let f = vec3::add_const(g, before.x, num::scale(&b, -1.0));
    let a5 = {
        let h = vec3::constant(g, h5);
        let rel = vec3::add_const(g, before.x, num::scale(&p5, -1.0));
        vec3::cross(g, h, rel)
    };
    let a6 = {
        let h = vec3::constant(g, h6);
        let rel = vec3::add_const(g, before.y, num::scale(&p6, -1.0));
        let c = vec3::cross(g, h, rel);
        vec3::rotate(g, h5, t5.0, t5.1, c)
    };
    let a1 = {
        let p = vec3::scale(g, t1.0, r.rs);
        let q = vec3::scale(g, t1.1, r.rc);
        let dm = vec3::sub(g, p, q);
        let d6 = vec3::rotate(g, h6, t6.0, t6.1, dm);
        vec3::rotate(g, h5, t5.0, t5.1, d6)
    };
    let a61 = vec3::cross(g, a6, a1);
    let det = vec3::dot(g, a5, a61);
    let det = away_from_zero(g, det);
    let delta5 = {
        let d = vec3::dot(g, f, a61);
        let d = g.div(d, det);
        g.neg(d)
    };
    let delta1 = {
        let a6f = vec3::cross(g, a6, f);
        let d = vec3::dot(g, a5, a6f);
        let d = g.div(d, det);
        g.neg(d)
    };
    let t5n = turn_by(g, t5, delta5);
    let t1n = turn_by(g, t1, delta1);
    let m_new = place(g, arm, (r, f2), [t5n, t6, t1n]).m;
    let (t6n, _) = fit_joint_6(g, arm, t5n, m_new);
    let after = place(g, arm, (r, f2), [t5n, t6n, t1n]);
    let miss1 = miss(g, after.x, b);
    let lowers = g.sub(miss0, miss1);
    let length = g.mul_add2(delta5, delta5, delta1, delta1);
    let bound = g.exact(1e-12);
    let short = g.sub(bound, length);
    let better = g.min(lowers, short);
    let better = g.name(
        better,
        &format!("polish_{n}"),
        "≥ 0 when the Newton step on x − b is short and lowers the miss",
    );
    let pick = |g: &mut Graph, a: (Id, Id), b: (Id, Id)| {
        (g.select(better, a.0, b.0), g.select(better, a.1, b.1))
    };
    [pick(g, t5n, t5), pick(g, t6n, t6), pick(g, t1n, t1)]
}

/// The polished root `(θ5, θ6, θ1)` with turns `turns`, whose routed check value is `score`
/// (its miss plus the routing's penalty, which is kept): two Newton steps, then joint 6 held
/// where it is free.
pub fn polish(
    g: &mut Graph,
    arm: &Arm,
    (r, f2): (&Circle, [f64; 3]),
    t: &Target,
    (turns, score): ([(Id, Id); 3], Id),
    n: usize,
) -> Polished {
    let b = arm.wrist_center;
    let before = place(g, arm, (r, f2), turns);
    let miss0 = miss(g, before.x, b);
    let penalty = g.sub(score, miss0);
    let turns = step(g, arm, (r, f2), turns, &format!("{n}a"));
    let [t5, t6, t1] = step(g, arm, (r, f2), turns, &format!("{n}b"));
    let m = place(g, arm, (r, f2), [t5, t6, t1]).m;
    // Joint 6 free: m on axis 6.
    let (_, off_axis) = fit_joint_6(g, arm, t5, m);
    let tol = g.exact((1e-10 * arm.scale).powi(2));
    let free6 = g.sub(tol, off_axis);
    let free6 = g.name(
        free6,
        &format!("j6_free_{n}"),
        "≥ 0 when b is on axis 6 (|m⊥h6|² below tolerance²): joint 6 is held",
    );
    let t6 = (
        g.select(free6, t.reference1.0, t6.0),
        g.select(free6, t.reference1.1, t6.1),
    );
    let last = place(g, arm, (r, f2), [t5, t6, t1]);
    let miss2 = miss(g, last.x, b);
    // Within 1e-6 of the arm's size of axis 6 the chain's roots are double: they carry about
    // √ε, and no fixed number of steps takes the miss below the length tolerance everywhere
    // there. A miss up to 5e-9 of the arm's size is accepted in that band (the candidate is
    // flagged at the reach limit by its merge value). In `f32` both squares grow by one
    // factor √(ε₃₂/ε₆₄) only (band 1.5e-4, miss 7.6e-7 of the size), not the two of a squared
    // tolerance: the test's bound on an `f32` solution's miss is 1e-5 of the size.
    let band = g.exact_once((1e-6 * arm.scale).powi(2));
    let near = g.sub(band, off_axis);
    let allowance = g.exact_once((5e-9 * arm.scale).powi(2));
    let zero = g.constant(0.0);
    let allowed = g.select(near, allowance, zero);
    let over = g.sub(miss2, allowed);
    let over = g.max(over, zero);
    let residual = g.add(over, penalty);
    Polished {
        turns: [t5, t6, t1],
        residual,
        free6,
    }
}

/// Marks the copies among polished roots: a root whose joints 5, 6 and 1 land within
/// `copies` (sum of squared differences of cosines and sines) of an earlier real root (miss
/// within `tol²`) is that root again, and fails its check. The polish can bring the two halves
/// of a near-double root together after the quartic's routing told them apart.
pub fn drop_copies(g: &mut Graph, roots: &mut [ArmSolution], copies: f64, tol: f64) {
    let near = g.exact_once(copies);
    let tol2 = g.exact(tol * tol);
    let turns =
        |r: &ArmSolution| -> Vec<(Id, Id)> { r.undo.iter().map(|t| (t.cos, t.sin)).collect() };
    for j in 1..roots.len() {
        let later = turns(&roots[j]);
        let earlier: Vec<(Vec<(Id, Id)>, Id)> = roots[..j]
            .iter()
            .map(|r| (turns(r), r.checks[0].have_squared))
            .collect();
        let before = earlier.iter().map(|(t, res)| (&t[..], *res));
        let check = &mut roots[j].checks[0];
        check.have_squared = route::penalised(g, check.have_squared, before, &later, (near, tol2));
    }
}
