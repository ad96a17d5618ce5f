//! Reading arm description files (TOML) into the canonical [`Model`].
//!
//! # The description format
//!
//! An arm is one TOML file. Unknown keys are errors, so a misspelt key never passes silently.
//!
//! ## Top level
//!
//! | key | type | default | meaning |
//! |---|---|---|---|
//! | `name` | string | required | the arm's name; it becomes a Rust module name, so letters, digits, `-` and `_`, starting with a letter, not a Rust keyword |
//! | `description` | string | none | free text |
//! | `length_unit` | `"m"` or `"mm"` | `"m"` | unit of every length in the file |
//! | `angle_unit` | `"rad"` or `"deg"` | `"rad"` | unit of every angle in the file |
//! | `convention` | `"dh"`, `"modified-dh"` or `"axes"` | required | how the joints are described |
//! | `[[joint]]` | array of tables | required | one table per joint, base to tool; 1 to 16 joints |
//! | `[tool]` | table | identity | the tool frame (see below) |
//! | `[base]` | table | identity | the arm's base frame in the world frame |
//!
//! ## `[[joint]]`, in every convention
//!
//! | key | type | default | meaning |
//! |---|---|---|---|
//! | `type` | `"revolute"` or `"prismatic"` | required | turns about its axis or slides along it |
//! | `name` | string | `joint N` | a name for messages and generated code: not blank, printing characters only, at most 64 characters, unique among the joints (also against the `joint N` of a joint without a name) |
//! | `direction` | `1` or `-1` | `1` | the sign between the joint value (what the controller reports) and the model value |
//! | `limits` | `[min, max]` | revolute: one turn, (−180°, 180°]; prismatic: unlimited | allowed joint values, in the file's units; min < max. A revolute range wider than one turn allows several equivalent angles; at most 16 turns |
//!
//! ## `[[joint]]` with `convention = "dh"` or `"modified-dh"`
//!
//! `a` (length), `alpha` (angle), `d` (length), `theta` (angle), each 0 by default. The
//! joint's *model value* is `direction × joint value`, added to `theta` for a revolute joint
//! and to `d` for a prismatic one.
//!
//! - `dh`, standard Denavit–Hartenberg (Denavit & Hartenberg 1955, as in Spong, Hutchinson &
//!   Vidyasagar, *Robot Modeling and Control*, 2006): link transform
//!   `Rz(θ)·Tz(d)·Tx(a)·Rx(α)`; joint `i` moves about the z axis of frame `i−1`.
//! - `modified-dh` (Craig, *Introduction to Robotics*, 3rd ed., 2005): link transform
//!   `Rx(α)·Tx(a)·Rz(θ)·Tz(d)`, where `alpha` and `a` describe the step from the previous
//!   joint axis to this one; joint `i` moves about the z axis of frame `i`.
//!
//! ## `[[joint]]` with `convention = "axes"`
//!
//! | key | type | default | meaning |
//! |---|---|---|---|
//! | `axis` | `[x, y, z]` | required | the axis direction; any nonzero length, normalised on reading |
//! | `point` | `[x, y, z]` (length) | required for revolute joints | any point on the axis |
//! | `offset` | angle or length | 0 | model value = `direction × joint value + offset` |
//!
//! Axis and point are in the base frame with every model value at zero.
//!
//! ## `[tool]` and `[base]`
//!
//! `translation = [x, y, z]` (length, default zero) and at most one of
//! `rpy = [roll, pitch, yaw]` (angles; `R = Rz(yaw)·Ry(pitch)·Rx(roll)`) or
//! `rotation = [[r11, r12, r13], [r21, r22, r23], [r31, r32, r33]]` (rows; orthonormal within
//! 1e-6 with determinant +1; it is then made exactly orthonormal).
//!
//! - `[tool]` with `dh`/`modified-dh`: the tool frame relative to the last joint's frame; with
//!   `axes`: the tool frame in the base frame with every model value at zero.
//! - `[base]`: the arm's base frame in the world frame. Tool poses going into and out of the
//!   tool are world poses of the tool frame.
//!
//! ## Example
//!
//! ```toml
//! # An invented two-link planar arm.
//! name = "planar-two-link"
//! length_unit = "mm"
//! angle_unit = "deg"
//! convention = "dh"
//!
//! [[joint]]
//! name = "shoulder"
//! type = "revolute"
//! a = 300
//! limits = [-150, 150]
//!
//! [[joint]]
//! name = "elbow"
//! type = "revolute"
//! a = 200
//! direction = -1
//!
//! [tool]
//! translation = [0, 0, 50]
//! ```
//!
//! ## Errors
//!
//! Every problem of a file is reported at once, each with the file, line and column, the key
//! (joints count from 1: `joint[3].limits`), what is wrong with the numbers in the file's
//! units, and the source line with a caret. A file with any problem gives no model.
//!
//! Numbers must be finite and plausible: every length at most 10 km and every angle at most
//! 1,000 turns in size ([`plausible`]), so a slip such as `1e308` is an error at its place.
//! A report shows the first 50 problems and counts the rest; a value from the file is
//! repeated at most 60 characters long, and a long source line as a window around the caret.

mod checks;
mod convert;
mod nesting;
pub mod plausible;
mod reader;
mod schema;
mod source;

use crate::diagnostics::{Diagnostics, Warnings};
use crate::model::Model;

pub use checks::{MAX_JOINTS, ROTATION_TOLERANCE};
pub use schema::{arm_name_problem, Convention, MAX_JOINT_NAME_CHARS};

/// Reads description text into a [`Model`]; `path` names the text in messages.
pub fn load_str(text: &str, path: &str) -> Result<Model, Diagnostics> {
    load_str_with_warnings(text, path).map(|(model, _)| model)
}

/// [`load_str`] with the likely slips that do not stop the load (a radian file whose limits
/// look like degrees), for the tools to show on stderr.
pub fn load_str_with_warnings(text: &str, path: &str) -> Result<(Model, Warnings), Diagnostics> {
    let mut source = source::Source::new(text, path);
    let document = match toml_edit::Document::parse(text) {
        Ok(document) => document,
        Err(e) => {
            let mut message = format!("not valid TOML: {}", e.message());
            let span = match (e.span(), nesting::deepest(text)) {
                (Some(span), _) => span,
                (None, Some((at, depth))) => {
                    message.push_str(&format!(
                        "; tables, arrays and dotted keys nest {depth} deep here (a \
                         description needs at most 4)"
                    ));
                    at..at
                }
                (None, None) => 0..0,
            };
            source.report(&span, "", message);
            return Err(source.into_diagnostics());
        }
    };
    let description = schema::read(&mut source, document.as_table());
    checks::check(&mut source, &description);
    if source.is_clean() {
        Ok((
            convert::to_model(&source, &description, path),
            source.warnings(),
        ))
    } else {
        Err(source.into_diagnostics())
    }
}
