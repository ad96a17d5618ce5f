//! Joints 1–3 of a general arm: R R R with any axes (no named family), solved through a
//! quartic (Pieper 1968; Craig, Introduction to Robotics, 3rd ed., 2005, §4.6, presents the
//! same reduction, from memory).
//!
//! # The reduction
//!
//! Let `f1`, `f2` be the feet of the common normal of axes 1 and 2, `a = |f2 − f1| > 0` its
//! length, `n = (f2 − f1)/a`, `ℓ = h2 × n`, `cos α = h1 · h2`, `sin α = |h1 × h2| > 0`, and
//! `m = (h1 − cos α h2)/sin α = μ ℓ` (`μ = ±1`): `(n, ℓ, h2)` is an orthonormal frame and
//! `h1 = cos α h2 + sin α m`. Joint 3 moves the wrist center to
//! `r(θ3) = E3(θ3) c − f2 = r0 + cos θ3 rc + sin θ3 rs` (from `f2`). Joint 1 turns about
//! axis 1, so it keeps the distance from `f1` and the height along `h1` of the point joints
//! 2 and 3 place: with `u = c_t − f1` (the wrist-center target from `f1`),
//! `ρ = |u|²` and `ζ = h1 · u`,
//!
//! ```text
//! |R2 r + a n|² = ρ        ⇒  n · R2 r = X := (ρ − a² − |r|²) / (2a)
//! h1 · (R2 r + a n) = ζ    ⇒  m · R2 r = Y := (ζ − cos α Z) / sin α,   Z := h2 · r
//! ```
//!
//! and joint 2 turns `r` about `h2`, keeping `Z` and the length `|r⊥|² = |r|² − Z²` of its part
//! ⟂ `h2`. So `θ3` solves
//!
//! ```text
//! F(θ3) = X² + Y² + Z² − |r|² = 0,
//! ```
//!
//! a trigonometric polynomial of degree 2 (`X`, `Y`, `Z` and `|r|²` are each
//! `k0 + k1 cos θ3 + k2 sin θ3`), i.e. a quartic in a half-angle tangent:
//! [`crate::plan::quartic::trig_roots`] solves it by Ferrari's method (at most 4 roots: Pieper 1968).
//!
//! # Joint 3 a slide (the general-slide family, [`super::slide`])
//!
//! With `e3` the slide's direction, `r(d3) = r0 + d3 e3` (`rc = 0`, `rs = e3`, the pair of
//! joint 3 read as `(1, d3)`, so `∂r/∂d3 = e3` is the circle's `cos θ3 rs − sin θ3 rc`): `Z`
//! and `Y` are linear in `d3`, `|r|²` and `X` quadratic, and `4a² F(d3) = (2aX)² + 4a² (Y² + Z²
//! − |r|²)` is a monic quartic, solved by [`crate::plan::quartic::quartic_roots`] (Ferrari's
//! method and two guarded Newton steps per root). The back substitution, the Newton step on
//! the two equations (in `(θ2, d3)`), the labels and the routing are the same; a root's
//! pair for telling copies apart is `(1, d3 / scale)`.
//!
//! # Back substitution
//!
//! * Joint 2, Paden–Kahan subproblem 1 in the plane ⟂ `h2`: turn `r⊥ = (n·r, ℓ·r)` onto
//!   `(X, μY)`: `cos θ2 ∝ (n·r) X + (ℓ·r) μY`, `sin θ2 ∝ (n·r) μY − (ℓ·r) X`.
//! * Joint 1, Paden–Kahan subproblem 1 about `h1`: turn `w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ
//!   + Z h2` onto `u`; the reference value when the target is on axis 1.
//! * A complex pair of roots gives its real part; the candidate's check is its residual
//!   `|E1 E2 E3 c − c_t|²`, which such a candidate misses by.
//!
//! # Labels
//!
//! The shoulder label is the side of the plane through axis 1 ⟂ `n` the wrist center is on
//! (the elbow family's rule), the elbow label the sign of the position Jacobian's determinant
//! (the aspect). Each root is routed to the slot of its own label (the one with the smallest
//! residual when two share a label, so a complex root never displaces a real one).

use armforge_runtime::internal::{CheckKind, ElbowRule, ShoulderRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::{Elbow, JointKind, Shoulder};

use crate::plan::arm::Arm;
use crate::plan::graph::{Graph, Id};
use crate::plan::quartic::{at, away_from_zero, quartic_roots, squared, trig_roots, Linear};
use crate::plan::route;
use crate::plan::subproblems::rotate_onto;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{sign, turn_by, unit_pair, ArmSolution, Target, Turn};
use crate::units::tidy;

/// How axes 1 and 2 lie. The quartic needs them apart and not parallel; when they meet or
/// are parallel, one equation in joint 3 alone is left (see [`super::axes_1_2`]).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Layout {
    /// Apart and not parallel: the quartic.
    Skew,
    /// Meeting in one point (`a = 0`, `f1 = f2`).
    Meet,
    /// Parallel and apart (`sin α = 0`).
    Parallel,
}

/// Axes 1 and 2 count as parallel when their sines is at most this (the classifier's default
/// angle tolerance, radians).
const PARALLEL: f64 = 1e-6;

