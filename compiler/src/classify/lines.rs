//! Line geometry with nalgebra: closest points of two lines, the least-squares meeting point
//! of several lines, angles between lines.
//!
//! A joint axis is a line `(point, direction)`; its sign does not matter for geometry, so the
//! angles here are between *lines* and lie in `[0, π/2]` unless a function says otherwise.

use nalgebra::{Matrix3, Point3, Unit, Vector3};

/// A line in space: a point on it and a unit direction.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Line {
    /// A point on the line.
    pub point: Point3<f64>,
    /// The unit direction.
    pub direction: Unit<Vector3<f64>>,
}

/// The common normal of two lines: where they come closest and how close.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ClosestPoints {
    /// The point on the first line nearest the second.
    pub on_first: Point3<f64>,
    /// The point on the second line nearest the first.
    pub on_second: Point3<f64>,
    /// The length of the common normal (the distance between the lines).
    pub distance: f64,
    /// True when the lines are parallel: the feet are then one choice among many (the
    /// first line's given point and its projection on the second line).
    pub parallel: bool,
}

impl Line {
    /// A line through `point` along `direction` (any non-zero length); `None` for a zero or
    /// non-finite direction or a non-finite point.
    pub fn new(point: [f64; 3], direction: [f64; 3]) -> Option<Line> {
        let p = Point3::from(point);
        let d = Vector3::from(direction);
        if !p.coords.iter().all(|x| x.is_finite()) || !d.iter().all(|x| x.is_finite()) {
            return None;
        }
        Unit::try_new(d, 1e-300).map(|direction| Line {
            point: p,
            direction,
        })
    }

    /// The foot of the perpendicular from `x` to this line.
    pub fn project(&self, x: &Point3<f64>) -> Point3<f64> {
        let d = self.direction.into_inner();
        self.point + d * d.dot(&(x - self.point))
    }

    /// The distance from `x` to this line.
    pub fn distance_to(&self, x: &Point3<f64>) -> f64 {
        (x - self.project(x)).norm()
    }

    /// `I − d dᵀ`: the projector onto the plane perpendicular to the line.
    pub fn perpendicular_projector(&self) -> Matrix3<f64> {
        let d = self.direction.into_inner();
        Matrix3::identity() - d * d.transpose()
    }
}

/// The angle between two directions, in `[0, π]` (stable for nearly parallel directions).
pub fn angle_between_directions(a: &Vector3<f64>, b: &Vector3<f64>) -> f64 {
    a.cross(b).norm().atan2(a.dot(b))
}

/// The angle between two lines (direction signs ignored), in `[0, π/2]`.
pub fn angle_between_lines(a: &Line, b: &Line) -> f64 {
    let (da, db) = (a.direction.into_inner(), b.direction.into_inner());
    da.cross(&db).norm().atan2(da.dot(&db).abs())
}

/// The closest points of two lines (the feet of their common normal). Lines whose angle is at
/// most `parallel_angle` radians are treated as parallel.
pub fn closest_points(a: &Line, b: &Line, parallel_angle: f64) -> ClosestPoints {
    if angle_between_lines(a, b) <= parallel_angle {
        let on_second = b.project(&a.point);
        return ClosestPoints {
            on_first: a.point,
            on_second,
            distance: (on_second - a.point).norm(),
            parallel: true,
        };
    }
    // Minimise |a.p + s·u − b.p − t·v|²: the 2×2 normal equations.
    let (u, v) = (a.direction.into_inner(), b.direction.into_inner());
    let w = a.point - b.point;
    let uv = u.dot(&v);
    let (du, dv) = (u.dot(&w), v.dot(&w));
    let det = 1.0 - uv * uv;
    let s = (uv * dv - du) / det;
    let t = (dv - uv * du) / det;
    let on_first = a.point + u * s;
    let on_second = b.point + v * t;
    ClosestPoints {
        on_first,
        on_second,
        distance: (on_first - on_second).norm(),
        parallel: false,
    }
}

/// The point nearest to every line in the least-squares sense: it minimises the sum of squared
/// distances to the lines, `Σ |(I − dᵢdᵢᵀ)(x − pᵢ)|²`, solved by SVD of the 3×3 normal matrix.
/// `None` when the lines are all parallel (no single nearest point): the normal matrix then has
/// a singular value below `rank_tolerance` (relative to the largest).
pub fn least_squares_meeting_point(lines: &[Line], rank_tolerance: f64) -> Option<Point3<f64>> {
    let mut a = Matrix3::zeros();
    let mut b = Vector3::zeros();
    for line in lines {
        let p = line.perpendicular_projector();
        a += p;
        b += p * line.point.coords;
    }
    let svd = a.svd(true, true);
    let largest = svd.singular_values.max();
    if largest.partial_cmp(&0.0) != Some(std::cmp::Ordering::Greater)
        || svd.singular_values.min() <= rank_tolerance * largest
    {
        return None;
    }
    svd.solve(&b, 0.0).ok().map(Point3::from)
}

