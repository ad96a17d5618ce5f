armforge_macros::solver!(struct Arm = "fixtures/offset-wrist.toml");

fn main() {}
