//! The quartic and trigonometric roots against nalgebra's eigenvalues of the companion matrix
//! (a reference library: the roots of a monic polynomial are the eigenvalues of its companion
//! matrix, e.g. Golub & Van Loan, Matrix Computations, 4th ed., §7.4.6, from memory).

use nalgebra::Matrix4;

use super::*;
use crate::plan::samples::{sample_count, SampleRng};
use armforge_runtime::plan::{evaluate, Op};

/// Evaluates `build` on a graph whose inputs are `inputs`, returning the values of its outputs.
fn run<const N: usize>(inputs: &[f64], build: impl Fn(&mut Graph, &[Id]) -> [Id; N]) -> [f64; N] {
    let mut g = Graph::new();
    let ids: Vec<Id> = (0..inputs.len()).map(|i| g.input(i)).collect();
    let outs = build(&mut g, &ids);
    let (compact, map) = g.compact(&outs);
    let ops: Vec<Op> = compact.nodes().iter().map(|n| n.op).collect();
    let mut values = vec![0.0; ops.len()];
    assert!(evaluate(&ops, inputs, &mut values));
    outs.map(|o| values[map[o as usize].unwrap() as usize])
}

fn ferrari(k: [f64; 5]) -> [f64; 4] {
    run(&k, |g, ids| {
        quartic_roots(g, &[ids[0], ids[1], ids[2], ids[3], ids[4]], "q")
    })
}

/// The real roots of `k[0] t⁴ + … + k[4]` by nalgebra: eigenvalues of the companion matrix
/// whose imaginary part is below `imag` (relative to the root's size).
fn reference_roots(k: [f64; 5], imag: f64) -> Vec<f64> {
    let [a, b, c, d, e] = k;
    let m = Matrix4::new(
        -b / a,
        -c / a,
        -d / a,
        -e / a,
        1.0,
        0.0,
        0.0,
        0.0,
        0.0,
        1.0,
        0.0,
        0.0,
        0.0,
        0.0,
        1.0,
        0.0,
    );
    m.complex_eigenvalues()
        .iter()
        .filter(|z| z.im.abs() <= imag * (1.0 + z.re.abs()))
        .map(|z| z.re)
        .collect()
}

/// Coefficients of `lead · Π (t − r)` over the real roots `r` times `(t² + s t + p)` factors.
fn expand(lead: f64, real: &[f64], quadratics: &[(f64, f64)]) -> [f64; 5] {
    let mut poly = vec![lead];
    let mul = |poly: &[f64], factor: &[f64]| {
        let mut out = vec![0.0; poly.len() + factor.len() - 1];
        for (i, x) in poly.iter().enumerate() {
            for (j, y) in factor.iter().enumerate() {
                out[i + j] += x * y;
            }
        }
        out
    };
    for &r in real {
        poly = mul(&poly, &[1.0, -r]);
    }
    for &(s, p) in quadratics {
        poly = mul(&poly, &[1.0, s, p]);
    }
    [poly[0], poly[1], poly[2], poly[3], poly[4]]
}

/// The worst distance from a reference root to the nearest computed root, relative to
/// `1 + |root|`.
fn worst_miss(computed: &[f64; 4], reference: &[f64]) -> f64 {
    reference
        .iter()
        .map(|r| {
            computed
                .iter()
                .map(|t| (t - r).abs() / (1.0 + r.abs()))
                .fold(f64::INFINITY, f64::min)
        })
        .fold(0.0, f64::max)
}

/// The first-order condition of a root: how far a relative coefficient error of 1 moves it,
/// `Σ |k_i| |r|^i / |P′(r)|` (Wilkinson, Rounding Errors in Algebraic Processes, 1963, from
/// memory).
fn condition(k: &[f64; 5], r: f64) -> f64 {
    let size: f64 = k
        .iter()
        .rev()
        .enumerate()
        .map(|(i, c)| c.abs() * r.abs().powi(i as i32))
        .sum();
    let slope = ((4.0 * k[0] * r + 3.0 * k[1]) * r + 2.0 * k[2]) * r + k[3];
    size / slope.abs().max(1e-300)
}

/// Against polynomials built from known roots: Ferrari's miss is within a small factor of
/// nalgebra's (both measured against the known roots), or within what the roots' condition
/// allows.
fn compare_with_known_roots(k: [f64; 5], truth: &[f64], worst: &mut (f64, f64)) {
    let mine = worst_miss(&ferrari(k), truth);
    let na = reference_roots(k, 1e-3);
    let theirs = if na.len() == truth.len() {
        let mut padded = [f64::NAN; 4];
        padded[..na.len()].copy_from_slice(&na);
        worst_miss(&padded.map(|x| if x.is_nan() { na[0] } else { x }), truth)
    } else {
        f64::INFINITY
    };
    worst.0 = worst.0.max(mine);
    if theirs.is_finite() {
        worst.1 = worst.1.max(theirs);
    }
    // What double precision can promise: 1e-14 of the worst first-order condition.
    let floor = truth
        .iter()
        .map(|&r| 1e-14 * (1.0 + condition(&k, r)) / (1.0 + r.abs()))
        .fold(1e-15, f64::max);
    assert!(
        mine <= 10.0 * theirs + floor,
        "{k:?}: Ferrari {mine:e}, nalgebra {theirs:e}, floor {floor:e}"
    );
}

