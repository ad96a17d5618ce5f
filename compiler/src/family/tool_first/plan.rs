//! The plan of a tool-first arm: the whole solve of the mirrored arm's family for the target
//! `G⁻¹`, read back in the arm's order (mirrored decoupling, Pieper 1968, read from the tool
//! end). With `G = B⁻¹ T M⁻¹ = E1 ⋯ E6`,
//!
//! `G⁻¹ = E6(−θ6) E5(−θ5) E4(−θ4) E3(−θ3) E2(−θ2) E1(−θ1)`, and `E(h, −θ) = E(−h, θ)`,
//!
//! so `G⁻¹` is the forward kinematics of the mirrored arm (joint `i` of it is joint `7 − i`
//! about the reversed axis, by the same value, no base and no tool). When the arm's axes 3–5
//! are parallel and axes 1 and 2 meet, the mirrored arm's axes 2–4 are parallel and its axes 5
//! and 6 meet: a three-parallel arm, solved by that family's
//! [`crate::family::TargetStep`] with the target `G⁻¹`. Any family offering the step is used
//! the same way; nothing here knows which.

use armforge_runtime::plan::CandidateLayout;
use armforge_runtime::Joint;

use crate::classify::{Family, Geometry};
use crate::family::{mirror, TargetSolution, TargetStep};
use crate::model::{Model, ModelJoint};
use crate::plan::arm::Arm;
use crate::plan::decouple;
use crate::plan::graph::Graph;
use crate::plan::Plan;
use crate::units::Units;

/// The plan of a tool-first arm, given the classification of its mirrored arm (`inner`) and
/// the target step of the mirrored arm's family.
pub fn build(model: &Model, inner: &Geometry, step: TargetStep) -> Plan {
    let mirrored = mirror::mirrored_model(model);
    let arm = Arm::with_center(model, Family::ToolFirst, inner.wrist_center);
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let target = mirror::mirrored_target(&mut g, &arm, &t);
    let TargetSolution {
        arm: inner_arm,
        candidates,
        mut rule,
        twist,
        free,
    } = step(&mut g, &mirrored, inner, &target);
    rule.mirrored = true;
    let candidates: Vec<CandidateLayout> = mirror::read_back(candidates);
    // The planner's arm keeps the mirrored family's placed point (as its plan rounded it).
    let arm = Arm {
        wrist_center: inner_arm.wrist_center,
        ..arm
    };
    // The mirrored arm's reference inputs hold its joints `free`: the arm's `5 − i`.
    crate::plan::assemble(
        arm,
        &g,
        &candidates,
        rule,
        twist,
        free.map(mirror::joint_of),
    )
}

/// The mirrored arm as a model, rebuilt from the planner's arm of a tool-first plan (the
/// review sheet has the plan only): joints reversed about reversed axes, no base, no tool,
/// joints named by the arm's numbering (`joint 6` is the mirrored arm's first).
pub fn mirrored_model_of(arm: &Arm) -> Model {
    let joints = arm
        .joints
        .iter()
        .enumerate()
        .rev()
        .map(|(i, j)| ModelJoint {
            joint: Joint {
                axis: [-j.axis[0], -j.axis[1], -j.axis[2]],
                ..*j
            },
            name: format!("joint {}", i + 1),
            location: Default::default(),
        })
        .collect();
    Model {
        name: "mirrored".to_string(),
        description: None,
        units: Units::default(),
        joints,
        tool: armforge_runtime::Pose::IDENTITY,
        base: armforge_runtime::Pose::IDENTITY,
        source_path: String::new(),
    }
}
