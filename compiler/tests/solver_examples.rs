//! The example arms under `arms/`: each loads, classifies, and round-trips through the
//! interpreter; its plan and emitted module are snapshotted (insta), one case per arm.

use std::path::{Path, PathBuf};

use armforge_compiler::classify::{classify, Tolerances};
use armforge_compiler::emit::{emit_module, EmitOptions};
use armforge_compiler::pipeline::load_model;
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{sample_configuration, SampleRng};
use armforge_compiler::solver::Solver;
use armforge_runtime::{JointKind, Pose};

fn arms() -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("../arms");
    let mut paths: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|x| x == "toml"))
        .collect();
    paths.sort();
    assert!(
        paths.len() >= 5,
        "example arms missing in {}",
        dir.display()
    );
    paths
}

fn stem(path: &Path) -> String {
    path.file_stem().unwrap().to_string_lossy().into_owned()
}

fn display_path(path: &Path) -> String {
    format!("arms/{}", path.file_name().unwrap().to_string_lossy())
}

fn error(a: &Pose, b: &Pose, reach: f64) -> f64 {
    let mut e: f64 = 0.0;
    for i in 0..3 {
        e = e.max((a.translation[i] - b.translation[i]).abs() / reach);
        for j in 0..3 {
            e = e.max((a.rotation[i][j] - b.rotation[i][j]).abs());
        }
    }
    e
}

#[test]
fn example_arms_round_trip_through_the_interpreter() {
    let samples = armforge_compiler::plan::samples::sample_count(300);
    for path in arms() {
        let model = load_model(&path, "arm").unwrap_or_else(|d| panic!("{d}"));
        let solver = Solver::for_model(&model).unwrap_or_else(|r| panic!("{r}"));
        let reach = solver.plan().arm.scale;
        let mut rng = SampleRng::new(17);
        let mut total = 0;
        for _ in 0..samples {
            let q = sample_configuration(&model, &mut rng);
            let target = model.forward(&q);
            let solutions = solver
                .solve(&target)
                .unwrap_or_else(|r| panic!("{}: {q:?}: {r}", path.display()));
            total += solutions.len();
            let mut found = false;
            for s in &solutions {
                // Arms are accepted within the classifier's tolerances (1e-6 of the size):
                // a pose is reproduced to well within that.
                let e = error(&solver.forward(&s.joints), &target, reach);
                assert!(e < 1e-9, "{}: {s:?} misses by {e:e}", path.display());
                if s.flags.is_empty() {
                    assert_eq!(solver.branch_of(&s.joints), s.branch);
                }
                // Revolute joints modulo whole turns; a joint whose range exceeds a turn holds
                // one value and lists the others (`Solution::equivalents`): the original's
                // value is the held one or listed.
                let equivalents: Vec<_> = s.equivalents(&solver.plan().arm.joints).collect();
                found |= s
                    .joints
                    .iter()
                    .zip(q.iter())
                    .zip(&model.joints)
                    .enumerate()
                    .all(|(i, ((a, b), j))| {
                        let d = a - b;
                        match j.joint.kind {
                            JointKind::Revolute => {
                                let listed = d.abs() < 1e-6
                                    || equivalents
                                        .iter()
                                        .any(|e| e.joint == i && (e.value - b).abs() < 1e-6);
                                let one_turn =
                                    j.joint.limits[1] - j.joint.limits[0] <= std::f64::consts::TAU;
                                (d - std::f64::consts::TAU * (d / std::f64::consts::TAU).round())
                                    .abs()
                                    < 1e-6
                                    && (one_turn || listed)
                            }
                            _ => d.abs() < 1e-6,
                        }
                    });
            }
            assert!(
                found,
                "{}: original {q:?} not among {solutions:#?}",
                path.display()
            );
        }
        eprintln!(
            "{}: {samples} poses, {:.2} solutions per pose",
            stem(&path),
            total as f64 / samples as f64
        );
    }
}

#[test]
fn example_arm_plans_and_modules() {
    for path in arms() {
        let model = load_model(&path, "arm").unwrap_or_else(|d| panic!("{d}"));
        let geometry = classify(&model, &Tolerances::default()).unwrap();
        let plan = build_plan(&model, &geometry);
        let name = stem(&path);
        insta::assert_snapshot!(format!("plan_{name}"), plan.to_string());
        let options = EmitOptions {
            source_path: display_path(&path),
            without_test: false,
            ..EmitOptions::default()
        };
        insta::assert_snapshot!(
            format!("module_{name}"),
            emit_module(&model, &plan, &options)
        );
    }
}