#[test]
fn four_real_roots_match_the_companion_matrix() {
    let mut rng = SampleRng::new(11);
    let mut worst = (0.0, 0.0);
    for _ in 0..sample_count(2000) {
        let roots: Vec<f64> = (0..4).map(|_| rng.range(-4.0, 4.0)).collect();
        let k = expand(rng.range(0.2, 3.0) * rng.sign(), &roots, &[]);
        compare_with_known_roots(k, &roots, &mut worst);
    }
    eprintln!(
        "four real roots: worst relative miss {:.2e} (nalgebra {:.2e})",
        worst.0, worst.1
    );
    assert!(worst.0 < 1e-8, "{:e}", worst.0);
}

#[test]
fn real_and_complex_roots_match_the_companion_matrix() {
    let mut rng = SampleRng::new(12);
    let mut worst = (0.0, 0.0);
    let mut worst_scaled: f64 = 0.0;
    for i in 0..sample_count(2000) {
        if i % 2 == 0 {
            // Two real roots and a complex pair.
            let roots = [rng.range(-4.0, 4.0), rng.range(-4.0, 4.0)];
            let s = rng.range(-4.0, 4.0);
            let p = s * s / 4.0 + rng.range(0.01, 4.0);
            let k = expand(rng.range(0.2, 3.0), &roots, &[(s, p)]);
            compare_with_known_roots(k, &roots, &mut worst);
        } else {
            // Random coefficients: against nalgebra, within the roots' condition.
            let k = [0; 5].map(|_| rng.range(-1.0, 1.0));
            if k[0].abs() < 0.05 {
                continue;
            }
            let computed = ferrari(k);
            for r in reference_roots(k, 1e-7) {
                let miss = computed
                    .iter()
                    .map(|t| (t - r).abs() / (1.0 + r.abs()))
                    .fold(f64::INFINITY, f64::min);
                let allowed = 1e-14 * (1.0 + condition(&k, r));
                if allowed < 1e-9 {
                    worst_scaled = worst_scaled.max(miss / allowed);
                }
            }
        }
    }
    eprintln!(
        "real and complex roots: worst relative miss {:.2e} (nalgebra {:.2e}); \
         random coefficients: worst miss / (1e-14 × condition) {worst_scaled:.2}",
        worst.0, worst.1
    );
    assert!(worst_scaled < 1.0, "{worst_scaled}");
}

#[test]
fn near_double_roots_keep_the_digits_their_condition_allows() {
    // Roots `r` and `r + s` with s = 1e-6 and 1e-4: double precision cannot place them better
    // than `C e (e + s) ≈ η` allows (η the rounding of P near the pair); Ferrari with the
    // Newton polish stays within a small factor of nalgebra there, and |P(t)| at rounding level.
    let mut rng = SampleRng::new(13);
    let mut worst = (0.0, 0.0);
    let mut worst_residual: f64 = 0.0;
    for i in 0..sample_count(1000) {
        let r = rng.range(-3.0, 3.0);
        let s = if i % 2 == 0 { 1e-6 } else { 1e-4 };
        let others = [rng.range(-3.0, 3.0), rng.range(-3.0, 3.0)];
        let roots = [r, r + s, others[0], others[1]];
        let k = expand(1.0, &roots, &[]);
        for t in ferrari(k) {
            let p = (((k[0] * t + k[1]) * t + k[2]) * t + k[3]) * t + k[4];
            let size: f64 = k
                .iter()
                .rev()
                .enumerate()
                .map(|(i, c)| c.abs() * t.abs().powi(i as i32))
                .sum();
            worst_residual = worst_residual.max(p.abs() / size);
        }
        compare_with_known_roots(k, &roots, &mut worst);
    }
    eprintln!(
        "near-double roots: worst miss {:.2e} (nalgebra {:.2e}), worst |P(t)| / Σ|k_i t^i| {worst_residual:.2e}",
        worst.0, worst.1
    );
    assert!(worst_residual < 1e-14, "{worst_residual:e}");
}

