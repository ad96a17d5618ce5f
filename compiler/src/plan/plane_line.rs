//! Two joints that bring a plane and a line into a given position relative to each other: the
//! step three consecutive parallel axes leave behind (Pieper 1968: parallel axes meet at
//! infinity), solved through a quartic.
//!
//! Joints turning about parallel axes `h` keep every plane ⟂ `h` a plane ⟂ `h` and keep its
//! offset along `h`. Which such plane the rest of the arm must produce is then a condition on
//! three joints; the one of them whose axis is a line `ℓ` can turn a plane `π` onto any other
//! plane with the same two numbers relative to `ℓ`: the cosine `n · a` of its normal to the
//! line's direction and the signed distance `n · (o − q)` of the line's point `o` from the
//! plane (`q` a point of the plane). Those two numbers are what the other two joints have to
//! set: one joint turns the line (turn `ψL` about `hL` through `pL`), the other the plane (turn
//! `ψP` about `hP` through `pP`), and
//!
//! ```text
//! n′ · a′ = C,    n′ · (o′ − q′) = D,
//! ```
//!
//! with `a′ = RL a`, `o′ = EL o`, `n′ = m := RP n`, `q′ = EP q`. Each side is linear in the
//! line's turn: with `b = o − pL`, `x∥ = hL · x`, `x⊥ = x − x∥ hL` and `μ = hL · m`,
//!
//! ```text
//! m · RL x = x∥ μ + cos ψL (m · x⊥) + sin ψL (m · (hL × x)),
//! α1 cos ψL + β1 sin ψL = P := C − a∥ μ,                α1 = m · a⊥,  β1 = m · (hL × a),
//! α2 cos ψL + β2 sin ψL = Q := D + n · (q − pP) + m · (pP − pL) − b∥ μ,
//!                                                      α2 = m · b⊥,  β2 = m · (hL × b).
//! ```
//!
//! `(cos ψL, sin ψL)` is a unit pair exactly when (with `|m⊥|² = 1 − μ²`, using
//! `α1² + β1² = |m⊥|² |a⊥|²`, `α1 α2 + β1 β2 = |m⊥|² a⊥ · b⊥`, `α1 β2 − β1 α2 = |m⊥|² w`,
//! `w = hL · (a × b)`)
//!
//! ```text
//! F(ψP) = |b⊥|² P² + |a⊥|² Q² − 2 (a⊥ · b⊥) P Q − w² (1 − μ²) = 0.
//! ```
//!
//! `P`, `Q` and `μ` are each `k0 + k1 cos ψP + k2 sin ψP`, so `F` is a trigonometric
//! polynomial of degree 2: a quartic in the half-angle tangent, solved by Ferrari's method
//! ([`crate::plan::quartic::trig_roots`]); at most 4 roots. The line's turn follows by Cramer's
//! rule, `(cos ψL, sin ψL) ∝ Δ (P β2 − Q β1, α1 Q − α2 P)`, `Δ = α1 β2 − β1 α2`, and each root
//! gets one guarded Newton step on the two equations themselves (the quartic squares them).
//! A complex pair's real part misses the equations: its residual says so.
//!
//! `w = 0` (the line and the joint's axis in one plane, for every turn of the line: they meet
//! or are parallel) makes `F` a perfect square, every root double: the families check that
//! their layouts keep it apart, or that it happens only at singular configurations.

use crate::plan::graph::{Graph, Id};
use crate::plan::quartic::{at, away_from_zero, product, squared, trig_roots, Linear};
use crate::plan::vec3::{self, num, V3};
use crate::plan::{turn_by, unit_pair};

/// The two joints: the one that turns the line and the one that turns the plane (axis
/// direction and a point of the axis, base frame at zero).
#[derive(Clone, Copy, Debug)]
pub struct PlaneLine {
    /// Turns the line.
    pub line_joint: ([f64; 3], [f64; 3]),
    /// Turns the plane.
    pub plane_joint: ([f64; 3], [f64; 3]),
    /// The arm's size (metres): weighs the cosine equation against the distance equation.
    pub scale: f64,
}

/// The line, the plane and the two numbers they must reach (graph values: constants or
/// values of the target).
#[derive(Clone, Copy, Debug)]
pub struct Aim {
    /// The line's unit direction `a`.
    pub direction: V3,
    /// A point `o` of the line.
    pub point: V3,
    /// The plane's unit normal `n`.
    pub normal: V3,
    /// A point `q` of the plane.
    pub on_plane: V3,
    /// The cosine `C = n′ · a′` to reach.
    pub cos: Id,
    /// The signed distance `D = n′ · (o′ − q′)` to reach (metres).
    pub distance: Id,
}

