//! Not for users: the support code that armforge-emitted solvers and the armforge interpreter
//! call. Its items may change in any release; use the emitted module's functions or the
//! compiler's `Solver` instead.
//!
//! Everything that both back ends of a plan need after the closed-form steps lives here, so
//! that no formula is written twice: turning model values into joint values, wrapping revolute
//! values into their limits, listing equivalent angles, dropping candidates outside the limits,
//! returning double roots once, flags, and the reason when nothing is left.

use core::f64::consts::{PI, TAU};

use crate::fk::joint_motion;
use crate::math::{abs, cross, dot, rotation_tolerance, round, sin_cos, sqrt, sub, Scalar};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;
use crate::solution::{
    Branch, Elbow, Flags, PoseProblem, Shoulder, Solution, SolutionSet, Unreachable, Wrist, JOINTS,
};

/// At most this many equivalent angles are listed for one revolute joint (a range of up to
/// seven turns); wider ranges list the first ones from the lower limit.
pub const MAX_EQUIVALENTS: usize = 8;

/// What a [`Check`] guards.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum CheckKind {
    /// Unused slot.
    None,
    /// Real when `have_squared ≤ limit²`; otherwise beyond reach by `√have − limit` metres.
    BeyondReach,
    /// Real when `have_squared ≥ limit²`; otherwise inside the hole by `limit − √have` metres.
    InsideHole,
    /// Real when `have_squared ≥ 0` (`γ² |h4 × h5|²` of Paden–Kahan subproblem 2, negative
    /// when the two cones miss each other); `limit` is `h4 · v`, the cosine of the angle
    /// between axis 4 and the requested direction of axis 6 after joints 1–3.
    WristOrientation,
}

/// A condition for a candidate to be a real solution.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Check {
    /// What is checked.
    pub kind: CheckKind,
    /// The squared quantity (see [`CheckKind`]).
    pub have_squared: f64,
    /// Its limit (metres, not squared).
    pub limit: f64,
}

impl Check {
    /// An unused check.
    pub const NONE: Check = Check {
        kind: CheckKind::None,
        have_squared: 0.0,
        limit: 0.0,
    };
}

/// One candidate solution straight out of the closed-form steps, in model values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Candidate {
    /// Model values (radians or metres) of the six joints.
    pub model_values: [f64; JOINTS],
    /// The branch the candidate belongs to.
    pub branch: Branch,
    /// Conditions for the candidate to be real.
    pub checks: [Check; 4],
    /// Joint 5 at the aligned position (joint 4 taken from the reference).
    pub wrist_aligned: bool,
    /// The wrist center on axis 1 (joint 1 taken from the reference).
    pub on_axis_1: bool,
}

/// Tolerances of one arm's solver.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Settings {
    /// A target this close to a reach boundary (metres) counts as on it.
    pub length_tolerance: f64,
    /// A wrist cone gap this small (radians, squared sine) counts as closed.
    pub angle_tolerance: f64,
    /// Joint values this far beyond a limit (radians or metres) still count as within it.
    pub limit_tolerance: f64,
    /// Two solutions closer than this in every joint are one.
    pub duplicate_tolerance: f64,
    /// `h4 · h5` and `h5 · h6`: the wrist's twist cosines, to say by how much an orientation
    /// misses what the wrist reaches.
    pub wrist_twist_cosines: [f64; 2],
}

/// Checks that a target pose is finite with a proper orthonormal rotation (within
/// [`rotation_tolerance`]: 1e-6 for `f64`, about 7.6e-6 for `f32`).
#[inline]
pub fn check_pose<S: Scalar>(target: &Pose<S>) -> Result<(), Unreachable<S>> {
    if !target.is_finite() {
        return Err(Unreachable::InvalidPose(PoseProblem::NotFinite));
    }
    let r = &target.rotation;
    let mut error = S::ZERO;
    for i in 0..3 {
        for j in 0..3 {
            let g = r[0][i] * r[0][j] + r[1][i] * r[1][j] + r[2][i] * r[2][j];
            let want = if i == j { S::ONE } else { S::ZERO };
            error = error.max(abs(g - want));
        }
    }
    if error > rotation_tolerance() {
        return Err(Unreachable::InvalidPose(PoseProblem::NotOrthonormal {
            error,
        }));
    }
    let det = dot(&r[0], &cross(&r[1], &r[2]));
    if det < S::ZERO {
        return Err(Unreachable::InvalidPose(PoseProblem::Reflection));
    }
    Ok(())
}

