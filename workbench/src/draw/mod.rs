//! Drawings of an arm for people: side, top and front views to scale, as SVG.
//!
//! A reviewer of a new arm file should see, without deriving anything, that the description
//! matches the physical robot: a wrong sign in one row of a table is invisible in numbers but
//! obvious in a picture. A drawing shows, in the world frame and to one scale:
//!
//! - each joint at its centre (the foot of the common normal from the previous joint's axis),
//!   a circle for a revolute joint and a square for a prismatic one, numbered from the base;
//! - each joint's positive direction as an arrow (right-hand rule for a revolute joint), or ⊙ /
//!   ⊗ when it points out of or into the page;
//! - the links between the joints, a prismatic joint's rail over its limits, the wrist
//!   center, the tool frame (x, y, z in red, green, blue), the base frame and the mount plate;
//! - a grid and a scale bar in the file's length unit; joint values in the file's units.
//!
//! [`Drawing::configuration`] draws one configuration; [`Drawing::solutions`] draws one panel
//! per solution of a tool pose, side by side, each labelled with its branch, over the target
//! pose. The output is deterministic: the same input gives the same bytes.
//!
//! Each view is an SVG group with `class="view"`, `data-view`, `data-panel`, `data-scale`
//! (px per metre) and `data-origin-x`/`-y` (the world origin on the page, px); joints are
//! groups with `class="joint"` and `data-joint` (1-based), so tools and tests can map a drawing
//! back to the world.

mod footer;
mod geometry;
mod labels;
mod layout;
mod page;
mod panels;
mod primitives;
mod render_view;
mod scale_bar;
mod scene;
mod style;
mod symbols;
mod view;

use armforge_runtime::{JointKind, Pose};

use armforge_compiler::model::Model;

pub use layout::Arrangement;
pub use panels::solution_panels;
pub use scale_bar::{round_length, ScaleBar};
pub use scene::{ArmScene, JointMark, Skeleton};
pub use view::ViewKind;

/// Largest distance (metres) from the point nearest to the last three axes to any of them for
/// that point to count as a wrist center when no classification is at hand.
const WRIST_AXES_MEET: f64 = 1e-6;

/// One configuration drawn in one panel.
#[derive(Clone, Debug, PartialEq)]
pub struct Panel {
    /// The panel's heading, e.g. the branch label of a solution.
    pub caption: String,
    /// Joint values in SI units (radians, metres); missing values count as zero.
    pub joint_values: Vec<f64>,
    /// Other joint values that put the arm in the same place (whole turns of revolute
    /// joints), named under the joint values.
    pub alternatives: Vec<Vec<f64>>,
}

/// A drawing of an arm: one or more panels of the same views at one scale.
#[derive(Clone, Debug)]
pub struct Drawing<'a> {
    /// The arm.
    pub model: &'a Model,
    /// What the drawing shows, next to the arm's name in the title.
    pub subject: String,
    /// The panels, in order.
    pub panels: Vec<Panel>,
    /// The views in each panel.
    pub views: Vec<ViewKind>,
    /// How a panel's views are arranged.
    pub arrangement: Arrangement,
    /// Panels per row.
    pub columns: usize,
    /// The wrist center in the base frame with every model value at zero, if the arm has one.
    pub wrist_center: Option<[f64; 3]>,
    /// A target tool pose in the world, drawn in every panel.
    pub target: Option<Pose>,
}

impl<'a> Drawing<'a> {
    /// One configuration (joint values in SI units) in side, top and front views side by side.
    /// The wrist center is the common point of the last three axes when they meet.
    pub fn configuration(model: &'a Model, joint_values: Vec<f64>) -> Drawing<'a> {
        Drawing {
            model,
            subject: "one configuration".to_string(),
            panels: vec![Panel {
                caption: "joint values".to_string(),
                joint_values,
                alternatives: Vec::new(),
            }],
            views: vec![ViewKind::Side, ViewKind::Top, ViewKind::End],
            arrangement: Arrangement::Row,
            columns: 1,
            wrist_center: wrist_center_from_axes(model),
            target: None,
        }
    }

    /// Every configuration for a tool pose (world frame, SI): one panel each with a side view
    /// above a top view, up to four panels per row, over the target pose. Make the panels of a
    /// solver's answer with [`solution_panels`].
    pub fn solutions(model: &'a Model, target: Pose, panels: Vec<Panel>) -> Drawing<'a> {
        let count = panels.len();
        let with_turns: usize = panels.iter().map(|p| 1 + p.alternatives.len()).sum();
        let mut subject = match count {
            1 => "the one configuration for a tool pose".to_string(),
            n => format!("all {n} configurations for one tool pose"),
        };
        if with_turns > count {
            subject.push_str(&format!(
                " ({with_turns} joint solutions counting whole turns)"
            ));
        }
        Drawing {
            model,
            subject,
            panels,
            views: vec![ViewKind::Side, ViewKind::Top],
            arrangement: Arrangement::Column,
            columns: count.clamp(1, 4),
            wrist_center: wrist_center_from_axes(model),
            target: Some(target),
        }
    }

    /// The same drawing with a given wrist center (base frame at zero, metres), e.g. the one
    /// the classifier found.
    pub fn with_wrist_center(mut self, wrist_center: Option<[f64; 3]>) -> Drawing<'a> {
        self.wrist_center = wrist_center;
        self
    }

    /// The drawing as an SVG document.
    pub fn to_svg(&self) -> String {
        page::render(self)
    }
}

/// The common point of the last three joint axes at zero (base frame, metres), when the last
/// three joints are revolute and their axes meet within a micrometre.
pub fn wrist_center_from_axes(model: &Model) -> Option<[f64; 3]> {
    let last = model
        .joints
        .len()
        .checked_sub(3)
        .map(|k| &model.joints[k..])?;
    if last.iter().any(|j| j.joint.kind != JointKind::Revolute) {
        return None;
    }
    let lines: Vec<geometry::Line> = last
        .iter()
        .map(|j| geometry::Line::new(j.joint.point, j.joint.axis))
        .collect();
    let (point, worst) = geometry::nearest_point_to_lines(&lines)?;
    (worst <= WRIST_AXES_MEET).then_some(point)
}
