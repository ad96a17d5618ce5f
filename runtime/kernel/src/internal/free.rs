//! The free joints, chosen within their limits so that the other joints fit theirs.
//!
//! At three singular configurations the pose leaves one joint free and the plan holds it at a
//! reference (its reference input):
//!
//! * **joint 1**, when the wrist center is on axis 1 (flag `on_axis_1`);
//! * **joint 2**, when the wrist center is on axis 2 and joint 3 slides (the pivot of a polar
//!   arm): joint 2 turns about a line through the wrist center;
//! * **joint 4**, when the wrist is aligned (joint 5 at either aligned position, flag
//!   `wrist_aligned`): only θ4 + θ6 (or θ4 − θ6 at the second aligned position) is fixed.
//!
//! At the held value another joint can fall outside its limits although a value of the free
//! joint keeps every joint inside. Choosing that value is a one-dimensional interval problem,
//! solved here in closed form with fixed bounds (no data-dependent loop), then the plan is
//! evaluated once more with the chosen value as the reference:
//!
//! * **Joint 4 at an aligned wrist**: θ6 = θ6ʰ + σ (θ4 − θ4ʰ) with σ = −1 when axis 6 lines up
//!   with axis 4 and +1 when it lines up against it, so θ4 must lie in joint 4's arc and in
//!   joint 6's arc carried over, `θ4ʰ + σ ([lo6, hi6] − θ6ʰ)`. The point of that intersection
//!   nearest the held value is among the held value and the four arc ends ([`aligned_joint_4`]).
//! * **Joint 1 or 2 (turning about a line through the wrist center)**: with `m` its model value
//!   the wrist must make `R456(m) = Qᵀ R_f(m)ᵀ Pᵀ G` (`P`, `Q` the turns of the joints before
//!   and after it up to joint 3, `G = rot(B⁻¹ T M⁻¹)`). Each wrist joint reaching one of its
//!   limits is one condition `A + B cos m + C sin m = e` (Rodrigues), with at most two roots
//!   `m = μ ± acos((e − A) / ρ)`, `ρ = √(B² + C²)`. A root is a real crossing for this
//!   candidate's wrist branch only when the branch's own θ5 goes with it (the other branch
//!   reaches the same limit at the other roots), which a sign says. Walking
//!   around the circle from the held value, each real crossing flips one joint between inside
//!   and outside its limits, and joint `f`'s own limits flip it: the arcs where everything is
//!   inside follow in one pass over at most [`ENDS`] sorted ends ([`free_arm_joint`]).
//!
//! Only candidates at one of these configurations and outside the limits are looked at, so
//! `solve` costs nothing more elsewhere. The interpreter and every emitted module call this one
//! function.

use super::{wrap, Candidate, Settings};
use crate::fk::joint_motion;
use crate::math::{abs, add, atan2, cos, cross, dot, scale, sin, sqrt, sub, Scalar};
use crate::model::{Joint, JointKind};
use crate::pose::Pose;
use crate::solution::JOINTS;

/// Arc ends are moved this far (radians) inside the arcs, so that the joints land within
/// their limits despite rounding: 1e-9 for `f64`, 64 epsilons for `f32` (about 7.6e-6).
#[inline(always)]
fn inside<S: Scalar>() -> S {
    S::of(1e-9).max(S::of(64.0) * S::EPSILON)
}

/// A revolute joint's limits as model values `[lo, hi]`, or `None` when it turns a whole turn
/// or more (or is a slide).
fn model_range<S: Scalar>(joint: &Joint<S>) -> Option<[S; 2]> {
    let [lo, hi] = joint.limits;
    if joint.kind != JointKind::Revolute || !(lo.is_finite() && hi.is_finite()) || hi - lo >= S::TAU
    {
        return None;
    }
    let (a, b) = (joint.model_value(lo), joint.model_value(hi));
    Some([a.min(b), a.max(b)])
}

