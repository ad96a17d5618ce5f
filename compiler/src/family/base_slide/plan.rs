//! Joints 1–3 of a base-slide arm: P R R (joint 1 a slide, axes 2 and 3 skew), solved
//! through a quartic in the slide (Pieper 1968: a line meets the surface the wrist center
//! sweeps about axes 2 and 3 in at most 4 points).
//!
//! # The reduction
//!
//! Let `e1` be the slide's direction, `f2` the foot on axis 2 of the common normal of axes 2
//! and 3, and `r(θ3) = E3(θ3) c − f2 = r0 + cos θ3 rc + sin θ3 rs` the wrist center turned
//! about axis 3, seen from `f2`. The slide moves joints 2… by `d1 e1`, so with the
//! wrist-center target `c_t`, `d0 = e1 · (c_t − f2)`, `y⊥ = c_t − f2 − d0 e1` (⟂ `e1`) and
//! `s = d1 − d0`, joint 2 must turn `r(θ3)` onto `y(s) = y⊥ − s e1`. A turn about axis 2 keeps
//! the height along `h2` and the distance from `f2`:
//!
//! ```text
//! h2 · y = h2 · y⊥ − (h2 · e1) s  =  Z(θ3) = z0 + zc cos θ3 + zs sin θ3     (z = h2 · r)
//! |y|²   = |y⊥|² + s²             =  Q(θ3) = q0 + qc cos θ3 + qs sin θ3     (q = |r|²)
//! ```
//!
//! Two equations linear in `(cos θ3, sin θ3)`: with `L1 = h2 · y⊥ − z0 − (h2·e1) s`,
//! `L2 = |y⊥|² − q0 + s²` and `Δ = zc qs − zs qc` (Cramer's rule),
//!
//! ```text
//! cos θ3 = (qs L1 − zs L2) / Δ,   sin θ3 = (zc L2 − qc L1) / Δ,
//! F(s)   = cos² θ3 + sin² θ3 − 1 = 0,
//! ```
//!
//! a quartic in `s` (leading coefficient `(zs² + zc²)/Δ² > 0`), solved in `τ = s / ℓ` (`ℓ` the
//! arm's size) by Ferrari's method ([`crate::plan::quartic::quartic_roots`], two Newton steps
//! per root): at most 4 real roots. Measured from the common normal, `(qc, qs)` is
//! `2 (r0·rc, r0·rs)` with `r0⊥h3` the common normal itself, so
//! `|Δ| = 2 ρ3² a23 sin α23` (`ρ3` the wrist center's distance from axis 3, `a23` and `α23`
//! the common normal and angle of axes 2 and 3): the quartic needs axes 2 and 3 skew and the
//! wrist center off axis 3 (the family's conditions; parallel or meeting axes 2 and 3 are
//! other layouts, rejected as not built).
//!
//! # Back substitution
//!
//! * `θ3 = atan2(sin θ3, cos θ3)` from Cramer's rule (made a unit pair), then one guarded
//!   Newton step on the two equations in `(s, θ3)`, kept when it is short and lowers the miss.
//! * `θ2`, Paden–Kahan subproblem 1 about `h2`: turn `r(θ3)⊥h2` onto `y(s)`; `θ2 = 0` when
//!   both are on axis 2 (joint 2 free, a singular configuration).
//! * `d1 = d0 + s`.
//! * A complex pair of roots gives its real part; the candidate's check is its residual
//!   `|E1 E2 E3 c − c_t|² = |R2 r − y|²`, which such a candidate misses by.
//!
//! # Labels
//!
//! The shoulder label is the side of the plane through `f2` ⟂ `e1` the wrist center (the
//! slide undone) is on: `e1 · R2 r = −s`, so `Facing` and `Across` are the two sides of the
//! target line's nearest approach to `f2`, which split the 4 roots 2 + 2 on most poses. The
//! elbow label is the sign of the position Jacobian's determinant
//! `det[e1, h2 × (w − f2), ∂w/∂θ3]` (the aspect). Each root is routed to the slot of its own
//! label ([`crate::plan::route`]; two roots with one label: the second takes a free slot, and
//! labels are read by solving).

