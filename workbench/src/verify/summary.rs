//! The verification's findings: per kind of sample, recovery, errors (max and 99.9th
//! percentile), solutions per pose, singular and unreachable counts, and the failing samples
//! named; as a plain-text table or JSON.

use std::collections::BTreeMap;
use std::fmt::Write as _;

use serde::Serialize;

use super::check::{within, Outcome, Status, Thresholds};
use super::sampler::Kind;
use armforge_compiler::model::Model;
use armforge_runtime::compact::Compact;

/// At most this many failing samples are listed (all are counted).
pub const LISTED_FAILURES: usize = 20;

/// The findings for one kind of sample.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct KindSummary {
    /// The kind.
    pub kind: Kind,
    /// Its name in the table.
    pub name: &'static str,
    /// Samples asked for.
    pub asked: u64,
    /// Samples tried (some kinds cannot always be placed; an arm may have none of a kind).
    pub tried: u64,
    /// Samples whose original configuration was among the solutions.
    pub recovered: u64,
    /// Samples for which the solver found no solution.
    pub unreachable: u64,
    /// Samples with a solution flagged singular.
    pub singular: u64,
    /// Samples judged near a singular configuration or a reach boundary by their geometry
    /// (whichever sampler made them), held to the looser pose limit and to joint allowances
    /// scaled by the conditioning.
    pub judged_singular: u64,
    /// Samples recovered only by `solve_near` from the original configuration (singular
    /// poses: the free joint held at the reference).
    pub recovered_near: u64,
    /// Samples that fail a threshold.
    pub failed: u64,
    /// Largest position error (fraction of the arm's size).
    pub max_position_error: f64,
    /// 99.9th percentile of the position errors.
    pub p999_position_error: f64,
    /// Largest rotation error (Frobenius norm).
    pub max_rotation_error: f64,
    /// 99.9th percentile of the rotation errors.
    pub p999_rotation_error: f64,
    /// The largest pose-error limit applied to a sample of this kind.
    pub pose_threshold: f64,
    /// The joint threshold for recovery away from singular configurations (scaled by the
    /// conditioning near them).
    pub joint_threshold: f64,
    /// Number of poses by number of solutions.
    pub solutions_per_pose: BTreeMap<usize, u64>,
    /// Number of poses by number of solutions distinct modulo whole turns.
    pub distinct_per_pose: BTreeMap<usize, u64>,
}

/// A failing sample, named.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Failure {
    /// The sample's index (with the seed, it reproduces the sample).
    pub index: u64,
    /// Its kind.
    pub kind: Kind,
    /// The joint values in the file's units.
    pub joints: Vec<f64>,
    /// How far it was placed from the singular configuration, boundary or limit (radians,
    /// or fraction of the arm's size; zero for uniform samples).
    pub offset: f64,
    /// What went wrong.
    pub problem: String,
}

/// Everything a verification found.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Summary {
    /// The arm's name.
    pub arm: String,
    /// The description file.
    pub path: String,
    /// The seed.
    pub seed: u64,
    /// Uniform samples asked for.
    pub samples: u64,
    /// The arm's size, metres (position errors are fractions of it); `arm_size_m` in JSON.
    #[serde(rename = "arm_size_m")]
    pub arm_size: f64,
    /// The thresholds.
    pub thresholds: Thresholds,
    /// Per kind of sample.
    pub kinds: Vec<KindSummary>,
    /// Number of poses by number of solutions, over every sample.
    pub solutions_per_pose: BTreeMap<usize, u64>,
    /// Number of poses by number of solutions distinct modulo whole turns, over every sample.
    pub distinct_per_pose: BTreeMap<usize, u64>,
    /// Samples that fail, in all.
    pub failed: u64,
    /// The first failing samples by index.
    pub failures: Vec<Failure>,
    /// True when no sample fails.
    pub passed: bool,
    /// Wall time of the round trips, seconds (not part of the findings: it varies).
    pub seconds: f64,
    /// Threads used.
    pub threads: usize,
}

