//! How near and how far the wrist center can get: the range of a distance over joint ranges.

use nalgebra::{Matrix3x2, Vector2, Vector3};

/// The model-value range `[low, high]` of a joint from its limits (joint values), sorted; may
/// be infinite.
pub fn model_range(joint: &armforge_runtime::Joint) -> [f64; 2] {
    let a = joint.model_value(joint.limits[0]);
    let b = joint.model_value(joint.limits[1]);
    let (a, b) = (finite_or_keep(a), finite_or_keep(b));
    if a <= b {
        [a, b]
    } else {
        [b, a]
    }
}

fn finite_or_keep(x: f64) -> f64 {
    // ±∞ stays ±∞; NaN (∞ − ∞ from an infinite limit with an offset cannot happen, but a
    // NaN limit could) widens to the whole line.
    if x.is_nan() {
        f64::INFINITY
    } else {
        x
    }
}

/// The range of `|w + v·d|` for `d` in `range` (a point moving along a line).
pub fn line_norm_range(w: &Vector3<f64>, v: &Vector3<f64>, range: [f64; 2]) -> [f64; 2] {
    let at = |d: f64| (w + v * d).norm();
    let vv = v.norm_squared();
    if vv <= 0.0 {
        return [w.norm(), w.norm()];
    }
    let min = at((-w.dot(v) / vv).max(range[0]).min(range[1]));
    let max = if range[0].is_infinite() || range[1].is_infinite() {
        f64::INFINITY
    } else {
        at(range[0]).max(at(range[1]))
    };
    [min, max]
}

/// The range of `|w + v₁·d₁ + v₂·d₂|` for `(d₁, d₂)` in the box `r₁ × r₂` (a point moving in a
/// plane). The norm is convex: the maximum is at a corner (infinite if the box is unbounded in a
/// direction that moves the point); the minimum is at the unconstrained least-squares point
/// (nalgebra SVD) when it lies in the box, otherwise on an edge.
pub fn plane_norm_range(
    w: &Vector3<f64>,
    v: [&Vector3<f64>; 2],
    ranges: [[f64; 2]; 2],
) -> [f64; 2] {
    let moves = |i: usize| v[i].norm_squared() > 0.0;
    let unbounded = |i: usize| ranges[i][0].is_infinite() || ranges[i][1].is_infinite();
    let max = if (0..2).any(|i| moves(i) && unbounded(i)) {
        f64::INFINITY
    } else {
        let mut m: f64 = 0.0;
        for a in ranges[0] {
            for b in ranges[1] {
                m = m.max((w + v[0] * a + v[1] * b).norm());
            }
        }
        m
    };
    [plane_min(w, v, ranges), max]
}

fn plane_min(w: &Vector3<f64>, v: [&Vector3<f64>; 2], ranges: [[f64; 2]; 2]) -> f64 {
    let a = Matrix3x2::from_columns(&[*v[0], *v[1]]);
    let svd = a.svd(true, true);
    let inside = |d: &Vector2<f64>| (0..2).all(|i| d[i] >= ranges[i][0] && d[i] <= ranges[i][1]);
    let mut best = f64::INFINITY;
    if let Ok(d) = svd.solve(&(-w), 1e-12 * svd.singular_values.max()) {
        if inside(&d) {
            best = (w + a * d).norm();
        }
    }
    // Edges: hold one coordinate at a finite bound, move the other along its range.
    for (fixed, free) in [(0, 1), (1, 0)] {
        for bound in ranges[fixed] {
            if bound.is_finite() {
                let edge = line_norm_range(&(w + v[fixed] * bound), v[free], ranges[free]);
                best = best.min(edge[0]);
            }
        }
    }
    best
}

#[cfg(test)]
mod tests {
    //! Expected values are worked by hand (Pythagoras on the given boxes and lines).
    use super::*;

    #[test]
    fn line_range_passes_the_nearest_point() {
        // A point moving along y at x = 3 for d in [−1, 4]: nearest 3 (at d = 0), farthest 5.
        let r = line_norm_range(
            &Vector3::new(3.0, 0.0, 0.0),
            &Vector3::new(0.0, 1.0, 0.0),
            [-1.0, 4.0],
        );
        assert!((r[0] - 3.0).abs() < 1e-15 && (r[1] - 5.0).abs() < 1e-15);
    }

    #[test]
    fn plane_range_with_the_origin_outside_the_box() {
        // Point (2 + d1, d2) for d1 in [0, 1], d2 in [−1, 1]: nearest (2, 0), farthest (3, ±1).
        let r = plane_norm_range(
            &Vector3::new(2.0, 0.0, 0.0),
            [&Vector3::new(1.0, 0.0, 0.0), &Vector3::new(0.0, 1.0, 0.0)],
            [[0.0, 1.0], [-1.0, 1.0]],
        );
        assert!((r[0] - 2.0).abs() < 1e-15);
        assert!((r[1] - 10f64.sqrt()).abs() < 1e-15);
    }

    #[test]
    fn plane_range_unbounded() {
        let r = plane_norm_range(
            &Vector3::new(2.0, 0.0, 0.0),
            [&Vector3::new(1.0, 0.0, 0.0), &Vector3::new(0.0, 1.0, 0.0)],
            [[-f64::INFINITY, f64::INFINITY], [0.0, 1.0]],
        );
        assert!(r[0].abs() < 1e-15 && r[1].is_infinite());
    }
}
