//! `armforge solve`: every joint solution for tool poses, through the interpreter.
//!
//! Reads JSON lines `{"rotation": [[...], [...], [...]], "translation": [x, y, z]}` (the world
//! pose of the tool frame, rotation row-major, translation in the file's length unit) from
//! stdin and writes one line per input:
//!
//! ```text
//! {"status": "ok", "count": 8, "solutions": [{"joints": [...], "branch": {"shoulder": "facing",
//!   "elbow": "up", "wrist": "leading"}, "wrist_aligned": false, "on_axis_1": false,
//!   "at_reach_limit": false}, ...]}
//! {"status": "beyond_reach", "reason": "...", "by": 12.5, "unit": "mm", "count": 0, "solutions": []}
//! ```
//!
//! Joint values are in the file's units. Statuses other than `ok`: `invalid_pose`,
//! `beyond_reach`, `inside_hole`, `wrist_orientation`, `outside_limits` (with the 1-based
//! `joint`), `branch_unavailable`; each with a sentence in `reason` and, where there is one, the
//! amount `by` in the file's `unit`. A malformed line gets `{"error": "..."}` and the rest goes
//! on; blank lines are skipped. `--near` gives the one solution nearest to given joint values,
//! `--branch` the one of a branch.
//!
//! Exit status: 0 when every line was read, 1 if any was malformed, 2 for a file that is not a
//! valid description, 3 for a geometry with no decoupled closed form.

use std::process::ExitCode;

use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_runtime::{
    Branch, Elbow, Flags, Pose, PoseProblem, Shoulder, Solution, Unreachable, Wrist, JOINTS,
};
use serde_json::{json, Map, Value};

/// Arguments of `armforge solve`.
#[derive(clap::Args, Debug)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Give only the solution nearest to these joint values (file units, comma separated).
    #[arg(
        long,
        value_name = "J1,J2,...",
        value_delimiter = ',',
        allow_hyphen_values = true
    )]
    pub near: Option<Vec<f64>>,
    /// Give only the solution of this branch: SHOULDER,ELBOW,WRIST with shoulder
    /// facing|across|only, elbow up|down|extended|retracted|only, wrist leading|trailing.
    #[arg(long, value_name = "SHOULDER,ELBOW,WRIST", conflicts_with = "near")]
    pub branch: Option<String>,
}

/// Which solutions to give for each pose.
enum Mode {
    All,
    Near([f64; JOINTS]),
    Branch(Branch),
}

/// Runs `armforge solve`.
pub fn run(args: Args) -> ExitCode {
    let (model, geometry) = match super::load_classified(&args.arm) {
        Ok(loaded) => loaded,
        Err(code) => return code,
    };
    let mode = match mode(&model, &args) {
        Ok(mode) => mode,
        Err(message) => {
            eprintln!("error: {message}");
            return ExitCode::from(super::exit::BAD_FILE);
        }
    };
    let solver = Solver::new(&model, &geometry);
    super::lines::answer_lines(|line| {
        read_pose(&model, line).map(|target| answer(&model, &solver, &mode, &target))
    })
}

fn mode(model: &Model, args: &Args) -> Result<Mode, String> {
    if let Some(values) = &args.near {
        if values.len() != JOINTS || model.joints.len() != JOINTS {
            return Err(format!(
                "--near needs {JOINTS} joint values, found {}",
                values.len()
            ));
        }
        let si = model.joint_values_to_si(values);
        let mut current = [0.0; JOINTS];
        current.iter_mut().zip(si).for_each(|(c, v)| *c = v);
        return Ok(Mode::Near(current));
    }
    if let Some(text) = &args.branch {
        return parse_branch(text).map(Mode::Branch);
    }
    Ok(Mode::All)
}

/// Reads `SHOULDER,ELBOW,WRIST`, e.g. `facing,up,leading` (the words of
/// [`Shoulder::word`], [`Elbow::word`] and [`Wrist::word`]).
fn parse_branch(text: &str) -> Result<Branch, String> {
    let words: Vec<&str> = text.split(',').map(str::trim).collect();
    let [shoulder, elbow, wrist] = words.as_slice() else {
        return Err(format!(
            "--branch needs three words SHOULDER,ELBOW,WRIST (e.g. facing,up,leading), found \"{text}\""
        ));
    };
    Ok(Branch {
        shoulder: read_word(
            "shoulder",
            shoulder,
            Shoulder::from_word,
            Shoulder::ALL.map(Shoulder::word),
        )?,
        elbow: read_word(
            "elbow",
            elbow,
            Elbow::from_word,
            Elbow::ALL.map(Elbow::word),
        )?,
        wrist: read_word(
            "wrist",
            wrist,
            Wrist::from_word,
            Wrist::ALL.map(Wrist::word),
        )?,
    })
}