/// Axes 1 and 2 count as meeting when their common normal is at most this × the arm's size
/// (the classifier's default distance tolerance).
const MEET: f64 = 1e-6;

/// The constants of a general arm's position step.
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// How axes 1 and 2 lie.
    pub layout: Layout,
    /// Axis 1.
    pub h1: [f64; 3],
    /// Axis 2.
    pub h2: [f64; 3],
    /// Axis 3 (the slide's direction when joint 3 slides).
    pub h3: [f64; 3],
    /// Joint 3 slides (the general-slide family, [`super::slide`]): `r(d3) = r0 + d3 rs` with
    /// `rc = 0` and `rs` the slide's direction, and the equations in `d3` are polynomials.
    pub slide: bool,
    /// Foot of the common normal on axis 1.
    pub f1: [f64; 3],
    /// Length of the common normal of axes 1 and 2.
    pub a: f64,
    /// Unit common normal, from axis 1 toward axis 2.
    pub n: [f64; 3],
    /// `h2 × n`.
    pub ell: [f64; 3],
    /// The normal of the shoulder label's plane through axis 1: `n`, or `ℓ` when axes 1 and 2
    /// are parallel (the plane through both axes).
    pub side: [f64; 3],
    /// `cos α = h1 · h2`.
    pub cos_a: f64,
    /// `sin α = |h1 × h2|`.
    pub sin_a: f64,
    /// `m · ℓ = ±1`.
    pub mu: f64,
    /// `r(θ3) = r0 + cos θ3 rc + sin θ3 rs`.
    pub r0: [f64; 3],
    /// See `r0`.
    pub rc: [f64; 3],
    /// See `r0`.
    pub rs: [f64; 3],
    /// The shoulder side that means `Facing` (the side at zero).
    pub facing: f64,
    /// The Jacobian sign that means `Up` (the sign at zero).
    pub up: f64,
    /// Two roots whose joints 2 and 3 lie closer than this (sum of squared differences of
    /// their cosines and sines) are one root found twice: a double root, or a complex pair's
    /// real part polished onto a real root. [`COPIES`] for a general arm.
    pub copies: f64,
}

/// A general arm's [`Constants::copies`]: about 1e-5 rad, where rounding separates the two
/// halves of a double root (the square root of the epsilon, with room).
pub const COPIES: f64 = 1e-10;

/// The circle joint 3 moves the placed point on, seen from `f2`:
/// `r(θ3) = r0 + cos θ3 rc + sin θ3 rs`, with `rc ⟂ rs` and `|rc| = |rs|`, so that
/// `∂r/∂θ3 = cos θ3 rs − sin θ3 rc`. Constant for a general arm ([`Circle::fixed`]); a chain
/// read through the target (the mid-wrist family's) moves it with the target.
#[derive(Clone, Copy, Debug)]
pub struct Circle {
    /// The circle's center from `f2`.
    pub r0: V3,
    /// The radius at `θ3 = 0`.
    pub rc: V3,
    /// The radius a quarter turn on.
    pub rs: V3,
}

impl Circle {
    /// The circle of a general arm's joint 3: the constants' own.
    pub fn fixed(g: &mut Graph, k: &Constants) -> Circle {
        Circle {
            r0: vec3::constant(g, k.r0),
            rc: vec3::constant(g, k.rc),
            rs: vec3::constant(g, k.rs),
        }
    }
}

/// The common normal of two lines `p + s h`: its feet on each line.
pub(crate) fn common_normal(
    p1: &[f64; 3],
    h1: &[f64; 3],
    p2: &[f64; 3],
    h2: &[f64; 3],
) -> [[f64; 3]; 2] {
    let w0 = num::sub(p1, p2);
    let b = num::dot(h1, h2);
    let d = num::dot(h1, &w0);
    let e = num::dot(h2, &w0);
    let denom = (1.0 - b * b).max(1e-300);
    let s = (b * e - d) / denom;
    let t = (e - b * d) / denom;
    [
        num::add(p1, &num::scale(h1, s)),
        num::add(p2, &num::scale(h2, t)),
    ]
}

/// Axes 1 and 2: their layout, the feet `f1`, `f2` of their common normal, its length `a` and
/// direction `n` (for meeting axes `f1 = f2` is the meeting point and `n = h1 × h2 / sin α`;
/// for parallel ones `f1` is the foot of `p2` on axis 1).
fn axes_1_2(
    [(h1, p1), (h2, p2)]: [([f64; 3], [f64; 3]); 2],
    scale: f64,
) -> (Layout, [[f64; 3]; 2], f64, [f64; 3]) {
    let cross = num::cross(&h1, &h2);
    let sin_a = num::norm(&cross);
    if sin_a <= PARALLEL {
        let f1 = num::add(&p1, &num::scale(&h1, num::dot(&h1, &num::sub(&p2, &p1))));
        let a = num::norm(&num::sub(&p2, &f1)).max(1e-300);
        let n = num::scale(&num::sub(&p2, &f1), 1.0 / a);
        return (Layout::Parallel, [f1, p2], a, n);
    }
    let [f1, f2] = common_normal(&p1, &h1, &p2, &h2);
    let a = num::norm(&num::sub(&f2, &f1));
    if a <= MEET * scale {
        let o = num::scale(&num::add(&f1, &f2), 0.5);
        return (Layout::Meet, [o, o], 0.0, num::scale(&cross, 1.0 / sin_a));
    }
    (
        Layout::Skew,
        [f1, f2],
        a,
        num::scale(&num::sub(&f2, &f1), 1.0 / a),
    )
}

