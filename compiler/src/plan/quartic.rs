//! Real roots of a quartic, and of a trigonometric polynomial of degree 2, in closed form on
//! the plan graph: no loop, no branch on data, a fixed operation count.
//!
//! # Ferrari's method (Ferrari, published by Cardano in *Ars Magna*, 1545)
//!
//! For `a t⁴ + b t³ + c t² + d t + e = 0` with `a ≠ 0`, divide by `a` and shift
//! `t = y − B/4` (`B = b/a`, `C = c/a`, `D = d/a`, `E = e/a`) to the depressed quartic
//!
//! ```text
//! y⁴ + p y² + q y + r = 0,   p = C − 3B²/8,   q = D − BC/2 + B³/8,
//!                            r = E − BD/4 + B²C/16 − 3B⁴/256.
//! ```
//!
//! It factors into two real quadratics `(y² + α y + β)(y² − α y + γ)` with
//! `β + γ = p + α²`, `α (γ − β) = q`, `β γ = r`; so `U = α²` is a root of the resolvent cubic
//!
//! ```text
//! U³ + 2p U² + (p² − 4r) U − q² = 0,
//! ```
//!
//! which is `−q² ≤ 0` at `U = 0` and so always has a root `U ≥ 0`. The plan takes its
//! largest root (the best conditioned): with `U = V − 2p/3` the cubic is `V³ + P V + Q = 0`,
//! `P = −p²/3 − 4r`, `Q = −2p³/27 + 8pr/3 − q²`, `Δ = Q²/4 + P³/27`, and (Cardano's formula and
//! its trigonometric form, Viète 1615)
//!
//! ```text
//! Δ ≥ 0:  V = A − P/(3A),  A = ∛(−Q/2 − sign(Q) √Δ)           (one real root)
//! Δ < 0:  V = 2 √(−P/3) cos(φ/3),  φ = atan2(√−Δ, −Q/2)          (the largest of three)
//! ```
//!
//! then one Newton step on the cubic. `γ − β` is `q/α` when `α` is large enough, else
//! `sign(q) √((p + U)² − 4r)` (the same value from `β + γ` and `βγ`; the plan picks the form
//! with the smaller rounding error, so a biquadratic, `q = 0`, `α = 0`, is exact). The four
//! roots are `y = (−α ± √(α² − 4β))/2` and `y = (α ± √(α² − 4γ))/2`, with negative
//! discriminants clamped at zero: a complex pair gives its real part twice, and the caller
//! rejects it by a residual check.
//!
//! Each root is then polished by two Newton steps on the quartic itself,
//! `t ← t − P(t)/P′(t)`, each kept only if it lowers `|P(t)|` (a `select`, not a loop): a
//! simple root gains back the digits the depressed form lost, and a step that would jump off
//! a near-double root is refused.
//!
//! # A trigonometric polynomial of degree 2
//!
//! `F(θ) = k0 + k1 cos θ + k2 sin θ + k3 cos 2θ + k4 sin 2θ` becomes a quartic in the half-angle
//! tangent `t = tan(φ/2)`, `θ = φ + γ`: with `k′` the coefficients turned by `γ`
//! (`k1′ = k1 cos γ + k2 sin γ`, `k2′ = k2 cos γ − k1 sin γ`, the same with `2γ` for `k3′, k4′`),
//!
//! ```text
//! (1 + t²)² F = (k0 − k1′ + k3′) t⁴ + (2k2′ − 4k4′) t³ + (2k0 − 6k3′) t²
//!             + (2k2′ + 4k4′) t + (k0 + k1′ + k3′).
//! ```
//!
//! The leading coefficient is `F(γ + π)`; a root there is a root at `t = ∞`, and a small one
//! throws the other roots' digits away when dividing by it. So the plan samples `F` at the six
//! angles `θ = kπ/3` and takes `γ` with `F(γ + π)` largest in magnitude (five `select`
//! rounds). A degree-2 trigonometric polynomial that is not zero everywhere cannot vanish at
//! all six (it has at most four roots), so the leading coefficient is never the smallest part
//! of the polynomial by more than a fixed factor.

