armforge_macros::solver!(mod arm = fixtures::arm);

fn main() {}
