//! The command line's input and output, in one place: the exit-code table, every write to
//! standard output and standard error, loading the description, safe file writes, the
//! bounded JSON-lines loop, the readers of poses and joint values, and the wording of why a
//! pose has no solution.

pub mod exit;
pub mod files;
pub mod json;
pub mod lines;
pub mod same_code;
pub mod terminal;
pub mod unreachable;
pub mod values;
