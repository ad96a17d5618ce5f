//! Reading an arm from its tool (mirrored decoupling, Pieper 1968), shared by the families that
//! solve an arm through its mirror (the wrist-at-base and tool-first families).
//!
//! With `G = B⁻¹ T M⁻¹ = E1 ⋯ E6`, `G⁻¹ = E6(−θ6) ⋯ E1(−θ1)` and `E(h, −θ) = E(−h, θ)`, so
//! `G⁻¹` is the forward kinematics of the *mirrored arm*: joint `i` of it is joint `7 − i`
//! turning about the reversed axis, by the same value, with no base and no tool. Here: the
//! mirrored model, its classification by a subset of the registry, its target `G⁻¹` on the
//! graph, and the renumbering of what is found on it (candidates, `verify` hints, words) back
//! into the arm's numbering (0-based joint `i` of the mirrored arm is the arm's `5 − i`).

// A rejection is made once per classification; keeping it unboxed keeps the pinned
// `Result<Geometry, Rejection>` (as in `classify`).
#![allow(clippy::result_large_err)]

use std::collections::HashMap;
use std::sync::{Mutex, OnceLock};

use armforge_runtime::plan::CandidateLayout;
use armforge_runtime::{Joint, Pose};

use super::data::{Distance, SamplerBoundary, VerifyHints};
use super::{Family, FamilyModule, Recognition, REGISTRY};
use crate::classify::context::Context;
use crate::classify::{Geometry, Rejection};
use crate::model::{Model, ModelJoint};
use crate::plan::arm::Arm;
use crate::plan::decouple::Target;
use crate::plan::graph::Graph;
use crate::plan::pose;
use crate::plan::vec3::num;

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

/// The runtime joints of the mirrored arm (for `verify` hints measured on it).
pub fn mirrored_joints(joints: &[Joint]) -> Vec<Joint> {
    joints
        .iter()
        .rev()
        .map(|j| Joint {
            axis: [-j.axis[0], -j.axis[1], -j.axis[2]],
            ..*j
        })
        .collect()
}

/// Why no family of the subset recognised the mirrored arm.
#[derive(Debug, Default)]
pub struct MirroredMiss {
    /// The first family that found the mirrored arm degenerate, with its reason.
    pub degenerate: Option<(Family, Rejection)>,
    /// The first other reason given.
    pub first: Option<Rejection>,
}

impl MirroredMiss {
    /// The reason to give: the degenerate one first.
    pub fn reason(self) -> Option<Rejection> {
        self.degenerate.map(|(_, r)| r).or(self.first)
    }
}

/// The arm seen from its tool ([`mirrored_model`]) classified by the families of the registry
/// that `offers` accepts (never the mirroring families themselves, so the mirror of a mirror
/// is never tried): the first that recognises it, or why none did.
pub fn classify_mirrored(
    ctx: &Context,
    offers: fn(&dyn FamilyModule) -> bool,
) -> Result<Geometry, MirroredMiss> {
    let mirrored = mirrored_model(ctx.model);
    let mctx = Context::new(&mirrored, &ctx.tolerances).map_err(|r| MirroredMiss {
        degenerate: None,
        first: Some(r),
    })?;
    let mut miss = MirroredMiss::default();
    for module in REGISTRY.iter().filter(|m| offers(**m)) {
        match module.recognise(&mctx) {
            Recognition::Mine(found) => {
                return Ok(crate::classify::geometry_of(&mctx, module.family(), found))
            }
            Recognition::Degenerate(r) => {
                miss.degenerate.get_or_insert((module.family(), r));
            }
            Recognition::NotMine(r) => {
                if miss.first.is_none() {
                    miss.first = r;
                }
            }
        }
    }
    Err(miss)
}

/// The mirrored arm's target on the graph: `G⁻¹` (named `ginv`) with the plan's reference
/// inputs, for the arm `arm` (its base and tool) and the plan's target `t`.
pub fn mirrored_target(g: &mut Graph, arm: &Arm, t: &Target) -> Target {
    let motion = pose::joint_motions(g, arm, t);
    let inverse = motion.inverse(g);
    let inverse = pose::name(
        g,
        inverse,
        "ginv",
        "G⁻¹ = (B⁻¹ T M⁻¹)⁻¹: the mirrored arm's target",
    );
    Target {
        rotation: inverse.rows,
        translation: inverse.translation,
        reference1: t.reference1,
        reference4: t.reference4,
    }
}

/// The mirrored arm's candidates read in the arm's order (its joint values reversed).
pub fn read_back(candidates: Vec<CandidateLayout>) -> Vec<CandidateLayout> {
    candidates
        .into_iter()
        .map(|mut c| {
            c.model_values.reverse();
            c
        })
        .collect()
}

