armforge_macros::solver!(
    /// Axes 2 and 3 are 10° apart: no elbow family, so no decoupled closed form.
    pub mod arm = "fixtures/offset-wrist.toml";
);

fn main() {}
