//! What a solver returns: solutions with their branch labels and flags, in a fixed-capacity
//! set, or the reason why a target cannot be reached.
//!
//! Joint values are SI (radians for revolute joints, metres for prismatic ones).

use core::fmt;

use crate::compact::Compact;
use crate::math::{rotation_tolerance, Scalar};

/// Number of joints of every arm armforge solves.
pub const JOINTS: usize = 6;

/// Which of the (up to two) solutions of the first joint choice an arm is in.
///
/// Each choice has one word, used alike by the types, `Display`, JSON, `--branch`, the review
/// sheet and the drawings ([`Shoulder::word`]).
///
/// * Elbow and polar arms: the wrist center's side of the plane through axis 1 spanned by
///   axes 1 and 2 (normal `h1 × h2`). `Facing` is the side on which the wrist center lies in
///   the zero configuration, `Across` the other one (the wrist center reached across the
///   plane, over or past axis 1).
/// * Cylindrical arms: the sign of the radial slide's reach along its own direction measured
///   from the point of the slide's line closest to axis 1: `Facing` reaches out along the
///   slide's direction, `Across` through the other side of axis 1.
/// * Cartesian arms have no such choice: `Only`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Shoulder {
    /// The wrist center on the side of axis 1 it has in the zero configuration.
    Facing,
    /// The wrist center reached across axis 1, on the side opposite to its zero-configuration
    /// side.
    Across,
    /// The arm's family has a single shoulder solution.
    Only,
}

/// Which of the (up to two) solutions of the second joint choice an arm is in.
///
/// * Elbow arms: the sign of the elbow bend measured from the stretched configuration (the
///   angle from the upper arm to the forearm about axis 2). `Up` puts the elbow on the side of
///   the shoulder–wrist-center line toward axis 1's direction when the shoulder is `Facing`;
///   the label follows the arm when it reaches across, so `Up` keeps meaning "the elbow above
///   the line" for an arm whose axis 1 points up.
/// * Polar arms: which root of the slide's length: `Extended` the larger, `Retracted` the
///   smaller (the slide passing the wrist center's nearest approach to axis 2).
/// * Cylindrical and cartesian arms: `Only`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Elbow {
    /// Elbow arm, elbow toward axis 1's direction.
    Up,
    /// Elbow arm, elbow away from axis 1's direction.
    Down,
    /// Polar arm, the longer slide root.
    Extended,
    /// Polar arm, the shorter slide root.
    Retracted,
    /// The arm's family has a single solution here.
    Only,
}

/// Which of the two wrist solutions an arm is in: the side of the aligned position (where
/// axes 4 and 6 line up) joint 5 is turned to. `Leading` when axis 6 leans toward `h4 × h5`,
/// i.e. `(h4 × h5) · R5(θ5) h6 ≥ 0` (all vectors as seen after joint 4), `Trailing`
/// otherwise (axis 6 leaning away from `h4 × h5`).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Wrist {
    /// Joint 5 turned so that axis 6 leans toward `h4 × h5` (or aligned).
    Leading,
    /// Joint 5 turned so that axis 6 leans away from `h4 × h5`.
    Trailing,
}

impl Shoulder {
    /// Every shoulder choice, in the order of [`Shoulder::word`]'s documentation.
    pub const ALL: [Shoulder; 3] = [Shoulder::Facing, Shoulder::Across, Shoulder::Only];

    /// The choice's one word: `facing`, `across` or `only`.
    pub const fn word(self) -> &'static str {
        match self {
            Shoulder::Facing => "facing",
            Shoulder::Across => "across",
            Shoulder::Only => "only",
        }
    }

    /// The choice named by `word` (as [`Shoulder::word`] writes it).
    pub fn from_word(word: &str) -> Option<Shoulder> {
        Shoulder::ALL.into_iter().find(|c| c.word() == word)
    }
}

impl Elbow {
    /// Every elbow choice.
    pub const ALL: [Elbow; 5] = [
        Elbow::Up,
        Elbow::Down,
        Elbow::Extended,
        Elbow::Retracted,
        Elbow::Only,
    ];

    /// The choice's one word: `up`, `down`, `extended`, `retracted` or `only`.
    pub const fn word(self) -> &'static str {
        match self {
            Elbow::Up => "up",
            Elbow::Down => "down",
            Elbow::Extended => "extended",
            Elbow::Retracted => "retracted",
            Elbow::Only => "only",
        }
    }

    /// The choice named by `word` (as [`Elbow::word`] writes it).
    pub fn from_word(word: &str) -> Option<Elbow> {
        Elbow::ALL.into_iter().find(|c| c.word() == word)
    }
}

impl Wrist {
    /// Both wrist choices.
    pub const ALL: [Wrist; 2] = [Wrist::Leading, Wrist::Trailing];

