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

use super::arm::Arm;
use super::graph::Graph;
use super::subproblems::{rotate_into_plane, rotate_onto};
use super::vec3::{self, num, V3};
use super::{sign, ArmSolution, Target, Turn};
use crate::units::tidy;
use armforge_runtime::internal::{ElbowRule, ShoulderRule};

/// The constants of the elbow family.
struct Constants {
    h1: [f64; 3],
    p1: [f64; 3],
    h2: [f64; 3],
    /// `h2 − (h1·h2) h1`.
    alpha: [f64; 3],
    /// `h1 × h2`.
    beta: [f64; 3],
    /// `h1 · h2`.
    cos12: f64,
    /// `h2 · (c − p2) − h2 · (p1 − p2)`.
    e0: f64,
    p1_minus_p2: [f64; 3],
    /// Upper arm: from axis 2 to axis 3, ⟂ h2.
    l: [f64; 3],
    /// Forearm: from axis 3 to the wrist center, ⟂ h2.
    v: [f64; 3],
    /// `h2 × V`.
    hv: [f64; 3],
    /// `±1`: h3 = sense · h2.
    sense: f64,
    /// Angle of the stretched arm about h2 (`φ0 = atan2(2 L·(h×V), 2 L·V)`).
    stretched: f64,
}

fn constants(arm: &Arm) -> Constants {
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
    let l = num::perpendicular(&num::sub(&p3, &p2), &h2);
    let v = num::perpendicular(&num::sub(&c, &p3), &h2);
    let hv = num::cross(&h2, &v);
    let sense = sign(num::dot(&h3, &h2));
    let stretched = num::dot(&l, &hv).atan2(num::dot(&l, &v));
    Constants {
        h1,
        p1,
        h2,
        alpha,
        beta,
        cos12,
        e0,
        p1_minus_p2,
        l,
        v,
        hv,
        sense,
        stretched,
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
            sense: k.sense,
            stretched: k.stretched,
            up,
        },
    )
}

