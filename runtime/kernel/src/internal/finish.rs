//! Finishing: candidates straight out of the closed-form steps become solutions. Model values
//! become joint values (wrapped by whole turns toward an anchor, or listed as equivalents),
//! the reach and wrist checks and the limits are applied, double roots at a boundary are
//! returned once, flags are set, and the reason is worked out when nothing is left.

use super::{inv_tau, round_fast, wrap, Candidate, Check, CheckKind, Settings};
use crate::math::{abs, sqrt, tolerance, Growth, Scalar};
use crate::model::{Joint, JointKind};
use crate::solution::{Branch, Flags, Solution, SolutionSet, Unreachable, JOINTS};

/// At most this many equivalent angles are listed for one revolute joint (a range of up to
/// seven turns); wider ranges list the first ones from the lower limit.
pub const MAX_EQUIVALENTS: usize = 8;

/// True when a revolute joint's range is wider than one turn (equivalent angles are listed).
#[inline(always)]
pub fn lists_equivalents<S: Scalar>(joint: &Joint<S>, tolerance: S) -> bool {
    let [lo, hi] = joint.limits;
    joint.kind == JointKind::Revolute
        && lo.is_finite()
        && hi.is_finite()
        && hi - lo > S::TAU + tolerance
}

/// How many equivalent values of one joint can be within its limits (1 unless the joint is
/// revolute with a range wider than one turn). Generators use this for the set's capacity.
pub fn equivalent_count<S: Scalar>(joint: &Joint<S>, tolerance: S) -> usize {
    if !lists_equivalents(joint, tolerance) {
        return 1;
    }
    let [lo, hi] = joint.limits;
    let turns = ((hi - lo + S::of(2.0) * tolerance) / S::TAU).to_f64();
    let mut n = 1;
    while n < MAX_EQUIVALENTS && (n as f64) <= turns {
        n += 1;
    }
    n
}

/// How one joint's values are finished, worked out once per solve.
#[derive(Clone, Copy)]
struct Finishing<S: Scalar> {
    /// Revolute with more than one turn of range: list equivalent angles from `lo`.
    lists: bool,
    /// Revolute with at most one turn: wrap around `center`.
    wraps: bool,
    center: S,
    lo: S,
    hi: S,
}

impl<S: Scalar> Finishing<S> {
    const NONE: Finishing<S> = Finishing {
        lists: false,
        wraps: false,
        center: S::ZERO,
        lo: S::ZERO,
        hi: S::ZERO,
    };

    #[inline(always)]
    fn of(joint: &Joint<S>, tol: S) -> Finishing<S> {
        let [lo, hi] = joint.limits;
        let lists = lists_equivalents(joint, tol);
        Finishing {
            lists,
            wraps: joint.kind == JointKind::Revolute && !lists,
            center: if lo.is_finite() && hi.is_finite() {
                S::of(0.5) * (lo + hi)
            } else {
                S::ZERO
            },
            lo,
            hi,
        }
    }
}

/// The per-joint constants of the conversion, worked out once per solve.
struct Table<S: Scalar> {
    finishing: [Finishing<S>; JOINTS],
    offset: [S; JOINTS],
    direction: [S; JOINTS],
    center: [S; JOINTS],
    /// `1.0` for joints that wrap, `0.0` otherwise.
    wraps: [S; JOINTS],
    low: [S; JOINTS],
    high: [S; JOINTS],
}

impl<S: Scalar> Table<S> {
    #[inline(always)]
    fn of(joints: &[Joint<S>; JOINTS], tol: S) -> Table<S> {
        let mut finishing = [Finishing::NONE; JOINTS];
        for (f, j) in finishing.iter_mut().zip(joints.iter()) {
            *f = Finishing::of(j, tol);
        }
        let mut t = Table {
            finishing,
            offset: [S::ZERO; JOINTS],
            direction: [S::ZERO; JOINTS],
            center: [S::ZERO; JOINTS],
            wraps: [S::ZERO; JOINTS],
            low: [S::ZERO; JOINTS],
            high: [S::ZERO; JOINTS],
        };
        for i in 0..JOINTS {
            t.offset[i] = joints[i].offset;
            t.direction[i] = joints[i].direction;
            t.center[i] = finishing[i].center;
            t.wraps[i] = if finishing[i].wraps { S::ONE } else { S::ZERO };
            t.low[i] = finishing[i].lo - tol;
            t.high[i] = finishing[i].hi + tol;
        }
        t
    }