/// The plan's reference inputs for the current joint values: cosine and sine of the model
/// values of joints 1 and 4 (a non-finite value counts as zero).
pub fn reference(joints: &[Joint; JOINTS], current: &[f64; JOINTS]) -> [f64; 4] {
    reference_of(joints, current, [0, 3])
}

/// The plan's reference inputs for the current joint values when the free joints are `free`
/// (0-based): joints 1 and 4 for an arm that decouples at its wrist, others for families that
/// hold other joints at their singularities (a non-finite value counts as zero).
pub fn reference_of(
    joints: &[Joint; JOINTS],
    current: &[f64; JOINTS],
    free: [usize; 2],
) -> [f64; 4] {
    let model = |i: usize| {
        let i = i.min(JOINTS - 1);
        let q = current[i];
        joints[i].model_value(if q.is_finite() { q } else { 0.0 })
    };
    let (s1, c1) = sin_cos(model(free[0]));
    let (s4, c4) = sin_cos(model(free[1]));
    [c1, s1, c4, s4]
}

/// `1 / 2π`.
const INV_TAU: f64 = 1.0 / TAU;

/// `1.5 · 2^52`: adding and subtracting it rounds a double of magnitude below `2^51` to the
/// nearest whole number (ties to even) with two additions, no call and no branch.
const ROUNDER: f64 = 6_755_399_441_055_744.0;

/// `x` rounded to a whole number, branch-free (falls back to `round` beyond `2^51`).
#[inline(always)]
fn round_fast(x: f64) -> f64 {
    if abs(x) < 2_251_799_813_685_248.0 {
        (x + ROUNDER) - ROUNDER
    } else {
        round(x)
    }
}

/// `x` wrapped by whole turns into `[center − π, center + π]`, without data-dependent branches.
#[inline]
pub fn wrap(x: f64, center: f64) -> f64 {
    x - TAU * round_fast((x - center) * INV_TAU)
}

/// True when a revolute joint's range is wider than one turn (equivalent angles are listed).
#[inline(always)]
pub fn lists_equivalents(joint: &Joint, tolerance: f64) -> bool {
    joint.kind == JointKind::Revolute
        && joint.limits[0].is_finite()
        && joint.limits[1].is_finite()
        && joint.limits[1] - joint.limits[0] > TAU + tolerance
}

/// How many equivalent values of one joint can be within its limits (1 unless the joint is
/// revolute with a range wider than one turn). Generators use this for the set's capacity.
pub fn equivalent_count(joint: &Joint, tolerance: f64) -> usize {
    if !lists_equivalents(joint, tolerance) {
        return 1;
    }
    let turns = (joint.limits[1] - joint.limits[0] + 2.0 * tolerance) / TAU;
    let mut n = 1;
    while n < MAX_EQUIVALENTS && (n as f64) <= turns {
        n += 1;
    }
    n
}

/// How one joint's values are finished, worked out once per solve.
#[derive(Clone, Copy)]
struct Finishing {
    /// Revolute with more than one turn of range: list equivalent angles from `lo`.
    lists: bool,
    /// Revolute with at most one turn: wrap around `center`.
    wraps: bool,
    center: f64,
    lo: f64,
    hi: f64,
}

impl Finishing {
    const NONE: Finishing = Finishing {
        lists: false,
        wraps: false,
        center: 0.0,
        lo: 0.0,
        hi: 0.0,
    };

    #[inline(always)]
    fn of(joint: &Joint, tol: f64) -> Finishing {
        let [lo, hi] = joint.limits;
        let lists = lists_equivalents(joint, tol);
        Finishing {
            lists,
            wraps: joint.kind == JointKind::Revolute && !lists,
            center: if lo.is_finite() && hi.is_finite() {
                0.5 * (lo + hi)
            } else {
                0.0
            },
            lo,
            hi,
        }
    }
}

/// The per-joint constants of the conversion, worked out once per solve.
struct Table {
    finishing: [Finishing; JOINTS],
    offset: [f64; JOINTS],
    direction: [f64; JOINTS],
    center: [f64; JOINTS],
    /// `1.0` for joints that wrap, `0.0` otherwise.
    wraps: [f64; JOINTS],
    low: [f64; JOINTS],
    high: [f64; JOINTS],
}

