//! What every classification step needs: the joint lines, their kinds, the resolved
//! tolerances, and ways to reject with a location.

use armforge_runtime::JointKind;
use nalgebra::Point3;

use super::lines::{angle_between_lines, closest_points, least_squares_meeting_point, Line};
use super::reject::{Note, Reason, Rejection};
use super::tolerances::{Resolved, Tolerances};
use crate::model::Model;

/// The number of joints a decoupled arm has.
pub const JOINTS: usize = 6;

/// The model seen as lines, with tolerances resolved for its size.
pub struct Context<'a> {
    /// The model being classified.
    pub model: &'a Model,
    /// Tolerances as given.
    pub tolerances: Tolerances,
    /// Tolerances in metres and radians for this arm.
    pub tol: Resolved,
    lines: Vec<Line>,
    kinds: Vec<JointKind>,
}

/// Where three lines come closest together, and how far the worst of them stays away.
pub struct Meeting {
    /// The least-squares meeting point.
    pub point: Point3<f64>,
    /// The largest distance of the point from the lines.
    pub miss: f64,
}

impl<'a> Context<'a> {
    /// Checks the joint count and the axes, and resolves the tolerances.
    pub fn new(model: &'a Model, tolerances: &Tolerances) -> Result<Self, Rejection> {
        let count = model.joints.len();
        if count != JOINTS {
            let joint = if count > JOINTS { JOINTS + 1 } else { count };
            return Err(Rejection::new(
                model,
                Reason::JointCount { count },
                (joint > 0).then_some(joint),
                Vec::new(),
            ));
        }
        let mut lines = Vec::with_capacity(JOINTS);
        for (i, j) in model.joints.iter().enumerate() {
            match Line::new(j.joint.point, j.joint.axis) {
                Some(line) => lines.push(line),
                None => {
                    return Err(Rejection::new(
                        model,
                        Reason::InvalidAxis { joint: i + 1 },
                        Some(i + 1),
                        Vec::new(),
                    ))
                }
            }
        }
        Ok(Context {
            model,
            tolerances: *tolerances,
            tol: Resolved::for_model(model, tolerances),
            lines,
            kinds: model.joints.iter().map(|j| j.joint.kind).collect(),
        })
    }

    /// The axis line of joint `n` (1-based, 1..=6).
    pub fn line(&self, n: usize) -> &Line {
        &self.lines[n - 1]
    }

    /// The kind of joint `n` (1-based).
    pub fn kind(&self, n: usize) -> JointKind {
        self.kinds[n - 1]
    }

    /// True when joint `n` turns.
    pub fn revolute(&self, n: usize) -> bool {
        self.kind(n) == JointKind::Revolute
    }

    /// The angle between the axes of joints `a` and `b`, in `[0, π/2]`.
    pub fn angle(&self, a: usize, b: usize) -> f64 {
        angle_between_lines(self.line(a), self.line(b))
    }

    /// True when the axes of joints `a` and `b` are parallel within the tolerance.
    pub fn parallel(&self, a: usize, b: usize) -> bool {
        self.angle(a, b) <= self.tol.angle
    }

    /// The length of the common normal of the axes of joints `a` and `b`.
    pub fn gap(&self, a: usize, b: usize) -> f64 {
        closest_points(self.line(a), self.line(b), self.tol.angle).distance
    }

    /// The least-squares meeting point of the axes of `joints`; `None` when they are all
    /// parallel.
    pub fn meeting(&self, joints: &[usize]) -> Option<Meeting> {
        let lines: Vec<Line> = joints.iter().map(|&n| *self.line(n)).collect();
        let rank = 0.25 * self.tol.angle * self.tol.angle;
        let point = least_squares_meeting_point(&lines, rank)?;
        let miss = lines
            .iter()
            .map(|l| l.distance_to(&point))
            .fold(0.0, f64::max);
        Some(Meeting { point, miss })
    }

    /// True when joints `first..first+3` turn and their axes meet in one point.
    pub fn three_meet(&self, first: usize) -> bool {
        let joints = [first, first + 1, first + 2];
        joints.iter().all(|&n| self.revolute(n))
            && self
                .meeting(&joints)
                .is_some_and(|m| m.miss <= self.tol.distance)
    }

    /// True when joints `first..first+3` turn and their axes are parallel.
    pub fn three_parallel(&self, first: usize) -> bool {
        (first..first + 3).all(|n| self.revolute(n))
            && self.parallel(first, first + 1)
            && self.parallel(first + 1, first + 2)
    }

    /// The families, in general terms, that an arm whose wrist is not spherical belongs to.
    /// `general` allows the general-6R note (not for a degenerate wrist, whose trouble is the
    /// missing orientation, not the missing closed form).
    pub fn notes_without_wrist(&self, general: bool) -> Vec<Note> {
        let mut notes: Vec<Note> = (1..=JOINTS - 2)
            .filter(|&first| self.three_parallel(first))
            .map(|first| Note::ThreeParallelAxes { first })
            .collect();
        if self.three_meet(1) {
            notes.push(Note::FirstThreeMeet);
        }
        notes.extend(
            (2..=3)
                .filter(|&first| self.three_meet(first))
                .map(|first| Note::MiddleThreeMeet { first }),
        );
        let all_revolute = (1..=JOINTS).all(|n| self.revolute(n));
        let any_meet = (1..=JOINTS - 2).any(|first| self.three_meet(first));
        if general && notes.is_empty() && all_revolute && !any_meet {
            notes.push(Note::GeneralSixRevolute);
        }
        notes
    }

    /// A rejection of this arm, pointing at joint `joint` (1-based).
    pub fn reject(&self, reason: Reason, joint: usize, notes: Vec<Note>) -> Rejection {
        Rejection::new(self.model, reason, Some(joint), notes)
    }

    /// A rejection in a family's own words (`Reason::Family`: a short name, the message with
    /// numbers in the file's units, the measured quantities), pointing at joint `joint`.
    pub fn reject_family(
        &self,
        name: &'static str,
        joint: usize,
        message: String,
        measures: Vec<(&'static str, super::reject::Quantity)>,
    ) -> Rejection {
        let reason = Reason::Family {
            name,
            message,
            measures,
        };
        self.reject(reason, joint, Vec::new())
    }
}
