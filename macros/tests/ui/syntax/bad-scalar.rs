armforge_macros::solver!(mod a = "fixtures/a.toml", scalar = f16;);

fn main() {}