    /// Joint values of model values: the lowest equivalent within the limits for joints that
    /// list equivalents (with how many there are), the wrapped value otherwise; and whether
    /// every joint has a value within its limits. The same arithmetic as
    /// [`Joint::joint_value`], [`wrap`] and [`equivalents`].
    #[inline(always)]
    fn convert(&self, model: &[S; JOINTS], tol: S) -> ([S; JOINTS], [usize; JOINTS], bool) {
        let mut values = [S::ZERO; JOINTS];
        let mut counts = [1usize; JOINTS];
        let mut inside = true;
        // Written out per joint (constant indices) so that, inlined into an emitted solver,
        // the table's constants fold into the code.
        let mut joint = |i: usize| {
            let q = (model[i] - self.offset[i]) * self.direction[i];
            if self.finishing[i].lists {
                let (v, n, _) = equivalents(&self.finishing[i], q, tol);
                values[i] = v;
                counts[i] = n;
                inside &= n > 0;
            } else {
                let turns = round_fast((q - self.center[i]) * inv_tau()) * self.wraps[i];
                let v = q - S::TAU * turns;
                values[i] = v;
                inside &= (v >= self.low[i]) & (v <= self.high[i]);
            }
        };
        joint(0);
        joint(1);
        joint(2);
        joint(3);
        joint(4);
        joint(5);
        (values, counts, inside)
    }
}

/// The joint values equivalent to `q` within the limits, as the lowest one and how many there
/// are (`lowest + k·2π`, `k < count`), and by how much the nearest one misses the limits when
/// there are none.
#[inline(always)]
fn equivalents<S: Scalar>(f: &Finishing<S>, q: S, tol: S) -> (S, usize, S) {
    let (lo, hi) = (f.lo, f.hi);
    if f.lists {
        let lowest = q - S::TAU * floor((q - lo + tol) * inv_tau());
        let above = floor((hi + tol - lowest) * inv_tau()).to_f64();
        let count = if above < 0.0 {
            0
        } else if above >= (MAX_EQUIVALENTS - 1) as f64 {
            MAX_EQUIVALENTS
        } else {
            above as usize + 1
        };
        let miss = if count == 0 { lowest - hi } else { S::ZERO };
        return (lowest, count, miss);
    }
    let v = if f.wraps { wrap(q, f.center) } else { q };
    let miss = (lo - v).max(v - hi);
    if miss > tol {
        (v, 0, miss)
    } else {
        (v, 1, S::ZERO)
    }
}

/// The largest whole number not above `x` (through rounding, so it works without `std`).
#[inline(always)]
fn floor<S: Scalar>(x: S) -> S {
    let r = round_fast(x);
    if r > x {
        r - S::ONE
    } else {
        r
    }
}

/// `acos` through `atan2` (works without `std`), argument clamped to `[−1, 1]`.
fn acos<S: Scalar>(x: S) -> S {
    let x = crate::math::clamp(x, -S::ONE, S::ONE);
    crate::math::atan2(sqrt((S::ONE - x) * (S::ONE + x)), x)
}

/// By how much (radians) the angle between axis 4 and the requested axis-6 direction misses
/// the band the wrist reaches: `z = R5 h6` keeps the angle `φ56` to `h5`, which keeps `φ45` to
/// `h4`, so the angle to `h4` lies in `[|φ45 − φ56|, min(φ45 + φ56, 2π − φ45 − φ56)]`.
fn wrist_miss<S: Scalar>(cos_angle: S, [c45, c56]: [S; 2]) -> S {
    let angle = acos(cos_angle);
    let (p45, p56) = (acos(c45), acos(c56));
    let lo = abs(p45 - p56);
    let hi = (p45 + p56).min(S::TAU - p45 - p56);
    (lo - angle).max(angle - hi).max(S::ZERO)
}