/// The arm's 0-based joint for the mirrored arm's 0-based joint `i`.
pub fn joint_of(i: usize) -> usize {
    5 - i
}

/// The mirrored arm's `verify` hints in the arm's numbering (0-based joint `i` is the arm's
/// `5 − i`, its motion undone).
pub fn renumber_hints(h: VerifyHints) -> VerifyHints {
    let distance = |d: Distance| Distance {
        point: d.point,
        moved_by: d
            .moved_by
            .iter()
            .map(|&(j, undo)| (joint_of(j), !undo))
            .collect(),
        axis: joint_of(d.axis),
    };
    let boundary = |b: SamplerBoundary| SamplerBoundary {
        distance: distance(b.distance),
        joint: joint_of(b.joint),
        at: b.at,
        side: b.side,
    };
    let mut roles = h.roles;
    roles.reverse();
    VerifyHints {
        aligned_joint: joint_of(h.aligned_joint),
        aligned_at: h.aligned_at,
        axes: h.axes.map(|d| d.map(distance)),
        on_axis: h.on_axis.map(boundary),
        boundaries: h.boundaries.into_iter().map(boundary).collect(),
        roles,
    }
}

/// `text`, written about the mirrored arm, in the arm's numbering: every joint or axis number
/// after `joint`, `joints`, `axis` or `axes` (single numbers, lists `2, 3 and 4`, ranges `2–4`)
/// becomes `7 − n`, and a group's numbers are put in ascending order again (`axes 5 and 6` →
/// `axes 1 and 2`, `joints 2–4` → `joints 3–5`). Symbols (`θ5`, `h6`) are left alone: text that
/// uses them says it is read on the mirrored arm.
pub fn renumber_text(text: &str) -> String {
    const WORDS: [&str; 9] = [
        "joints ", "joint ", "joint-", "axes ", "axis ", "Joints ", "Joint ", "Axes ", "Axis ",
    ];
    let mut out = String::with_capacity(text.len());
    let mut rest = text;
    while !rest.is_empty() {
        if let Some(word) = WORDS.iter().find(|w| rest.starts_with(**w)) {
            out.push_str(word);
            rest = &rest[word.len()..];
            let (group, after) = number_group(rest);
            out.push_str(&group);
            rest = after;
        } else if let Some((group, after)) = bracketed_range(rest) {
            out.push('(');
            out.push_str(&group);
            rest = after;
        } else {
            let c = rest.chars().next().unwrap_or(' ');
            out.push(c);
            rest = &rest[c.len_utf8()..];
        }
    }
    out
}

