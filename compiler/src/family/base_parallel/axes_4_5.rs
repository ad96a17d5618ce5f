//! Base-parallel arms whose axes 4 and 5 meet or are parallel: joints 4–6 in closed form
//! without the plane–line quartic (whose roots are all double for these placements).
//!
//! With `G = B⁻¹ T M⁻¹ = E1 ⋯ E6` (rotation `R`), `h` the direction of axes 1–3 and
//! `A = E1 E2 E3 = G E6⁻¹ E5⁻¹ E4⁻¹`: `A` keeps every point's height `h · y` and turns every
//! direction about `h`, so `R4 R5 R6 n = h` with `n = Rᵀ h`, and a point `x` of link 3 kept by
//! joints 4 and 5 satisfies `n · (E6⁻¹ E5⁻¹ E4⁻¹ x − q) = 0` with `q = G⁻¹ x` (`h · G y = h · x`
//! exactly when `n · (y − q) = 0`).
//!
//! # Axes 4 and 5 meeting at `m`
//!
//! `E4` and `E5` keep `m`, so `n · (E6⁻¹ m − q) = 0` with `q = G⁻¹ m`; with `v = m − p6`,
//! `E6⁻¹ m = p6 + R6ᵀ v` and `n · R6ᵀ v = (R6 n) · v`:
//!
//! ```text
//! a cos θ6 + b sin θ6 = e,   a = n · v⊥,  b = n · (v × h6),
//!                            e = n · (q − p6) − (h6 · n)(h6 · v)     (v⊥ = v − (h6 · v) h6)
//! ```
//!
//! one equation in joint 6 alone (2 roots; `a² + b² = |n⊥|² |v⊥|²`, zero only where axis 6 is
//! parallel to axes 1–3 (joint 6 free: held at its reference) or for `m` on axis 6, a
//! spherical wrist, rejected). Then `w = R6 n` is known and `R4 R5 w = h`: **Paden–Kahan
//! subproblem 2** (Paden 1986; Murray, Li & Sastry, A Mathematical Introduction to Robotic
//! Manipulation, 1994, §3.2, from memory): `z = R5 w = R4ᵀ h` has `h4 · z = h4 · h` and
//! `h5 · z = h5 · w`, so `z = α h4 + β h5 ± γ (h4 × h5)` with `α = (h4·h − c (h5·w)) / (1 − c²)`,
//! `β = (h5·w − c (h4·h)) / (1 − c²)`, `c = h4 · h5`, `γ² (1 − c²) = |h5 × w|² −
//! (h4·h − c (h5·w))² / (1 − c²)` (0–2 roots); θ5 turns `w` onto `z` about `h5` and θ4 turns `z`
//! onto `h` about `h4` (both subproblem 1). Up to 2 × 2 joint-4–6 solutions.
//!
//! # Axes 4 and 5 parallel (direction `g = h4`, `h5 = s5 g`)
//!
//! `R4 R5 = R(g, ψ)`, `ψ = θ4 + s5 θ5`, so `g · (R6 n) = g · h`:
//!
//! ```text
//! a cos θ6 + b sin θ6 = e,   a = n · g⊥,  b = n · (g × h6),  e = g · h − (h6 · g)(h6 · n)
//! ```
//!
//! (2 roots; scaled by the arm's size so the check reads in metres). ψ turns `w = R6 n` onto
//! `h` about `g` (subproblem 1). Axis 4's point `p4` is kept by joint 4, so with `q = G⁻¹ p4`,
//! `d = p4 − p5`: `n · q = n · p6 + w · (p5 − p6) + (R5 w) · d`, one equation in joint 5:
//!
//! ```text
//! a5 cos θ5 + b5 sin θ5 = e5,   a5 = w · d⊥,  b5 = w · (d × h5),
//!                               e5 = n · (q − p6) − w · (p5 − p6) − (h5 · w)(h5 · d)
//! ```
//!
//! (2 roots; `a5² + b5² = (1 − (g · h)²) |d⊥|² > 0`, since axis 4 is not parallel to axes 1–3
//! and axes 4 and 5 are not one line), then `θ4 = ψ − s5 θ5`. Up to 2 × 2.
//!
//! Joints 1–3 then follow as for every base-parallel arm (the planar chain, 2 bends): up to
//! 8 solutions. The labels: the shoulder label is the root of the joint-6 equation (facing:
//! the root where its derivative `−a sin θ6 + b cos θ6` is `≤ 0`, across: `≥ 0`; the two
//! change only where they merge), the wrist label the sign of `γ` (leading `+`) or the root of
//! the joint-5 equation (leading: derivative `≤ 0`), the elbow label the bend of joints 1–2.

