//! The wrist at the base: axes 1–3 meet in a point `b` and axes 4–6 do not. Mirrored
//! decoupling (Pieper 1968, read from the tool end): with `G = B⁻¹ T M⁻¹ = E1 ⋯ E6`,
//!
//! `G⁻¹ = E6(−θ6) E5(−θ5) E4(−θ4) E3(−θ3) E2(−θ2) E1(−θ1)`, and `E(h, −θ) = E(−h, θ)`,
//!
//! so `G⁻¹` is the forward kinematics of the *mirrored arm*: joint `i` of it is joint `7 − i`
//! turning about the reversed axis, by the same value, with no base and no tool. Its joints
//! 4–6 (the arm's 3, 2, 1) meet in `b`: a spherical wrist. The mirrored arm is planned exactly
//! like any decoupled arm (its joints 1–3, the arm's 6, 5, 4, by their own family; then the
//! wrist) with the target `G⁻¹`, and the candidates are read back in the arm's order.
//!
//! The point `b` seen from the tool, `G⁻¹ b`, depends on joints 4–6 only; the rotation of
//! joints 1–3 follows from the rest.

use armforge_runtime::plan::CandidateLayout;
use armforge_runtime::{Joint, Pose};

use crate::classify::{Family, Geometry};
use crate::model::{Model, ModelJoint};
use crate::plan::arm::Arm;
use crate::plan::decouple::{self, Target};
use crate::plan::graph::Graph;
use crate::plan::pose;
use crate::plan::vec3::num;
use crate::plan::{Plan, PositionStep};

/// The mirrored arm: joints in reverse order with reversed axes, base and tool at the identity
/// (its forward kinematics with the joint values reversed is `G⁻¹`). Names and locations go
/// with their joints, so messages about the mirrored arm still point at the right table.
pub fn mirrored_model(model: &Model) -> Model {
    let joints: Vec<ModelJoint> = model
        .joints
        .iter()
        .rev()
        .map(|j| ModelJoint {
            joint: Joint {
                axis: num::scale(&j.joint.axis, -1.0),
                ..j.joint
            },
            ..j.clone()
        })
        .collect();
    Model {
        joints,
        tool: Pose::IDENTITY,
        base: Pose::IDENTITY,
        ..model.clone()
    }
}

/// The plan of an arm with its wrist at the base, given the classification of its mirrored
/// arm (`inner`: the family of the arm's joints 6, 5, 4 and the meeting point of axes 1–3) and
/// that family's position step.
pub fn build(model: &Model, inner: &Geometry, family: Family, step: PositionStep) -> Plan {
    let mirrored = mirrored_model(model);
    let inner_arm = Arm::new(&mirrored, inner);
    let arm = Arm::with_center(model, family, inner.wrist_center);
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let motion = pose::joint_motions(&mut g, &arm, &t);
    let inverse = motion.inverse(&mut g);
    let inverse = pose::name(
        &mut g,
        inverse,
        "ginv",
        "G⁻¹ = (B⁻¹ T M⁻¹)⁻¹: the mirrored arm's target",
    );
    let mirrored_target = Target {
        rotation: inverse.rows,
        translation: inverse.translation,
        reference1: t.reference1,
        reference4: t.reference4,
    };
    let (candidates, mut rule) = crate::plan::decoupled(&mut g, &inner_arm, &mirrored_target, step);
    rule.mirrored = true;
    let candidates: Vec<CandidateLayout> = candidates
        .into_iter()
        .map(|mut c| {
            c.model_values.reverse();
            c
        })
        .collect();
    let w = crate::plan::wrist::WristAxes::of(&inner_arm);
    let twist = [num::dot(&w.h4, &w.h5), num::dot(&w.h5, &w.h6)];
    // The mirrored arm holds its joint 1 (the arm's joint 6) and its joint 4 (the arm's
    // joint 3) when they are free.
    crate::plan::assemble(arm, &g, &candidates, rule, twist, [5, 2])
}