/// Joint 1 of elbow and polar arms (rotate a point into a plane), with the wrist center seen
/// from axis 2 once joint 1 is undone.
pub(crate) struct JointOne {
    /// `(cos θ1, sin θ1)` for `σ = +1, −1`.
    pub roots: [(super::graph::Id, super::graph::Id); 2],
    /// `θ1` for `σ = +1, −1`.
    pub angles: [super::graph::Id; 2],
    /// `w − p2 = E1(−θ1) c_t − p2` for `σ = +1, −1`.
    pub w: [V3; 2],
    /// `d²`: squared distance of `w` from axis 2, for `σ = +1, −1`.
    pub d2: [super::graph::Id; 2],
    /// Shoulder labels for `σ = +1, −1`.
    pub shoulders: [Shoulder; 2],
    /// The shoulder's reality check (the wrist center outside the offset cylinder).
    pub check: CheckLayout,
    /// `≥ 0` when the wrist center is on axis 1.
    pub singular: super::graph::Id,
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
        // d² = |(w − p2)⊥h2|² (the perpendicular part first: no cancellation, and a unit
        // axis folds its component away).
        let hw = vec3::dot_const(g, k.h2, w);
        let along = vec3::scale_const(g, hw, k.h2);
        let w_perp = vec3::sub(g, w, along);
        let d2 = vec3::dot(g, w_perp, w_perp);
        let d2 = g.name(
            d2,
            &format!("d2_{tag}"),
            "d² = |(w − p2)⊥h2|²: squared distance from axis 2",
        );
        let theta1 = g.atan2(s1, c1);
        angles[i] = g.name(theta1, &format!("q1_{tag}"), "θ1 = atan2(sin θ1, cos θ1)");
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

/// Builds joints 1–3 of an elbow arm for every branch (σ × elbow sign).
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target, ct: V3) -> Vec<ArmSolution> {
    let k = constants(arm);
    let (_, up) = references(arm, &k);
    let tol = 1e-10 * arm.scale;
    let one_ = joint_one(g, arm, t, ct);
    let shoulder_check = one_.check;
    let ll = num::dot(&k.l, &k.l);
    let vv = num::dot(&k.v, &k.v);
    let (len_l, len_v) = (ll.sqrt(), vv.sqrt());
    let two_lv = (2.0 * len_l * len_v).max(1e-300);
    let reach_out = g.constant(len_l + len_v);
    let reach_in = g.constant((len_l - len_v).abs());

    let mut out = Vec::new();
    for (i, sigma) in [1.0, -1.0].into_iter().enumerate() {
        let tag = if sigma > 0.0 { "a" } else { "b" };
        let (c1, s1) = one_.roots[i];
        let w = one_.w[i];
        let d2 = one_.d2[i];
        let theta1 = one_.angles[i];
        let offset = g.constant(ll + vv);
        let num_c = g.sub(d2, offset);
        let inv = g.constant(1.0 / two_lv);
        let cos_psi = g.mul(num_c, inv);
        let cos_psi = g.clamp(cos_psi, -1.0, 1.0);
        let cos_psi = g.name(
            cos_psi,
            &format!("j3_cos_psi_{tag}"),
            format!(
                "law of cosines: cos ψ = (d² − |L|² − |V|²) / (2 |L| |V|), |L| = {} m, |V| = {} m",
                tidy(len_l),
                tidy(len_v)
            ),
        );
        let one = g.constant(1.0);
        let om = g.sub(one, cos_psi);
        let op = g.add(one, cos_psi);
        let prod = g.mul(om, op);
        let sin_psi = g.sqrt0(prod);
        let sin_psi = g.name(
            sin_psi,
            &format!("j3_sin_psi_{tag}"),
            "sin ψ = √((1 − cos ψ)(1 + cos ψ)) ≥ 0",
        );
        // |x⊥|² = |L + R(φ) V|² = |L|² + |V|² + 2|L||V| cos ψ, shared by both elbow roots.
        let two = g.constant(two_lv);
        let n = g.mul(two, cos_psi);
        let n = g.add(offset, n);
        let floor = g.exact(tol * tol);
        let n = g.max(n, floor);
        let inv_n = g.div(one, n);
        let inv_n = g.name(
            inv_n,
            &format!("j2_inv_{tag}"),
            "1 / |L + R3 V|², the squared distance of the wrist center from axis 2",
        );
        let shoulder = one_.shoulders[i];
        let side = if shoulder == Shoulder::Facing {
            1.0
        } else {
            -1.0
        };
        for bend in [1.0, -1.0] {
            let btag = if bend > 0.0 { "a" } else { "b" };
            let tag2 = format!("{tag}{btag}");
            let sp = if bend > 0.0 { sin_psi } else { g.neg(sin_psi) };
            let (cf, sf) = (k.stretched.cos(), k.stretched.sin());
            let cf = g.constant(cf);
            let sf = g.constant(sf);
            let cos_phi = {
                let x = g.mul(cf, cos_psi);
                let y = g.mul(sf, sp);
                g.sub(x, y)
            };
            let cos_phi = g.name(
                cos_phi,
                &format!("j3_cos_{tag2}"),
                format!(
                    "cos φ3 = cos(φ0 ± ψ), φ0 = {} rad (stretched)",
                    tidy(k.stretched)
                ),
            );
            let sin_phi = {
                let x = g.mul(sf, cos_psi);
                let y = g.mul(cf, sp);
                g.add(x, y)
            };
            let sin_phi = g.name(sin_phi, &format!("j3_sin_{tag2}"), "sin φ3 = sin(φ0 ± ψ)");
            let phi = g.atan2(sin_phi, cos_phi);
            let theta3 = if k.sense > 0.0 { phi } else { g.neg(phi) };
            let theta3 = g.name(
                theta3,
                &format!("q3_{tag2}"),
                if k.sense > 0.0 {
                    "θ3 = atan2(sin φ3, cos φ3)"
                } else {
                    "θ3 = -atan2(sin φ3, cos φ3)"
                },
            );
            // x⊥ = L + R(h2, φ3) V.
            let x = {
                let a = vec3::scale_const(g, cos_phi, k.v);
                let b = vec3::scale_const(g, sin_phi, k.hv);
                let ab = vec3::add(g, a, b);
                vec3::add_const(g, ab, k.l)
            };
            let (nc, ns) = rotate_onto(g, k.h2, x, w);
            let theta2 = g.atan2(ns, nc);
            let theta2 = g.name(
                theta2,
                &format!("q2_{tag2}"),
                "Paden–Kahan 1: θ2 = atan2(h2 · (x⊥ × w), x⊥ · w), x⊥ = L + R3 V",
            );
            let c2 = g.mul(nc, inv_n);
            let s2 = g.mul(ns, inv_n);
            let c23 = {
                let x = g.mul(c2, cos_phi);
                let y = g.mul(s2, sin_phi);
                g.sub(x, y)
            };
            let c23 = g.name(c23, &format!("c23_{tag2}"), "cos(θ2 + φ3)");
            let s23 = {
                let x = g.mul(s2, cos_phi);
                let y = g.mul(c2, sin_phi);
                g.add(x, y)
            };
            let s23 = g.name(s23, &format!("s23_{tag2}"), "sin(θ2 + φ3)");
            let elbow = if bend * side == up {
                Elbow::Up
            } else {
                Elbow::Down
            };
            out.push(ArmSolution {
                angles: [theta1, theta2, theta3],
                undo: vec![
                    Turn {
                        axis: k.h1,
                        cos: c1,
                        sin: s1,
                    },
                    Turn {
                        axis: k.h2,
                        cos: c23,
                        sin: s23,
                    },
                ],
                shoulder,
                elbow,
                checks: vec![
                    shoulder_check,
                    CheckLayout {
                        kind: CheckKind::BeyondReach,
                        have_squared: d2,
                        limit: reach_out,
                    },
                    CheckLayout {
                        kind: CheckKind::InsideHole,
                        have_squared: d2,
                        limit: reach_in,
                    },
                ],
                on_axis_1: Some(one_.singular),
            });
        }
    }
    out
}
