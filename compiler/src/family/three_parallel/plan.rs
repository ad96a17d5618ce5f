//! Three consecutive parallel axes (joints 2, 3, 4) with no spherical wrist: the published
//! reduction (Pieper 1968: parallel axes meet at infinity), for arms whose axes 5 and 6 meet.
//!
//! Joints 2–4 turn about lines parallel to `h = h2`, so they keep every point's component
//! along `h` and turn every direction about `h` by the sum `Φ = θ2 + θ3 + θ4` (signs by axis
//! sense). With `G = B⁻¹ T M⁻¹ = E1 ⋯ E6` and `q` the point where axes 5 and 6 meet:
//!
//! 1. Joint 1, from the parallel planes: `E5 E6 q = q`, so `h · E1(−θ1) G q = h · q`:
//!    rotate a point into a plane, `a cos θ1 + b sin θ1 = e` (0–2 roots).
//! 2. Joint 5, from the orientation: `R5 R6 (Rᵀ R1 h) = h`. Joint 6 keeps the component along
//!    `h6`, so `h · R5 h6 = h6 · w`, `w = Rᵀ R1 h`: rotate into a plane again (0–2 roots).
//! 3. Joint 6, Paden–Kahan subproblem 1: turn `w` onto `R5ᵀ h` about `h6`.
//! 4. The sum Φ: `R(h, Φ) = R1ᵀ R R6ᵀ R5ᵀ`, read on a direction `x ⟂ h`.
//! 5. Joints 2 and 3, the planar two-link step: the point `o4` on axis 4 must reach
//!    `E1(−θ1) G E6(−θ6) E5(−θ5) o4` (law of cosines, 0–2 roots); joint 4 is the rest of Φ.
//!
//! Up to 2 × 2 × 2 = 8 solutions. Joint 1 is free when `G q` is on axis 1 (held at the
//! reference), joint 6 when axis 6 lines up with the parallel axes (held at the reference, the
//! sum Φ takes the rest).

use armforge_runtime::internal::{BranchRule, CheckKind, ElbowRule, WristRule};
use armforge_runtime::plan::{CandidateLayout, CheckLayout};
use armforge_runtime::{Branch, Elbow, Shoulder, Wrist};

use crate::classify::Geometry;
use crate::family::elbow::plan as elbow;
use crate::family::TargetSolution;
use crate::model::Model;
use crate::plan::arm::Arm;
use crate::plan::decouple::{self, Target};
use crate::plan::graph::{Graph, Id};
use crate::plan::planar::{self, TwoLink};
use crate::plan::pose::{self, Motion};
use crate::plan::subproblems::{rotate_into_plane_given, rotate_onto};
use crate::plan::vec3::{self, num, V3};
use crate::plan::wrist::ALIGNED_SINE;
use crate::plan::Plan;
use crate::units::tidy;

/// Cosines below this count as perpendicular (the wrist check is then never needed).
const PERPENDICULAR: f64 = 1e-12;

/// The constants of a three-parallel arm.
#[derive(Clone, Debug)]
pub struct Layout {
    /// The common direction of axes 2–4 (axis 2's).
    pub h: [f64; 3],
    /// `±1`: axis 4 is `sense4 · h`.
    pub sense4: f64,
    /// Where axes 5 and 6 meet, base frame at zero.
    pub meeting: [f64; 3],
    /// The point of axis 4 the two-link step places (the canonical point).
    pub on_axis_4: [f64; 3],
    /// A unit direction ⟂ `h`, on which the sum Φ is read.
    pub across: [f64; 3],
    /// Joints 2–3 placing `on_axis_4`.
    pub two_link: TwoLink,
}

impl Layout {
    /// The layout of an arm whose axes 2–4 are parallel and axes 5, 6 meet.
    pub fn of(arm: &Arm) -> Layout {
        let h = arm.axis(1);
        let on_axis_4 = arm.point(3);
        Layout {
            h,
            sense4: crate::plan::sign(num::dot(&arm.axis(3), &h)),
            meeting: meeting_point(arm.point(4), arm.axis(4), arm.point(5), arm.axis(5)),
            on_axis_4,
            across: num::any_perpendicular(&h),
            two_link: TwoLink::new(h, arm.point(1), arm.axis(2), arm.point(2), on_axis_4),
        }
    }