/// The signed angle that turns `from` onto `to` about `axis`, measured in the plane
/// perpendicular to `axis` (right-hand rule), in `(−π, π]`. `None` when either vector is
/// (nearly) along the axis, so the angle is not defined.
pub fn signed_angle_about(
    axis: &Unit<Vector3<f64>>,
    from: &Vector3<f64>,
    to: &Vector3<f64>,
    tolerance: f64,
) -> Option<f64> {
    let h = axis.into_inner();
    let f = from - h * h.dot(from);
    let t = to - h * h.dot(to);
    if f.norm() <= tolerance || t.norm() <= tolerance {
        return None;
    }
    Some(h.dot(&f.cross(&t)).atan2(f.dot(&t)))
}

#[cfg(test)]
mod tests {
    //! Expected values are worked by hand from elementary analytic geometry (common normal of
    //! two lines, perpendicular distance, angle from the dot and cross products).
    use super::*;

    fn line(p: [f64; 3], d: [f64; 3]) -> Line {
        Line::new(p, d).expect("valid line")
    }

    #[test]
    fn skew_lines_common_normal() {
        // x axis and a line parallel to y through (0, 0, 2): common normal along z, length 2.
        let c = closest_points(
            &line([0.0, 0.0, 0.0], [1.0, 0.0, 0.0]),
            &line([5.0, 3.0, 2.0], [0.0, 1.0, 0.0]),
            1e-12,
        );
        assert!(!c.parallel);
        assert!((c.distance - 2.0).abs() < 1e-15);
        assert!((c.on_first - Point3::new(5.0, 0.0, 0.0)).norm() < 1e-15);
        assert!((c.on_second - Point3::new(5.0, 0.0, 2.0)).norm() < 1e-15);
    }

    #[test]
    fn parallel_lines_distance() {
        let c = closest_points(
            &line([0.0, 0.0, 0.0], [0.0, 0.0, 1.0]),
            &line([3.0, 4.0, 7.0], [0.0, 0.0, -1.0]),
            1e-12,
        );
        assert!(c.parallel);
        assert!((c.distance - 5.0).abs() < 1e-15);
    }

    #[test]
    fn three_concurrent_lines_meet_where_they_cross() {
        let lines = [
            line([1.0, 2.0, 3.0], [1.0, 0.0, 0.0]),
            line([1.0, 2.0, 9.0], [0.0, 0.0, 1.0]),
            line([2.0, 3.0, 4.0], [1.0, 1.0, 1.0]),
        ];
        let c = least_squares_meeting_point(&lines, 1e-12).expect("not parallel");
        assert!((c - Point3::new(1.0, 2.0, 3.0)).norm() < 1e-14);
    }

    #[test]
    fn skew_lines_meeting_point_is_the_least_squares_minimum() {
        // Three skew lines: the returned point must have a smaller sum of squared distances
        // than any nearby point (the definition of the least-squares point).
        let lines = [
            line([0.0, 0.0, 0.0], [1.0, 0.2, 0.0]),
            line([0.3, 0.1, 0.05], [0.0, 1.0, 0.3]),
            line([0.2, -0.1, 0.4], [0.1, 0.2, 1.0]),
        ];
        let cost =
            |x: &Point3<f64>| -> f64 { lines.iter().map(|l| l.distance_to(x).powi(2)).sum() };
        let c = least_squares_meeting_point(&lines, 1e-12).expect("not parallel");
        let best = cost(&c);
        for k in 0..200 {
            let t = f64::from(k);
            let step = Vector3::new((1.3 * t).sin(), (0.7 * t).cos(), (2.9 * t).sin()) * 1e-4;
            assert!(cost(&(c + step)) > best);
        }
    }

    #[test]
    fn all_parallel_lines_have_no_meeting_point() {
        let lines = [
            line([0.0, 0.0, 0.0], [0.0, 0.0, 1.0]),
            line([1.0, 0.0, 0.0], [0.0, 0.0, 1.0]),
        ];
        assert!(least_squares_meeting_point(&lines, 1e-12).is_none());
    }

    #[test]
    fn angles() {
        let a = line([0.0; 3], [1.0, 0.0, 0.0]);
        let b = line([0.0; 3], [-1.0, 1.0, 0.0]);
        assert!((angle_between_lines(&a, &b) - std::f64::consts::FRAC_PI_4).abs() < 1e-15);
        let s = signed_angle_about(
            &Unit::new_normalize(Vector3::z()),
            &Vector3::x(),
            &Vector3::y(),
            1e-12,
        );
        assert!((s.expect("defined") - std::f64::consts::FRAC_PI_2).abs() < 1e-15);
    }
}
