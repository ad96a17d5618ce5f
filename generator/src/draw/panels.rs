//! The panels of a solutions drawing: one per distinct configuration, labelled with its branch.
//!
//! Solutions that differ only by whole turns of revolute joints (a joint whose range is wider
//! than one turn lists every equivalent angle) put the arm in the same place; they share one
//! panel, which names the other joint values.

use std::f64::consts::{PI, TAU};

use armforge_runtime::{Flags, JointKind, Solution};

use super::Panel;
use crate::model::Model;

/// Two wrapped joint values closer than this (radians or metres) are the same.
const SAME_VALUE: f64 = 1e-9;

/// One panel per distinct configuration among `solutions`, in their order; each shows the
/// member nearest to all-zero joint values and lists the others as alternatives.
pub fn solution_panels(model: &Model, solutions: &[Solution]) -> Vec<Panel> {
    let mut groups: Vec<Vec<&Solution>> = Vec::new();
    for s in solutions {
        match groups
            .iter_mut()
            .find(|g| g[0].branch == s.branch && same_place(model, &g[0].joints, &s.joints))
        {
            Some(group) => group.push(s),
            None => groups.push(vec![s]),
        }
    }
    let count = groups.len();
    groups
        .iter()
        .enumerate()
        .map(|(k, group)| {
            let shown = group
                .iter()
                .copied()
                .min_by(|a, b| size(&a.joints).total_cmp(&size(&b.joints)))
                .unwrap_or(group[0]);
            Panel {
                caption: caption(k, count, shown),
                joint_values: shown.joints.to_vec(),
                alternatives: group
                    .iter()
                    .filter(|s| !std::ptr::eq(**s, shown))
                    .map(|s| s.joints.to_vec())
                    .collect(),
            }
        })
        .collect()
}

/// True when the two sets of joint values differ only by whole turns of revolute joints.
fn same_place(model: &Model, a: &[f64], b: &[f64]) -> bool {
    model
        .joints
        .iter()
        .zip(a.iter().zip(b))
        .all(|(j, (x, y))| match j.joint.kind {
            JointKind::Revolute => wrap(x - y).abs() < SAME_VALUE,
            JointKind::Prismatic => (x - y).abs() < SAME_VALUE,
        })
}

/// An angle wrapped into (−π, π].
fn wrap(x: f64) -> f64 {
    let w = x - TAU * (x / TAU).round();
    if w <= -PI {
        w + TAU
    } else {
        w
    }
}

fn size(q: &[f64]) -> f64 {
    q.iter().map(|x| x.abs()).sum()
}

/// `2 of 4: shoulder front, elbow down, wrist plus`, with any singular condition.
fn caption(k: usize, count: usize, solution: &Solution) -> String {
    let mut caption = format!("{} of {count}: {}", k + 1, solution.branch);
    for (flag, words) in [
        (Flags::WRIST_ALIGNED, "wrist aligned"),
        (Flags::ON_AXIS_1, "wrist center on axis 1"),
        (Flags::AT_REACH_LIMIT, "at the reach limit"),
    ] {
        if solution.flags.contains(flag) {
            caption.push_str(&format!(" ({words})"));
        }
    }
    caption
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn wrapping_keeps_half_turns_apart_and_merges_whole_turns() {
        assert!(wrap(TAU).abs() < 1e-15);
        assert!((wrap(PI) - PI).abs() < 1e-15);
        assert!((wrap(-PI) - PI).abs() < 1e-15);
        assert!((wrap(3.0 * TAU + 0.5) - 0.5).abs() < 1e-12);
    }
}