    /// True when axis 5 ⟂ `h` and axis 6 ⟂ axis 5: every orientation of axis 6 relative to
    /// the parallel axes is reachable, joint 5 never lacks a root.
    pub fn wrist_reaches_all(&self, arm: &Arm) -> bool {
        num::dot(&arm.axis(4), &self.h).abs() < PERPENDICULAR
            && num::dot(&arm.axis(4), &arm.axis(5)).abs() < PERPENDICULAR
    }

    /// `h · h5` and `h5 · h6`, for the angle by which an orientation misses.
    pub fn twist_cosines(&self, arm: &Arm) -> [f64; 2] {
        [
            num::dot(&self.h, &arm.axis(4)),
            num::dot(&arm.axis(4), &arm.axis(5)),
        ]
    }
}

/// The midpoint of the common normal of two non-parallel lines (their meeting point when they
/// meet).
pub fn meeting_point(p: [f64; 3], u: [f64; 3], q: [f64; 3], v: [f64; 3]) -> [f64; 3] {
    let w = num::sub(&p, &q);
    let uv = num::dot(&u, &v);
    let (du, dv) = (num::dot(&u, &w), num::dot(&v, &w));
    let det = (1.0 - uv * uv).max(1e-300);
    let s = (uv * dv - du) / det;
    let t = (dv - uv * du) / det;
    let a = num::add(&p, &num::scale(&u, s));
    let b = num::add(&q, &num::scale(&v, t));
    num::scale(&num::add(&a, &b), 0.5)
}

/// The arm seen with another point as its "wrist center" (the elbow family's joint-1 and label
/// steps then apply to that point).
fn with_center(arm: &Arm, center: [f64; 3]) -> Arm {
    Arm {
        wrist_center: center,
        ..arm.clone()
    }
}

/// The label rules of a three-parallel arm: joint 1's side as for the elbow family (with the
/// meeting point of axes 5 and 6), the bend of joints 2–3 placing axis 4, and the side of
/// axis 6 relative to the plane of axis 5 and the parallel axes.
pub fn rules(arm: &Arm) -> BranchRule {
    let k = Layout::of(arm);
    let (shoulder, _) = elbow::rules(&with_center(arm, k.meeting));
    let (_, elbow) = elbow::rules(&with_center(arm, k.on_axis_4));
    BranchRule {
        shoulder,
        elbow,
        wrist: WristRule {
            normal: num::cross(&arm.axis(4), &k.h),
            axis5: arm.axis(4),
            axis6: arm.axis(5),
        },
        mirrored: false,
    }
}

