//! The keys of the description format and their types: a TOML document read into a
//! [`Description`] (what the user wrote, in the file's units, with spans).
//!
//! Problems of single values (unknown keys, wrong types, non-finite numbers, unknown words)
//! are reported here; problems across values are checked in [`super::checks`].

use std::ops::Range;

use armforge_runtime::JointKind;
use toml_edit::{Item, TableLike};

use super::reader::{self, Entry, Quantity, Spanned};
use super::source::Source;
use crate::text::is_non_printing;
use crate::units::{tidy, AngleUnit, LengthUnit, Units};

/// The keys allowed at the top level of a file.
pub(crate) const TOP_KEYS: &[&str] = &[
    "name",
    "description",
    "length_unit",
    "angle_unit",
    "convention",
    "joint",
    "tool",
    "base",
];
/// Joint keys in every convention.
pub(crate) const JOINT_KEYS: &[&str] = &["type", "name", "direction", "limits"];
/// Joint keys of the `dh` and `modified-dh` conventions.
pub(crate) const DH_KEYS: &[&str] = &["a", "alpha", "d", "theta"];
/// Joint keys of the `axes` convention.
pub(crate) const AXES_KEYS: &[&str] = &["axis", "point", "offset"];
/// Keys of `[tool]` and `[base]`.
pub(crate) const FRAME_KEYS: &[&str] = &["translation", "rpy", "rotation"];

/// How the joints of a file are described.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Convention {
    /// Standard Denavit–Hartenberg parameters.
    Dh,
    /// Modified (proximal) Denavit–Hartenberg parameters.
    ModifiedDh,
    /// Joint axes and points in the base frame at zero.
    Axes,
}

impl Convention {
    /// Every convention, in the order the format reference lists them.
    pub const ALL: [Convention; 3] = [Convention::Dh, Convention::ModifiedDh, Convention::Axes];

    /// The convention a file's `convention` word names, if any.
    pub fn from_word(word: &str) -> Option<Convention> {
        Convention::ALL.into_iter().find(|c| c.word() == word)
    }

    /// The word used in files.
    pub fn word(self) -> &'static str {
        match self {
            Convention::Dh => "dh",
            Convention::ModifiedDh => "modified-dh",
            Convention::Axes => "axes",
        }
    }

    /// The joint keys that belong to this convention only.
    pub(crate) fn own_keys(self) -> &'static [&'static str] {
        match self {
            Convention::Dh | Convention::ModifiedDh => DH_KEYS,
            Convention::Axes => AXES_KEYS,
        }
    }
}

/// A whole description file, in the file's units.
#[derive(Debug)]
pub(crate) struct Description {
    /// The arm's name.
    pub name: String,
    /// Free text.
    pub description: Option<String>,
    /// The file's units.
    pub units: Units,
    /// The convention, if it was given and known.
    pub convention: Option<Convention>,
    /// Where the `joint` key (or the file) starts.
    pub joints_span: Range<usize>,
    /// The joints, base to tool (empty when `joint` is not an array of tables).
    pub joints: Vec<JointEntry>,
    /// True when `joint` was given but is not an array of tables (already reported).
    pub joints_malformed: bool,
    /// `[tool]`, if present.
    pub tool: Option<FrameEntry>,
    /// `[base]`, if present.
    pub base: Option<FrameEntry>,
}

/// One `[[joint]]` table, in the file's units.
#[derive(Debug, Default)]
pub(crate) struct JointEntry {
    /// Where the table starts (its header).
    pub span: Range<usize>,
    /// `type`, if given and known.
    pub kind: Option<JointKind>,
    /// `name`, checked to be non-empty and printable.
    pub name: Option<Spanned<String>>,
    /// `direction`: 1 or -1.
    pub direction: f64,
    /// `limits = [min, max]`.
    pub limits: Option<Spanned<[f64; 2]>>,
    /// DH parameters `a`, `alpha`, `d`, `theta`.
    pub dh: DhParameters,
    /// `axis`.
    pub axis: Option<Spanned<[f64; 3]>>,
    /// `point`.
    pub point: Option<Spanned<[f64; 3]>>,
    /// `offset`.
    pub offset: f64,
    /// Every key written in the table, with its span (for the convention checks).
    pub keys: Vec<(String, Range<usize>)>,
}

/// Denavit–Hartenberg parameters of one joint, in the file's units.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
pub(crate) struct DhParameters {
    /// Link length.
    pub a: f64,
    /// Link twist.
    pub alpha: f64,
    /// Link offset.
    pub d: f64,
    /// Joint angle.
    pub theta: f64,
}

