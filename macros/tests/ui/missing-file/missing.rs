armforge_macros::solver!(mod arm = "fixtures/no-such-arm.toml";);

fn main() {}