/// True when the model value `m` is within `range` (by whole turns); `None` is every value.
fn within<S: Scalar>(m: S, range: Option<[S; 2]>, tol: S) -> bool {
    match range {
        Some([lo, hi]) => {
            let v = wrap(m, S::of(0.5) * (lo + hi));
            v >= lo - tol && v <= hi + tol
        }
        None => true,
    }
}

/// A joint's motion at model value `m`.
fn turn<S: Scalar>(joint: &Joint<S>, m: S) -> Pose<S> {
    joint_motion(joint, joint.joint_value(m))
}

/// The most ends [`free_arm_joint`] sorts: for each of joints 4, 5 and 6, two limits with two
/// roots each; and the free joint's own two limits.
pub const ENDS: usize = 3 * 2 * 2 + 2;

/// A root of `A + B cos m + C sin m = e`: the angle `m` with its cosine and sine (from the
/// angle-sum identities, so that testing another condition at the root needs no `sin_cos`).
#[derive(Clone, Copy, Debug)]
struct Root<S: Scalar> {
    at: S,
    cos: S,
    sin: S,
}

/// `A + B cos m + C sin m = e`: the roots `m = μ ± α`, `μ = atan2(C, B)`,
/// `α = acos((e − A) / ρ)` (none when out of range); `cos(μ ± α) = (B x ∓ C s) / ρ` and
/// `sin(μ ± α) = (C x ± B s) / ρ` with `x = cos α`, `s = sin α`.
fn roots<S: Scalar>([a, b, c]: [S; 3], e: S) -> Option<[Root<S>; 2]> {
    let rho = sqrt(b * b + c * c);
    if rho <= S::of(1e-12).max(S::of(64.0) * S::EPSILON) || !rho.is_finite() {
        return None;
    }
    let x = (e - a) / rho;
    if !(x >= -S::ONE && x <= S::ONE) {
        return None;
    }
    let mu = atan2(c, b);
    let s = sqrt((S::ONE - x) * (S::ONE + x));
    let alpha = atan2(s, x);
    let inv = S::ONE / rho;
    let (bx, cs, cx, bs) = (b * x * inv, c * s * inv, c * x * inv, b * s * inv);
    Some([
        Root {
            at: mu + alpha,
            cos: bx - cs,
            sin: cx + bs,
        },
        Root {
            at: mu - alpha,
            cos: bx + cs,
            sin: cx - bs,
        },
    ])
}

/// The coefficients of `u · R_f(m)ᵀ y = A + B cos m + C sin m` for a rotation `R_f(m)` about the
/// unit axis `h` (Rodrigues): `A = (u·h)(y·h)`, `B = u·y − A`, `C = −h·(y × u)`.
fn coefficients<S: Scalar>(h: &[S; 3], u: &[S; 3], y: &[S; 3]) -> [S; 3] {
    let a = dot(u, h) * dot(y, h);
    [a, dot(u, y) - a, -dot(h, &cross(y, u))]
}

/// `A + B cos m + C sin m` at a root `m`.
fn value_at<S: Scalar>([a, b, c]: [S; 3], m: &Root<S>) -> S {
    a + b * m.cos + c * m.sin
}

/// The wrist center with every model value at zero (where axes 4 and 5 meet), or `None` when
/// the axes of joints 4, 5 and 6 do not meet in one point within `tol` metres.
fn wrist_center<S: Scalar>(joints: &[Joint<S>; JOINTS], tol: S) -> Option<[S; 3]> {
    let (j4, j5, j6) = (&joints[3], &joints[4], &joints[5]);
    let c45 = dot(&j4.axis, &j5.axis);
    let det = S::ONE - c45 * c45;
    if !det.is_finite() || det <= S::of(1e-6) {
        return None;
    }
    // Closest point of line 4 to line 5: p4 + t h4, t = (p5 − p4)·(h4 − (h4·h5) h5) / (1 − (h4·h5)²).
    let d = sub(&j5.point, &j4.point);
    let t = (dot(&d, &j4.axis) - c45 * dot(&d, &j5.axis)) / det;
    let c = add(&j4.point, &scale(&j4.axis, t));
    let off = |j: &Joint<S>| {
        let v = sub(&c, &j.point);
        let along = dot(&v, &j.axis);
        dot(&v, &v) - along * along
    };
    let tol2 = tol * tol;
    (off(j5) <= tol2 && off(j6) <= tol2).then_some(c)
}

