//! The inspection report: the model as a table and the classification (or rejection), in the
//! file's units. One value serves both the text (`armforge inspect`) and JSON (`--json`), so
//! the two cannot say different things; the review sheet can reuse it.

use std::fmt::Write as _;

use armforge_runtime::JointKind;
use serde::Serialize;
use serde_json::{json, Value};

use armforge_compiler::classify::evidence::{ReachOrigin, Singularity};
use armforge_compiler::classify::reject::{Quantity, Rejection};
use armforge_compiler::classify::{Geometry, SolutionCount};
use armforge_compiler::family::{Judged, Value as FamilyValue};
use armforge_compiler::model::Model;
use armforge_compiler::units::{snap, tidy, Units};

/// One joint of the model, in the file's units.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct JointRow {
    /// 1-based joint number.
    pub number: usize,
    /// The joint's name.
    pub name: String,
    /// `revolute` or `prismatic`.
    pub kind: &'static str,
    /// Unit axis direction, base frame at zero.
    pub axis: [f64; 3],
    /// A point on the axis (revolute joints), file length unit.
    pub point: Option<[f64; 3]>,
    /// Joint-value limits `[min, max]` in the file's units (`null` when unlimited).
    pub limits: [Option<f64>; 2],
}

/// One measured item: a key for scripts, a label and definition for people, the value in the
/// file's units, and how the text report shows it.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Item {
    /// Stable key.
    pub key: &'static str,
    /// What it is, in words (with its definition).
    pub label: String,
    /// The value in the file's units (number, boolean or vector).
    pub value: Value,
    /// The value as the text report writes it.
    pub shown: String,
}

/// The wrist center and reach, and what to expect of a solver.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Solvable {
    /// `elbow`, `polar`, `cylindrical` or `cartesian`.
    pub family: &'static str,
    /// The kinds of joints 1–3 (`R R R` …).
    pub pattern: &'static str,
    /// Evidence for the family.
    pub family_evidence: Vec<Item>,
    /// Evidence for the spherical wrist.
    pub wrist: Vec<Item>,
    /// The most solutions for one tool pose.
    pub solutions: SolutionCount,
    /// The reach of the wrist center, as a sentence and numbers.
    pub reach: Option<Item>,
    /// The singular configurations, in words.
    pub singularities: Vec<String>,
    /// How the arm decouples, one line (text report).
    #[serde(skip)]
    pub summary: &'static str,
    /// What the two factors of the solution count solve (text report).
    #[serde(skip)]
    pub solution_parts: [&'static str; 2],
}

/// Why the arm was rejected, located.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Rejected {
    /// The reason's short name.
    pub reason: &'static str,
    /// The full message (numbers in the file's units).
    pub message: String,
    /// `path:line:column` of the offending joint's table.
    pub path: String,
    /// 1-based line.
    pub line: usize,
    /// 1-based column.
    pub column: usize,
    /// The offending joint (1-based).
    pub joint: Option<usize>,
    /// The measured numbers, in the file's units.
    pub measured: Vec<Item>,
    /// Other families the arm belongs to.
    pub notes: Vec<String>,
    /// The offending line of the file, when the report was given the file's text.
    pub source_line: Option<String>,
}

/// The outcome of classification.
#[derive(Clone, Debug, PartialEq, Serialize)]
#[serde(tag = "status", rename_all = "snake_case")]
pub enum Outcome {
    /// Decoupled closed form: the family and its evidence.
    Solvable(Solvable),
    /// No decoupled closed form armforge builds.
    Rejected(Rejected),
}

/// Everything `armforge inspect` reports.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct Report {
    /// The arm's name.
    pub arm: String,
    /// The description file.
    pub path: String,
    /// The file's free text.
    pub description: Option<String>,
    /// The file's length unit symbol.
    pub length_unit: &'static str,
    /// The file's angle unit symbol.
    pub angle_unit: &'static str,
    /// The model as a table.
    pub joints: Vec<JointRow>,
    /// The tool point at zero, base frame, file length unit.
    pub tool_point: [f64; 3],
    /// The tolerances used.
    pub tolerances: Vec<Item>,
    /// The classification.
    pub outcome: Outcome,
    /// The file's units (for the text).
    #[serde(skip)]
    pub units: Units,
}

