//! # armforge-workbench
//!
//! The tools around the armforge compiler (`armforge-compiler`): the `armforge` command line,
//! the `inspect` report, the Markdown review sheet, `verify`, `draw` and `new`. Nothing here is
//! needed to compile a solver; the `solver!` macro never builds this crate.
//!
//! **Safety.** A generated solver is not a safety function. Validate every solver on the real
//! machine at reduced speed in a safeguarded cell, and defer to local regulations, the applicable
//! robot safety standards (e.g. ISO 10218) and licensed practice.
#![deny(missing_docs)]

pub mod draw;
pub mod report;
pub mod review;
pub mod scaffold;
pub mod verify;
