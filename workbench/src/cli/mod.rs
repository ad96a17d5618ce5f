//! The `armforge` command line: one module per subcommand, each a thin shell over the library.

pub mod draw;
pub mod emit;
pub mod explain;
pub mod forward;
pub mod inspect;
pub mod io;
pub mod new;
pub mod solve;
pub mod verify;
