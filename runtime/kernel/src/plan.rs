//! The plan interpreter: evaluates a solve plan (a straight-line expression graph made by
//! armforge-compiler) at run time, without heap and without panics.
//!
//! A plan is a slice of [`Op`]s in evaluation order; op `i` writes value `i` of a caller-given
//! scratch buffer and reads only values before it. Every op runs exactly once per evaluation,
//! so the operation count is fixed. [`CandidateLayout`]s say which values form the candidate
//! solutions that [`crate::internal::finish`] turns into a solution set; the emitted solvers
//! build the same candidates from the same plan as straight-line Rust.

use crate::internal::{Candidate, Check, CheckKind};
use crate::math::{abs, atan2, cbrt, cos, sqrt};
use crate::solution::{Branch, JOINTS};

/// Index of a value in a plan.
pub type ValueId = u32;

/// One operation of a plan.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Op {
    /// Input slot (see [`INPUTS`]).
    Input(u32),
    /// A constant.
    Const(f64),
    /// `a + b`.
    Add(ValueId, ValueId),
    /// `a − b`.
    Sub(ValueId, ValueId),
    /// `a · b`.
    Mul(ValueId, ValueId),
    /// `a / b` (plans only divide by values kept away from zero).
    Div(ValueId, ValueId),
    /// `−a`.
    Neg(ValueId),
    /// `|a|`.
    Abs(ValueId),
    /// `√a` (plans only take roots of values clamped at zero).
    Sqrt(ValueId),
    /// `atan2(y, x)`.
    Atan2(ValueId, ValueId),
    /// Real cube root `∛a` (the resolvent cubic of Ferrari's method).
    Cbrt(ValueId),
    /// `cos a` (the trigonometric form of a cubic's roots).
    Cos(ValueId),
    /// The smaller of `a` and `b`.
    Min(ValueId, ValueId),
    /// The larger of `a` and `b`.
    Max(ValueId, ValueId),
    /// `if c ≥ 0 { a } else { b }`.
    Select(ValueId, ValueId, ValueId),
}

/// Number of plan inputs: the target pose's rotation (row-major, 9), its translation (3), and
/// the cosine and sine of the reference model values of joints 1 and 4 (4).
pub const INPUTS: usize = 16;

/// Input slot of the first reference value (cos of joint 1's reference model value), followed
/// by sin 1, cos 4, sin 4.
pub const REFERENCE_INPUT: usize = 12;

/// The plan inputs for a target pose and reference cosines and sines.
pub fn inputs(target: &crate::Pose, reference: &[f64; 4]) -> [f64; INPUTS] {
    let r = &target.rotation;
    let t = &target.translation;
    [
        r[0][0],
        r[0][1],
        r[0][2],
        r[1][0],
        r[1][1],
        r[1][2],
        r[2][0],
        r[2][1],
        r[2][2],
        t[0],
        t[1],
        t[2],
        reference[0],
        reference[1],
        reference[2],
        reference[3],
    ]
}

/// Evaluates `ops` into `values`. Returns false (and computes nothing) when `values` is
/// shorter than `ops`. A reference to a missing value or input reads NaN.
pub fn evaluate(ops: &[Op], inputs: &[f64], values: &mut [f64]) -> bool {
    if values.len() < ops.len() {
        return false;
    }
    for (i, op) in ops.iter().enumerate() {
        let (done, rest) = values.split_at_mut(i);
        let v = |id: ValueId| done.get(id as usize).copied().unwrap_or(f64::NAN);
        let out = match *op {
            Op::Input(slot) => inputs.get(slot as usize).copied().unwrap_or(f64::NAN),
            Op::Const(c) => c,
            Op::Add(a, b) => v(a) + v(b),
            Op::Sub(a, b) => v(a) - v(b),
            Op::Mul(a, b) => v(a) * v(b),
            Op::Div(a, b) => v(a) / v(b),
            Op::Neg(a) => -v(a),
            Op::Abs(a) => abs(v(a)),
            Op::Sqrt(a) => sqrt(v(a)),
            Op::Atan2(y, x) => atan2(v(y), v(x)),
            Op::Cbrt(a) => cbrt(v(a)),
            Op::Cos(a) => cos(v(a)),
            Op::Min(a, b) => v(a).min(v(b)),
            Op::Max(a, b) => v(a).max(v(b)),
            Op::Select(c, a, b) => {
                if v(c) >= 0.0 {
                    v(a)
                } else {
                    v(b)
                }
            }
        };
        if let Some(slot) = rest.first_mut() {
            *slot = out;
        }
    }
    true
}

