//! The solver against textbook closed forms, worked independently for the upright example
//! arm (axis 1 vertical, shoulder and elbow axes horizontal, a wrist with axes x, y, x):
//!
//! * joint 1: `θ1 = atan2(y_c, x_c)` for the facing posture (Spong, Hutchinson & Vidyasagar,
//!   Robot Modeling and Control, 2006, §3.3, from memory);
//! * joints 2 and 3: the planar elbow manipulator, `cos ψ = (r² − a1² − a2²) / (2 a1 a2)` and
//!   `θ = atan2(·) − atan2(a2 sin ψ, a1 + a2 cos ψ)` (same source, §3.3, from memory);
//! * joints 4–6: Euler angles of `R456 = Rx(θ4) Ry(θ5) Rx(θ6)` read from the matrix entries
//!   (the XYX analogue of the ZYZ extraction in Siciliano et al., Robotics, 2009, §2.4.1,
//!   from memory; the matrix product is written out below).

use std::f64::consts::{PI, TAU};

use armforge_compiler::plan::samples::{sample_configuration, upright_elbow_arm, SampleRng};
use armforge_compiler::solver::Solver;
use armforge_runtime::Pose;

type M3 = [[f64; 3]; 3];

fn mul(a: &M3, b: &M3) -> M3 {
    let mut m = [[0.0; 3]; 3];
    for (i, row) in m.iter_mut().enumerate() {
        for (j, v) in row.iter_mut().enumerate() {
            *v = (0..3).map(|k| a[i][k] * b[k][j]).sum();
        }
    }
    m
}

fn transpose(a: &M3) -> M3 {
    let mut m = [[0.0; 3]; 3];
    for (i, row) in m.iter_mut().enumerate() {
        for (j, v) in row.iter_mut().enumerate() {
            *v = a[j][i];
        }
    }
    m
}

fn rz(t: f64) -> M3 {
    let (s, c) = t.sin_cos();
    [[c, -s, 0.0], [s, c, 0.0], [0.0, 0.0, 1.0]]
}

fn ry(t: f64) -> M3 {
    let (s, c) = t.sin_cos();
    [[c, 0.0, s], [0.0, 1.0, 0.0], [-s, 0.0, c]]
}

fn wrap(x: f64) -> f64 {
    x - TAU * (x / TAU).round()
}

/// The four facing-shoulder solutions of the upright arm (shoulder offset 0.12 m, upper arm
/// 0.40 m, forearm (0.38, 0.075) m, flange 0.09 m along x, tool rotation identity at zero).
fn textbook(target: &Pose) -> Vec<[f64; 6]> {
    let r = &target.rotation;
    // Wrist center: step back 0.09 m along the tool's x axis.
    let c = [
        target.translation[0] - 0.09 * r[0][0],
        target.translation[1] - 0.09 * r[1][0],
        target.translation[2] - 0.09 * r[2][0],
    ];
    let t1 = c[1].atan2(c[0]);
    let radial = (c[0] * c[0] + c[1] * c[1]).sqrt() - 0.12;
    let height = c[2] - 0.45;
    let (a1, a2) = (0.4f64, (0.38f64.powi(2) + 0.075f64.powi(2)).sqrt());
    let beta0 = 0.38f64.atan2(0.075);
    let d = (radial * radial + height * height - a1 * a1 - a2 * a2) / (2.0 * a1 * a2);
    let mut out = Vec::new();
    for psi in [d.acos(), -d.acos()] {
        let t2 = radial.atan2(height) - (a2 * psi.sin()).atan2(a1 + a2 * psi.cos());
        let t3 = psi - beta0;
        // R456 = (Rz(θ1) Ry(θ2 + θ3))ᵀ R.
        let r123 = mul(&rz(t1), &ry(t2 + t3));
        let w = mul(&transpose(&r123), r);
        // Rx(a) Ry(b) Rx(c) = [[cb, sb sc, sb cc], [sa sb, …], [−ca sb, …]].
        let b = (w[0][1].hypot(w[0][2])).atan2(w[0][0]);
        let a = w[1][0].atan2(-w[2][0]);
        let cc = w[0][1].atan2(w[0][2]);
        out.push([t1, t2, t3, a, b, cc]);
        out.push([t1, t2, t3, a + PI, -b, cc + PI]);
    }
    out
}

#[test]
fn facing_solutions_match_the_textbook_closed_forms() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let solver = Solver::new(&model, &geometry);
    let mut rng = SampleRng::new(2006);
    let mut compared = 0;
    for _ in 0..500 {
        let q = sample_configuration(&model, &mut rng);
        let target = model.forward(&q);
        let ours = solver.solve(&target).unwrap();
        for expected in textbook(&target) {
            let found = ours.iter().any(|s| {
                s.joints
                    .iter()
                    .zip(expected.iter())
                    .all(|(a, b)| wrap(a - b).abs() < 1e-9)
            });
            assert!(
                found,
                "textbook solution {expected:?} missing from {ours:#?}"
            );
            compared += 1;
        }
    }
    assert_eq!(compared, 2000);
}
