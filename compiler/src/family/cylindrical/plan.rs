//! Joints 1–3 of a cylindrical arm (R P P: slides not parallel, not both ⟂ axis 1).
//!
//! The wrist center's component along axis 1 is linear in the slides and its distance from
//! axis 1 quadratic: with the slide `k` that moves most along axis 1 eliminated by the linear
//! equation, the other slide `s` solves `|W + s D|² = ρ²` (0–2 roots), `ρ` the target's
//! distance from axis 1. Joint 1 then turns `W + s D` onto the target (Paden–Kahan
//! subproblem 1).

use armforge_runtime::internal::{CheckKind, ElbowRule, ShoulderRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::{Elbow, Shoulder};

use crate::plan::arm::Arm;
use crate::plan::graph::Graph;
use crate::plan::subproblems::rotate_onto;
use crate::plan::vec3::{self, num, V3};
use crate::plan::{ArmSolution, Target, Turn};
use crate::units::tidy;

/// The constants of a cylindrical arm.
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// Axis 1.
    pub h1: [f64; 3],
    /// The point of axis 1.
    pub p1: [f64; 3],
    /// Index (0-based: 1 or 2) of the eliminated slide `k`.
    pub pivot: usize,
    /// Index (0-based: 1 or 2) of the solved slide `j`.
    pub other: usize,
    /// `h1 · (c − p1)`.
    pub height: f64,
    /// `h1 · u_k`.
    pub along_k: f64,
    /// `h1 · u_j`.
    pub along_j: f64,
    /// Radial part at zero target height: `(c − p1)⊥ − height / along_k · u_k⊥`.
    pub a0: [f64; 3],
    /// Radial change per unit of target height: `u_k⊥ / along_k`.
    pub a1: [f64; 3],
    /// Radial change per unit of the solved slide.
    pub d: [f64; 3],
}

/// The constants the plan of a cylindrical arm is built from.
pub fn constants(arm: &Arm) -> Constants {
    let h1 = arm.axis(0);
    let p1 = arm.point(0);
    let (u2, u3) = (arm.axis(1), arm.axis(2));
    let (pivot, other) = if num::dot(&h1, &u2).abs() >= num::dot(&h1, &u3).abs() {
        (1, 2)
    } else {
        (2, 1)
    };
    let uk = arm.axis(pivot);
    let uj = arm.axis(other);
    let along_k = num::dot(&h1, &uk);
    let along_j = num::dot(&h1, &uj);
    let ck = num::sub(&arm.wrist_center, &p1);
    let height = num::dot(&h1, &ck);
    let uk_perp = num::perpendicular(&uk, &h1);
    let uj_perp = num::perpendicular(&uj, &h1);
    let a0 = num::sub(
        &num::perpendicular(&ck, &h1),
        &num::scale(&uk_perp, height / along_k),
    );
    let a1 = num::scale(&uk_perp, 1.0 / along_k);
    let d = num::sub(&uj_perp, &num::scale(&uk_perp, along_j / along_k));
    Constants {
        h1,
        p1,
        pivot,
        other,
        height,
        along_k,
        along_j,
        a0,
        a1,
        d,
    }
}

/// The label rules of a cylindrical arm.
pub fn rules(arm: &Arm) -> (ShoulderRule, ElbowRule) {
    let k = constants(arm);
    (
        ShoulderRule::Radial {
            direction: k.d,
            point: k.p1,
            wrist_center: arm.wrist_center,
        },
        ElbowRule::Only,
    )
}