/// `r² − e²` of joint 5's equation as `(r − e)(r + e)`, `r − e = (r + s) − h6·w` and
/// `r + e = (r − s) + h6·w` (`s = (h5·h6)(h5·h)`). Where axis 6 can line up with the parallel
/// axes (`r + s = 1` or `r − s = 1`), the two roots of joint 5 merge there, and the factor that
/// vanishes is taken from `1 ∓ h6·w = |h6 × w|² / (1 ± h6·w)` (`w` is a unit vector), which
/// keeps its digits: joint 5 then loses none near the alignment.
fn discriminant(g: &mut Graph, arm: &Arm, k: &Layout, along: Id, perp2: Id, tag: &str) -> Id {
    let (h5, h6) = (arm.axis(4), arm.axis(5));
    let c56 = num::dot(&h5, &h6);
    let h6_perp = num::sub(&h6, &num::scale(&h5, c56));
    let r = num::norm(&h6_perp) * num::norm(&num::sub(&k.h, &num::scale(&h5, num::dot(&h5, &k.h))));
    let s = c56 * num::dot(&h5, &k.h);
    let one = g.constant(1.0);
    let factor = |g: &mut Graph, constant: f64, sign: f64| -> Id {
        let c = g.constant(constant);
        let plain = if sign > 0.0 {
            g.add(c, along)
        } else {
            g.sub(c, along)
        };
        if (constant - 1.0).abs() > 1e-12 {
            return plain;
        }
        // 1 ∓ h6·w: on the side where it is small, |h6 × w|² / (1 ± h6·w) with 1 ± h6·w ≥ 1.
        let other = if sign > 0.0 {
            g.sub(one, along)
        } else {
            g.add(one, along)
        };
        let safe = g.max(other, one);
        let quotient = g.div(perp2, safe);
        let toward = if sign > 0.0 { g.neg(along) } else { along };
        g.select(toward, quotient, plain)
    };
    let below = factor(g, r + s, -1.0);
    let above = factor(g, r - s, 1.0);
    let disc = g.mul(below, above);
    g.name(
        disc,
        &format!("j5_disc_{tag}"),
        "r² − e² = (r − e)(r + e), each factor from |h6 × w|² where it vanishes",
    )
}

/// Joints 5 and 6 for one root of joint 1.
struct Hand {
    /// Model values of joints 5 and 6.
    angles: [Id; 2],
    /// cos, sin of joints 5 and 6.
    turns: [(Id, Id); 2],
    wrist: Wrist,
}