use armforge_runtime::internal::{CheckKind, ElbowRule, ShoulderRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::{Elbow, Shoulder};

use crate::family::general::plan::common_normal;
use crate::plan::arm::Arm;
use crate::plan::graph::{Graph, Id};
use crate::plan::quartic::{away_from_zero, quartic_roots};
use crate::plan::route;
use crate::plan::subproblems::rotate_onto;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{sign, turn_by, unit_pair, ArmSolution, Target, Turn};
use crate::units::tidy;

/// Two roots whose joints 2 and 3 lie closer than this (sum of squared differences of their
/// cosines and sines) are one root found twice (as the general family's `COPIES`).
pub const COPIES: f64 = 1e-10;

/// The constants of a base-slide arm's position step.
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// The slide's direction `e1`.
    pub e1: [f64; 3],
    /// Axis 2.
    pub h2: [f64; 3],
    /// Axis 3.
    pub h3: [f64; 3],
    /// The foot on axis 2 of the common normal of axes 2 and 3.
    pub f2: [f64; 3],
    /// `h2 · e1`.
    pub along: f64,
    /// `r(θ3) = r0 + cos θ3 rc + sin θ3 rs`, from `f2`.
    pub r0: [f64; 3],
    /// See `r0`.
    pub rc: [f64; 3],
    /// See `r0`.
    pub rs: [f64; 3],
    /// `[z0, zc, zs]`: `h2 · r(θ3)`.
    pub z: [f64; 3],
    /// `[q0, qc, qs]`: `|r(θ3)|²`.
    pub q: [f64; 3],
    /// `Δ = zc qs − zs qc`.
    pub delta: f64,
    /// The unit of `τ = s / ℓ` (the arm's size, metres).
    pub ell: f64,
    /// The side that means `Facing` (the side at zero).
    pub facing: f64,
    /// The Jacobian sign that means `Up` (the sign at zero).
    pub up: f64,
}

/// The constants the plan of a base-slide arm is built from.
pub fn constants(arm: &Arm) -> Constants {
    let e1 = arm.axis(0);
    let (h2, p2) = (arm.axis(1), arm.point(1));
    let (h3, p3) = (arm.axis(2), arm.point(2));
    let c = arm.wrist_center;
    let [f2, _] = common_normal(&p2, &h2, &p3, &h3);
    let v = num::sub(&c, &p3);
    let height = num::dot(&h3, &v);
    let r0 = num::add(&num::sub(&p3, &f2), &num::scale(&h3, height));
    let rc = num::sub(&v, &num::scale(&h3, height));
    let rs = num::cross(&h3, &v);
    let z = [num::dot(&h2, &r0), num::dot(&h2, &rc), num::dot(&h2, &rs)];
    let q = [
        num::dot(&r0, &r0) + num::dot(&rc, &rc),
        2.0 * num::dot(&r0, &rc),
        2.0 * num::dot(&r0, &rs),
    ];
    let delta = z[1] * q[2] - z[2] * q[1];
    // The labels at zero: the side of the plane ⟂ e1 through f2, the Jacobian's sign.
    let w = num::sub(&c, &f2);
    let facing = sign(num::dot(&e1, &w));
    let d2 = num::cross(&h2, &w);
    let up = sign(num::dot(&e1, &num::cross(&d2, &rs)));
    Constants {
        e1,
        h2,
        h3,
        f2,
        along: num::dot(&h2, &e1),
        r0,
        rc,
        rs,
        z,
        q,
        delta,
        ell: arm.scale,
        facing,
        up,
    }
}

/// The label rules of a base-slide arm.
pub fn rules(arm: &Arm, k: &Constants) -> (ShoulderRule, ElbowRule) {
    (
        ShoulderRule::Plane {
            normal: k.e1,
            point: k.f2,
            wrist_center: arm.wrist_center,
            facing: k.facing,
        },
        ElbowRule::Aspect { up: k.up },
    )
}

/// `p0 + p1 τ + p2 τ²`, lowest power first.
type Quadratic = [Id; 3];

