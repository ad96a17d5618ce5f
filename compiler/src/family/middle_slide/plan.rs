//! Joints 1–3 of a middle-slide arm: R P R (joint 2 a slide) with any axes, solved through a
//! quartic in joint 3 or, when the slide is ⟂ axis 1, through one trigonometric-linear
//! equation and a quadratic (Pieper 1968: the wrist-center equations of three joints of which
//! joint 1 turns; the same elimination as the general family's, [`crate::family::general`]).
//!
//! # The reduction
//!
//! At zero: axis 1 `h1` through `p1`, the slide `e2` (unit, carried by joint 1), axis 3 `h3`
//! through `p3` (moved by `d2 e2` with the slide), the wrist center `c`. Joints 2 and 3 place
//! the wrist center, joint 1 undone, at
//!
//! ```text
//! x(d2, θ3) = P(θ3) + d2 e2   (from p1),   P(θ3) = v + E3(θ3) c − p3 = p0 + cos θ3 pc + sin θ3 ps,
//! ```
//!
//! `v = p3 − p1`, `p0 = v + (h3·(c − p3)) h3`, `pc = (c − p3)⊥h3`, `ps = h3 × (c − p3)` (so
//! `pc ⟂ ps`, `|pc| = |ps|`). Joint 1 keeps the height along `h1` and the distance from `p1`:
//! with `u = c_t − p1`, `ζ = h1 · u`, `ρ = |u|²` and `k = h1 · e2`,
//!
//! ```text
//! (1)  h1 · P(θ3) + k d2 = ζ
//! (2)  |P(θ3)|² + 2 d2 e2 · P(θ3) + d2² = ρ
//! ```
//!
//! (`|P|² = |p0|² + |pc|² + 2 p0·pc cos θ3 + 2 p0·ps sin θ3`, trigonometric of degree 1).
//!
//! * **Tilted slide** (`k ≠ 0`, [`Layout::Tilted`]): (1) gives `d2(θ3) = (ζ − h1·P(θ3)) / k`,
//!   trigonometric of degree 1; in (2) it leaves
//!   `F(θ3) = |P|² + 2 d2 (e2·P) + d2² − ρ = 0`, trigonometric of degree 2, a quartic in the
//!   half-angle tangent, solved by Ferrari's method ([`crate::plan::quartic::trig_roots`]):
//!   at most 4 roots. A complex pair gives its real part; its residual rejects it.
//! * **Level slide** (`k = 0`, [`Layout::Level`]: the slide ⟂ axis 1 keeps the height): (1)
//!   is `(h1·pc) cos θ3 + (h1·ps) sin θ3 = ζ − h1·p0`, 2 roots; for each, (2) is a monic
//!   quadratic, `d2 = −β ± √(β² − γ)`, `β = e2·P`, `γ = |P|² − ρ`: at most 2 × 2 = 4.
//!
//! After either, one guarded Newton step on (1) and (2) in `(d2, θ3)` gives back the digits a
//! near-double root loses. Joint 1 then turns `x` onto `u` about `h1` (Paden–Kahan subproblem
//! 1; the reference value when the target is on axis 1). Each candidate's check is its
//! residual `|E1 E2 E3 c − c_t|²`.
//!
//! # Labels
//!
//! With joint 1 undone, the position Jacobian's determinant is
//! `det[h1 × x, e2, P′] = (h1 × x) · (e2 × P′)`, `P′ = ∂P/∂θ3`; its sign (the elbow's `Up`
//! or `Down`, [`ElbowRule::Aspect`]) is that of `(e2·x)(h1·P′) − k (x·P′)` (cylindrical
//! coordinates about axis 1, whose volume factor is positive). The shoulder label is the side
//! of the plane through `p1` ⟂ `e2` the wrist center is on, `e2 · x` (`Facing` or `Across`,
//! [`ShoulderRule::Plane`]). For a level slide the two labels separate all four roots: the
//! two slide roots of one `θ3` have `e2·x = ±√(β² − γ)`, and the two roots of (1) have
//! opposite signs of `h1·P′`, so the aspect `sign(e2·x) sign(h1·P′)` tells them apart; each
//! changes only where two roots merge. For a tilted slide the aspect is `−sign(k F′(θ3))`,
//! which alternates along the roots of `F`; two roots can then share both labels, and the
//! second takes a label no root has ([`crate::plan::route`]: labels are read by solving).

