//! The review sheet.