/// `p(τ)` by Horner's rule.
fn value(g: &mut Graph, [p0, p1, p2]: Quadratic, tau: Id) -> Id {
    let x = g.mul(p2, tau);
    let x = g.add(x, p1);
    let x = g.mul(x, tau);
    g.add(x, p0)
}

/// The target seen from `f2`, the slide undone to its nearest approach: `d0`, `y⊥` and
/// Cramer's `cos θ3`, `sin θ3` as quadratics in `τ`.
struct Aim {
    d0: Id,
    y_perp: V3,
    cos3: Quadratic,
    sin3: Quadratic,
}

fn aim(g: &mut Graph, k: &Constants, ct: V3) -> Aim {
    let u = vec3::add_const(g, ct, num::scale(&k.f2, -1.0));
    let d0 = vec3::dot_const(g, k.e1, u);
    let d0 = g.name(
        d0,
        "d0",
        "d0 = e1 · (c_t − f2): the slide at the nearest approach",
    );
    let y_perp = {
        let along = vec3::scale_const(g, d0, k.e1);
        vec3::sub(g, u, along)
    };
    let y_perp = vec3::name(g, y_perp, "y_perp", "y⊥ = c_t − f2 − d0 e1");
    let l1 = {
        let h = vec3::dot_const(g, k.h2, y_perp);
        let z0 = g.constant(k.z[0]);
        g.sub(h, z0)
    };
    let l1 = g.name(
        l1,
        "l1",
        format!("L1 at s = 0: h2 · y⊥ − z0, z0 = {} m", tidy(k.z[0])),
    );
    let l2 = {
        let yy = vec3::dot(g, y_perp, y_perp);
        let q0 = g.constant(k.q[0]);
        g.sub(yy, q0)
    };
    let l2 = g.name(
        l2,
        "l2",
        format!("L2 at s = 0: |y⊥|² − q0, q0 = {} m²", tidy(k.q[0])),
    );
    let [_, zc, zs] = k.z;
    let [_, qc, qs] = k.q;
    let (d, l) = (k.delta, k.ell);
    let lin = |g: &mut Graph, a: f64, b: f64| {
        let a = g.constant(a);
        let b = g.constant(b);
        g.mul_add2(a, l1, b, l2)
    };
    let c0 = lin(g, qs / d, -zs / d);
    let s0 = lin(g, -qc / d, zc / d);
    let cos3 = [
        g.name(c0, "cos3_0", "cos θ3 = (qs L1 − zs L2)/Δ: constant part"),
        g.constant(-qs * k.along * l / d),
        g.constant(-zs * l * l / d),
    ];
    let sin3 = [
        g.name(s0, "sin3_0", "sin θ3 = (zc L2 − qc L1)/Δ: constant part"),
        g.constant(qc * k.along * l / d),
        g.constant(zc * l * l / d),
    ];
    Aim {
        d0,
        y_perp,
        cos3,
        sin3,
    }
}

/// `F(τ) = cos²θ3 + sin²θ3 − 1`, highest power first.
fn quartic(g: &mut Graph, [a0, a1, a2]: Quadratic, [b0, b1, b2]: Quadratic) -> [Id; 5] {
    let two = g.constant(2.0);
    let one = g.constant(1.0);
    let k0 = g.mul_add2(a2, a2, b2, b2);
    let k1 = g.mul_add2(a1, a2, b1, b2);
    let k1 = g.mul(two, k1);
    let k2 = {
        let sq = g.mul_add2(a1, a1, b1, b1);
        let cross = g.mul_add2(a0, a2, b0, b2);
        let cross = g.mul(two, cross);
        g.add(sq, cross)
    };
    let k3 = g.mul_add2(a0, a1, b0, b1);
    let k3 = g.mul(two, k3);
    let k4 = g.mul_add2(a0, a0, b0, b0);
    let k4 = g.sub(k4, one);
    let notes = ["τ⁴", "τ³", "τ²", "τ", "1"];
    let mut k = [k0, k1, k2, k3, k4];
    for (i, (ki, note)) in k.iter_mut().zip(notes).enumerate() {
        *ki = g.name(
            *ki,
            &format!("slide_k{i}"),
            format!("F(τ) = cos²θ3 + sin²θ3 − 1: coefficient of {note}"),
        );
    }
    k
}