use armforge_runtime::internal::{CheckKind, ElbowRule, ShoulderRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::{Elbow, Shoulder};

use crate::family::general::plan::{along, on_axis_1, radius_terms, Aim, Circle};
use crate::plan::arm::Arm;
use crate::plan::graph::{Graph, Id};
use crate::plan::quartic::{at, away_from_zero, product, squared, trig_roots, Linear};
use crate::plan::route;
use crate::plan::subproblems::{rotate_into_plane, rotate_onto};
use crate::plan::vec3::{self, num, V3};
use crate::plan::{sign, turn_by, unit_pair, ArmSolution, Target, Turn};
use crate::units::tidy;

/// How the slide lies to axis 1.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Layout {
    /// `k = h1 · e2 ≠ 0`: the quartic in joint 3.
    Tilted,
    /// `k = 0` (the slide ⟂ axis 1): joint 3 from the height, the slide from a quadratic.
    Level,
}

/// The slide counts as ⟂ axis 1 when `|h1 · e2|` is at most this (the classifier's default
/// angle tolerance, radians).
pub const LEVEL: f64 = 1e-6;

/// Two roots whose `(cos θ3, sin θ3, d2 / scale)` lie closer than this (sum of squared
/// differences) are one root found twice (about 1e-5 rad, as the general family's).
pub const COPIES: f64 = 1e-10;

/// The constants of a middle-slide arm's position step.
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// How the slide lies to axis 1.
    pub layout: Layout,
    /// Axis 1.
    pub h1: [f64; 3],
    /// Axis 1's point (nearest the base origin).
    pub p1: [f64; 3],
    /// The slide's direction.
    pub e2: [f64; 3],
    /// Axis 3.
    pub h3: [f64; 3],
    /// Axis 3's point at zero.
    pub p3: [f64; 3],
    /// `k = h1 · e2` (zero for a level slide).
    pub k: f64,
    /// `P(θ3) = p0 + cos θ3 pc + sin θ3 ps`, from `p1`.
    pub p0: [f64; 3],
    /// See `p0`.
    pub pc: [f64; 3],
    /// See `p0`.
    pub ps: [f64; 3],
    /// The shoulder side that means `Facing` (the side at zero).
    pub facing: f64,
    /// The Jacobian sign that means `Up` (the sign at zero).
    pub up: f64,
}

/// The constants of `arm` (the classifier has made sure the wrist center is off axis 3 and,
/// for a level slide, that axis 3 is not parallel to axis 1).
pub fn constants(arm: &Arm) -> Constants {
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let e2 = arm.axis(1);
    let (h3, p3) = (arm.axis(2), arm.point(2));
    let c = arm.wrist_center;
    let k = num::dot(&h1, &e2);
    let layout = if k.abs() <= LEVEL {
        Layout::Level
    } else {
        Layout::Tilted
    };
    let k = if layout == Layout::Level { 0.0 } else { k };
    let r = num::sub(&c, &p3);
    let along3 = num::dot(&h3, &r);
    let p0 = num::add(&num::sub(&p3, &p1), &num::scale(&h3, along3));
    let pc = num::sub(&r, &num::scale(&h3, along3));
    let ps = num::cross(&h3, &r);
    // The labels at zero: x = c − p1, P′ = ps.
    let x = num::sub(&c, &p1);
    let facing = sign(num::dot(&e2, &x));
    let up = sign(num::dot(&num::cross(&h1, &x), &num::cross(&e2, &ps)));
    Constants {
        layout,
        h1,
        p1,
        e2,
        h3,
        p3,
        k,
        p0,
        pc,
        ps,
        facing,
        up,
    }
}