/// Joints 5 and 6 for `w = Rᵀ R1 h`, both roots of joint 5.
fn hand(
    g: &mut Graph,
    arm: &Arm,
    k: &Layout,
    w: V3,
    reference: (Id, Id),
    tag: &str,
) -> (Vec<Hand>, Option<CheckLayout>, Id) {
    let (h5, h6) = (arm.axis(4), arm.axis(5));
    let c56 = num::dot(&h5, &h6);
    let h6_perp = num::sub(&h6, &num::scale(&h5, c56));
    let a = g.constant(num::dot(&h6_perp, &k.h));
    let b = g.constant(num::dot(&num::cross(&h5, &h6), &k.h));
    let along = vec3::dot_const(g, h6, w);
    let along = g.name(
        along,
        &format!("j5_rhs_{tag}"),
        "h6 · w: the cosine of the angle between the parallel axes and axis 6 (w = Rᵀ R1 h)",
    );
    let shift = g.constant(c56 * num::dot(&h5, &k.h));
    let e = g.sub(along, shift);
    let e = g.name(
        e,
        &format!("j5_e_{tag}"),
        format!(
            "h · R5 h6 = h6 · w: a cos θ5 + b sin θ5 = h6 · w − (h5·h6)(h5·h) = h6 · w − {}",
            tidy(c56 * num::dot(&h5, &k.h))
        ),
    );
    // Joint 6 turns w onto R5ᵀ h; both have the same component along h6, so the parts ⟂ h6
    // have the same length |h6 × w|.
    let h6k = vec3::constant(g, h6);
    let cross = vec3::cross(g, h6k, w);
    let perp2 = vec3::dot(g, cross, cross);
    let perp2 = g.name(
        perp2,
        &format!("j6_perp2_{tag}"),
        "|h6 × w|²: zero when axis 6 lines up with the parallel axes",
    );
    let disc = discriminant(g, arm, k, along, perp2, tag);
    let roots = rotate_into_plane_given(
        g,
        [a, b, e],
        Some(disc),
        reference,
        1e-20,
        "",
        &format!("j5_{tag}"),
    );
    let check = (!k.wrist_reaches_all(arm)).then_some(CheckLayout {
        kind: CheckKind::WristOrientation,
        have_squared: disc,
        limit: along,
    });
    let floor = g.exact(ALIGNED_SINE * ALIGNED_SINE);
    let aligned = g.sub(floor, perp2);
    let aligned = g.name(
        aligned,
        &format!("aligned_{tag}"),
        format!("≥ 0 when axis 6 is within {ALIGNED_SINE:e} of the parallel axes' direction"),
    );
    let scaled = vec3::scale_const(g, along, h6);
    let w_perp = vec3::sub(g, w, scaled);
    let mut out = Vec::with_capacity(2);
    for (i, sigma) in [1.0, -1.0].into_iter().enumerate() {
        let stag = if sigma > 0.0 { "a" } else { "b" };
        let name = format!("{tag}{stag}");
        let (c5, s5) = roots.roots[i];
        let theta5 = g.atan2(s5, c5);
        let theta5 = g.name(theta5, &format!("q5_{name}"), "θ5 = atan2(sin θ5, cos θ5)");
        let y = {
            let hk = vec3::constant(g, k.h);
            vec3::rotate_back(g, h5, c5, s5, hk)
        };
        let y = vec3::name(g, y, &format!("y6_{name}"), "R5ᵀ h");
        // Both parts ⟂ h6: near the alignment `w⊥ · y` would otherwise carry the rounding of
        // `w⊥ · h6` times `y · h6 ≈ 1`, as large as the product it is after.
        let y_along = vec3::dot_const(g, h6, y);
        let y_back = vec3::scale_const(g, y_along, h6);
        let y_perp = vec3::sub(g, y, y_back);
        let (nc, ns) = rotate_onto(g, h6, w_perp, y_perp);
        // Normalised by the root of nc² + ns² rather than by |h6 × w|²: near the alignment the
        // two differ by rounding, and (cos θ6, sin θ6) must stay a unit pair to undo joint 6.
        let q = g.mul_add2(nc, nc, ns, ns);
        let floor4 = g.exact_fourth(ALIGNED_SINE.powi(4));
        let inv = {
            let safe = g.max(q, floor4);
            let root = g.sqrt(safe);
            let one = g.constant(1.0);
            g.div(one, root)
        };
        let (rc, rs) = if sigma > 0.0 {
            reference
        } else {
            (g.neg(reference.0), g.neg(reference.1))
        };
        // Where R5ᵀ h itself lines up with h6 (joint 5 at the merged root), the pair has no
        // direction: the reference too.
        let lost = g.sub(floor4, q);
        let c6 = g.mul(nc, inv);
        let c6 = g.select(lost, rc, c6);
        let c6 = g.select(aligned, rc, c6);
        let c6 = g.name(
            c6,
            &format!("j6_cos_{name}"),
            "cos θ6 = w⊥ · R5ᵀh / √(nc² + ns²) (reference when aligned)",
        );
        let s6 = g.mul(ns, inv);
        let s6 = g.select(lost, rs, s6);
        let s6 = g.select(aligned, rs, s6);
        let s6 = g.name(
            s6,
            &format!("j6_sin_{name}"),
            "sin θ6 = h6 · (w⊥ × R5ᵀh) / √(nc² + ns²) (reference when aligned)",
        );
        let theta6 = g.atan2(s6, c6);
        let theta6 = g.name(theta6, &format!("q6_{name}"), "θ6 = atan2(sin θ6, cos θ6)");
        out.push(Hand {
            angles: [theta5, theta6],
            turns: [(c5, s5), (c6, s6)],
            wrist: if sigma > 0.0 {
                Wrist::Leading
            } else {
                Wrist::Trailing
            },
        });
    }
    (out, check, aligned)
}

