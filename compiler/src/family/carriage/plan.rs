//! Joints 1–3 of a carriage arm (P P R: two slides that are not parallel, then a turn whose
//! axis is not ⟂ both slides).
//!
//! # The reduction
//!
//! The slides move the wrist center within planes parallel to both: with `n` the unit
//! normal of the slides (`e1 × e2` normalised), only joint 3 changes the wrist center's
//! height `n · c` across them. Joint 3 turns the wrist center about axis 3 (`h3` through
//! `p3`): with `v = c − p3`, `v∥ = (h3 · v) h3` and `v⊥ = v − v∥`,
//!
//! ```text
//! E3(θ3) c = p3 + v∥ + cos θ3 v⊥ + sin θ3 (h3 × v⊥)
//! n · c_t  = k0 + a cos θ3 + b sin θ3,   k0 = n · (p3 + v∥),  a = n · v⊥,  b = n · (h3 × v⊥)
//! ```
//!
//! one equation in joint 3 alone. With `R² = a² + b²` and `e = n · c_t − k0` (`|e| ≤ R`):
//!
//! ```text
//! cos θ3 = (a e ∓ b √(R² − e²)) / R²,   sin θ3 = (b e ± a √(R² − e²)) / R²
//! ```
//!
//! (0–2 roots; they merge where `|e| = R`, the wrist center at its highest or lowest across
//! the slides). The slides then carry the rest, `δ = c_t − E3(θ3) c = d1 e1 + d2 e2`,
//! solved with the dual directions `f1 = (e1 − g e2) / (1 − g²)`, `f2 = (e2 − g e1) / (1 − g²)`,
//! `g = e1 · e2`: `d1 = f1 · δ`, `d2 = f2 · δ`.
//!
//! # Labels
//!
//! The two roots lie on either side of `θ3 = φ`, `φ = atan2(b, a)` (the joint-3 value of the
//! highest wrist center): `sin(θ3 − φ) = ±√(R² − e²) / R`. The elbow label is that sign
//! (the runtime's [`ElbowRule::Bend`] with `stretched = φ`), `Up` on the zero
//! configuration's side; it changes only where the two roots merge. There is no shoulder
//! choice.

use armforge_runtime::internal::{CheckKind, ElbowRule, ShoulderRule};
use armforge_runtime::plan::CheckLayout;
use armforge_runtime::{Elbow, Shoulder};

use crate::plan::arm::Arm;
use crate::plan::graph::{Graph, Id};
use crate::plan::vec3::{self, num, V3};
use crate::plan::{sign, ArmSolution, Turn};

/// The constants of a carriage arm's position step.
#[derive(Clone, Copy, Debug)]
pub struct Constants {
    /// The slide of joint 1 (unit).
    pub e1: [f64; 3],
    /// The slide of joint 2 (unit).
    pub e2: [f64; 3],
    /// Dual direction of slide 1: `d1 = f1 · δ`.
    pub f1: [f64; 3],
    /// Dual direction of slide 2: `d2 = f2 · δ`.
    pub f2: [f64; 3],
    /// The unit normal of both slides, `e1 × e2 / |e1 × e2|`.
    pub n: [f64; 3],
    /// Axis 3.
    pub h3: [f64; 3],
    /// The point of axis 3 at zero.
    pub p3: [f64; 3],
    /// `p3 + v∥`: the center of the circle joint 3 turns the wrist center on.
    pub hub: [f64; 3],
    /// `v⊥`: the wrist center from the hub at zero.
    pub spoke: [f64; 3],
    /// `h3 × v⊥`.
    pub spoke_turned: [f64; 3],
    /// `k0 = n · hub`: the circle's height across the slides.
    pub k0: f64,
    /// `a = n · v⊥`.
    pub a: f64,
    /// `b = n · (h3 × v⊥)`.
    pub b: f64,
    /// `R = √(a² + b²)`: how far joint 3 moves the wrist center across the slides, each way.
    pub swing: f64,
    /// `φ = atan2(b, a)`: the joint-3 model value of the highest wrist center.
    pub phase: f64,
    /// The sign of `sin(θ3 − φ)` that means `Up` (the zero configuration's).
    pub up: f64,
}

/// The constants the plan of a carriage arm is built from.
pub fn constants(arm: &Arm) -> Constants {
    let (e1, e2) = (arm.axis(0), arm.axis(1));
    let h3 = arm.axis(2);
    let p3 = arm.point(2);
    let g = num::dot(&e1, &e2);
    let det = 1.0 - g * g;
    let f1 = num::scale(&num::sub(&e1, &num::scale(&e2, g)), 1.0 / det);
    let f2 = num::scale(&num::sub(&e2, &num::scale(&e1, g)), 1.0 / det);
    let n = num::unit(&num::cross(&e1, &e2));
    let v = num::sub(&arm.wrist_center, &p3);
    let spoke = num::perpendicular(&v, &h3);
    let hub = num::sub(&arm.wrist_center, &spoke);
    let spoke_turned = num::cross(&h3, &spoke);
    let (a, b) = (num::dot(&n, &spoke), num::dot(&n, &spoke_turned));
    let phase = b.atan2(a);
    Constants {
        e1,
        e2,
        f1,
        f2,
        n,
        h3,
        p3,
        hub,
        spoke,
        spoke_turned,
        k0: num::dot(&n, &hub),
        a,
        b,
        swing: a.hypot(b),
        phase,
        up: sign((-phase).sin()),
    }
}

