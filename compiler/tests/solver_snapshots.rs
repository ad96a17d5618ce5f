//! Snapshots (insta) of plans and an emitted module: a reviewer reads the plan diff first.
//! Accept changes with `INSTA_UPDATE=always cargo test -p armforge-generator --test
//! solver_snapshots` after reviewing them.

use armforge_compiler::classify::Family;
use armforge_compiler::emit::{emit_module, EmitOptions};
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{sample_arm, upright_elbow_arm, SampleOptions};

#[test]
fn plan_of_the_upright_elbow_arm() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    insta::assert_snapshot!(build_plan(&model, &geometry).to_string());
}

#[test]
fn plans_of_sample_arms_of_every_family() {
    for family in [
        Family::Elbow,
        Family::Polar,
        Family::Cylindrical,
        Family::Cartesian,
    ] {
        let (model, geometry) = sample_arm(family, 1, &SampleOptions::default());
        let name = format!("plan_{}", family.name());
        insta::assert_snapshot!(name, build_plan(&model, &geometry).to_string());
    }
}

#[test]
fn emitted_module_of_the_upright_elbow_arm() {
    let (model, geometry) = upright_elbow_arm(0.12, 0.0);
    let plan = build_plan(&model, &geometry);
    let options = EmitOptions {
        source_path: "arms/upright-elbow.toml".to_string(),
        without_test: false,
        ..EmitOptions::default()
    };
    insta::assert_snapshot!(emit_module(&model, &plan, &options));
}