/// True when joint 3 slides and the candidate's slide puts the wrist center on axis 2 (the
/// pivot of a polar arm), within `tol` metres.
fn at_pivot<S: Scalar>(joints: &[Joint<S>; JOINTS], c: &Candidate<S>, tol: S) -> bool {
    let (j2, j3) = (&joints[1], &joints[2]);
    if j2.kind != JointKind::Revolute || j3.kind != JointKind::Prismatic {
        return false;
    }
    let Some(center) = wrist_center(joints, tol) else {
        return false;
    };
    let p = turn(j3, c.model_values[2]).transform_point(&center);
    let v = sub(&p, &j2.point);
    let along = dot(&v, &j2.axis);
    dot(&v, &v) - along * along <= tol * tol
}

/// The nearest model value to `held` within both arcs (`None` is the whole circle): the
/// nearest of `held` and the four arc ends moved inside that lies in both.
fn nearest_in_both<S: Scalar>(held: S, a: Option<[S; 2]>, b: Option<[S; 2]>) -> Option<S> {
    let ends = |r: Option<[S; 2]>| r.map_or([S::NAN; 2], |[lo, hi]| [lo + inside(), hi - inside()]);
    let [a0, a1] = ends(a);
    let [b0, b1] = ends(b);
    let mut best: Option<(S, S)> = None;
    for m in [held, a0, a1, b0, b1] {
        if !m.is_finite() || !within(m, a, S::ZERO) || !within(m, b, S::ZERO) {
            continue;
        }
        let distance = abs(wrap(m - held, S::ZERO));
        if best.map_or(true, |(d, _)| distance < d) {
            best = Some((distance, m));
        }
    }
    best.map(|(_, m)| m)
}

/// Joint 4 of a candidate at an aligned wrist, moved so that joints 4 and 6 both fit their
/// limits (see the module documentation), or `None` when they already do or cannot.
pub fn aligned_joint_4<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    c: &Candidate<S>,
    tol: S,
) -> Option<S> {
    let m = &c.model_values;
    let (r4, r6) = (model_range(&joints[3]), model_range(&joints[5]));
    if within(m[3], r4, tol) && within(m[5], r6, tol) {
        return None;
    }
    // σ = −1 when R5 h6 = h4 (θ4 + θ6 fixed), +1 when R5 h6 = −h4 (θ4 − θ6 fixed).
    let z = turn(&joints[4], m[4]).rotate(&joints[5].axis);
    let sigma = if dot(&joints[3].axis, &z) > S::ZERO {
        -S::ONE
    } else {
        S::ONE
    };
    let carried = r6.map(|[lo, hi]| {
        let (a, b) = (m[3] + sigma * (lo - m[5]), m[3] + sigma * (hi - m[5]));
        [a.min(b), a.max(b)]
    });
    nearest_in_both(m[3], r4, carried)
}

/// The bits of the walk's state in [`free_arm_joint`]: which joint is outside its limits.
const FREE_BIT: u8 = 1;
const BITS: [u8; 3] = [2, 4, 8];

/// What every candidate of one call shares in the joint-1/2 problem, worked out once per call
/// (arm constants and the target's `G = rot(B⁻¹ T M⁻¹)`), so that a candidate costs only its
/// own turns of joints 1–3 and its roots.
struct WristData<S: Scalar> {
    /// Model ranges of joints 4, 5, 6 (`None`: a whole turn or more).
    ranges: [Option<[S; 2]>; 3],
    /// `n = h4 × h5`: the wrist branch is the side of this plane that `R5 h6` is on.
    n: [S; 3],
    /// For each limit of joint 5: `R5(L) h6`.
    z5: [[S; 3]; 2],
    /// For each limit of joint 4: `R4(L) h5` and `R4(L) n`.
    r4: [[[S; 3]; 2]; 2],
    /// `G h6`.
    g6: [S; 3],
    /// For each limit of joint 6: `G R6(L)ᵀ h5` and `G R6(L)ᵀ (h5 × h6)`.
    g_r6: [[[S; 3]; 2]; 2],
}