/// The 99.9th percentile (nearest rank) of `values`, reordering them.
fn p999(values: &mut [f64]) -> f64 {
    if values.is_empty() {
        return 0.0;
    }
    let rank = ((values.len() as f64) * 0.999).ceil() as usize;
    let i = rank.clamp(1, values.len()) - 1;
    let (_, v, _) = values.select_nth_unstable_by(i, f64::total_cmp);
    *v
}

fn max(values: &[f64]) -> f64 {
    values.iter().copied().fold(0.0, f64::max)
}

/// Summarises one kind.
pub fn kind_summary(
    kind: Kind,
    asked: u64,
    outcomes: &[&Outcome],
    thresholds: &Thresholds,
) -> KindSummary {
    let mut positions: Vec<f64> = outcomes.iter().map(|o| o.position_error).collect();
    let mut rotations: Vec<f64> = outcomes.iter().map(|o| o.rotation_error).collect();
    let mut histogram = BTreeMap::new();
    let mut distinct = BTreeMap::new();
    for o in outcomes {
        *histogram.entry(o.solutions).or_insert(0) += 1;
        *distinct.entry(o.distinct).or_insert(0) += 1;
    }
    let count = |f: &dyn Fn(&Outcome) -> bool| outcomes.iter().filter(|o| f(o)).count() as u64;
    KindSummary {
        kind,
        name: kind.name(),
        asked,
        tried: outcomes.len() as u64,
        recovered: count(&|o| o.status == Status::Recovered),
        unreachable: count(&|o| o.unreachable),
        singular: count(&|o| o.singular),
        judged_singular: count(&|o| o.judged_singular),
        recovered_near: count(&|o| o.recovered_near),
        failed: count(&|o| o.fails()),
        max_position_error: max(&positions),
        p999_position_error: p999(&mut positions),
        max_rotation_error: max(&rotations),
        p999_rotation_error: p999(&mut rotations),
        pose_threshold: outcomes
            .iter()
            .map(|o| o.pose_limit)
            .fold(thresholds.pose, f64::max),
        joint_threshold: thresholds.joint,
        solutions_per_pose: histogram,
        distinct_per_pose: distinct,
    }
}

/// What went wrong with a failing outcome, in words.
pub fn problem_text(model: &Model, o: &Outcome) -> String {
    let mut parts = Vec::new();
    match o.status {
        Status::Recovered => {}
        Status::NotRecovered { joint, by, allowed } => parts.push(format!(
            "the original configuration is not among the {} solutions (the nearest differs in \
             joint {} by {}, allowed {})",
            o.solutions,
            joint + 1,
            joint_difference(model, joint, by),
            joint_difference(model, joint, allowed),
        )),
        Status::Unreachable(reason) => parts.push(format!(
            "no solution for a pose that forward kinematics made: {reason}"
        )),
    }
    let limit = o.pose_limit;
    if !within(o.position_error, limit) {
        parts.push(format!(
            "a solution misses the position by {:.3e} of the arm's size (allowed {limit:e})",
            o.position_error
        ));
    }
    if !within(o.rotation_error, limit) {
        parts.push(format!(
            "a solution misses the rotation by {:.3e} (Frobenius norm; allowed {limit:e})",
            o.rotation_error
        ));
    }
    parts.join("; ")
}

/// A joint difference as judged (radians, or a fraction of the arm's size for a slide) in the
/// file's units: `0.000057°`, `2.5e-7 rad`, `3e-9 of the arm's size`.
fn joint_difference(model: &Model, joint: usize, value: f64) -> String {
    let prismatic = model
        .joints
        .get(joint)
        .is_some_and(|j| j.joint.kind == armforge_runtime::JointKind::Prismatic);
    if prismatic {
        format!("{} of the arm's size", Compact(value))
    } else {
        format!(
            "{}{}",
            Compact(model.units.angle_from_si(value)),
            model.units.angle.display_symbol()
        )
    }
}

