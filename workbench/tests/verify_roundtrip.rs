//! `armforge verify`: every example arm passes the round trip (a few hundred samples here; the
//! command defaults to 100,000), the findings do not depend on the thread count, a solver
//! built from a description with one number changed fails with the failing samples named, and
//! the command's exit codes.
//!
//! `ARMFORGE_SCALE=K` (release builds) runs K times the 400 samples per arm.

mod common;

use common::{classified, examples, workspace};

use std::process::Command;

use armforge_compiler::classify::{classify, Geometry, Singularity, Tolerances};
use armforge_compiler::description::load_str;
use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_workbench::verify::{verify, Kind, Options, Summary};

fn samples() -> u64 {
    armforge_compiler::plan::samples::sample_count(400) as u64
}

fn run(reference: &Model, geometry: &Geometry, solver: &Solver, n: u64) -> Summary {
    let options = Options {
        samples: n,
        seed: 7,
        ..Options::default()
    };
    verify(reference, geometry, solver, &options, &|_| {}).expect("six joints")
}

#[test]
fn every_example_arm_passes() {
    for (path, text) in examples() {
        let (model, geometry) = classified(&path, &text);
        let solver = Solver::new(&model, &geometry);
        let summary = run(&model, &geometry, &solver, samples());
        assert!(summary.passed, "{path}:\n{}", summary.to_text(&model));
        let uniform = &summary.kinds[0];
        assert_eq!(uniform.kind, Kind::WithinLimits);
        assert_eq!(uniform.tried, samples());
        assert_eq!(uniform.recovered, samples());
        // At most 4 postures × 2 wrist solutions for a decoupled 6R arm, fewer for the other
        // families (Craig, Introduction to Robotics, 3rd ed., 2005, §4.7; Siciliano et al.,
        // Robotics, 2009, §2.12), counting angles a whole turn apart once.
        let most = summary.distinct_per_pose.keys().max().copied().unwrap_or(0);
        assert!(
            most <= geometry.solutions.total as usize,
            "{path}: {most} distinct solutions for one pose"
        );
        // Every arm's wrist can align within its limits (an arm whose family has no aligned
        // configuration excepted), and every arm has finite limits.
        let hints = geometry
            .family
            .module()
            .verify_hints(&solver.plan().arm.joints, &geometry);
        for kind in [Kind::WristNearAligned, Kind::AtLimit] {
            if kind == Kind::WristNearAligned && hints.aligned_at.is_empty() {
                continue;
            }
            let k = summary.kinds.iter().find(|k| k.kind == kind).expect("kind");
            assert!(k.tried > 0, "{path}: no {kind:?} samples");
        }
    }
}

#[test]
fn elbow_arms_get_samples_at_their_reach_boundaries_and_near_axis_1() {
    for (path, text) in examples() {
        let (model, geometry) = classified(&path, &text);
        if geometry.family != armforge_compiler::classify::Family::Elbow {
            continue;
        }
        let solver = Solver::new(&model, &geometry);
        // 1,000 uniform samples give 50 of each kind; about a third of the reach-boundary
        // and a fifth of the axis-1 samples land within the solver's tolerance (1e-10 of the
        // arm's size, on log-uniform offsets from 1e-12 to 1e-6 and 1e-3).
        let summary = run(&model, &geometry, &solver, 1000);
        let on_axis = geometry
            .singularities
            .iter()
            .any(|s| matches!(s, Singularity::WristCenterOnAxis1 { .. }));
        let kinds: &[Kind] = if on_axis {
            &[Kind::ReachBoundary, Kind::NearAxis1]
        } else {
            &[Kind::ReachBoundary]
        };
        for &kind in kinds {
            let k = summary.kinds.iter().find(|k| k.kind == kind).expect("kind");
            assert!(k.tried > 0, "{path}: no {kind:?} samples");
            // Placed near a boundary, some land within the solver's tolerance and are flagged.
            assert!(
                k.singular > 0,
                "{path}: no {kind:?} sample flagged singular"
            );
        }
    }
}

#[test]
fn findings_do_not_depend_on_the_thread_count() {
    let (path, text) = examples()
        .into_iter()
        .find(|(p, _)| p.contains("rack-loader"))
        .expect("rack-loader example");
    let (model, geometry) = classified(&path, &text);
    let solver = Solver::new(&model, &geometry);
    let one = rayon::ThreadPoolBuilder::new()
        .num_threads(1)
        .build()
        .expect("pool")
        .install(|| run(&model, &geometry, &solver, 300));
    let many = run(&model, &geometry, &solver, 300);
    assert_eq!(one.kinds, many.kinds);
    assert_eq!(one.failures, many.failures);
}

