//! The sizes of a drawing's symbols in world units, and their world geometry: frame axes, the
//! mount plate, and every point a view must hold.

use armforge_runtime::math::{add, norm, scale, sub};
use armforge_runtime::Pose;

use super::scene::ArmScene;

/// Share of the arm's size drawn as a joint axis arrow.
const AXIS_ARROW_SHARE: f64 = 0.12;
/// Share of the arm's size drawn as a frame axis arrow (tool, base, target).
const FRAME_ARROW_SHARE: f64 = 0.10;
/// Share of the arm's size drawn as the mount plate's radius.
const MOUNT_SHARE: f64 = 0.08;
/// Corners of the polygon that stands for the round mount plate.
const MOUNT_CORNERS: usize = 48;

/// World lengths of the symbols, scaled to the arm.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Lengths {
    /// The arm's size: the diagonal of the box around every configuration's links, metres.
    pub arm: f64,
    /// Joint axis arrows, metres.
    pub axis_arrow: f64,
    /// Frame axis arrows, metres.
    pub frame_arrow: f64,
    /// Mount plate radius, metres.
    pub mount_radius: f64,
}

impl Lengths {
    /// Symbol sizes for a set of scenes (and an optional target pose).
    pub fn for_scenes(scenes: &[ArmScene], target: Option<&Pose>) -> Lengths {
        let points: Vec<[f64; 3]> = scenes
            .iter()
            .flat_map(|s| s.links.iter().copied())
            .chain(target.map(|t| t.translation))
            .collect();
        let mut min = [f64::INFINITY; 3];
        let mut max = [f64::NEG_INFINITY; 3];
        for p in &points {
            for k in 0..3 {
                min[k] = min[k].min(p[k]);
                max[k] = max[k].max(p[k]);
            }
        }
        let arm = if points.is_empty() {
            1.0
        } else {
            norm(&sub(&max, &min)).max(1e-3)
        };
        Lengths {
            arm,
            axis_arrow: AXIS_ARROW_SHARE * arm,
            frame_arrow: FRAME_ARROW_SHARE * arm,
            mount_radius: MOUNT_SHARE * arm,
        }
    }
}

/// The tips of a frame's x, y and z arrows.
pub fn frame_tips(pose: &Pose, length: f64) -> [[f64; 3]; 3] {
    let r = &pose.rotation;
    let tip = |c: usize| {
        add(
            &pose.translation,
            &scale(&[r[0][c], r[1][c], r[2][c]], length),
        )
    };
    [tip(0), tip(1), tip(2)]
}

/// The rim of the mount plate: a disk about the base origin, perpendicular to the base's z axis.
pub fn mount_rim(base: &Pose, radius: f64) -> Vec<[f64; 3]> {
    (0..MOUNT_CORNERS)
        .map(|k| {
            let angle = std::f64::consts::TAU * k as f64 / MOUNT_CORNERS as f64;
            let local = [radius * angle.cos(), radius * angle.sin(), 0.0];
            base.transform_point(&local)
        })
        .collect()
}

/// The base's z axis in the world (the mount plate's normal, pointing into the arm).
pub fn mount_normal(base: &Pose) -> [f64; 3] {
    base.rotate(&[0.0, 0.0, 1.0])
}

/// Every world point a view of this scene must hold: links, joint arrows, rails, frames and
/// the mount plate (with its hatching).
pub fn extent_points(scene: &ArmScene, lengths: &Lengths) -> Vec<[f64; 3]> {
    let mut points = scene.links.clone();
    for joint in &scene.joints {
        points.push(add(
            &joint.centre,
            &scale(&joint.positive_axis, lengths.axis_arrow),
        ));
        points.push(sub(
            &joint.centre,
            &scale(&joint.positive_axis, 0.5 * lengths.axis_arrow),
        ));
        points.extend(joint.rail.iter().flatten());
    }
    points.extend(scene.wrist_center);
    points.extend(frame_tips(&scene.tool, lengths.frame_arrow));
    points.extend(frame_tips(&scene.base, lengths.frame_arrow));
    let below = scale(&mount_normal(&scene.base), -0.5 * lengths.mount_radius);
    for p in mount_rim(&scene.base, lengths.mount_radius) {
        points.push(add(&p, &below));
        points.push(p);
    }
    points
}