/// The label rules of a middle-slide arm.
pub fn rules(arm: &Arm, k: &Constants) -> (ShoulderRule, ElbowRule) {
    (
        ShoulderRule::Plane {
            normal: k.e2,
            point: k.p1,
            wrist_center: arm.wrist_center,
            facing: k.facing,
        },
        ElbowRule::Aspect { up: k.up },
    )
}

/// The circle `P(θ3)` on the graph (in the general family's terms: center and radii).
fn circle(g: &mut Graph, k: &Constants) -> Circle {
    Circle {
        r0: vec3::constant(g, k.p0),
        rc: vec3::constant(g, k.pc),
        rs: vec3::constant(g, k.ps),
    }
}

/// The target seen from `p1`.
fn aim(g: &mut Graph, k: &Constants, ct: V3) -> Aim {
    let u = vec3::add_const(g, ct, num::scale(&k.p1, -1.0));
    let u = vec3::name(g, u, "u", "u = c_t − p1: the target from axis 1's point");
    let rho = vec3::dot(g, u, u);
    let rho = g.name(rho, "rho", "ρ = |u|²");
    let zeta = vec3::dot_const(g, k.h1, u);
    let zeta = g.name(zeta, "zeta", "ζ = h1 · u");
    Aim { u, rho, zeta }
}

/// One root before routing.
struct Root {
    values: Vec<Id>,
    /// `(cos θ3, sin θ3)` and `(d2 / scale, 0)`: what tells two roots apart.
    apart: [(Id, Id); 2],
    residual: Id,
    side: Id,
    up: Id,
}

/// Builds joints 1–3 of a middle-slide arm: four labelled slots, each holding the root of its
/// label (a failing candidate when no root has it).
pub fn solve(g: &mut Graph, arm: &Arm, k: &Constants, t: &Target, ct: V3) -> Vec<ArmSolution> {
    let scale = arm.scale;
    let tol = 1e-10 * scale;
    let p = circle(g, k);
    let target = aim(g, k, ct);
    let on_axis = on_axis_1(g, &target, tol);
    let hp = along(g, &p, k.h1);
    let ep = along(g, &p, k.e2);
    let pp = radius_terms(g, &p);
    let candidates: Vec<((Id, Id), Id)> = match k.layout {
        Layout::Tilted => tilted(g, k, &target, (hp, ep, pp)),
        Layout::Level => level(g, &target, (hp, ep, pp), tol),
    };
    let roots: Vec<Root> = candidates
        .into_iter()
        .enumerate()
        .map(|(i, (cs3, d2))| {
            let (cs3, d2) = refine(g, k, &target, (cs3, d2), (i + 1, scale));
            carry(g, k, t, (&target, on_axis), (cs3, d2), (i + 1, scale))
        })
        .collect();
    route_roots(g, k, &roots, on_axis, (tol, scale))
}

/// A tilted slide: `d2(θ3)` from (1), the quartic `F(θ3) = 0` from (2).
fn tilted(
    g: &mut Graph,
    k: &Constants,
    aim: &Aim,
    (hp, ep, pp): (Linear, Linear, Linear),
) -> Vec<((Id, Id), Id)> {
    let inv_k = 1.0 / k.k;
    let d = {
        let d0 = g.sub(aim.zeta, hp[0]);
        let s = g.constant(inv_k);
        let d0 = g.mul(s, d0);
        let d0 = g.name(
            d0,
            "d2_0",
            format!(
                "d2(θ3) = (ζ − h1·P(θ3)) / k: constant part, k = h1 · e2 = {}",
                tidy(k.k)
            ),
        );
        let m = g.constant(-inv_k);
        [d0, g.mul(m, hp[1]), g.mul(m, hp[2])]
    };
    let de = product(g, d, ep);
    let dd = squared(g, d);
    let mut f = [0; 5];
    for i in 0..5 {
        let two = g.constant(2.0);
        let twice = g.mul(two, de[i]);
        let s = g.add(twice, dd[i]);
        f[i] = if i < 3 { g.add(s, pp[i]) } else { s };
    }
    f[0] = g.sub(f[0], aim.rho);
    let notes = [
        "k0",
        "k1 (cos θ3)",
        "k2 (sin θ3)",
        "k3 (cos 2θ3)",
        "k4 (sin 2θ3)",
    ];
    for (fi, note) in f.iter_mut().zip(notes) {
        *fi = g.name(
            *fi,
            &format!("j3_{}", note.split(' ').next().unwrap_or("k")),
            format!("F(θ3) = |P|² + 2 d2 (e2·P) + d2² − ρ: {note}"),
        );
    }
    let roots = trig_roots(g, f, "j3");
    roots
        .roots
        .iter()
        .enumerate()
        .map(|(i, &cs3)| {
            let d2 = at(g, d, cs3);
            let d2 = g.name(d2, &format!("d2_{}", i + 1), "d2 = (ζ − h1·P(θ3)) / k");
            (cs3, d2)
        })
        .collect()
}