impl<S: Scalar> WristData<S> {
    fn new(joints: &[Joint<S>; JOINTS], to_base: &impl Fn(&[S; 3]) -> [S; 3]) -> Self {
        let (h4, h5, h6) = (&joints[3].axis, &joints[4].axis, &joints[5].axis);
        let ranges = [3, 4, 5].map(|j| model_range(&joints[j]));
        let n = cross(h4, h5);
        let n6 = cross(h5, h6);
        // Only a limited joint's limits are turned (a joint of a whole turn or more has none).
        let zero = [[S::ZERO; 3]; 2];
        WristData {
            ranges,
            n,
            z5: ranges[1].map_or(zero, |r| r.map(|l| turn(&joints[4], l).rotate(h6))),
            r4: ranges[0].map_or([zero; 2], |r| {
                r.map(|l| {
                    let t4 = turn(&joints[3], l);
                    [t4.rotate(h5), t4.rotate(&n)]
                })
            }),
            g6: to_base(h6),
            g_r6: ranges[2].map_or([zero; 2], |r| {
                r.map(|l| {
                    let t6 = turn(&joints[5], l);
                    [to_base(&t6.rotate_back(h5)), to_base(&t6.rotate_back(&n6))]
                })
            }),
        }
    }
}

/// One end of an arc of the free joint: its distance counterclockwise from the held value
/// (in `[0, 2π]`; unused ends at ∞), the bit it flips, and the wrist branch it is real for
/// (`1` the side `n · R5 h6 > 0`, `-1` the other, `0` both: the free joint's own limits).
#[derive(Clone, Copy)]
struct End<S: Scalar> {
    at: S,
    bit: u8,
    side: i8,
}

/// The ends of both wrist branches at one position of joints 1–3, sorted, with the key they
/// were worked out for (`f` and the model values of joints 1–3): the two wrist branches of one
/// position (half a turn apart) share them, so the second one costs only its walk.
type SharedEnds<S> = ([S; 4], [End<S>; ENDS]);