/// A `[tool]` or `[base]` table, in the file's units.
#[derive(Debug, Default)]
pub(crate) struct FrameEntry {
    /// `tool` or `base`.
    pub path: String,
    /// `translation`.
    pub translation: [f64; 3],
    /// `rpy = [roll, pitch, yaw]`.
    pub rpy: Option<Spanned<[f64; 3]>>,
    /// `rotation`, rows.
    pub rotation: Option<Spanned<[[f64; 3]; 3]>>,
    /// Every key written in the table, with its span.
    pub keys: Vec<(String, Range<usize>)>,
}

/// Reads a parsed document into a [`Description`], reporting every problem of single values.
pub(crate) fn read(source: &mut Source, root: &dyn TableLike) -> Description {
    let file_start = 0..0;
    let top = reader::entries(root, &file_start);
    let find = |key: &str| top.iter().find(|e| e.key == key);

    for entry in top.iter().filter(|e| !TOP_KEYS.contains(&e.key.as_str())) {
        reader::report_unknown(source, entry, &entry.key.clone(), TOP_KEYS);
    }
    let units = Units {
        length: find("length_unit").map_or(LengthUnit::Metre, |e| length_unit(source, e)),
        angle: find("angle_unit").map_or(AngleUnit::Radian, |e| angle_unit(source, e)),
    };
    let name = match find("name") {
        Some(e) => arm_name(source, e),
        None => {
            report_missing(
                source,
                &file_start,
                "name",
                "the file",
                "name = \"bench-arm\"",
            );
            String::new()
        }
    };
    let convention = match find("convention") {
        Some(e) => convention(source, e),
        None => {
            report_missing(
                source,
                &file_start,
                "convention",
                "the file",
                "convention = \"dh\", \"modified-dh\" or \"axes\"",
            );
            None
        }
    };
    let description = find("description")
        .and_then(|e| reader::string(source, e, "description"))
        .map(|s| s.value);
    let (joints_span, joints) = match find("joint") {
        Some(e) => (e.key_span.clone(), joints(source, e, units)),
        None => (file_start, Some(Vec::new())),
    };
    let joints_malformed = joints.is_none();
    let joints = joints.unwrap_or_default();
    let tool = find("tool").and_then(|e| frame(source, e, units));
    let base = find("base").and_then(|e| frame(source, e, units));
    Description {
        name,
        description,
        units,
        convention,
        joints_span,
        joints,
        joints_malformed,
        tool,
        base,
    }
}

/// Reports a required key that is missing from a table.
pub(crate) fn report_missing(
    source: &mut Source,
    span: &Range<usize>,
    path: &str,
    table: &str,
    example: &str,
) {
    let message = format!("missing required key in {table}; add e.g. `{example}`");
    source.report(span, path, message);
}

fn length_unit(source: &mut Source, entry: &Entry) -> LengthUnit {
    match reader::string(source, entry, "length_unit") {
        Some(s) if s.value == "m" => LengthUnit::Metre,
        Some(s) if s.value == "mm" => LengthUnit::Millimetre,
        Some(s) => {
            reader::report_not_one_of(source, &s, "length_unit", "length unit", &["m", "mm"]);
            LengthUnit::Metre
        }
        None => LengthUnit::Metre,
    }
}

fn angle_unit(source: &mut Source, entry: &Entry) -> AngleUnit {
    match reader::string(source, entry, "angle_unit") {
        Some(s) if s.value == "rad" => AngleUnit::Radian,
        Some(s) if s.value == "deg" => AngleUnit::Degree,
        Some(s) => {
            reader::report_not_one_of(source, &s, "angle_unit", "angle unit", &["rad", "deg"]);
            AngleUnit::Radian
        }
        None => AngleUnit::Radian,
    }
}

fn convention(source: &mut Source, entry: &Entry) -> Option<Convention> {
    let s = reader::string(source, entry, "convention")?;
    let found = Convention::from_word(&s.value);
    if found.is_none() {
        let words: Vec<&str> = Convention::ALL.iter().map(|c| c.word()).collect();
        reader::report_not_one_of(source, &s, "convention", "convention", &words);
    }
    found
}

