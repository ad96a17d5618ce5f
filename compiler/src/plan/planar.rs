//! Two parallel revolute axes placing a point: the planar two-link step shared by every family
//! with a pair of parallel axes (joints 2–3 of an elbow arm, two of three parallel axes).
//!
//! With the point `w` given relative to the first axis (direction `h`), its squared distance
//! `d²` from that axis fixes the second joint by the law of cosines,
//! `d² = |L|² + |V|² + 2 |L| |V| cos ψ` (`L` from the first axis to the second, `V` from the
//! second axis to the point, both ⟂ `h`; ψ measured from the stretched configuration, two
//! roots ±ψ), and then the first joint turns `L + R(φ) V` onto `w` (Paden–Kahan subproblem 1).

use armforge_runtime::internal::CheckKind;
use armforge_runtime::plan::CheckLayout;

use super::graph::{Graph, Id};
use super::subproblems::rotate_onto;
use super::vec3::{self, num, V3};
use crate::units::tidy;

/// The constants of a pair of parallel axes and the point they place.
#[derive(Clone, Copy, Debug)]
pub struct TwoLink {
    /// Unit direction of the first axis.
    pub h: [f64; 3],
    /// From the first axis to the second, ⟂ `h`.
    pub l: [f64; 3],
    /// From the second axis to the point, ⟂ `h`.
    pub v: [f64; 3],
    /// `±1`: the second axis is `sense · h`.
    pub sense: f64,
    /// Angle of the stretched configuration about `h`: `atan2(L · (h × V), L · V)`.
    pub stretched: f64,
}

impl TwoLink {
    /// The pair of parallel axes `(h, p)`, `(h_b, p_b)` placing the point `c` (all at zero).
    pub fn new(h: [f64; 3], p: [f64; 3], h_b: [f64; 3], p_b: [f64; 3], c: [f64; 3]) -> TwoLink {
        let l = num::perpendicular(&num::sub(&p_b, &p), &h);
        let v = num::perpendicular(&num::sub(&c, &p_b), &h);
        let hv = num::cross(&h, &v);
        TwoLink {
            h,
            l,
            v,
            sense: super::sign(num::dot(&h_b, &h)),
            stretched: num::dot(&l, &hv).atan2(num::dot(&l, &v)),
        }
    }

    /// `|L|` and `|V|`.
    pub fn lengths(&self) -> (f64, f64) {
        (num::norm(&self.l), num::norm(&self.v))
    }
}

/// One bend of the two-link step.
#[derive(Clone, Copy, Debug)]
pub struct Bend {
    /// `+1` or `−1`: the sign of `sin(φ − φ0)`.
    pub bend: f64,
    /// Model value of the first joint.
    pub first: Id,
    /// Model value of the second joint.
    pub second: Id,
    /// `cos(θ_a + φ)`, `sin(θ_a + φ)`: the turn of both joints about `h`.
    pub sum: (Id, Id),
}

/// Both bends of the two-link step, and the reach checks on `d²`.
#[derive(Clone, Debug)]
pub struct TwoLinkRoots {
    /// Stretched side first (`+ψ`), then `−ψ`.
    pub bends: [Bend; 2],
    /// The point within the outer reach, and outside the inner hole.
    pub checks: [CheckLayout; 2],
}

/// What both bends share: `cos ψ`, `sin ψ ≥ 0`, `ψ` and `1 / |x⊥|²`.
#[derive(Clone, Copy)]
struct Shared {
    cos_psi: Id,
    sin_psi: Id,
    psi: Id,
    inv_n: Id,
}

