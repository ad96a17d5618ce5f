//! Joints 1–3 of an elbow arm (R R R, axis 2 ∥ axis 3, axis 1 ∦ axis 2), any shoulder and
//! sideways offset, any elbow step and any angle between axes 1 and 2.
//!
//! 1. Joint 1, rotate a point into a plane: joints 2 and 3 turn about lines parallel to `h2`, so
//!    `h2 · (E1(−θ1) c_t − p2) = h2 · (c − p2)`, i.e. `a cos θ1 + b sin θ1 = e` (0–2 roots).
//! 2. Joint 3, law of cosines on the distance `d` from axis 2 to the wrist center, in the plane
//!    ⟂ `h2`: `d² = |L|² + |V|² + 2 |L| |V| cos ψ`, ψ measured from the stretched arm (0–2).
//! 3. Joint 2, Paden–Kahan subproblem 1: rotate `E3 c` onto the wrist-center target about
//!    axis 2 (1 root).

use armforge_runtime::internal::CheckKind;
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::{Elbow, Shoulder};

use crate::plan::arm::Arm;
use crate::plan::graph::Graph;
use crate::plan::planar::{self, TwoLink};
use crate::plan::subproblems::rotate_into_plane;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{sign, ArmSolution, Target, Turn};
use crate::units::tidy;
use armforge_runtime::internal::{ElbowRule, ShoulderRule};

/// The constants of the elbow family (joint 1 is shared with the polar family).
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// Axis 1.
    pub h1: [f64; 3],
    /// The point of axis 1.
    pub p1: [f64; 3],
    /// Axis 2.
    pub h2: [f64; 3],
    /// `h2 − (h1·h2) h1`.
    pub alpha: [f64; 3],
    /// `h1 × h2`.
    pub beta: [f64; 3],
    /// `h1 · h2`.
    pub cos12: f64,
    /// `h2 · (c − p2) − h2 · (p1 − p2)`.
    pub e0: f64,
    /// `p1 − p2`.
    pub p1_minus_p2: [f64; 3],
    /// Joints 2 and 3 placing the wrist center: the upper arm `L` from axis 2 to axis 3 and
    /// the forearm `V` from axis 3 to the wrist center, both ⟂ h2.
    pub two_link: TwoLink,
}

/// The constants the plan of an elbow arm is built from.
pub fn constants(arm: &Arm) -> Constants {
    let c = arm.wrist_center;
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let (h2, p2) = (arm.axis(1), arm.point(1));
    let (h3, p3) = (arm.axis(2), arm.point(2));
    let cos12 = num::dot(&h1, &h2);
    let alpha = num::sub(&h2, &num::scale(&h1, cos12));
    let beta = num::cross(&h1, &h2);
    // h2 · (c − p2): the wrist center's height along axis 2, invariant under joints 2 and 3.
    let height = num::dot(&h2, &num::sub(&c, &p2));
    let p1_minus_p2 = num::sub(&p1, &p2);
    let e0 = height - num::dot(&h2, &p1_minus_p2);
    Constants {
        h1,
        p1,
        h2,
        alpha,
        beta,
        cos12,
        e0,
        p1_minus_p2,
        two_link: TwoLink::new(h2, p2, h3, p3, c),
    }
}

/// The label references: which sign of `(h1×h2)·(w − p1)` is `Facing`, which bend is `Up`.
fn references(arm: &Arm, k: &Constants) -> (f64, f64) {
    let c = arm.wrist_center;
    let facing = sign(num::dot(&k.beta, &num::sub(&c, &k.p1)));
    let up = num::unit(&num::perpendicular(&k.h1, &k.h2));
    let mut forward = num::perpendicular(&num::perpendicular(&num::sub(&c, &k.p1), &k.h2), &up);
    if num::norm(&forward) < 1e-9 {
        forward = num::cross(&k.h2, &up);
    }
    let up_sign = sign(num::dot(&k.h2, &num::cross(&up, &forward)));
    (facing, up_sign)
}

/// The label rules of an elbow arm.
pub fn rules(arm: &Arm) -> (ShoulderRule, ElbowRule) {
    let k = constants(arm);
    let (facing, up) = references(arm, &k);
    (
        ShoulderRule::Plane {
            normal: k.beta,
            point: k.p1,
            wrist_center: arm.wrist_center,
            facing,
        },
        ElbowRule::Bend {
            sense: k.two_link.sense,
            stretched: k.two_link.stretched,
            up,
        },
    )
}

/// Joint 1 of elbow and polar arms (rotate a point into a plane), with the wrist center seen
/// from axis 2 once joint 1 is undone.
pub(crate) struct JointOne {
    /// `(cos θ1, sin θ1)` for `σ = +1, −1`.
    pub roots: [(crate::plan::graph::Id, crate::plan::graph::Id); 2],
    /// `θ1` for `σ = +1, −1`.
    pub angles: [crate::plan::graph::Id; 2],
    /// `w − p2 = E1(−θ1) c_t − p2` for `σ = +1, −1`.
    pub w: [V3; 2],
    /// `d²`: squared distance of `w` from axis 2, for `σ = +1, −1`.
    pub d2: [crate::plan::graph::Id; 2],
    /// Shoulder labels for `σ = +1, −1`.
    pub shoulders: [Shoulder; 2],
    /// The shoulder's reality check (the wrist center outside the offset cylinder).
    pub check: CheckLayout,
    /// `≥ 0` when the wrist center is on axis 1.
    pub singular: crate::plan::graph::Id,
}