/// The constants of `arm` (the classifier has made sure that axes 1 and 2 are not one line
/// and that, when they meet, axis 3 misses the meeting point; `sin α` is kept above 1e-300).
/// When joint 3 slides, the slide's constants ([`Constants::slide`]).
pub fn constants(arm: &Arm) -> Constants {
    let lines = [0, 1, 2].map(|i| (arm.axis(i), arm.point(i)));
    let slide = arm.joints[2].kind == JointKind::Prismatic;
    constants_with(lines, arm.wrist_center, arm.scale, slide)
}

/// The constants of three joint lines `(h, p)` that place the point `c` (at zero), for an arm
/// of size `scale`: [`constants`] of a general arm, or the lines of another family's chain
/// read in this family's terms.
pub fn constants_of(lines: [([f64; 3], [f64; 3]); 3], c: [f64; 3], scale: f64) -> Constants {
    constants_with(lines, c, scale, false)
}

/// [`constants_of`] with joint 3 turning about, or sliding along (`slide`), its line.
fn constants_with(
    lines: [([f64; 3], [f64; 3]); 3],
    c: [f64; 3],
    scale: f64,
    slide: bool,
) -> Constants {
    let [(h1, p1), (h2, p2), (h3, p3)] = lines;
    let cos_a = num::dot(&h1, &h2);
    let sin_a = num::norm(&num::cross(&h1, &h2)).max(1e-300);
    let (layout, [f1, f2], a, n) = axes_1_2([(h1, p1), (h2, p2)], scale);
    let ell = num::cross(&h2, &n);
    let side = if layout == Layout::Parallel { ell } else { n };
    let m = num::scale(&num::sub(&h1, &num::scale(&h2, cos_a)), 1.0 / sin_a);
    let mu = if layout == Layout::Parallel {
        1.0
    } else {
        sign(num::dot(&m, &ell))
    };
    let v = num::sub(&c, &p3);
    let along = num::dot(&h3, &v);
    // A slide: r(d3) = (c − f2) + d3 h3, the circle's `cos θ3 rc + sin θ3 rs` read at
    // `(1, d3)` with `rc = 0`, `rs = h3`.
    let (r0, rc, rs) = if slide {
        (num::sub(&c, &f2), [0.0; 3], h3)
    } else {
        (
            num::add(&num::sub(&p3, &f2), &num::scale(&h3, along)),
            num::sub(&v, &num::scale(&h3, along)),
            num::cross(&h3, &v),
        )
    };
    // The labels at zero: the wrist center's side of the plane, the Jacobian's sign.
    let facing = sign(num::dot(&side, &num::sub(&c, &f1)));
    let d1 = num::cross(&h1, &num::sub(&c, &p1));
    let d2 = num::cross(&h2, &num::sub(&c, &p2));
    let d3 = if slide { h3 } else { num::cross(&h3, &v) };
    let up = sign(num::dot(&d1, &num::cross(&d2, &d3)));
    Constants {
        layout,
        h1,
        h2,
        h3,
        slide,
        f1,
        a,
        n,
        ell,
        side,
        cos_a,
        sin_a,
        mu,
        r0,
        rc,
        rs,
        facing,
        up,
        copies: COPIES,
    }
}

/// The label rules of a general arm.
pub fn rules(arm: &Arm, k: &Constants) -> (ShoulderRule, ElbowRule) {
    (
        ShoulderRule::Plane {
            normal: k.side,
            point: k.f1,
            wrist_center: arm.wrist_center,
            facing: k.facing,
        },
        ElbowRule::Aspect { up: k.up },
    )
}

/// `d · (const, cos θ, sin θ)` pieces of `d · r(θ3)` for a constant direction `d`.
pub fn along(g: &mut Graph, r: &Circle, d: [f64; 3]) -> Linear {
    [
        vec3::dot_const(g, d, r.r0),
        vec3::dot_const(g, d, r.rc),
        vec3::dot_const(g, d, r.rs),
    ]
}

/// One root carried through joints 2 and 1, before routing to a labelled slot.
pub(super) struct Root {
    angles: [Id; 3],
    turns: [(Id, Id); 3],
    residual: Id,
    /// `det² / scale⁵` (metres): at most the length tolerance where two roots merge.
    merge: Id,
    /// `≥ 0` for `Facing`.
    facing: Id,
    /// `≥ 0` for `Up`.
    up: Id,
}

/// Builds joints 1–3 of a general arm: four labelled slots, each holding the root of its
/// label (a failing candidate when no root has it).
pub fn solve(g: &mut Graph, arm: &Arm, k: &Constants, t: &Target, ct: V3) -> Vec<ArmSolution> {
    let r = Circle::fixed(g, k);
    solve_on(g, (arm.scale, k, &r), t, ct)
}

