//! Proc macro that emits an armforge solver at compile time (filled in by the solver work).
