//! Joints 4–6 of a spherical wrist with any twist angles (axis 4 ∦ axis 5, axis 5 ∦ axis 6).
//!
//! 1. Joints 4 and 5, Paden–Kahan subproblem 2 (Paden 1986; Murray, Li & Sastry 1994, §3.3):
//!    `R4 R5 h6 = R456 h6 =: v`. The intermediate `z = R5 h6 = R4ᵀ v` satisfies `h4·z = h4·v`
//!    and `h5·z = h5·h6`, so `z = α h4 + β h5 ± γ (h4 × h5)` (0–2 solutions); θ5 turns `h6`
//!    onto `z` about `h5`, θ4 turns `z` onto `v` about `h4` (both subproblem 1).
//! 2. Joint 6, subproblem 1: turn a direction `x6 ⟂ h6` onto `R5ᵀ R4ᵀ R456 x6` about `h6`.
//!
//! Joint 5 at the aligned position (`z ∥ h4`) leaves θ4 free: θ4 is the reference (plus a
//! half turn for the second wrist branch), θ6 follows, and the candidates are flagged.
//! A wrist with `h4 ⟂ h5 ⟂ h6` needs only one branch computed: the other is
//! `(θ4 + π, 2 θa − θ5, θ6 + π)` with θa the aligned position of joint 5.

