//! The review sheet: a Markdown page that lets a reviewer see, without deriving anything,
//! what the arm's solver computes, how it was checked, and whether the description matches
//! the machine.
//!
//! Deterministic: the same description gives the same bytes (numbers rounded to six decimals,
//! everything in a fixed order), so the sheet diffs cleanly in review. `armforge explain`
//! prints it; `armforge emit --sheet` writes it beside the module.
//!
//! Sections, each in its own file: §1 the arm ([`arm`]), §2 classification ([`family`]),
//! §3–4 the method and the steps ([`steps`]), §5 branches ([`branches`]), §6 singular
//! configurations ([`singular`]), §7 reach and §8 tolerances ([`limits`]), §9 the plan as
//! evaluated ([`listing`]).

pub mod arm;
pub mod branches;
pub mod family;
pub mod limits;
pub mod listing;
pub mod markdown;
pub mod show;
pub mod singular;
pub mod steps;

use std::fmt::Write as _;

use show::Show;

use crate::report::{self, Outcome};
use armforge_compiler::classify::Geometry;
use armforge_compiler::model::Model;
use armforge_compiler::plan::Plan;

/// The safety caution at the top of every sheet.
pub const SAFETY: &str = "**Safety.** A generated solver is not a safety function. Validate \
    it on the real machine at reduced speed in a safeguarded cell, and defer to local \
    regulations, the applicable robot safety standards (e.g. ISO 10218) and licensed practice.";

/// The review sheet of a classified arm and its plan, as Markdown.
pub fn review_sheet(model: &Model, geometry: &Geometry, plan: &Plan) -> String {
    let s = Show { units: model.units };
    let report = report::build(model, &geometry.tolerances, &Ok(geometry.clone()));
    let mut out = String::new();
    header(&mut out, model);
    arm::write(&mut out, model, &s);
    family::write(&mut out, &report, geometry, plan, &s);
    steps::write(&mut out, plan, &s);
    branches::write(&mut out, plan, &s);
    let texts = match &report.outcome {
        Outcome::Solvable(solvable) => solvable.singularities.clone(),
        Outcome::Rejected(_) => Vec::new(),
    };
    singular::write(&mut out, geometry, plan, &texts, &s);
    limits::reach(&mut out, &report, geometry, plan, &s);
    limits::tolerances(&mut out, &report, plan, &s);
    listing::write(&mut out, plan, &s);
    out
}

fn header(out: &mut String, model: &Model) {
    let _ = writeln!(out, "# Review sheet: {}\n", model.name);
    let _ = writeln!(out, "> {SAFETY}\n");
    let _ = writeln!(
        out,
        "Written by armforge {} from {} (lengths in {}, angles in {}). The same file always \
         gives the same sheet.\n",
        env!("CARGO_PKG_VERSION"),
        markdown::code(&model.source_path),
        model.units.length.symbol(),
        model.units.angle.symbol()
    );
    let _ = writeln!(
        out,
        "How to review: check §1 against the machine (axes, points, directions, offsets, \
         limits, and the tool positions, which can be measured); §2 says why the closed form \
         applies, with the measured numbers; §4 gives every equation the solver evaluates, \
         first in symbols, then with this arm's numbers; §5–§7 say which solutions exist and \
         where they merge or lose a joint; §8 lists every tolerance. Run `armforge verify` on \
         the same file for the round-trip evidence.\n"
    );
}