/// One root: the two turns, by how much it misses, and how near it is to merging.
#[derive(Clone, Copy, Debug)]
pub struct Root {
    /// `(cos ψL, sin ψL)`: the turn of the line's joint about its axis direction.
    pub line_turn: (Id, Id),
    /// `(cos ψP, sin ψP)`: the turn of the plane's joint.
    pub plane_turn: (Id, Id),
    /// The turned plane's normal `m = RP n`.
    pub normal: V3,
    /// `(scale · (n′ · a′ − C))² + (n′ · (o′ − q′) − D)²` (m²): zero for a real root.
    pub residual: Id,
    /// `det² / scale` of the two equations' Jacobian in `(ψL, ψP)` (metres): small where two
    /// roots merge (a reach boundary or a singular configuration).
    pub merge: Id,
}

/// The constant and turning parts of `m(ψP) = RP n = m0 + cos ψP mc + sin ψP ms`.
struct TurningNormal {
    m0: V3,
    mc: V3,
    ms: V3,
}

impl TurningNormal {
    fn of(g: &mut Graph, h: [f64; 3], n: V3) -> TurningNormal {
        let along = vec3::dot_const(g, h, n);
        let m0 = vec3::scale_const(g, along, h);
        let mc = vec3::sub(g, n, m0);
        let hk = vec3::constant(g, h);
        let ms = vec3::cross(g, hk, n);
        TurningNormal { m0, mc, ms }
    }

    /// `d · m(ψP)` as a [`Linear`], for a constant `d`.
    fn along(&self, g: &mut Graph, d: [f64; 3]) -> Linear {
        [self.m0, self.mc, self.ms].map(|v| vec3::dot_const(g, d, v))
    }

    /// `m` at one turn.
    fn at(&self, g: &mut Graph, (c, s): (Id, Id)) -> V3 {
        let a = vec3::scale(g, c, self.mc);
        let b = vec3::scale(g, s, self.ms);
        let ab = vec3::add(g, a, b);
        vec3::add(g, self.m0, ab)
    }
}

/// The line's numbers relative to the line joint's axis: `a`, `b = o − pL`, `hL × a`,
/// `hL × b`, `a∥`, `b∥`.
struct LineParts {
    a: V3,
    b: V3,
    ha: V3,
    hb: V3,
    a_along: Id,
    b_along: Id,
}

/// `k · x` for a constant `k` and a [`Linear`] `x`.
fn scale_linear(g: &mut Graph, k: Id, x: Linear) -> Linear {
    x.map(|xi| g.mul(k, xi))
}

