//! `armforge verify` judges a sample by its geometry, not by the sampler that made it: a
//! sample at a joint limit that is also at the wrist's second aligned position (joint 5 at
//! ±180°, axes 4 and 6 in one line again) is held to the singular-aware criterion, and joint
//! allowances grow with the conditioning. Every example arm passes with the documented default
//! limits (no `limits` keys: one turn for revolute joints, unlimited slides).
//!
//! `ARMFORGE_SCALE=K` (release builds) runs K times the samples per arm.

use std::path::{Path, PathBuf};

use armforge_compiler::classify::{classify, Geometry, Tolerances};
use armforge_compiler::description::load_str;
use armforge_compiler::model::Model;
use armforge_compiler::solver::Solver;
use armforge_runtime::{Joint, JOINTS};
use armforge_workbench::verify::{verify, Judge, Kind, Options, Sampler, Summary, Thresholds};

fn workspace() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .parent()
        .expect("the workbench sits in the workspace")
        .to_path_buf()
}

fn example(name: &str) -> String {
    std::fs::read_to_string(workspace().join("arms").join(name)).expect("readable arm file")
}

/// The example with every `limits` line removed: the documented defaults.
fn at_default_limits(text: &str) -> String {
    text.lines()
        .filter(|l| !l.trim_start().starts_with("limits"))
        .map(|l| format!("{l}\n"))
        .collect()
}

fn classified(path: &str, text: &str) -> (Model, Geometry) {
    let model = load_str(text, path).unwrap_or_else(|d| panic!("{path} does not load:\n{d}"));
    let geometry = classify(&model, &Tolerances::default())
        .unwrap_or_else(|r| panic!("{path} does not classify: {r}"));
    (model, geometry)
}

fn run(model: &Model, geometry: &Geometry, samples: u64) -> Summary {
    let solver = Solver::new(model, geometry);
    let options = Options {
        samples,
        seed: 11,
        ..Options::default()
    };
    verify(model, geometry, &solver, &options, &|_| {}).expect("six joints")
}

fn judge_of(model: &Model, geometry: &Geometry) -> Judge {
    let joints: [Joint; JOINTS] = model.runtime_joints().try_into().expect("six joints");
    let sampler = Sampler::new(joints, geometry, 1);
    Judge::new(
        joints,
        geometry.resolved.arm_size,
        sampler.hints().clone(),
        Thresholds::default(),
    )
}

#[test]
fn the_second_aligned_position_frees_joints_4_and_6() {
    let text = at_default_limits(&example("bench-elbow-dh.toml"));
    let (model, geometry) = classified("bench-elbow-default", &text);
    let judge = judge_of(&model, &geometry);
    let deg = |x: f64| x.to_radians();
    // Away from every singular configuration: every joint held to 1e-6 over its measure
    // (here between 0.29 and 0.87).
    let general = [0.3, deg(-40.0), deg(60.0), 0.5, deg(50.0), -0.7];
    let j = judge.judge(&general);
    assert!(!j.near_singular, "{j:?}");
    let m = j.measures;
    assert!((j.joint[0] - 1e-6 / m.axis[0]).abs() < 1e-18, "{j:?}");
    assert!((j.joint[1] - 1e-6 / m.axis[1]).abs() < 1e-18, "{j:?}");
    assert_eq!(j.joint[2], 1e-6);
    assert_eq!(j.joint[4], j.joint[0].max(j.joint[1]));
    assert!((j.joint[3] - j.joint[4] / m.wrist).abs() < 1e-18, "{j:?}");
    for (i, allowed) in j.joint.iter().enumerate() {
        assert!(*allowed <= 1e-5, "joint {}: {j:?}", i + 1);
    }
    // Joint 5 a whisker from ±180° (a joint-limit sample of the one-turn default): axes 4 and
    // 6 line up again, so joints 4 and 6 are free; joints 1–3 and 5 are still compared.
    for q5 in [deg(180.0) - 1e-12, deg(-180.0) + 1e-12, 1e-12] {
        let mut q = general;
        q[4] = q5;
        let j = judge.judge(&q);
        assert!(j.near_singular, "{q5}: {j:?}");
        assert_eq!(j.joint[3], f64::INFINITY, "{q5}: {j:?}");
        assert_eq!(j.joint[5], f64::INFINITY, "{q5}: {j:?}");
        assert!(j.joint[0] <= 1e-5 && j.joint[4] <= 1e-5, "{j:?}");
    }
    // 1e-4 rad from alignment: joints 4 and 6 held to joint 5's allowance / 1e-4.
    let mut q = general;
    q[4] = deg(180.0) - 1e-4;
    let j = judge.judge(&q);
    assert!((j.joint[3] * 1e-4 / j.joint[4] - 1.0).abs() < 1e-9, "{j:?}");
}

#[test]
fn joint_1_is_conditioned_by_the_distance_from_axis_1() {
    let text = example("bench-elbow-dh.toml");
    let (model, geometry) = classified("bench-elbow", &text);
    let judge = judge_of(&model, &geometry);
    let joints: [Joint; JOINTS] = model.runtime_joints().try_into().expect("six joints");
    let sampler = Sampler::new(joints, &geometry, 5);
    let placed: Vec<_> = (0..40)
        .filter_map(|i| sampler.sample(i, Kind::NearAxis1))
        .collect();
    assert!(placed.len() > 30, "{}", placed.len());
    for sample in placed {
        let q = sample.joints;
        let j = judge.judge(&q);
        let r = j.measures.axis[0];
        // Placed `offset` of the arm's size from axis 1 (1e-12 to 1e-3).
        assert!((r / sample.offset - 1.0).abs() < 1e-3, "{sample:?} {j:?}");
        assert!(j.near_singular);
        if r > 1e-6 / std::f64::consts::PI {
            assert!((j.joint[0] * r / 1e-6 - 1.0).abs() < 1e-9, "{j:?}");
            // The wrist follows joint 1.
            assert_eq!(j.joint[4], j.joint[0]);
        } else {
            // Joint 1 is free once its allowance reaches half a turn.
            assert_eq!(j.joint[0], f64::INFINITY, "{j:?}");
        }
        assert!(j.joint[2] <= 1e-6, "{j:?}");
    }
}

/// Every example arm: verify passes each at the documented default limits.
const AT_DEFAULTS: [&str; 6] = [
    "bench-elbow-dh.toml",
    "ceiling-transfer-axes.toml",
    "centrifuge-loader-dh.toml",
    "hotel-loader-axes.toml",
    "rack-loader-mdh.toml",
    "tray-gantry-axes.toml",
];

#[test]
fn example_arms_pass_at_the_default_limits() {
    // 2,000 uniform samples give 100 at joint limits; before judging by geometry about 8% of
    // those (joint 5 at ±180°) failed on each arm. Near axis 1 the cylindrical arm's joint-1
    // pair was not a unit pair (rotation errors up to 1.5e-7), and near the polar arm's pivot
    // joint 2 was the angle of rounding noise (position errors of 20% of the arm's size).
    let n = armforge_compiler::plan::samples::sample_count(2000) as u64;
    for name in AT_DEFAULTS {
        let text = at_default_limits(&example(name));
        let (model, geometry) = classified(name, &text);
        let summary = run(&model, &geometry, n);
        assert!(summary.passed, "{name}:\n{}", summary.to_text(&model));
    }
}
