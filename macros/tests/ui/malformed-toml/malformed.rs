armforge_macros::solver!(mod arm = "fixtures/malformed-toml.toml";);

fn main() {}