fn len3(u: &Units, v: &[f64; 3]) -> [f64; 3] {
    [
        u.length_from_si(v[0]),
        u.length_from_si(v[1]),
        u.length_from_si(v[2]),
    ]
}

fn show_vec(v: &[f64; 3]) -> String {
    format!("({}, {}, {})", tidy(v[0]), tidy(v[1]), tidy(v[2]))
}

fn length_item(u: &Units, key: &'static str, label: &str, metres: f64) -> Item {
    let value = u.length_from_si(metres);
    Item {
        key,
        label: label.to_string(),
        value: number(value),
        shown: if metres.is_finite() {
            u.show_length(metres)
        } else {
            "unlimited".to_string()
        },
    }
}

fn angle_item(u: &Units, key: &'static str, label: &str, radians: f64) -> Item {
    Item {
        key,
        label: label.to_string(),
        value: number(u.angle_from_si(radians)),
        shown: u.show_angle(radians),
    }
}

fn point_item(u: &Units, key: &'static str, label: &str, metres: &[f64; 3]) -> Item {
    let v = len3(u, metres);
    Item {
        key,
        label: label.to_string(),
        value: json!(v.map(clean)),
        shown: format!("{} {}", show_vec(&v), u.length.symbol()),
    }
}

fn direction_item(key: &'static str, label: &str, d: &[f64; 3]) -> Item {
    Item {
        key,
        label: label.to_string(),
        value: json!(d.map(clean)),
        shown: show_vec(d),
    }
}

fn flag_item(key: &'static str, label: &str, yes: bool) -> Item {
    Item {
        key,
        label: label.to_string(),
        value: Value::Bool(yes),
        shown: if yes { "yes" } else { "no" }.to_string(),
    }
}

/// A number for JSON at full precision without rounding noise ([`clean`]); `null` when
/// infinite.
fn number(x: f64) -> Value {
    if x.is_finite() {
        json!(clean(x))
    } else {
        Value::Null
    }
}

/// `x` (in the file's units) at full precision with its rounding noise taken out
/// ([`snap`]: zero within 64 ulps of 1000 units, `0.85` for `0.8500000000000001`).
fn clean(x: f64) -> f64 {
    snap(x, 1e3)
}

fn joint_rows(model: &Model) -> Vec<JointRow> {
    let u = &model.units;
    model
        .joints
        .iter()
        .enumerate()
        .map(|(i, j)| {
            let limit = |x: f64| {
                x.is_finite()
                    .then(|| clean(u.joint_from_si(j.joint.kind, x)))
            };
            JointRow {
                number: i + 1,
                name: j.name.clone(),
                kind: match j.joint.kind {
                    JointKind::Revolute => "revolute",
                    JointKind::Prismatic => "prismatic",
                },
                axis: j.joint.axis.map(clean),
                point: (j.joint.kind == JointKind::Revolute)
                    .then(|| len3(u, &j.joint.point).map(clean)),
                limits: [limit(j.joint.limits[0]), limit(j.joint.limits[1])],
            }
        })
        .collect()
}

