//! Placing one joint so that a measure of the arm takes a given value: a grid scan, then
//! bisection on a sign change, or golden-section search for the extremum when the value lies
//! just inside a maximum or minimum (a reach boundary is such a tangency).

/// Points of the first scan over the joint's range.
const GRID: usize = 96;
/// Iterations of bisection and golden-section search (far more than `f64` needs; both stop
/// early once the interval stops shrinking).
const ITERATIONS: usize = 200;

/// A value `x` in `[lo, hi]` with `f(x) = target`, or `None` when the scan finds none.
///
/// `pick` in `[0, 1)` chooses among several solutions, so samples spread over all of them.
pub fn solve_one(
    f: impl Fn(f64) -> f64,
    [lo, hi]: [f64; 2],
    target: f64,
    pick: f64,
) -> Option<f64> {
    if !(lo.is_finite() && hi.is_finite() && lo < hi && target.is_finite()) {
        return None;
    }
    let xs: Vec<f64> = (0..=GRID)
        .map(|i| lo + (hi - lo) * i as f64 / GRID as f64)
        .collect();
    let gs: Vec<f64> = xs.iter().map(|&x| f(x) - target).collect();
    if gs.iter().any(|g| !g.is_finite()) {
        return None;
    }
    let crossings: Vec<usize> = (0..GRID).filter(|&i| gs[i] * gs[i + 1] <= 0.0).collect();
    if !crossings.is_empty() {
        let at = ((pick * crossings.len() as f64) as usize).min(crossings.len() - 1);
        let i = crossings[at];
        return Some(bisect(&f, xs[i], xs[i + 1], target));
    }
    // No sign change on the grid: the target lies just beyond the grid's extreme values (near
    // a minimum when every value is above it, near a maximum when every value is below).
    let above = gs[0] > 0.0;
    let score = |g: f64| if above { g } else { -g };
    let best = (0..=GRID)
        .min_by(|&a, &b| score(gs[a]).total_cmp(&score(gs[b])))
        .unwrap_or(0);
    let left = xs[best.saturating_sub(1)];
    let right = xs[(best + 1).min(GRID)];
    let extreme = golden(&|x| score(f(x) - target), left, right);
    if score(f(extreme) - target) > 0.0 {
        return None;
    }
    // Between the extremum and a grid point the value crosses the target once.
    let other = if pick < 0.5 { left } else { right };
    let other = if score(f(other) - target) > 0.0 {
        other
    } else {
        xs[best]
    };
    Some(bisect(&f, extreme, other, target))
}

/// Bisection for `f(x) = target` between `a` and `b`, where `f − target` changes sign.
fn bisect(f: &impl Fn(f64) -> f64, mut a: f64, mut b: f64, target: f64) -> f64 {
    let mut ga = f(a) - target;
    if ga == 0.0 {
        return a;
    }
    for _ in 0..ITERATIONS {
        let m = 0.5 * (a + b);
        if m == a || m == b {
            break;
        }
        let gm = f(m) - target;
        if gm == 0.0 {
            return m;
        }
        if (gm > 0.0) == (ga > 0.0) {
            a = m;
            ga = gm;
        } else {
            b = m;
        }
    }
    // The end nearer the target.
    if (f(a) - target).abs() <= (f(b) - target).abs() {
        a
    } else {
        b
    }
}

/// Golden-section search for the minimum of a unimodal `f` on `[a, b]`.
fn golden(f: &impl Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
    let r = (5f64.sqrt() - 1.0) / 2.0;
    let mut c = b - r * (b - a);
    let mut d = a + r * (b - a);
    let (mut fc, mut fd) = (f(c), f(d));
    for _ in 0..ITERATIONS {
        if fc <= fd {
            b = d;
            d = c;
            fd = fc;
            c = b - r * (b - a);
            fc = f(c);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + r * (b - a);
            fd = f(d);
        }
        if b - a <= f64::EPSILON * a.abs().max(b.abs()).max(1.0) {
            break;
        }
    }
    if fc <= fd {
        c
    } else {
        d
    }
}

#[cfg(test)]
mod tests {
    //! Worked by hand: the roots and extrema of simple functions.
    use super::*;

    #[test]
    fn finds_a_crossing() {
        let x = solve_one(|x| x * x, [0.0, 2.0], 2.0, 0.0).unwrap_or(f64::NAN);
        assert!((x - 2f64.sqrt()).abs() < 1e-15);
    }

    #[test]
    fn finds_a_value_just_below_a_maximum() {
        // cos has its maximum 1 at 0; cos x = 1 − 1e-12 at x = ±√(2e-12) (Taylor, to 1e-24).
        let x = solve_one(f64::cos, [-1.0, 1.3], 1.0 - 1e-12, 0.2).unwrap_or(f64::NAN);
        assert!((1.0 - x.cos() - 1e-12).abs() < 2e-16, "{x}");
        assert!((x.abs() - 2e-12f64.sqrt()).abs() < 1e-9);
    }

    #[test]
    fn finds_a_value_just_above_a_v_shaped_minimum() {
        // |x − 0.3| = 1e-12 at 0.3 ± 1e-12.
        let x = solve_one(|x| (x - 0.3).abs(), [-1.0, 1.0], 1e-12, 0.9).unwrap_or(f64::NAN);
        assert!(((x - 0.3).abs() - 1e-12).abs() < 1e-16, "{x}");
    }

    #[test]
    fn none_when_the_value_is_out_of_range() {
        assert!(solve_one(f64::cos, [-1.0, 1.0], 1.5, 0.5).is_none());
    }
}
