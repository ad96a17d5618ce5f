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
//! Joint values are in the file's units. There is one solution per branch: a joint whose range
//! exceeds a turn is at the equivalent angle nearest its range's center (with `--near`, nearest
//! the given value). Its other values within the limits follow the solution's flags as
//! `"equivalents": [[joint, value], ...]` (1-based joint, file units; at most
//! [`MAX_EQUIVALENTS_LISTED`] of them) with `"equivalent_count"`, how many there are in all;
//! both keys are left out when there are none. Any combination of them reaches the same pose.
//!
//! Statuses other than `ok`: `invalid_pose`,
//! `beyond_reach`, `inside_hole`, `wrist_orientation`, `outside_limits` (with the 1-based
//! `joint`), `branch_unavailable`, `no_such_branch` (a branch this arm never has); each with
//! a sentence in `reason` and, where there is one, the amount `by` in the file's `unit`. A malformed line gets `{"error": "...", "line": N}` and
//! the rest goes on; blank lines are skipped. `--near` gives the one solution nearest to given
//! joint values, `--branch` the one of a branch.

use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_runtime::{
    Branch, Elbow, Flags, Joint, Pose, Shoulder, Solution, Unreachable, Wrist, JOINTS,
};
use serde_json::{json, Value};

use super::io::terminal::{fail, Outcome};
use super::io::{exit, files, lines, unreachable, values};

/// Arguments of `armforge solve`.
#[derive(clap::Args, Debug)]
#[command(after_help = super::io::exit::TABLE)]
pub struct Args {
    /// The arm description file.
    pub arm: std::path::PathBuf,
    /// Give only the solution nearest to these joint values (file units, comma separated).
    #[arg(long, value_name = "J1,J2,...", allow_hyphen_values = true)]
    pub near: Option<String>,
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
pub fn run(args: Args) -> Outcome {
    let (model, geometry) = files::load_classified(&args.arm)?;
    let mode = mode(&model, &args).map_err(|message| fail(exit::USAGE, &message))?;
    let solver = Solver::new(&model, &geometry);
    lines::answer_lines(|line| {
        let pose = values::pose(line, false)?;
        let target = model.units.pose_to_si(&pose);
        Ok(answer(&model, &solver, &mode, &target))
    })
}

fn mode(model: &Model, args: &Args) -> Result<Mode, String> {
    if let Some(text) = &args.near {
        let values = values::joints_option(model, "--near", text)?;
        if values.len() != JOINTS {
            return Err(format!(
                "--near needs {JOINTS} joint values, found {}",
                values.len()
            ));
        }
        let si = model.joint_values_to_si(&values);
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

/// The output line for one target.
fn answer(model: &Model, solver: &Solver, mode: &Mode, target: &Pose) -> Line {
    let result = match mode {
        Mode::All => solver.solve(target),
        Mode::Near(current) => solver.solve_near(target, current).map(|s| vec![s]),
        Mode::Branch(branch) => solver.solve_branch(target, *branch).map(|s| vec![s]),
    };
    match result {
        Ok(solutions) => {
            let objects: Vec<Line> = solutions
                .iter()
                .map(|s| solution_json(model, &solver.plan().arm.joints, s))
                .collect();
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

/// The most equivalent values listed per solution (`equivalent_count` gives them all).
pub const MAX_EQUIVALENTS_LISTED: usize = 16;

fn solution_json(model: &Model, joints: &[Joint; JOINTS], s: &Solution) -> Line {
    let line = Line::new()
        .with(
            "joints",
            json!(model.tidy_joint_values(&model.joint_values_from_si(&s.joints))),
        )
        .with_object("branch", &branch_json(&s.branch))
        .with(
            "wrist_aligned",
            json!(s.flags.contains(Flags::WRIST_ALIGNED)),
        )
        .with("on_axis_1", json!(s.flags.contains(Flags::ON_AXIS_1)))
        .with(
            "at_reach_limit",
            json!(s.flags.contains(Flags::AT_REACH_LIMIT)),
        );
    let equivalents = s.equivalents(joints);
    let count = equivalents.len();
    if count == 0 {
        return line;
    }
    let listed: Vec<Value> = equivalents
        .take(MAX_EQUIVALENTS_LISTED)
        .map(|e| {
            let mut q = s.joints;
            q[e.joint] = e.value;
            let shown = model.tidy_joint_values(&model.joint_values_from_si(&q));
            json!([e.joint + 1, shown[e.joint]])
        })
        .collect();
    line.with("equivalents", Value::Array(listed))
        .with("equivalent_count", json!(count))
}

/// A branch label as JSON words (the words `--branch` reads).
fn branch_json(b: &Branch) -> Line {
    Line::new()
        .with("shoulder", json!(b.shoulder.word()))
        .with("elbow", json!(b.elbow.word()))
        .with("wrist", json!(b.wrist.word()))
}

/// Why a target has no solution, with the amount in the file's units.
fn unreachable_json(model: &Model, why: &Unreachable) -> Line {
    let reason = unreachable::reason(model, why);
    let mut line = Line::new()
        .with("status", json!(reason.status))
        .with("reason", json!(reason.text));
    if let Some(joint) = reason.joint {
        line = line.with("joint", json!(joint));
    }
    if let Some((by, unit)) = reason.by {
        line = line.with("by", json!(by)).with("unit", json!(unit));
    }
    line.with("count", json!(0)).with("solutions", json!([]))
}
