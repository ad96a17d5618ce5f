//! Why a pose has no solution, in one wording for every command (`solve`'s JSON, `draw`'s
//! message), with the amounts in the file's units.

use armforge_compiler::model::Model;
use armforge_runtime::{JointKind, PoseProblem, Unreachable};

/// One reason, ready for JSON or a message.
pub struct Reason {
    /// The machine-readable status (`beyond_reach`, …).
    pub status: &'static str,
    /// A sentence for people.
    pub text: String,
    /// The amount and its unit symbol, in the file's units, where there is one.
    pub by: Option<(f64, &'static str)>,
    /// The 1-based joint the reason is about, where there is one.
    pub joint: Option<usize>,
}

/// The reason a target has no solution, in the file's units.
pub fn reason(model: &Model, why: &Unreachable) -> Reason {
    let units = &model.units;
    let length = |by: f64| Some((units.length_from_si(by), units.length.symbol()));
    let angle = |by: f64| Some((units.angle_from_si(by), units.angle.symbol()));
    let (status, text, by, joint) = match *why {
        Unreachable::InvalidPose(problem) => ("invalid_pose", pose_problem(problem), None, None),
        Unreachable::BeyondReach { by } => (
            "beyond_reach",
            format!(
                "the wrist center is beyond the arm's reach by {}",
                units.show_length(by)
            ),
            length(by),
            None,
        ),
        Unreachable::InsideHole { by } => (
            "inside_hole",
            format!(
                "the wrist center is inside the region the arm cannot reach near its shoulder, \
                 by {}",
                units.show_length(by)
            ),
            length(by),
            None,
        ),
        Unreachable::WristOrientation { by } => (
            "wrist_orientation",
            format!(
                "the wrist cannot turn the tool this way: axis 6 misses the directions it can \
                 reach by {}",
                units.show_angle(by)
            ),
            angle(by),
            None,
        ),
        Unreachable::OutsideLimits { joint, by } => {
            let prismatic = model
                .joints
                .get(joint)
                .is_some_and(|j| j.joint.kind == JointKind::Prismatic);
            let (shown, amount) = if prismatic {
                (units.show_length(by), length(by))
            } else {
                (units.show_angle(by), angle(by))
            };
            (
                "outside_limits",
                format!(
                    "every solution is outside the joint limits; the closest misses the limits \
                     of {} by {shown}",
                    model.joint_label(joint)
                ),
                amount,
                Some(joint + 1),
            )
        }
        Unreachable::BranchUnavailable => (
            "branch_unavailable",
            "the target is reachable, but not in the requested branch".into(),
            None,
            None,
        ),
        Unreachable::NoSuchBranch => (
            "no_such_branch",
            "this arm has no such branch".into(),
            None,
            None,
        ),
    };
    Reason {
        status,
        text,
        by,
        joint,
    }
}

/// What is wrong with a pose, with the numbers.
fn pose_problem(problem: PoseProblem) -> String {
    match problem {
        PoseProblem::NotFinite => "the pose has an entry that is NaN or infinite".into(),
        PoseProblem::NotOrthonormal { error } => format!(
            "the rotation is not a rotation matrix: its columns must be unit vectors at right \
             angles to each other, but an entry of RᵀR differs from the identity's by {} (at \
             most {} is allowed)",
            compact(error),
            compact(armforge_runtime::math::rotation_tolerance::<f64>())
        ),
        PoseProblem::Reflection => {
            "the rotation is a reflection (determinant −1), not a rotation".into()
        }
    }
}

/// A number for a sentence: plain with up to 4 significant digits between 1e-3 and 1e6,
/// otherwise `1.5e-9`, never with trailing zeros.
pub fn compact(x: f64) -> String {
    let magnitude = x.abs();
    if x == 0.0 || !x.is_finite() {
        return format!("{}", if x == 0.0 { 0.0 } else { x });
    }
    if (1e-3..1e6).contains(&magnitude) {
        let digits = (3 - magnitude.log10().floor() as i32).max(0) as usize;
        let s = format!("{x:.digits$}");
        let s = if s.contains('.') {
            s.trim_end_matches('0').trim_end_matches('.')
        } else {
            &s
        };
        return s.to_string();
    }
    let s = format!("{x:.3e}");
    match s.split_once('e') {
        Some((mantissa, exponent)) if mantissa.contains('.') => format!(
            "{}e{exponent}",
            mantissa.trim_end_matches('0').trim_end_matches('.')
        ),
        _ => s,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn compact_numbers() {
        assert_eq!(compact(3.0), "3");
        assert_eq!(compact(1e-6), "1e-6");
        assert_eq!(compact(0.0123456), "0.01235");
        assert_eq!(compact(1234.5678), "1235");
        assert_eq!(compact(1e308), "1e308");
        assert_eq!(compact(-2.5e-9), "-2.5e-9");
    }

    #[test]
    fn a_rotation_that_is_not_one_is_said_with_its_numbers() {
        let text = pose_problem(PoseProblem::NotOrthonormal { error: 3.0 });
        assert!(text.contains("by 3 (at most 1e-6 is allowed)"), "{text}");
        assert!(!text.contains("3.000e0"), "{text}");
    }
}
