//! The folded branch rule (`internal::fold_rule`, what an emitted elbow arm's `branch_of`
//! evaluates) against the geometric rule it is folded from (`internal::branch_of`), on every
//! example arm whose rule folds, at random configurations and across several turns.

use std::path::{Path, PathBuf};

use armforge_compiler::pipeline::load_model;
use armforge_compiler::plan::samples::{sample_configuration, sample_count, SampleRng};
use armforge_compiler::solver::Solver;
use armforge_runtime::internal::{branch_of, branch_of_folded, fold_rule};

fn arms() -> Vec<PathBuf> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("../arms");
    let mut paths: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter(|p| p.extension().is_some_and(|x| x == "toml"))
        .collect();
    paths.sort();
    paths
}

#[test]
fn folded_rule_reads_the_same_labels_as_the_geometric_rule() {
    let samples = sample_count(2000);
    let mut folded_arms = 0;
    for path in arms() {
        let model = load_model(&path, "arm").unwrap_or_else(|d| panic!("{d}"));
        let Ok(solver) = Solver::for_model(&model) else {
            continue;
        };
        let plan = solver.plan();
        let Some(folded) = fold_rule(&plan.rule, &plan.arm.joints) else {
            continue;
        };
        folded_arms += 1;
        let mut rng = SampleRng::new(29);
        for k in 0..samples {
            let mut q = sample_configuration(&model, &mut rng);
            // Whole turns change no label: shift some samples by a few.
            let turns = (k % 5) as f64 - 2.0;
            q[1] += turns * std::f64::consts::TAU;
            q[4] -= turns * std::f64::consts::TAU;
            let joints = &plan.arm.joints;
            assert_eq!(
                branch_of_folded(&folded, joints, &q),
                branch_of(&plan.rule, joints, &q),
                "{}: {q:?}",
                path.display()
            );
        }
    }
    // At least three example arms fold today (the check must see some arms to mean anything).
    assert!(folded_arms >= 3, "only {folded_arms} example arms fold");
}
