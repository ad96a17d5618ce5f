//! Joints 1–3 of a general arm whose axes 1 and 2 meet or are parallel: the quartic's two
//! equations fall apart, one of them holds joint 3 alone, and every step is a quadratic
//! (Pieper 1968; Craig, Introduction to Robotics, 3rd ed., 2005, §4.6, from memory: the
//! "a1 = 0" and "sin α1 = 0" cases). The frame `(n, ℓ, h2)`, `r(θ3)`, `u`, `ρ`, `ζ` and `Z`
//! are those of [`super::plan`].
//!
//! # Axes 1 and 2 meet (at `O = f1 = f2`)
//!
//! Joints 1 and 2 turn about lines through `O`, so they keep the distance from `O`:
//!
//! ```text
//! |r(θ3)|² = ρ   ⇔   K1 cos θ3 + K2 sin θ3 = ρ − K0
//! ```
//!
//! (Paden–Kahan subproblem 3 in product-of-exponentials form; `|r|² = K0 + K1 cos θ3 +
//! K2 sin θ3`), up to 2 roots. Joints 2 then 1 turn `r` onto `u` about two axes through one
//! point, Paden–Kahan subproblem 2 (Murray, Li & Sastry, A Mathematical Introduction to
//! Robotic Manipulation, 1994, §3.3): the point between the two turns is
//! `z = α h1 + β h2 ± γ (h1 × h2)` with
//!
//! ```text
//! α = (cos α12 Z − ζ) / (cos² α12 − 1),   β = (cos α12 ζ − Z) / (cos² α12 − 1),
//! γ² = (|r|² − α² − β² − 2 α β cos α12) / sin² α12,
//! ```
//!
//! joint 2 turns `r` onto `z`, joint 1 turns `z` onto `u` (subproblem 1 each): up to 2 × 2 = 4.
//!
//! # Axes 1 and 2 parallel (`h1 = ±h2`, `a` apart)
//!
//! Joints 1 and 2 keep the height along the axes:
//!
//! ```text
//! Z(θ3) = ±ζ   ⇔   (h2 · rc) cos θ3 + (h2 · rs) sin θ3 = ±ζ − h2 · r0,
//! ```
//!
//! up to 2 roots. In the plane ⟂ the axes joint 1 keeps the distance from axis 1 (the law
//! of cosines): `n · R2 r = X := (ρ − ζ² − a² − |r⊥|²) / (2a)` and
//! `ℓ · R2 r = ±√(|r⊥|² − X²)`; joint 2 turns `r⊥` onto that (subproblem 1), joint 1 turns the
//! result onto `u`: up to 2 × 2 = 4.
//!
//! Each candidate's check is its residual `|E1 E2 E3 c − c_t|²`, which a candidate beyond
//! reach misses by; the labels and their routing are the quartic's ([`super::plan::route`]).

use crate::plan::graph::{Graph, Id};
use crate::plan::subproblems::{rotate_into_plane, rotate_onto};
use crate::plan::vec3::{self, num, V3};
use crate::plan::{unit_pair, ArmSolution, Target};

use super::plan::{
    aim, along, finish, on_axis_1, placed, radius_terms, route, Aim, Circle, Constants, Curve, Root,
};
use crate::plan::quartic::at;

/// The two roots of joint 3 from `k1 cos θ3 + k2 sin θ3 = e` (the classifier has made sure
/// that `k1² + k2²` is clear of zero, so the reference is never used).
fn joint_3_roots(
    g: &mut Graph,
    [a, b]: [Id; 2],
    e: Id,
    (threshold, unit): (f64, &str),
) -> [(Id, Id); 2] {
    let one = g.constant(1.0);
    let zero = g.constant(0.0);
    // Beyond reach (`e² > a² + b²`) the pair is `(a, b) e / r²`, longer than 1: made a unit
    // pair, so that the point stays on joint 3's circle and the candidate's residual says how
    // far the target is (off the circle, the rest of the chain could place it exactly, and a
    // θ3 that does not reach would pass its check).
    rotate_into_plane(g, [a, b, e], (one, zero), threshold, unit, "j3")
        .roots
        .map(|(c, s)| unit_pair(g, c, s))
}