use super::graph::{Graph, Id};

/// Smallest magnitude divided by (a guard against dividing by exactly zero).
const TINY: f64 = 1e-300;

/// The four (cos θ, sin θ) candidates of a degree-2 trigonometric polynomial, with the
/// quartic they came from.
#[derive(Clone, Copy, Debug)]
pub struct TrigRoots {
    /// `(cos θ, sin θ)` of each candidate root: the real roots, and the real parts of complex
    /// pairs (which the caller rejects by a residual check).
    pub roots: [(Id, Id); 4],
}

/// `x · x`.
fn square(g: &mut Graph, x: Id) -> Id {
    g.mul(x, x)
}

/// `k · x` for a constant `k`.
fn times(g: &mut Graph, k: f64, x: Id) -> Id {
    let k = g.constant(k);
    g.mul(k, x)
}

/// `x` pushed away from zero to at least `TINY` in magnitude, keeping its sign (zero counts
/// as positive).
pub(crate) fn away_from_zero(g: &mut Graph, x: Id) -> Id {
    let tiny = g.exact(TINY);
    let minus_tiny = g.exact(-TINY);
    let up = g.max(x, tiny);
    let down = g.min(x, minus_tiny);
    g.select(x, up, down)
}

/// `P(t)` and `P′(t)` by Horner's rule, coefficients highest power first.
fn horner(g: &mut Graph, k: &[Id; 5], t: Id) -> (Id, Id) {
    let mut p = k[0];
    let mut dp = g.constant(0.0);
    for &c in &k[1..] {
        let dpt = g.mul(dp, t);
        dp = g.add(dpt, p);
        let pt = g.mul(p, t);
        p = g.add(pt, c);
    }
    (p, dp)
}

/// One guarded Newton step on `P` from `t` (with `P(t)` known): the step is kept only when it
/// does not raise `|P|`. Returns the new `t` and `P` there.
fn newton_step(g: &mut Graph, k: &[Id; 5], t: Id, p_at_t: Id, slope: Id) -> (Id, Id) {
    let slope = away_from_zero(g, slope);
    let step = g.div(p_at_t, slope);
    let moved = g.sub(t, step);
    let (p_moved, _) = horner(g, k, moved);
    let before = g.abs(p_at_t);
    let after = g.abs(p_moved);
    let better = g.sub(before, after);
    (
        g.select(better, moved, t),
        g.select(better, p_moved, p_at_t),
    )
}

/// Polishes a root estimate with two guarded Newton steps on the quartic `k` (highest power
/// first).
pub fn polish(g: &mut Graph, k: &[Id; 5], t: Id) -> Id {
    let (p0, dp0) = horner(g, k, t);
    let (t1, p1) = newton_step(g, k, t, p0, dp0);
    let (_, dp1) = horner(g, k, t1);
    let (t2, _) = newton_step(g, k, t1, p1, dp1);
    t2
}