/// The label rules of a carriage arm: no shoulder choice, the elbow by the side of `φ`.
pub fn rules(k: &Constants) -> (ShoulderRule, ElbowRule) {
    (
        ShoulderRule::Only,
        ElbowRule::Bend {
            sense: 1.0,
            stretched: k.phase,
            up: k.up,
        },
    )
}

/// Builds joints 1–3 of a carriage arm for both roots of joint 3.
pub fn solve(g: &mut Graph, k: &Constants, ct: V3) -> Vec<ArmSolution> {
    let height = vec3::dot_const(g, k.n, ct);
    let e = {
        let k0 = g.constant(k.k0);
        g.sub(height, k0)
    };
    let e = g.name(
        e,
        "swing_height",
        "e = n · c_t − k0: the target's height across the slides, from the circle's",
    );
    let e2 = g.mul(e, e);
    let e2 = g.name(e2, "swing_height2", "e²");
    let disc = {
        let r2 = g.constant(k.swing * k.swing);
        g.sub(r2, e2)
    };
    let root = g.sqrt0(disc);
    let root = g.name(root, "swing_root", "√(R² − e²), zero beyond reach");
    let limit = g.constant(k.swing);
    [1.0, -1.0]
        .into_iter()
        .map(|side| {
            branch(
                g,
                k,
                ct,
                e,
                root,
                side,
                CheckLayout {
                    kind: CheckKind::BeyondReach,
                    have_squared: e2,
                    limit,
                },
            )
        })
        .collect()
}

/// The branch with `sin(θ3 − φ)` of sign `side`.
fn branch(
    g: &mut Graph,
    k: &Constants,
    ct: V3,
    e: Id,
    root: Id,
    side: f64,
    check: CheckLayout,
) -> ArmSolution {
    let tag = if side > 0.0 { "a" } else { "b" };
    let inv = 1.0 / (k.swing * k.swing);
    // cos θ3 = (a e − side b √) / R², sin θ3 = (b e + side a √) / R².
    let c3 = {
        let ae = g.constant(k.a * inv);
        let ae = g.mul(ae, e);
        let br = g.constant(-side * k.b * inv);
        let br = g.mul(br, root);
        g.add(ae, br)
    };
    let s3 = {
        let be = g.constant(k.b * inv);
        let be = g.mul(be, e);
        let ar = g.constant(side * k.a * inv);
        let ar = g.mul(ar, root);
        g.add(be, ar)
    };
    let sign_word = if side > 0.0 {
        "∓ → −"
    } else {
        "∓ → +"
    };
    let c3 = g.name(
        c3,
        &format!("j3_cos_{tag}"),
        format!("cos θ3 = (a e ∓ b √(R² − e²)) / R² ({sign_word})"),
    );
    let s3 = g.name(
        s3,
        &format!("j3_sin_{tag}"),
        "sin θ3 = (b e ± a √(R² − e²)) / R²",
    );
    let theta3 = g.atan2(s3, c3);
    let theta3 = g.name(theta3, &format!("q3_{tag}"), "θ3 = atan2(sin θ3, cos θ3)");
    let placed = {
        let along = vec3::scale_const(g, c3, k.spoke);
        let across = vec3::scale_const(g, s3, k.spoke_turned);
        let turned = vec3::add(g, along, across);
        vec3::add_const(g, turned, k.hub)
    };
    let delta = vec3::sub(g, ct, placed);
    let delta = vec3::name(
        g,
        delta,
        &format!("carried_{tag}"),
        "δ = c_t − E3(θ3) c: what the slides carry",
    );
    let d1 = vec3::dot_const(g, k.f1, delta);
    let d1 = g.name(d1, &format!("q1_{tag}"), "d1 = f1 · δ");
    let d2 = vec3::dot_const(g, k.f2, delta);
    let d2 = g.name(d2, &format!("q2_{tag}"), "d2 = f2 · δ");
    ArmSolution {
        angles: [d1, d2, theta3],
        undo: vec![Turn::about(k.h3, (c3, s3))],
        shoulder: Shoulder::Only,
        elbow: if side == k.up { Elbow::Up } else { Elbow::Down },
        checks: vec![check],
        on_axis_1: None,
    }
}