/// Joint 3 slides, axes 1 and 2 meet: `|r(d3)|² = d3² + 2 (r0 · e3) d3 + |r0|² = ρ`, so
/// `d3 = −r0 · e3 ± √max((r0 · e3)² − |r0|² + ρ, 0)` (beyond reach, inside the sphere the
/// slide's line misses, the nearest value, which its residual rejects). Returns the pairs
/// `(1, d3)` and `|r|²` as a polynomial in `d3`.
fn slide_distance_roots(g: &mut Graph, r: &Circle, rho: Id) -> ([(Id, Id); 2], Curve) {
    let one = g.constant(1.0);
    let two = g.constant(2.0);
    let r00 = vec3::dot(g, r.r0, r.r0);
    let r0e = vec3::dot(g, r.r0, r.rs);
    let disc = {
        let bb = g.mul(r0e, r0e);
        let d = g.sub(bb, r00);
        let d = g.add(d, rho);
        let root = g.sqrt0(d);
        g.name(
            root,
            "j3_root",
            "√max((r0·e3)² − |r0|² + ρ, 0): |r(d3)|² = ρ keeps the distance from O",
        )
    };
    let centre = g.neg(r0e);
    let roots = [g.add(centre, disc), g.sub(centre, disc)].map(|d| (one, d));
    let r1 = g.mul(two, r0e);
    (roots, Curve::Poly([r00, r1, one]))
}

/// `r(θ3) = r0 + cos θ3 rc + sin θ3 rs`, from `f2`.
fn radius(g: &mut Graph, r: &Circle, (c3, s3): (Id, Id)) -> V3 {
    let p = vec3::scale(g, c3, r.rc);
    let q = vec3::scale(g, s3, r.rs);
    let s = vec3::add(g, p, q);
    vec3::add(g, s, r.r0)
}

/// Joints 1–3 when axes 1 and 2 meet.
pub fn solve_meeting(
    g: &mut Graph,
    (scale, k, r): (f64, &Constants, &Circle),
    t: &Target,
    ct: V3,
) -> Vec<ArmSolution> {
    let tol = 1e-10 * scale;
    let target = aim(g, k, ct);
    let Aim { u, rho, zeta } = target;
    let (roots3, radius2) = if k.slide {
        slide_distance_roots(g, r, rho)
    } else {
        let kk = radius_terms(g, r);
        let e = {
            let e = g.sub(rho, kk[0]);
            g.name(e, "j3_e", "ρ − K0: |r(θ3)|² = ρ keeps the distance from O")
        };
        let roots = joint_3_roots(g, [kk[1], kk[2]], e, ((tol * scale).powi(2), " m²"));
        (roots, Curve::Trig(kk))
    };
    let on_axis = on_axis_1(g, &target, tol);
    let z = along(g, r, k.h2);
    let h12 = num::cross(&k.h1, &k.h2);
    let inv = 1.0 / (k.cos_a * k.cos_a - 1.0);
    let mut roots: Vec<Root> = Vec::new();
    for (i, &cs3) in roots3.iter().enumerate() {
        let zv = at(g, z, cs3);
        let rr = radius2.at(g, cs3);
        let inv = g.constant(inv);
        let cos_a = g.constant(k.cos_a);
        let alpha = {
            let p = g.mul(cos_a, zv);
            let d = g.sub(p, zeta);
            g.mul(inv, d)
        };
        let beta = {
            let p = g.mul(cos_a, zeta);
            let d = g.sub(p, zv);
            g.mul(inv, d)
        };
        let gamma = {
            let aa = g.mul(alpha, alpha);
            let bb = g.mul(beta, beta);
            let ab = g.mul(alpha, beta);
            let two_cos = g.constant(2.0 * k.cos_a);
            let cross = g.mul(two_cos, ab);
            let d = g.sub(rr, aa);
            let d = g.sub(d, bb);
            let d = g.sub(d, cross);
            let per = g.constant(1.0 / (k.sin_a * k.sin_a));
            let gg = g.mul(per, d);
            let gamma = g.sqrt0(gg);
            g.name(
                gamma,
                &format!("gamma_{}", i + 1),
                "γ = √max((|r|² − α² − β² − 2αβ cos α12) / sin² α12, 0): Paden–Kahan 2",
            )
        };
        let rv = radius(g, r, cs3);
        let axial = vec3::scale_const(g, zv, k.h2);
        let r_perp = vec3::sub(g, rv, axial);
        for (j, sigma) in [1.0, -1.0].into_iter().enumerate() {
            let n = 2 * i + j + 1;
            let sg = if sigma > 0.0 { gamma } else { g.neg(gamma) };
            let zp = {
                let a = vec3::scale_const(g, alpha, k.h1);
                let b = vec3::scale_const(g, beta, k.h2);
                let c = vec3::scale_const(g, sg, h12);
                let ab = vec3::add(g, a, b);
                vec3::add(g, ab, c)
            };
            let (nc, ns) = rotate_onto(g, k.h2, r_perp, zp);
            let cs2 = unit_pair(g, nc, ns);
            let place = placed(g, (k, r), z, cs2, cs3);
            let note = "Paden–Kahan 2: θ2 turns r onto z = α h1 + β h2 ± γ (h1 × h2) about axis 2";
            roots.push(finish(
                g,
                k,
                t,
                (u, on_axis),
                [cs2, cs3],
                place,
                (n, note, scale),
            ));
        }
    }
    route(g, k, &roots, on_axis, (tol, scale))
}