/// A failing outcome, named, with its joints in the file's units.
pub fn failure(model: &Model, o: &Outcome) -> Failure {
    let joints = o
        .failing
        .as_deref()
        .map(|s| {
            model
                .joint_values_from_si(&s.joints)
                .into_iter()
                .map(tidy_full)
                .collect()
        })
        .unwrap_or_default();
    Failure {
        index: o.index,
        kind: o.kind,
        joints,
        offset: o.failing.as_deref().map_or(0.0, |s| s.offset),
        problem: problem_text(model, o),
    }
}

/// A joint value rounded to 12 significant digits (enough to reproduce the sample's pose to
/// well below every threshold, short enough to read).
fn tidy_full(x: f64) -> f64 {
    format!("{x:.12e}").parse().unwrap_or(x)
}

fn e(x: f64) -> String {
    if x == 0.0 {
        "0".to_string()
    } else {
        format!("{x:.1e}")
    }
}

fn histogram_text(h: &BTreeMap<usize, u64>) -> String {
    h.iter()
        .map(|(n, c)| format!("{n}: {c}"))
        .collect::<Vec<_>>()
        .join(", ")
}

impl Summary {
    /// The findings as a plain-text table.
    pub fn to_text(&self, model: &Model) -> String {
        let mut out = String::new();
        let joint_threshold = format!(
            "{}{}",
            Compact(model.units.angle_from_si(self.thresholds.joint)),
            model.units.angle.display_symbol()
        );
        let _ = writeln!(
            out,
            "verify {} ({}): seed {}, {} samples within limits plus samples near singular \
             configurations and reach boundaries; {} threads, {:.2} s",
            self.arm, self.path, self.seed, self.samples, self.threads, self.seconds
        );
        let _ = writeln!(
            out,
            "position error: fraction of the arm's size ({}); rotation error: Frobenius norm of \
             R_solution − R_target; joints recovered within {} (slides: {} of the arm's size);\n\
             unreachable: `solve` found nothing (always a failure); near: recovered only by \
             `solve_near` from the original configuration (a singular pose's free joint held at \
             the reference);\njudged singular: near a singular configuration or reach \
             boundary by the sample's geometry, whichever sampler made it; there joint \
             allowances scale with the conditioning ({} / ρ for joint 1 with the wrist center \
             ρ from axis 1 as a fraction of the arm's size, divided again by joint 5's distance \
             from an aligned position in radians for joints 4 and 6) and a joint whose \
             allowance reaches half a turn is free\n",
            model.units.show_length(self.arm_size),
            joint_threshold,
            Compact(self.thresholds.joint),
            joint_threshold,
        );
        let header = [
            "samples",
            "tried",
            "recovered",
            "singular",
            "judged singular",
            "unreachable",
            "near",
            "failed",
            "position max",
            "position 99.9%",
            "rotation max",
            "rotation 99.9%",
            "pose limit",
        ];
        let mut rows = vec![header.iter().map(|s| s.to_string()).collect::<Vec<_>>()];
        for k in &self.kinds {
            if k.tried == 0 {
                rows.push(vec![
                    k.name.to_string(),
                    "0".into(),
                    format!("none: {}", none_reason(k)),
                ]);
                continue;
            }
            rows.push(vec![
                k.name.to_string(),
                k.tried.to_string(),
                k.recovered.to_string(),
                k.singular.to_string(),
                k.judged_singular.to_string(),
                k.unreachable.to_string(),
                k.recovered_near.to_string(),
                k.failed.to_string(),
                e(k.max_position_error),
                e(k.p999_position_error),
                e(k.max_rotation_error),
                e(k.p999_rotation_error),
                format!("{:e}", k.pose_threshold),
            ]);
        }
        out.push_str(&table(&rows));
        let _ = writeln!(
            out,
            "\nsolutions per pose, distinct modulo whole turns (solutions: poses): {}",
            histogram_text(&self.distinct_per_pose)
        );
        for k in self.kinds.iter().filter(|k| k.tried > 0) {
            let _ = writeln!(
                out,
                "  {}: {}",
                k.name,
                histogram_text(&k.distinct_per_pose)
            );
        }
        let _ = writeln!(
            out,
            "solutions per pose (one per branch, equivalent angles not counted): {}",
            histogram_text(&self.solutions_per_pose)
        );
        if !self.failures.is_empty() {
            let _ = writeln!(
                out,
                "\nfailing samples ({} in all; the first {} by index; joints in {}, {}):",
                self.failed,
                self.failures.len(),
                model.units.angle.symbol(),
                model.units.length.symbol()
            );
            for f in &self.failures {
                let joints: Vec<String> = f.joints.iter().map(|x| format!("{x}")).collect();
                let placed = if f.offset > 0.0 {
                    format!(", placed {:.2e} from it", f.offset)
                } else {
                    String::new()
                };
                let _ = writeln!(
                    out,
                    "  sample {} ({}{placed}): joints [{}]: {}",
                    f.index,
                    f.kind_name(),
                    joints.join(", "),
                    f.problem
                );
            }
        }
        let _ = writeln!(
            out,
            "\n{}",
            if self.passed {
                "passed: every configuration recovered, every error within its limit".to_string()
            } else {
                format!(
                    "FAILED: {} samples not recovered or beyond a limit",
                    self.failed
                )
            }
        );
        out
    }
}

