//! The emitter: deterministic output, fixtures compiled by the workspace tests kept fresh, and
//! insta snapshots of plans and an emitted module.
//!
//! Regenerate the fixtures with `ARMFORGE_BLESS=1 cargo test -p armforge-generator --test
//! solver_emit`; accept snapshots with `INSTA_UPDATE=always`.

use std::path::PathBuf;

use armforge_compiler::classify::Family;
use armforge_compiler::emit::{emit_module, EmitOptions};
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{sample_arm, SampleOptions};

/// The arms whose emitted modules the workspace tests compile (`tests/tests/generated/`).
/// Keep in sync with `tests/tests/solver_emitted.rs`.
fn fixtures() -> Vec<(&'static str, Family, u64, SampleOptions)> {
    let plain = SampleOptions::default();
    let dextrous = SampleOptions {
        orthogonal_wrist: true,
        shoulder_axes_meet: true,
        ..plain
    };
    let two_turns = SampleOptions {
        revolute_range: std::f64::consts::TAU,
        orthogonal_wrist: true,
        ..plain
    };
    vec![
        ("elbow_orthogonal", Family::Elbow, 11, dextrous),
        ("elbow_twisted", Family::Elbow, 12, plain),
        ("elbow_two_turns", Family::Elbow, 13, two_turns),
        ("polar", Family::Polar, 14, plain),
        ("cylindrical", Family::Cylindrical, 15, plain),
        ("cartesian", Family::Cartesian, 16, plain),
    ]
}

fn generated_dir() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../tests/tests/generated")
}

fn source(name: &str, family: Family, seed: u64, options: &SampleOptions) -> String {
    let (model, geometry) = sample_arm(family, seed, options);
    let plan = build_plan(&model, &geometry);
    emit_module(
        &model,
        &plan,
        &EmitOptions {
            source_path: format!("<sample arm {name}>"),
            without_test: false,
        },
    )
}

#[test]
fn emitted_fixtures_are_fresh() {
    let bless = std::env::var_os("ARMFORGE_BLESS").is_some();
    let dir = generated_dir();
    for (name, family, seed, options) in fixtures() {
        let text = source(name, family, seed, &options);
        let path = dir.join(format!("{name}.rs"));
        if bless {
            std::fs::create_dir_all(&dir).unwrap();
            if std::fs::read_to_string(&path).ok().as_deref() != Some(text.as_str()) {
                std::fs::write(&path, &text).unwrap();
            }
            continue;
        }
        let on_disk = std::fs::read_to_string(&path).unwrap_or_default();
        assert!(
            on_disk == text,
            "{} is stale: run ARMFORGE_BLESS=1 cargo test -p armforge-generator --test solver_emit",
            path.display()
        );
    }
}

#[test]
fn emission_is_deterministic() {
    for (name, family, seed, options) in fixtures() {
        let a = source(name, family, seed, &options);
        let b = source(name, family, seed, &options);
        assert_eq!(a, b, "{name}: two emissions differ");
    }
}
