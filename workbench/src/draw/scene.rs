//! What a drawing shows of one configuration, in the world frame: joint centres and axes,
//! the links between them, the wrist center, the tool frame and the base.

use armforge_runtime::math::{add, norm, scale, sub};
use armforge_runtime::{joint_motion, Joint, JointKind, Pose};

use super::geometry::{common_normal_feet, Line};
use armforge_compiler::model::Model;

/// Where each joint sits on its axis at zero, in the base frame: the feet of the common
/// normals to the neighbouring axes, so that the links look like the physical arm.
#[derive(Clone, Debug, PartialEq)]
pub struct Skeleton {
    /// For each joint, the point of its axis closest to the previous joint's axis (joint 1:
    /// closest to the base origin). This is the joint's centre in the drawing.
    pub entry: Vec<[f64; 3]>,
    /// For each joint, the point of its axis closest to the next joint's axis (last joint:
    /// closest to the tool origin).
    pub exit: Vec<[f64; 3]>,
}

impl Skeleton {
    /// The skeleton of a model. Parallel neighbouring axes have no unique common normal; the
    /// one through the point the description gives on the later axis is taken (for DH files
    /// that is where the convention puts the common normal; for collinear axes it is where the
    /// file says the later joint sits). A common normal whose feet lie far outside the arm
    /// (nearly parallel axes) is treated the same way.
    pub fn of(model: &Model) -> Skeleton {
        let far = 4.0 * arm_size_at_zero(model).max(1e-3);
        let lines = joint_lines(model, far * 1e-9);
        let mut entry = Vec::with_capacity(lines.len());
        let mut exit = Vec::with_capacity(lines.len());
        for (i, line) in lines.iter().enumerate() {
            match i.checked_sub(1).map(|p| (&lines[p], entry[p])) {
                None => entry.push(line.closest_point(&[0.0; 3])),
                Some((previous, previous_entry)) => {
                    let feet = common_normal_feet(previous, line)
                        .filter(|(a, _)| norm(&sub(a, &previous_entry)) <= far);
                    let (a, b) = feet.unwrap_or_else(|| {
                        let a = previous.closest_point(&line.point);
                        (a, line.closest_point(&a))
                    });
                    exit.push(a);
                    entry.push(b);
                }
            }
        }
        if let Some(last) = lines.last() {
            exit.push(last.closest_point(&model.tool.translation));
        }
        Skeleton { entry, exit }
    }
}

/// Each joint's line at zero. A slide's direction has no place of its own (an `axes` file may
/// leave its point out, at the base origin): a slide that follows a turning joint and whose
/// line misses that joint's axis is drawn where it carries the rest of the arm, on the line
/// along the slide through the next turning joint's point (or the tool origin), moved onto the
/// previous axis when that line misses it too. So a polar arm's boom comes out of its tilt
/// axis and runs to the wrist, where forward kinematics puts them.
fn joint_lines(model: &Model, meet: f64) -> Vec<Line> {
    let mut lines: Vec<Line> = model
        .joints
        .iter()
        .map(|j| Line::new(j.joint.point, j.joint.axis))
        .collect();
    for i in 1..lines.len() {
        let (previous, joint) = (&model.joints[i - 1].joint, &model.joints[i].joint);
        if joint.kind != JointKind::Prismatic || previous.kind != JointKind::Revolute {
            continue;
        }
        let misses = |line: &Line| {
            common_normal_feet(&lines[i - 1], line).map(|(a, b)| norm(&sub(&a, &b)) > meet)
        };
        if misses(&lines[i]) != Some(true) {
            continue;
        }
        let anchor = model.joints[i + 1..]
            .iter()
            .find(|j| j.joint.kind == JointKind::Revolute)
            .map_or(model.tool.translation, |j| j.joint.point);
        let through_anchor = Line::new(anchor, joint.axis);
        lines[i] = match common_normal_feet(&lines[i - 1], &through_anchor) {
            Some((on_previous, _)) if misses(&through_anchor) == Some(true) => {
                Line::new(on_previous, joint.axis)
            }
            _ => through_anchor,
        };
    }
    lines
}

