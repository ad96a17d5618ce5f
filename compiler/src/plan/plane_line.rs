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
    /// The Jacobian's determinant itself: its sign tells roots apart (it changes only where
    /// two roots merge), a label a controller can hold.
    pub aspect: Id,
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
    let form = Form {
        p,
        q,
        mu,
        weights: [bb, aa, ab],
        ww: g.mul(w, w),
    };
    let mut chosen: Vec<(Id, Id)> = Vec::with_capacity(4);
    let mut out = Vec::with_capacity(4);
    for (i, &turn) in roots.roots.iter().enumerate() {
        let name = format!("{tag}_{}", i + 1);
        // Two steps: Ferrari's estimate of a near-double root can be 1e-7 rad off, where
        // the model's cubic remainder still hides a pair 1e-10 rad apart.
        let turn = form.refine(g, (k, &m), turn, &chosen);
        let turn = form.refine(g, (k, &m), turn, &[]);
        chosen.push(turn);
        out.push(carry(g, k, aim, (&line, &m), (p, q), turn, &name));
    }
    [out[0], out[1], out[2], out[3]]
}

/// `F(ψP)` written as the plan evaluates it near a root: the quadratic form in `P`, `Q` and
/// `|hL × m|²` from the vector `m` itself. Expanded into the coefficients of cos, sin,
/// cos 2ψP, sin 2ψP, `F` loses the digits of a near-double root (two solutions merging where
/// axis `hL` lines up with the plane's normal); evaluated this way it keeps them.
struct Form {
    p: Linear,
    q: Linear,
    mu: Linear,
    /// `|b⊥|²`, `|a⊥|²`, `a⊥ · b⊥`.
    weights: [Id; 3],
    /// `w²`.
    ww: Id,
}

/// The value and first two derivatives of a [`Linear`] at a turn.
fn with_derivatives(g: &mut Graph, [l0, l1, l2]: Linear, turn: (Id, Id)) -> [Id; 3] {
    let value = at(g, [l0, l1, l2], turn);
    let zero = g.constant(0.0);
    let n1 = g.neg(l1);
    let n2 = g.neg(l2);
    let first = at(g, [zero, l2, n1], turn);
    let second = at(g, [zero, n1, n2], turn);
    [value, first, second]
}

impl Form {
    /// `F`, `F′`, `F″` at the turn `(c, s)`.
    fn derivatives(
        &self,
        g: &mut Graph,
        (k, m): (&PlaneLine, &TurningNormal),
        turn: (Id, Id),
    ) -> [Id; 3] {
        let [p0, p1, p2] = with_derivatives(g, self.p, turn);
        let [q0, q1, q2] = with_derivatives(g, self.q, turn);
        let [u0, u1, u2] = with_derivatives(g, self.mu, turn);
        let [wb, wa, wx] = self.weights;
        let two = g.constant(2.0);
        // Qform = wb P² + wa Q² − 2 wx P Q and its derivatives.
        let value = {
            let pp = g.mul(p0, p0);
            let qq = g.mul(q0, q0);
            let pq = g.mul(p0, q0);
            let a = g.mul(wb, pp);
            let b = g.mul(wa, qq);
            let c = g.mul(wx, pq);
            let c = g.mul(two, c);
            let ab = g.add(a, b);
            g.sub(ab, c)
        };
        let first = {
            let a = g.mul(p0, p1);
            let a = g.mul(wb, a);
            let b = g.mul(q0, q1);
            let b = g.mul(wa, b);
            let c = g.mul_add2(p1, q0, p0, q1);
            let c = g.mul(wx, c);
            let ab = g.add(a, b);
            let d = g.sub(ab, c);
            g.mul(two, d)
        };
        let second = {
            let a = g.mul_add2(p1, p1, p0, p2);
            let a = g.mul(wb, a);
            let b = g.mul_add2(q1, q1, q0, q2);
            let b = g.mul(wa, b);
            let pq = g.mul(p1, q1);
            let c = g.mul_add2(p2, q0, p0, q2);
            let c = g.add(c, pq);
            let c = g.add(c, pq);
            let c = g.mul(wx, c);
            let ab = g.add(a, b);
            let d = g.sub(ab, c);
            g.mul(two, d)
        };
        // w² |hL × m|², with |hL × m|² from the vector (exact near the alignment) and its
        // derivatives from μ = hL · m: (1 − μ²)′ = −2 μ μ′, (1 − μ²)″ = −2 (μ′² + μ μ″).
        let perp = {
            let mv = m.at(g, turn);
            let h = vec3::constant(g, k.line_joint.0);
            let x = vec3::cross(g, h, mv);
            vec3::dot(g, x, x)
        };
        let perp1 = {
            let x = g.mul(u0, u1);
            let minus_two = g.constant(-2.0);
            g.mul(minus_two, x)
        };
        let perp2 = {
            let x = g.mul_add2(u1, u1, u0, u2);
            let minus_two = g.constant(-2.0);
            g.mul(minus_two, x)
        };
        let [f0, f1, f2] = [(value, perp), (first, perp1), (second, perp2)].map(|(a, b)| {
            let wb = g.mul(self.ww, b);
            g.sub(a, wb)
        });
        [f0, f1, f2]
    }