/// Every end at the model values `m` for free joint `f` (see the module documentation),
/// tagged with the wrist branch it is real for, sorted counterclockwise from `m[f]`; only
/// those of wrist branch `only` when it is not zero.
fn ends_of<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    data: &WristData<S>,
    m: &[S; JOINTS],
    f: usize,
    range_f: Option<[S; 2]>,
    only: i8,
) -> [End<S>; ENDS] {
    let (h4, h5, h6) = (&joints[3].axis, &joints[4].axis, &joints[5].axis);
    let held = m[f.min(1)];
    let hf = &joints[f.min(1)].axis;
    // Q x (turns after joint f up to joint 3) and Pᵀ y (turns before it, undone): joint 2's
    // turn for f = 0, joint 1's for f = 1.
    let e3 = turn(&joints[2], m[2]);
    let other = if f == 0 { 1 } else { 0 };
    let e_other = turn(&joints[other], m[other]);
    let q = |x: &[S; 3]| {
        let x = e3.rotate(x);
        if f == 0 {
            e_other.rotate(&x)
        } else {
            x
        }
    };
    let p = |g: &[S; 3]| {
        if f == 0 {
            *g
        } else {
            e_other.rotate_back(g)
        }
    };
    let (u4, y6) = (q(h4), p(&data.g6));
    let side_of = |positive: bool| if positive { 1 } else { -1 };
    let mut ends = [End {
        at: S::of(f64::INFINITY),
        bit: 0,
        side: 0,
    }; ENDS];
    let mut n_ends = 0;
    let mut push = |root: S, bit: u8, side: i8| {
        if only != 0 && side != 0 && side != only {
            return;
        }
        if let Some(slot) = ends.get_mut(n_ends) {
            *slot = End {
                at: wrap(root - held, S::PI),
                bit,
                side,
            };
            n_ends += 1;
        }
    };
    // Joint 5 at a limit L: h4 · R456 h6 = h4 · R5(L) h6, real for the branch L's side is.
    if data.ranges[1].is_some() {
        let k = coefficients(hf, &u4, &y6);
        for z in &data.z5 {
            let side = side_of(dot(&data.n, z) > S::ZERO);
            if only != 0 && side != only {
                continue;
            }
            for root in roots(k, dot(h4, z)).into_iter().flatten() {
                push(root.at, BITS[1], side);
            }
        }
    }
    // Joint 4 at L: R4(L) h5 · R456 h6 = h5 · h6; real for the sign of n · R4(L)ᵀ R456 h6.
    if data.ranges[0].is_some() {
        for [r4h5, r4n] in &data.r4 {
            let k = coefficients(hf, &q(r4h5), &y6);
            let test = coefficients(hf, &q(r4n), &y6);
            for root in roots(k, dot(h5, h6)).into_iter().flatten() {
                push(root.at, BITS[0], side_of(value_at(test, &root) > S::ZERO));
            }
        }
    }
    // Joint 6 at L: h4 · R456 R6(L)ᵀ h5 = h4 · h5; real for the sign of
    // (h5 × h6) · R6(L) R456ᵀ h4 (n · R5 h6 = (h5 × h6) · R5ᵀ h4).
    if data.ranges[2].is_some() {
        for [g_h5, g_n6] in &data.g_r6 {
            let k = coefficients(hf, &u4, &p(g_h5));
            let test = coefficients(hf, &u4, &p(g_n6));
            for root in roots(k, dot(h4, h5)).into_iter().flatten() {
                push(root.at, BITS[2], side_of(value_at(test, &root) > S::ZERO));
            }
        }
    }
    if let Some([lo, hi]) = range_f {
        push(lo, FREE_BIT, 0);
        push(hi, FREE_BIT, 0);
    }
    // Sorted counterclockwise: a bubble sort (stable) over as many slots as this arm's limits
    // can fill (four per limited wrist joint, two for the free joint's own limits): loop
    // bounds fixed by the arm, not the pose, every index provably in range (no panic path);
    // the unused ends (∞) stay last.
    let used = slots(data, range_f);
    for pass in 0..used {
        for j in (pass + 1..used).rev() {
            if let Some([a, b]) = ends.get_mut(j - 1..=j) {
                if b.at < a.at {
                    core::mem::swap(a, b);
                }
            }
        }
    }
    ends
}

/// How many ends this arm's limits can give (an arm constant, at most [`ENDS`]): four per
/// limited wrist joint (two limits, two roots each), two for the free joint's own limits.
fn slots<S: Scalar>(data: &WristData<S>, range_f: Option<[S; 2]>) -> usize {
    let limited = data.ranges.iter().filter(|r| r.is_some()).count();
    (4 * limited + if range_f.is_some() { 2 } else { 0 }).min(ENDS)
}

/// Walks around the circle over the sorted ends real for one wrist branch: past each end one
/// joint flips between inside and outside. The stretch after an end reaches to the next (or
/// back to the held value, 2π on); where nothing is outside, its nearer end (moved inside) is
/// a candidate. Returns the offset from the held value of the nearest one. Only the first
/// `used` slots can hold an end (see [`slots`]); the loops stop there.
fn walk<S: Scalar>(ends: &[End<S>; ENDS], used: usize, start: u8, ours: bool) -> Option<S> {
    // This branch's ends, in order; the rest (and every slot past `used`) at ∞.
    let mut mine = [(S::of(f64::INFINITY), 0u8); ENDS];
    let mut k = 0;
    for e in ends.iter().take(used) {
        if e.side == 0 || (e.side > 0) == ours {
            if let Some(slot) = mine.get_mut(k) {
                *slot = (e.at, e.bit);
                k += 1;
            }
        }
    }
    let mut state = start;
    let mut best: Option<(S, S)> = None;
    for (i, &(d, bit)) in mine.iter().enumerate().take(used) {
        state ^= bit;
        let next = mine.get(i + 1).map_or(S::TAU, |e| e.0.min(S::TAU));
        if state != 0 || !d.is_finite() {
            continue;
        }
        let (a, b) = (d + inside(), next - inside());
        if a > b {
            continue;
        }
        for (offset, distance) in [(a, a), (b, S::TAU - b)] {
            if best.map_or(true, |(bd, _)| distance < bd) {
                best = Some((distance, offset));
            }
        }
    }
    best.map(|(_, offset)| offset)
}