/// Joints 1–3 when axes 1 and 2 are parallel.
pub fn solve_parallel(
    g: &mut Graph,
    (scale, k, r): (f64, &Constants, &Circle),
    t: &Target,
    ct: V3,
) -> Vec<ArmSolution> {
    let tol = 1e-10 * scale;
    let target = aim(g, k, ct);
    let Aim { u, rho, zeta } = target;
    let z = along(g, r, k.h2);
    let [z0, z1, z2] = z;
    // h1 = ±h2: the height along h2 the target asks for.
    let e = {
        let s = g.constant(k.cos_a.signum());
        let height = g.mul(s, zeta);
        let e = g.sub(height, z0);
        g.name(
            e,
            "j3_e",
            "±ζ − h2 · r0: joints 1 and 2 keep the height along the axes",
        )
    };
    let roots3 = if k.slide {
        // Z(d3) = z0 + (h2 · e3) d3: one root (the classifier has made sure that the slide is
        // not ⟂ the axes).
        let one = g.constant(1.0);
        let d = g.div(e, z2);
        vec![(one, d)]
    } else {
        joint_3_roots(g, [z1, z2], e, (tol * tol, " m")).to_vec()
    };
    let on_axis = on_axis_1(g, &target, tol);
    // |u⊥|² − a², the planar distance from axis 1 the two planar links must span.
    let planar = {
        let zz = g.mul(zeta, zeta);
        let d = g.sub(rho, zz);
        let aa = g.constant(k.a * k.a);
        g.sub(d, aa)
    };
    let inv_2a = g.constant(1.0 / (2.0 * k.a));
    let rn = along(g, r, k.n);
    let rl = along(g, r, k.ell);
    let mut roots: Vec<Root> = Vec::new();
    for (i, &cs3) in roots3.iter().enumerate() {
        let rn = at(g, rn, cs3);
        let rl = at(g, rl, cs3);
        let perp2 = g.mul_add2(rn, rn, rl, rl);
        let x = {
            let d = g.sub(planar, perp2);
            let x = g.mul(inv_2a, d);
            g.name(
                x,
                &format!("x_{}", i + 1),
                "X = (ρ − ζ² − a² − |r⊥|²) / (2a): n · R2 r, the law of cosines",
            )
        };
        let y = {
            let xx = g.mul(x, x);
            let d = g.sub(perp2, xx);
            let y = g.sqrt0(d);
            g.name(
                y,
                &format!("y_{}", i + 1),
                "Y = √max(|r⊥|² − X², 0): ±ℓ · R2 r",
            )
        };
        for (j, sigma) in [1.0, -1.0].into_iter().enumerate() {
            let n = 2 * i + j + 1;
            let my = if sigma > 0.0 { y } else { g.neg(y) };
            // Paden–Kahan 1 in the plane ⟂ h2: (n·r, ℓ·r) onto (X, ±Y).
            let nc = g.mul_add2(rn, x, rl, my);
            let a = g.mul(rn, my);
            let b = g.mul(rl, x);
            let ns = g.sub(a, b);
            let cs2 = unit_pair(g, nc, ns);
            let place = placed(g, (k, r), z, cs2, cs3);
            let note = "Paden–Kahan 1: θ2 = atan2((n·r) (±Y) − (ℓ·r) X, (n·r) X + (ℓ·r) (±Y))";
            roots.push(finish(
                g,
                k,
                t,
                (u, on_axis),
                [cs2, cs3],
                place,
                (n, note, scale),
            ));
        }
    }
    route(g, k, &roots, on_axis, (tol, scale))
}