/// Builds the report of `model` for a classification result.
pub fn build(
    model: &Model,
    tolerances: &armforge_compiler::classify::Tolerances,
    result: &Result<Geometry, Rejection>,
) -> Report {
    let u = &model.units;
    let size = armforge_compiler::classify::tolerances::arm_size(model);
    let tolerance_items = vec![
        length_item(
            u,
            "arm_size",
            "arm size (largest distance between the tool point and the feet of the \
             perpendiculars from it, back through every revolute axis; plus slide strokes)",
            size,
        ),
        {
            let mut item = length_item(
                u,
                "distance_tolerance",
                &format!(
                    "lines meet when they pass within (distance tolerance {:e} × arm size)",
                    tolerances.distance
                ),
                tolerances.distance * size,
            );
            // Three significant digits however small (six decimals would round it away).
            let value = u.length_from_si(tolerances.distance * size);
            item.value = json!(format!("{value:.2e}").parse::<f64>().unwrap_or(value));
            item.shown = format!("{value:.2e} {}", u.length.symbol());
            item
        },
        angle_item(
            u,
            "angle_tolerance",
            "lines are parallel or perpendicular within",
            tolerances.angle,
        ),
    ];
    Report {
        arm: model.name.clone(),
        path: model.source_path.clone(),
        description: model.description.clone(),
        length_unit: u.length.symbol(),
        angle_unit: u.angle.symbol(),
        joints: joint_rows(model),
        tool_point: len3(u, &model.tool.translation).map(clean),
        tolerances: tolerance_items,
        outcome: match result {
            Ok(g) => Outcome::Solvable(solvable(model, g)),
            Err(r) => Outcome::Rejected(rejected(u, r)),
        },
        units: *u,
    }
}

fn rejected(u: &Units, r: &Rejection) -> Rejected {
    let measured = r
        .reason
        .measures()
        .into_iter()
        .map(|(key, q)| match q {
            Quantity::Length(m) => length_item(u, key, key, m),
            Quantity::Angle(a) => angle_item(u, key, key, a),
            Quantity::Count(n) => Item {
                key,
                label: key.to_string(),
                value: json!(n),
                shown: n.to_string(),
            },
        })
        .collect();
    Rejected {
        reason: r.reason.kind(),
        message: r.message.clone(),
        path: r.path.clone(),
        line: r.location.line,
        column: r.location.column,
        joint: r.joint,
        measured,
        notes: r.note_texts.clone(),
        source_line: None,
    }
}

/// The `inspect` items of the family's evidence, as its module lists them
/// ([`armforge_compiler::family::FamilyModule::evidence`]).
fn family_items(u: &Units, g: &Geometry) -> Vec<Item> {
    g.family
        .module()
        .evidence(&g.arm)
        .into_iter()
        .map(|j| judged_item(u, &j))
        .collect()
}

/// One family evidence item in the file's units.
fn judged_item(u: &Units, j: &Judged) -> Item {
    match j.value {
        FamilyValue::Flag(yes) => flag_item(j.key, j.label, yes),
        FamilyValue::Length(m) => length_item(u, j.key, j.label, m),
        FamilyValue::Angle(a) => angle_item(u, j.key, j.label, a),
        FamilyValue::Direction(d) => direction_item(j.key, j.label, &d),
        FamilyValue::Point(p) => point_item(u, j.key, j.label, &p),
        FamilyValue::Number(x) => Item {
            key: j.key,
            label: j.label.to_string(),
            value: number(x),
            shown: tidy(x),
        },
    }
}

fn wrist_items(u: &Units, g: &Geometry) -> Vec<Item> {
    let Some(w) = &g.wrist else {
        return Vec::new();
    };
    vec![
        point_item(
            u,
            "wrist_center",
            "wrist center (base frame, every joint at zero)",
            &w.center,
        ),
        length_item(
            u,
            "miss",
            "largest distance of the wrist center from axes 4, 5, 6",
            w.miss,
        ),
        Item {
            key: "gaps",
            label: "common normals of axes 4–5, 5–6 and 4–6 (how far each pair passes apart)"
                .into(),
            value: json!(w.gaps.map(|g| clean(u.length_from_si(g)))),
            shown: w
                .gaps
                .iter()
                .map(|&g| u.show_length(g))
                .collect::<Vec<_>>()
                .join(", "),
        },
        angle_item(u, "angle_4_5", "angle between axes 4 and 5", w.angle_4_5),
        angle_item(u, "angle_5_6", "angle between axes 5 and 6", w.angle_5_6),
        Item {
            key: "axis_4_6_angle_range",
            label: "angle between the lines of axes 4 and 6 as joint 5 turns".into(),
            value: json!(w.axis_4_6_angle_range.map(|a| clean(u.angle_from_si(a)))),
            shown: format!(
                "{} to {}",
                u.show_angle(w.axis_4_6_angle_range[0]),
                u.show_angle(w.axis_4_6_angle_range[1])
            ),
        },
        flag_item(
            "reaches_every_orientation",
            "reaches every orientation",
            w.reaches_every_orientation,
        ),
    ]
}