    /// A step on the local quadratic model `F + F′ d + F″ d²/2 = 0` (both of its roots at
    /// once: the step that keeps a near-double pair apart). The root nearer the turn is
    /// taken, unless an earlier root (`chosen`) already took it (the pair's first member):
    /// then the other (the first step only: a second step polishes the root it is at). Steps longer than 1e-4 rad are refused (a simple root is already
    /// within that; the model is for the last digits).
    fn refine(
        &self,
        g: &mut Graph,
        km: (&PlaneLine, &TurningNormal),
        turn: (Id, Id),
        chosen: &[(Id, Id)],
    ) -> (Id, Id) {
        let [f0, f1, f2] = self.derivatives(g, km, turn);
        let half = g.constant(0.5);
        let a = g.mul(half, f2);
        let disc = {
            let x = g.mul(f1, f1);
            let y = g.mul(f0, a);
            let four = g.constant(4.0);
            let y = g.mul(four, y);
            let d = g.sub(x, y);
            let zero = g.constant(0.0);
            let d = g.max(d, zero);
            g.sqrt(d)
        };
        // q = −(F′ + sign(F′) √disc)/2; roots q/a and F/q (the small one).
        let signed = {
            let minus = g.neg(disc);
            g.select(f1, disc, minus)
        };
        let qv = {
            let x = g.add(f1, signed);
            let minus_half = g.constant(-0.5);
            g.mul(minus_half, x)
        };
        let qv = away_from_zero(g, qv);
        let a_safe = away_from_zero(g, a);
        let near = g.div(f0, qv);
        let far = g.div(qv, a_safe);
        // A bound on a squared step: 1e-4 rad, 1.5e-2 rad in `f32` (where Ferrari's roots carry
        // the square root of a larger epsilon).
        let limit = g.exact_once(1e-8);
        let short = |g: &mut Graph, d: Id| {
            let dd = g.mul(d, d);
            g.sub(limit, dd)
        };
        let near_ok = short(g, near);
        let far_ok = short(g, far);
        let zero = g.constant(0.0);
        let near = g.select(near_ok, near, zero);
        let far = g.select(far_ok, far, near);
        let first = turn_by(g, turn, near);
        let second = turn_by(g, turn, far);
        // Taken already: within 1e-10 rad of an earlier root (the same root of the same model;
        // the two members of a near-double pair lie farther apart than that once refined).
        let mut taken = g.constant(-1.0);
        for &(c, s) in chosen {
            let dc = g.sub(c, first.0);
            let ds = g.sub(s, first.1);
            let d = g.mul_add2(dc, dc, ds, ds);
            let close = g.exact(1e-20);
            let same = g.sub(close, d);
            taken = g.max(same, taken);
        }
        (
            g.select(taken, second.0, first.0),
            g.select(taken, second.1, first.1),
        )
    }
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
    // A short step only (|δ| ≤ 1e-4 rad, 1.5e-2 in `f32`): it polishes a root (in a cluster
    // of four roots the refined estimate can still be 1e-6 rad off) and must not carry a
    // complex pair's real part far; one that lands on a real root is dropped as its copy.
    let short = {
        let l2 = g.mul(dl, dl);
        let p2 = g.mul(dp, dp);
        let d = g.add(l2, p2);
        let bound = g.exact_once(1e-8);
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
        aspect: before.det,
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