/// The four roots (real roots, and real parts of complex pairs, which their residuals
/// reject); `tag` names the plan values.
pub fn solve(g: &mut Graph, k: &PlaneLine, aim: &Aim, tag: &str) -> [Root; 4] {
    let (hl, pl) = k.line_joint;
    let (hp, pp) = k.plane_joint;
    let hlk = vec3::constant(g, hl);
    let a = aim.direction;
    let b = vec3::add_const(g, aim.point, num::scale(&pl, -1.0));
    let ha = vec3::cross(g, hlk, a);
    let hb = vec3::cross(g, hlk, b);
    let line = LineParts {
        a,
        b,
        ha,
        hb,
        a_along: vec3::dot_const(g, hl, a),
        b_along: vec3::dot_const(g, hl, b),
    };
    let aa = vec3::dot(g, ha, ha);
    let bb = vec3::dot(g, hb, hb);
    let ab = vec3::dot(g, ha, hb);
    let w = {
        let axb = vec3::cross(g, a, b);
        vec3::dot_const(g, hl, axb)
    };
    let w = g.name(
        w,
        &format!("{tag}_w"),
        "w = hL · (a × b): zero when the line and the line joint's axis lie in one plane",
    );
    let m = TurningNormal::of(g, hp, aim.normal);
    let mu = m.along(g, hl);
    let shift = m.along(g, num::sub(&pp, &pl));
    let p = {
        let minus = g.neg(line.a_along);
        let t = scale_linear(g, minus, mu);
        [g.add(aim.cos, t[0]), t[1], t[2]]
    };
    let q = {
        let nq = vec3::dot(g, aim.normal, aim.on_plane);
        let np = vec3::dot_const(g, pp, aim.normal);
        let offset = g.sub(nq, np);
        let d = g.add(aim.distance, offset);
        let minus = g.neg(line.b_along);
        let t = scale_linear(g, minus, mu);
        let d = g.add(d, shift[0]);
        [g.add(d, t[0]), g.add(shift[1], t[1]), g.add(shift[2], t[2])]
    };
    let f = {
        let pp2 = squared(g, p);
        let qq2 = squared(g, q);
        let pq = product(g, p, q);
        let mm = squared(g, mu);
        let ww = g.mul(w, w);
        let minus_two_ab = {
            let two = g.constant(-2.0);
            g.mul(two, ab)
        };
        let mut f = [0; 5];
        for i in 0..5 {
            let x = g.mul(bb, pp2[i]);
            let y = g.mul(aa, qq2[i]);
            let z = g.mul(minus_two_ab, pq[i]);
            let v = g.mul(ww, mm[i]);
            let xy = g.add(x, y);
            let xyz = g.add(xy, z);
            f[i] = g.add(xyz, v);
        }
        f[0] = g.sub(f[0], ww);
        f
    };
    let notes = ["k0", "k1", "k2", "k3", "k4"];
    let f = [0, 1, 2, 3, 4].map(|i| {
        g.name(
            f[i],
            &format!("{tag}_{}", notes[i]),
            format!(
                "F(ψP) = |b⊥|² P² + |a⊥|² Q² − 2 (a⊥·b⊥) P Q − w² (1 − μ²): {} (of 1, cos ψP, \
                 sin ψP, cos 2ψP, sin 2ψP)",
                notes[i]
            ),
        )
    });
    let roots = trig_roots(g, f, tag);
    let mut out = Vec::with_capacity(4);
    for (i, &turn) in roots.roots.iter().enumerate() {
        let name = format!("{tag}_{}", i + 1);
        out.push(carry(g, k, aim, (&line, &m), (p, q), turn, &name));
    }
    [out[0], out[1], out[2], out[3]]
}

/// The line's turn for one root of the plane's, then one guarded Newton step on both
/// equations.
fn carry(
    g: &mut Graph,
    k: &PlaneLine,
    aim: &Aim,
    (line, m): (&LineParts, &TurningNormal),
    (p, q): (Linear, Linear),
    turn_p: (Id, Id),
    name: &str,
) -> Root {
    let normal = m.at(g, turn_p);
    let pv = at(g, p, turn_p);
    let qv = at(g, q, turn_p);
    let a_perp = {
        let s = vec3::scale_const(g, line.a_along, k.line_joint.0);
        vec3::sub(g, line.a, s)
    };
    let b_perp = {
        let s = vec3::scale_const(g, line.b_along, k.line_joint.0);
        vec3::sub(g, line.b, s)
    };
    let a1 = vec3::dot(g, normal, a_perp);
    let b1 = vec3::dot(g, normal, line.ha);
    let a2 = vec3::dot(g, normal, b_perp);
    let b2 = vec3::dot(g, normal, line.hb);
    let delta = {
        let x = g.mul(a1, b2);
        let y = g.mul(b1, a2);
        g.sub(x, y)
    };
    let nc = {
        let x = g.mul(pv, b2);
        let y = g.mul(qv, b1);
        let d = g.sub(x, y);
        g.mul(d, delta)
    };
    let ns = {
        let x = g.mul(a1, qv);
        let y = g.mul(a2, pv);
        let d = g.sub(x, y);
        g.mul(d, delta)
    };
    let turn_l = unit_pair(g, nc, ns);
    let before = Misses::at(g, k, aim, (turn_l, turn_p));
    let (dl, dp) = before.step(g);
    let turn_ln = turn_by(g, turn_l, dl);
    let turn_pn = turn_by(g, turn_p, dp);
    let after = Misses::at(g, k, aim, (turn_ln, turn_pn));
    let lowers = g.sub(before.residual, after.residual);
    // A short step only (|δ| ≤ 1e-6 rad): it polishes a root and must not carry a complex
    // pair's real part onto a neighbouring real root.
    let short = {
        let l2 = g.mul(dl, dl);
        let p2 = g.mul(dp, dp);
        let d = g.add(l2, p2);
        let bound = g.exact(1e-12);
        g.sub(bound, d)
    };
    let better = g.min(lowers, short);
    let better = g.name(
        better,
        &format!("{name}_refine"),
        "≥ 0 when the Newton step on the two equations is short and lowers the miss",
    );
    let pick = |g: &mut Graph, x: (Id, Id), y: (Id, Id)| {
        (g.select(better, x.0, y.0), g.select(better, x.1, y.1))
    };
    let line_turn = pick(g, turn_ln, turn_l);
    let plane_turn = pick(g, turn_pn, turn_p);
    let residual = g.select(better, after.residual, before.residual);
    let residual = g.name(
        residual,
        &format!("{name}_miss"),
        "(scale (n′·a′ − C))² + (n′·(o′ − q′) − D)²: zero for a real root",
    );
    let normal = vec3::select(g, better, after.normal, before.normal);
    let merge = {
        let d2 = g.mul(before.det, before.det);
        let per = g.constant(1.0 / k.scale);
        g.mul(d2, per)
    };
    let merge = g.name(
        merge,
        &format!("{name}_merge"),
        "det² / scale of the two equations' Jacobian: small where two roots merge",
    );
    Root {
        line_turn,
        plane_turn,
        normal,
        residual,
        merge,
    }
}

