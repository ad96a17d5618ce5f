//! Rejections: which property fails, between which joints, by how much, and where in the file.

use std::fmt;

use armforge_runtime::JointKind;

use crate::diagnostics::Location;
use crate::model::Model;
use crate::units::Units;

/// The property that fails. Joint numbers are 1-based; lengths in metres, angles in radians.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(tag = "kind", rename_all = "snake_case"))]
pub enum Reason {
    /// The arm does not have six joints.
    JointCount {
        /// How many joints it has.
        count: usize,
    },
    /// A joint's axis or point is zero-length or not finite.
    InvalidAxis {
        /// The joint.
        joint: usize,
    },
    /// Joint 4, 5 or 6 slides: a spherical wrist needs three revolute joints.
    WristJointNotRevolute {
        /// The sliding joint.
        joint: usize,
    },
    /// Two consecutive wrist axes are parallel: a degenerate wrist.
    WristAxesParallel {
        /// The first joint of the pair (4 or 5).
        first: usize,
        /// The second joint of the pair (5 or 6).
        second: usize,
        /// The angle between the axes, radians.
        angle: f64,
        /// The distance between the axes, metres.
        distance: f64,
    },
    /// The wrist axes do not meet in one point; `first`/`second` is the pair that misses most.
    WristAxesMiss {
        /// The first joint of the pair.
        first: usize,
        /// The second joint of the pair.
        second: usize,
        /// The length of the pair's common normal, metres.
        gap: f64,
        /// The largest distance of the least-squares meeting point from the three axes.
        miss: f64,
    },
    /// The three wrist axes cross pairwise but not in one point (a triangle).
    WristAxesNotConcurrent {
        /// The largest distance of the least-squares meeting point from the three axes.
        miss: f64,
    },
    /// Axis 1 is parallel to axis 2: joints 1 and 2 cannot position the wrist center in space.
    #[cfg_attr(feature = "serde", serde(rename = "axes_1_and_2_parallel"))]
    Axes1And2Parallel {
        /// The angle between the axes, radians.
        angle: f64,
    },
    /// R R R whose axes 2 and 3 are not parallel.
    #[cfg_attr(feature = "serde", serde(rename = "elbow_axes_2_and_3_not_parallel"))]
    ElbowAxes2And3NotParallel {
        /// The angle between the axes, radians.
        angle: f64,
    },
    /// R R R whose axes 2 and 3 are one line: joints 2 and 3 turn about the same line.
    #[cfg_attr(feature = "serde", serde(rename = "elbow_axes_2_and_3_coincide"))]
    ElbowAxes2And3Coincide {
        /// The distance between the axes, metres.
        distance: f64,
    },
    /// R R R whose wrist center lies on axis 3: joint 3 cannot move it.
    #[cfg_attr(feature = "serde", serde(rename = "wrist_center_on_axis_3"))]
    WristCenterOnAxis3 {
        /// The distance of the wrist center from axis 3, metres.
        distance: f64,
    },
    /// General R R R whose axes 1 and 2 are one line: joints 1 and 2 turn about it alike.
    #[cfg_attr(feature = "serde", serde(rename = "general_axes_1_and_2_one_line"))]
    GeneralAxes1And2OneLine {
        /// The distance between the axes, metres.
        distance: f64,
    },
    /// General R R R whose axes 1, 2 and 3 meet in one point, with a spherical wrist: no joint
    /// changes the wrist center's distance from that point.
    #[cfg_attr(feature = "serde", serde(rename = "general_axes_1_to_3_meet"))]
    GeneralAxes1To3Meet {
        /// The distance of axis 3 from the point where axes 1 and 2 meet, metres.
        distance: f64,
    },
    /// General R R R whose wrist center lies on axis 3: joint 3 cannot move it.
    #[cfg_attr(feature = "serde", serde(rename = "general_wrist_center_on_axis_3"))]
    GeneralWristCenterOnAxis3 {
        /// The distance of the wrist center from axis 3, metres.
        distance: f64,
    },
    /// R R P whose slide is not perpendicular to axis 2.
    PolarSlideNotPerpendicular {
        /// The angle between the slide and axis 2, radians.
        angle: f64,
    },
    /// R P P whose slides are parallel.
    CylindricalSlidesParallel {
        /// The angle between the slides, radians.
        angle: f64,
    },
    /// R P P whose slides are both perpendicular to axis 1: the height along axis 1 is fixed.
    #[cfg_attr(
        feature = "serde",
        serde(rename = "cylindrical_slides_perpendicular_to_axis_1")
    )]
    CylindricalSlidesPerpendicularToAxis1 {
        /// The angles of the slides of joints 2 and 3 with axis 1, radians.
        angles: [f64; 2],
    },
    /// P P P whose slides are parallel in pairs or lie in one plane.
    CartesianSlidesDependent {
        /// The two slides that are parallel, if that is the failure.
        parallel_pair: Option<[usize; 2]>,
        /// The angle that should not be zero: between the parallel pair, or of slide 3 out of
        /// the plane of slides 1 and 2. Radians.
        angle: f64,
    },
    /// Joints 1–3 are a pattern no family covers (e.g. P R R).
    UnsupportedPattern {
        /// The kinds of joints 1, 2, 3 (`R`/`P`).
        pattern: String,
    },
    /// A family's own reason, in its own words (its folder in [`crate::family`]).
    Family {
        /// A short name (as in JSON `kind`).
        name: &'static str,
        /// The message, with numbers in the file's units.
        message: String,
        /// The measured numbers behind it.
        measures: Vec<(&'static str, Quantity)>,
    },
}