/// [`solve`] for the lines of `k` with joint 3 moving the placed point on the circle `r`,
/// for an arm of size `scale`, placing it at `ct`.
pub fn solve_on(
    g: &mut Graph,
    (scale, k, r): (f64, &Constants, &Circle),
    t: &Target,
    ct: V3,
) -> Vec<ArmSolution> {
    match k.layout {
        Layout::Skew => solve_skew(g, (scale, k, r), t, ct),
        Layout::Meet => super::axes_1_2::solve_meeting(g, (scale, k, r), t, ct),
        Layout::Parallel => super::axes_1_2::solve_parallel(g, (scale, k, r), t, ct),
    }
}

/// The wrist-center target seen from `f1`: `u = c_t − f1`, `ρ = |u|²`, `ζ = h1 · u`.
#[derive(Clone, Copy)]
pub struct Aim {
    /// The target from the chosen point of axis 1.
    pub u: V3,
    /// `ρ = |u|²`.
    pub rho: Id,
    /// `ζ = h1 · u`.
    pub zeta: Id,
}

pub(super) fn aim(g: &mut Graph, k: &Constants, ct: V3) -> Aim {
    let u = vec3::add_const(g, ct, num::scale(&k.f1, -1.0));
    let u = vec3::name(
        g,
        u,
        "u",
        "u = c_t − f1: the target from the foot of the common normal",
    );
    let rho = vec3::dot(g, u, u);
    let rho = g.name(rho, "rho", "ρ = |u|²");
    let zeta = vec3::dot_const(g, k.h1, u);
    let zeta = g.name(zeta, "zeta", "ζ = h1 · u");
    Aim { u, rho, zeta }
}

/// `|r|² = K0 + K1 cos θ3 + K2 sin θ3` (`rc ⟂ rs`, `|rc| = |rs|`).
pub fn radius_terms(g: &mut Graph, r: &Circle) -> Linear {
    let two = g.constant(2.0);
    let r00 = vec3::dot(g, r.r0, r.r0);
    let rcc = vec3::dot(g, r.rc, r.rc);
    let r0c = vec3::dot(g, r.r0, r.rc);
    let r0s = vec3::dot(g, r.r0, r.rs);
    [g.add(r00, rcc), g.mul(two, r0c), g.mul(two, r0s)]
}

/// `≥ 0` when the target is on axis 1 (joint 1 is free: the reference is used).
pub fn on_axis_1(g: &mut Graph, aim: &Aim, tol: f64) -> Id {
    let zz = g.mul(aim.zeta, aim.zeta);
    let radial2 = g.sub(aim.rho, zz);
    let floor = g.exact(tol * tol);
    let on_axis = g.sub(floor, radial2);
    g.name(
        on_axis,
        "j1_free",
        "≥ 0 when the target is on axis 1 (|u⊥|² = ρ − ζ² below tolerance²)",
    )
}

/// Axes 1 and 2 apart and not parallel: the quartic in joint 3.
fn solve_skew(
    g: &mut Graph,
    (scale, k, r): (f64, &Constants, &Circle),
    t: &Target,
    ct: V3,
) -> Vec<ArmSolution> {
    let tol = 1e-10 * scale;
    let target = aim(g, k, ct);
    let Aim { u, rho, zeta } = target;
    let (x, y, z, roots) = if k.slide {
        slide_quartic(g, k, r, &target)
    } else {
        turn_quartic(g, k, r, &target)
    };
    let on_axis = on_axis_1(g, &target, tol);
    let carried: Vec<Root> = roots
        .iter()
        .enumerate()
        .map(|(i, &cs3)| {
            carry(
                g,
                (k, r),
                t,
                (u, rho, zeta),
                x,
                y,
                z,
                cs3,
                on_axis,
                (i + 1, scale),
            )
        })
        .collect();
    route(g, k, &carried, on_axis, (tol, scale))
}

/// `X` (`n · R2 r`) as a function of joint 3: a trigonometric polynomial of degree 1 in `θ3`
/// (a turn), or a polynomial of degree 2 in `d3` (a slide, read at `(1, d3)`).
#[derive(Clone, Copy)]
pub(super) enum Curve {
    /// `k0 + k1 cos θ3 + k2 sin θ3`.
    Trig(Linear),
    /// `k0 + k1 d3 + k2 d3²`.
    Poly([Id; 3]),
}

impl Curve {
    /// The value at joint 3's pair: `(cos θ3, sin θ3)`, or `(1, d3)` for a slide.
    pub(super) fn at(self, g: &mut Graph, (c3, s3): (Id, Id)) -> Id {
        match self {
            Curve::Trig(l) => at(g, l, (c3, s3)),
            Curve::Poly([k0, k1, k2]) => {
                let q = g.mul(k2, s3);
                let q = g.add(q, k1);
                let q = g.mul(q, s3);
                g.add(q, k0)
            }
        }
    }
}

/// The equations of the quartic: `X`, `Y`, `Z` and the candidates of joint 3.
type Quartic = (Curve, Linear, Linear, Vec<(Id, Id)>);

