//! Shared helpers for armforge's workspace integration tests.