/// The candidates of a three-parallel arm (every branch), from the target `t`.
pub fn solve(g: &mut Graph, arm: &Arm, t: &Target) -> Vec<CandidateLayout> {
    let k = Layout::of(arm);
    let h1 = arm.axis(0);
    let motion = pose::joint_motions(g, arm, t);
    let motion: Motion = pose::name(g, motion, "g", "G = B⁻¹ T M⁻¹ = E1 ⋯ E6");
    let target_q = {
        let q = vec3::constant(g, k.meeting);
        motion.apply(g, q)
    };
    let target_q = vec3::name(
        g,
        target_q,
        "wc",
        &format!(
            "G q: where the target puts the meeting point of axes 5 and 6, q = ({}, {}, {}) m",
            tidy(k.meeting[0]),
            tidy(k.meeting[1]),
            tidy(k.meeting[2])
        ),
    );
    let one = elbow::joint_one(g, &with_center(arm, k.meeting), t, target_q);
    let mut out = Vec::new();
    for (i1, sigma1) in ["a", "b"].into_iter().enumerate() {
        let (c1, s1) = one.roots[i1];
        let r1h = {
            let hk = vec3::constant(g, k.h);
            vec3::rotate(g, h1, c1, s1, hk)
        };
        let w = motion.rotate_back(g, r1h);
        let w = vec3::name(
            g,
            w,
            &format!("w6_{sigma1}"),
            "w = Rᵀ R1 h = R6ᵀ R5ᵀ h: the parallel axes' direction seen from the tool",
        );
        let (hands, wrist_check, aligned) = hand(g, arm, &k, w, t.reference4, sigma1);
        for hd in &hands {
            let tag = format!(
                "{sigma1}{}",
                if hd.wrist == Wrist::Leading { "a" } else { "b" }
            );
            let outer = Outer {
                angles: [one.angles[i1], hd.angles[0], hd.angles[1]],
                turns: [(c1, s1), hd.turns[0], hd.turns[1]],
                shoulder: one.shoulders[i1],
                wrist: hd.wrist,
                checks: [Some(one.check), wrist_check],
                wrist_aligned: Some(aligned),
                on_axis_1: Some(one.singular),
            };
            out.extend(joints_2_to_4(g, arm, (&k, &motion), &outer, &tag));
        }
    }
    out
}

/// Joints 1, 5 and 6 of one candidate, found before joints 2–4.
pub(crate) struct Outer {
    /// Model values of joints 1, 5, 6.
    pub angles: [Id; 3],
    /// cos, sin of joints 1, 5, 6.
    pub turns: [(Id, Id); 3],
    /// The shoulder label of joint 1's root.
    pub shoulder: Shoulder,
    /// The wrist label of joint 5's root.
    pub wrist: Wrist,
    /// The checks of joints 1, 5 and 6 (up to two).
    pub checks: [Option<CheckLayout>; 2],
    /// `≥ 0` where axis 6 lines up with the parallel axes.
    pub wrist_aligned: Option<Id>,
    /// `≥ 0` where joint 1 is free.
    pub on_axis_1: Option<Id>,
}