/// A joint value for a model value, in the file's units, and whether the joint's limits let
/// the arm get there.
fn joint_value(model: &Model, index: usize, model_value: f64) -> (String, bool) {
    let Some(j) = model.joints.get(index) else {
        return (tidy(model_value), true);
    };
    let q = j.joint.joint_value(model_value);
    let [lo, hi] = j.joint.limits;
    let inside = |x: f64| x >= lo && x <= hi;
    match j.joint.kind {
        JointKind::Revolute => {
            // Wrapped into (−π, π]: a half turn reads as +180°.
            let turn = 2.0 * std::f64::consts::PI;
            let w = q.rem_euclid(turn);
            let wrapped = if w > std::f64::consts::PI {
                w - turn
            } else {
                w
            };
            let reachable = (-2..=2).any(|k| inside(wrapped + f64::from(k) * turn));
            (model.units.show_angle(wrapped), reachable)
        }
        JointKind::Prismatic => (model.units.show_length(q), inside(q)),
    }
}

/// Joint values for model values, those the limits rule out said apart:
/// `0°`, `0° (180° is outside the joint's limits)`, `180° (outside the joint's limits)`.
fn joint_values(model: &Model, index: usize, model_values: &[f64]) -> String {
    let (inside, outside): (Vec<_>, Vec<_>) = model_values
        .iter()
        .map(|&m| joint_value(model, index, m))
        .partition(|(_, reachable)| *reachable);
    let words = |v: &[(String, bool)]| {
        v.iter()
            .map(|(s, _)| s.as_str())
            .collect::<Vec<_>>()
            .join(" and ")
    };
    match (inside.is_empty(), outside.is_empty()) {
        (_, true) => words(&inside),
        (true, false) => format!("{} (outside the joint's limits)", words(&outside)),
        (false, false) => format!(
            "{} ({} {} outside the joint's limits)",
            words(&inside),
            words(&outside),
            if outside.len() == 1 { "is" } else { "are" }
        ),
    }
}

fn singularity_text(model: &Model, s: &Singularity) -> String {
    let u = &model.units;
    match s {
        Singularity::WristAligned { joint_5_at } => format!(
            "wrist aligned: axes 4 and 6 in one line, joints 4 and 6 turn together, at joint 5 \
             = {}",
            joint_values(model, 4, joint_5_at)
        ),
        Singularity::WristNeverAligned => {
            "wrist never aligned: axes 4 and 6 cannot line up (the wrist's twists differ)".into()
        }
        Singularity::Shoulder {
            perpendicular: true,
            offset,
            ..
        } => format!(
            "wrist center {} from axis 1: the two joint-1 solutions merge; the wrist center \
             cannot come nearer axis 1",
            u.show_length(*offset)
        ),
        Singularity::Shoulder { free_point, .. } => format!(
            "wrist center at {} on axis 1: joint 1 is free; around it the two joint-1 solutions \
             merge on a cone about axis 1 (axes 1 and 2 are not perpendicular)",
            free_point
                .map(|p| format!("{} {}", show_vec(&len3(u, &p)), u.length.symbol()))
                .unwrap_or_else(|| "a point".into())
        ),
        Singularity::WristCenterOnAxis1 { reachable } => format!(
            "wrist center on axis 1: joint 1 is free (shoulder singularity{})",
            match reachable {
                Some(true) => "; the slides can take it there",
                Some(false) => "; outside the slides' limits",
                None => "",
            }
        ),
        Singularity::Stretched { joint_3_at } => format!(
            "arm stretched (wrist center farthest from axis 2) at joint 3 = {}: the two elbow \
             solutions merge",
            joint_values(model, 2, &[*joint_3_at])
        ),
        Singularity::Folded { joint_3_at } => format!(
            "arm folded (wrist center nearest axis 2) at joint 3 = {}: the two elbow solutions \
             merge",
            joint_values(model, 2, &[*joint_3_at])
        ),
        Singularity::SlideClosestToAxis2 { joint_3_at } => format!(
            "slide where the wrist center passes nearest axis 2, joint 3 = {}: the two slide \
             solutions merge",
            joint_values(model, 2, &[*joint_3_at])
        ),
        Singularity::Described { text, .. } => text.clone(),
    }
}

