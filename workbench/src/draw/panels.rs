//! The panels of a solutions drawing: one per distinct configuration, labelled with its branch.
//!
//! Solutions that differ only by whole turns of revolute joints put the arm in the same place;
//! they share one panel, which names the other joint values: those of other solutions in the
//! same place and the equivalent angles of joints whose range is wider than one turn
//! (`Solution::equivalents`).

use std::f64::consts::{PI, TAU};

use armforge_runtime::{Flags, Joint, JointKind, Solution, JOINTS};

use super::Panel;
use armforge_compiler::model::Model;

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
            let mut alternatives: Vec<Vec<f64>> = group
                .iter()
                .filter(|s| !std::ptr::eq(**s, shown))
                .map(|s| s.joints.to_vec())
                .collect();
            if let Some(table) = joint_table(model) {
                for e in shown.equivalents(&table) {
                    let mut q = shown.joints.to_vec();
                    q[e.joint] = e.value;
                    let same =
                        |a: &Vec<f64>| a.iter().zip(&q).all(|(x, y)| (x - y).abs() < SAME_VALUE);
                    if !alternatives.iter().any(same) {
                        alternatives.push(q);
                    }
                }
            }
            Panel {
                caption: caption(k, count, shown),
                joint_values: shown.joints.to_vec(),
                alternatives,
            }
        })
        .collect()
}

/// The model's joints as a solver's joint table (`None` unless it has six).
fn joint_table(model: &Model) -> Option<[Joint; JOINTS]> {
    let joints: Vec<Joint> = model.joints.iter().map(|j| j.joint).collect();
    joints.try_into().ok()
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

/// `2 of 4: facing, down, leading`, with any singular condition.
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
    use armforge_compiler::diagnostics::Location;
    use armforge_compiler::model::ModelJoint;
    use armforge_runtime::{Branch, Elbow, Joint, Pose, Shoulder, Wrist};

    fn six_revolute() -> Model {
        let joint = Joint {
            kind: JointKind::Revolute,
            axis: [0.0, 0.0, 1.0],
            point: [0.0; 3],
            direction: 1.0,
            offset: 0.0,
            limits: [-2.0 * TAU, 2.0 * TAU],
        };
        Model {
            name: "six".to_string(),
            description: None,
            units: Default::default(),
            joints: (0..6)
                .map(|i| ModelJoint {
                    joint,
                    name: format!("joint {}", i + 1),
                    location: Location::default(),
                })
                .collect(),
            tool: Pose::IDENTITY,
            base: Pose::IDENTITY,
            source_path: "six.toml".to_string(),
        }
    }

    fn solution(joints: [f64; 6], wrist: Wrist) -> Solution {
        Solution {
            joints,
            branch: Branch {
                shoulder: Shoulder::Facing,
                elbow: Elbow::Up,
                wrist,
            },
            flags: Flags::NONE,
        }
    }

    #[test]
    fn whole_turn_equivalents_share_a_panel_showing_the_smallest_values() {
        let q = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6];
        let mut turned = q;
        turned[5] -= TAU;
        let mut other = q;
        other[4] = -0.5;
        let panels = solution_panels(
            &six_revolute(),
            &[
                solution(turned, Wrist::Leading),
                solution(other, Wrist::Trailing),
                solution(q, Wrist::Leading),
            ],
        );
        assert_eq!(panels.len(), 2);
        assert_eq!(panels[0].joint_values, q.to_vec());
        // The other solution in the same place first, then the equivalent angles the limits
        // (±720°) allow: three more values per joint, the turned joint 6 listed once.
        assert_eq!(panels[0].alternatives[0], turned.to_vec());
        assert_eq!(panels[0].alternatives.len(), 18);
        assert_eq!(panels[0].caption, "1 of 2: facing, up, leading");
        assert_eq!(panels[1].caption, "2 of 2: facing, up, trailing");
        assert_eq!(panels[1].alternatives.len(), 18);
    }

    #[test]
    fn singular_conditions_are_named_in_the_caption() {
        let mut s = solution([0.0; 6], Wrist::Leading);
        s.flags = Flags::WRIST_ALIGNED.union(Flags::AT_REACH_LIMIT);
        let panels = solution_panels(&six_revolute(), &[s]);
        assert_eq!(
            panels[0].caption,
            "1 of 1: facing, up, leading (wrist aligned) (at the reach limit)"
        );
    }

    #[test]
    fn a_half_turn_is_a_different_configuration() {
        let q = [0.1, 0.2, 0.3, 0.4, 0.5, 0.6];
        let mut half = q;
        half[3] += PI;
        let panels = solution_panels(
            &six_revolute(),
            &[solution(q, Wrist::Leading), solution(half, Wrist::Leading)],
        );
        assert_eq!(panels.len(), 2);
    }

    #[test]
    fn wrapping_keeps_half_turns_apart_and_merges_whole_turns() {
        assert!(wrap(TAU).abs() < 1e-15);
        assert!((wrap(PI) - PI).abs() < 1e-15);
        assert!((wrap(-PI) - PI).abs() < 1e-15);
        assert!((wrap(3.0 * TAU + 0.5) - 0.5).abs() < 1e-12);
    }
}
