//! Closed-form subproblems on the plan graph, carrying cosines and sines algebraically.
//!
//! * Rotate a point into a plane: `a cos θ + b sin θ = e` (0–2 roots).
//! * Paden–Kahan subproblem 1, rotate a point onto a point about one axis (Paden 1986;
//!   Murray, Li & Sastry, A Mathematical Introduction to Robotic Manipulation, 1994, §3.3).

use super::graph::{Graph, Id};
use super::vec3::{self, V3};

/// The two roots of `a cos θ + b sin θ = e`, as (cos, sin) pairs for `σ = +1` and `σ = −1`:
/// `cos θ = (a e − σ b k) / r²`, `sin θ = (b e + σ a k) / r²`, `r² = a² + b²`,
/// `k = √(r² − e²)`. When `r²` is below the singular threshold every θ solves it; the roots
/// are then the reference and the reference plus a half turn.
#[derive(Clone, Copy, Debug)]
pub struct PlaneRoots {
    /// (cos, sin) for `σ = +1` and `σ = −1`.
    pub roots: [(Id, Id); 2],
    /// `a² + b²`.
    pub radius_squared: Id,
    /// `|e|`: the roots are real when `r² ≥ e²`.
    pub limit: Id,
    /// `≥ 0` when the equation does not fix θ (the reference is used).
    pub singular: Id,
}

/// Solves `a cos θ + b sin θ = e` (rotate a point into a plane).
pub fn rotate_into_plane(
    g: &mut Graph,
    abe: [Id; 3],
    reference: (Id, Id),
    threshold_squared: f64,
    unit: &str,
    label: &str,
) -> PlaneRoots {
    rotate_into_plane_given(g, abe, None, reference, threshold_squared, unit, label)
}

/// [`rotate_into_plane`] with `r² − e²` given (`disc`) when the caller has a form of it that
/// keeps its digits where the two roots merge (a product of two differences instead of the
/// difference of two squares near 1).
pub fn rotate_into_plane_given(
    g: &mut Graph,
    [a, b, e]: [Id; 3],
    disc: Option<Id>,
    reference: (Id, Id),
    threshold_squared: f64,
    unit: &str,
    label: &str,
) -> PlaneRoots {
    let aa = g.mul(a, a);
    let bb = g.mul(b, b);
    let r2 = g.add(aa, bb);
    let r2 = g.name(r2, &format!("{label}_r2"), "r² = a² + b²");
    let disc = match disc {
        Some(d) => d,
        None => {
            let ee = g.mul(e, e);
            g.sub(r2, ee)
        }
    };
    let k = g.sqrt0(disc);
    let k = g.name(k, &format!("{label}_k"), "k = √max(r² − e², 0)");
    let floor = g.exact(threshold_squared);
    let safe = g.max(r2, floor);
    let one = g.constant(1.0);
    let inv = g.div(one, safe);
    let inv = g.name(inv, &format!("{label}_inv_r2"), "1 / max(r², threshold²)");
    let singular = g.sub(floor, r2);
    let singular = g.name(
        singular,
        &format!("{label}_free"),
        format!(
            "≥ 0 when r < {:.2e}{unit}: θ is free, the reference is used",
            threshold_squared.sqrt()
        ),
    );
    let ae = g.mul(a, e);
    let be = g.mul(b, e);
    let bk = g.mul(b, k);
    let ak = g.mul(a, k);
    let mut roots = [(0, 0); 2];
    for (i, sigma) in [1.0, -1.0].into_iter().enumerate() {
        let (c, s) = if sigma > 0.0 {
            (g.sub(ae, bk), g.add(be, ak))
        } else {
            (g.add(ae, bk), g.sub(be, ak))
        };
        let c = g.mul(c, inv);
        let s = g.mul(s, inv);
        let (rc, rs) = if sigma > 0.0 {
            reference
        } else {
            (g.neg(reference.0), g.neg(reference.1))
        };
        let c = g.select(singular, rc, c);
        let s = g.select(singular, rs, s);
        let tag = if sigma > 0.0 { "a" } else { "b" };
        let sign = if sigma > 0.0 { "−" } else { "+" };
        let c = g.name(
            c,
            &format!("{label}_cos_{tag}"),
            format!("cos θ = (a e {sign} b k) / r²  (σ = {sigma:+})"),
        );
        let sign = if sigma > 0.0 { "+" } else { "−" };
        let s = g.name(
            s,
            &format!("{label}_sin_{tag}"),
            format!("sin θ = (b e {sign} a k) / r²  (σ = {sigma:+})"),
        );
        roots[i] = (c, s);
    }
    let limit = g.abs(e);
    PlaneRoots {
        roots,
        radius_squared: r2,
        limit,
        singular,
    }
}

/// Paden–Kahan subproblem 1: the angle about unit `h` that turns `x` (given by its part
/// perpendicular to `h`) onto the direction of `y`: `cos θ ∝ x⊥ · y`, `sin θ ∝ h · (x⊥ × y)`.
/// Returns the unnormalised (cos, sin) numerators; divide by `|x⊥|²` for the unit pair.
pub fn rotate_onto(g: &mut Graph, h: [f64; 3], x_perp: V3, y: V3) -> (Id, Id) {
    let c = vec3::dot(g, x_perp, y);
    let cr = vec3::cross(g, x_perp, y);
    let s = vec3::dot_const(g, h, cr);
    (c, s)
}