/// The largest real root `U ≥ 0` of the resolvent cubic `U³ + 2p U² + (p² − 4r) U − q² = 0`
/// (Cardano's formula or its trigonometric form, then one guarded Newton step).
fn resolvent_root(g: &mut Graph, p: Id, q: Id, r: Id, label: &str) -> Id {
    let pp = square(g, p);
    let qq = square(g, q);
    let four_r = times(g, 4.0, r);
    let lin = g.sub(pp, four_r);
    // P = −p²/3 − 4r, Q = −2p³/27 + 8pr/3 − q².
    let pp3 = times(g, 1.0 / 3.0, pp);
    let neg_pp3 = g.neg(pp3);
    let big_p = g.sub(neg_pp3, four_r);
    let big_p = g.name(big_p, &format!("{label}_cubic_p"), "P = −p²/3 − 4r");
    let ppp = g.mul(pp, p);
    let ppp = times(g, -2.0 / 27.0, ppp);
    let pr = g.mul(p, r);
    let pr = times(g, 8.0 / 3.0, pr);
    let sum = g.add(ppp, pr);
    let big_q = g.sub(sum, qq);
    let big_q = g.name(
        big_q,
        &format!("{label}_cubic_q"),
        "Q = −2p³/27 + 8pr/3 − q²",
    );
    let half_q = times(g, 0.5, big_q);
    let hq2 = square(g, half_q);
    let p_third = times(g, 1.0 / 3.0, big_p);
    let p_third3 = {
        let sq = square(g, p_third);
        g.mul(sq, p_third)
    };
    let delta = g.add(hq2, p_third3);
    let delta = g.name(delta, &format!("{label}_cubic_disc"), "Δ = Q²/4 + P³/27");
    // Δ ≥ 0: A = ∛(−Q/2 − sign(Q) √Δ), V = A − P/(3A).
    let root_delta = g.sqrt0(delta);
    let neg_root = g.neg(root_delta);
    let signed = g.select(big_q, root_delta, neg_root);
    let inner = g.add(half_q, signed);
    let inner = g.neg(inner);
    let big_a = g.cbrt(inner);
    let big_a = g.name(
        big_a,
        &format!("{label}_cardano"),
        "A = ∛(−Q/2 − sign(Q) √Δ)",
    );
    let abs_a = g.abs(big_a);
    let tiny = g.exact(TINY);
    let usable = g.sub(abs_a, tiny);
    let one = g.constant(1.0);
    let safe_a = g.select(usable, big_a, one);
    let three_a = times(g, 3.0, safe_a);
    let ratio = g.div(big_p, three_a);
    let zero = g.constant(0.0);
    let ratio = g.select(usable, ratio, zero);
    let one_real = g.sub(big_a, ratio);
    // Δ < 0: V = 2 √(−P/3) cos(φ/3), φ = atan2(√−Δ, −Q/2).
    let neg_p_third = g.neg(p_third);
    let rho = g.sqrt0(neg_p_third);
    let neg_delta = g.neg(delta);
    let root_neg_delta = g.sqrt0(neg_delta);
    let neg_half_q = g.neg(half_q);
    let phi = g.atan2(root_neg_delta, neg_half_q);
    let phi3 = times(g, 1.0 / 3.0, phi);
    let cos_phi3 = g.cos(phi3);
    let two_rho = times(g, 2.0, rho);
    let three_real = g.mul(two_rho, cos_phi3);
    let v = g.select(delta, one_real, three_real);
    let two_p3 = times(g, 2.0 / 3.0, p);
    let u0 = g.sub(v, two_p3);
    let u0 = g.max(u0, zero);
    // One guarded Newton step on h(U) = ((U + 2p) U + (p² − 4r)) U − q².
    let two_p = times(g, 2.0, p);
    let k = [one, two_p, lin, g.neg(qq)];
    let cubic = |g: &mut Graph, u: Id| {
        let mut h = k[0];
        let mut dh = zero;
        for &c in &k[1..] {
            let dhu = g.mul(dh, u);
            dh = g.add(dhu, h);
            let hu = g.mul(h, u);
            h = g.add(hu, c);
        }
        (h, dh)
    };
    let (h0, dh0) = cubic(g, u0);
    let slope = away_from_zero(g, dh0);
    let step = g.div(h0, slope);
    let u1 = g.sub(u0, step);
    let u1 = g.max(u1, zero);
    let (h1, _) = cubic(g, u1);
    let before = g.abs(h0);
    let after = g.abs(h1);
    let better = g.sub(before, after);
    let u = g.select(better, u1, u0);
    g.name(
        u,
        &format!("{label}_resolvent"),
        "U = α²: the largest root of U³ + 2p U² + (p² − 4r) U − q² = 0",
    )
}