/// Another family the arm belongs to, said in general terms.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(tag = "kind", rename_all = "snake_case"))]
pub enum Note {
    /// Three consecutive revolute axes are parallel.
    ThreeParallelAxes {
        /// The first of the three joints.
        first: usize,
    },
    /// The axes of joints 1, 2, 3 meet in one point (instead of 4, 5, 6).
    FirstThreeMeet,
    /// The axes of three consecutive joints in the middle (2–4 or 3–5) meet in one point.
    MiddleThreeMeet {
        /// The first of the three joints.
        first: usize,
    },
    /// A spherical wrist, but joints 1–3 are no family of ours: Pieper's quartic.
    PieperQuartic,
    /// Six revolute joints and no decoupling: the general 6R problem.
    GeneralSixRevolute,
}

/// Why an arm has no decoupled closed form armforge can build, located in the file.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Rejection {
    /// The property that fails (SI numbers).
    pub reason: Reason,
    /// Other families the arm belongs to, if any.
    pub notes: Vec<Note>,
    /// The offending joint (1-based), whose table the location points at.
    pub joint: Option<usize>,
    /// The file, as given.
    pub path: String,
    /// Where the offending joint's table starts.
    #[cfg_attr(feature = "serde", serde(serialize_with = "location_as_pair"))]
    pub location: Location,
    /// The message, with numbers in the file's units.
    pub message: String,
    /// The notes, as sentences.
    pub note_texts: Vec<String>,
}

#[cfg(feature = "serde")]
fn location_as_pair<S: serde::Serializer>(l: &Location, s: S) -> Result<S::Ok, S::Error> {
    serde::Serialize::serialize(&[l.line, l.column], s)
}

impl Rejection {
    /// Builds the rejection of `model` for `reason`, pointing at `joint` (1-based).
    pub fn new(model: &Model, reason: Reason, joint: Option<usize>, notes: Vec<Note>) -> Self {
        let location = joint
            .and_then(|j| model.joints.get(j.wrapping_sub(1)))
            .or(model.joints.last())
            .map(|j| j.location)
            .unwrap_or(Location { line: 1, column: 1 });
        let message = describe(model, &reason);
        let note_texts = notes.iter().map(|n| describe_note(model, n)).collect();
        Rejection {
            reason,
            notes,
            joint,
            path: model.source_path.clone(),
            location,
            message,
            note_texts,
        }
    }

    /// True when the file itself is wrong (not a geometry question): a bad axis.
    pub fn is_bad_input(&self) -> bool {
        matches!(self.reason, Reason::InvalidAxis { .. })
    }
}

impl fmt::Display for Rejection {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "error: {}:{}:{}: {}",
            self.path, self.location.line, self.location.column, self.message
        )?;
        for note in &self.note_texts {
            write!(f, "\n  note: {note}")?;
        }
        Ok(())
    }
}

impl std::error::Error for Rejection {}

fn label(model: &Model, joint: usize) -> String {
    model.joint_label(joint.wrapping_sub(1))
}