/// The first failing check of a candidate, with by how much it misses (`None` when all pass).
fn verdict<S: Scalar>(
    checks: &[Check<S>; 4],
    settings: &Settings<S>,
) -> Option<(Unreachable<S>, S)> {
    let tol = settings.length_tolerance;
    for c in checks {
        match c.kind {
            CheckKind::None => {}
            CheckKind::BeyondReach => {
                let outer = c.limit + tol;
                if c.have_squared > outer * outer {
                    let by = sqrt(c.have_squared) - c.limit;
                    return Some((Unreachable::BeyondReach { by }, by));
                }
            }
            CheckKind::InsideHole => {
                let inner = (c.limit - tol).max(S::ZERO);
                if c.have_squared < inner * inner {
                    let by = c.limit - sqrt(c.have_squared.max(S::ZERO));
                    return Some((Unreachable::InsideHole { by }, by));
                }
            }
            CheckKind::Residual => {
                if c.have_squared > tol * tol {
                    let by = sqrt(c.have_squared);
                    return Some((Unreachable::BeyondReach { by }, by));
                }
            }
            CheckKind::WristOrientation => {
                if c.have_squared < -settings.angle_tolerance {
                    let by = wrist_miss(c.limit, settings.wrist_twist_cosines);
                    return Some((Unreachable::WristOrientation { by }, by));
                }
            }
        }
    }
    None
}

/// `Some(at_limit)` when every check passes (`at_limit`: the candidate is on a reach boundary),
/// `None` otherwise: the same comparisons as [`verdict`], without working out by how much a
/// failing check misses (that is done only when no candidate is left).
#[inline(always)]
fn passes<S: Scalar>(checks: &[Check<S>; 4], settings: &Settings<S>) -> Option<bool> {
    let tol = settings.length_tolerance;
    let mut at_limit = false;
    let mut fails = false;
    for c in checks {
        match c.kind {
            CheckKind::None => {}
            CheckKind::BeyondReach => {
                let outer = c.limit + tol;
                let inner = (c.limit - tol).max(S::ZERO);
                fails |= c.have_squared > outer * outer;
                at_limit |= c.have_squared >= inner * inner;
            }
            CheckKind::InsideHole => {
                let inner = (c.limit - tol).max(S::ZERO);
                let outer = c.limit + tol;
                fails |= c.have_squared < inner * inner;
                at_limit |= (c.limit > tol) & (c.have_squared <= outer * outer);
            }
            CheckKind::Residual => {
                // A NaN residual fails too.
                fails |= !c.have_squared.is_finite() | (c.have_squared > tol * tol);
                at_limit |= c.limit <= tol;
            }
            CheckKind::WristOrientation => {
                fails |= c.have_squared < -settings.angle_tolerance;
                at_limit |= c.have_squared <= settings.angle_tolerance;
            }
        }
    }
    if fails {
        None
    } else {
        Some(at_limit)
    }
}

/// Distance between two values of one joint: wrap-aware for revolute joints with at most one
/// turn of range, plain otherwise.
#[inline]
fn joint_distance<S: Scalar>(joint: &Joint<S>, a: S, b: S, tol: S) -> S {
    let d = a - b;
    if joint.kind == JointKind::Revolute && !lists_equivalents(joint, tol) {
        abs(wrap(d, S::ZERO))
    } else {
        abs(d)
    }
}

/// Two roots of one boundary closer than this (radians or metres) are one double root: at a
/// reach boundary a rounding error ε in the cosine moves the roots by about √(2ε) ≈ 1.5e-8.
/// For `f64`; other scalars scale it with the square root of their epsilon.
pub const BOUNDARY_DUPLICATE_TOLERANCE: f64 = 1e-7;

#[inline]
fn is_duplicate<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    q: &[S; JOINTS],
    flags: Flags,
    found: &[Solution<S>],
) -> bool {
    // Branches give distinct configurations except where two roots meet at a boundary (the
    // candidates are then flagged), so only flagged candidates are compared.
    if !flags.contains(Flags::AT_REACH_LIMIT) {
        return false;
    }
    found.iter().any(|s| {
        let tolerance = if s.flags.contains(Flags::AT_REACH_LIMIT) {
            tolerance(BOUNDARY_DUPLICATE_TOLERANCE, Growth::SquareRoot)
        } else {
            settings.duplicate_tolerance
        };
        joints
            .iter()
            .zip(q.iter().zip(s.joints.iter()))
            .all(|(j, (a, b))| joint_distance(j, *a, *b, settings.limit_tolerance) < tolerance)
    })
}