/// Joint `f` (0 or 1, turning about a line through the wrist center) of a candidate, moved to
/// the value nearest its held one at which joints 4, 5, 6 and `f` itself fit their limits (see
/// the module documentation), or `None` when they already do, none does, or the wrist is
/// aligned (no wrist branch to follow). `shared` keeps the last position's ends (both wrist
/// branches) for the other wrist branch of the same position; without it (a single
/// candidate) only this branch's ends are worked out.
fn free_arm_joint<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    data: &WristData<S>,
    shared: Option<&mut Option<SharedEnds<S>>>,
    c: &Candidate<S>,
    f: usize,
    tol: S,
) -> Option<S> {
    let m = &c.model_values;
    let joint_f = joints.get(f)?;
    let held = *m.get(f)?;
    let range_f = model_range(joint_f);
    // Outside bits at the held value.
    let mut start = if within(held, range_f, tol) {
        0
    } else {
        FREE_BIT
    };
    for ((bit, range), value) in BITS.iter().zip(data.ranges).zip([m[3], m[4], m[5]]) {
        if !within(value, range, tol) {
            start |= bit;
        }
    }
    if start == 0 {
        return None;
    }
    // The wrist branch: the side of the plane of h4 and h5 that z = R5 h6 is on.
    let side = dot(&data.n, &turn(&joints[4], m[4]).rotate(&joints[5].axis));
    if !side.is_finite() || abs(side) <= S::of(1e-9).max(S::of(64.0) * S::EPSILON) {
        return None;
    }
    let ours = side > S::ZERO;
    let used = slots(data, range_f);
    let Some(shared) = shared else {
        let only = if ours { 1 } else { -1 };
        let ends = ends_of(joints, data, m, f, range_f, only);
        return walk(&ends, used, start, ours).map(|offset| held + offset);
    };
    let key = [S::of(f as f64), m[0], m[1], m[2]];
    if shared.as_ref().map_or(true, |(k, _)| *k != key) {
        *shared = Some((key, ends_of(joints, data, m, f, range_f, 0)));
    }
    let (_, ends) = shared.as_ref()?;
    walk(ends, used, start, ours).map(|offset| held + offset)
}

/// The joint limits as [`LimitTable::within`] compares them, worked out once per call: each
/// joint's range center (a revolute value is wrapped toward it) and its limits widened by the
/// limit tolerance.
struct LimitTable<S: Scalar> {
    centers: [S; JOINTS],
    lo: [S; JOINTS],
    hi: [S; JOINTS],
}

impl<S: Scalar> LimitTable<S> {
    fn new(joints: &[Joint<S>; JOINTS], settings: &Settings<S>) -> Self {
        let tol = settings.limit_tolerance;
        LimitTable {
            centers: super::centers(joints),
            lo: joints.each_ref().map(|j| j.limits[0] - tol),
            hi: joints.each_ref().map(|j| j.limits[1] + tol),
        }
    }

    /// True when every joint of a candidate is within its limits: the comparisons of
    /// `finish_one` (each revolute value wrapped toward its range's center), without working
    /// out a reason.
    fn within(&self, joints: &[Joint<S>; JOINTS], c: &Candidate<S>) -> bool {
        let mut inside = true;
        for (i, (j, &m)) in joints.iter().zip(c.model_values.iter()).enumerate() {
            let q = (m - j.offset) * j.direction;
            let v = match (j.kind, self.centers.get(i)) {
                (JointKind::Revolute, Some(&center)) => wrap(q, center),
                _ => q,
            };
            let (lo, hi) = (self.lo.get(i), self.hi.get(i));
            inside &= lo.is_some_and(|&lo| v >= lo) & hi.is_some_and(|&hi| v <= hi);
        }
        inside
    }