/// Joints 2–4 for joints 1, 5 and 6: the sum `Φ = θ2 + θ3 + θ4` from the orientation,
/// `R(h, Φ) x = R1ᵀ R R6ᵀ R5ᵀ x`, joints 2 and 3 placing the point `o4` of axis 4 at
/// `E1(−θ1) G E6(−θ6) E5(−θ5) o4` (law of cosines, 0–2 roots), joint 4 the rest of `Φ`: one
/// candidate per bend.
pub(crate) fn joints_2_to_4(
    g: &mut Graph,
    arm: &Arm,
    (k, motion): (&Layout, &Motion),
    outer: &Outer,
    tag: &str,
) -> Vec<CandidateLayout> {
    let up = match rules(arm).elbow {
        ElbowRule::Bend { up, .. } => up,
        _ => 1.0,
    };
    let side = if outer.shoulder == Shoulder::Across {
        -1.0
    } else {
        1.0
    };
    let tol = 1e-10 * arm.scale;
    let (h1, p1) = (arm.axis(0), arm.point(0));
    let (h5, p5) = (arm.axis(4), arm.point(4));
    let (h6, p6) = (arm.axis(5), arm.point(5));
    let [(c1, s1), (c5, s5), (c6, s6)] = outer.turns;
    let y = {
        let x = vec3::constant(g, k.across);
        let a = vec3::rotate_back(g, h5, c5, s5, x);
        let b = vec3::rotate_back(g, h6, c6, s6, a);
        let c = motion.rotate(g, b);
        vec3::rotate_back(g, h1, c1, s1, c)
    };
    let sum = planar::angle_about(g, k.h, k.across, y);
    let sum = g.name(
        sum,
        &format!("phi234_{tag}"),
        "Φ = θ2 + θ3 + θ4 (about h) = atan2(h · (x × R1ᵀ R R6ᵀ R5ᵀ x), x · R1ᵀ R R6ᵀ R5ᵀ x)",
    );
    // The point on axis 4, where joints 2 and 3 must put it.
    let placed = {
        let a = pose::undo_revolute_const(g, h5, p5, (c5, s5), k.on_axis_4);
        let b = pose::undo_revolute(g, h6, p6, (c6, s6), a);
        let c = motion.apply(g, b);
        let d = pose::undo_revolute(g, h1, p1, (c1, s1), c);
        vec3::add_const(g, d, num::scale(&arm.point(1), -1.0))
    };
    let placed = vec3::name(
        g,
        placed,
        &format!("w4_{tag}"),
        "E1(−θ1) G E6(−θ6) E5(−θ5) o4 − p2: where joints 2 and 3 must put axis 4",
    );
    let d2 = planar::distance_squared(g, k.h, placed);
    let d2 = g.name(
        d2,
        &format!("d2_{tag}"),
        "d² = |(w4 − p2)⊥h|²: squared distance of axis 4 from axis 2",
    );
    let two = planar::solve(g, &k.two_link, placed, d2, tol, tag);
    let mut out = Vec::with_capacity(2);
    for bend in &two.bends {
        let btag = format!("{tag}{}", if bend.bend > 0.0 { "a" } else { "b" });
        // θ4 = s4 (Φ − θ2 − φ3), φ3 = s3 θ3.
        let phi3 = if k.two_link.sense > 0.0 {
            bend.second
        } else {
            g.neg(bend.second)
        };
        let rest = g.sub(sum, bend.first);
        let rest = g.sub(rest, phi3);
        let theta4 = if k.sense4 > 0.0 { rest } else { g.neg(rest) };
        let theta4 = g.name(
            theta4,
            &format!("q4_{btag}"),
            format!("θ4 = {} (Φ − θ2 − φ3)", k.sense4),
        );
        let mut checks = [None; 4];
        let list = outer
            .checks
            .into_iter()
            .chain([Some(two.checks[0]), Some(two.checks[1])]);
        for (slot, c) in checks.iter_mut().zip(list.flatten()) {
            *slot = Some(c);
        }
        let [theta1, theta5, theta6] = outer.angles;
        out.push(CandidateLayout {
            model_values: [theta1, bend.first, bend.second, theta4, theta5, theta6],
            branch: Branch {
                shoulder: outer.shoulder,
                elbow: if bend.bend * side == up {
                    Elbow::Up
                } else {
                    Elbow::Down
                },
                wrist: outer.wrist,
            },
            checks,
            wrist_aligned: outer.wrist_aligned,
            on_axis_1: outer.on_axis_1,
        });
    }
    out
}

/// The solve of a three-parallel arm for the target `t` (the family's
/// [`crate::family::TargetStep`]); joints 1 and 6 are held at the reference when free.
pub fn target_step(
    g: &mut Graph,
    model: &Model,
    geometry: &Geometry,
    t: &Target,
) -> TargetSolution {
    let probe = Arm::with_center(model, geometry.family, [0.0; 3]);
    let k = Layout::of(&probe);
    let arm = Arm::with_center(model, geometry.family, k.meeting);
    let candidates = solve(g, &arm, t);
    let rule = rules(&arm);
    let twist = k.twist_cosines(&arm);
    TargetSolution {
        arm,
        candidates,
        rule,
        twist,
        free: [0, 5],
    }
}

/// The plan of a three-parallel arm.
pub fn build(model: &Model, geometry: &Geometry) -> Plan {
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let s = target_step(&mut g, model, geometry, &t);
    crate::plan::assemble(s.arm, &g, &s.candidates, s.rule, s.twist, s.free)
}