/// How far through the steps a failed candidate got: a candidate whose position was
/// reachable but whose wrist was not says more than one whose position was out of reach.
#[inline]
fn stage<S: Scalar>(reason: &Unreachable<S>) -> u8 {
    match reason {
        Unreachable::WristOrientation { .. } => 1,
        _ => 0,
    }
}

/// Keeps the more telling of two failure reasons: the later stage, then the smaller miss.
#[inline]
fn keep_smaller<S: Scalar>(
    best: &mut Option<(Unreachable<S>, S)>,
    reason: Unreachable<S>,
    amount: S,
) {
    match best {
        Some((r, a)) if (stage(r), -*a) >= (stage(&reason), -amount) => {}
        _ => *best = Some((reason, amount)),
    }
}

/// Turns candidates into solutions: checks, joint values, wrapping and equivalent angles,
/// limits, duplicates, flags. Writes into `out` and returns how many were written, or the
/// reason when there are none. With `only`, candidates of other branches are skipped.
#[inline(always)]
pub fn finish<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    candidates: &[Candidate<S>],
    only: Option<Branch>,
    out: &mut [Solution<S>],
) -> Result<usize, Unreachable<S>> {
    let tol = settings.limit_tolerance;
    let table = Table::of(joints, tol);
    let mut len = 0;
    let mut matched = false;
    for c in candidates {
        if only.is_some_and(|b| b != c.branch) {
            continue;
        }
        matched = true;
        let Some(at_limit) = passes(&c.checks, settings) else {
            continue;
        };
        let (values, counts, inside) = table.convert(&c.model_values, tol);
        if !inside {
            continue;
        }
        let flags = flags_of(c, at_limit);
        len = push_combinations(
            joints, settings, &values, &counts, c.branch, flags, out, len,
        );
    }
    if len > 0 {
        return Ok(len);
    }
    if !matched {
        return Err(Unreachable::BranchUnavailable);
    }
    Err(failure(&table, settings, candidates, only))
}

/// Why no candidate became a solution (worked out only then): a joint limit before a failed
/// check, the later stage, then the smaller miss.
#[cold]
#[inline(never)]
fn failure<S: Scalar>(
    table: &Table<S>,
    settings: &Settings<S>,
    candidates: &[Candidate<S>],
    only: Option<Branch>,
) -> Unreachable<S> {
    let tol = settings.limit_tolerance;
    let mut failure: Option<(Unreachable<S>, S)> = None;
    let mut limit_failure: Option<(Unreachable<S>, S)> = None;
    for c in candidates {
        if only.is_some_and(|b| b != c.branch) {
            continue;
        }
        if let Some((reason, amount)) = verdict(&c.checks, settings) {
            keep_smaller(&mut failure, reason, amount);
            continue;
        }
        let mut worst: Option<(usize, S)> = None;
        for i in 0..JOINTS {
            let q = (c.model_values[i] - table.offset[i]) * table.direction[i];
            let (_, n, miss) = equivalents(&table.finishing[i], q, tol);
            if n == 0 && worst.map_or(true, |(_, m)| miss > m) {
                worst = Some((i, miss));
            }
        }
        if let Some((joint, by)) = worst {
            keep_smaller(
                &mut limit_failure,
                Unreachable::OutsideLimits { joint, by },
                by,
            );
        }
    }
    match limit_failure.or(failure) {
        Some((reason, _)) => reason,
        None => Unreachable::BranchUnavailable,
    }
}