/// One root carried through joints 3 and 2, before routing to a labelled slot.
struct Root {
    /// `d1`, `θ2`, `θ3`.
    values: [Id; 3],
    /// Joints 2 and 3 as turns.
    turns: [(Id, Id); 2],
    residual: Id,
    /// `det² / ℓ⁵`: at most the length tolerance where two roots merge.
    merge: Id,
    /// `≥ 0` for `Facing`.
    facing: Id,
    /// `≥ 0` for `Up`.
    up: Id,
}

/// The misses of the two equations, `Z(θ3) − h2 · y` and `(Q(θ3) − |y|²) / (2ℓ)`, and the sum
/// of their squares (metres²).
fn misses(g: &mut Graph, k: &Constants, aim: &Aim, s: Id, (c3, s3): (Id, Id)) -> (Id, Id, Id) {
    let zr = {
        let zc = g.constant(k.z[1]);
        let zs = g.constant(k.z[2]);
        g.mul_add2(zc, c3, zs, s3)
    };
    let zl = {
        let h = vec3::dot_const(g, k.h2, aim.y_perp);
        let z0 = g.constant(k.z[0]);
        let h = g.sub(h, z0);
        let a = g.constant(k.along);
        let as_ = g.mul(a, s);
        g.sub(h, as_)
    };
    let g1 = g.sub(zr, zl);
    let qr = {
        let qc = g.constant(k.q[1]);
        let qs = g.constant(k.q[2]);
        g.mul_add2(qc, c3, qs, s3)
    };
    let ql = {
        let yy = vec3::dot(g, aim.y_perp, aim.y_perp);
        let q0 = g.constant(k.q[0]);
        let y = g.sub(yy, q0);
        let ss = g.mul(s, s);
        g.add(y, ss)
    };
    let g2 = {
        let d = g.sub(qr, ql);
        let inv = g.constant(0.5 / k.ell);
        g.mul(inv, d)
    };
    let miss = g.mul_add2(g1, g1, g2, g2);
    (g1, g2, miss)
}