fn reach_item(u: &Units, g: &Geometry) -> Option<Item> {
    let r = g.reach?;
    let from = match r.from {
        ReachOrigin::ShoulderPoint => "from the shoulder point",
        ReachOrigin::Axis1 => "from axis 1",
    };
    let max = if r.max.is_finite() {
        u.show_length(r.max)
    } else {
        "unlimited".to_string()
    };
    Some(Item {
        key: "reach",
        label: format!(
            "distance of the {} {from} (revolute limits ignored, slide limits kept)",
            g.family.module().placed_point()
        ),
        value: json!({ "min": number(u.length_from_si(r.min)), "max": number(u.length_from_si(r.max)) }),
        shown: format!("{} to {}", u.show_length(r.min), max),
    })
}

fn solvable(model: &Model, g: &Geometry) -> Solvable {
    let u = &model.units;
    Solvable {
        family: g.family.name(),
        pattern: g.family.pattern(),
        family_evidence: family_items(u, g),
        wrist: wrist_items(u, g),
        solutions: g.solutions,
        reach: reach_item(u, g),
        singularities: g
            .singularities
            .iter()
            .map(|s| singularity_text(model, s))
            .collect(),
        summary: g.family.module().summary(),
        solution_parts: g.family.module().solution_parts(),
    }
}

fn table(rows: &[Vec<String>]) -> String {
    let columns = rows.first().map_or(0, Vec::len);
    let widths: Vec<usize> = (0..columns)
        .map(|c| rows.iter().map(|r| r[c].chars().count()).max().unwrap_or(0))
        .collect();
    let mut out = String::new();
    for row in rows {
        let mut line = String::new();
        for (c, cell) in row.iter().enumerate() {
            let pad = widths[c] - cell.chars().count();
            line.push_str(cell);
            if c + 1 < columns {
                line.push_str(&" ".repeat(pad + 2));
            }
        }
        out.push_str(line.trim_end());
        out.push('\n');
    }
    out
}

fn limits_text(u: &Units, row: &JointRow) -> String {
    let unit = if row.kind == "revolute" {
        u.angle.display_symbol()
    } else {
        u.length.symbol()
    };
    let sep = if row.kind == "revolute" { "" } else { " " };
    let end = |x: Option<f64>, inf: &str| {
        x.map_or(inf.to_string(), |v| format!("{}{sep}{unit}", tidy(v)))
    };
    format!("{} … {}", end(row.limits[0], "−∞"), end(row.limits[1], "∞"))
}

fn items_text(out: &mut String, items: &[Item]) {
    for item in items {
        let _ = writeln!(out, "  {}: {}", item.label, item.shown);
    }
}

impl Report {
    /// Adds the offending line of `source` (the description file's text) to a rejection, so
    /// the text report can show it under the message.
    pub fn with_source(mut self, source: &str) -> Self {
        if let Outcome::Rejected(r) = &mut self.outcome {
            r.source_line = r
                .line
                .checked_sub(1)
                .and_then(|i| source.lines().nth(i))
                .map(|l| l.trim_end().to_string());
        }
        self
    }

