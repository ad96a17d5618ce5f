//! Property tests and a fuzz harness driven by proptest (cargo-fuzz needs a nightly toolchain
//! and network access that CI does not have).
//!
//! - Random valid arms of every family, written as `axes` description files, go through the
//!   one pipeline (read → classify → plan → emit): each is accepted with its family and emits
//!   a module that parses as Rust; a few of them are compiled with rustc in every run.
//! - Byte-level mutations of every example arm: never a panic; every rejected file has its
//!   problems located at a line and column; every accepted one emits a module that parses.
//! - Poses from arbitrary f64 bit patterns, rotations with determinant −1 and poses pushed
//!   beyond reach: never a panic; every solution reproduces the pose; every refusal has a
//!   reason with a number that is not NaN.
//!
//! The runs are deterministic (a fixed proptest seed); `ARMFORGE_SCALE` multiplies the case
//! counts.

use std::fmt::Write as _;
use std::path::{Path, PathBuf};

use armforge_compiler::classify::{Family, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::pipeline::{generate_from_str, generate_module, Generated, PipelineError};
use armforge_compiler::plan::samples::{sample_arm, sample_count, SampleOptions};
use armforge_compiler::solver::Solver;
use armforge_runtime::{JointKind, Pose, Unreachable, JOINTS};
use armforge_tests::{example_arm_paths, pose_difference_of};
use proptest::prelude::*;
use proptest::test_runner::{Config, RngAlgorithm, TestRng, TestRunner};

/// Every family of the registry.
fn families() -> Vec<Family> {
    armforge_compiler::family::REGISTRY
        .iter()
        .map(|m| m.family())
        .collect()
}

/// A deterministic runner with `default_cases × ARMFORGE_SCALE` cases.
fn runner(default_cases: usize) -> TestRunner {
    let config = Config {
        cases: sample_count(default_cases) as u32,
        failure_persistence: None,
        ..Config::default()
    };
    TestRunner::new_with_rng(config, TestRng::deterministic_rng(RngAlgorithm::ChaCha))
}

/// Runs `test` over `strategy`, failing with proptest's minimal counterexample.
fn check<S: Strategy>(
    default_cases: usize,
    strategy: S,
    test: impl Fn(S::Value) -> Result<(), TestCaseError>,
) where
    S::Value: std::fmt::Debug,
{
    if let Err(e) = runner(default_cases).run(&strategy, test) {
        panic!("{e}");
    }
}

/// A number as TOML reads it back exactly (Rust's shortest round-trip form).
fn number(x: f64) -> String {
    format!("{x:?}")
}

fn triple(v: &[f64; 3]) -> String {
    format!("[{}, {}, {}]", number(v[0]), number(v[1]), number(v[2]))
}

fn frame(out: &mut String, header: &str, pose: &Pose) {
    let r = &pose.rotation;
    let _ = writeln!(
        out,
        "\n[{header}]\ntranslation = {}\nrotation = [{}, {}, {}]",
        triple(&pose.translation),
        triple(&r[0]),
        triple(&r[1]),
        triple(&r[2])
    );
}

/// The model as an `axes` description file in metres and radians.
fn description_of(model: &Model) -> String {
    let mut out = String::from(
        "name = \"sample-arm\"\nconvention = \"axes\"\ndescription = \"A random sample arm\"\n",
    );
    for (i, j) in model.joints.iter().enumerate() {
        let joint = &j.joint;
        let kind = match joint.kind {
            JointKind::Revolute => "revolute",
            JointKind::Prismatic => "prismatic",
        };
        let _ = writeln!(
            out,
            "\n[[joint]]\nname = \"j{}\"\ntype = \"{kind}\"\naxis = {}\npoint = {}\ndirection = {}\noffset = {}",
            i + 1,
            triple(&joint.axis),
            triple(&joint.point),
            number(joint.direction),
            number(joint.offset)
        );
        if joint.limits.iter().all(|l| l.is_finite()) {
            let _ = writeln!(
                out,
                "limits = [{}, {}]",
                number(joint.limits[0]),
                number(joint.limits[1])
            );
        }
    }
    frame(&mut out, "tool", &model.tool);
    frame(&mut out, "base", &model.base);
    out
}

fn sample_options() -> impl Strategy<Value = SampleOptions> {
    (any::<bool>(), any::<bool>(), any::<bool>(), any::<bool>()).prop_map(
        |(two_turns, orthogonal_wrist, random_zero, shoulder_axes_meet)| SampleOptions {
            revolute_range: if two_turns {
                std::f64::consts::TAU
            } else {
                std::f64::consts::PI
            },
            orthogonal_wrist,
            random_zero,
            shoulder_axes_meet,
            shoulder_axes_parallel: false,
        },
    )
}

fn random_arm() -> impl Strategy<Value = (Family, u64, SampleOptions)> {
    let families = families();
    (0..families.len(), any::<u64>(), sample_options())
        .prop_map(move |(f, seed, options)| (families[f], seed, options))
}

/// The sample arm through the pipeline from its description text.
fn generate_sample(family: Family, seed: u64, options: &SampleOptions) -> (Model, Generated) {
    let (model, _) = sample_arm(family, seed, options);
    let text = description_of(&model);
    let generated = generate_from_str(&text, "sample-arm.toml", &Tolerances::default())
        .unwrap_or_else(|e| panic!("{family:?} seed {seed}: {e}\n{text}"));
    (model, generated)
}

#[test]
fn random_valid_arms_of_every_family_are_accepted_and_emit_rust_that_parses() {
    check(24, random_arm(), |(family, seed, options)| {
        let (model, generated) = generate_sample(family, seed, &options);
        prop_assert_eq!(generated.geometry.family, family);
        for (read, made) in generated.model.joints.iter().zip(&model.joints) {
            for k in 0..3 {
                prop_assert!((read.joint.axis[k] - made.joint.axis[k]).abs() < 1e-12);
                prop_assert_eq!(read.joint.point[k], made.joint.point[k]);
            }
        }
        if let Err(e) = syn::parse_file(&generated.source) {
            return Err(TestCaseError::fail(format!(
                "{family:?} seed {seed}: the module does not parse: {e}"
            )));
        }
        Ok(())
    });
}

/// One edit of a file's bytes.
#[derive(Clone, Debug)]
enum Edit {
    /// Replaces the byte at (position mod length).
    Replace(usize, u8),
    /// Inserts a byte before (position mod length + 1).
    Insert(usize, u8),
    /// Removes up to `n` bytes from (position mod length).
    Remove(usize, usize),
    /// Copies up to 16 bytes from one place to another.
    Copy(usize, usize),
}

/// Bytes that matter to TOML and to the reader, and a few that are not UTF-8 on their own.
const INTERESTING: &[u8] = b"[]{}=\".,'#\n\r\t -+0123456789eE_infa\\\x00\x7f\x80\xc3\xe2\xff";

fn byte() -> impl Strategy<Value = u8> {
    prop_oneof![
        3 => (0..INTERESTING.len()).prop_map(|i| INTERESTING[i]),
        1 => any::<u8>(),
    ]
}

fn edit() -> impl Strategy<Value = Edit> {
    prop_oneof![
        (any::<usize>(), byte()).prop_map(|(p, b)| Edit::Replace(p, b)),
        (any::<usize>(), byte()).prop_map(|(p, b)| Edit::Insert(p, b)),
        (any::<usize>(), 1..24usize).prop_map(|(p, n)| Edit::Remove(p, n)),
        (any::<usize>(), any::<usize>()).prop_map(|(a, b)| Edit::Copy(a, b)),
    ]
}

fn apply(bytes: &mut Vec<u8>, edit: &Edit) {
    let len = bytes.len().max(1);
    match *edit {
        Edit::Replace(p, b) => {
            if let Some(slot) = bytes.get_mut(p % len) {
                *slot = b;
            }
        }
        Edit::Insert(p, b) => bytes.insert(p % (bytes.len() + 1), b),
        Edit::Remove(p, n) => {
            let start = p % len;
            let end = (start + n).min(bytes.len());
            bytes.drain(start.min(end)..end);
        }
        Edit::Copy(from, to) => {
            let from = from % len;
            let piece: Vec<u8> = bytes.iter().skip(from).take(16).copied().collect();
            let to = to % (bytes.len() + 1);
            bytes.splice(to..to, piece);
        }
    }
}

fn scratch() -> PathBuf {
    let dir = std::env::temp_dir().join(format!("armforge-properties-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Checks what the pipeline made of a mutated file.
fn judge(path: &Path, result: Result<Generated, PipelineError>) -> Result<(), TestCaseError> {
    match result {
        Ok(generated) => {
            prop_assert!(
                syn::parse_file(&generated.source).is_ok(),
                "{}: accepted, but the module does not parse",
                path.display()
            );
        }
        Err(PipelineError::Description(d)) => {
            prop_assert!(!d.items.is_empty());
            for item in &d.items {
                prop_assert!(
                    item.location.line >= 1 && item.location.column >= 1,
                    "unlocated: {item:?}"
                );
            }
            let report = d.to_string();
            let place = format!(
                "{}:{}:{}:",
                d.path, d.items[0].location.line, d.items[0].location.column
            );
            prop_assert!(report.contains(&place), "{report}");
        }
        Err(PipelineError::Rejected(r)) => {
            prop_assert!(r.location.line >= 1, "unlocated rejection: {r}");
        }
        Err(PipelineError::Unreadable(d)) => {
            return Err(TestCaseError::fail(format!("the file exists: {d}")));
        }
    }
    Ok(())
}

#[test]
fn mutated_example_arms_never_panic_and_every_problem_is_located() {
    let arms: Vec<Vec<u8>> = example_arm_paths()
        .iter()
        .map(|p| std::fs::read(p).unwrap())
        .collect();
    assert!(arms.len() >= 5, "the example arms are present");
    let dir = scratch();
    let strategy = (0..arms.len(), prop::collection::vec(edit(), 1..5));
    check(300, strategy, |(arm, edits)| {
        let mut bytes = arms[arm].clone();
        for e in &edits {
            apply(&mut bytes, e);
        }
        let path = dir.join("mutated.toml");
        std::fs::write(&path, &bytes).unwrap();
        let result = generate_module(&path, "mutated.toml", &Tolerances::default());
        judge(&path, result)
    });
}

/// A rotation with determinant −1: a proper rotation with one row negated.
fn reflection(r: [[f64; 3]; 3], row: usize) -> [[f64; 3]; 3] {
    let mut m = r;
    m[row] = m[row].map(|x| -x);
    m
}

/// Every solution reproduces the target; a refusal's number is not NaN.
fn judge_pose(solver: &Solver, target: &Pose) -> Result<(), TestCaseError> {
    match solver.solve(target) {
        Ok(solutions) => {
            prop_assert!(!solutions.is_empty());
            let scale = 1.0
                + target
                    .translation
                    .iter()
                    .fold(0.0f64, |m, x| m.max(x.abs()));
            for s in &solutions {
                let reached = solver.forward(&s.joints);
                let (rotation, position) = pose_difference_of(&reached, target);
                prop_assert!(
                    position <= 1e-6 * scale && rotation <= 1e-6,
                    "a solution misses the pose by {position:e} m and {rotation:e} in a \
                     rotation entry: {s:?}"
                );
            }
        }
        Err(why) => {
            let number = match why {
                Unreachable::BeyondReach { by }
                | Unreachable::InsideHole { by }
                | Unreachable::WristOrientation { by }
                | Unreachable::OutsideLimits { by, .. } => by,
                Unreachable::InvalidPose(_)
                | Unreachable::BranchUnavailable
                | Unreachable::NoSuchBranch => 0.0,
            };
            prop_assert!(!number.is_nan(), "a reason without a number: {why:?}");
        }
    }
    Ok(())
}

fn bits() -> impl Strategy<Value = f64> {
    any::<u64>().prop_map(f64::from_bits)
}

#[test]
fn arbitrary_poses_never_panic_and_never_give_a_wrong_solution() {
    let pose = (
        prop::array::uniform3(prop::array::uniform3(bits())),
        prop::array::uniform3(bits()),
    );
    let strategy = (random_arm(), pose);
    check(
        200,
        strategy,
        |((family, seed, options), (rotation, translation))| {
            let (model, geometry) = sample_arm(family, seed, &options);
            let solver = Solver::new(&model, &geometry);
            judge_pose(
                &solver,
                &Pose {
                    rotation,
                    translation,
                },
            )
        },
    );
}

#[test]
fn reflected_and_far_poses_get_a_reason_and_near_ones_reproduce() {
    let strategy = (random_arm(), any::<u64>(), 0..3usize, 0.9f64..3.0);
    check(
        200,
        strategy,
        |((family, seed, options), pose_seed, row, stretch)| {
            let (model, geometry) = sample_arm(family, seed, &options);
            let solver = Solver::new(&model, &geometry);
            let mut rng = armforge_compiler::plan::samples::SampleRng::new(pose_seed);
            let q = armforge_compiler::plan::samples::sample_configuration(&model, &mut rng);
            let mut joints = [0.0; JOINTS];
            joints[..q.len().min(JOINTS)].copy_from_slice(&q[..q.len().min(JOINTS)]);
            let reached = solver.forward(&joints);
            // The same place with a reflected rotation is refused as an invalid pose.
            let mirrored = Pose {
                rotation: reflection(reached.rotation, row),
                ..reached
            };
            prop_assert!(matches!(
                solver.solve(&mirrored),
                Err(Unreachable::InvalidPose(_))
            ));
            // Pushed away from (or toward) the base: solutions reproduce it, or a reason says why.
            let pushed = Pose {
                translation: reached.translation.map(|x| x * stretch),
                ..reached
            };
            judge_pose(&solver, &pushed)?;
            // Far beyond any reach: refused with a finite distance.
            let far = Pose {
                translation: reached.translation.map(|x| x * 1e6 + 1e3),
                ..reached
            };
            match solver.solve(&far) {
                Err(Unreachable::BeyondReach { by }) => prop_assert!(by.is_finite() && by > 0.0),
                Err(other) => {
                    prop_assert!(!matches!(other, Unreachable::InvalidPose(_)), "{other:?}")
                }
                Ok(s) => {
                    let prismatic = model
                        .joints
                        .iter()
                        .any(|j| j.joint.kind == JointKind::Prismatic);
                    prop_assert!(prismatic, "a revolute arm reaches 1000 km: {s:?}");
                }
            }
            Ok(())
        },
    );
}

/// The rlibs of `armforge_runtime` next to this test binary (one per feature set).
fn runtime_rlibs() -> (PathBuf, Vec<PathBuf>) {
    let exe = std::env::current_exe().unwrap();
    let deps = exe.parent().unwrap().to_path_buf();
    let mut rlibs: Vec<PathBuf> = std::fs::read_dir(&deps)
        .unwrap()
        .filter_map(|e| e.ok().map(|e| e.path()))
        .filter(|p| {
            let name = p.file_name().unwrap().to_string_lossy();
            name.starts_with("libarmforge_runtime-") && name.ends_with(".rlib")
        })
        .collect();
    rlibs.sort();
    (deps, rlibs)
}

#[test]
fn a_few_random_arms_compile_with_rustc() {
    let (deps, rlibs) = runtime_rlibs();
    assert!(
        !rlibs.is_empty(),
        "armforge_runtime is built next to {}",
        deps.display()
    );
    let rustc = std::env::var("RUSTC").unwrap_or_else(|_| "rustc".to_string());
    let dir = scratch();
    check(2, random_arm(), |(family, seed, options)| {
        let (_, generated) = generate_sample(family, seed, &options);
        let source = dir.join(format!("sample_{seed}.rs"));
        std::fs::write(&source, &generated.source).unwrap();
        let mut errors = Vec::new();
        for rlib in &rlibs {
            let out = std::process::Command::new(&rustc)
                .args([
                    "--edition",
                    "2021",
                    "--crate-type",
                    "lib",
                    "--emit",
                    "metadata",
                ])
                .args(["--crate-name", "sample_arm", "-D", "warnings", "--out-dir"])
                .arg(&dir)
                .arg("-L")
                .arg(format!("dependency={}", deps.display()))
                .arg("--extern")
                .arg(format!("armforge_runtime={}", rlib.display()))
                .arg(&source)
                .output()
                .unwrap();
            if out.status.success() {
                return Ok(());
            }
            errors.push(String::from_utf8_lossy(&out.stderr).into_owned());
        }
        Err(TestCaseError::fail(format!(
            "{family:?} seed {seed}: the emitted module does not compile:\n{}",
            errors.join("\n")
        )))
    });
}
