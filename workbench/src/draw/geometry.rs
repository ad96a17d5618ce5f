//! Line geometry for placing a drawing's joints: common normals, closest points and the point
//! nearest to several lines.

use armforge_runtime::math::{add, cross, dot, norm, scale, sub};
use nalgebra::{Matrix3, Vector3};

/// Below this squared sine of the angle between two axes they count as parallel.
const PARALLEL_SIN_SQUARED: f64 = 1e-12;

/// A line in space: a point on it and a unit direction.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Line {
    /// A point on the line.
    pub point: [f64; 3],
    /// Unit direction.
    pub direction: [f64; 3],
}

impl Line {
    /// The line through `point` along `direction` (normalised here; a zero direction stays zero).
    pub fn new(point: [f64; 3], direction: [f64; 3]) -> Line {
        let length = norm(&direction);
        let direction = if length > 0.0 {
            scale(&direction, 1.0 / length)
        } else {
            direction
        };
        Line { point, direction }
    }

    /// The point of the line closest to `x` (the foot of the perpendicular from `x`).
    pub fn closest_point(&self, x: &[f64; 3]) -> [f64; 3] {
        let along = dot(&sub(x, &self.point), &self.direction);
        add(&self.point, &scale(&self.direction, along))
    }

    /// The distance from `x` to the line.
    pub fn distance(&self, x: &[f64; 3]) -> f64 {
        norm(&sub(x, &self.closest_point(x)))
    }
}

/// The feet of the common normal of two lines, `(on a, on b)`; `None` when they are parallel.
///
/// For intersecting lines both feet are the intersection. With `d = p_b − p_a` and
/// `n = h_a × h_b`, the feet are at `t_a = ((d × h_b)·n)/|n|²` and `t_b = ((d × h_a)·n)/|n|²`
/// along the lines (the closest points of two skew lines; e.g. Murray, Li & Sastry 1994, §3.3
/// use the same construction for the common normal).
pub fn common_normal_feet(a: &Line, b: &Line) -> Option<([f64; 3], [f64; 3])> {
    let n = cross(&a.direction, &b.direction);
    let nn = dot(&n, &n);
    if nn < PARALLEL_SIN_SQUARED {
        return None;
    }
    let d = sub(&b.point, &a.point);
    let t_a = dot(&cross(&d, &b.direction), &n) / nn;
    let t_b = dot(&cross(&d, &a.direction), &n) / nn;
    Some((
        add(&a.point, &scale(&a.direction, t_a)),
        add(&b.point, &scale(&b.direction, t_b)),
    ))
}

/// The point with the least sum of squared distances to the lines, and the largest distance
/// from it to any of them; `None` when the lines are all parallel (no unique point).
///
/// Solves `Σ (I − h hᵀ) x = Σ (I − h hᵀ) p` (the normal equations of the distances).
pub fn nearest_point_to_lines(lines: &[Line]) -> Option<([f64; 3], f64)> {
    let mut a = Matrix3::zeros();
    let mut b = Vector3::zeros();
    for line in lines {
        let h = Vector3::from(line.direction);
        let projector = Matrix3::identity() - h * h.transpose();
        a += projector;
        b += projector * Vector3::from(line.point);
    }
    let x = a.lu().solve(&b)?;
    let x = [x[0], x[1], x[2]];
    if !x.iter().all(|v| v.is_finite()) {
        return None;
    }
    let worst = lines.iter().map(|l| l.distance(&x)).fold(0.0, f64::max);
    Some((x, worst))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn skew_lines_meet_their_common_normal_at_right_angles() {
        // z axis and a line along y through (1, 0, 2): the common normal is the x segment at
        // height 2 (worked by hand).
        let a = Line::new([0.0, 0.0, 0.0], [0.0, 0.0, 1.0]);
        let b = Line::new([1.0, 5.0, 2.0], [0.0, 1.0, 0.0]);
        let (fa, fb) = common_normal_feet(&a, &b).unwrap();
        assert!(norm(&sub(&fa, &[0.0, 0.0, 2.0])) < 1e-12);
        assert!(norm(&sub(&fb, &[1.0, 0.0, 2.0])) < 1e-12);
    }

    #[test]
    fn parallel_lines_have_no_unique_common_normal() {
        let a = Line::new([0.0, 0.0, 0.0], [0.0, 1.0, 0.0]);
        let b = Line::new([1.0, 0.0, 0.0], [0.0, -1.0, 0.0]);
        assert!(common_normal_feet(&a, &b).is_none());
    }

    #[test]
    fn three_lines_through_one_point_give_that_point() {
        let c = [0.4, -0.2, 0.9];
        let lines = [
            Line::new(add(&c, &[1.0, 0.0, 0.0]), [1.0, 0.0, 0.0]),
            Line::new(add(&c, &[0.0, 2.0, 0.0]), [0.0, 1.0, 0.0]),
            Line::new(add(&c, &[0.3, 0.0, 0.3]), [1.0, 0.0, 1.0]),
        ];
        let (x, worst) = nearest_point_to_lines(&lines).unwrap();
        assert!(norm(&sub(&x, &c)) < 1e-12);
        assert!(worst < 1e-12);
    }
}