/// Builds joint 1 of an elbow or polar arm.
pub(crate) fn joint_one(g: &mut Graph, arm: &Arm, t: &Target, ct: V3) -> JointOne {
    let k = constants(arm);
    let (facing, _) = references(arm, &k);
    let tol = 1e-10 * arm.scale;
    let u = vec3::add_const(g, ct, num::scale(&k.p1, -1.0));
    let u = vec3::name(g, u, "u", "u = c_t − p1");
    let a = vec3::dot_const(g, k.alpha, u);
    let a = g.name(a, "j1_a", "a = (h2 − (h1·h2) h1) · u");
    let b = vec3::dot_const(g, k.beta, u);
    let b = g.name(b, "j1_b", "b = (h1 × h2) · u");
    let along = vec3::dot_const(g, k.h1, u);
    let cos12 = g.constant(k.cos12);
    let shift = g.mul(cos12, along);
    let e0 = g.constant(k.e0);
    let e = g.sub(e0, shift);
    let e = g.name(
        e,
        "j1_e",
        format!(
            "e = h2·(c − p1) − (h1·h2)(h1·u) = {} − {} (h1·u)",
            tidy(k.e0),
            tidy(k.cos12)
        ),
    );
    let no_offset = g.constant_value(e) == Some(0.0);
    let roots = rotate_into_plane(g, [a, b, e], t.reference1, tol * tol, " m", "j1");
    let check = CheckLayout {
        kind: CheckKind::InsideHole,
        have_squared: roots.radius_squared,
        limit: roots.limit,
    };
    let mut w_out = [[0; 3]; 2];
    let mut d2_out = [0; 2];
    let mut angles = [0; 2];
    let mut shoulders = [Shoulder::Facing; 2];
    for (i, sigma) in [1.0, -1.0].into_iter().enumerate() {
        let tag = if sigma > 0.0 { "a" } else { "b" };
        let (c1, s1) = roots.roots[i];
        let w = vec3::rotate_back(g, k.h1, c1, s1, u);
        let w = vec3::add_const(g, w, k.p1_minus_p2);
        let w = vec3::name(
            g,
            w,
            &format!("w_{tag}"),
            "w − p2 = E1(−θ1) c_t − p2: the wrist center with joint 1 undone",
        );
        let d2 = planar::distance_squared(g, k.h2, w);
        let d2 = g.name(
            d2,
            &format!("d2_{tag}"),
            "d² = |(w − p2)⊥h2|²: squared distance from axis 2",
        );
        angles[i] = if i == 1 && no_offset {
            // e = 0: the second root is the first turned by half a turn (the finishing wraps).
            let half = g.constant(std::f64::consts::PI);
            let theta1 = g.add(angles[0], half);
            g.name(
                theta1,
                &format!("q1_{tag}"),
                "θ1 = θ1(σ = +1) + π, as e = 0",
            )
        } else {
            let theta1 = g.atan2(s1, c1);
            g.name(theta1, &format!("q1_{tag}"), "θ1 = atan2(sin θ1, cos θ1)")
        };
        // (h1 × h2) · (w − p1) = −σ k: the shoulder's side.
        shoulders[i] = if -sigma == facing {
            Shoulder::Facing
        } else {
            Shoulder::Across
        };
        w_out[i] = w;
        d2_out[i] = d2;
    }
    JointOne {
        roots: roots.roots,
        angles,
        w: w_out,
        d2: d2_out,
        shoulders,
        check,
        singular: roots.singular,
    }
}

/// Builds joints 1–3 of an elbow arm for every branch (σ × elbow sign): joint 1 by rotating
/// the wrist center into axis 2's plane, then joints 2 and 3 by the planar two-link step.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target, ct: V3) -> Vec<ArmSolution> {
    let k = constants(arm);
    let (_, up) = references(arm, &k);
    let tol = 1e-10 * arm.scale;
    let one = joint_one(g, arm, t, ct);
    let mut out = Vec::new();
    for (i, sigma) in [1.0, -1.0].into_iter().enumerate() {
        let tag = if sigma > 0.0 { "a" } else { "b" };
        let (c1, s1) = one.roots[i];
        let two = planar::solve(g, &k.two_link, one.w[i], one.d2[i], tol, tag);
        let shoulder = one.shoulders[i];
        let side = if shoulder == Shoulder::Facing {
            1.0
        } else {
            -1.0
        };
        for bend in two.bends {
            let elbow = if bend.bend * side == up {
                Elbow::Up
            } else {
                Elbow::Down
            };
            let mut checks = vec![one.check];
            checks.extend(two.checks);
            out.push(ArmSolution {
                angles: [one.angles[i], bend.first, bend.second],
                undo: vec![
                    Turn::about(k.h1, (c1, s1)),
                    Turn::about(k.h2, (bend.sum.0, bend.sum.1)),
                ],
                shoulder,
                elbow,
                checks,
                on_axis_1: Some(one.singular),
            });
        }
    }
    out
}