use armforge_runtime::internal::{CheckKind, WristRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::Wrist;

use super::arm::Arm;
use super::graph::{Graph, Id};
use super::vec3::{self, num, V3};
use crate::units::tidy;

/// One wrist solution, in model values.
#[derive(Clone, Debug)]
pub struct WristSolution {
    /// θ4, θ5, θ6.
    pub angles: [Id; 3],
    /// Leading or trailing.
    pub wrist: Wrist,
    /// `≥ 0` when joint 5 is at the aligned position.
    pub aligned: Id,
    /// The wrist cone check, for wrists whose twists differ.
    pub check: Option<CheckLayout>,
}

/// Sines of the wrist's joint-5 alignment below this count as aligned (joint 4 free).
pub const ALIGNED_SINE: f64 = 1e-10;

/// The wrist's constant directions.
#[derive(Clone, Copy, Debug)]
pub struct WristAxes {
    /// Axis 4 at zero.
    pub h4: [f64; 3],
    /// Axis 5 at zero.
    pub h5: [f64; 3],
    /// Axis 6 at zero.
    pub h6: [f64; 3],
    /// A unit direction ⟂ h6, used for joint 6.
    pub x6: [f64; 3],
}

impl WristAxes {
    /// The wrist axes of an arm.
    pub fn of(arm: &Arm) -> WristAxes {
        let h6 = arm.axis(5);
        WristAxes {
            h4: arm.axis(3),
            h5: arm.axis(4),
            h6,
            x6: num::any_perpendicular(&h6),
        }
    }

    /// True when `h4 ⟂ h5` and `h6 ⟂ h5`: the two branches are mirror images.
    pub fn is_orthogonal(&self) -> bool {
        num::dot(&self.h4, &self.h5).abs() < 1e-12 && num::dot(&self.h6, &self.h5).abs() < 1e-12
    }
}

/// The wrist label rule.
pub fn rule(arm: &Arm) -> WristRule {
    let w = WristAxes::of(arm);
    WristRule {
        normal: num::cross(&w.h4, &w.h5),
        axis5: w.h5,
        axis6: w.h6,
    }
}

/// The shared start of both wrist branches: `a = h4 · v`, the coefficients `α`, `β` of the
/// intermediate `z`, the gap `γ²` and `γ`.
struct Cone {
    a: Id,
    alpha: Id,
    beta: Id,
    gap: Id,
    gamma: Id,
}

/// `a = h4 · v`, `α = (a − c45 b) / (1 − c45²)`, `β = (b − c45 a) / (1 − c45²)` with
/// `c45 = h4 · h5`, `b = h5 · h6`, then the gap and `γ`.
fn cone(g: &mut Graph, w: &WristAxes, v: V3, tag: &str) -> Cone {
    let c45 = num::dot(&w.h4, &w.h5);
    let b = num::dot(&w.h5, &w.h6);
    let den = 1.0 - c45 * c45;
    let a = vec3::dot_const(g, w.h4, v);
    let a = g.name(a, &format!("j5_a_{tag}"), "a = h4 · v = h4 · z");
    let alpha = {
        let k = g.constant(1.0 / den);
        let off = g.constant(c45 * b);
        let x = g.sub(a, off);
        g.mul(k, x)
    };
    let alpha = g.name(
        alpha,
        &format!("j5_alpha_{tag}"),
        format!(
            "α = (a − (h4·h5)(h5·h6)) / (1 − (h4·h5)²), h4·h5 = {}, h5·h6 = {}",
            tidy(c45),
            tidy(b)
        ),
    );
    let beta = {
        let kb = g.constant(b / den);
        let ka = g.constant(-c45 / den);
        let x = g.mul(ka, a);
        g.add(kb, x)
    };
    let beta = g.name(
        beta,
        &format!("j5_beta_{tag}"),
        "β = ((h5·h6) − (h4·h5) a) / (1 − (h4·h5)²)",
    );
    let gap = gap(g, w, v, a, tag);
    let gamma = {
        let k = g.constant(1.0 / den);
        let x = g.mul(k, gap);
        g.sqrt0(x)
    };
    let gamma = g.name(gamma, &format!("j5_gamma_{tag}"), "γ = √(γ²) ≥ 0");
    Cone {
        a,
        alpha,
        beta,
        gap,
        gamma,
    }
}

/// `γ² (1 − c45²) = 1 − α² − β² − 2 α β c45 = |h4 × v|² − (b − c45 a)² / (1 − c45²)`: the
/// second form has no cancellation when `v` is nearly parallel to `h4`.
fn gap(g: &mut Graph, w: &WristAxes, v: V3, a: Id, tag: &str) -> Id {
    let c45 = num::dot(&w.h4, &w.h5);
    let b = num::dot(&w.h5, &w.h6);
    let den = 1.0 - c45 * c45;
    let gap = {
        let h4k = vec3::constant(g, w.h4);
        let hv = vec3::cross(g, h4k, v);
        let s2 = vec3::dot(g, hv, hv);
        let kb = g.constant(b);
        let kc = g.constant(c45);
        let ca = g.mul(kc, a);
        let t = g.sub(kb, ca);
        let tt = g.mul(t, t);
        let k = g.constant(1.0 / den);
        let x = g.mul(k, tt);
        g.sub(s2, x)
    };
    g.name(
        gap,
        &format!("j5_gap_{tag}"),
        "γ² (1 − (h4·h5)²) = |h4 × v|² − ((h5·h6) − (h4·h5) a)² / (1 − (h4·h5)²)",
    )
}

/// `α h4 + β h5 ± γ n` with `first` in place of `α` (`z` itself, or `z⊥` with `α − a`).
fn along_cone(g: &mut Graph, w: &WristAxes, first: Id, beta: Id, gm: Id) -> V3 {
    let n = num::cross(&w.h4, &w.h5);
    let x = vec3::scale_const(g, first, w.h4);
    let y = vec3::scale_const(g, beta, w.h5);
    let q = vec3::scale_const(g, gm, n);
    let xy = vec3::add(g, x, y);
    vec3::add(g, xy, q)
}

/// θ5: turn `h6` onto `z` about `h5` (the parts ⟂ h5 have the constant length √(1 − b²)).
/// Returns `(cos θ5, sin θ5, θ5)`.
fn joint5(g: &mut Graph, w: &WristAxes, z: V3, name: &str) -> (Id, Id, Id) {
    let b = num::dot(&w.h5, &w.h6);
    let h6p = num::sub(&w.h6, &num::scale(&w.h5, b));
    let inv6 = 1.0 / (1.0 - b * b);
    let c5 = vec3::dot_const(g, h6p, z);
    let h6k = vec3::constant(g, w.h6);
    let cr = vec3::cross(g, h6k, z);
    let s5 = vec3::dot_const(g, w.h5, cr);
    let k6 = g.constant(inv6);
    let c5 = g.mul(k6, c5);
    let c5 = g.name(c5, &format!("j5_cos_{name}"), "cos θ5 = (h6⊥ · z) / |h6⊥|²");
    let s5 = g.mul(k6, s5);
    let s5 = g.name(
        s5,
        &format!("j5_sin_{name}"),
        "sin θ5 = h5 · (h6 × z) / |h6⊥|²",
    );
    let theta5 = g.atan2(s5, c5);
    let theta5 = g.name(theta5, &format!("q5_{name}"), "θ5 = atan2(sin θ5, cos θ5)");
    (c5, s5, theta5)
}

/// θ4: turn `z` onto `v` about `h4`, normalised by the actual length (robust near
/// alignment); at the aligned position the reference (negated for the second branch).
/// Returns `(cos θ4, sin θ4, θ4, aligned)`.
#[allow(clippy::too_many_arguments)]
fn joint4(
    g: &mut Graph,
    w: &WristAxes,
    cone: &Cone,
    gm: Id,
    v: V3,
    reference: (Id, Id),
    first_branch: bool,
    (tag, name): (&str, &str),
) -> (Id, Id, Id, Id) {
    // z⊥ = z − a h4 = (α − a) h4 + β h5 ± γ n.
    let d = g.sub(cone.alpha, cone.a);
    let z_perp = along_cone(g, w, d, cone.beta, gm);
    let nc = vec3::dot(g, z_perp, v);
    let zxv = vec3::cross(g, z_perp, v);
    let ns = vec3::dot_const(g, w.h4, zxv);
    // |z⊥| |v⊥| normalises (nc, ns). For a right-angled wrist z⊥ = γ n and |v⊥| = γ, so
    // the product is γ² = |h4 × v|², known without a root; otherwise take the root of
    // nc² + ns² (robust when joint 5 is near the aligned position).
    let (q, floor, inv) = if w.is_orthogonal() {
        let floor = g.exact(ALIGNED_SINE * ALIGNED_SINE);
        let safe = g.max(cone.gap, floor);
        let one = g.constant(1.0);
        (cone.gap, floor, g.div(one, safe))
    } else {
        let q = g.mul_add2(nc, nc, ns, ns);
        let floor = g.exact_fourth(ALIGNED_SINE.powi(4));
        let safe = g.max(q, floor);
        let root = g.sqrt(safe);
        let one = g.constant(1.0);
        (q, floor, g.div(one, root))
    };
    let aligned = g.sub(floor, q);
    let aligned = g.name(
        aligned,
        &format!("aligned_{tag}"),
        format!("≥ 0 when joint 5 is within {ALIGNED_SINE:e} of the aligned position"),
    );
    let c4 = g.mul(nc, inv);
    let s4 = g.mul(ns, inv);
    let (rc, rs) = if first_branch {
        reference
    } else {
        (g.neg(reference.0), g.neg(reference.1))
    };
    let c4 = g.select(aligned, rc, c4);
    let s4 = g.select(aligned, rs, s4);
    let c4 = g.name(
        c4,
        &format!("j4_cos_{name}"),
        "cos θ4 = z⊥ · v / |z⊥|² (reference when aligned)",
    );
    let s4 = g.name(
        s4,
        &format!("j4_sin_{name}"),
        "sin θ4 = h4 · (z × v) / |z⊥|² (reference when aligned)",
    );
    let theta4 = g.atan2(s4, c4);
    let theta4 = g.name(theta4, &format!("q4_{name}"), "θ4 = atan2(sin θ4, cos θ4)");
    (c4, s4, theta4, aligned)
}

/// θ6: turn `x6` onto `R5ᵀ R4ᵀ (R456 x6)` about `h6` (Paden–Kahan subproblem 1).
fn joint6(g: &mut Graph, w: &WristAxes, four: (Id, Id), five: (Id, Id), xv: V3, name: &str) -> Id {
    let y = vec3::rotate_back(g, w.h4, four.0, four.1, xv);
    let y = vec3::rotate_back(g, w.h5, five.0, five.1, y);
    let y = vec3::name(g, y, &format!("y6_{name}"), "R5ᵀ R4ᵀ R456 x6");
    let c6 = vec3::dot_const(g, w.x6, y);
    let x6k = vec3::constant(g, w.x6);
    let cr = vec3::cross(g, x6k, y);
    let s6 = vec3::dot_const(g, w.h6, cr);
    let theta6 = g.atan2(s6, c6);
    g.name(
        theta6,
        &format!("q6_{name}"),
        "Paden–Kahan 1: θ6 = atan2(h6 · (x6 × y), x6 · y)",
    )
}

/// The mirror branch of a right-angled wrist, without a call: `(θ4 + π, 2 θa − θ5, θ6 + π)`
/// with θa the aligned position of joint 5.
fn mirror(g: &mut Graph, w: &WristAxes, first: &WristSolution, tag: &str) -> WristSolution {
    let [theta4, theta5, theta6] = first.angles;
    let theta_a = {
        let c = num::cross(&w.h6, &w.h4);
        num::dot(&w.h5, &c).atan2(num::dot(&w.h6, &w.h4))
    };
    let pi = g.constant(std::f64::consts::PI);
    let t4 = g.add(theta4, pi);
    let t4 = g.name(t4, &format!("q4_{tag}b"), "θ4 + π (mirror wrist branch)");
    let k = g.constant(2.0 * theta_a);
    let t5 = g.sub(k, theta5);
    let t5 = g.name(
        t5,
        &format!("q5_{tag}b"),
        format!("2 θa − θ5, θa = {} rad (aligned position)", tidy(theta_a)),
    );
    let t6 = g.add(theta6, pi);
    let t6 = g.name(t6, &format!("q6_{tag}b"), "θ6 + π (mirror wrist branch)");
    WristSolution {
        angles: [t4, t5, t6],
        wrist: Wrist::Trailing,
        aligned: first.aligned,
        check: None,
    }
}

/// Builds joints 4–6 for one arm branch, given `v = R456 h6` and `xv = R456 x6`: the cone
/// of `z`, then per wrist branch θ5, θ4, θ6 (a right-angled wrist solves one branch and
/// mirrors it).
pub fn solve(
    g: &mut Graph,
    arm: &Arm,
    v: V3,
    xv: V3,
    reference: (Id, Id),
    tag: &str,
) -> Vec<WristSolution> {
    let w = WristAxes::of(arm);
    let cone = cone(g, &w, v, tag);
    let check = (!w.is_orthogonal()).then_some(CheckLayout {
        kind: CheckKind::WristOrientation,
        have_squared: cone.gap,
        limit: cone.a,
    });
    let branches: &[f64] = if w.is_orthogonal() {
        &[1.0]
    } else {
        &[1.0, -1.0]
    };
    let mut out = Vec::new();
    for &sign in branches {
        let first_branch = sign > 0.0;
        let name = format!("{tag}{}", if first_branch { "a" } else { "b" });
        let gm = if first_branch {
            cone.gamma
        } else {
            g.neg(cone.gamma)
        };
        let z = along_cone(g, &w, cone.alpha, cone.beta, gm);
        let z = vec3::name(
            g,
            z,
            &format!("z_{name}"),
            "z = R5 h6 = α h4 + β h5 ± γ (h4 × h5)",
        );
        let (c5, s5, theta5) = joint5(g, &w, z, &name);
        let (c4, s4, theta4, aligned) =
            joint4(g, &w, &cone, gm, v, reference, first_branch, (tag, &name));
        let theta6 = joint6(g, &w, (c4, s4), (c5, s5), xv, &name);
        let solution = WristSolution {
            angles: [theta4, theta5, theta6],
            wrist: if first_branch {
                Wrist::Leading
            } else {
                Wrist::Trailing
            },
            aligned,
            check,
        };
        if w.is_orthogonal() {
            let second = mirror(g, &w, &solution, tag);
            out.push(solution);
            out.push(second);
        } else {
            out.push(solution);
        }
    }
    out
}