/// Joint 3 turns: `F(θ3) = X² + Y² + Z² − |r|²`, a trigonometric polynomial of degree 2.
fn turn_quartic(g: &mut Graph, k: &Constants, r: &Circle, target: &Aim) -> Quartic {
    let Aim { rho, zeta, .. } = *target;
    let kk = radius_terms(g, r);
    let z = along(g, r, k.h2);
    let inv_2a = 1.0 / (2.0 * k.a);
    let x0 = {
        let aa = g.constant(k.a * k.a);
        let shift = g.add(aa, kk[0]);
        let d = g.sub(rho, shift);
        let s = g.constant(inv_2a);
        let x0 = g.mul(s, d);
        g.name(
            x0,
            "x0",
            format!(
                "X = (ρ − a² − |r|²)/(2a): constant part, a = {} m",
                tidy(k.a)
            ),
        )
    };
    let minus_inv_2a = g.constant(-inv_2a);
    let x = [x0, g.mul(minus_inv_2a, kk[1]), g.mul(minus_inv_2a, kk[2])];
    let cot = k.cos_a / k.sin_a;
    let y0 = {
        let cos_a = g.constant(k.cos_a);
        let shift = g.mul(cos_a, z[0]);
        let d = g.sub(zeta, shift);
        let s = g.constant(1.0 / k.sin_a);
        let y0 = g.mul(s, d);
        g.name(
            y0,
            "y0",
            format!(
                "Y = (ζ − cos α Z)/sin α: constant part, cos α = {}, sin α = {}",
                tidy(k.cos_a),
                tidy(k.sin_a)
            ),
        )
    };
    let minus_cot = g.constant(-cot);
    let y = [y0, g.mul(minus_cot, z[1]), g.mul(minus_cot, z[2])];
    let (fx, fy, fz) = (squared(g, x), squared(g, y), squared(g, z));
    let mut f = [0; 5];
    for i in 0..5 {
        let s = g.add(fx[i], fy[i]);
        let s = g.add(s, fz[i]);
        f[i] = if i < 3 { g.sub(s, kk[i]) } else { s };
    }
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
            format!("F(θ3) = X² + Y² + Z² − |r|²: {note}"),
        );
    }
    let roots = trig_roots(g, f, "j3");
    (Curve::Trig(x), y, z, roots.roots.to_vec())
}

/// `(Σ pᵢ dⁱ)²`, coefficients lowest power first (`p` of degree 2: a degree-4 result).
fn poly_square(g: &mut Graph, p: [Id; 3]) -> [Id; 5] {
    let two = g.constant(2.0);
    let sq = |g: &mut Graph, a: Id| g.mul(a, a);
    let twice = |g: &mut Graph, a: Id, b: Id| {
        let ab = g.mul(a, b);
        g.mul(two, ab)
    };
    let c0 = sq(g, p[0]);
    let c1 = twice(g, p[0], p[1]);
    let c2 = {
        let a = sq(g, p[1]);
        let b = twice(g, p[0], p[2]);
        g.add(a, b)
    };
    let c3 = twice(g, p[1], p[2]);
    let c4 = sq(g, p[2]);
    [c0, c1, c2, c3, c4]
}

/// Joint 3 slides: `r(d3) = r0 + d3 e3` (`e3 = rs`, `rc = 0`), so `Z` and `Y` are linear in
/// `d3`, `|r|² = |r0|² + 2 (r0 · e3) d3 + d3²` and `X` quadratic, and
/// `4a² F(d3) = W² + 4a² (Y² + Z² − |r|²)`, `W = 2aX = ρ − a² − |r|²`, is a monic quartic in
/// `d3`, solved by Ferrari's method ([`quartic_roots`], two guarded Newton steps per root).
fn slide_quartic(g: &mut Graph, k: &Constants, r: &Circle, target: &Aim) -> Quartic {
    let Aim { rho, zeta, .. } = *target;
    let z = along(g, r, k.h2);
    let two = g.constant(2.0);
    let r00 = vec3::dot(g, r.r0, r.r0);
    let r0e = vec3::dot(g, r.r0, r.rs);
    let r1 = g.mul(two, r0e);
    let one = g.constant(1.0);
    // W = ρ − a² − |r|² = w0 + w1 d3 − d3².
    let w0 = {
        let aa = g.constant(k.a * k.a);
        let shift = g.add(aa, r00);
        let w0 = g.sub(rho, shift);
        g.name(
            w0,
            "w0",
            format!(
                "W = 2aX = ρ − a² − |r|²: constant part, a = {} m",
                tidy(k.a)
            ),
        )
    };
    let w = [w0, g.neg(r1), g.neg(one)];
    let inv_2a = g.constant(1.0 / (2.0 * k.a));
    let x = w.map(|wi| g.mul(inv_2a, wi));
    let cot = k.cos_a / k.sin_a;
    let y0 = {
        let cos_a = g.constant(k.cos_a);
        let shift = g.mul(cos_a, z[0]);
        let d = g.sub(zeta, shift);
        let s = g.constant(1.0 / k.sin_a);
        let y0 = g.mul(s, d);
        g.name(
            y0,
            "y0",
            format!(
                "Y = (ζ − cos α Z)/sin α: constant part, cos α = {}, sin α = {}",
                tidy(k.cos_a),
                tidy(k.sin_a)
            ),
        )
    };
    let minus_cot = g.constant(-cot);
    let y = [y0, g.mul(minus_cot, z[1]), g.mul(minus_cot, z[2])];
    let zero = g.constant(0.0);
    let ww = poly_square(g, w);
    let yy = poly_square(g, [y[0], y[2], zero]);
    let zz = poly_square(g, [z[0], z[2], zero]);
    let radius2 = [r00, r1, one];
    let four_aa = g.constant(4.0 * k.a * k.a);
    let mut c = [0; 5];
    for i in 0..5 {
        c[i] = if i < 3 {
            let s = g.add(yy[i], zz[i]);
            let s = g.sub(s, radius2[i]);
            let s = g.mul(four_aa, s);
            g.add(ww[i], s)
        } else {
            ww[i]
        };
        c[i] = g.name(
            c[i],
            &format!("j3_c{i}"),
            format!("4a² F(d3) = W² + 4a² (Y² + Z² − |r|²): coefficient of d3^{i}"),
        );
    }
    let roots = quartic_roots(g, &[c[4], c[3], c[2], c[1], c[0]], "j3");
    let pairs = roots.iter().map(|&d| (one, d)).collect();
    (Curve::Poly(x), y, z, pairs)
}