impl Table {
    #[inline(always)]
    fn of(joints: &[Joint; JOINTS], tol: f64) -> Table {
        let mut finishing = [Finishing::NONE; JOINTS];
        for (f, j) in finishing.iter_mut().zip(joints.iter()) {
            *f = Finishing::of(j, tol);
        }
        let mut t = Table {
            finishing,
            offset: [0.0; JOINTS],
            direction: [0.0; JOINTS],
            center: [0.0; JOINTS],
            wraps: [0.0; JOINTS],
            low: [0.0; JOINTS],
            high: [0.0; JOINTS],
        };
        for i in 0..JOINTS {
            t.offset[i] = joints[i].offset;
            t.direction[i] = joints[i].direction;
            t.center[i] = finishing[i].center;
            t.wraps[i] = if finishing[i].wraps { 1.0 } else { 0.0 };
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
    fn convert(&self, model: &[f64; JOINTS], tol: f64) -> ([f64; JOINTS], [usize; JOINTS], bool) {
        let mut values = [0.0; JOINTS];
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
                let turns = round_fast((q - self.center[i]) * INV_TAU) * self.wraps[i];
                let v = q - TAU * turns;
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
fn equivalents(f: &Finishing, q: f64, tol: f64) -> (f64, usize, f64) {
    let (lo, hi) = (f.lo, f.hi);
    if f.lists {
        let lowest = q - TAU * floor((q - lo + tol) * INV_TAU);
        let above = floor((hi + tol - lowest) * INV_TAU);
        let count = if above < 0.0 {
            0
        } else if above >= (MAX_EQUIVALENTS - 1) as f64 {
            MAX_EQUIVALENTS
        } else {
            above as usize + 1
        };
        let miss = if count == 0 { lowest - hi } else { 0.0 };
        return (lowest, count, miss);
    }
    let v = if f.wraps { wrap(q, f.center) } else { q };
    let miss = (lo - v).max(v - hi);
    if miss > tol {
        (v, 0, miss)
    } else {
        (v, 1, 0.0)
    }
}

/// The largest whole number not above `x` (through rounding, so it works without `std`).
#[inline(always)]
fn floor(x: f64) -> f64 {
    let r = round_fast(x);
    if r > x {
        r - 1.0
    } else {
        r
    }
}

/// `acos` through `atan2` (works without `std`), argument clamped to `[−1, 1]`.
fn acos(x: f64) -> f64 {
    let x = crate::math::clamp(x, -1.0, 1.0);
    crate::math::atan2(sqrt((1.0 - x) * (1.0 + x)), x)
}

/// By how much (radians) the angle between axis 4 and the requested axis-6 direction misses
/// the band the wrist reaches: `z = R5 h6` keeps the angle `φ56` to `h5`, which keeps `φ45` to
/// `h4`, so the angle to `h4` lies in `[|φ45 − φ56|, min(φ45 + φ56, 2π − φ45 − φ56)]`.
fn wrist_miss(cos_angle: f64, [c45, c56]: [f64; 2]) -> f64 {
    let angle = acos(cos_angle);
    let (p45, p56) = (acos(c45), acos(c56));
    let lo = abs(p45 - p56);
    let hi = (p45 + p56).min(TAU - p45 - p56);
    (lo - angle).max(angle - hi).max(0.0)
}

/// The first failing check of a candidate, with by how much it misses (`None` when all pass).
fn verdict(checks: &[Check; 4], settings: &Settings) -> Option<(Unreachable, f64)> {
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
                let inner = (c.limit - tol).max(0.0);
                if c.have_squared < inner * inner {
                    let by = c.limit - sqrt(c.have_squared.max(0.0));
                    return Some((Unreachable::InsideHole { by }, by));
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
fn passes(checks: &[Check; 4], settings: &Settings) -> Option<bool> {
    let tol = settings.length_tolerance;
    let mut at_limit = false;
    let mut fails = false;
    for c in checks {
        match c.kind {
            CheckKind::None => {}
            CheckKind::BeyondReach => {
                let outer = c.limit + tol;
                let inner = (c.limit - tol).max(0.0);
                fails |= c.have_squared > outer * outer;
                at_limit |= c.have_squared >= inner * inner;
            }
            CheckKind::InsideHole => {
                let inner = (c.limit - tol).max(0.0);
                let outer = c.limit + tol;
                fails |= c.have_squared < inner * inner;
                at_limit |= (c.limit > tol) & (c.have_squared <= outer * outer);
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
fn joint_distance(joint: &Joint, a: f64, b: f64, tol: f64) -> f64 {
    let d = a - b;
    if joint.kind == JointKind::Revolute && !lists_equivalents(joint, tol) {
        abs(wrap(d, 0.0))
    } else {
        abs(d)
    }
}

/// Two roots of one boundary closer than this (radians or metres) are one double root: at a
/// reach boundary a rounding error ε in the cosine moves the roots by about √(2ε) ≈ 1.5e-8.
pub const BOUNDARY_DUPLICATE_TOLERANCE: f64 = 1e-7;

#[inline]
fn is_duplicate(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    q: &[f64; JOINTS],
    flags: Flags,
    found: &[Solution],
) -> bool {
    // Branches give distinct configurations except where two roots meet at a boundary (the
    // candidates are then flagged), so only flagged candidates are compared.
    if !flags.contains(Flags::AT_REACH_LIMIT) {
        return false;
    }
    found.iter().any(|s| {
        let tolerance = if s.flags.contains(Flags::AT_REACH_LIMIT) {
            BOUNDARY_DUPLICATE_TOLERANCE
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
fn stage(reason: &Unreachable) -> u8 {
    match reason {
        Unreachable::WristOrientation { .. } => 1,
        _ => 0,
    }
}

/// Keeps the more telling of two failure reasons: the later stage, then the smaller miss.
#[inline]
fn keep_smaller(best: &mut Option<(Unreachable, f64)>, reason: Unreachable, amount: f64) {
    match best {
        Some((r, a)) if (stage(r), -*a) >= (stage(&reason), -amount) => {}
        _ => *best = Some((reason, amount)),
    }
}

/// Turns candidates into solutions: checks, joint values, wrapping and equivalent angles,
/// limits, duplicates, flags. Writes into `out` and returns how many were written, or the
/// reason when there are none. With `only`, candidates of other branches are skipped.
#[inline(always)]
pub fn finish(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    candidates: &[Candidate],
    only: Option<Branch>,
    out: &mut [Solution],
) -> Result<usize, Unreachable> {
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
fn failure(
    table: &Table,
    settings: &Settings,
    candidates: &[Candidate],
    only: Option<Branch>,
) -> Unreachable {
    let tol = settings.limit_tolerance;
    let mut failure: Option<(Unreachable, f64)> = None;
    let mut limit_failure: Option<(Unreachable, f64)> = None;
    for c in candidates {
        if only.is_some_and(|b| b != c.branch) {
            continue;
        }
        if let Some((reason, amount)) = verdict(&c.checks, settings) {
            keep_smaller(&mut failure, reason, amount);
            continue;
        }
        let mut worst: Option<(usize, f64)> = None;
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
fn push_combinations(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    lowest: &[f64; JOINTS],
    counts: &[usize; JOINTS],
    branch: Branch,
    flags: Flags,
    out: &mut [Solution],
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
                *v += TAU * *k as f64;
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
pub fn collect<const CAP: usize>(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    candidates: &[Candidate],
) -> SolutionSet<CAP> {
    let mut set = SolutionSet::empty();
    let outcome = finish(joints, settings, candidates, None, set.storage_mut());
    set.record(outcome);
    set
}

/// The first solution of one branch (the one nearest the joints' range centers comes first
/// among equivalent angles is not guaranteed; the first listed is returned).
#[inline]
pub fn first_of_branch<const CAP: usize>(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    candidates: &[Candidate],
    branch: Branch,
) -> Result<Solution, Unreachable> {
    let mut storage = [Solution::EMPTY; CAP];
    let len = finish(joints, settings, candidates, Some(branch), &mut storage)?;
    nearest_to_center(joints, settings, storage.get(..len).unwrap_or(&[]))
        .ok_or(Unreachable::BranchUnavailable)
}

/// Of several solutions, the one whose joints are closest to the centers of their ranges
/// (a controller's natural pick among equivalent angles).
fn nearest_to_center(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    solutions: &[Solution],
) -> Option<Solution> {
    let mut center = [0.0; JOINTS];
    for (c, j) in center.iter_mut().zip(joints.iter()) {
        let [lo, hi] = j.limits;
        if lo.is_finite() && hi.is_finite() {
            *c = 0.5 * (lo + hi);
        }
    }
    nearest(joints, settings, solutions, &center)
}

/// The solution nearest to `current` (sum of squared joint distances, wrap-aware for revolute
/// joints with at most one turn of range).
#[inline]
pub fn nearest(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    solutions: &[Solution],
    current: &[f64; JOINTS],
) -> Option<Solution> {
    let mut best: Option<(f64, Solution)> = None;
    for s in solutions {
        let mut d = 0.0;
        for i in 0..JOINTS {
            let e = joint_distance(
                &joints[i],
                s.joints[i],
                current[i],
                settings.limit_tolerance,
            );
            d += e * e;
        }
        if best.map_or(true, |(b, _)| d < b) {
            best = Some((d, *s));
        }
    }
    best.map(|(_, s)| s)
}

/// The solution nearest to `current` among all solutions of a target, or the reason.
#[inline]
pub fn near<const CAP: usize>(
    joints: &[Joint; JOINTS],
    settings: &Settings,
    candidates: &[Candidate],
    current: &[f64; JOINTS],
) -> Result<Solution, Unreachable> {
    let set = collect::<CAP>(joints, settings, candidates);
    if let Some(reason) = set.reason() {
        return Err(reason);
    }
    nearest(joints, settings, set.as_slice(), current).ok_or(Unreachable::BranchUnavailable)
}

/// How the shoulder label is read from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ShoulderRule {
    /// Elbow and polar arms: the sign of `normal · (E2 E3 c − point)`; `Front` when it equals
    /// `front` (`±1`; zero counts as positive).
    Plane {
        /// `h1 × h2`.
        normal: [f64; 3],
        /// A point on axis 1.
        point: [f64; 3],
        /// The wrist center at zero.
        wrist_center: [f64; 3],
        /// The sign that means `Front`.
        front: f64,
    },
    /// Cylindrical arms: the sign of `direction · (E2 E3 c − point)`; `Front` when `≥ 0`.
    Radial {
        /// The radial direction of the solved slide, ⟂ axis 1.
        direction: [f64; 3],
        /// The point of the slide's line nearest axis 1 at zero, shifted by the slides.
        point: [f64; 3],
        /// The wrist center at zero.
        wrist_center: [f64; 3],
    },
    /// No shoulder choice.
    Only,
}

/// How the elbow label is read from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ElbowRule {
    /// Elbow arms: bend `= sign sin(sense · θ3 − stretched)` (θ3 the model value); `Up` when
    /// bend × (+1 front, −1 back) equals `up`.
    Bend {
        /// `±1`: axis 3's direction relative to axis 2.
        sense: f64,
        /// The angle of the stretched configuration about axis 2.
        stretched: f64,
        /// The sign that means `Up` with the shoulder in front.
        up: f64,
    },
    /// Polar arms: `Extended` when the slide's model value is at least `nearest` (the value at
    /// the nearest approach to axis 2).
    Slide {
        /// The slide value of the nearest approach.
        nearest: f64,
    },
    /// No elbow choice.
    Only,
}

/// How the wrist label is read from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WristRule {
    /// `h4 × h5` at zero.
    pub normal: [f64; 3],
    /// `h5` at zero.
    pub axis5: [f64; 3],
    /// `h6` at zero.
    pub axis6: [f64; 3],
}

/// The rules that read a branch label from joint values.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BranchRule {
    /// Shoulder rule.
    pub shoulder: ShoulderRule,
    /// Elbow rule.
    pub elbow: ElbowRule,
    /// Wrist rule.
    pub wrist: WristRule,
    /// The rules read the arm backwards: for an arm whose axes 1–3 meet (the wrist at the
    /// base), they are the rules of the mirrored arm, whose joint `i` is joint `7 − i` turning
    /// about the reversed axis (same joint values).
    pub mirrored: bool,
}

/// The mirrored arm of [`BranchRule::mirrored`]: joints in reverse order, axes reversed, and
/// the joint values in reverse order. `E(−h, θ) = E(h, −θ)`, so the mirrored arm's forward
/// kinematics with the reversed values is the inverse of the arm's joint motions.
pub fn mirror(joints: &[Joint; JOINTS], q: &[f64; JOINTS]) -> ([Joint; JOINTS], [f64; JOINTS]) {
    let mut mj = *joints;
    let mut mq = *q;
    for i in 0..JOINTS {
        let j = joints[JOINTS - 1 - i];
        mj[i] = Joint {
            axis: [-j.axis[0], -j.axis[1], -j.axis[2]],
            ..j
        };
        mq[i] = q[JOINTS - 1 - i];
    }
    (mj, mq)
}

fn sign(x: f64) -> f64 {
    if x >= 0.0 {
        1.0
    } else {
        -1.0
    }
}

/// Rodrigues' rotation of `v` about unit `h` by `angle`.
fn rotate(h: &[f64; 3], angle: f64, v: &[f64; 3]) -> [f64; 3] {
    let (s, c) = sin_cos(angle);
    let k = dot(h, v) * (1.0 - c);
    let hv = cross(h, v);
    [
        c * v[0] + s * hv[0] + k * h[0],
        c * v[1] + s * hv[1] + k * h[1],
        c * v[2] + s * hv[2] + k * h[2],
    ]
}

/// The branch label of a configuration, read by the arm's rules.
pub fn branch_of(rule: &BranchRule, joints: &[Joint; JOINTS], q: &[f64; JOINTS]) -> Branch {
    if rule.mirrored {
        let (mj, mq) = mirror(joints, q);
        let forward = BranchRule {
            mirrored: false,
            ..*rule
        };
        return branch_of(&forward, &mj, &mq);
    }
    // The point joints 2–6 carry (a wrist center is fixed by joints 4–6; the meeting point of
    // axes 5 and 6 of a three-parallel arm is moved by joint 4).
    let moved_center = |c: &[f64; 3]| {
        let mut w = *c;
        for i in (1..JOINTS).rev() {
            w = joint_motion(&joints[i], q[i]).transform_point(&w);
        }
        w
    };
    let shoulder = match rule.shoulder {
        ShoulderRule::Plane {
            normal,
            point,
            wrist_center,
            front,
        } => {
            let w = moved_center(&wrist_center);
            if sign(dot(&normal, &sub(&w, &point))) == front {
                Shoulder::Front
            } else {
                Shoulder::Back
            }
        }
        ShoulderRule::Radial {
            direction,
            point,
            wrist_center,
        } => {
            let w = moved_center(&wrist_center);
            if dot(&direction, &sub(&w, &point)) >= 0.0 {
                Shoulder::Front
            } else {
                Shoulder::Back
            }
        }
        ShoulderRule::Only => Shoulder::Only,
    };
    let elbow = match rule.elbow {
        ElbowRule::Bend {
            sense,
            stretched,
            up,
        } => {
            let theta3 = joints[2].model_value(q[2]);
            let bend = sign(crate::math::sin(sense * theta3 - stretched));
            let side = if shoulder == Shoulder::Back {
                -1.0
            } else {
                1.0
            };
            if bend * side == up {
                Elbow::Up
            } else {
                Elbow::Down
            }
        }
        ElbowRule::Slide { nearest } => {
            if joints[2].model_value(q[2]) >= nearest {
                Elbow::Extended
            } else {
                Elbow::Retracted
            }
        }
        ElbowRule::Only => Elbow::Only,
    };
    let theta5 = joints[4].model_value(q[4]);
    let w = &rule.wrist;
    let turned = rotate(&w.axis5, theta5, &w.axis6);
    let wrist = if dot(&w.normal, &turned) >= 0.0 {
        Wrist::Plus
    } else {
        Wrist::Minus
    };
    Branch {
        shoulder,
        elbow,
        wrist,
    }
}

/// Half a turn, for emitted code that adds it to a model value.
pub const HALF_TURN: f64 = PI;

#[cfg(test)]
mod tests {
    use super::*;

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
    fn wrap_lands_within_half_a_turn_of_the_center() {
        for k in -5..=5 {
            let x = 0.3 + TAU * k as f64;
            assert!((wrap(x, 0.0) - 0.3).abs() < 1e-12);
        }
        assert!((wrap(3.0 * PI / 2.0, 0.0) + PI / 2.0).abs() < 1e-12);
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

    #[test]
    fn pose_checks() {
        assert!(check_pose(&Pose::<f64>::IDENTITY).is_ok());
        let mut p = Pose::IDENTITY;
        p.translation[0] = f64::NAN;
        assert_eq!(
            check_pose(&p),
            Err(Unreachable::InvalidPose(PoseProblem::NotFinite))
        );
        let mut p = Pose::IDENTITY;
        p.rotation[2][2] = -1.0;
        assert_eq!(
            check_pose(&p),
            Err(Unreachable::InvalidPose(PoseProblem::Reflection))
        );
        let mut p = Pose::IDENTITY;
        p.rotation[0][1] = 1e-3;
        assert!(matches!(
            check_pose(&p),
            Err(Unreachable::InvalidPose(PoseProblem::NotOrthonormal { .. }))
        ));
    }
}