use armforge_runtime::internal::CheckKind;
use armforge_runtime::plan::{CandidateLayout, CheckLayout};
use armforge_runtime::{Shoulder, Wrist};

use super::plan::{finish_hand, start, Joints4To6, Layout};
use crate::classify::decoupled::{gap, line_angle};
use crate::plan::arm::Arm;
use crate::plan::decouple::Target;
use crate::plan::graph::{Graph, Id};
use crate::plan::pose::Motion;
use crate::plan::subproblems::{rotate_into_plane, rotate_onto, PlaneRoots};
use crate::plan::vec3::{self, num, V3};
use crate::plan::{unit_pair, Plan};

/// Where axes 4 and 5 lie relative to each other, decided when the plan is built from the
/// arm's constants with the classifier's tolerances.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Placement {
    /// Neither meeting nor parallel: the plane–line quartic ([`super::plan::solve`]).
    Apart,
    /// Meeting in one point.
    Meeting,
    /// Parallel (and not one line).
    Parallel,
}

/// The name prefix of the joint-6 equation of the meeting placement.
const MEETING: &str = "j6m";
/// The name prefix of the joint-6 equation of the parallel placement.
const PARALLEL: &str = "j6p";

impl Placement {
    /// The placement of `arm` with the classifier's resolved tolerances (metres, radians):
    /// parallel within `angle`, else meeting within `distance`.
    pub fn of(arm: &Arm, distance: f64, angle: f64) -> Placement {
        if line_angle(arm, 4, 5) <= angle {
            Placement::Parallel
        } else if gap(arm, 4, 5) <= distance {
            Placement::Meeting
        } else {
            Placement::Apart
        }
    }

    /// The placement a plan was built for (read from the names of its joint-6 step).
    pub fn of_plan(plan: &Plan) -> Placement {
        let named = |prefix: &str| {
            plan.graph
                .nodes()
                .iter()
                .any(|n| n.name.as_deref().is_some_and(|s| s.starts_with(prefix)))
        };
        if named(MEETING) {
            Placement::Meeting
        } else if named(PARALLEL) {
            Placement::Parallel
        } else {
            Placement::Apart
        }
    }
}

/// The constants of the meeting placement.
#[derive(Clone, Copy, Debug)]
pub struct Meeting {
    /// The point `m` where axes 4 and 5 meet.
    pub meet: [f64; 3],
    /// `v = m − p6`, axis 6's point `p6`.
    pub from_6: [f64; 3],
    /// `v⊥ = v − (h6 · v) h6`.
    pub from_6_across: [f64; 3],
    /// `v × h6`.
    pub from_6_turned: [f64; 3],
    /// `h6 · v`.
    pub from_6_along: f64,
    /// `c = h4 · h5`.
    pub cos_45: f64,
    /// `h4 · h`.
    pub cos_4: f64,
}

impl Meeting {
    /// The constants of an arm whose axes 4 and 5 meet.
    pub fn of(arm: &Arm) -> Meeting {
        let (h4, p4, h5, p5) = (arm.axis(3), arm.point(3), arm.axis(4), arm.point(4));
        let (h6, p6) = (arm.axis(5), arm.point(5));
        // The closest points of the two axes (they meet within the tolerance): the middle.
        let w0 = num::sub(&p4, &p5);
        let c = num::dot(&h4, &h5);
        let (d, e) = (num::dot(&h4, &w0), num::dot(&h5, &w0));
        let den = 1.0 - c * c;
        let s = (c * e - d) / den;
        let u = (e - c * d) / den;
        let on_4 = num::add(&p4, &num::scale(&h4, s));
        let on_5 = num::add(&p5, &num::scale(&h5, u));
        let meet = crate::units::snap3(num::scale(&num::add(&on_4, &on_5), 0.5), arm.scale);
        let v = num::sub(&meet, &p6);
        let along = num::dot(&h6, &v);
        Meeting {
            meet,
            from_6: v,
            from_6_across: num::sub(&v, &num::scale(&h6, along)),
            from_6_turned: num::cross(&v, &h6),
            from_6_along: along,
            cos_45: c,
            cos_4: num::dot(&h4, &arm.axis(0)),
        }
    }
}