/// Builds joints 1–3 of a cylindrical arm for both roots.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target, ct: V3) -> Vec<ArmSolution> {
    let k = constants(arm);
    let tol = 1e-10 * arm.scale;
    let y = vec3::add_const(g, ct, num::scale(&k.p1, -1.0));
    let zt = vec3::dot_const(g, k.h1, y);
    let zt = g.name(
        zt,
        "height",
        "h1 · (c_t − p1): the target's height along axis 1",
    );
    let y_perp = {
        let along = vec3::scale_const(g, zt, k.h1);
        vec3::sub(g, y, along)
    };
    let y_perp = vec3::name(g, y_perp, "radial", "(c_t − p1)⊥h1");
    let rho2 = vec3::dot(g, y_perp, y_perp);
    let rho2 = g.name(rho2, "rho2", "ρ² = |(c_t − p1)⊥h1|²");
    let w = {
        let x = vec3::scale_const(g, zt, k.a1);
        vec3::add_const(g, x, k.a0)
    };
    let w = vec3::name(
        g,
        w,
        "w0",
        &format!(
            "W = A0 + z A1: the radial part with slide {} at zero",
            k.other + 1
        ),
    );
    let dd = num::dot(&k.d, &k.d).max(1e-300);
    let dw = vec3::dot_const(g, k.d, w);
    let dw = g.name(dw, "dw", "D · W");
    let ww = vec3::dot(g, w, w);
    // |W⊥D|² = |W|² − (D·W)²/|D|²; disc/|D|² = ρ² − |W⊥D|².
    let closest = {
        let q = g.mul(dw, dw);
        let kq = g.constant(1.0 / dd);
        let q = g.mul(kq, q);
        g.sub(ww, q)
    };
    let closest = g.name(
        closest,
        "closest2",
        "|W⊥D|²: squared nearest approach to axis 1",
    );
    let disc = g.sub(rho2, closest);
    let root = g.sqrt0(disc);
    let root = g.name(
        root,
        "slide_root",
        format!("√(ρ² − |W⊥D|²) / |D|, |D|² = {}", tidy(dd)),
    );
    let limit = g.sqrt0(closest);
    let floor = g.exact(tol * tol);
    let singular = g.sub(floor, rho2);
    let singular = g.name(
        singular,
        "j1_free",
        "≥ 0 when the wrist center is on axis 1",
    );
    let mut out = Vec::new();
    for (facing, tag) in [(true, "a"), (false, "b")] {
        // s = (−D·W ± |D| √(ρ² − |W⊥D|²)) / |D|².
        let kd = g.constant(1.0 / dd.sqrt());
        let r = g.mul(kd, root);
        let kw = g.constant(-1.0 / dd);
        let base = g.mul(kw, dw);
        let s = if facing {
            g.add(base, r)
        } else {
            g.sub(base, r)
        };
        let s = g.name(
            s,
            &format!("slide{}_{tag}", k.other + 1),
            "s = (−D·W ± |D| √(ρ² − |W⊥D|²)) / |D|²",
        );
        let kz = g.constant(1.0 / k.along_k);
        let kj = g.constant(-k.along_j / k.along_k);
        let sk = {
            let h = g.constant(k.height);
            let z = g.sub(zt, h);
            let z = g.mul(kz, z);
            let j = g.mul(kj, s);
            g.add(z, j)
        };
        let sk = g.name(
            sk,
            &format!("slide{}_{tag}", k.pivot + 1),
            format!(
                "(h1·(c_t − c) − {} s) / {} (the height equation)",
                tidy(k.along_j),
                tidy(k.along_k)
            ),
        );
        let x = {
            let a = vec3::scale_const(g, s, k.d);
            vec3::add(g, a, w)
        };
        let (nc, ns) = rotate_onto(g, k.h1, x, y_perp);
        // Scaled by |x| |radial| rather than ρ²: near axis 1 the two differ by rounding far
        // beyond ρ², and the pair must stay a rotation.
        let (c1, s1) = crate::plan::unit_pair(g, nc, ns);
        let (rc, rs) = if facing {
            t.reference1
        } else {
            (g.neg(t.reference1.0), g.neg(t.reference1.1))
        };
        let c1 = g.select(singular, rc, c1);
        let s1 = g.select(singular, rs, s1);
        let c1 = g.name(
            c1,
            &format!("j1_cos_{tag}"),
            "cos θ1 = (x · radial) / |x · radial, h1 · (x × radial)|",
        );
        let s1 = g.name(
            s1,
            &format!("j1_sin_{tag}"),
            "sin θ1 = h1 · (x × radial) / |x · radial, h1 · (x × radial)|",
        );
        let theta1 = g.atan2(s1, c1);
        let theta1 = g.name(theta1, &format!("q1_{tag}"), "θ1 = atan2(sin θ1, cos θ1)");
        let mut angles = [theta1, 0, 0];
        angles[k.pivot] = sk;
        angles[k.other] = s;
        out.push(ArmSolution {
            angles,
            undo: vec![Turn::about(k.h1, (c1, s1))],
            shoulder: if facing {
                Shoulder::Facing
            } else {
                Shoulder::Across
            },
            elbow: Elbow::Only,
            checks: vec![CheckLayout {
                kind: CheckKind::InsideHole,
                have_squared: rho2,
                limit,
            }],
            on_axis_1: Some(singular),
        });
    }
    out
}
