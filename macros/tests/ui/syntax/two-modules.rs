armforge_macros::solver!(mod a = "fixtures/a.toml"; mod b = "fixtures/b.toml";);

fn main() {}
