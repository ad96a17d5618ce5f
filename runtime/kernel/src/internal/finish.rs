//! Finishing: candidates straight out of the closed-form steps become solutions. Model values
//! become joint values (each revolute value wrapped by whole turns toward an anchor: the
//! range's center for `solve` and `solve_branch`, near `current` for `solve_near`), the reach
//! and wrist checks and the limits are applied, double roots at a boundary are returned once,
//! flags are set, and the reason is worked out when nothing is left.
//!
//! One value per joint and branch: a joint whose range exceeds a turn holds the equivalent
//! angle nearest its range's center (within half a turn of it, so always inside the range);
//! the other in-range values are listed lazily by [`crate::Solution::equivalents`].

use super::{wrap, Candidate, Check, CheckKind, Settings};
use crate::math::{abs, sqrt, tolerance, Growth, Scalar};
use crate::model::{Joint, JointKind};
use crate::solution::{Branch, Flags, Solution, SolutionSet, Unreachable, JOINTS};

/// True when a revolute joint's range is wider than one turn (it has equivalent angles
/// within its limits).
#[inline(always)]
pub fn exceeds_a_turn<S: Scalar>(joint: &Joint<S>, tolerance: S) -> bool {
    let [lo, hi] = joint.limits;
    joint.kind == JointKind::Revolute
        && lo.is_finite()
        && hi.is_finite()
        && hi - lo > S::TAU + tolerance
}

/// The center of a joint's range (zero for an unlimited joint).
#[inline(always)]
fn center_of<S: Scalar>(joint: &Joint<S>) -> S {
    let [lo, hi] = joint.limits;
    if lo.is_finite() && hi.is_finite() {
        S::of(0.5) * (lo + hi)
    } else {
        S::ZERO
    }
}

/// The joint value of a model value: `(m − offset) · direction`, for a revolute joint wrapped
/// by whole turns into `[anchor − π, anchor + π]`.
#[inline(always)]
fn joint_value<S: Scalar>(joint: &Joint<S>, model: S, anchor: S) -> S {
    let q = (model - joint.offset) * joint.direction;
    if joint.kind == JointKind::Revolute {
        wrap(q, anchor)
    } else {
        q
    }
}

