armforge_macros::solver!(mod arm "fixtures/offset-wrist.toml");

fn main() {}