    /// The choice's one word: `leading` or `trailing`.
    pub const fn word(self) -> &'static str {
        match self {
            Wrist::Leading => "leading",
            Wrist::Trailing => "trailing",
        }
    }

    /// The choice named by `word` (as [`Wrist::word`] writes it).
    pub fn from_word(word: &str) -> Option<Wrist> {
        Wrist::ALL.into_iter().find(|c| c.word() == word)
    }
}

/// The branch label of a configuration: the choice at the shoulder, the elbow and the wrist.
///
/// A label is a function of the joint values alone (see each solver's `branch_of`), so a
/// controller can hold one branch while it moves. It displays as the three words separated by
/// commas (`facing, up, leading`), the words `armforge solve --branch` reads.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub struct Branch {
    /// Shoulder choice.
    pub shoulder: Shoulder,
    /// Elbow choice.
    pub elbow: Elbow,
    /// Wrist choice.
    pub wrist: Wrist,
}

impl fmt::Display for Branch {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "{}, {}, {}",
            self.shoulder.word(),
            self.elbow.word(),
            self.wrist.word()
        )
    }
}

/// Conditions a solution was found under (a small bit set).
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash)]
pub struct Flags(u8);

impl Flags {
    /// No condition.
    pub const NONE: Flags = Flags(0);
    /// Joint 5 at the aligned position: joints 4 and 6 turn about one line, only their sum (or
    /// difference) is fixed by the pose. Joint 4 was kept at the reference value (or the
    /// reference plus a half turn for the second representative), unless that put joint 4 or
    /// 6 outside its limits: then at the nearest value that keeps both within them.
    pub const WRIST_ALIGNED: Flags = Flags(1);
    /// The wrist center on axis 1: joint 1 is free; it was kept at the reference value (or the
    /// reference plus a half turn), unless that put a joint outside its limits: then at the
    /// nearest value that keeps every joint within them.
    pub const ON_AXIS_1: Flags = Flags(2);
    /// The target is on a reach boundary (within the solver's tolerance) — of the arm's reach,
    /// of an inner hole, or of the cone of orientations a wrist with twists other than 90°
    /// reaches: two branches meet in one configuration, returned once.
    pub const AT_REACH_LIMIT: Flags = Flags(4);

    /// True when every condition in `other` is set here.
    pub const fn contains(self, other: Flags) -> bool {
        self.0 & other.0 == other.0
    }
    /// True when no condition is set.
    pub const fn is_empty(self) -> bool {
        self.0 == 0
    }
    /// Both sets of conditions.
    pub const fn union(self, other: Flags) -> Flags {
        Flags(self.0 | other.0)
    }
    /// True when the solution is at a singularity or a boundary (any flag set).
    pub const fn is_singular(self) -> bool {
        self.0 != 0
    }
}

/// One inverse-kinematics solution, in the scalar `S` of its solver (`f64` unless said
/// otherwise).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Solution<S: Scalar = f64> {
    /// Joint values, SI (radians or metres), within the joints' limits.
    pub joints: [S; JOINTS],
    /// The branch this configuration belongs to.
    pub branch: Branch,
    /// Singular conditions met by this solution.
    pub flags: Flags,
}

impl<S: Scalar> Solution<S> {
    /// A placeholder used to fill fixed-capacity storage.
    pub const EMPTY: Solution<S> = Solution {
        joints: [S::ZERO; JOINTS],
        branch: Branch {
            shoulder: Shoulder::Only,
            elbow: Elbow::Only,
            wrist: Wrist::Leading,
        },
        flags: Flags::NONE,
    };
}

/// What is wrong with a target pose given to a solver.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum PoseProblem<S: Scalar = f64> {
    /// An entry is NaN or infinite.
    NotFinite,
    /// `RᵀR` differs from the identity by more than the scalar's rotation tolerance
    /// ([`crate::math::rotation_tolerance`]: 1e-6 for `f64`, about 7.6e-6 for `f32`); the
    /// largest entry difference is given.
    NotOrthonormal {
        /// Largest absolute entry of `RᵀR − I`.
        error: S,
    },
    /// The rotation is a reflection (determinant −1).
    Reflection,
}

/// Why a target has no solution.
///
/// The amounts are in the solver's scalar `S` (`f64` unless said otherwise).
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Unreachable<S: Scalar = f64> {
    /// The pose itself is invalid.
    InvalidPose(PoseProblem<S>),
    /// The wrist center is farther than the arm reaches, by `by` metres.
    BeyondReach {
        /// Metres beyond the reach.
        by: S,
    },
    /// The wrist center is inside the region the arm cannot reach around its shoulder
    /// (too close to axis 1 for the shoulder offset, or closer to axis 2 than the folded arm),
    /// by `by` metres.
    InsideHole {
        /// Metres inside the unreachable region.
        by: S,
    },
    /// The wrist cannot turn the tool to the requested orientation (possible only for wrists
    /// whose twist angles differ); `by` is the angle in radians by which the requested
    /// direction of axis 6 misses the cone the wrist can reach.
    WristOrientation {
        /// Radians outside the reachable cone.
        by: S,
    },
    /// Every solution has a joint outside its limits; the one closest to the limits violates
    /// `joint` (0-based) by `by` (radians or metres).
    OutsideLimits {
        /// 0-based joint index.
        joint: usize,
        /// Radians or metres beyond the nearest limit.
        by: S,
    },
    /// The target is reachable, but not in the requested branch.
    BranchUnavailable,
    /// The requested branch is none of this arm's (an elbow word for a polar arm, say): no
    /// target ever has a solution in it.
    NoSuchBranch,
}