/// Joint values of model values (each revolute value toward its anchor), and whether every
/// joint is within its limits.
#[inline(always)]
fn convert<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    model: &[S; JOINTS],
    anchor: &[S; JOINTS],
    tol: S,
) -> ([S; JOINTS], bool) {
    let mut values = [S::ZERO; JOINTS];
    let mut inside = true;
    for i in 0..JOINTS {
        let j = &joints[i];
        let v = joint_value(j, model[i], anchor[i]);
        values[i] = v;
        inside &= (v >= j.limits[0] - tol) & (v <= j.limits[1] + tol);
    }
    (values, inside)
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
pub(crate) fn passes<S: Scalar>(checks: &[Check<S>; 4], settings: &Settings<S>) -> Option<bool> {
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
/// turn of range, plain otherwise (values whole turns apart are different positions of a
/// joint whose range exceeds a turn).
#[inline]
fn joint_distance<S: Scalar>(joint: &Joint<S>, a: S, b: S, tol: S) -> S {
    let d = a - b;
    if joint.kind == JointKind::Revolute && !exceeds_a_turn(joint, tol) {
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

/// Turns candidates into solutions: checks, joint values (each revolute joint at the value
/// nearest its range's center), limits, duplicates, flags. Writes into `out` and returns how
/// many were written, or the reason when there are none. With `only`, candidates of other
/// branches are skipped.
#[inline(always)]
pub fn finish<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    candidates: &[Candidate<S>],
    only: Option<Branch>,
    out: &mut [Solution<S>],
) -> Result<usize, Unreachable<S>> {
    let tol = settings.limit_tolerance;
    let anchor = centers(joints);
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
        let (values, inside) = convert(joints, &c.model_values, &anchor, tol);
        if !inside {
            continue;
        }
        let flags = flags_of(c, at_limit);
        let found = out.get(..len).unwrap_or(&[]);
        if is_duplicate(joints, settings, &values, flags, found) {
            continue;
        }
        if let Some(slot) = out.get_mut(len) {
            *slot = Solution {
                joints: values,
                branch: c.branch,
                flags,
            };
            len += 1;
        }
    }
    if len > 0 {
        return Ok(len);
    }
    if !matched {
        return Err(Unreachable::BranchUnavailable);
    }
    Err(failure(joints, settings, candidates, only))
}

/// Why no candidate became a solution (worked out only then): a joint limit before a failed
/// check, the later stage, then the smaller miss.
#[cold]
#[inline(never)]
pub fn failure<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    candidates: &[Candidate<S>],
    only: Option<Branch>,
) -> Unreachable<S> {
    let tol = settings.limit_tolerance;
    let anchor = centers(joints);
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
            let j = &joints[i];
            let v = joint_value(j, c.model_values[i], anchor[i]);
            let miss = (j.limits[0] - v).max(v - j.limits[1]);
            if miss > tol && worst.map_or(true, |(_, m)| miss > m) {
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

/// A solution set filled one candidate at a time, for emitted solvers: each
/// [`Collector::add`] is written out with a constant candidate index, so that, inlined with
/// the module's joint table and settings, the candidate's check kinds, joint offsets,
/// directions, centers and limits fold into straight-line code (no loop over candidates).
pub struct Collector<const CAP: usize, S: Scalar> {
    set: SolutionSet<CAP, S>,
    len: usize,
}

impl<const CAP: usize, S: Scalar> Collector<CAP, S> {
    /// An empty collector.
    #[inline(always)]
    pub fn new() -> Self {
        Collector {
            set: SolutionSet::empty(),
            len: 0,
        }
    }

    /// Finishes one candidate (as [`finish`] does: checks, joint values nearest the range
    /// centers, limits, duplicates, flags) and keeps it when it is a solution.
    #[inline(always)]
    pub fn add(&mut self, joints: &[Joint<S>; JOINTS], settings: &Settings<S>, c: &Candidate<S>) {
        let Some(at_limit) = passes(&c.checks, settings) else {
            return;
        };
        let anchor = centers(joints);
        let (values, inside) = convert(joints, &c.model_values, &anchor, settings.limit_tolerance);
        if !inside {
            return;
        }
        let flags = flags_of(c, at_limit);
        let storage = self.set.storage_mut();
        let found = storage.get(..self.len).unwrap_or(&[]);
        if is_duplicate(joints, settings, &values, flags, found) {
            return;
        }
        if let Some(slot) = storage.get_mut(self.len) {
            *slot = Solution {
                joints: values,
                branch: c.branch,
                flags,
            };
            self.len += 1;
        }
    }

    /// True while no candidate has been kept.
    #[inline(always)]
    pub fn is_empty(&self) -> bool {
        self.len == 0
    }

    /// The set; when nothing was kept, the reason worked out from every candidate.
    #[inline(always)]
    pub fn finish(
        mut self,
        joints: &[Joint<S>; JOINTS],
        settings: &Settings<S>,
        candidates: &[Candidate<S>],
    ) -> SolutionSet<CAP, S> {
        let outcome = if self.len > 0 {
            Ok(self.len)
        } else if candidates.is_empty() {
            Err(Unreachable::BranchUnavailable)
        } else {
            Err(failure(joints, settings, candidates, None))
        };
        self.set.record(outcome);
        self.set
    }
}

impl<const CAP: usize, S: Scalar> Default for Collector<CAP, S> {
    fn default() -> Self {
        Self::new()
    }
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

/// The values each joint is wrapped toward by `solve` and `solve_branch`: the centers of the
/// ranges (zero for an unlimited joint). Of the equivalent angles of a joint whose range
/// exceeds a turn, the one nearest the center is the one within half a turn of it, and it is
/// always inside the range.
#[inline(always)]
pub fn centers<S: Scalar>(joints: &[Joint<S>; JOINTS]) -> [S; JOINTS] {
    let mut out = [S::ZERO; JOINTS];
    for (c, j) in out.iter_mut().zip(joints.iter()) {
        *c = center_of(j);
    }
    out
}

/// The values each joint is wrapped toward by `solve_near`: for a revolute joint whose range
/// exceeds a turn, `current` clamped to `[lo + π, hi − π]` (so the equivalent within half a
/// turn of it is the in-range one nearest `current`, and `current` itself when it is in
/// range); otherwise the range's center. A non-finite `current` counts as the center.
#[inline(always)]
pub fn anchors_near<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    current: &[S; JOINTS],
    tol: S,
) -> [S; JOINTS] {
    let mut out = [S::ZERO; JOINTS];
    for ((a, j), q) in out.iter_mut().zip(joints.iter()).zip(current.iter()) {
        let [lo, hi] = j.limits;
        *a = if exceeds_a_turn(j, tol) && q.is_finite() {
            crate::math::clamp(*q, lo + S::PI, hi - S::PI)
        } else {
            center_of(j)
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
    solution_of(joints, settings, c, anchor).ok_or_else(|| failure_of_one(joints, settings, c))
}

/// [`finish_one`] without the reason: `None` when the candidate is not a solution.
#[inline(always)]
fn solution_of<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    c: &Candidate<S>,
    anchor: &[S; JOINTS],
) -> Option<Solution<S>> {
    let at_limit = passes(&c.checks, settings)?;
    let (values, inside) = convert(joints, &c.model_values, anchor, settings.limit_tolerance);
    inside.then(|| Solution {
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
    failure(joints, settings, core::slice::from_ref(c), None)
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
        // The reason is worked out once, from every candidate, only when none is left.
        let Some(s) = solution_of(joints, settings, c, anchor) else {
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
        None => Err(failure(joints, settings, candidates, None)),
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
    fn a_range_over_a_turn_holds_the_value_nearest_its_center() {
        let j = revolute([-TAU, 3.0 * TAU]);
        assert!(exceeds_a_turn(&j, 1e-12));
        // The center is at one turn: 0.5 is held as 0.5 + 2π.
        assert!((joint_value(&j, 0.5, center_of(&j)) - (0.5 + TAU)).abs() < 1e-12);
        let one_turn = revolute([-PI, PI]);
        assert!(!exceeds_a_turn(&one_turn, 1e-12));
        assert!((joint_value(&one_turn, PI + 0.25, 0.0) - (0.25 - PI)).abs() < 1e-12);
    }

    #[test]
    fn outside_limits_reports_the_miss() {
        let mut joints = [revolute([-PI, PI]); JOINTS];
        joints[2] = revolute([-1.0, 1.0]);
        let settings = Settings {
            length_tolerance: 1e-10,
            angle_tolerance: 1e-18,
            limit_tolerance: 1e-12,
            duplicate_tolerance: 1e-10,
            wrist_twist_cosines: [0.0, 0.0],
        };
        let mut model_values = [0.0; JOINTS];
        model_values[2] = 1.5;
        let c = Candidate {
            model_values,
            branch: Solution::<f64>::EMPTY.branch,
            checks: [Check::NONE; 4],
            wrist_aligned: false,
            on_axis_1: false,
        };
        match finish_one(&joints, &settings, &c, &centers(&joints)) {
            Err(Unreachable::OutsideLimits { joint: 2, by }) => assert!((by - 0.5).abs() < 1e-12),
            other => panic!("expected joint 3 outside its limits, got {other:?}"),
        }
    }
}
