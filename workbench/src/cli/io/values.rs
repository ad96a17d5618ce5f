//! The readers of poses and joint values, shared by `solve`, `forward` and `draw`.
//!
//! Everything is in the file's units; every number must be finite.

use armforge_compiler::description::plausible::joint_value_problem;
use armforge_compiler::model::Model;
use armforge_compiler::text::shorten;
use armforge_runtime::Pose;
use serde_json::{Map, Value};

/// The shape a pose has, for messages.
const POSE_SHAPE: &str = r#"{"rotation": [[r11, r12, r13], [r21, r22, r23], [r31, r32, r33]], "translation": [x, y, z]}"#;

/// A world pose of the tool frame (rotation row-major, translation in the file's length unit)
/// from JSON text: one line of a stream, or a whole file when `multi_line`.
pub fn pose(text: &str, multi_line: bool) -> Result<Pose, String> {
    let value = super::json::parse(text, multi_line)?;
    let Value::Object(object) = value else {
        return Err(format!("expected an object {POSE_SHAPE}"));
    };
    only_keys(&object, &["rotation", "translation"])?;
    let rows = array(&object, "rotation", 3)?;
    let mut rotation = [[0.0; 3]; 3];
    for (r, (out, row)) in rotation.iter_mut().zip(rows).enumerate() {
        *out = numbers(row, &format!("rotation row {}", r + 1))?;
    }
    let translation = match object.get("translation") {
        Some(v) => numbers(v, "\"translation\"")?,
        None => return Err("missing \"translation\": [x, y, z]".to_string()),
    };
    Ok(Pose {
        rotation,
        translation,
    })
}

/// The joint values of a JSON line `{"joints": [...]}`, one finite number per joint.
pub fn joints_line(model: &Model, line: &str) -> Result<Vec<f64>, String> {
    let value = super::json::parse(line, false)?;
    let Value::Object(object) = value else {
        return Err("expected an object {\"joints\": [...]}".to_string());
    };
    only_keys(&object, &["joints"])?;
    let Some(Value::Array(items)) = object.get("joints") else {
        return Err("expected \"joints\": an array of joint values".to_string());
    };
    count(model, items.len())?;
    items
        .iter()
        .enumerate()
        .map(|(i, item)| match item.as_f64() {
            Some(v) => plausible(model, i, v).map_err(|e| format!("{}: {e}", model.joint_label(i))),
            None => Err(format!(
                "{} is not a finite number: {}",
                model.joint_label(i),
                shorten(&item.to_string(), SHOWN_CHARS)
            )),
        })
        .collect()
}

/// The joint values of a comma-separated option (`--near`, `--joints`), one finite number
/// per joint.
pub fn joints_option(model: &Model, option: &str, text: &str) -> Result<Vec<f64>, String> {
    let items: Vec<&str> = text.split(',').map(str::trim).collect();
    count(model, items.len())
        .map_err(|e| format!("{option}: {e} in `{}`", shorten(text, SHOWN_CHARS)))?;
    items
        .iter()
        .enumerate()
        .map(|(i, item)| match item.parse::<f64>() {
            Ok(v) => plausible(model, i, v)
                .map_err(|e| format!("{option}: the value of {}: {e}", model.joint_label(i))),
            Err(_) => Err(format!(
                "{option}: the value of {} is not a number: `{}`",
                model.joint_label(i),
                shorten(item, SHOWN_CHARS)
            )),
        })
        .collect()
}

/// The most characters of a value a message repeats.
const SHOWN_CHARS: usize = 60;

/// `value` when it is a finite, plausible value of joint `index` (at most 1,000 turns or 10 km
/// in size, in the file's units), else why not.
fn plausible(model: &Model, index: usize, value: f64) -> Result<f64, String> {
    let kind = model.joints[index].joint.kind;
    match joint_value_problem(model.units, kind, value) {
        Some(problem) => Err(problem),
        None => Ok(value),
    }
}

/// Checks the number of joint values against the arm.
fn count(model: &Model, found: usize) -> Result<(), String> {
    let expected = model.joints.len();
    if found == expected {
        return Ok(());
    }
    Err(format!(
        "expected {expected} joint values for arm \"{}\", found {found}",
        model.name
    ))
}

/// Refuses a key other than `allowed`.
fn only_keys(object: &Map<String, Value>, allowed: &[&str]) -> Result<(), String> {
    match object.keys().find(|k| !allowed.contains(&k.as_str())) {
        Some(other) => {
            let expected: Vec<String> = allowed.iter().map(|k| format!("\"{k}\"")).collect();
            Err(format!(
                "unknown key {}; expected {}",
                Value::from(other.as_str()),
                expected.join(" and ")
            ))
        }
        None => Ok(()),
    }
}

/// The `len` items of the array under `key`.
fn array<'v>(object: &'v Map<String, Value>, key: &str, len: usize) -> Result<&'v [Value], String> {
    match object.get(key) {
        Some(Value::Array(items)) if items.len() == len => Ok(items),
        Some(Value::Array(items)) => {
            Err(format!("\"{key}\" needs {len} rows, found {}", items.len()))
        }
        Some(other) => Err(format!(
            "\"{key}\" must be an array of {len} rows, not {}",
            shorten(&other.to_string(), SHOWN_CHARS)
        )),
        None => Err(format!("missing \"{key}\": [[...], [...], [...]]")),
    }
}

/// Three finite numbers.
fn numbers(value: &Value, what: &str) -> Result<[f64; 3], String> {
    let Value::Array(items) = value else {
        let value = shorten(&value.to_string(), SHOWN_CHARS).into_owned();
        return Err(format!("{what} must be an array of 3 numbers, not {value}"));
    };
    if items.len() != 3 {
        return Err(format!("{what} needs 3 numbers, found {}", items.len()));
    }
    let mut out = [0.0; 3];
    for (o, item) in out.iter_mut().zip(items) {
        *o = item.as_f64().filter(|v| v.is_finite()).ok_or_else(|| {
            let item = shorten(&item.to_string(), SHOWN_CHARS).into_owned();
            format!("{what}: {item} is not a finite number")
        })?;
    }
    Ok(out)
}