/// One choice of `--branch`, or what is wrong with it.
fn read_word<T, const N: usize>(
    slot: &str,
    word: &str,
    read: fn(&str) -> Option<T>,
    known: [&str; N],
) -> Result<T, String> {
    read(word).ok_or_else(|| format!("--branch: unknown {slot} \"{word}\" ({})", known.join(", ")))
}

/// The target pose of one input line (SI), or what is wrong with the line.
fn read_pose(model: &Model, line: &str) -> Result<Pose, String> {
    let value: Value = serde_json::from_str(line).map_err(|e| format!("not valid JSON: {e}"))?;
    let Value::Object(object) = value else {
        return Err(
            "expected an object {\"rotation\": [[...], [...], [...]], \"translation\": [x, y, z]}"
                .to_string(),
        );
    };
    if let Some(other) = object
        .keys()
        .find(|k| !matches!(k.as_str(), "rotation" | "translation"))
    {
        return Err(format!(
            "unknown key \"{other}\"; expected \"rotation\" and \"translation\""
        ));
    }
    let rows = numbers_array(&object, "rotation", 3)?;
    let mut rotation = [[0.0; 3]; 3];
    for (r, (out, row)) in rotation.iter_mut().zip(rows).enumerate() {
        *out = three_numbers(&row, &format!("rotation row {}", r + 1))?;
    }
    let translation = match object.get("translation") {
        Some(v) => three_numbers(v, "\"translation\"")?,
        None => return Err("missing \"translation\": [x, y, z]".to_string()),
    };
    Ok(model.units.pose_to_si(&Pose {
        rotation,
        translation,
    }))
}

fn numbers_array(object: &Map<String, Value>, key: &str, len: usize) -> Result<Vec<Value>, String> {
    match object.get(key) {
        Some(Value::Array(items)) if items.len() == len => Ok(items.clone()),
        Some(Value::Array(items)) => {
            Err(format!("\"{key}\" needs {len} rows, found {}", items.len()))
        }
        Some(other) => Err(format!(
            "\"{key}\" must be an array of {len} rows, not {other}"
        )),
        None => Err(format!("missing \"{key}\": [[...], [...], [...]]")),
    }
}

fn three_numbers(value: &Value, what: &str) -> Result<[f64; 3], String> {
    let Value::Array(items) = value else {
        return Err(format!("{what} must be an array of 3 numbers, not {value}"));
    };
    if items.len() != 3 {
        return Err(format!("{what} needs 3 numbers, found {}", items.len()));
    }
    let mut out = [0.0; 3];
    for (o, item) in out.iter_mut().zip(items) {
        *o = item
            .as_f64()
            .ok_or_else(|| format!("{what}: {item} is not a number"))?;
    }
    Ok(out)
}

/// The output line for one target.
fn answer(model: &Model, solver: &Solver, mode: &Mode, target: &Pose) -> Line {
    let result = match mode {
        Mode::All => solver.solve(target),
        Mode::Near(current) => solver.solve_near(target, current).map(|s| vec![s]),
        Mode::Branch(branch) => solver.solve_branch(target, *branch).map(|s| vec![s]),
    };
    match result {
        Ok(solutions) => {
            let objects: Vec<Line> = solutions.iter().map(|s| solution_json(model, s)).collect();
            Line::new()
                .with("status", json!("ok"))
                .with("count", json!(solutions.len()))
                .with_objects("solutions", &objects)
        }
        Err(reason) => unreachable_json(model, &reason),
    }
}

