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

use crate::classify::{Family, Geometry};
use crate::family::mirror;
use crate::model::Model;
use crate::plan::arm::Arm;
use crate::plan::decouple;
use crate::plan::graph::Graph;
use crate::plan::vec3::num;
use crate::plan::{Plan, PositionStep};

pub use crate::family::mirror::mirrored_model;

/// The plan of an arm with its wrist at the base, given the classification of its mirrored
/// arm (`inner`: the family of the arm's joints 6, 5, 4 and the meeting point of axes 1–3) and
/// that family's position step.
pub fn build(model: &Model, inner: &Geometry, family: Family, step: PositionStep) -> Plan {
    let mirrored = mirrored_model(model);
    let inner_arm = Arm::new(&mirrored, inner);
    let arm = Arm::with_center(model, family, inner.wrist_center);
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let mirrored_target = mirror::mirrored_target(&mut g, &arm, &t);
    let (candidates, mut rule) = crate::plan::decoupled(&mut g, &inner_arm, &mirrored_target, step);
    rule.mirrored = true;
    let candidates = mirror::read_back(candidates);
    let w = crate::plan::wrist::WristAxes::of(&inner_arm);
    let twist = [num::dot(&w.h4, &w.h5), num::dot(&w.h5, &w.h6)];
    // The mirrored arm holds its joint 1 (the arm's joint 6) and its joint 4 (the arm's
    // joint 3) when they are free.
    crate::plan::assemble(arm, &g, &candidates, rule, twist, [5, 2])
}
