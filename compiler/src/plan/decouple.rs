//! Kinematic decoupling (Pieper 1968): the wrist-center target and the wrist's rotation seen
//! from the target pose. With `G = B⁻¹ T M⁻¹`, the wrist center `c` satisfies
//! `E1 E2 E3 c = G c` and the wrist rotation is `R456 = (R1 R2 R3)ᵀ rot(G)`.

use armforge_runtime::plan::INPUTS;

use super::arm::Arm;
use super::graph::{Graph, Id};
use super::vec3::{self, num, V3};
use crate::units::tidy;

/// The target pose as plan inputs.
#[derive(Clone, Copy, Debug)]
pub struct Target {
    /// Rows of the target rotation.
    pub rotation: [V3; 3],
    /// The target translation.
    pub translation: V3,
    /// Reference cosine and sine of joint 1's model value.
    pub reference1: (Id, Id),
    /// Reference cosine and sine of joint 4's model value.
    pub reference4: (Id, Id),
}

/// Declares the plan inputs (pose entries and reference values).
pub fn target(g: &mut Graph) -> Target {
    let mut ids = [0; INPUTS];
    let names = [
        "r00", "r01", "r02", "r10", "r11", "r12", "r20", "r21", "r22", "px", "py", "pz",
        "ref1_cos", "ref1_sin", "ref4_cos", "ref4_sin",
    ];
    for (slot, name) in names.iter().enumerate() {
        let id = g.input(slot);
        ids[slot] = g.name(id, name, format!("input: {name}"));
    }
    Target {
        rotation: [
            [ids[0], ids[1], ids[2]],
            [ids[3], ids[4], ids[5]],
            [ids[6], ids[7], ids[8]],
        ],
        translation: [ids[9], ids[10], ids[11]],
        reference1: (ids[12], ids[13]),
        reference4: (ids[14], ids[15]),
    }
}

fn show(v: &[f64; 3]) -> String {
    format!("({}, {}, {})", tidy(v[0]), tidy(v[1]), tidy(v[2]))
}

/// The wrist-center target `c_t = B_Rᵀ (T_R c_tool + T_t − B_t)` with
/// `c_tool = M_Rᵀ (c − M_t)` (the wrist center seen from the tool frame).
pub fn wrist_center_target(g: &mut Graph, arm: &Arm, t: &Target) -> V3 {
    let c_tool = wrist_center_in_tool(arm);
    let k = vec3::constant(g, c_tool);
    let rotated = vec3::mat_mul(g, &t.rotation, k);
    let world = vec3::add(g, rotated, t.translation);
    let b = &arm.base;
    let shifted = vec3::add_const(g, world, num::scale(&b.translation, -1.0));
    let ct = vec3::mat_t_mul_const(g, &b.rotation, shifted);
    vec3::name(
        g,
        ct,
        "wc",
        &format!(
            "wrist-center target c_t = B⁻¹ (T_R c_tool + T_t), c_tool = {} m",
            show(&c_tool)
        ),
    )
}

/// The wrist center seen from the tool frame: `c_tool = M_Rᵀ (c − M_t)`.
pub fn wrist_center_in_tool(arm: &Arm) -> [f64; 3] {
    let m = &arm.tool;
    m.rotate_back(&num::sub(&arm.wrist_center, &m.translation))
}

/// `rot(G) x = B_Rᵀ T_R M_Rᵀ x` for a constant direction `x` of the tool at zero.
pub fn target_direction(g: &mut Graph, arm: &Arm, t: &Target, x: [f64; 3], name: &str) -> V3 {
    let in_tool = arm.tool.rotate_back(&x);
    let k = vec3::constant(g, in_tool);
    let world = vec3::mat_mul(g, &t.rotation, k);
    let v = vec3::mat_t_mul_const(g, &arm.base.rotation, world);
    vec3::name(
        g,
        v,
        name,
        &format!(
            "rot(B⁻¹ T M⁻¹) {} : where the target sends this wrist direction",
            show(&x)
        ),
    )
}