/// The constants of the parallel placement.
#[derive(Clone, Copy, Debug)]
pub struct Parallel {
    /// `g = h4`.
    pub g: [f64; 3],
    /// `s5 = h5 · g` (±1).
    pub sense5: f64,
    /// `g⊥ = g − (h6 · g) h6`.
    pub g_across: [f64; 3],
    /// `g × h6`.
    pub g_turned: [f64; 3],
    /// `h6 · g`.
    pub g_along: f64,
    /// `g · h`.
    pub cos_g: f64,
    /// `d = p4 − p5`.
    pub d: [f64; 3],
    /// `d⊥ = d − (h5 · d) h5`.
    pub d_across: [f64; 3],
    /// `d × h5`.
    pub d_turned: [f64; 3],
    /// `h5 · d`.
    pub d_along: f64,
    /// `p5 − p6`.
    pub from_6: [f64; 3],
}

impl Parallel {
    /// The constants of an arm whose axes 4 and 5 are parallel.
    pub fn of(arm: &Arm) -> Parallel {
        let (g, h5, h6) = (arm.axis(3), arm.axis(4), arm.axis(5));
        let sense5 = crate::plan::sign(num::dot(&g, &h5));
        let h5 = num::scale(&g, sense5);
        let g_along = num::dot(&h6, &g);
        let d = num::sub(&arm.point(3), &arm.point(4));
        let d_along = num::dot(&h5, &d);
        Parallel {
            g,
            sense5,
            g_across: num::sub(&g, &num::scale(&h6, g_along)),
            g_turned: num::cross(&g, &h6),
            g_along,
            cos_g: num::dot(&g, &arm.axis(0)),
            d,
            d_across: num::sub(&d, &num::scale(&h5, d_along)),
            d_turned: num::cross(&d, &h5),
            d_along,
            from_6: num::sub(&arm.point(4), &arm.point(5)),
        }
    }
}

/// `n = Rᵀ h` and `q = G⁻¹ x` for a point `x` of link 3 kept by joint 4.
fn normal_and_point(g: &mut Graph, k: &Layout, motion: &Motion, x: [f64; 3]) -> (V3, V3) {
    let hk = vec3::constant(g, k.h);
    let n = motion.rotate_back(g, hk);
    let n = vec3::name(
        g,
        n,
        "n",
        "n = Rᵀ h: the direction of axes 1–3 seen from the tool",
    );
    let ginv = motion.inverse(g);
    let xk = vec3::constant(g, x);
    let q = ginv.apply(g, xk);
    let q = vec3::name(
        g,
        q,
        "q",
        "q = G⁻¹ x: the point joints 1–3 keep at its height",
    );
    (n, q)
}

/// `n · (q − p6)`.
fn height_gap(g: &mut Graph, arm: &Arm, n: V3, q: V3) -> Id {
    let nq = vec3::dot(g, n, q);
    let np6 = vec3::dot_const(g, arm.point(5), n);
    g.sub(nq, np6)
}

/// The check that a root of `a cos θ + b sin θ = e` is real: `a² + b² ≥ e²`.
fn real_roots(roots: &PlaneRoots) -> CheckLayout {
    CheckLayout {
        kind: CheckKind::InsideHole,
        have_squared: roots.radius_squared,
        limit: roots.limit,
    }
}

/// The tag of a label pair (`f`/`a`, `l`/`t`).
fn tag(first: bool, second: bool) -> String {
    format!(
        "{}{}",
        if first { "f" } else { "a" },
        if second { "l" } else { "t" }
    )
}