    /// The report as text for people.
    pub fn to_text(&self) -> String {
        let mut out = String::new();
        let _ = writeln!(out, "arm: {} ({})", self.arm, self.path);
        if let Some(d) = &self.description {
            for line in d.lines() {
                let _ = writeln!(out, "  {}", line.trim_end());
            }
        }
        let _ = writeln!(out, "units: {}, {}\n", self.length_unit, self.angle_unit);
        let mut rows = vec![["joint", "name", "type", "axis", "point", "limits"]
            .map(String::from)
            .to_vec()];
        for j in &self.joints {
            rows.push(vec![
                j.number.to_string(),
                j.name.clone(),
                j.kind.to_string(),
                show_vec(&j.axis),
                j.point.map_or("—".to_string(), |p| {
                    format!("{} {}", show_vec(&p), self.length_unit)
                }),
                limits_text(&self.units, j),
            ]);
        }
        out.push_str(&table(&rows));
        let _ = writeln!(
            out,
            "tool point at zero: {} {}\n",
            show_vec(&self.tool_point),
            self.length_unit
        );
        let _ = writeln!(out, "tolerances:");
        items_text(&mut out, &self.tolerances);
        out.push('\n');
        match &self.outcome {
            Outcome::Solvable(s) => solvable_text(&mut out, s),
            Outcome::Rejected(r) => rejected_text(&mut out, r),
        }
        out
    }
}

fn solvable_text(out: &mut String, s: &Solvable) {
    let _ = writeln!(out, "family: {} ({})", s.family, s.pattern);
    items_text(out, &s.family_evidence);
    let _ = writeln!(out, "\n{}", s.summary);
    items_text(out, &s.wrist);
    let _ = writeln!(
        out,
        "\nsolutions to expect: up to {} ({} for {} × {} for {}; revolute values counted once \
         per turn)",
        s.solutions.total,
        s.solutions.position,
        s.solution_parts[0],
        s.solutions.wrist,
        s.solution_parts[1]
    );
    if let Some(r) = &s.reach {
        let _ = writeln!(out, "reach: {}: {}", r.label, r.shown);
    } else if s.pattern == "P P P" {
        let _ = writeln!(
            out,
            "reach: the box the three slides span (their limits in the table)"
        );
    } else {
        let _ = writeln!(
            out,
            "reach: no simple closed form; the solver reports how far a target misses"
        );
    }
    let _ = writeln!(out, "singular configurations:");
    for line in &s.singularities {
        let _ = writeln!(out, "  - {line}");
    }
}

fn rejected_text(out: &mut String, r: &Rejected) {
    let _ = writeln!(
        out,
        "no decoupled closed form: {}:{}:{}: {}",
        r.path, r.line, r.column, r.message
    );
    if let Some(source) = &r.source_line {
        source_excerpt(out, r.line, r.column, source);
    }
    for note in &r.notes {
        let _ = writeln!(out, "  note: {note}");
    }
}

/// The offending line of the file with a caret under the column, as `inspect` shows it.
fn source_excerpt(out: &mut String, line: usize, column: usize, source: &str) {
    let gutter = line.to_string().len();
    let _ = writeln!(out, "{:gutter$} |", "");
    let _ = writeln!(out, "{line} | {source}");
    let _ = writeln!(out, "{:gutter$} | {:>col$}", "", "^", col = column.max(1));
}

/// A rejection as every command prints it: the located message, the offending line of the
/// file's `text` with a caret (as in `inspect`'s report), then the notes.
pub fn rejection_text(rejection: &Rejection, text: &str) -> String {
    let mut out = format!(
        "error: {}:{}:{}: {}\n",
        rejection.path, rejection.location.line, rejection.location.column, rejection.message
    );
    let line = rejection.location.line.checked_sub(1);
    if let Some(source) = line.and_then(|i| text.lines().nth(i)) {
        source_excerpt(
            &mut out,
            rejection.location.line,
            rejection.location.column,
            source.trim_end(),
        );
    }
    for note in &rejection.note_texts {
        let _ = writeln!(out, "  note: {note}");
    }
    out.trim_end().to_string()
}