/// The wrist center with joint 1 undone for joint pairs `(c2, s2)`, `(c3, s3)`:
/// `w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2`, with `n · (w − f1)` and `∂w/∂θ3`.
pub(super) struct Placed {
    w: V3,
    /// The shoulder label's side: `side · (w − f1)` (`n · (w − f1)` unless axes 1 and 2 are
    /// parallel).
    side: Id,
    /// `∂w/∂θ3 = R2 (cos θ3 rs − sin θ3 rc)` (`= R2 (h3 × R3 (c − p3))` for a general arm).
    d3: V3,
}

pub(super) fn placed(
    g: &mut Graph,
    (k, r): (&Constants, &Circle),
    z: Linear,
    (c2, s2): (Id, Id),
    (c3, s3): (Id, Id),
) -> Placed {
    let rn = along(g, r, k.n);
    let rl = along(g, r, k.ell);
    let rn = at(g, rn, (c3, s3));
    let rl = at(g, rl, (c3, s3));
    let zv = at(g, z, (c3, s3));
    let along_n = {
        let p = g.mul(c2, rn);
        let q = g.mul(s2, rl);
        let d = g.sub(p, q);
        let a = g.constant(k.a);
        g.add(a, d)
    };
    let along_l = g.mul_add2(s2, rn, c2, rl);
    let w = {
        let wn = vec3::scale_const(g, along_n, k.n);
        let wl = vec3::scale_const(g, along_l, k.ell);
        let wh = vec3::scale_const(g, zv, k.h2);
        let s = vec3::add(g, wn, wl);
        vec3::add(g, s, wh)
    };
    let d3 = {
        let p = vec3::scale(g, c3, r.rs);
        let q = vec3::scale(g, s3, r.rc);
        let s = vec3::sub(g, p, q);
        vec3::rotate(g, k.h2, c2, s2, s)
    };
    let side = if k.layout == Layout::Parallel {
        along_l
    } else {
        along_n
    };
    Placed { w, side, d3 }
}

/// `∂w/∂θ2 = h2 × (w − f2)` (axis 2 through `f2 = f1 + a n`).
fn d_theta2(g: &mut Graph, k: &Constants, w: V3) -> V3 {
    let h2 = vec3::constant(g, k.h2);
    let w2 = vec3::add_const(g, w, num::scale(&k.n, -k.a));
    vec3::cross(g, h2, w2)
}

/// The misses of the two equations joint 1 leaves, `|w − f1|² − ρ` and `h1 · (w − f1) − ζ`,
/// and a squared length that weighs them alike, `G1² / (4 max(ρ, tol²)) + G2²`.
fn misses(g: &mut Graph, k: &Constants, w: V3, rho: Id, zeta: Id, four_rho: Id) -> (Id, Id, Id) {
    let ww = vec3::dot(g, w, w);
    let g1 = g.sub(ww, rho);
    let hw = vec3::dot_const(g, k.h1, w);
    let g2 = g.sub(hw, zeta);
    let g11 = g.mul(g1, g1);
    let a = g.div(g11, four_rho);
    let g22 = g.mul(g2, g2);
    (g1, g2, g.add(a, g22))
}