/// The letters of a joint kind in patterns.
pub fn kind_letter(kind: JointKind) -> char {
    match kind {
        JointKind::Revolute => 'R',
        JointKind::Prismatic => 'P',
    }
}

const DECOUPLING: &str =
    "kinematic decoupling needs the axes of joints 4, 5 and 6 to meet in one point";

fn describe(model: &Model, reason: &Reason) -> String {
    let u: &Units = &model.units;
    match reason {
        Reason::JointCount { count } => format!(
            "the arm has {count} joint{}; armforge solves arms of exactly 6 joints \
             (3 to place the wrist center, 3 to orient the tool)",
            if *count == 1 { "" } else { "s" }
        ),
        Reason::InvalidAxis { joint } => format!(
            "{}: the axis direction is zero or a coordinate is not finite",
            label(model, *joint)
        ),
        Reason::WristJointNotRevolute { joint } => format!(
            "{} slides; a spherical wrist needs joints 4, 5 and 6 to turn, and {DECOUPLING}",
            label(model, *joint)
        ),
        Reason::WristAxesParallel {
            first,
            second,
            angle,
            distance,
        } => format!(
            "axes of {} and {} are parallel (angle {}, {} apart), so axes 4, 5 and 6 never meet \
             in one point and the last three joints cannot orient the tool by themselves: \
             kinematic decoupling at the wrist needs axis {first} not parallel to axis \
             {second}",
            label(model, *first),
            label(model, *second),
            u.show_angle(*angle),
            u.show_length(*distance)
        ),
        Reason::WristAxesMiss {
            first,
            second,
            gap,
            miss,
        } => format!(
            "axes of {} and {} pass {} apart (the nearest common point of axes 4, 5, 6 \
             misses one of them by {}); {DECOUPLING}",
            label(model, *first),
            label(model, *second),
            u.show_length(*gap),
            u.show_length(*miss)
        ),
        Reason::WristAxesNotConcurrent { miss } => format!(
            "axes of joints 4, 5 and 6 cross in pairs but not in one point (their nearest \
             common point misses one of them by {}); {DECOUPLING}",
            u.show_length(*miss)
        ),
        Reason::Axes1And2Parallel { angle } => format!(
            "axes of {} and {} are parallel (angle {}); joints 1–3 must place the wrist center \
             in space, which needs axis 1 not parallel to axis 2",
            label(model, 1),
            label(model, 2),
            u.show_angle(*angle)
        ),
        Reason::ElbowAxes2And3NotParallel { angle } => format!(
            "joints 1–3 turn (R R R) but axes of {} and {} make {}; the elbow family needs \
             axis 2 parallel to axis 3",
            label(model, 2),
            label(model, 3),
            u.show_angle(*angle)
        ),
        Reason::ElbowAxes2And3Coincide { distance } => format!(
            "axes of {} and {} are one line ({} apart); the elbow family needs an upper arm: \
             axis 3 away from axis 2",
            label(model, 2),
            label(model, 3),
            u.show_length(*distance)
        ),
        Reason::WristCenterOnAxis3 { distance } => format!(
            "the wrist center lies on the axis of {} ({} away), so joint 3 cannot move it; \
             the elbow family needs a forearm: the wrist center away from axis 3",
            label(model, 3),
            u.show_length(*distance)
        ),
        Reason::GeneralAxes1And2OneLine { distance } => format!(
            "axes of {} and {} are one line ({} apart): the two joints turn the arm alike, so \
             joints 1–3 cannot place the wrist center in space",
            label(model, 1),
            label(model, 2),
            u.show_length(*distance)
        ),
        Reason::GeneralAxes1To3Meet { distance } => format!(
            "axes of {}, {} and {} meet in one point (axis 3 passes {} from where axes 1 and 2 \
             meet) and the wrist is spherical: no joint changes the wrist center's distance \
             from that point, so the arm cannot reach a volume",
            label(model, 1),
            label(model, 2),
            label(model, 3),
            u.show_length(*distance)
        ),
        Reason::GeneralWristCenterOnAxis3 { distance } => format!(
            "the wrist center lies on the axis of {} ({} away), so joint 3 cannot move it: \
             joints 1–3 cannot place the wrist center in space",
            label(model, 3),
            u.show_length(*distance)
        ),
        Reason::PolarSlideNotPerpendicular { angle } => format!(
            "the slide of {} makes {} with the axis of {}; the polar family (R R P) needs the \
             slide perpendicular to axis 2",
            label(model, 3),
            u.show_angle(*angle),
            label(model, 2)
        ),
        Reason::CylindricalSlidesParallel { angle } => format!(
            "the slides of {} and {} are parallel (angle {}); the cylindrical family (R P P) \
             needs two slides in different directions",
            label(model, 2),
            label(model, 3),
            u.show_angle(*angle)
        ),
        Reason::CylindricalSlidesPerpendicularToAxis1 { angles } => format!(
            "the slides of {} and {} make {} and {} with the axis of {}; the cylindrical family \
             (R P P) needs one slide with a component along axis 1",
            label(model, 2),
            label(model, 3),
            u.show_angle(angles[0]),
            u.show_angle(angles[1]),
            label(model, 1)
        ),
        Reason::CartesianSlidesDependent {
            parallel_pair,
            angle,
        } => match parallel_pair {
            Some([a, b]) => format!(
                "the slides of {} and {} are parallel (angle {}); the cartesian family \
                 (P P P) needs three independent slides",
                label(model, *a),
                label(model, *b),
                u.show_angle(*angle)
            ),
            None => format!(
                "the slide of {} leaves the plane of the slides of joints 1 and 2 by only {}; \
                 the cartesian family (P P P) needs three independent slides",
                label(model, 3),
                u.show_angle(*angle)
            ),
        },
        Reason::UnsupportedPattern { pattern } => format!(
            "joints 1–3 are {pattern}; armforge's families of joints 1–3 with a spherical wrist \
             are {}",
            super::family::decoupled_families()
        ),
        Reason::Family { message, .. } => message.clone(),
    }
}