/// One output object with its keys in a fixed, readable order (status first, joints first).
struct Line(Vec<(&'static str, String)>);

impl Line {
    fn new() -> Line {
        Line(Vec::new())
    }
    /// Adds a key with any JSON value.
    fn with(mut self, key: &'static str, value: Value) -> Line {
        self.0.push((key, value.to_string()));
        self
    }
    /// Adds a key whose value is an ordered object.
    fn with_object(mut self, key: &'static str, object: &Line) -> Line {
        self.0.push((key, object.to_string()));
        self
    }
    /// Adds a key whose value is an array of ordered objects.
    fn with_objects(mut self, key: &'static str, objects: &[Line]) -> Line {
        let items: Vec<String> = objects.iter().map(Line::to_string).collect();
        self.0.push((key, format!("[{}]", items.join(","))));
        self
    }
}

impl std::fmt::Display for Line {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("{")?;
        for (i, (key, value)) in self.0.iter().enumerate() {
            if i > 0 {
                f.write_str(",")?;
            }
            write!(f, "{}:{value}", Value::from(*key))?;
        }
        f.write_str("}")
    }
}

fn solution_json(model: &Model, s: &Solution) -> Line {
    Line::new()
        .with("joints", json!(model.joint_values_from_si(&s.joints)))
        .with_object("branch", &branch_json(&s.branch))
        .with(
            "wrist_aligned",
            json!(s.flags.contains(Flags::WRIST_ALIGNED)),
        )
        .with("on_axis_1", json!(s.flags.contains(Flags::ON_AXIS_1)))
        .with(
            "at_reach_limit",
            json!(s.flags.contains(Flags::AT_REACH_LIMIT)),
        )
}

/// A branch label as JSON words (the words `--branch` reads).
fn branch_json(b: &Branch) -> Line {
    Line::new()
        .with("shoulder", json!(b.shoulder.word()))
        .with("elbow", json!(b.elbow.word()))
        .with("wrist", json!(b.wrist.word()))
}

/// Why a target has no solution, with the amount in the file's units.
fn unreachable_json(model: &Model, reason: &Unreachable) -> Line {
    let units = &model.units;
    let length = |by: f64| (units.length_from_si(by), units.length.symbol());
    let (status, reason_text, amount, joint) = match *reason {
        Unreachable::InvalidPose(problem) => {
            let text = match problem {
                PoseProblem::NotFinite => "the pose has an entry that is NaN or infinite".into(),
                PoseProblem::NotOrthonormal { error } => format!(
                    "the rotation is not orthonormal: RᵀR differs from the identity by up to \
                     {error:.3e} (allowed 1e-6)"
                ),
                PoseProblem::Reflection => {
                    "the rotation is a reflection (determinant −1), not a rotation".into()
                }
            };
            ("invalid_pose", text, None, None)
        }
        Unreachable::BeyondReach { by } => (
            "beyond_reach",
            format!(
                "the wrist center is beyond the arm's reach by {}",
                units.show_length(by)
            ),
            Some(length(by)),
            None,
        ),
        Unreachable::InsideHole { by } => (
            "inside_hole",
            format!(
                "the wrist center is inside the region the arm cannot reach near its shoulder, \
                 by {}",
                units.show_length(by)
            ),
            Some(length(by)),
            None,
        ),
        Unreachable::WristOrientation { by } => (
            "wrist_orientation",
            format!(
                "the wrist cannot turn the tool this way: axis 6 misses the directions it can \
                 reach by {}",
                units.show_angle(by)
            ),
            Some((units.angle_from_si(by), units.angle.symbol())),
            None,
        ),
        Unreachable::OutsideLimits { joint, by } => {
            let kind = model
                .joints
                .get(joint)
                .map_or(armforge_runtime::JointKind::Revolute, |j| j.joint.kind);
            let (shown, amount) = match kind {
                armforge_runtime::JointKind::Revolute => (
                    units.show_angle(by),
                    (units.angle_from_si(by), units.angle.symbol()),
                ),
                armforge_runtime::JointKind::Prismatic => (units.show_length(by), length(by)),
            };
            (
                "outside_limits",
                format!(
                    "every solution is outside the joint limits; the closest misses the limits \
                     of {} by {shown}",
                    model.joint_label(joint)
                ),
                Some(amount),
                Some(joint + 1),
            )
        }
        Unreachable::BranchUnavailable => (
            "branch_unavailable",
            "the target is reachable, but not in the requested branch".into(),
            None,
            None,
        ),
    };
    let mut line = Line::new()
        .with("status", json!(status))
        .with("reason", json!(reason_text));
    if let Some(joint) = joint {
        line = line.with("joint", json!(joint));
    }
    if let Some((by, unit)) = amount {
        line = line.with("by", json!(by)).with("unit", json!(unit));
    }
    line.with("count", json!(0)).with("solutions", json!([]))
}