/// Solves the two-link step for the point `w` (relative to the first axis) with squared
/// distance `d2` from that axis. `tol` is the length below which a distance counts as zero.
pub fn solve(g: &mut Graph, k: &TwoLink, w: V3, d2: Id, tol: f64, tag: &str) -> TwoLinkRoots {
    let (len_l, len_v) = k.lengths();
    let shared = law_of_cosines(g, k, d2, tol, tag);
    let bends = [1.0, -1.0].map(|bend| one_bend(g, k, w, &shared, bend, tag));
    let reach_out = g.constant(len_l + len_v);
    let reach_in = g.constant((len_l - len_v).abs());
    TwoLinkRoots {
        bends,
        checks: [
            CheckLayout {
                kind: CheckKind::BeyondReach,
                have_squared: d2,
                limit: reach_out,
            },
            CheckLayout {
                kind: CheckKind::InsideHole,
                have_squared: d2,
                limit: reach_in,
            },
        ],
    }
}

/// `cos ψ` by the law of cosines, `sin ψ`, one `ψ = atan2(sin ψ, cos ψ)` for both bends, and
/// `1 / |L + R(φ) V|²`.
fn law_of_cosines(g: &mut Graph, k: &TwoLink, d2: Id, tol: f64, tag: &str) -> Shared {
    let (len_l, len_v) = k.lengths();
    let (ll, vv) = (len_l * len_l, len_v * len_v);
    let two_lv = (2.0 * len_l * len_v).max(1e-300);
    let offset = g.constant(ll + vv);
    let num_c = g.sub(d2, offset);
    let inv = g.constant(1.0 / two_lv);
    let cos_psi = g.mul(num_c, inv);
    let cos_psi = g.clamp(cos_psi, -1.0, 1.0);
    let cos_psi = g.name(
        cos_psi,
        &format!("j3_cos_psi_{tag}"),
        format!(
            "law of cosines: cos ψ = (d² − |L|² − |V|²) / (2 |L| |V|), |L| = {} m, |V| = {} m",
            tidy(len_l),
            tidy(len_v)
        ),
    );
    let one = g.constant(1.0);
    let om = g.sub(one, cos_psi);
    let op = g.add(one, cos_psi);
    let prod = g.mul(om, op);
    let sin_psi = g.sqrt0(prod);
    let sin_psi = g.name(
        sin_psi,
        &format!("j3_sin_psi_{tag}"),
        "sin ψ = √((1 − cos ψ)(1 + cos ψ)) ≥ 0",
    );
    // |x⊥|² = |L + R(φ) V|² = |L|² + |V|² + 2|L||V| cos ψ, shared by both roots.
    let two = g.constant(two_lv);
    let n = g.mul(two, cos_psi);
    let n = g.add(offset, n);
    let floor = g.exact(tol * tol);
    let n = g.max(n, floor);
    let inv_n = g.div(one, n);
    let inv_n = g.name(
        inv_n,
        &format!("j2_inv_{tag}"),
        "1 / |L + R3 V|², the squared distance of the point from the first axis",
    );
    // One atan2 for both bends: φ3 = φ0 ± ψ, with ψ ∈ [0, π] (the finishing wraps φ3).
    let psi = g.atan2(sin_psi, cos_psi);
    let psi = g.name(
        psi,
        &format!("j3_psi_{tag}"),
        "ψ = atan2(sin ψ, cos ψ), shared by both bends",
    );
    Shared {
        cos_psi,
        sin_psi,
        psi,
        inv_n,
    }
}