/// The two equations' misses at one pair of turns, their Jacobian, and the weighted residual.
struct Misses {
    e1: Id,
    e2: Id,
    /// `[[∂e1/∂ψL, ∂e1/∂ψP], [∂e2/∂ψL, ∂e2/∂ψP]]`.
    jac: [[Id; 2]; 2],
    det: Id,
    normal: V3,
    residual: Id,
}

impl Misses {
    fn at(g: &mut Graph, k: &PlaneLine, aim: &Aim, (tl, tp): ((Id, Id), (Id, Id))) -> Misses {
        let (hl, pl) = k.line_joint;
        let (hp, pp) = k.plane_joint;
        let m = vec3::rotate(g, hp, tp.0, tp.1, aim.normal);
        let a = vec3::rotate(g, hl, tl.0, tl.1, aim.direction);
        // o′ − pL and q′ − pP.
        let o = {
            let b = vec3::add_const(g, aim.point, num::scale(&pl, -1.0));
            vec3::rotate(g, hl, tl.0, tl.1, b)
        };
        let q = {
            let b = vec3::add_const(g, aim.on_plane, num::scale(&pp, -1.0));
            vec3::rotate(g, hp, tp.0, tp.1, b)
        };
        let gap = {
            let d = vec3::sub(g, o, q);
            vec3::add_const(g, d, num::sub(&pl, &pp))
        };
        let e1 = {
            let c = vec3::dot(g, m, a);
            g.sub(c, aim.cos)
        };
        let e2 = {
            let d = vec3::dot(g, m, gap);
            g.sub(d, aim.distance)
        };
        let hlk = vec3::constant(g, hl);
        let hpk = vec3::constant(g, hp);
        let hm = vec3::cross(g, hpk, m);
        let dl1 = {
            let x = vec3::cross(g, hlk, a);
            vec3::dot(g, m, x)
        };
        let dp1 = vec3::dot(g, hm, a);
        let dl2 = {
            let x = vec3::cross(g, hlk, o);
            vec3::dot(g, m, x)
        };
        // ∂/∂ψP of m · (o′ − q′) is (hP × m) · (o′ − pP).
        let dp2 = {
            let x = vec3::add_const(g, o, num::sub(&pl, &pp));
            vec3::dot(g, hm, x)
        };
        let det = {
            let x = g.mul(dl1, dp2);
            let y = g.mul(dp1, dl2);
            g.sub(x, y)
        };
        let residual = {
            let s = g.constant(k.scale);
            let se1 = g.mul(s, e1);
            let x = g.mul(se1, se1);
            let y = g.mul(e2, e2);
            g.add(x, y)
        };
        Misses {
            e1,
            e2,
            jac: [[dl1, dp1], [dl2, dp2]],
            det,
            normal: m,
            residual,
        }
    }

    /// The Newton step `(δL, δP) = −J⁻¹ (e1, e2)`.
    fn step(&self, g: &mut Graph) -> (Id, Id) {
        let [[j11, j12], [j21, j22]] = self.jac;
        let det = away_from_zero(g, self.det);
        let dl = {
            let x = g.mul(j12, self.e2);
            let y = g.mul(j22, self.e1);
            let d = g.sub(x, y);
            g.div(d, det)
        };
        let dp = {
            let x = g.mul(j21, self.e1);
            let y = g.mul(j11, self.e2);
            let d = g.sub(x, y);
            g.div(d, det)
        };
        (dl, dp)
    }
}

#[cfg(test)]
#[path = "plane_line_tests.rs"]
mod tests;