impl<S: Scalar> fmt::Display for Unreachable<S> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match *self {
            Unreachable::InvalidPose(PoseProblem::NotFinite) => {
                write!(f, "invalid pose: an entry is NaN or infinite")
            }
            Unreachable::InvalidPose(PoseProblem::NotOrthonormal { error }) => write!(
                f,
                "invalid pose: the rotation is not orthonormal (RᵀR − I up to {}, allowed {})",
                Compact(error.to_f64()),
                Compact(rotation_tolerance::<S>().to_f64())
            ),
            Unreachable::InvalidPose(PoseProblem::Reflection) => {
                write!(f, "invalid pose: the rotation is a reflection (determinant −1)")
            }
            Unreachable::BeyondReach { by } => {
                write!(f, "the wrist center is beyond reach by {} m", Compact(by.to_f64()))
            }
            Unreachable::InsideHole { by } => write!(
                f,
                "the wrist center is inside the unreachable region near the shoulder by {} m",
                Compact(by.to_f64())
            ),
            Unreachable::WristOrientation { by } => write!(
                f,
                "the wrist cannot reach this orientation: axis 6 misses its reachable cone by {} rad",
                Compact(by.to_f64())
            ),
            Unreachable::OutsideLimits { joint, by } => write!(
                f,
                "every solution is outside the joint limits; the closest violates joint {} by {} (radians; metres for a slide)",
                joint + 1,
                Compact(by.to_f64())
            ),
            Unreachable::BranchUnavailable => {
                write!(f, "the target is reachable, but not in the requested branch")
            }
            Unreachable::NoSuchBranch => {
                write!(f, "this arm has no such branch")
            }
        }
    }
}

/// Solutions in fixed-capacity storage (no heap), with the reason when there are none; in the
/// scalar `S` of its solver (`f64` unless said otherwise).
#[derive(Clone, Debug)]
pub struct SolutionSet<const CAP: usize, S: Scalar = f64> {
    solutions: [Solution<S>; CAP],
    len: usize,
    reason: Option<Unreachable<S>>,
}

impl<const CAP: usize, S: Scalar> SolutionSet<CAP, S> {
    /// An empty set with a reason.
    pub const fn unreachable(reason: Unreachable<S>) -> Self {
        SolutionSet {
            solutions: [Solution::EMPTY; CAP],
            len: 0,
            reason: Some(reason),
        }
    }

    /// An empty set without a reason, to be filled in place through [`Self::storage_mut`] and
    /// [`Self::record`] (the storage is set up once and not copied).
    #[inline(always)]
    pub(crate) const fn empty() -> Self {
        SolutionSet {
            solutions: [Solution::EMPTY; CAP],
            len: 0,
            reason: None,
        }
    }

    /// The whole storage, to write solutions into.
    #[inline(always)]
    pub(crate) fn storage_mut(&mut self) -> &mut [Solution<S>] {
        &mut self.solutions
    }

    /// Records how many solutions were written, or the reason for none.
    #[inline(always)]
    pub(crate) fn record(&mut self, outcome: Result<usize, Unreachable<S>>) {
        match outcome {
            Ok(len) => self.len = if len < CAP { len } else { CAP },
            Err(reason) => self.reason = Some(reason),
        }
    }

    /// The solutions as a slice.
    pub fn as_slice(&self) -> &[Solution<S>] {
        self.solutions.get(..self.len).unwrap_or(&[])
    }

    /// Iterates over the solutions.
    pub fn iter(&self) -> core::slice::Iter<'_, Solution<S>> {
        self.as_slice().iter()
    }

    /// Number of solutions.
    pub fn len(&self) -> usize {
        self.len
    }

    /// True when there is no solution.
    pub fn is_empty(&self) -> bool {
        self.len == 0
    }

    /// Why there is no solution (`None` when there is at least one).
    pub fn reason(&self) -> Option<Unreachable<S>> {
        self.reason
    }

    /// `Ok(solutions)` or `Err(reason)`.
    pub fn status(&self) -> Result<&[Solution<S>], Unreachable<S>> {
        match self.reason {
            Some(reason) if self.len == 0 => Err(reason),
            _ => Ok(self.as_slice()),
        }
    }
}

impl<'a, const CAP: usize, S: Scalar> IntoIterator for &'a SolutionSet<CAP, S> {
    type Item = &'a Solution<S>;
    type IntoIter = core::slice::Iter<'a, Solution<S>>;
    fn into_iter(self) -> Self::IntoIter {
        self.iter()
    }
}