/// A level slide: joint 3 from (1), the slide from the quadratic (2).
fn level(
    g: &mut Graph,
    aim: &Aim,
    (hp, ep, pp): (Linear, Linear, Linear),
    tol: f64,
) -> Vec<((Id, Id), Id)> {
    let e = {
        let e = g.sub(aim.zeta, hp[0]);
        g.name(
            e,
            "j3_e",
            "ζ − h1·p0: joint 3 alone sets the height along axis 1",
        )
    };
    let one = g.constant(1.0);
    let zero = g.constant(0.0);
    // Beyond reach the pair is longer than 1: made a unit pair, so the point stays on joint
    // 3's circle and the residual says how far the target is.
    let roots3 = rotate_into_plane(g, [hp[1], hp[2], e], (one, zero), tol * tol, " m", "j3")
        .roots
        .map(|(c, s)| unit_pair(g, c, s));
    let mut out = Vec::new();
    for (i, cs3) in roots3.into_iter().enumerate() {
        let beta = at(g, ep, cs3);
        let beta = g.name(beta, &format!("beta_{}", i + 1), "β = e2 · P(θ3)");
        let gamma = {
            let r = at(g, pp, cs3);
            g.sub(r, aim.rho)
        };
        let root = {
            let bb = g.mul(beta, beta);
            let disc = g.sub(bb, gamma);
            let root = g.sqrt0(disc);
            g.name(
                root,
                &format!("slide_root_{}", i + 1),
                "√max(β² − γ, 0),  γ = |P(θ3)|² − ρ",
            )
        };
        let base = g.neg(beta);
        for (j, plus) in [true, false].into_iter().enumerate() {
            let d2 = if plus {
                g.add(base, root)
            } else {
                g.sub(base, root)
            };
            let d2 = g.name(
                d2,
                &format!("d2_{}", 2 * i + j + 1),
                format!("d2 = −β {} √(β² − γ)", if plus { "+" } else { "−" }),
            );
            out.push((cs3, d2));
        }
    }
    out
}

/// `x = P(θ3) + d2 e2` and `P′(θ3) = cos θ3 ps − sin θ3 pc`.
fn placed(g: &mut Graph, k: &Constants, (c3, s3): (Id, Id), d2: Id) -> (V3, V3) {
    let pc = vec3::constant(g, k.pc);
    let ps = vec3::constant(g, k.ps);
    let a = vec3::scale(g, c3, pc);
    let b = vec3::scale(g, s3, ps);
    let ab = vec3::add(g, a, b);
    let p = vec3::add_const(g, ab, k.p0);
    let slide = vec3::scale_const(g, d2, k.e2);
    let x = vec3::add(g, p, slide);
    let a = vec3::scale(g, c3, ps);
    let b = vec3::scale(g, s3, pc);
    (x, vec3::sub(g, a, b))
}

/// The misses of (2) and (1), `G1 = |x|² − ρ`, `G2 = h1 · x − ζ`, and a squared length that
/// weighs them alike, `G1² / (4 max(ρ, tol²)) + G2²`.
fn misses(g: &mut Graph, k: &Constants, x: V3, aim: &Aim, four_rho: Id) -> (Id, Id, Id) {
    let xx = vec3::dot(g, x, x);
    let g1 = g.sub(xx, aim.rho);
    let hx = vec3::dot_const(g, k.h1, x);
    let g2 = g.sub(hx, aim.zeta);
    let g11 = g.mul(g1, g1);
    let a = g.div(g11, four_rho);
    let g22 = g.mul(g2, g2);
    (g1, g2, g.add(a, g22))
}