fn describe_note(model: &Model, note: &Note) -> String {
    let _ = model;
    match note {
        Note::ThreeParallelAxes { first } => format!(
            "the axes of joints {}, {} and {} are parallel: an arm with three consecutive \
             parallel axes has a closed form (Pieper 1968), but not by decoupling at the wrist; \
             armforge's three-parallel and offset-hand families build it for parallel axes 2, \
             3 and 4 (axes 5 and 6 meeting or apart), its base-parallel family for parallel \
             axes 1, 2 and 3 (axes 4 and 5 apart, meeting or parallel), and its tool-first family for parallel axes \
             3, 4 and 5 or 4, 5 and 6 (the same shapes read from the tool), six revolute joints \
             each",
            first,
            first + 1,
            first + 2
        ),
        Note::FirstThreeMeet => "the axes of joints 1, 2 and 3 meet in one point instead of \
             those of joints 4, 5 and 6: such an arm decouples at its base (Pieper's \
             criterion, Pieper 1968); armforge's wrist-at-base family builds it when joints 6, \
             5 and 4, read from the tool, are one of its families of joints 1–3"
            .to_string(),
        Note::MiddleThreeMeet { first } => format!(
            "the axes of joints {}, {} and {} meet in one point: Pieper's criterion holds and \
             a closed form exists (Pieper 1968): the point is fixed in link {} and in link {}, \
             so it is placed by {} from the base and by {} from the tool, a three-joint position \
             problem like joints 1–3 of the general family; {}",
            first,
            first + 1,
            first + 2,
            first - 1,
            first + 2,
            if *first == 2 {
                "joint 1"
            } else {
                "joints 1 and 2"
            },
            if *first == 2 {
                "joints 6 and 5"
            } else {
                "joint 6"
            },
            if *first == 2 {
                "armforge's mid-wrist family builds it when joints 1, 5 and 6 turn and the \
                 point is off axes 1 and 5"
            } else {
                "armforge's tool-first family builds it, reading the arm from its tool as a \
                 mid-wrist arm, when joints 1, 2 and 6 turn and the point is off axes 6 and 2"
            },
        ),
        Note::PieperQuartic => "the wrist is spherical, so Pieper's criterion holds and a \
             closed form exists (Pieper 1968): the general family solves joints 1–3 of no named \
             family through a quartic, or through quadratics when axes 1 and 2 meet or are \
             parallel"
            .to_string(),
        Note::GeneralSixRevolute => "six revolute joints with no three consecutive axes meeting \
             in a point and no three consecutive parallel axes: armforge knows no closed form \
             for such an arm; in general it has up to 16 solutions (Raghavan & Roth 1990), \
             found numerically or by polynomial elimination"
            .to_string(),
    }
}