impl Failure {
    /// The name of the sample's kind.
    pub fn kind_name(&self) -> &'static str {
        self.kind.name()
    }
}

fn none_reason(k: &KindSummary) -> &'static str {
    match k.kind {
        Kind::WristNearAligned => "joint 5's limits keep the wrist from aligning",
        Kind::NearAxis1 => "the wrist center cannot reach axis 1 within the joint limits",
        Kind::ReachBoundary => "no reach boundary where solutions merge within the joint limits",
        Kind::AtLimit => "no finite joint limits",
        Kind::WithinLimits => "no samples asked for",
    }
}

fn table(rows: &[Vec<String>]) -> String {
    let columns = rows.iter().map(Vec::len).max().unwrap_or(0);
    let mut widths = vec![0; columns];
    for row in rows {
        // A short row's last cell runs on across the remaining columns: it sets no width.
        let fixed = if row.len() < columns {
            row.len().saturating_sub(1)
        } else {
            row.len()
        };
        for (w, cell) in widths.iter_mut().zip(&row[..fixed]) {
            *w = (*w).max(cell.chars().count());
        }
    }
    let mut out = String::new();
    for row in rows {
        let mut line = String::new();
        for (c, cell) in row.iter().enumerate() {
            line.push_str(cell);
            if c + 1 < row.len() {
                let pad = widths[c].saturating_sub(cell.chars().count());
                line.push_str(&" ".repeat(pad + 2));
            }
        }
        out.push_str(line.trim_end());
        out.push('\n');
    }
    out
}

#[cfg(test)]
mod table_tests {
    use super::table;

    #[test]
    fn a_row_that_says_none_keeps_the_columns_aligned() {
        let row = |cells: &[&str]| cells.iter().map(|c| c.to_string()).collect::<Vec<_>>();
        let text = table(&[
            row(&["samples", "tried", "recovered"]),
            row(&["within limits", "200", "200"]),
            row(&["wrist center near axis 1", "0", "none: it cannot get there"]),
        ]);
        let lines: Vec<&str> = text.lines().collect();
        let column_of = |line: &str, cell: &str| line.find(cell).expect("cell");
        assert_eq!(column_of(lines[0], "tried"), column_of(lines[1], "200"));
        assert_eq!(column_of(lines[0], "tried"), column_of(lines[2], "0"));
        assert_eq!(
            column_of(lines[0], "recovered"),
            column_of(lines[2], "none")
        );
    }
}