/// Rust keywords, which a module name cannot be.
const RUST_KEYWORDS: &[&str] = &[
    "as", "async", "await", "break", "const", "continue", "crate", "dyn", "else", "enum", "extern",
    "false", "fn", "for", "if", "impl", "in", "let", "loop", "match", "mod", "move", "mut", "pub",
    "ref", "return", "self", "Self", "static", "struct", "super", "trait", "true", "type",
    "unsafe", "use", "where", "while", "abstract", "become", "box", "do", "final", "macro",
    "override", "priv", "try", "typeof", "unsized", "virtual", "yield", "gen",
];

fn arm_name(source: &mut Source, entry: &Entry) -> String {
    let Some(s) = reader::string(source, entry, "name") else {
        return String::new();
    };
    if let Some(message) = arm_name_problem(&s.value) {
        source.report(
            &s.span,
            "name",
            format!("{message} (it becomes a Rust module name)"),
        );
    }
    s.value
}

/// What is wrong with `name` as an arm name, which becomes a Rust module name: `None` when it
/// has only letters, digits, `-` and `_`, starts with a letter and is not a Rust keyword.
pub fn arm_name_problem(name: &str) -> Option<String> {
    let name = &*reader::shown(name);
    if name.is_empty() {
        Some("the name is empty".to_string())
    } else if !name.starts_with(|c: char| c.is_ascii_alphabetic()) {
        Some(format!("\"{name}\" must start with a letter (a-z, A-Z)"))
    } else if let Some(bad) = name
        .chars()
        .find(|c| !(c.is_ascii_alphanumeric() || *c == '-' || *c == '_'))
    {
        Some(format!(
            "\"{name}\" contains '{bad}'; use only letters, digits, '-' and '_'"
        ))
    } else if RUST_KEYWORDS.contains(&name.replace('-', "_").as_str()) {
        Some(format!(
            "\"{name}\" is a Rust keyword and cannot name a module"
        ))
    } else {
        None
    }
}

/// The joint tables, or `None` (reported) when `joint` is not an array of tables.
fn joints(source: &mut Source, entry: &Entry, units: Units) -> Option<Vec<JointEntry>> {
    let tables: Vec<(&dyn TableLike, Range<usize>)> = match entry.item {
        Item::ArrayOfTables(a) => a
            .iter()
            .map(|t| {
                (
                    t as &dyn TableLike,
                    t.span().unwrap_or_else(|| entry.span()),
                )
            })
            .collect(),
        Item::Value(toml_edit::Value::Array(a))
            if a.iter().all(|v| v.as_inline_table().is_some()) =>
        {
            a.iter()
                .filter_map(|v| v.as_inline_table())
                .map(|t| {
                    (
                        t as &dyn TableLike,
                        t.span().unwrap_or_else(|| entry.span()),
                    )
                })
                .collect()
        }
        other => {
            let message = format!(
                "expected an array of tables (one `[[joint]]` table per joint), found {}",
                reader::found(other)
            );
            source.report(&entry.span(), "joint", message);
            return None;
        }
    };
    let joints = tables
        .into_iter()
        .enumerate()
        .map(|(i, (table, span))| joint(source, table, span, &format!("joint[{}]", i + 1), units))
        .collect();
    Some(joints)
}

fn joint(
    source: &mut Source,
    table: &dyn TableLike,
    span: Range<usize>,
    path: &str,
    units: Units,
) -> JointEntry {
    let entries = reader::entries(table, &span);
    let mut joint = JointEntry {
        direction: 1.0,
        ..JointEntry::default()
    };
    match entries.iter().find(|e| e.key == "type") {
        Some(e) => joint.kind = joint_kind(source, e, &format!("{path}.type")),
        None => report_missing(
            source,
            &span,
            &format!("{path}.type"),
            "this joint",
            "type = \"revolute\"",
        ),
    }
    let length = Quantity::Length(units.length);
    let angle = Quantity::Angle(units.angle);
    let joint_quantity = match joint.kind {
        Some(JointKind::Revolute) => angle,
        Some(JointKind::Prismatic) => length,
        None => Quantity::Plain,
    };
    for e in &entries {
        let key_path = format!("{path}.{}", e.key);
        let number = |source: &mut Source, q| reader::number(source, e, &key_path, q);
        match e.key.as_str() {
            "type" => {}
            "name" => joint.name = joint_name(source, e, &key_path),
            "direction" => joint.direction = direction(source, e, &key_path),
            "limits" => {
                joint.limits = reader::numbers(source, e, &key_path, joint_quantity, "[min, max]")
            }
            "a" => joint.dh.a = number(source, length).map_or(0.0, |x| x.value),
            "alpha" => joint.dh.alpha = number(source, angle).map_or(0.0, |x| x.value),
            "d" => joint.dh.d = number(source, length).map_or(0.0, |x| x.value),
            "theta" => joint.dh.theta = number(source, angle).map_or(0.0, |x| x.value),
            "axis" => {
                joint.axis = reader::numbers(source, e, &key_path, Quantity::Plain, "[x, y, z]")
            }
            "point" => joint.point = reader::numbers(source, e, &key_path, length, "[x, y, z]"),
            "offset" => joint.offset = number(source, joint_quantity).map_or(0.0, |x| x.value),
            _ => {
                let known: Vec<&str> = [JOINT_KEYS, DH_KEYS, AXES_KEYS].concat();
                reader::report_unknown(source, e, &key_path, &known);
                continue;
            }
        }
        joint.keys.push((e.key.clone(), e.key_span.clone()));
    }
    joint.span = span;
    joint
}