/// A measured number of a rejection, for reports in the file's units.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(
    feature = "serde",
    serde(tag = "unit", content = "value", rename_all = "snake_case")
)]
pub enum Quantity {
    /// A length in metres.
    Length(f64),
    /// An angle in radians.
    Angle(f64),
    /// A plain count.
    Count(usize),
}

impl Reason {
    /// The short name of the reason (as in JSON `kind`).
    pub fn kind(&self) -> &'static str {
        match self {
            Reason::JointCount { .. } => "joint_count",
            Reason::InvalidAxis { .. } => "invalid_axis",
            Reason::WristJointNotRevolute { .. } => "wrist_joint_not_revolute",
            Reason::WristAxesParallel { .. } => "wrist_axes_parallel",
            Reason::WristAxesMiss { .. } => "wrist_axes_miss",
            Reason::WristAxesNotConcurrent { .. } => "wrist_axes_not_concurrent",
            Reason::Axes1And2Parallel { .. } => "axes_1_and_2_parallel",
            Reason::ElbowAxes2And3NotParallel { .. } => "elbow_axes_2_and_3_not_parallel",
            Reason::ElbowAxes2And3Coincide { .. } => "elbow_axes_2_and_3_coincide",
            Reason::WristCenterOnAxis3 { .. } => "wrist_center_on_axis_3",
            Reason::GeneralAxes1And2OneLine { .. } => "general_axes_1_and_2_one_line",
            Reason::GeneralAxes1To3Meet { .. } => "general_axes_1_to_3_meet",
            Reason::GeneralWristCenterOnAxis3 { .. } => "general_wrist_center_on_axis_3",
            Reason::PolarSlideNotPerpendicular { .. } => "polar_slide_not_perpendicular",
            Reason::CylindricalSlidesParallel { .. } => "cylindrical_slides_parallel",
            Reason::CylindricalSlidesPerpendicularToAxis1 { .. } => {
                "cylindrical_slides_perpendicular_to_axis_1"
            }
            Reason::CartesianSlidesDependent { .. } => "cartesian_slides_dependent",
            Reason::UnsupportedPattern { .. } => "unsupported_pattern",
            Reason::Family { name, .. } => name,
        }
    }

    /// The measured numbers behind the reason, named.
    pub fn measures(&self) -> Vec<(&'static str, Quantity)> {
        use Quantity::{Angle, Count, Length};
        match self {
            Reason::JointCount { count } => vec![("joint_count", Count(*count))],
            Reason::InvalidAxis { .. }
            | Reason::WristJointNotRevolute { .. }
            | Reason::UnsupportedPattern { .. } => Vec::new(),
            Reason::WristAxesParallel {
                angle, distance, ..
            } => vec![("angle", Angle(*angle)), ("distance", Length(*distance))],
            Reason::WristAxesMiss { gap, miss, .. } => {
                vec![("gap", Length(*gap)), ("miss", Length(*miss))]
            }
            Reason::WristAxesNotConcurrent { miss } => vec![("miss", Length(*miss))],
            Reason::Axes1And2Parallel { angle }
            | Reason::ElbowAxes2And3NotParallel { angle }
            | Reason::PolarSlideNotPerpendicular { angle }
            | Reason::CylindricalSlidesParallel { angle }
            | Reason::CartesianSlidesDependent { angle, .. } => vec![("angle", Angle(*angle))],
            Reason::ElbowAxes2And3Coincide { distance }
            | Reason::WristCenterOnAxis3 { distance }
            | Reason::GeneralAxes1And2OneLine { distance }
            | Reason::GeneralAxes1To3Meet { distance }
            | Reason::GeneralWristCenterOnAxis3 { distance } => {
                vec![("distance", Length(*distance))]
            }
            Reason::CylindricalSlidesPerpendicularToAxis1 { angles } => vec![
                ("angle_2_to_axis_1", Angle(angles[0])),
                ("angle_3_to_axis_1", Angle(angles[1])),
            ],
            Reason::Family { measures, .. } => measures.clone(),
        }
    }
}