/// Where a [`Check`] takes its values from.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CheckLayout {
    /// What the check guards.
    pub kind: CheckKind,
    /// Value of the squared quantity that is checked.
    pub have_squared: ValueId,
    /// Value of the limit it is checked against.
    pub limit: ValueId,
}

/// Where one candidate solution's numbers are in an evaluated plan.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CandidateLayout {
    /// Model values (radians or metres) of the six joints.
    pub model_values: [ValueId; JOINTS],
    /// The branch the candidate belongs to (fixed by the plan).
    pub branch: Branch,
    /// Conditions for the candidate to be real (unused slots have kind `None`).
    pub checks: [Option<CheckLayout>; 4],
    /// Value that is `≥ 0` when joint 5 is at the aligned position.
    pub wrist_aligned: Option<ValueId>,
    /// Value that is `≥ 0` when the wrist center is on axis 1.
    pub on_axis_1: Option<ValueId>,
}

/// Reads a candidate from evaluated values.
pub fn candidate(layout: &CandidateLayout, values: &[f64]) -> Candidate {
    let v = |id: ValueId| values.get(id as usize).copied().unwrap_or(f64::NAN);
    let flag = |id: Option<ValueId>| id.map(|id| v(id) >= 0.0).unwrap_or(false);
    let mut checks = [Check::NONE; 4];
    for (out, layout) in checks.iter_mut().zip(layout.checks.iter()) {
        if let Some(c) = layout {
            *out = Check {
                kind: c.kind,
                have_squared: v(c.have_squared),
                limit: v(c.limit),
            };
        }
    }
    let mut model_values = [0.0; JOINTS];
    for (out, id) in model_values.iter_mut().zip(layout.model_values.iter()) {
        *out = v(*id);
    }
    Candidate {
        model_values,
        branch: layout.branch,
        checks,
        wrist_aligned: flag(layout.wrist_aligned),
        on_axis_1: flag(layout.on_axis_1),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn evaluates_in_order_and_selects() {
        let ops = [
            Op::Input(0),
            Op::Const(4.0),
            Op::Mul(0, 1),
            Op::Sqrt(2),
            Op::Neg(3),
            Op::Select(4, 1, 3),
            Op::Atan2(1, 1),
        ];
        let mut values = [0.0; 7];
        assert!(evaluate(&ops, &[9.0], &mut values));
        assert_eq!(values[3], 6.0);
        assert_eq!(values[5], 6.0);
        assert!((values[6] - core::f64::consts::FRAC_PI_4).abs() < 1e-15);
    }

    #[test]
    fn cube_roots_and_cosines() {
        let ops = [
            Op::Input(0),
            Op::Cbrt(0),
            Op::Cos(0),
            Op::Neg(0),
            Op::Cbrt(3),
        ];
        let mut values = [0.0; 5];
        assert!(evaluate(&ops, &[-27.0], &mut values));
        assert_eq!(values[1], -3.0);
        assert_eq!(values[4], 3.0);
        // cos(−27) = cos(27 − 8π) = cos(1.86726…) ≈ −0.29214.
        assert!((values[2] + 0.29214).abs() < 1e-5);
    }

    #[test]
    fn short_buffer_and_bad_references_do_not_panic() {
        let ops = [Op::Add(5, 7), Op::Input(99)];
        let mut short = [0.0; 1];
        assert!(!evaluate(&ops, &[], &mut short));
        let mut values = [0.0; 2];
        assert!(evaluate(&ops, &[], &mut values));
        assert!(values[0].is_nan() && values[1].is_nan());
    }
}