/// `θ = atan2(s, c)`, named.
fn angle(g: &mut Graph, (c, s): (Id, Id), name: &str, note: &str) -> Id {
    let theta = g.atan2(s, c);
    g.name(theta, name, note)
}

/// Joint 6's two roots: `(cos, sin)` per root, facing (σ = +1) first.
fn joint_6(g: &mut Graph, arm: &Arm, abe: [Id; 3], t: &Target, prefix: &str) -> PlaneRoots {
    let tol = 1e-10 * arm.scale;
    rotate_into_plane(g, abe, t.reference4, tol * tol, " m", prefix)
}

/// Joints 4–6 of the meeting placement.
fn meeting_hands(
    g: &mut Graph,
    arm: &Arm,
    (k, motion): (&Layout, &Motion),
    t: &Target,
) -> Vec<Joints4To6> {
    let c = Meeting::of(arm);
    let (h4, h5, h6) = (arm.axis(3), arm.axis(4), arm.axis(5));
    let (n, q) = normal_and_point(g, k, motion, c.meet);
    let a = vec3::dot_const(g, c.from_6_across, n);
    let a = g.name(a, "j6m_a", "a = n · v⊥, v = m − p6");
    let b = vec3::dot_const(g, c.from_6_turned, n);
    let b = g.name(b, "j6m_b", "b = n · (v × h6)");
    let e = {
        let gap = height_gap(g, arm, n, q);
        let along = vec3::dot_const(g, h6, n);
        let k = g.constant(c.from_6_along);
        let off = g.mul(k, along);
        g.sub(gap, off)
    };
    let e = g.name(e, "j6m_e", "e = n · (q − p6) − (h6 · n)(h6 · v)");
    let roots6 = joint_6(g, arm, [a, b, e], t, MEETING);
    let check6 = real_roots(&roots6);
    let den = 1.0 - c.cos_45 * c.cos_45;
    let n45 = num::cross(&h4, &h5);
    let mut out = Vec::with_capacity(4);
    for (facing, turn6) in [true, false].into_iter().zip(roots6.roots) {
        let six = if facing { "f" } else { "a" };
        let theta6 = angle(g, turn6, &format!("q6_{six}"), "θ6 (this root)");
        let w = vec3::rotate(g, h6, turn6.0, turn6.1, n);
        let w = vec3::name(g, w, &format!("w_{six}"), "w = R6 n");
        // Paden–Kahan subproblem 2: R4 R5 w = h.
        let a5 = vec3::dot_const(g, h5, w);
        let a5 = g.name(a5, &format!("j45_b_{six}"), "h5 · w = h5 · z");
        let off = {
            let kc = g.constant(c.cos_45);
            let x = g.mul(kc, a5);
            let k4 = g.constant(c.cos_4);
            g.sub(k4, x)
        };
        let alpha = {
            let k = g.constant(1.0 / den);
            g.mul(k, off)
        };
        let alpha = g.name(
            alpha,
            &format!("j45_alpha_{six}"),
            "α = (h4·h − c (h5·w)) / (1 − c²), c = h4 · h5",
        );
        let beta = {
            let k = g.constant(1.0 / den);
            let kc = g.constant(c.cos_45 * c.cos_4);
            let x = g.sub(a5, kc);
            g.mul(k, x)
        };
        let beta = g.name(
            beta,
            &format!("j45_beta_{six}"),
            "β = (h5·w − c (h4·h)) / (1 − c²)",
        );
        let (gap, across_5) = {
            let h5k = vec3::constant(g, h5);
            let hw = vec3::cross(g, h5k, w);
            let s2 = vec3::dot(g, hw, hw);
            let oo = g.mul(off, off);
            let k = g.constant(1.0 / den);
            let x = g.mul(k, oo);
            (g.sub(s2, x), s2)
        };
        let gap = g.name(
            gap,
            &format!("j45_gap_{six}"),
            "γ² (1 − c²) = |h5 × w|² − (h4·h − c (h5·w))² / (1 − c²)",
        );
        let gamma = {
            let k = g.constant(1.0 / den);
            let x = g.mul(k, gap);
            g.sqrt0(x)
        };
        let gamma = g.name(gamma, &format!("j45_gamma_{six}"), "γ = √(γ²) ≥ 0");
        // Where the two solutions merge (a double root) rounding in `w` (joint 6's root) can
        // leave `γ² (1 − c²)` up to about 1e-13 below zero; the check allows 1e-11, a miss of
        // the two cones by about 5e-12 rad.
        let check45 = {
            let slack = g.exact(1e-11);
            let have = g.add(gap, slack);
            CheckLayout {
                kind: CheckKind::WristOrientation,
                have_squared: have,
                limit: a5,
            }
        };
        // Axis 5 along axes 1–3 (w ∥ h5): joint 5 joins joints 1–3 and is not fixed.
        let aligned = {
            let floor = g.exact(1e-20);
            g.sub(floor, across_5)
        };
        let free = g.max(roots6.singular, aligned);
        let free = g.name(
            free,
            &format!("free_{six}"),
            "≥ 0 where joint 6 is free (axis 6 along axes 1–3) or joint 5 is (axis 5 along them)",
        );
        for leading in [true, false] {
            let tag = tag(facing, leading);
            let gm = if leading { gamma } else { g.neg(gamma) };
            let z = {
                let x = vec3::scale_const(g, alpha, h4);
                let y = vec3::scale_const(g, beta, h5);
                let s = vec3::scale_const(g, gm, n45);
                let xy = vec3::add(g, x, y);
                vec3::add(g, xy, s)
            };
            let z = vec3::name(
                g,
                z,
                &format!("z_{tag}"),
                "z = α h4 + β h5 ± γ (h4 × h5) = R5 w",
            );
            let turn5 = {
                let along = vec3::scale_const(g, a5, h5);
                let w_perp = vec3::sub(g, w, along);
                let (c5, s5) = rotate_onto(g, h5, w_perp, z);
                unit_pair(g, c5, s5)
            };
            let theta5 = angle(
                g,
                turn5,
                &format!("q5_{tag}"),
                "Paden–Kahan 1: θ5 turns w onto z about h5",
            );
            let turn4 = {
                let k4 = g.constant(c.cos_4);
                let along = vec3::scale_const(g, k4, h4);
                let z_perp = vec3::sub(g, z, along);
                let hk = vec3::constant(g, k.h);
                let (c4, s4) = rotate_onto(g, h4, z_perp, hk);
                unit_pair(g, c4, s4)
            };
            let theta4 = angle(
                g,
                turn4,
                &format!("q4_{tag}"),
                "Paden–Kahan 1: θ4 turns z onto h about h4",
            );
            out.push(Joints4To6 {
                angles: [theta4, theta5, theta6],
                turns: [turn4, turn5, turn6],
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
                checks: [Some(check6), Some(check45)],
                free: Some(free),
            });
        }
    }
    out
}

