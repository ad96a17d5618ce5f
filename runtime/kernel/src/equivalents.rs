//! Equivalent angles of a solution, listed lazily.
//!
//! A solver returns one value per joint and branch. For a revolute joint whose range exceeds
//! one turn, that value is the equivalent angle nearest the center of the range (within half a
//! turn of it, so always inside the range); [`Solution::equivalents`] gives the joint's other
//! values within its limits, the held value plus or minus whole turns. Every combination of
//! them reaches the same pose: the set of solutions stays one per branch, whatever the ranges.

use crate::math::{tolerance, Growth, Scalar};
use crate::model::{Joint, JointKind};
use crate::solution::{Solution, JOINTS};

/// How far beyond a limit a joint value still counts as within it (radians or metres): the
/// rounding slack of `f64`, carried to other scalars by the ratio of the epsilons (the
/// solvers' limit tolerance).
pub const LIMIT_TOLERANCE: f64 = 1e-12;

/// The most whole turns [`Equivalents`] counts on either side of a held value: more than the
/// 16-turn ranges a description may give, a bound for a joint table from elsewhere.
const MAX_TURNS: i32 = 32;

/// One more in-range value of one joint: the held value plus `turns` whole turns.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Equivalent<S: Scalar = f64> {
    /// 0-based joint index.
    pub joint: usize,
    /// Whole turns added to the held value (never zero).
    pub turns: i32,
    /// The joint value, `held + 2π · turns` (radians), within the joint's limits.
    pub value: S,
}

/// The other in-range values of each joint of a solution, joint by joint, each joint's from
/// the lowest up; computed as they are asked for. See [`Solution::equivalents`].
#[derive(Clone, Debug)]
pub struct Equivalents<S: Scalar = f64> {
    held: [S; JOINTS],
    /// Per joint, the lowest and highest whole turns that stay within the limits
    /// (`lowest > highest` when there are none besides zero).
    lowest: [i32; JOINTS],
    highest: [i32; JOINTS],
    /// The next joint and turn to look at.
    joint: usize,
    turns: i32,
}

impl<S: Scalar> Equivalents<S> {
    /// The other values of `solution` within the limits of `joints` (the solver's joint table,
    /// `JOINT_TABLE` in an emitted module).
    pub fn new(solution: &Solution<S>, joints: &[Joint<S>; JOINTS]) -> Equivalents<S> {
        let tol: S = tolerance(LIMIT_TOLERANCE, Growth::Linear);
        let mut lowest = [1; JOINTS];
        let mut highest = [0; JOINTS];
        for i in 0..JOINTS {
            let (j, v) = (&joints[i], solution.joints[i]);
            let [lo, hi] = j.limits;
            // Prismatic joints have no turns; an unlimited revolute joint would have every
            // turn in range, and a held value outside the limits has no equivalents to list.
            if j.kind != JointKind::Revolute || !(lo.is_finite() && hi.is_finite()) {
                continue;
            }
            if !(v >= lo - tol && v <= hi + tol) {
                continue;
            }
            let turns = |x: S| (x / S::TAU).to_f64();
            // Whole turns k with lo − tol ≤ v + 2πk ≤ hi + tol.
            let from = ceil(turns(lo - tol - v)).max(-f64::from(MAX_TURNS));
            let to = floor(turns(hi + tol - v)).min(f64::from(MAX_TURNS));
            lowest[i] = from as i32;
            highest[i] = to as i32;
        }
        let mut out = Equivalents {
            held: solution.joints,
            lowest,
            highest,
            joint: 0,
            turns: lowest[0],
        };
        out.skip_held();
        out
    }

    /// How many other values each joint has.
    pub fn per_joint(&self) -> [usize; JOINTS] {
        let mut out = [0; JOINTS];
        for (i, n) in out.iter_mut().enumerate() {
            let (a, b) = (self.lowest[i], self.highest[i]);
            // The turn range always holds zero when it is not empty.
            *n = if b >= a { (b - a) as usize } else { 0 };
        }
        out
    }

    /// How many other configurations reach the same pose in the same branch: every
    /// combination of the joints' values, the held one excluded (saturating).
    pub fn configurations(&self) -> usize {
        self.per_joint()
            .iter()
            .fold(1usize, |n, k| n.saturating_mul(k + 1))
            - 1
    }

    /// Moves past the held value (zero turns) and past joints with nothing left.
    fn skip_held(&mut self) {
        while self.joint < JOINTS {
            let i = self.joint;
            if self.turns == 0 {
                self.turns = 1;
            }
            if self.turns <= self.highest[i] {
                return;
            }
            self.joint += 1;
            if let Some(&lowest) = self.lowest.get(self.joint) {
                self.turns = lowest;
            }
        }
    }
}