/// Writes every combination of equivalent values (an odometer over the joints: the first
/// joint turns fastest).
#[allow(clippy::too_many_arguments)]
#[inline(always)]
fn push_combinations<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    lowest: &[S; JOINTS],
    counts: &[usize; JOINTS],
    branch: Branch,
    flags: Flags,
    out: &mut [Solution<S>],
    mut len: usize,
) -> usize {
    let total: usize = counts.iter().product();
    if total == 1 {
        // One value per joint (the common case): no odometer.
        let found = out.get(..len).unwrap_or(&[]);
        if !is_duplicate(joints, settings, lowest, flags, found) {
            if let Some(slot) = out.get_mut(len) {
                *slot = Solution {
                    joints: *lowest,
                    branch,
                    flags,
                };
                len += 1;
            }
        }
        return len;
    }
    let mut turns = [0usize; JOINTS];
    for _ in 0..total {
        let mut q = *lowest;
        for ((v, k), n) in q.iter_mut().zip(turns.iter()).zip(counts.iter()) {
            if *n > 1 {
                *v += S::TAU * S::of(*k as f64);
            }
        }
        let found = out.get(..len).unwrap_or(&[]);
        if !is_duplicate(joints, settings, &q, flags, found) {
            if let Some(slot) = out.get_mut(len) {
                *slot = Solution {
                    joints: q,
                    branch,
                    flags,
                };
                len += 1;
            }
        }
        for (k, n) in turns.iter_mut().zip(counts.iter()) {
            *k += 1;
            if *k < *n {
                break;
            }
            *k = 0;
        }
    }
    len
}

/// [`finish`] into a fixed-capacity set.
#[inline]
pub fn collect<const CAP: usize, S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    candidates: &[Candidate<S>],
) -> SolutionSet<CAP, S> {
    let mut set = SolutionSet::empty();
    let outcome = finish(joints, settings, candidates, None, set.storage_mut());
    set.record(outcome);
    set
}

/// Sum of squared joint distances (wrap-aware for revolute joints with at most one turn of
/// range).
#[inline]
fn distance<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    a: &[S; JOINTS],
    b: &[S; JOINTS],
) -> S {
    let mut d = S::ZERO;
    for i in 0..JOINTS {
        let e = joint_distance(&joints[i], a[i], b[i], settings.limit_tolerance);
        d += e * e;
    }
    d
}

/// The solution nearest to `current` (see [`distance`]).
#[inline]
pub fn nearest<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    solutions: &[Solution<S>],
    current: &[S; JOINTS],
) -> Option<Solution<S>> {
    let mut best: Option<(S, Solution<S>)> = None;
    for s in solutions {
        let d = distance(joints, settings, &s.joints, current);
        if best.map_or(true, |(b, _)| d < b) {
            best = Some((d, *s));
        }
    }
    best.map(|(_, s)| s)
}

/// The values each joint is wrapped toward by `solve_branch` and `solve`: the centers of the
/// ranges (zero for an unlimited joint). Among equivalent angles of a joint whose range
/// exceeds a turn, the one nearest the center is the one within half a turn of it.
#[inline(always)]
pub fn centers<S: Scalar>(joints: &[Joint<S>; JOINTS]) -> [S; JOINTS] {
    let mut out = [S::ZERO; JOINTS];
    for (c, j) in out.iter_mut().zip(joints.iter()) {
        *c = Finishing::of(j, S::ZERO).center;
    }
    out
}

/// The values each joint is wrapped toward by `solve_near`: for a revolute joint whose range
/// exceeds a turn, `current` clamped to `[lo + π, hi − π]` (so the equivalent within half a
/// turn of it is the in-range one nearest `current`); otherwise the range's center. A
/// non-finite `current` counts as the center.
#[inline(always)]
pub fn anchors_near<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    current: &[S; JOINTS],
    tol: S,
) -> [S; JOINTS] {
    let mut out = [S::ZERO; JOINTS];
    for ((a, j), q) in out.iter_mut().zip(joints.iter()).zip(current.iter()) {
        let f = Finishing::of(j, tol);
        *a = if f.lists && q.is_finite() {
            crate::math::clamp(*q, f.lo + S::PI, f.hi - S::PI)
        } else {
            f.center
        };
    }
    out
}