/// Joints 2 and 1 for one root of joint 3, its residual and its labels.
///
/// After the quartic, one guarded Newton step on the two equations joint 1 leaves
/// (`|w − f1|² = ρ`, `h1 · (w − f1) = ζ`) in `(θ2, θ3)`: the quartic squares the equations
/// when it eliminates `θ2`, and loses about `ε / a` when axes 1 and 2 nearly meet; the step
/// on the equations themselves gives the digits back wherever the Jacobian is regular.
#[allow(clippy::too_many_arguments)]
fn carry(
    g: &mut Graph,
    (k, r): (&Constants, &Circle),
    t: &Target,
    (u, rho, zeta): (V3, Id, Id),
    x: Curve,
    y: Linear,
    z: Linear,
    (c3, s3): (Id, Id),
    on_axis: Id,
    (n, scale): (usize, f64),
) -> Root {
    let rn = along(g, r, k.n);
    let rl = along(g, r, k.ell);
    let rn = at(g, rn, (c3, s3));
    let rl = at(g, rl, (c3, s3));
    let xv = x.at(g, (c3, s3));
    let yv = at(g, y, (c3, s3));
    let my = if k.mu > 0.0 { yv } else { g.neg(yv) };
    // Paden–Kahan 1 in the plane ⟂ h2: (n·r, ℓ·r) onto (X, μY).
    let nc = g.mul_add2(rn, xv, rl, my);
    let a = g.mul(rn, my);
    let b = g.mul(rl, xv);
    let ns = g.sub(a, b);
    let (c2, s2) = unit_pair(g, nc, ns);
    // One Newton step on (G1, G2) in (θ2, θ3), kept when it lowers the miss.
    let tol = g.exact(1e-20);
    let four_rho = {
        let four = g.constant(4.0);
        let r = g.max(rho, tol);
        g.mul(four, r)
    };
    let before = placed(g, (k, r), z, (c2, s2), (c3, s3));
    let (g1, g2, miss0) = misses(g, k, before.w, rho, zeta, four_rho);
    let d2 = d_theta2(g, k, before.w);
    let two = g.constant(2.0);
    let j11 = vec3::dot(g, before.w, d2);
    let j11 = g.mul(two, j11);
    let j12 = vec3::dot(g, before.w, before.d3);
    let j12 = g.mul(two, j12);
    let j21 = vec3::dot_const(g, k.h1, d2);
    let j22 = vec3::dot_const(g, k.h1, before.d3);
    let det = {
        let p = g.mul(j11, j22);
        let q = g.mul(j12, j21);
        let d = g.sub(p, q);
        away_from_zero(g, d)
    };
    // (δ2, δ3) = −J⁻¹ (G1, G2).
    let delta2 = {
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
    let (c2n, s2n) = turn_by(g, (c2, s2), delta2);
    let (c3n, s3n) = if k.slide {
        (c3, g.add(s3, delta3))
    } else {
        turn_by(g, (c3, s3), delta3)
    };
    let after = placed(g, (k, r), z, (c2n, s2n), (c3n, s3n));
    let (_, _, miss1) = misses(g, k, after.w, rho, zeta, four_rho);
    let lowers = g.sub(miss0, miss1);
    // A short step only (|δ| ≤ 1e-6 rad): the step polishes a root; it must not carry the real
    // part of a complex pair onto a neighbouring real root (a duplicate with another label).
    let d22 = g.mul(delta2, delta2);
    let d33 = if k.slide {
        // A slide's step in metres, measured against the arm's size.
        let per = g.constant(1.0 / scale);
        let relative = g.mul(per, delta3);
        g.mul(relative, relative)
    } else {
        g.mul(delta3, delta3)
    };
    let step2 = g.add(d22, d33);
    let bound = g.exact(1e-12);
    let short = g.sub(bound, step2);
    let better = g.min(lowers, short);
    let better = g.name(
        better,
        &format!("refine_{n}"),
        "≥ 0 when the Newton step on the two equations is short and lowers the miss",
    );
    let c2 = g.select(better, c2n, c2);
    let s2 = g.select(better, s2n, s2);
    let c3 = g.select(better, c3n, c3);
    let s3 = g.select(better, s3n, s3);
    let placed = Placed {
        w: vec3::select(g, better, after.w, before.w),
        side: g.select(better, after.side, before.side),
        d3: vec3::select(g, better, after.d3, before.d3),
    };
    let note2 = "Paden–Kahan 1: θ2 = atan2((n·r) μY − (ℓ·r) X, (n·r) X + (ℓ·r) μY), refined";
    finish(
        g,
        k,
        t,
        (u, on_axis),
        [(c2, s2), (c3, s3)],
        placed,
        (n, note2, scale),
    )
}

/// Joint 1 for one root of joints 2 and 3 (Paden–Kahan subproblem 1 about axis 1, the
/// reference on axis 1), the root's residual `|E1 E2 E3 c − c_t|²` and its labels.
pub(super) fn finish(
    g: &mut Graph,
    k: &Constants,
    t: &Target,
    (u, on_axis): (V3, Id),
    [(c2, s2), (c3, s3)]: [(Id, Id); 2],
    Placed { w, side, d3 }: Placed,
    (n, note2, scale): (usize, &str, f64),
) -> Root {
    let (theta3, turn3) = if k.slide {
        // The slide's value is the root itself; its pair for telling roots apart is
        // `(1, d3 / scale)`, a length measured against the arm's size.
        let d3 = g.name(s3, &format!("q3_{n}"), "d3: the slide's root");
        let per = g.constant(1.0 / scale);
        (d3, (c3, g.mul(per, s3)))
    } else {
        let theta3 = g.atan2(s3, c3);
        let theta3 = g.name(theta3, &format!("q3_{n}"), "θ3 = atan2(sin θ3, cos θ3)");
        (theta3, (c3, s3))
    };
    let theta2 = g.atan2(s2, c2);
    let theta2 = g.name(theta2, &format!("q2_{n}"), note2);
    let w = vec3::name(
        g,
        w,
        &format!("w_{n}"),
        "w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2: the wrist center, joint 1 undone",
    );
    let height = vec3::dot_const(g, k.h1, w);
    let axial = vec3::scale_const(g, height, k.h1);
    let w_perp = vec3::sub(g, w, axial);
    let (nc1, ns1) = rotate_onto(g, k.h1, w_perp, u);
    let (c1, s1) = unit_pair(g, nc1, ns1);
    let c1 = g.select(on_axis, t.reference1.0, c1);
    let s1 = g.select(on_axis, t.reference1.1, s1);
    let theta1 = g.atan2(s1, c1);
    let theta1 = g.name(
        theta1,
        &format!("q1_{n}"),
        "Paden–Kahan 1: θ1 turns w onto u about axis 1 (the reference on axis 1)",
    );
    let turned = vec3::rotate(g, k.h1, c1, s1, w);
    let miss = vec3::sub(g, turned, u);
    let residual = vec3::dot(g, miss, miss);
    let residual = g.name(
        residual,
        &format!("miss_{n}"),
        "|E1 E2 E3 c − c_t|²: zero for a real root",
    );
    // Labels: the side (w − f1) · side, and det[h1 × (w − f1), h2 × (w − f2), R2 (h3 × R3 v)].
    let facing = g.constant(k.facing);
    let side = g.mul(facing, side);
    let h1 = vec3::constant(g, k.h1);
    let d1 = vec3::cross(g, h1, w);
    let d2 = d_theta2(g, k, w);
    let d23 = vec3::cross(g, d2, d3);
    let det = vec3::dot(g, d1, d23);
    let up_sign = g.constant(k.up);
    let up = g.mul(up_sign, det);
    let det2 = g.mul(det, det);
    let per_scale5 = g.constant(1.0 / scale.powi(5));
    let merge = g.mul(det2, per_scale5);
    let merge = g.name(
        merge,
        &format!("merge_{n}"),
        "det² / scale⁵: at most the length tolerance where two roots merge (a reach boundary)",
    );
    Root {
        angles: [theta1, theta2, theta3],
        turns: [(c1, s1), (c2, s2), turn3],
        residual,
        merge,
        facing: g.name(side, &format!("side_{n}"), "≥ 0: shoulder facing"),
        up: g.name(up, &format!("aspect_{n}"), "≥ 0: elbow up (Jacobian sign)"),
    }
}

/// Routes each root to the slot of its label ([`crate::plan::route`]): slot
/// `(shoulder, elbow)` takes, among the roots with that label, a real one before a complex
/// one, and among those the one farthest from the shoulder plane, ties broken by `θ3`. A root
/// that lands on an earlier real one (joints 2 and 3 within about 1e-5 rad: a double root, or
/// a complex pair's real part polished onto a real root) is that root again: it fails its
/// check.
pub(super) fn route(
    g: &mut Graph,
    k: &Constants,
    roots: &[Root],
    on_axis: Id,
    (tol, scale): (f64, f64),
) -> Vec<ArmSolution> {
    // In f32 the threshold grows ×2^14.5 (about 1.5e-3 rad): a squared distance of two roots
    // is no squared tolerance; ×2^29 would merge distinct roots 0.2 rad apart.
    let near = g.exact_once(k.copies);
    let tol2 = g.exact(tol * tol);
    let tie_weight = g.constant(1e-6 * scale);
    let mut routed: Vec<route::Root> = Vec::with_capacity(roots.len());
    for (j, r) in roots.iter().enumerate() {
        let before = roots[..j].iter().map(|e| (&e.turns[1..3], e.residual));
        let residual = route::penalised(g, r.residual, before, &r.turns[1..3], (near, tol2));
        // Nearest the shoulder plane last; θ3 breaks ties (symmetric arms put two roots
        // equally far from the plane).
        let side = g.abs(r.facing);
        let tie = g.mul(tie_weight, r.angles[2]);
        let rank = g.sub(tie, side);
        let mut values = r.angles.to_vec();
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
            let turn = |j: usize| (v[3 + 2 * j], v[4 + 2 * j]);
            let mut undo = vec![Turn::about(k.h1, turn(0)), Turn::about(k.h2, turn(1))];
            if !k.slide {
                undo.push(Turn::about(k.h3, turn(2)));
            }
            ArmSolution {
                angles,
                undo,
                shoulder: if facing {
                    Shoulder::Facing
                } else {
                    Shoulder::Across
                },
                elbow: if up { Elbow::Up } else { Elbow::Down },
                checks: vec![CheckLayout {
                    kind: CheckKind::Residual,
                    have_squared: score,
                    limit: v[9],
                }],
                on_axis_1: Some(on_axis),
            }
        })
        .collect()
}

#[cfg(test)]
#[path = "plan_tests.rs"]
mod tests;