/// The four root candidates of `k[0] t⁴ + k[1] t³ + k[2] t² + k[3] t + k[4] = 0` by Ferrari's
/// method, each polished by two guarded Newton steps (see the module doc). A complex pair
/// yields its real part twice. `k[0]` must not be small against the other coefficients.
pub fn quartic_roots(g: &mut Graph, k: &[Id; 5], label: &str) -> [Id; 4] {
    let lead = away_from_zero(g, k[0]);
    let one = g.constant(1.0);
    let inv = g.div(one, lead);
    let [bb, cc, dd, ee] = [k[1], k[2], k[3], k[4]].map(|x| g.mul(x, inv));
    let b2 = square(g, bb);
    // p = C − 3B²/8
    let t = times(g, 3.0 / 8.0, b2);
    let p = g.sub(cc, t);
    let p = g.name(
        p,
        &format!("{label}_p"),
        "p = C − 3B²/8 (depressed quartic)",
    );
    // q = D − BC/2 + B³/8
    let bc = g.mul(bb, cc);
    let bc = times(g, 0.5, bc);
    let b3 = g.mul(b2, bb);
    let b3 = times(g, 1.0 / 8.0, b3);
    let q = g.sub(dd, bc);
    let q = g.add(q, b3);
    let q = g.name(q, &format!("{label}_q"), "q = D − BC/2 + B³/8");
    // r = E − BD/4 + B²C/16 − 3B⁴/256
    let bd = g.mul(bb, dd);
    let bd = times(g, 0.25, bd);
    let b2c = g.mul(b2, cc);
    let b2c = times(g, 1.0 / 16.0, b2c);
    let b4 = square(g, b2);
    let b4 = times(g, 3.0 / 256.0, b4);
    let r = g.sub(ee, bd);
    let r = g.add(r, b2c);
    let r = g.sub(r, b4);
    let r = g.name(r, &format!("{label}_r"), "r = E − BD/4 + B²C/16 − 3B⁴/256");
    let u = resolvent_root(g, p, q, r, label);
    let alpha = g.sqrt(u);
    let alpha = g.name(alpha, &format!("{label}_alpha"), "α = √U");
    // γ − β: q/α, or sign(q) √((p + U)² − 4r), whichever rounds less.
    let p_u = g.add(p, u);
    let s2 = square(g, p_u);
    let four_r = times(g, 4.0, r);
    let gap2 = g.sub(s2, four_r);
    let gap_root = g.sqrt0(gap2);
    let neg_gap = g.neg(gap_root);
    let from_product = g.select(q, gap_root, neg_gap);
    let safe_alpha = away_from_zero(g, alpha);
    let from_alpha = g.div(q, safe_alpha);
    let abs_p = g.abs(p);
    let abs_r = g.abs(r);
    let root_r = g.sqrt(abs_r);
    let scale = g.add(abs_p, root_r);
    let scale = g.add(scale, u);
    let u_scale = g.mul(u, scale);
    let gap2_pos = g.abs(gap2);
    let prefer_alpha = g.sub(u_scale, gap2_pos);
    let gap = g.select(prefer_alpha, from_alpha, from_product);
    let gap = g.name(
        gap,
        &format!("{label}_gap"),
        "γ − β = q/α, or sign(q) √((p + U)² − 4r) when α is small",
    );
    let half = g.constant(0.5);
    let lo = g.sub(p_u, gap);
    let beta = g.mul(half, lo);
    let hi = g.add(p_u, gap);
    let gamma = g.mul(half, hi);
    let shift = times(g, 0.25, bb);
    let mut roots = [0; 4];
    let factors = [(g.neg(alpha), beta, "1"), (alpha, gamma, "2")];
    for (f, (lin, constant, tag)) in factors.into_iter().enumerate() {
        // y² − lin·y + constant = 0 → y = (lin ± √(lin² − 4·constant))/2.
        let four_c = times(g, 4.0, constant);
        let disc = g.sub(u, four_c);
        let root = g.sqrt0(disc);
        let root = g.name(
            root,
            &format!("{label}_root{tag}"),
            "√max(α² − 4β, 0) resp. √max(α² − 4γ, 0): a quadratic factor's roots",
        );
        for (i, sign) in [1.0, -1.0].into_iter().enumerate() {
            let signed = times(g, sign, root);
            let y = g.add(lin, signed);
            let y = g.mul(half, y);
            let t = g.sub(y, shift);
            let t = polish(g, k, t);
            let n = 2 * f + i + 1;
            roots[2 * f + i] = g.name(
                t,
                &format!("{label}_t{n}"),
                "root t = y − B/4 after two guarded Newton steps on the quartic",
            );
        }
    }
    roots
}