/// The most characters a joint name may have.
pub const MAX_JOINT_NAME_CHARS: usize = 64;

/// Reads a joint name: not empty or blank, printable, at most [`MAX_JOINT_NAME_CHARS`]
/// characters (it appears in messages, drawings, the review sheet and generated code).
fn joint_name(source: &mut Source, entry: &Entry, path: &str) -> Option<Spanned<String>> {
    let name = reader::string(source, entry, path)?;
    let problem = if name.value.trim().is_empty() {
        Some("the joint name is empty; give a name or leave `name` out (the joint is then called `joint N`)".to_string())
    } else if let Some(bad) = name.value.chars().find(|&c| is_non_printing(c)) {
        Some(format!(
            "the joint name \"{}\" contains the non-printing character U+{:04X}; use printing characters only",
            reader::shown(&name.value),
            u32::from(bad)
        ))
    } else {
        let count = name.value.chars().count();
        (count > MAX_JOINT_NAME_CHARS).then(|| {
            format!(
                "the joint name \"{}\" has {count} characters; at most {MAX_JOINT_NAME_CHARS} are allowed",
                reader::shown(&name.value)
            )
        })
    };
    match problem {
        Some(message) => {
            source.report(&name.span, path, message);
            None
        }
        None => Some(name),
    }
}

fn joint_kind(source: &mut Source, entry: &Entry, path: &str) -> Option<JointKind> {
    let s = reader::string(source, entry, path)?;
    match s.value.as_str() {
        "revolute" => Some(JointKind::Revolute),
        "prismatic" => Some(JointKind::Prismatic),
        _ => {
            reader::report_not_one_of(source, &s, path, "joint type", &["revolute", "prismatic"]);
            None
        }
    }
}

fn direction(source: &mut Source, entry: &Entry, path: &str) -> f64 {
    let Some(x) = reader::number(source, entry, path, Quantity::Plain) else {
        return 1.0;
    };
    if x.value == 1.0 || x.value == -1.0 {
        x.value
    } else {
        let message = format!("direction must be 1 or -1, found {}", tidy(x.value));
        source.report(&x.span, path, message);
        1.0
    }
}

fn frame(source: &mut Source, entry: &Entry, units: Units) -> Option<FrameEntry> {
    let path = entry.key.clone();
    let Some(table) = entry.item.as_table_like() else {
        let message = format!(
            "expected a table (`[{path}]` with translation, rpy or rotation), found {}",
            reader::found(entry.item)
        );
        source.report(&entry.span(), &path, message);
        return None;
    };
    let span = entry.span();
    let mut frame = FrameEntry {
        path: path.clone(),
        ..FrameEntry::default()
    };
    for e in reader::entries(table, &span) {
        let key_path = format!("{path}.{}", e.key);
        match e.key.as_str() {
            "translation" => {
                let length = Quantity::Length(units.length);
                if let Some(t) = reader::numbers(source, &e, &key_path, length, "[x, y, z]") {
                    frame.translation = t.value;
                }
            }
            "rpy" => {
                let angle = Quantity::Angle(units.angle);
                frame.rpy = reader::numbers(source, &e, &key_path, angle, "[roll, pitch, yaw]")
            }
            "rotation" => frame.rotation = reader::matrix3(source, &e, &key_path),
            _ => {
                reader::report_unknown(source, &e, &key_path, FRAME_KEYS);
                continue;
            }
        }
        frame.keys.push((e.key.clone(), e.key_span.clone()));
    }
    Some(frame)
}
