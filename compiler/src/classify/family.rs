//! What the families share in recognition: the rejection when none recognises an arm, and
//! the check of axes 1 and 2 the elbow and polar families both need.

use armforge_runtime::JointKind;

use super::context::Context;
use super::decoupled::kinds_of;
use super::reject::{kind_letter, Note, Reason, Rejection};
use crate::family::REGISTRY;

/// The rejection of an arm no family recognises and none has a reason for: the wrist's, if it
/// is not spherical, otherwise the pattern of joints 1–3 that no family covers.
pub fn unrecognised(ctx: &Context) -> Rejection {
    if let Err(r) = super::wrist::analyse(ctx) {
        return r;
    }
    let kinds = [ctx.kind(1), ctx.kind(2), ctx.kind(3)];
    let pattern = kinds
        .iter()
        .map(|&k| kind_letter(k).to_string())
        .collect::<Vec<_>>()
        .join(" ");
    // The first joint at which the pattern leaves every decoupled family's pattern.
    let families: Vec<Vec<JointKind>> = REGISTRY
        .iter()
        .filter(|m| m.position_step().is_some())
        .map(|m| kinds_of(m.pattern()))
        .collect();
    let matching = |n: usize| families.iter().any(|f| f.get(..n) == Some(&kinds[..n]));
    let first_odd = (1..=3).find(|&n| !matching(n)).unwrap_or(3);
    ctx.reject(
        Reason::UnsupportedPattern { pattern },
        first_odd,
        Vec::new(),
    )
}

/// The families that solve joints 1–3 behind a spherical wrist, as "name (pattern)" in the
/// registry's order: "elbow (R R R), polar (R R P), … and general (R R R)".
pub fn decoupled_families() -> String {
    let named: Vec<String> = REGISTRY
        .iter()
        .filter(|m| m.position_step().is_some())
        .map(|m| format!("{} ({})", m.name(), m.pattern()))
        .collect();
    match named.split_last() {
        Some((last, [])) => last.clone(),
        Some((last, rest)) => format!("{} and {last}", rest.join(", ")),
        None => String::new(),
    }
}

/// Joint 1 must be able to turn the wrist center into the plane joints 2–3 keep it in.
pub fn check_axis_1_not_parallel_to_2(ctx: &Context) -> Result<(), Rejection> {
    if ctx.parallel(1, 2) {
        let notes = if ctx.three_parallel(1) {
            vec![Note::ThreeParallelAxes { first: 1 }]
        } else {
            Vec::new()
        };
        let angle = ctx.angle(1, 2);
        return Err(ctx.reject(Reason::Axes1And2Parallel { angle }, 2, notes));
    }
    Ok(())
}