/// One candidate finished: its checks, its joint values (each revolute value the equivalent
/// within half a turn of `anchor`), the limits, its flags; or why it is not a solution.
///
/// Written for constant tables: inlined into an emitted solver with `JOINT_TABLE` and
/// `SETTINGS`, every offset, direction, center and limit folds into the code, the per-joint
/// loop unrolls and the revolute/prismatic choice disappears.
#[inline(always)]
pub fn finish_one<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    c: &Candidate<S>,
    anchor: &[S; JOINTS],
) -> Result<Solution<S>, Unreachable<S>> {
    let Some(at_limit) = passes(&c.checks, settings) else {
        return Err(failure_of_one(joints, settings, c));
    };
    let tol = settings.limit_tolerance;
    let mut values = [S::ZERO; JOINTS];
    let mut inside = true;
    for i in 0..JOINTS {
        let j = &joints[i];
        let q = (c.model_values[i] - j.offset) * j.direction;
        let v = if j.kind == JointKind::Revolute {
            wrap(q, anchor[i])
        } else {
            q
        };
        values[i] = v;
        inside &= (v >= j.limits[0] - tol) & (v <= j.limits[1] + tol);
    }
    if !inside {
        return Err(failure_of_one(joints, settings, c));
    }
    Ok(Solution {
        joints: values,
        branch: c.branch,
        flags: flags_of(c, at_limit),
    })
}

/// The flags of a candidate that passed its checks.
#[inline(always)]
fn flags_of<S: Scalar>(c: &Candidate<S>, at_limit: bool) -> Flags {
    let mut flags = Flags::NONE;
    if c.wrist_aligned {
        flags = flags.union(Flags::WRIST_ALIGNED);
    }
    if c.on_axis_1 {
        flags = flags.union(Flags::ON_AXIS_1);
    }
    if at_limit {
        flags = flags.union(Flags::AT_REACH_LIMIT);
    }
    flags
}

/// Why one candidate is not a solution (worked out only then).
#[cold]
#[inline(never)]
fn failure_of_one<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    c: &Candidate<S>,
) -> Unreachable<S> {
    let table = Table::of(joints, settings.limit_tolerance);
    failure(&table, settings, core::slice::from_ref(c), None)
}

/// Of every candidate, the solution nearest `current` (sum of squared joint distances,
/// wrap-aware for revolute joints with at most one turn of range), each finished toward
/// `anchor` (see [`anchors_near`]); or why there is none.
pub fn nearest_candidate<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    candidates: &[Candidate<S>],
    current: &[S; JOINTS],
    anchor: &[S; JOINTS],
) -> Result<Solution<S>, Unreachable<S>> {
    let mut best: Option<(S, Solution<S>)> = None;
    for c in candidates {
        let Ok(s) = finish_one(joints, settings, c, anchor) else {
            continue;
        };
        let d = distance(joints, settings, &s.joints, current);
        if best.map_or(true, |(b, _)| d < b) {
            best = Some((d, s));
        }
    }
    match best {
        Some((_, s)) => Ok(s),
        None if candidates.is_empty() => Err(Unreachable::BranchUnavailable),
        None => Err(failure(
            &Table::of(joints, settings.limit_tolerance),
            settings,
            candidates,
            None,
        )),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use core::f64::consts::{PI, TAU};

    fn revolute(limits: [f64; 2]) -> Joint {
        Joint {
            kind: JointKind::Revolute,
            axis: [0.0, 0.0, 1.0],
            point: [0.0; 3],
            direction: 1.0,
            offset: 0.0,
            limits,
        }
    }

    #[test]
    fn two_turn_range_lists_two_equivalents() {
        let j = revolute([-TAU, TAU]);
        assert_eq!(equivalent_count(&j, 1e-12), 3);
        let (lowest, n, _) = equivalents(&Finishing::of(&j, 1e-12), 0.5, 1e-12);
        assert_eq!(n, 2);
        assert!((lowest - (0.5 - TAU)).abs() < 1e-12);
        let one_turn = revolute([-PI, PI]);
        assert_eq!(equivalent_count(&one_turn, 1e-12), 1);
        let (v, n, _) = equivalents(&Finishing::of(&one_turn, 1e-12), PI + 0.25, 1e-12);
        assert_eq!(n, 1);
        assert!((v - (0.25 - PI)).abs() < 1e-12);
    }

    #[test]
    fn outside_limits_reports_the_miss() {
        let j = revolute([-1.0, 1.0]);
        let (_, n, miss) = equivalents(&Finishing::of(&j, 1e-12), 1.5, 1e-12);
        assert_eq!(n, 0);
        assert!((miss - 0.5).abs() < 1e-12);
    }
}
