//! The canonical model of an arm: SI units, joint axes in the base frame at zero.
//!
//! Every description convention (`dh`, `modified-dh`, `axes`) is converted into this one
//! shape, so classification and solving never depend on how the file placed its frames.

use armforge_runtime::{Joint, Pose};

use crate::diagnostics::Location;
use crate::units::Units;

/// One joint of the model, with what a person needs to recognise it.
#[derive(Clone, Debug, PartialEq)]
pub struct ModelJoint {
    /// The joint as the runtime uses it (SI units).
    pub joint: Joint,
    /// The name from the file, or `joint N`.
    pub name: String,
    /// Where the joint's table starts in the file.
    pub location: Location,
}

/// An arm, in SI units, independent of the file's convention.
#[derive(Clone, Debug, PartialEq)]
pub struct Model {
    /// The arm's name (a valid Rust identifier after `-` → `_`).
    pub name: String,
    /// Free text from the file.
    pub description: Option<String>,
    /// The file's units, for reporting.
    pub units: Units,
    /// Joints from base to tool.
    pub joints: Vec<ModelJoint>,
    /// The tool frame in the base frame with every model value at zero.
    pub tool: Pose,
    /// The base frame in the world frame.
    pub base: Pose,
    /// The path of the description file, as given.
    pub source_path: String,
}

impl Model {
    /// The runtime joints, base to tool.
    pub fn runtime_joints(&self) -> Vec<Joint> {
        self.joints.iter().map(|j| j.joint).collect()
    }

    /// Forward kinematics in SI units: the world pose of the tool frame.
    pub fn forward(&self, joint_values: &[f64]) -> Pose {
        armforge_runtime::forward(&self.runtime_joints(), &self.base, &self.tool, joint_values)
    }

    /// Joint values in the file's units (degrees or radians, mm or m by joint kind), in SI.
    /// Values beyond the joint count are dropped.
    pub fn joint_values_to_si(&self, values: &[f64]) -> Vec<f64> {
        self.joints
            .iter()
            .zip(values)
            .map(|(j, &x)| self.units.joint_to_si(j.joint.kind, x))
            .collect()
    }

    /// Joint values in SI, in the file's units. Values beyond the joint count are dropped.
    pub fn joint_values_from_si(&self, values: &[f64]) -> Vec<f64> {
        self.joints
            .iter()
            .zip(values)
            .map(|(j, &x)| self.units.joint_from_si(j.joint.kind, x))
            .collect()
    }

    /// Forward kinematics in the file's units: joint values in the file's units in, the world
    /// pose of the tool frame out with its translation in the file's length unit, rounding
    /// noise taken out ([`crate::units::snap`]: `0` for `6.1e-17`, `0.85` for
    /// `0.8500000000000001`).
    pub fn forward_in_file_units(&self, joint_values: &[f64]) -> Pose {
        let pose = self.forward(&self.joint_values_to_si(joint_values));
        let pose = self.units.pose_from_si(&pose);
        crate::units::snap_pose(&pose, self.units.length_from_si(self.extent()))
    }

    /// The arm's extent in metres, at least 1 m: the largest coordinate of a joint point, the
    /// tool or the base. The scale below which rounding noise in a length is taken for zero.
    pub fn extent(&self) -> f64 {
        self.joints
            .iter()
            .flat_map(|j| j.joint.point)
            .chain(self.tool.translation)
            .chain(self.base.translation)
            .fold(1.0f64, |m, x| m.max(x.abs()))
    }

    /// Joint values in the file's units with rounding noise taken out ([`crate::units::snap`]:
    /// a turn is the scale of an angle, the arm's extent that of a slide).
    pub fn tidy_joint_values(&self, values: &[f64]) -> Vec<f64> {
        self.joints
            .iter()
            .zip(values)
            .map(|(j, &x)| {
                let scale = match j.joint.kind {
                    armforge_runtime::JointKind::Revolute => {
                        self.units.angle_from_si(core::f64::consts::TAU)
                    }
                    armforge_runtime::JointKind::Prismatic => {
                        self.units.length_from_si(self.extent())
                    }
                };
                crate::units::snap(x, scale)
            })
            .collect()
    }

    /// The joint's label for messages: `joint 3 ("elbow")`, 1-based.
    pub fn joint_label(&self, index: usize) -> String {
        let default = format!("joint {}", index + 1);
        match self.joints.get(index) {
            Some(j) if j.name != default => format!("joint {} (\"{}\")", index + 1, j.name),
            _ => default,
        }
    }
}
