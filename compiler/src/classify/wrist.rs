//! The spherical wrist: axes 4, 5, 6 meet in one point, and neither consecutive pair is
//! parallel (Pieper 1968: such an arm decouples into position and orientation).

use std::f64::consts::{FRAC_PI_2, PI};

use nalgebra::Vector3;

use super::context::Context;
use super::lines::{angle_between_directions, signed_angle_about};
use super::reject::{Reason, Rejection};

/// The wrist as measured, in metres and radians.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct WristEvidence {
    /// Where axes 4, 5, 6 meet (least-squares point), base frame at zero, metres.
    pub center: [f64; 3],
    /// The largest distance of the wrist center from axes 4, 5 and 6, metres.
    pub miss: f64,
    /// The lengths of the common normals of axes 4–5, 5–6 and 4–6, metres.
    pub gaps: [f64; 3],
    /// The angle between the lines of axes 4 and 5, in `[0, π/2]`.
    pub angle_4_5: f64,
    /// The angle between the lines of axes 5 and 6, in `[0, π/2]`.
    pub angle_5_6: f64,
    /// The range of the angle between the lines of axes 4 and 6 over every value of joint 5,
    /// `[min, max]` in `[0, π/2]` (direction signs ignored, so it does not depend on how the
    /// file pointed the axes).
    pub axis_4_6_angle_range: [f64; 2],
    /// True when the wrist reaches every orientation: the directed angle between axes 4 and 6
    /// then takes every value from 0 to π, which needs axes 4–5 and 5–6 both at 90°.
    pub reaches_every_orientation: bool,
    /// Model values of joint 5 (radians, in `(−π, π]`) at which axes 4 and 6 line up: the
    /// wrist singularity. Empty when they never do.
    pub aligned_at: Vec<f64>,
}

/// Checks the wrist of `ctx`'s arm and measures it.
pub fn analyse(ctx: &Context) -> Result<WristEvidence, Rejection> {
    if let Some(joint) = (4..=6).find(|&n| !ctx.revolute(n)) {
        return Err(ctx.reject(
            Reason::WristJointNotRevolute { joint },
            joint,
            ctx.notes_without_wrist(true),
        ));
    }
    for (first, second) in [(4, 5), (5, 6)] {
        if ctx.parallel(first, second) {
            let reason = Reason::WristAxesParallel {
                first,
                second,
                angle: ctx.angle(first, second),
                distance: ctx.gap(first, second),
            };
            let notes = ctx.notes_without_wrist(false);
            return Err(ctx.reject(reason, second, notes));
        }
    }
    let gaps = [ctx.gap(4, 5), ctx.gap(5, 6), ctx.gap(4, 6)];
    // Axes 4 and 5 are not parallel, so the three lines have one nearest point.
    let Some(meeting) = ctx.meeting(&[4, 5, 6]) else {
        let reason = Reason::WristAxesNotConcurrent {
            miss: f64::INFINITY,
        };
        return Err(ctx.reject(reason, 6, ctx.notes_without_wrist(true)));
    };
    if meeting.miss > ctx.tol.distance {
        return Err(reject_miss(ctx, gaps, meeting.miss));
    }
    Ok(measure(ctx, meeting.point.coords, meeting.miss, gaps))
}

fn reject_miss(ctx: &Context, gaps: [f64; 3], miss: f64) -> Rejection {
    let pairs = [(4, 5), (5, 6), (4, 6)];
    let (worst, gap) =
        gaps.iter().enumerate().fold(
            (0, gaps[0]),
            |best, (i, &g)| if g > best.1 { (i, g) } else { best },
        );
    let notes = ctx.notes_without_wrist(true);
    if gap > ctx.tol.distance {
        let (first, second) = pairs[worst];
        let reason = Reason::WristAxesMiss {
            first,
            second,
            gap,
            miss,
        };
        ctx.reject(reason, second, notes)
    } else {
        ctx.reject(Reason::WristAxesNotConcurrent { miss }, 6, notes)
    }
}

/// The range of the angle between two lines, `min(θ, π − θ)`, while the directed angle `θ`
/// sweeps `[lo, hi]` within `[0, π]`.
fn line_angle_range([lo, hi]: [f64; 2]) -> [f64; 2] {
    let line = |t: f64| t.min(PI - t);
    let max = if lo <= FRAC_PI_2 && hi >= FRAC_PI_2 {
        FRAC_PI_2
    } else {
        line(lo).max(line(hi))
    };
    [line(lo).min(line(hi)), max]
}

fn measure(ctx: &Context, center: Vector3<f64>, miss: f64, gaps: [f64; 3]) -> WristEvidence {
    let h4 = ctx.line(4).direction.into_inner();
    let h5 = ctx.line(5).direction;
    let h6 = ctx.line(6).direction.into_inner();
    // Directed angles between consecutive axes; joint 5 keeps both while it turns.
    let a = angle_between_directions(&h4, &h5);
    let b = angle_between_directions(&h5, &h6);
    // Turning h6 about h5 sweeps the angle to h4 from |a − b| to min(a + b, 2π − a − b).
    let range = [(a - b).abs(), (a + b).min(2.0 * PI - a - b)];
    let tol = ctx.tol.angle;
    let mut aligned_at = Vec::new();
    for target in [h4, -h4] {
        let reachable = if target == h4 {
            range[0] <= tol
        } else {
            range[1] >= PI - tol
        };
        if reachable {
            if let Some(t) = signed_angle_about(&h5, &h6, &target, tol.sin()) {
                aligned_at.push(t);
            }
        }
    }
    aligned_at.sort_by(f64::total_cmp);
    WristEvidence {
        center: [center.x, center.y, center.z],
        miss,
        gaps,
        angle_4_5: ctx.angle(4, 5),
        angle_5_6: ctx.angle(5, 6),
        axis_4_6_angle_range: line_angle_range(range),
        reaches_every_orientation: range[0] <= tol && range[1] >= PI - tol,
        aligned_at,
    }
}