/// Joints 3 and 2 for one root `τ` of the quartic, its residual and its labels.
fn carry(g: &mut Graph, k: &Constants, aim: &Aim, tau: Id, (n, tol): (usize, f64)) -> Root {
    let ell = g.constant(k.ell);
    let s = g.mul(ell, tau);
    let c3 = value(g, aim.cos3, tau);
    let s3 = value(g, aim.sin3, tau);
    let (c3, s3) = unit_pair(g, c3, s3);
    // One Newton step on (G1, G2) in (s, θ3), kept when it is short and lowers the miss.
    let (g1, g2, miss0) = misses(g, k, aim, s, (c3, s3));
    let j11 = g.constant(k.along);
    let j12 = {
        let zc = g.constant(-k.z[1]);
        let zs = g.constant(k.z[2]);
        g.mul_add2(zc, s3, zs, c3)
    };
    let j21 = {
        let m = g.constant(-1.0 / k.ell);
        g.mul(m, s)
    };
    let j22 = {
        let qc = g.constant(-0.5 * k.q[1] / k.ell);
        let qs = g.constant(0.5 * k.q[2] / k.ell);
        g.mul_add2(qc, s3, qs, c3)
    };
    let det = {
        let p = g.mul(j11, j22);
        let q = g.mul(j12, j21);
        let d = g.sub(p, q);
        away_from_zero(g, d)
    };
    let delta_s = {
        let p = g.mul(j22, g1);
        let q = g.mul(j12, g2);
        let d = g.sub(q, p);
        g.div(d, det)
    };
    let delta3 = {
        let p = g.mul(j21, g1);
        let q = g.mul(j11, g2);
        let d = g.sub(p, q);
        g.div(d, det)
    };
    let s_new = g.add(s, delta_s);
    let (c3n, s3n) = turn_by(g, (c3, s3), delta3);
    let (_, _, miss1) = misses(g, k, aim, s_new, (c3n, s3n));
    let lowers = g.sub(miss0, miss1);
    let step = {
        let per = g.constant(1.0 / k.ell);
        let ds = g.mul(per, delta_s);
        g.mul_add2(ds, ds, delta3, delta3)
    };
    let bound = g.exact(1e-12);
    let short = g.sub(bound, step);
    let better = g.min(lowers, short);
    let better = g.name(
        better,
        &format!("refine_{n}"),
        "≥ 0 when the Newton step on the two equations is short and lowers the miss",
    );
    let s = g.select(better, s_new, s);
    let c3 = g.select(better, c3n, c3);
    let s3 = g.select(better, s3n, s3);
    let d1 = g.add(aim.d0, s);
    let d1 = g.name(d1, &format!("d1_{n}"), "d1 = d0 + ℓ τ: the slide");
    let theta3 = g.atan2(s3, c3);
    let theta3 = g.name(
        theta3,
        &format!("q3_{n}"),
        "θ3 = atan2(zc L2 − qc L1, qs L1 − zs L2) (Cramer's rule), refined",
    );
    // Joint 2: turn r(θ3)⊥h2 onto y = y⊥ − s e1 (Paden–Kahan 1).
    let r = {
        let a = vec3::constant(g, k.r0);
        let b = vec3::constant(g, k.rc);
        let c = vec3::constant(g, k.rs);
        let b = vec3::scale(g, c3, b);
        let c = vec3::scale(g, s3, c);
        let bc = vec3::add(g, b, c);
        vec3::add(g, a, bc)
    };
    let y = {
        let back = vec3::scale_const(g, s, k.e1);
        vec3::sub(g, aim.y_perp, back)
    };
    let r_perp = {
        let h = vec3::dot_const(g, k.h2, r);
        let along = vec3::scale_const(g, h, k.h2);
        vec3::sub(g, r, along)
    };
    let (nc, ns) = rotate_onto(g, k.h2, r_perp, y);
    let (c2, s2) = unit_pair(g, nc, ns);
    let free2 = {
        let yh = vec3::dot_const(g, k.h2, y);
        let yy = vec3::dot(g, y, y);
        let yh2 = g.mul(yh, yh);
        let radial = g.sub(yy, yh2);
        let floor = g.exact(tol * tol);
        g.sub(floor, radial)
    };
    let free2 = g.name(
        free2,
        &format!("j2_free_{n}"),
        "≥ 0 when the wrist center is on axis 2 (|y⊥h2|² below tolerance²)",
    );
    let one = g.constant(1.0);
    let zero = g.constant(0.0);
    let c2 = g.select(free2, one, c2);
    let s2 = g.select(free2, zero, s2);
    let theta2 = g.atan2(s2, c2);
    let theta2 = g.name(
        theta2,
        &format!("q2_{n}"),
        "Paden–Kahan 1: θ2 turns r(θ3)⊥h2 onto y about axis 2 (zero on axis 2)",
    );
    let w = vec3::rotate(g, k.h2, c2, s2, r);
    let w = vec3::name(
        g,
        w,
        &format!("w_{n}"),
        "w − f2 = R2 r(θ3): the wrist center, the slide undone",
    );
    let miss = vec3::sub(g, w, y);
    let residual = vec3::dot(g, miss, miss);
    let residual = g.name(
        residual,
        &format!("miss_{n}"),
        "|E1 E2 E3 c − c_t|² = |R2 r − y|²: zero for a real root",
    );
    // Labels: the side e1 · (w − f2), and det[e1, h2 × (w − f2), R2 (cos θ3 rs − sin θ3 rc)].
    let side = vec3::dot_const(g, k.e1, w);
    let facing = g.constant(k.facing);
    let side = g.mul(facing, side);
    let d2 = {
        let h2 = vec3::constant(g, k.h2);
        vec3::cross(g, h2, w)
    };
    let d3 = {
        let rs = vec3::constant(g, k.rs);
        let rc = vec3::constant(g, k.rc);
        let p = vec3::scale(g, c3, rs);
        let q = vec3::scale(g, s3, rc);
        let d = vec3::sub(g, p, q);
        vec3::rotate(g, k.h2, c2, s2, d)
    };
    let d23 = vec3::cross(g, d2, d3);
    let det = vec3::dot_const(g, k.e1, d23);
    let up_sign = g.constant(k.up);
    let up = g.mul(up_sign, det);
    let det2 = g.mul(det, det);
    let per_scale5 = g.constant(1.0 / k.ell.powi(5));
    let merge = g.mul(det2, per_scale5);
    let merge = g.name(
        merge,
        &format!("merge_{n}"),
        "det² / ℓ⁵: at most the length tolerance where two roots merge (a reach boundary)",
    );
    Root {
        values: [d1, theta2, theta3],
        turns: [(c2, s2), (c3, s3)],
        residual,
        merge,
        facing: g.name(side, &format!("side_{n}"), "≥ 0: shoulder facing"),
        up: g.name(up, &format!("aspect_{n}"), "≥ 0: elbow up (Jacobian sign)"),
    }
}

