armforge_macros::solver!(mod arm "fixtures/tilted-elbow.toml");

fn main() {}