/// Joints 4–6 of the parallel placement.
fn parallel_hands(
    g: &mut Graph,
    arm: &Arm,
    (k, motion): (&Layout, &Motion),
    t: &Target,
) -> Vec<Joints4To6> {
    let c = Parallel::of(arm);
    let h6 = arm.axis(5);
    let (n, q) = normal_and_point(g, k, motion, arm.point(3));
    // Scaled by the arm's size: the check compares metres.
    let size = arm.scale;
    let a = vec3::dot_const(g, num::scale(&c.g_across, size), n);
    let a = g.name(a, "j6p_a", "a = L n · g⊥ (L the arm's size)");
    let b = vec3::dot_const(g, num::scale(&c.g_turned, size), n);
    let b = g.name(b, "j6p_b", "b = L n · (g × h6)");
    let e = {
        let along = vec3::dot_const(g, h6, n);
        let k = g.constant(-c.g_along * size);
        let x = g.mul(k, along);
        let kg = g.constant(c.cos_g * size);
        g.add(kg, x)
    };
    let e = g.name(e, "j6p_e", "e = L (g · h − (h6 · g)(h6 · n))");
    let roots6 = joint_6(g, arm, [a, b, e], t, PARALLEL);
    let check6 = real_roots(&roots6);
    let gap = height_gap(g, arm, n, q);
    let gap = g.name(gap, "height_gap", "n · (q − p6)");
    let mut out = Vec::with_capacity(4);
    for (facing, turn6) in [true, false].into_iter().zip(roots6.roots) {
        let six = if facing { "f" } else { "a" };
        let theta6 = angle(g, turn6, &format!("q6_{six}"), "θ6 (this root)");
        let w = vec3::rotate(g, h6, turn6.0, turn6.1, n);
        let w = vec3::name(g, w, &format!("w_{six}"), "w = R6 n");
        let along = vec3::dot_const(g, c.g, w);
        // Paden–Kahan 1: ψ = θ4 + s5 θ5 turns w onto h about g.
        let turn_sum = {
            let back = vec3::scale_const(g, along, c.g);
            let w_perp = vec3::sub(g, w, back);
            let hk = vec3::constant(g, k.h);
            let (cp, sp) = rotate_onto(g, c.g, w_perp, hk);
            unit_pair(g, cp, sp)
        };
        let a5 = vec3::dot_const(g, c.d_across, w);
        let a5 = g.name(a5, &format!("j5p_a_{six}"), "a5 = w · d⊥, d = p4 − p5");
        let b5 = vec3::dot_const(g, c.d_turned, w);
        let b5 = g.name(b5, &format!("j5p_b_{six}"), "b5 = w · (d × h5)");
        let e5 = {
            let x = vec3::dot_const(g, c.from_6, w);
            let y = g.sub(gap, x);
            let s = g.constant(c.sense5 * c.d_along);
            let z = g.mul(s, along);
            g.sub(y, z)
        };
        let e5 = g.name(
            e5,
            &format!("j5p_e_{six}"),
            "e5 = n · (q − p6) − w · (p5 − p6) − (h5 · w)(h5 · d)",
        );
        let tol = 1e-10 * arm.scale;
        let one = g.constant(1.0);
        let zero = g.constant(0.0);
        let roots5 = rotate_into_plane(
            g,
            [a5, b5, e5],
            (one, zero),
            tol * tol,
            " m",
            &format!("j5p_{six}"),
        );
        let check5 = real_roots(&roots5);
        for (leading, turn5) in [true, false].into_iter().zip(roots5.roots) {
            let tag = tag(facing, leading);
            let theta5 = angle(g, turn5, &format!("q5_{tag}"), "θ5 (this root)");
            // θ4 = ψ − s5 θ5.
            let (cs, ss) = turn_sum;
            let (c5, s5) = turn5;
            let s5 = if c.sense5 > 0.0 { s5 } else { g.neg(s5) };
            let c4 = g.mul_add2(cs, c5, ss, s5);
            let x = g.mul(ss, c5);
            let y = g.mul(cs, s5);
            let s4 = g.sub(x, y);
            let theta4 = angle(g, (c4, s4), &format!("q4_{tag}"), "θ4 = ψ − s5 θ5");
            out.push(Joints4To6 {
                angles: [theta4, theta5, theta6],
                turns: [(c4, s4), turn5, turn6],
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
                checks: [Some(check6), Some(check5)],
                free: Some(roots6.singular),
            });
        }
    }
    out
}

/// The candidates of a base-parallel arm whose axes 4 and 5 meet or are parallel: two roots
/// of joint 6, two of joints 4–5 each, two bends of joints 1–2 each.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target, placement: Placement) -> Vec<CandidateLayout> {
    let (k, motion, held) = start(g, arm, t);
    let hands = match placement {
        Placement::Parallel => parallel_hands(g, arm, (&k, &motion), t),
        _ => meeting_hands(g, arm, (&k, &motion), t),
    };
    let mut out = Vec::with_capacity(8);
    for hand in &hands {
        let tag = tag(
            hand.shoulder == Shoulder::Facing,
            hand.wrist == Wrist::Leading,
        );
        finish_hand(g, arm, (&k, &motion, held), hand, &tag, &mut out);
    }
    out
}
