//! Reading arm description files (TOML) into the canonical [`Model`](crate::model::Model).