/// A `snake_case` key or name (an evidence item's, a rejection's, a singular configuration's)
/// in the arm's numbering: every token that is one joint number 1–6 becomes `7 − n`, and the
/// numbers of one group (tokens joined directly or by `and`) are put in ascending order again:
/// `axes_5_and_6_miss` → `axes_1_and_2_miss`, `angle_1_2` → `angle_5_6`. Keys and names are
/// `'static` (they are the families' own); each distinct renumbered one is made once and kept
/// for the program's life (there are as many as the families have keys and names).
pub fn renumber_name(name: &'static str) -> &'static str {
    static NAMES: OnceLock<Mutex<HashMap<&'static str, &'static str>>> = OnceLock::new();
    let renamed = renumber_tokens(name);
    if renamed == name {
        return name;
    }
    let names = NAMES.get_or_init(|| Mutex::new(HashMap::new()));
    let mut names = names.lock().unwrap_or_else(|e| e.into_inner());
    names
        .entry(name)
        .or_insert_with(|| Box::leak(renamed.into_boxed_str()))
}

/// [`renumber_name`] without the keeping.
fn renumber_tokens(name: &str) -> String {
    let mut tokens: Vec<String> = name.split('_').map(str::to_string).collect();
    let number = |t: &str| {
        (t.len() == 1)
            .then(|| t.parse::<u32>().ok())
            .flatten()
            .filter(|n| (1..=6).contains(n))
    };
    let mut i = 0;
    while i < tokens.len() {
        if number(&tokens[i]).is_none() {
            i += 1;
            continue;
        }
        // One group: numbers, joined directly or by `and`.
        let mut slots = vec![i];
        let mut j = i + 1;
        while j < tokens.len() {
            if number(&tokens[j]).is_some() {
                slots.push(j);
                j += 1;
            } else if tokens[j] == "and" && tokens.get(j + 1).is_some_and(|t| number(t).is_some()) {
                j += 1;
            } else {
                break;
            }
        }
        let mut mapped: Vec<u32> = slots
            .iter()
            .filter_map(|&k| number(&tokens[k]).map(|n| 7 - n))
            .collect();
        mapped.sort_unstable();
        for (&k, n) in slots.iter().zip(mapped) {
            tokens[k] = n.to_string();
        }
        i = j;
    }
    tokens.join("_")
}

/// A range of joints alone in brackets at the start of `s` (`(2–3)`, as in `angles 0° (2–3)
/// and 0° (3–4)`) renumbered, and the rest of `s` from the closing bracket; `None` for
/// anything else in brackets (a point's coordinates, say).
fn bracketed_range(s: &str) -> Option<(String, &str)> {
    let inner = s.strip_prefix('(')?;
    let (group, after) = number_group(inner);
    let consumed = &inner[..inner.len() - after.len()];
    let range = consumed.contains('–') && !consumed.contains(',') && !consumed.contains(' ');
    (range && after.starts_with(')')).then_some((group, after))
}

/// The joint number (1–6, one digit not followed by another digit or a decimal point) at the
/// start of `s`.
fn joint_number(s: &str) -> Option<u32> {
    let mut chars = s.chars();
    let d = chars.next()?.to_digit(10).filter(|d| (1..=6).contains(d))?;
    let next = chars.next();
    if next.is_some_and(|c| c.is_ascii_digit() || c == '.') {
        return None;
    }
    Some(d)
}

/// A group of joint numbers at the start of `s` renumbered (see [`renumber_text`]), and the
/// rest of `s`.
fn number_group(s: &str) -> (String, &str) {
    const SEPARATORS: [&str; 4] = [", ", " and ", "–", "-"];
    let mut numbers = Vec::new();
    let mut separators = Vec::new();
    let mut rest = s;
    let Some(first) = joint_number(rest) else {
        return (String::new(), s);
    };
    numbers.push(7 - first);
    rest = &rest[1..];
    loop {
        let next = SEPARATORS.iter().find_map(|sep| {
            let after = rest.strip_prefix(*sep)?;
            joint_number(after).map(|n| (*sep, n, &after[1..]))
        });
        let Some((sep, n, after)) = next else {
            break;
        };
        separators.push(sep);
        numbers.push(7 - n);
        rest = after;
    }
    numbers.sort_unstable();
    let mut group = numbers[0].to_string();
    for (sep, n) in separators.iter().zip(&numbers[1..]) {
        group.push_str(sep);
        group.push_str(&n.to_string());
    }
    (group, rest)
}

#[cfg(test)]
mod tests {
    use super::{renumber_name, renumber_text};

    #[test]
    fn names_are_renumbered_once() {
        assert_eq!(renumber_name("axes_5_and_6_miss"), "axes_1_and_2_miss");
        assert_eq!(renumber_name("axis_6_parallel"), "axis_1_parallel");
        assert_eq!(renumber_name("shoulder"), "shoulder");
        assert_eq!(renumber_name("angle_1_2"), "angle_5_6");
        assert_eq!(renumber_name("angle_5_to_parallel"), "angle_2_to_parallel");
        assert_eq!(renumber_name("four_parallel_axes"), "four_parallel_axes");
        let a = renumber_name("axis_6_parallel");
        let b = renumber_name("axis_6_parallel");
        assert!(std::ptr::eq(a, b), "made once");
    }

    #[test]
    fn numbers_after_joint_and_axis_words_are_mirrored_and_sorted() {
        assert_eq!(
            renumber_text("axis 6 parallel to axes 2–4 at joint 5 = 30°"),
            "axis 1 parallel to axes 3–5 at joint 2 = 30°"
        );
        assert_eq!(
            renumber_text("the axes of joint 5 (\"j5\") and joint 6 pass 1.5 mm apart"),
            "the axes of joint 2 (\"j5\") and joint 1 pass 1.5 mm apart"
        );
        assert_eq!(
            renumber_text("axes 2, 3 and 4 parallel; joints 5 and 6; `θ5`, h6, 12 joints"),
            "axes 3, 4 and 5 parallel; joints 1 and 2; `θ5`, h6, 12 joints"
        );
        assert_eq!(renumber_text("axis 7 and joint 12"), "axis 7 and joint 12");
        assert_eq!(
            renumber_text("angles 0° (2–3) and 0° (3–4); (1, 2, 3) m; (2)"),
            "angles 0° (4–5) and 0° (3–4); (1, 2, 3) m; (2)"
        );
        assert_eq!(
            renumber_text("the two joint-1 solutions merge"),
            "the two joint-6 solutions merge"
        );
    }
}