/// One guarded Newton step on (2) and (1) in `(d2, θ3)`, kept when it is short (at most about
/// 1e-6 rad and 1e-6 × the arm's size) and lowers the miss: it polishes a root and never
/// carries a complex pair's real part onto a neighbouring real root.
fn refine(
    g: &mut Graph,
    k: &Constants,
    aim: &Aim,
    ((c3, s3), d2): ((Id, Id), Id),
    (n, scale): (usize, f64),
) -> ((Id, Id), Id) {
    let floor = g.exact(1e-20);
    let four_rho = {
        let four = g.constant(4.0);
        let r = g.max(aim.rho, floor);
        g.mul(four, r)
    };
    let (x, dp) = placed(g, k, (c3, s3), d2);
    let (g1, g2, miss0) = misses(g, k, x, aim, four_rho);
    // J = [[2 x·e2, 2 x·P′], [k, h1·P′]].
    let two = g.constant(2.0);
    let j11 = vec3::dot_const(g, k.e2, x);
    let j11 = g.mul(two, j11);
    let j12 = vec3::dot(g, x, dp);
    let j12 = g.mul(two, j12);
    let j21 = g.constant(k.k);
    let j22 = vec3::dot_const(g, k.h1, dp);
    let det = {
        let p = g.mul(j11, j22);
        let q = g.mul(j12, j21);
        let d = g.sub(p, q);
        away_from_zero(g, d)
    };
    // (δd, δ3) = −J⁻¹ (G1, G2).
    let delta_d = {
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
    let d2n = g.add(d2, delta_d);
    let (c3n, s3n) = turn_by(g, (c3, s3), delta3);
    let (xn, _) = placed(g, k, (c3n, s3n), d2n);
    let (_, _, miss1) = misses(g, k, xn, aim, four_rho);
    let lowers = g.sub(miss0, miss1);
    let step2 = {
        let per = g.constant(1.0 / scale);
        let dd = g.mul(per, delta_d);
        g.mul_add2(dd, dd, delta3, delta3)
    };
    let bound = g.exact(1e-12);
    let short = g.sub(bound, step2);
    let better = g.min(lowers, short);
    let better = g.name(
        better,
        &format!("refine_{n}"),
        "≥ 0 when the Newton step on (1) and (2) is short and lowers the miss",
    );
    (
        (g.select(better, c3n, c3), g.select(better, s3n, s3)),
        g.select(better, d2n, d2),
    )
}

/// Joint 1 for one root (Paden–Kahan subproblem 1 about axis 1, the reference on axis 1), the
/// root's residual `|E1 E2 E3 c − c_t|²` and its labels.
fn carry(
    g: &mut Graph,
    k: &Constants,
    t: &Target,
    (aim, on_axis): (&Aim, Id),
    ((c3, s3), d2): ((Id, Id), Id),
    (n, scale): (usize, f64),
) -> Root {
    let theta3 = g.atan2(s3, c3);
    let theta3 = g.name(theta3, &format!("q3_{n}"), "θ3 = atan2(sin θ3, cos θ3)");
    let (x, dp) = placed(g, k, (c3, s3), d2);
    let x = vec3::name(
        g,
        x,
        &format!("x_{n}"),
        "x = P(θ3) + d2 e2: the wrist center from p1, joint 1 undone",
    );
    let height = vec3::dot_const(g, k.h1, x);
    let axial = vec3::scale_const(g, height, k.h1);
    let x_perp = vec3::sub(g, x, axial);
    let (nc1, ns1) = rotate_onto(g, k.h1, x_perp, aim.u);
    let (c1, s1) = unit_pair(g, nc1, ns1);
    let c1 = g.select(on_axis, t.reference1.0, c1);
    let s1 = g.select(on_axis, t.reference1.1, s1);
    let theta1 = g.atan2(s1, c1);
    let theta1 = g.name(
        theta1,
        &format!("q1_{n}"),
        "Paden–Kahan 1: θ1 turns x onto u about axis 1 (the reference on axis 1)",
    );
    let turned = vec3::rotate(g, k.h1, c1, s1, x);
    let miss = vec3::sub(g, turned, aim.u);
    let residual = vec3::dot(g, miss, miss);
    let residual = g.name(
        residual,
        &format!("miss_{n}"),
        "|E1 E2 E3 c − c_t|²: zero for a real root",
    );
    // Labels: the side e2 · x, and det[h1 × x, e2, P′] = (h1 × x) · (e2 × P′).
    let side = {
        let s = vec3::dot_const(g, k.e2, x);
        let facing = g.constant(k.facing);
        g.mul(facing, s)
    };
    let det = {
        let h1 = vec3::constant(g, k.h1);
        let e2 = vec3::constant(g, k.e2);
        let a = vec3::cross(g, h1, x);
        let b = vec3::cross(g, e2, dp);
        vec3::dot(g, a, b)
    };
    let up = {
        let s = g.constant(k.up);
        g.mul(s, det)
    };
    let merge = {
        let d2 = g.mul(det, det);
        let per = g.constant(1.0 / scale.powi(3));
        g.mul(d2, per)
    };
    let merge = g.name(
        merge,
        &format!("merge_{n}"),
        "det² / scale³: at most the length tolerance where two roots merge (a reach boundary)",
    );
    let per = g.constant(1.0 / scale);
    let d2_scaled = g.mul(per, d2);
    let zero = g.constant(0.0);
    Root {
        values: vec![theta1, d2, theta3, c1, s1, c3, s3, merge],
        apart: [(c3, s3), (d2_scaled, zero)],
        residual,
        side: g.name(side, &format!("side_{n}"), "≥ 0: shoulder facing"),
        up: g.name(up, &format!("aspect_{n}"), "≥ 0: elbow up (Jacobian sign)"),
    }
}

/// Routes each root to the slot of its label ([`crate::plan::route`]): among roots with one
/// label a real one first, and among those the one farthest from the plane ⟂ `e2`, ties
/// broken by `θ3`. On a tilted slide, a root that repeats an earlier real one (joint 3 and the
/// slide within about 1e-5) fails its check.
fn route_roots(
    g: &mut Graph,
    k: &Constants,
    roots: &[Root],
    on_axis: Id,
    (tol, scale): (f64, f64),
) -> Vec<ArmSolution> {
    let near = g.exact_once(COPIES);
    let tol2 = g.exact(tol * tol);
    let tie_weight = g.constant(1e-6 * scale);
    let mut routed: Vec<route::Root> = Vec::with_capacity(roots.len());
    for (j, r) in roots.iter().enumerate() {
        // A level slide's roots come from a plane equation and a quadratic in closed form:
        // two of them are never one root found twice, however near (a double root is the
        // same values, which the finishing merges). A tilted slide's quartic gives a complex
        // pair's real part, which the Newton step can bring next to a real root.
        let residual = match k.layout {
            Layout::Tilted => {
                let before = roots[..j].iter().map(|e| (&e.apart[..], e.residual));
                route::penalised(g, r.residual, before, &r.apart, (near, tol2))
            }
            Layout::Level => r.residual,
        };
        let side = g.abs(r.side);
        let tie = g.mul(tie_weight, r.values[2]);
        let rank = g.sub(tie, side);
        routed.push(route::Root {
            values: r.values.clone(),
            residual,
            labels: [r.side, r.up],
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
            let names = ["q1", "d2", "q3"];
            let angles = [0, 1, 2]
                .map(|j| g.name(v[j], &format!("{}_{tag}", names[j]), "this label's root"));
            ArmSolution {
                angles,
                undo: vec![
                    Turn::about(k.h1, (v[3], v[4])),
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
                on_axis_1: Some(on_axis),
            }
        })
        .collect()
}
