//! Rigid poses: a rotation matrix and a translation.

use crate::math::{add, dot, Scalar};

/// A rigid pose: `p_world = rotation · p_local + translation`, in the scalar `S` (`f64` unless
/// said otherwise; `f32` for solvers emitted with `--scalar f32`).
///
/// `rotation` is row-major: `rotation[r][c]`. Build one with a struct literal.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Pose<S: Scalar = f64> {
    /// Rotation matrix, row-major.
    pub rotation: [[S; 3]; 3],
    /// Translation in metres.
    pub translation: [S; 3],
}

impl<S: Scalar> Default for Pose<S> {
    fn default() -> Self {
        Self::IDENTITY
    }
}

impl<S: Scalar> Pose<S> {
    /// The identity pose.
    pub const IDENTITY: Pose<S> = {
        let (o, z) = (S::ONE, S::ZERO);
        Pose {
            rotation: [[o, z, z], [z, o, z], [z, z, o]],
            translation: [z, z, z],
        }
    };

    /// The rotation applied to a vector: `R · v`.
    #[inline]
    pub fn rotate(&self, v: &[S; 3]) -> [S; 3] {
        let r = &self.rotation;
        [dot(&r[0], v), dot(&r[1], v), dot(&r[2], v)]
    }

    /// The transposed rotation applied to a vector: `Rᵀ · v`.
    #[inline]
    pub fn rotate_back(&self, v: &[S; 3]) -> [S; 3] {
        let r = &self.rotation;
        [
            r[0][0] * v[0] + r[1][0] * v[1] + r[2][0] * v[2],
            r[0][1] * v[0] + r[1][1] * v[1] + r[2][1] * v[2],
            r[0][2] * v[0] + r[1][2] * v[1] + r[2][2] * v[2],
        ]
    }

    /// The pose applied to a point: `R · p + t`.
    #[inline]
    pub fn transform_point(&self, p: &[S; 3]) -> [S; 3] {
        add(&self.rotate(p), &self.translation)
    }

    /// The composition `self · other` (apply `other` first).
    pub fn compose(&self, other: &Pose<S>) -> Pose<S> {
        let a = &self.rotation;
        let b = &other.rotation;
        let mut rotation = [[S::ZERO; 3]; 3];
        for (r, row) in rotation.iter_mut().enumerate() {
            for (c, out) in row.iter_mut().enumerate() {
                *out = a[r][0] * b[0][c] + a[r][1] * b[1][c] + a[r][2] * b[2][c];
            }
        }
        Pose {
            rotation,
            translation: self.transform_point(&other.translation),
        }
    }

    /// The inverse pose: `(Rᵀ, −Rᵀ t)`.
    pub fn inverse(&self) -> Pose<S> {
        let r = &self.rotation;
        let rotation = [
            [r[0][0], r[1][0], r[2][0]],
            [r[0][1], r[1][1], r[2][1]],
            [r[0][2], r[1][2], r[2][2]],
        ];
        let t = self.rotate_back(&self.translation);
        Pose {
            rotation,
            translation: [-t[0], -t[1], -t[2]],
        }
    }

    /// True when every entry is finite.
    pub fn is_finite(&self) -> bool {
        self.rotation.iter().flatten().all(|x| x.is_finite())
            && self.translation.iter().all(|x| x.is_finite())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sample() -> Pose {
        // A rotation of 90° about z with a translation.
        Pose {
            rotation: [[0.0, -1.0, 0.0], [1.0, 0.0, 0.0], [0.0, 0.0, 1.0]],
            translation: [1.0, 2.0, 3.0],
        }
    }

    #[test]
    fn inverse_composes_to_identity() {
        let p = sample();
        let id = p.compose(&p.inverse());
        for r in 0..3 {
            for c in 0..3 {
                assert!((id.rotation[r][c] - Pose::<f64>::IDENTITY.rotation[r][c]).abs() < 1e-15);
            }
            assert!(id.translation[r].abs() < 1e-15);
        }
    }

    #[test]
    fn f32_poses_compose_like_f64_ones() {
        let p = sample();
        let q: Pose<f32> = Pose {
            rotation: p.rotation.map(|row| row.map(|x| x as f32)),
            translation: p.translation.map(|x| x as f32),
        };
        let id = q.compose(&q.inverse());
        assert_eq!(id, Pose::<f32>::IDENTITY);
    }

    #[test]
    fn rotation_about_z_maps_x_to_y() {
        // Right-hand rule: a positive quarter turn about z takes x to y.
        assert_eq!(sample().rotate(&[1.0, 0.0, 0.0]), [0.0, 1.0, 0.0]);
    }
}