#[test]
fn exact_double_and_biquadratic_cases() {
    // (t − 1)²(t + 2)(t − 0.5): the double root is found to about √ε (its condition).
    let k = expand(1.0, &[1.0, 1.0, -2.0, 0.5], &[]);
    let t = ferrari(k);
    assert!(worst_miss(&t, &[1.0, -2.0, 0.5]) < 1e-7, "{t:?}");
    // t⁴ − 5t² + 4 (q = 0, a biquadratic): ±1, ±2 exactly.
    let t = ferrari([1.0, 0.0, -5.0, 0.0, 4.0]);
    assert!(worst_miss(&t, &[1.0, -1.0, 2.0, -2.0]) < 1e-15, "{t:?}");
    // t⁴ (q = r = p = 0): four zeros.
    let t = ferrari([2.0, 0.0, 0.0, 0.0, 0.0]);
    assert!(t.iter().all(|x| x.abs() < 1e-12), "{t:?}");
    // (t² + 1)(t² + 4): no real root; the candidates stay finite.
    let t = ferrari(expand(1.0, &[], &[(0.0, 1.0), (0.0, 4.0)]));
    assert!(t.iter().all(|x| x.is_finite()), "{t:?}");
    assert!(reference_roots(expand(1.0, &[], &[(0.0, 1.0), (0.0, 4.0)]), 1e-9).is_empty());
}

fn trig(k: [f64; 5]) -> [(f64, f64); 4] {
    let out = run(&k, |g, ids| {
        let r = trig_roots(g, [ids[0], ids[1], ids[2], ids[3], ids[4]], "f");
        let mut o = [0; 8];
        for (i, (c, s)) in r.roots.iter().enumerate() {
            o[2 * i] = *c;
            o[2 * i + 1] = *s;
        }
        o
    });
    [0, 1, 2, 3].map(|i| (out[2 * i], out[2 * i + 1]))
}

fn trig_eval(k: &[f64; 5], theta: f64) -> f64 {
    k[0] + k[1] * theta.cos()
        + k[2] * theta.sin()
        + k[3] * (2.0 * theta).cos()
        + k[4] * (2.0 * theta).sin()
}

/// The real roots of the trigonometric polynomial by nalgebra: the half-angle quartic about
/// the rotation `gamma` (chosen by the test), its companion eigenvalues, `θ = γ + 2 atan t`.
fn trig_reference(k: &[f64; 5], gamma: f64) -> Vec<f64> {
    let (c, s) = (gamma.cos(), gamma.sin());
    let (c2, s2) = ((2.0 * gamma).cos(), (2.0 * gamma).sin());
    let k1 = k[1] * c + k[2] * s;
    let k2 = k[2] * c - k[1] * s;
    let k3 = k[3] * c2 + k[4] * s2;
    let k4 = k[4] * c2 - k[3] * s2;
    let q = [
        k[0] - k1 + k3,
        2.0 * k2 - 4.0 * k4,
        2.0 * k[0] - 6.0 * k3,
        2.0 * k2 + 4.0 * k4,
        k[0] + k1 + k3,
    ];
    reference_roots(q, 1e-7)
        .into_iter()
        .map(|t| gamma + 2.0 * t.atan())
        .collect()
}

fn angle_gap(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(std::f64::consts::TAU);
    d.min(std::f64::consts::TAU - d)
}

#[test]
fn trigonometric_roots_match_the_companion_matrix_at_every_angle() {
    let mut rng = SampleRng::new(14);
    let mut worst: f64 = 0.0;
    let mut checked = 0;
    for i in 0..sample_count(2000) {
        let mut k = [0; 5].map(|_| rng.range(-1.0, 1.0));
        if i % 3 == 0 {
            // A root exactly at θ = π (t = ∞ without the rotation): k0 − k1 + k3 = 0.
            k[0] = k[1] - k[3];
        }
        if i % 3 == 1 {
            // A root exactly at θ = 0 and one at θ = π/2.
            k[0] = -k[1] - k[3];
            k[2] = k[3] - k[0];
        }
        // The reference rotation: a random angle where its leading coefficient is large.
        let gamma = rng.range(-3.0, 3.0);
        if trig_eval(&k, gamma + std::f64::consts::PI).abs() < 0.2 {
            continue;
        }
        let reference = trig_reference(&k, gamma);
        let mut sorted: Vec<f64> = reference
            .iter()
            .map(|x| x.rem_euclid(std::f64::consts::TAU))
            .collect();
        sorted.sort_by(f64::total_cmp);
        let close = sorted.windows(2).any(|w| w[1] - w[0] < 1e-3)
            || (sorted.len() > 1
                && sorted[0] + std::f64::consts::TAU - sorted[sorted.len() - 1] < 1e-3);
        if close {
            continue;
        }
        let computed = trig(k);
        for (c, s) in computed {
            assert!(((c * c + s * s) - 1.0).abs() < 1e-14, "{k:?}");
        }
        for r in &reference {
            let miss = computed
                .iter()
                .map(|(c, s)| angle_gap(s.atan2(*c), *r))
                .fold(f64::INFINITY, f64::min);
            worst = worst.max(miss);
        }
        checked += 1;
    }
    eprintln!("trigonometric roots: {checked} polynomials, worst miss {worst:.2e} rad");
    assert!(checked > sample_count(2000) / 2);
    assert!(worst < 1e-11, "{worst:e}");
}