/// The float literals of the emitted module's arm tables (`JOINT_TABLE`, `BASE`, `TOOL`,
/// `LABELS`): the text from each `const NAME` to the end of its item (a line starting `]` or
/// `}`).
fn table_literals(module: &str) -> Vec<(String, f64)> {
    let mut found = Vec::new();
    for name in ["JOINT_TABLE", "BASE", "TOOL", "LABELS"] {
        // An elbow arm's rule is printed folded (`FOLDED_LABELS`).
        let folded = format!("const FOLDED_{name}:");
        let Some(start) = module
            .find(&format!("const {name}:"))
            .or_else(|| module.find(&folded))
        else {
            panic!("no {name} in the emitted module");
        };
        let body = &module[start..];
        let end = ["\n]", "\n}"]
            .iter()
            .filter_map(|e| body.find(e))
            .min()
            .unwrap_or(body.len());
        let body = &body[..end];
        for word in body.split(|c: char| !(c.is_ascii_alphanumeric() || c == '.' || c == '-')) {
            let word = word.trim_start_matches('-');
            if word.starts_with(|c: char| c.is_ascii_digit()) && word.contains('.') {
                if let Ok(x) = word.parse::<f64>() {
                    found.push((format!("{name}: {word}"), x));
                }
            }
        }
    }
    found
}

#[test]
fn emitted_tables_and_forward_at_zero_carry_no_rounding_noise() {
    // A value within 1e-12 of zero is zero, and a value one shorter decimal stands for within a
    // few ulps (0.8500000000000001 for 0.85) is written as that decimal.
    for path in arms() {
        let model = load_model(&path, "arm").unwrap_or_else(|d| panic!("{d}"));
        let geometry = classify(&model, &Tolerances::default()).unwrap();
        let plan = build_plan(&model, &geometry);
        let module = emit_module(&model, &plan, &EmitOptions::default());
        let literals = table_literals(&module);
        assert!(literals.len() > 30, "{}: tables found", stem(&path));
        for (what, x) in literals {
            assert!(
                x == 0.0 || x.abs() > 1e-12,
                "{}: {what} is rounding noise",
                stem(&path)
            );
            let short = format!("{x:.11e}").parse::<f64>().unwrap();
            assert!(
                short == x || (short - x).abs() > 64.0 * f64::EPSILON * x.abs(),
                "{}: {what} stands for {short}",
                stem(&path)
            );
        }
        assert!(!module.contains(" 1 atan2") && !module.contains(" 1 divisions"));
        let zero = model.forward_in_file_units(&vec![0.0; model.joints.len()]);
        for x in zero.rotation.concat().into_iter().chain(zero.translation) {
            assert!(
                x == 0.0 || x.abs() > 1e-12,
                "{}: forward at zero carries {x:e}",
                stem(&path)
            );
            assert!(!(x == 0.0 && x.is_sign_negative()), "{}: -0", stem(&path));
        }
    }
}

/// The `limits` of each `[[joint]]` table as the file's own text says, read with `toml_edit`
/// (independent of armforge's reader).
fn limits_in_file(path: &Path) -> Vec<Option<[f64; 2]>> {
    let text = std::fs::read_to_string(path).unwrap();
    let doc: toml_edit::DocumentMut = text.parse().unwrap();
    let joints = doc["joint"].as_array_of_tables().expect("[[joint]] tables");
    joints
        .iter()
        .map(|j| {
            let limits = j.get("limits")?.as_array()?;
            let number = |i: usize| {
                let v = limits.get(i).unwrap();
                v.as_float()
                    .or_else(|| v.as_integer().map(|n| n as f64))
                    .unwrap()
            };
            Some([number(0), number(1)])
        })
        .collect()
}

#[test]
fn emitted_header_shows_each_limit_as_the_file_wrote_it() {
    // JOINT_TABLE holds SI values (radians: -2.9670597283903604 for -170°); the header lists
    // the file's own numbers next to it, so a reviewer can compare without converting.
    for path in arms() {
        let model = load_model(&path, "arm").unwrap_or_else(|d| panic!("{d}"));
        let geometry = classify(&model, &Tolerances::default()).unwrap();
        let plan = build_plan(&model, &geometry);
        let module = emit_module(&model, &plan, &EmitOptions::default());
        let header: Vec<&str> = module
            .lines()
            .skip_while(|l| !l.starts_with("// Joints as the description wrote them"))
            .skip(1)
            .take(model.joints.len())
            .collect();
        assert_eq!(header.len(), 6, "{}: joint lines", stem(&path));
        for (i, (line, written)) in header.iter().zip(limits_in_file(&path)).enumerate() {
            let Some([lo, hi]) = written else { continue };
            let expected_start = format!("//   {} {}:", i + 1, model.joints[i].name);
            assert!(line.starts_with(&expected_start), "{}: {line}", stem(&path));
            let shown: Vec<f64> = line
                .split("limits ")
                .nth(1)
                .unwrap_or_else(|| panic!("{}: no limits in {line}", stem(&path)))
                .split(',')
                .next()
                .unwrap()
                .split(" to ")
                .map(|w| {
                    let number = w.trim_end_matches(|c: char| !c.is_ascii_digit());
                    number.parse::<f64>().unwrap()
                })
                .collect();
            assert_eq!(shown, [lo, hi], "{}: {line}", stem(&path));
        }
    }
}