/// Builds joints 1–3 of a base-slide arm: four labelled slots, each holding the root of its
/// label (a failing candidate when no root has it).
pub fn solve(g: &mut Graph, arm: &Arm, k: &Constants, _t: &Target, ct: V3) -> Vec<ArmSolution> {
    let tol = 1e-10 * arm.scale;
    let target = aim(g, k, ct);
    let coefficients = quartic(g, target.cos3, target.sin3);
    let roots = quartic_roots(g, &coefficients, "slide");
    let carried: Vec<Root> = roots
        .iter()
        .enumerate()
        .map(|(i, &tau)| carry(g, k, &target, tau, (i + 1, tol)))
        .collect();
    route_roots(g, k, &carried, (tol, arm.scale))
}

/// Routes each root to the slot of its label ([`crate::plan::route`]): among roots with one
/// label a real one before a complex one, the one farthest from the shoulder plane first,
/// ties broken by `θ3`. A root that lands on an earlier real one (joints 2 and 3 within about
/// 1e-5 rad) is that root again: it fails its check.
fn route_roots(
    g: &mut Graph,
    k: &Constants,
    roots: &[Root],
    (tol, scale): (f64, f64),
) -> Vec<ArmSolution> {
    let near = g.exact_once(COPIES);
    let tol2 = g.exact(tol * tol);
    let tie_weight = g.constant(1e-6 * scale);
    let mut routed: Vec<route::Root> = Vec::with_capacity(roots.len());
    for (j, r) in roots.iter().enumerate() {
        let before = roots[..j].iter().map(|e| (&e.turns[..], e.residual));
        let residual = route::penalised(g, r.residual, before, &r.turns, (near, tol2));
        let side = g.abs(r.facing);
        let tie = g.mul(tie_weight, r.values[2]);
        let rank = g.sub(tie, side);
        let mut values = r.values.to_vec();
        values.extend(r.turns.iter().flat_map(|&(c, s)| [c, s]));
        values.push(r.merge);
        routed.push(route::Root {
            values,
            residual,
            labels: [r.facing, r.up],
            rank,
        });
    }
    route::route(g, &routed, tol)
        .into_iter()
        .map(|slot| {
            let [facing, up] = slot.labels;
            let tag = slot.tag([["f", "a"], ["u", "d"]]);
            let score = slot.named_score(g, &tag, route::SPARE_NOTE);
            let v = &slot.values;
            let angles =
                [0, 1, 2].map(|j| g.name(v[j], &format!("q{}_{tag}", j + 1), "this label's root"));
            ArmSolution {
                angles,
                undo: vec![
                    Turn::about(k.h2, (v[3], v[4])),
                    Turn::about(k.h3, (v[5], v[6])),
                ],
                shoulder: if facing {
                    Shoulder::Facing
                } else {
                    Shoulder::Across
                },
                elbow: if up { Elbow::Up } else { Elbow::Down },
                checks: vec![CheckLayout {
                    kind: CheckKind::Residual,
                    have_squared: score,
                    limit: v[7],
                }],
                on_axis_1: None,
            }
        })
        .collect()
}
