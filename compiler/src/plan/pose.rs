//! The target seen from the arm's own base and tool frames, as symbolic rigid motions:
//! `G = B⁻¹ T M⁻¹` (the product `E1 ⋯ E6` of the joint motions) and its inverse.
//!
//! Families that do not decouple at a wrist at the end of the arm (three parallel axes, the
//! wrist at the base) work with `G` itself rather than with one point of it.

use super::arm::Arm;
use super::decouple::Target;
use super::graph::{Graph, Id};
use super::vec3::{self, num, V3};

/// A symbolic rigid motion `x ↦ R x + t` (rotation by rows).
#[derive(Clone, Copy, Debug)]
pub struct Motion {
    /// Rows of the rotation.
    pub rows: [V3; 3],
    /// The translation.
    pub translation: V3,
}

impl Motion {
    /// The columns of the rotation (the rows of its transpose).
    pub fn columns(&self) -> [V3; 3] {
        let r = &self.rows;
        [
            [r[0][0], r[1][0], r[2][0]],
            [r[0][1], r[1][1], r[2][1]],
            [r[0][2], r[1][2], r[2][2]],
        ]
    }

    /// `R v` for a symbolic direction.
    pub fn rotate(&self, g: &mut Graph, v: V3) -> V3 {
        vec3::mat_mul(g, &self.rows, v)
    }

    /// `Rᵀ v` for a symbolic direction.
    pub fn rotate_back(&self, g: &mut Graph, v: V3) -> V3 {
        let columns = self.columns();
        vec3::mat_mul(g, &columns, v)
    }

    /// `R x + t` for a symbolic point.
    pub fn apply(&self, g: &mut Graph, x: V3) -> V3 {
        let r = self.rotate(g, x);
        vec3::add(g, r, self.translation)
    }

    /// The inverse motion `x ↦ Rᵀ (x − t)`.
    pub fn inverse(&self, g: &mut Graph) -> Motion {
        let back = self.rotate_back(g, self.translation);
        let zero = g.constant(0.0);
        Motion {
            rows: self.columns(),
            translation: [
                g.sub(zero, back[0]),
                g.sub(zero, back[1]),
                g.sub(zero, back[2]),
            ],
        }
    }
}

/// `G = B⁻¹ T M⁻¹`: rotation `B_Rᵀ T_R M_Rᵀ`, translation `B_Rᵀ (T_R (−M_Rᵀ M_t) + T_t − B_t)`.
/// A base or tool at the identity folds away.
pub fn joint_motions(g: &mut Graph, arm: &Arm, t: &Target) -> Motion {
    let m = &arm.tool;
    let b = &arm.base;
    // Column j of T_R M_Rᵀ is T_R (row j of M_R).
    let columns: Vec<V3> = (0..3)
        .map(|j| {
            let k = vec3::constant(g, m.rotation[j]);
            let tm = vec3::mat_mul(g, &t.rotation, k);
            vec3::mat_t_mul_const(g, &b.rotation, tm)
        })
        .collect();
    let rows = [
        [columns[0][0], columns[1][0], columns[2][0]],
        [columns[0][1], columns[1][1], columns[2][1]],
        [columns[0][2], columns[1][2], columns[2][2]],
    ];
    // −M_Rᵀ M_t: the tool frame's origin seen from its own axes, reversed.
    let back: [f64; 3] = std::array::from_fn(|i| {
        -(0..3)
            .map(|k| m.rotation[k][i] * m.translation[k])
            .sum::<f64>()
    });
    let k = vec3::constant(g, back);
    let moved = vec3::mat_mul(g, &t.rotation, k);
    let world = vec3::add(g, moved, t.translation);
    let shifted = vec3::add_const(g, world, num::scale(&b.translation, -1.0));
    let translation = vec3::mat_t_mul_const(g, &b.rotation, shifted);
    Motion { rows, translation }
}

/// `E(−θ) x = Rᵀ (x − p) + p` for a revolute joint with constant axis `h` through `p`.
pub fn undo_revolute(g: &mut Graph, h: [f64; 3], p: [f64; 3], (c, s): (Id, Id), x: V3) -> V3 {
    let rel = vec3::add_const(g, x, num::scale(&p, -1.0));
    let back = vec3::rotate_back(g, h, c, s, rel);
    vec3::add_const(g, back, p)
}

/// `E(−θ) x` for a constant point `x`.
pub fn undo_revolute_const(
    g: &mut Graph,
    h: [f64; 3],
    p: [f64; 3],
    angle: (Id, Id),
    x: [f64; 3],
) -> V3 {
    let x = vec3::constant(g, x);
    undo_revolute(g, h, p, angle, x)
}

/// Names the nine entries and the translation of a motion.
pub fn name(g: &mut Graph, m: Motion, name: &str, note: &str) -> Motion {
    let mut rows = m.rows;
    for (i, row) in rows.iter_mut().enumerate() {
        *row = vec3::name(
            g,
            *row,
            &format!("{name}_r{i}"),
            &format!("{note}: rotation row {i}"),
        );
    }
    let translation = vec3::name(
        g,
        m.translation,
        &format!("{name}_t"),
        &format!("{note}: translation"),
    );
    Motion { rows, translation }
}