    /// True when a candidate passes its checks (is real) but some joint is outside its limits.
    fn outside(
        &self,
        joints: &[Joint<S>; JOINTS],
        settings: &Settings<S>,
        c: &Candidate<S>,
    ) -> bool {
        super::finish::passes(&c.checks, settings).is_some() && !self.within(joints, c)
    }

    /// True when a candidate passes its checks and every joint is within its limits.
    fn fits(&self, joints: &[Joint<S>; JOINTS], settings: &Settings<S>, c: &Candidate<S>) -> bool {
        super::finish::passes(&c.checks, settings).is_some() && self.within(joints, c)
    }
}

/// Which joint (0-based) a candidate leaves free: 3 at an aligned wrist, 0 with the wrist
/// center on axis 1, 1 at the pivot of a polar arm; `None` elsewhere.
fn free_joint_of<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    settings: &Settings<S>,
    c: &Candidate<S>,
) -> Option<usize> {
    if c.wrist_aligned {
        return Some(3);
    }
    if c.on_axis_1 {
        return (joints[0].kind == JointKind::Revolute).then_some(0);
    }
    at_pivot(joints, c, S::of(4.0) * settings.length_tolerance).then_some(1)
}

/// Moves the free joint of every candidate that is at a singular configuration and outside
/// the limits (joint 1 on axis 1, joint 2 at a polar arm's pivot, joint 4 at an aligned wrist)
/// to the value nearest its held one at which every joint fits its limits (see the module
/// documentation). `rerun(reference, i)` evaluates the plan again with other reference inputs
/// and returns candidate `i`; `reference` is the one `candidates` were evaluated with. The
/// moved candidate is kept only when it is at the same singular configuration and within
/// every limit.
///
/// A rare path: it does nothing unless a candidate is singular and outside the limits; then
/// one closed form and one evaluation of the plan per such candidate.
#[inline(never)]
pub fn free_joint_1<S: Scalar>(
    joints: &[Joint<S>; JOINTS],
    frames: [&Pose<S>; 2],
    settings: &Settings<S>,
    target: &Pose<S>,
    reference: &[S; 4],
    candidates: &mut [Candidate<S>],
    mut rerun: impl FnMut(&[S; 4], usize) -> Option<Candidate<S>>,
) {
    let [base, tool] = frames;
    // rot(B⁻¹ T M⁻¹): where the target sends a direction of the arm at zero, base frame.
    let to_base = |x: &[S; 3]| base.rotate_back(&target.rotate(&tool.rotate_back(x)));
    let tol = settings.limit_tolerance;
    // Worked out once, for the first candidate that needs them: whether the wrist axes meet
    // (an arm constant), the wrist data, and the last position's ends.
    let limits = LimitTable::new(joints, settings);
    let mut wrist_meets: Option<bool> = None;
    let mut data: Option<WristData<S>> = None;
    // Shared between the two wrist branches of one position: only with more than one
    // candidate (`solve`, not `solve_branch`).
    let mut shared: Option<Option<SharedEnds<S>>> = (candidates.len() > 1).then_some(None);
    for (i, c) in candidates.iter_mut().enumerate() {
        let Some(f) = free_joint_of(joints, settings, c) else {
            continue;
        };
        if !limits.outside(joints, settings, c)
            || !*wrist_meets.get_or_insert_with(|| {
                wrist_center(joints, S::of(4.0) * settings.length_tolerance).is_some()
            })
        {
            continue;
        }
        let chosen = if f == 3 {
            aligned_joint_4(joints, c, tol)
        } else {
            let data = data.get_or_insert_with(|| WristData::new(joints, &to_base));
            free_arm_joint(joints, data, shared.as_mut(), c, f, tol)
        };
        let (Some(value), Some(&held)) = (chosen, c.model_values.get(f)) else {
            continue;
        };
        // The reference slots of the free joint: joint 4's are 2 and 3, joints 1 and 2 share
        // 0 and 1 (a polar arm holds joint 2 at its pivot relative to joint 1's reference).
        // The candidate's value is the reference or a fixed turn from it (half a turn for
        // another branch): keep that turn.
        let [c1, s1, c4, s4] = *reference;
        let mut moved = *reference;
        if f == 3 {
            let angle = value - (held - atan2(s4, c4));
            moved[2] = cos(angle);
            moved[3] = sin(angle);
        } else {
            let angle = value - (held - atan2(s1, c1));
            moved[0] = cos(angle);
            moved[1] = sin(angle);
        }
        if let Some(again) = rerun(&moved, i) {
            let same = again.wrist_aligned == c.wrist_aligned && again.on_axis_1 == c.on_axis_1;
            if same && limits.fits(joints, settings, &again) {
                *c = again;
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn nearest_in_both_arcs_is_an_end_or_the_held_value() {
        let deg = |x: f64| x.to_radians();
        let arc = |a: f64, b: f64| Some([deg(a), deg(b)]);
        // [30°, 150°] ∩ [45°, 225°] = [45°, 150°]: nearest 0° is 45° (moved inside).
        let m = nearest_in_both(0.0, arc(30.0, 150.0), arc(45.0, 225.0)).unwrap_or(f64::NAN);
        assert!((m - deg(45.0) - inside::<f64>()).abs() < 1e-15, "{m}");
        // Held inside both: stays.
        assert_eq!(nearest_in_both(1.0, arc(30.0, 150.0), None), Some(1.0));
        // Across the wrap: [170°, 200°] ∩ [−175°, 10°] = [185°, 200°], nearest 0° is 200°
        // (−160°, 160° away) rather than 185° (175° away).
        let m = nearest_in_both(0.0, arc(170.0, 200.0), arc(-175.0, 10.0)).unwrap_or(f64::NAN);
        assert!(
            (wrap(m, 0.0) - deg(-160.0) + inside::<f64>()).abs() < 1e-12,
            "{m}"
        );
        // Disjoint arcs: nothing.
        assert_eq!(nearest_in_both(0.0, arc(10.0, 20.0), arc(30.0, 40.0)), None);
    }

    #[test]
    fn roots_of_a_cosine_condition() {
        // cos m = 0.5 (A = 0, B = 1, C = 0): m = ±60° (any trigonometry table).
        let nan = Root {
            at: f64::NAN,
            cos: f64::NAN,
            sin: f64::NAN,
        };
        let r = roots([0.0, 1.0, 0.0], 0.5).unwrap_or([nan; 2]);
        assert!(
            (r[0].at.to_degrees() - 60.0).abs() < 1e-12
                && (r[1].at.to_degrees() + 60.0).abs() < 1e-12
        );
        // Their cosines and sines agree with the angles.
        for root in r {
            assert!((root.cos - root.at.cos()).abs() < 1e-15);
            assert!((root.sin - root.at.sin()).abs() < 1e-15);
        }
        // A general condition: 0.3 + 0.8 cos m − 0.5 sin m = 0.1, checked at both roots.
        let k = [0.3, 0.8, -0.5];
        for root in roots(k, 0.1).unwrap_or([nan; 2]) {
            let (s, c) = root.at.sin_cos();
            assert!((0.3 + 0.8 * c - 0.5 * s - 0.1).abs() < 1e-14, "{root:?}");
            assert!((root.cos - c).abs() < 1e-14 && (root.sin - s).abs() < 1e-14);
        }
        // 2 + cos m = 0 has no root.
        assert!(roots([2.0, 1.0, 0.0], 0.0).is_none());
        // Rodrigues: u · R(m)ᵀ y about z with u = x, y = x is cos m.
        let k = coefficients(&[0.0, 0.0, 1.0], &[1.0, 0.0, 0.0], &[1.0, 0.0, 0.0]);
        let at = Root {
            at: 0.3,
            cos: 0.3f64.cos(),
            sin: 0.3f64.sin(),
        };
        assert!((value_at(k, &at) - 0.3f64.cos()).abs() < 1e-15);
    }
}
