//! Joints 1–3 of a cartesian arm (P P P, slides linearly independent): the wrist center moves
//! by `U s` with `U = [u1 u2 u3]`, so `s = U⁻¹ (c_t − c)` — a 3×3 linear system solved once,
//! at generation time, by Cramer's rule (the inverse is folded into the plan).

use armforge_runtime::internal::{ElbowRule, ShoulderRule};
use armforge_runtime::{Elbow, Shoulder};

use crate::plan::arm::Arm;
use crate::plan::graph::Graph;
use crate::plan::vec3::{self, num, V3};
use crate::plan::ArmSolution;

/// The label rules of a cartesian arm: no choices.
pub fn rules(_arm: &Arm) -> (ShoulderRule, ElbowRule) {
    (ShoulderRule::Only, ElbowRule::Only)
}

/// `U⁻¹` by Cramer's rule (rows: `(u2 × u3, u3 × u1, u1 × u2) / det`).
pub fn inverse(u: [[f64; 3]; 3]) -> [[f64; 3]; 3] {
    let [u1, u2, u3] = u;
    let det = num::dot(&u1, &num::cross(&u2, &u3));
    let det = if det.abs() > 1e-300 { det } else { 1.0 };
    [
        num::scale(&num::cross(&u2, &u3), 1.0 / det),
        num::scale(&num::cross(&u3, &u1), 1.0 / det),
        num::scale(&num::cross(&u1, &u2), 1.0 / det),
    ]
}

/// `U⁻¹` of the arm's three slides, as the plan holds it.
pub fn slides_inverse(arm: &Arm) -> [[f64; 3]; 3] {
    inverse([arm.axis(0), arm.axis(1), arm.axis(2)])
}

/// Builds joints 1–3 of a cartesian arm (one branch).
pub fn solve(g: &mut Graph, arm: &Arm, _t: &crate::plan::Target, ct: V3) -> Vec<ArmSolution> {
    let inv = slides_inverse(arm);
    let delta = vec3::add_const(g, ct, num::scale(&arm.wrist_center, -1.0));
    let delta = vec3::name(
        g,
        delta,
        "shift",
        "c_t − c: how far the slides move the wrist center",
    );
    let mut angles = [0; 3];
    for (i, row) in inv.iter().enumerate() {
        let s = vec3::dot_const(g, *row, delta);
        angles[i] = g.name(
            s,
            &format!("q{}", i + 1),
            format!(
                "slide {} = ({}, {}, {}) · (c_t − c)  (row of U⁻¹, Cramer's rule)",
                i + 1,
                crate::units::tidy(row[0]),
                crate::units::tidy(row[1]),
                crate::units::tidy(row[2])
            ),
        );
    }
    vec![ArmSolution {
        angles,
        undo: Vec::new(),
        shoulder: Shoulder::Only,
        elbow: Elbow::Only,
        checks: Vec::new(),
        on_axis_1: None,
    }]
}
