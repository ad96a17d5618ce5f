armforge_macros::solver!(struct Arm = "fixtures/tilted-elbow.toml");

fn main() {}