/// The candidates of `F(θ) = k0 + k1 cos θ + k2 sin θ + k3 cos 2θ + k4 sin 2θ = 0` (see the
/// module doc): the half-angle quartic about the best of six rotations, solved by Ferrari's
/// method.
pub fn trig_roots(g: &mut Graph, k: [Id; 5], label: &str) -> TrigRoots {
    // F at θ = jπ/3; the rotation γ = θ − π with the largest |F(θ)|.
    let mut best: Option<(Id, [Id; 4])> = None;
    for j in 0..6 {
        let theta = j as f64 * std::f64::consts::PI / 3.0;
        let value = trig_value(g, &k, theta);
        let size = g.abs(value);
        let gamma = theta - std::f64::consts::PI;
        let trig = [
            g.constant(gamma.cos()),
            g.constant(gamma.sin()),
            g.constant((2.0 * gamma).cos()),
            g.constant((2.0 * gamma).sin()),
        ];
        best = Some(match best {
            None => (size, trig),
            Some((best_size, best_trig)) => {
                let wins = g.sub(size, best_size);
                let s = g.max(size, best_size);
                let mut t = [0; 4];
                for i in 0..4 {
                    t[i] = g.select(wins, trig[i], best_trig[i]);
                }
                (s, t)
            }
        });
    }
    let (_, [cg, sg, c2g, s2g]) = best.unwrap_or((0, [0; 4]));
    let [cg, sg, c2g, s2g] = [
        g.name(
            cg,
            &format!("{label}_cos_g"),
            "cos γ: the rotation with the largest |F(γ + π)|",
        ),
        g.name(sg, &format!("{label}_sin_g"), "sin γ"),
        g.name(c2g, &format!("{label}_cos_2g"), "cos 2γ"),
        g.name(s2g, &format!("{label}_sin_2g"), "sin 2γ"),
    ];
    let k1 = g.mul_add2(k[1], cg, k[2], sg);
    let k2a = g.mul(k[2], cg);
    let k2b = g.mul(k[1], sg);
    let k2 = g.sub(k2a, k2b);
    let k3 = g.mul_add2(k[3], c2g, k[4], s2g);
    let k4a = g.mul(k[4], c2g);
    let k4b = g.mul(k[3], s2g);
    let k4 = g.sub(k4a, k4b);
    let k0 = k[0];
    // (k0 − k1′ + k3′) t⁴ + (2k2′ − 4k4′) t³ + (2k0 − 6k3′) t² + (2k2′ + 4k4′) t + (k0 + k1′ + k3′)
    let two_k2 = times(g, 2.0, k2);
    let four_k4 = times(g, 4.0, k4);
    let a4 = {
        let x = g.sub(k0, k1);
        g.add(x, k3)
    };
    let a3 = g.sub(two_k2, four_k4);
    let a2 = {
        let x = times(g, 2.0, k0);
        let y = times(g, 6.0, k3);
        g.sub(x, y)
    };
    let a1 = g.add(two_k2, four_k4);
    let a0 = {
        let x = g.add(k0, k1);
        g.add(x, k3)
    };
    let notes = [
        "t⁴: k0 − k1′ + k3′ = F(γ + π)",
        "t³: 2k2′ − 4k4′",
        "t²: 2k0 − 6k3′",
        "t¹: 2k2′ + 4k4′",
        "t⁰: k0 + k1′ + k3′ = F(γ)",
    ];
    let mut quartic = [a4, a3, a2, a1, a0];
    for (i, (c, note)) in quartic.iter_mut().zip(notes).enumerate() {
        *c = g.name(*c, &format!("{label}_a{}", 4 - i), note);
    }
    let ts = quartic_roots(g, &quartic, label);
    let mut roots = [(0, 0); 4];
    for (i, &t) in ts.iter().enumerate() {
        // cos φ = (1 − t²)/(1 + t²), sin φ = 2t/(1 + t²); θ = φ + γ.
        let tt = square(g, t);
        let one = g.constant(1.0);
        let den = g.add(one, tt);
        let inv = g.div(one, den);
        let num_c = g.sub(one, tt);
        let cphi = g.mul(num_c, inv);
        let two_t = times(g, 2.0, t);
        let sphi = g.mul(two_t, inv);
        let c = {
            let x = g.mul(cphi, cg);
            let y = g.mul(sphi, sg);
            g.sub(x, y)
        };
        let s = g.mul_add2(sphi, cg, cphi, sg);
        let n = i + 1;
        roots[i] = (
            g.name(
                c,
                &format!("{label}_cos{n}"),
                "cos θ = cos φ cos γ − sin φ sin γ",
            ),
            g.name(
                s,
                &format!("{label}_sin{n}"),
                "sin θ = sin φ cos γ + cos φ sin γ",
            ),
        );
    }
    TrigRoots { roots }
}