/// One bend (`+1`: φ3 = φ0 + ψ, `−1`: φ3 = φ0 − ψ): joint 3 from `ψ`, joint 2 by turning
/// `x⊥ = L + R(h, φ3) V` onto `w` (Paden–Kahan subproblem 1), and the turn of both.
fn one_bend(g: &mut Graph, k: &TwoLink, w: V3, shared: &Shared, bend: f64, tag: &str) -> Bend {
    let Shared {
        cos_psi,
        sin_psi,
        psi,
        inv_n,
    } = *shared;
    let stretched = g.constant(k.stretched);
    let hv = num::cross(&k.h, &k.v);
    let cf = g.constant(k.stretched.cos());
    let sf = g.constant(k.stretched.sin());
    let btag = if bend > 0.0 { "a" } else { "b" };
    let tag2 = format!("{tag}{btag}");
    let sp = if bend > 0.0 { sin_psi } else { g.neg(sin_psi) };
    let cos_phi = {
        let x = g.mul(cf, cos_psi);
        let y = g.mul(sf, sp);
        g.sub(x, y)
    };
    let cos_phi = g.name(
        cos_phi,
        &format!("j3_cos_{tag2}"),
        format!(
            "cos φ3 = cos(φ0 ± ψ), φ0 = {} rad (stretched)",
            tidy(k.stretched)
        ),
    );
    let sin_phi = {
        let x = g.mul(sf, cos_psi);
        let y = g.mul(cf, sp);
        g.add(x, y)
    };
    let sin_phi = g.name(sin_phi, &format!("j3_sin_{tag2}"), "sin φ3 = sin(φ0 ± ψ)");
    let (phi, equation) = if bend > 0.0 {
        (g.add(stretched, psi), "φ0 + ψ")
    } else {
        (g.sub(stretched, psi), "φ0 − ψ")
    };
    let (second, equation) = if k.sense > 0.0 {
        (phi, format!("θ3 = φ3 = {equation}"))
    } else {
        (
            g.neg(phi),
            format!("θ3 = −φ3 = −({equation}) (axis 3 opposite to axis 2)"),
        )
    };
    let second = g.name(second, &format!("q3_{tag2}"), equation);
    // x⊥ = L + R(h, φ3) V.
    let x = {
        let a = vec3::scale_const(g, cos_phi, k.v);
        let b = vec3::scale_const(g, sin_phi, hv);
        let ab = vec3::add(g, a, b);
        vec3::add_const(g, ab, k.l)
    };
    let (nc, ns) = rotate_onto(g, k.h, x, w);
    let first = g.atan2(ns, nc);
    let first = g.name(
        first,
        &format!("q2_{tag2}"),
        "Paden–Kahan 1: θ2 = atan2(h2 · (x⊥ × w), x⊥ · w), x⊥ = L + R3 V",
    );
    let c2 = g.mul(nc, inv_n);
    let s2 = g.mul(ns, inv_n);
    let c23 = {
        let x = g.mul(c2, cos_phi);
        let y = g.mul(s2, sin_phi);
        g.sub(x, y)
    };
    let c23 = g.name(c23, &format!("c23_{tag2}"), "cos(θ2 + φ3)");
    let s23 = {
        let x = g.mul(s2, cos_phi);
        let y = g.mul(c2, sin_phi);
        g.add(x, y)
    };
    let s23 = g.name(s23, &format!("s23_{tag2}"), "sin(θ2 + φ3)");
    Bend {
        bend,
        first,
        second,
        sum: (c23, s23),
    }
}

/// `d² = |w⊥h|²`: the squared distance of `w` (relative to a point of the axis) from the axis
/// (the perpendicular part first: no cancellation, and a unit axis folds its component away).
pub fn distance_squared(g: &mut Graph, h: [f64; 3], w: V3) -> Id {
    let hw = vec3::dot_const(g, h, w);
    let along = vec3::scale_const(g, hw, h);
    let w_perp = vec3::sub(g, w, along);
    vec3::dot(g, w_perp, w_perp)
}

/// The angle about `h` that turns the direction `x` (⟂ `h`) onto the direction `y`:
/// `atan2(h · (x × y), x · y)`. A planar chain's sum of joint angles is read this way from the
/// orientation it must produce (`y` is `x` carried by that orientation).
pub fn angle_about(g: &mut Graph, h: [f64; 3], x: [f64; 3], y: V3) -> Id {
    let cos = vec3::dot_const(g, x, y);
    let xk = vec3::constant(g, x);
    let xy = vec3::cross(g, xk, y);
    let sin = vec3::dot_const(g, h, xy);
    g.atan2(sin, cos)
}