#[test]
fn a_solver_of_a_changed_description_fails_and_names_the_samples() {
    // The upper arm of the bench elbow 1 mm longer in the solver's description than in the
    // reference: every pose the solver returns misses by about that much.
    let (path, text) = examples()
        .into_iter()
        .find(|(p, _)| p.ends_with("bench-elbow-dh.toml"))
        .expect("bench-elbow example");
    assert!(text.contains("a = 400\n"));
    let changed = text.replace("a = 400\n", "a = 401\n");
    let (reference, geometry) = classified(&path, &text);
    let (wrong, wrong_geometry) = classified(&path, &changed);
    let solver = Solver::new(&wrong, &wrong_geometry);
    let summary = run(&reference, &geometry, &solver, 100);
    assert!(!summary.passed);
    assert!(summary.failed >= 100, "only {} failed", summary.failed);
    let first = &summary.failures[0];
    assert_eq!(first.index, 0, "failures are listed by index");
    assert_eq!(first.joints.len(), 6);
    assert!(
        first.problem.contains("misses the position") || first.problem.contains("not among"),
        "{}",
        first.problem
    );
    let text = summary.to_text(&reference);
    assert!(
        text.contains("sample 0 (within limits): joints ["),
        "{text}"
    );
    assert!(text.contains("FAILED"));
    // A degree file reads degrees: thresholds and joint differences in °, never radians.
    assert!(
        !text.contains("radians,") && !text.contains("joints: radians"),
        "{text}"
    );
    assert!(text.contains("joints recovered within 5.73e-5°"), "{text}");
    for f in summary
        .failures
        .iter()
        .filter(|f| f.problem.contains("not among"))
    {
        assert!(f.problem.contains("°, allowed "), "{}", f.problem);
    }
}

#[test]
fn a_solver_of_a_changed_twist_fails() {
    // Joint 6's axis tilted by 1° in the solver's description (standard DH alpha of joint 5).
    let (path, text) = examples()
        .into_iter()
        .find(|(p, _)| p.ends_with("bench-elbow-dh.toml"))
        .expect("bench-elbow example");
    let changed = text.replacen(
        "alpha = -90\nlimits = [-120, 120]",
        "alpha = -89\nlimits = [-120, 120]",
        1,
    );
    assert_ne!(changed, text, "the wrist-bend twist is in the file");
    let (reference, geometry) = classified(&path, &text);
    let wrong = load_str(&changed, &path).expect("loads");
    // A 1° twist error keeps the wrist spherical only if the classifier says so; either way the
    // solver of the changed file must not pass against the reference.
    if let Ok(wrong_geometry) = classify(&wrong, &Tolerances::default()) {
        let solver = Solver::new(&wrong, &wrong_geometry);
        let summary = run(&reference, &geometry, &solver, 50);
        assert!(!summary.passed);
        assert!(summary
            .failures
            .iter()
            .any(|f| f.problem.contains("rotation")));
    }
}

fn armforge() -> Command {
    Command::new(env!("CARGO_BIN_EXE_armforge"))
}

#[test]
fn verify_exit_codes_and_json() {
    let root = workspace();
    let ok = armforge()
        .current_dir(&root)
        .args([
            "verify",
            "arms/hotel-loader-axes.toml",
            "--samples",
            "200",
            "--json",
        ])
        .output()
        .expect("armforge runs");
    assert_eq!(
        ok.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&ok.stderr)
    );
    let json: serde_json::Value = serde_json::from_slice(&ok.stdout).expect("JSON");
    assert_eq!(json["passed"], serde_json::Value::Bool(true));
    assert_eq!(json["kinds"][0]["tried"], 200);
    let text = armforge()
        .current_dir(&root)
        .args([
            "verify",
            "arms/tray-gantry-axes.toml",
            "--samples",
            "100",
            "--seed",
            "3",
        ])
        .output()
        .expect("armforge runs");
    assert_eq!(text.status.code(), Some(0));
    let out = String::from_utf8_lossy(&text.stdout);
    assert!(out.contains("seed 3") && out.contains("passed"), "{out}");
    let rejected = armforge()
        .current_dir(&root)
        .args([
            "verify",
            "arms/rejected/offset-wrist.toml",
            "--samples",
            "10",
        ])
        .output()
        .expect("armforge runs");
    assert_eq!(rejected.status.code(), Some(3));
    let missing = armforge()
        .current_dir(&root)
        .args(["verify", "arms/no-such-arm.toml"])
        .output()
        .expect("armforge runs");
    assert_eq!(missing.status.code(), Some(5));
}

#[test]
fn sample_counts_outside_the_range_are_usage_errors() {
    // Zero would pass without checking anything; 2^64 − 1 and 10^12 would exhaust memory.
    for n in [
        "0",
        "10000001",
        "18446744073709551615",
        "1000000000000",
        "-3",
    ] {
        let out = armforge()
            .current_dir(workspace())
            .args([
                "verify",
                "arms/tray-gantry-axes.toml",
                &format!("--samples={n}"),
            ])
            .output()
            .expect("armforge runs");
        assert_eq!(out.status.code(), Some(2), "--samples {n}");
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains("--samples"), "--samples {n}: {err}");
        assert!(out.stdout.is_empty(), "--samples {n}");
    }
    let (path, text) = examples()
        .into_iter()
        .find(|(p, _)| p.ends_with("tray-gantry-axes.toml"))
        .expect("tray-gantry example");
    let (model, geometry) = classified(&path, &text);
    let solver = Solver::new(&model, &geometry);
    let options = Options {
        samples: 0,
        ..Options::default()
    };
    let e = verify(&model, &geometry, &solver, &options, &|_| {}).expect_err("zero samples");
    assert!(e.to_string().contains("1 to 10000000"), "{e}");
}