impl<S: Scalar> Iterator for Equivalents<S> {
    type Item = Equivalent<S>;

    fn next(&mut self) -> Option<Equivalent<S>> {
        let i = self.joint;
        let held = *self.held.get(i)?;
        let turns = self.turns;
        self.turns += 1;
        self.skip_held();
        Some(Equivalent {
            joint: i,
            turns,
            value: held + S::TAU * S::of(f64::from(turns)),
        })
    }

    fn size_hint(&self) -> (usize, Option<usize>) {
        let counts = self.per_joint();
        let mut left: usize = counts.iter().skip(self.joint + 1).sum();
        if let Some(&highest) = self.highest.get(self.joint) {
            // Turns from `self.turns` to `highest`, zero excluded.
            let span = highest - self.turns + 1;
            let zero_ahead = self.turns <= 0 && highest >= 0;
            left += span.max(0) as usize - usize::from(zero_ahead);
        }
        (left, Some(left))
    }
}

impl<S: Scalar> ExactSizeIterator for Equivalents<S> {}

impl<S: Scalar> Solution<S> {
    /// The other values of each joint within its limits (`joints`: the solver's joint table,
    /// `JOINT_TABLE` in an emitted module), lazily: for a revolute joint whose range exceeds a
    /// turn, the held value plus or minus whole turns. A solver holds each such joint at the
    /// value nearest its range's center (`solve`, `solve_branch`) or nearest the current value
    /// (`solve_near`); any combination of the listed values reaches the same pose.
    pub fn equivalents(&self, joints: &[Joint<S>; JOINTS]) -> Equivalents<S> {
        Equivalents::new(self, joints)
    }
}

/// The largest whole number not above `x`.
fn floor(x: f64) -> f64 {
    let r = crate::math::round(x);
    if r > x {
        r - 1.0
    } else {
        r
    }
}

/// The smallest whole number not below `x`.
fn ceil(x: f64) -> f64 {
    -floor(-x)
}

#[cfg(test)]
mod tests {
    use super::*;
    use core::f64::consts::{PI, TAU};

    fn table(limits: [f64; 2]) -> [Joint; JOINTS] {
        [Joint {
            kind: JointKind::Revolute,
            axis: [0.0, 0.0, 1.0],
            point: [0.0; 3],
            direction: 1.0,
            offset: 0.0,
            limits,
        }; JOINTS]
    }

    fn at(joints: [f64; JOINTS]) -> Solution {
        Solution {
            joints,
            ..Solution::EMPTY
        }
    }

    #[test]
    fn two_turns_each_side_give_two_others_per_joint() {
        // ±720°: a held value of 0.5 rad has 0.5 ± 2π and 0.5 − 4π in range (0.5 + 4π is not).
        let joints = table([-2.0 * TAU, 2.0 * TAU]);
        let list = at([0.5; JOINTS]).equivalents(&joints);
        assert_eq!(list.len(), 18);
        assert_eq!(list.per_joint(), [3; JOINTS]);
        assert_eq!(list.configurations(), 4usize.pow(6) - 1);
        let first: Vec<Equivalent> = list.clone().take(4).collect();
        assert_eq!(first[0].joint, 0);
        assert_eq!(first[0].turns, -2);
        assert!((first[0].value - (0.5 - 2.0 * TAU)).abs() < 1e-12);
        assert_eq!((first[2].joint, first[2].turns), (0, 1));
        assert_eq!((first[3].joint, first[3].turns), (1, -2));
        let mut left = list;
        let mut seen = 0;
        while let Some(e) = left.next() {
            seen += 1;
            assert_ne!(e.turns, 0);
            assert!(e.value >= -2.0 * TAU && e.value <= 2.0 * TAU);
            assert_eq!(left.len(), 18 - seen);
        }
        assert_eq!(seen, 18);
    }

    #[test]
    fn one_turn_ranges_have_none() {
        let joints = table([-PI, PI]);
        let list = at([PI; JOINTS]).equivalents(&joints);
        // −π is the same position as π, but both ends count as within [−π, π].
        assert_eq!(list.per_joint(), [1; JOINTS]);
        let joints = table([-3.0, 3.0]);
        assert_eq!(at([0.1; JOINTS]).equivalents(&joints).count(), 0);
        assert_eq!(at([0.1; JOINTS]).equivalents(&joints).configurations(), 0);
    }
}