/// `F(θ)` for a constant angle.
fn trig_value(g: &mut Graph, k: &[Id; 5], theta: f64) -> Id {
    let weights = [
        1.0,
        theta.cos(),
        theta.sin(),
        (2.0 * theta).cos(),
        (2.0 * theta).sin(),
    ];
    let mut sum = g.constant(0.0);
    for (&c, w) in k.iter().zip(weights) {
        let term = times(g, w, c);
        sum = g.add(sum, term);
    }
    sum
}

#[cfg(test)]
mod tests;

/// `k0 + k1 cos θ + k2 sin θ` (graph values; constants fold where the data allow).
pub type Linear = [Id; 3];

/// `l0 + l1 c + l2 s` at the turn `(c, s)`.
pub fn at(g: &mut Graph, [l0, l1, l2]: Linear, (c, s): (Id, Id)) -> Id {
    let x = g.mul(l1, c);
    let y = g.mul(l2, s);
    let xy = g.add(x, y);
    g.add(l0, xy)
}

/// `L²` as a degree-2 trigonometric polynomial `[k0, k1, k2, k3, k4]` (coefficients of
/// `1, cos θ, sin θ, cos 2θ, sin 2θ`): `cos²θ = (1 + cos 2θ)/2`, `sin²θ = (1 − cos 2θ)/2`,
/// `2 sin θ cos θ = sin 2θ`.
pub fn squared(g: &mut Graph, [l0, l1, l2]: Linear) -> [Id; 5] {
    let half = g.constant(0.5);
    let two = g.constant(2.0);
    let l00 = g.mul(l0, l0);
    let l11 = g.mul(l1, l1);
    let l22 = g.mul(l2, l2);
    let sum = g.add(l11, l22);
    let diff = g.sub(l11, l22);
    let k0 = g.mul(half, sum);
    let k0 = g.add(l00, k0);
    let l01 = g.mul(l0, l1);
    let l02 = g.mul(l0, l2);
    let l12 = g.mul(l1, l2);
    [k0, g.mul(two, l01), g.mul(two, l02), g.mul(half, diff), l12]
}

/// `L M` as a degree-2 trigonometric polynomial (see [`squared`]).
pub fn product(g: &mut Graph, [l0, l1, l2]: Linear, [m0, m1, m2]: Linear) -> [Id; 5] {
    let half = g.constant(0.5);
    let cc = g.mul(l1, m1);
    let ss = g.mul(l2, m2);
    let sum = g.add(cc, ss);
    let diff = g.sub(cc, ss);
    let k0 = {
        let z = g.mul(l0, m0);
        let h = g.mul(half, sum);
        g.add(z, h)
    };
    let k1 = g.mul_add2(l0, m1, l1, m0);
    let k2 = g.mul_add2(l0, m2, l2, m0);
    let k3 = g.mul(half, diff);
    let k4 = {
        let cs = g.mul_add2(l1, m2, l2, m1);
        g.mul(half, cs)
    };
    [k0, k1, k2, k3, k4]
}