/// The largest distance from the base origin of any joint point or the tool origin at zero.
fn arm_size_at_zero(model: &Model) -> f64 {
    model
        .joints
        .iter()
        .map(|j| norm(&j.joint.point))
        .chain(std::iter::once(norm(&model.tool.translation)))
        .fold(0.0, f64::max)
}

/// One joint as drawn, in the world frame.
#[derive(Clone, Debug, PartialEq)]
pub struct JointMark {
    /// 0-based joint index.
    pub index: usize,
    /// Revolute or prismatic.
    pub kind: JointKind,
    /// The joint's centre: the foot of the common normal from the previous axis, moved by the
    /// joints before it (and, for a prismatic joint, by its own slide: the carriage).
    pub centre: [f64; 3],
    /// Unit direction in which a positive joint value turns (right-hand rule) or slides:
    /// the axis times the joint's direction sign.
    pub positive_axis: [f64; 3],
    /// For a prismatic joint, the rail it slides on: from the carriage's place at the lower
    /// joint limit to the upper one (limits not finite: from model value zero to the carriage).
    pub rail: Option<[[f64; 3]; 2]>,
}

/// The ends of a prismatic joint's rail in the world (see [`JointMark::rail`]).
fn rail(before: &Pose, joint: &Joint, start: [f64; 3], carriage: [f64; 3]) -> [[f64; 3]; 2] {
    if !(joint.limits[0].is_finite() && joint.limits[1].is_finite()) {
        return [start, carriage];
    }
    let axis = before.rotate(&joint.axis);
    let at = |limit: f64| add(&start, &scale(&axis, joint.model_value(limit)));
    [at(joint.limits[0]), at(joint.limits[1])]
}

/// One configuration of the arm in the world frame, ready to project.
#[derive(Clone, Debug, PartialEq)]
pub struct ArmScene {
    /// The joints, base to tool.
    pub joints: Vec<JointMark>,
    /// The links as one polyline: base origin, then each joint's entry and exit points, then
    /// the tool origin.
    pub links: Vec<[f64; 3]>,
    /// The wrist center, when the arm has one.
    pub wrist_center: Option<[f64; 3]>,
    /// The tool frame in the world.
    pub tool: Pose,
    /// The base frame in the world.
    pub base: Pose,
}

impl ArmScene {
    /// The scene of `model` at `joint_values` (SI units; missing values count as zero).
    /// `wrist_center` is in the base frame with every model value at zero.
    pub fn new(
        model: &Model,
        skeleton: &Skeleton,
        joint_values: &[f64],
        wrist_center: Option<[f64; 3]>,
    ) -> ArmScene {
        let mut before = model.base;
        let mut joints = Vec::with_capacity(model.joints.len());
        let mut links = vec![model.base.translation];
        for (i, mj) in model.joints.iter().enumerate() {
            let joint = &mj.joint;
            let q = joint_values.get(i).copied().unwrap_or(0.0);
            let after = before.compose(&joint_motion(joint, q));
            let start = before.transform_point(&skeleton.entry[i]);
            let centre = after.transform_point(&skeleton.entry[i]);
            links.push(start);
            if joint.kind == JointKind::Prismatic {
                links.push(centre);
            }
            links.push(after.transform_point(&skeleton.exit[i]));
            joints.push(JointMark {
                index: i,
                kind: joint.kind,
                centre,
                positive_axis: scale(&before.rotate(&joint.axis), joint.direction.signum()),
                rail: (joint.kind == JointKind::Prismatic)
                    .then(|| rail(&before, joint, start, centre)),
            });
            before = after;
        }
        let tool = before.compose(&model.tool);
        links.push(tool.translation);
        ArmScene {
            joints,
            links,
            wrist_center: wrist_center.map(|c| before.transform_point(&c)),
            tool,
            base: model.base,
        }
    }
}
