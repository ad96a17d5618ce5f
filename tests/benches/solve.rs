//! Speed of the bench elbow arm's solvers, as ratios measured in one run.
//!
//! Benchmarks (one call per iteration, cycling through 256 reachable poses made by forward
//! kinematics from seeded random configurations):
//!
//! - `emitted/solve`: the emitted module's `solve` (every solution);
//! - `emitted/solve_branch`: the emitted `solve_branch` for the pose's own branch;
//! - `interpreter/solve`: the generator's interpreter `Solver::solve` on the same plan;
//! - `floor/transcendentals`: only the plan's count of `sqrt` and `atan2` calls (counted from
//!   the plan the emitter printed), on numbers taken from the same poses — the cost no closed
//!   form of this arm can avoid.
//!
//! After the run the ratios (emitted solve ÷ floor, interpreter ÷ emitted solve, …) are read
//! from criterion's estimates and printed. Run with `cargo bench -p armforge-tests`.

use std::hint::black_box;
use std::path::PathBuf;

use armforge_compiler::classify::Tolerances;
use armforge_compiler::pipeline::generate_module;
use armforge_compiler::solver::Solver;
use armforge_runtime::math::{atan2, sqrt};
use armforge_runtime::{Branch, Pose, JOINTS};
use armforge_tests::emitted::bench_elbow;
use criterion::Criterion;
use rand::rngs::StdRng;
use rand::{Rng, SeedableRng};

const POSES: usize = 256;
const GROUP: &str = "bench-elbow";

/// Reachable poses of the bench elbow arm and each one's branch.
fn poses() -> Vec<(Pose, Branch)> {
    let mut rng = StdRng::seed_from_u64(0xbe7c);
    (0..POSES)
        .map(|_| {
            let mut q = [0.0; JOINTS];
            for (value, joint) in q.iter_mut().zip(bench_elbow::JOINT_TABLE.iter()) {
                let [lo, hi] = joint.limits;
                *value = rng.random_range(lo..hi);
            }
            (bench_elbow::forward(&q), bench_elbow::branch_of(&q))
        })
        .collect()
}

/// The same count of `sqrt` and `atan2` calls as one evaluation of the plan, each on fresh
/// numbers from the pose (no call can be folded or hoisted) and independent of the others
/// (as free to overlap as the processor allows).
#[inline(never)]
fn transcendental_floor(pose: &Pose, sqrts: usize, atan2s: usize) -> f64 {
    let r = &pose.rotation;
    let t = &pose.translation;
    let mut acc = 0.0;
    for k in 0..sqrts {
        let x = black_box(r[k % 3][(k / 3) % 3]);
        acc += sqrt(x * x + t[k % 3] * t[k % 3] + 1.0);
    }
    for k in 0..atan2s {
        let y = black_box(r[(k / 3) % 3][k % 3]);
        acc += atan2(y, black_box(t[k % 3]));
    }
    acc
}

fn main() {
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR"));
    let generated = match generate_module(
        &root.join("../arms/bench-elbow-dh.toml"),
        "../arms/bench-elbow-dh.toml",
        &Tolerances::default(),
    ) {
        Ok(generated) => generated,
        Err(e) => panic!("the bench arm must generate: {e}"),
    };
    let counts = generated.plan.op_counts();
    let interpreter = Solver::from_plan(generated.plan.clone());
    let poses = poses();
    let mut criterion = Criterion::default().configure_from_args();
    let mut group = criterion.benchmark_group(GROUP);
    let mut i = 0;
    group.bench_function("emitted/solve", |b| {
        b.iter(|| {
            i = (i + 1) % POSES;
            bench_elbow::solve(black_box(&poses[i].0))
        })
    });
    group.bench_function("emitted/solve_branch", |b| {
        b.iter(|| {
            i = (i + 1) % POSES;
            let (pose, branch) = &poses[i];
            bench_elbow::solve_branch(black_box(pose), *branch)
        })
    });
    group.bench_function("interpreter/solve", |b| {
        b.iter(|| {
            i = (i + 1) % POSES;
            interpreter.solve(black_box(&poses[i].0))
        })
    });
    group.bench_function("floor/transcendentals", |b| {
        b.iter(|| {
            i = (i + 1) % POSES;
            transcendental_floor(black_box(&poses[i].0), counts.sqrt, counts.atan2)
        })
    });
    group.finish();
    criterion.final_summary();
    report_ratios(counts.sqrt, counts.atan2);
}

/// Where criterion writes its estimates.
fn criterion_dir() -> PathBuf {
    let target = std::env::var_os("CARGO_TARGET_DIR")
        .map(PathBuf::from)
        .unwrap_or_else(|| PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../target"));
    target.join("criterion").join(GROUP)
}

/// The time of one call in nanoseconds, from this run's estimates.
fn mean_ns(name: &str) -> Option<f64> {
    let file = criterion_dir()
        .join(name.replace('/', "_"))
        .join("new/estimates.json");
    let text = std::fs::read_to_string(file).ok()?;
    let value: serde_json::Value = serde_json::from_str(&text).ok()?;
    // Criterion's headline estimate: the slope of time over iterations, else the mean.
    value["slope"]["point_estimate"]
        .as_f64()
        .or_else(|| value["mean"]["point_estimate"].as_f64())
}

fn report_ratios(sqrts: usize, atan2s: usize) {
    let names = [
        "emitted/solve",
        "emitted/solve_branch",
        "interpreter/solve",
        "floor/transcendentals",
    ];
    let means: Vec<Option<f64>> = names.iter().map(|n| mean_ns(n)).collect();
    let [Some(solve), Some(branch), Some(interp), Some(floor)] = means[..] else {
        println!(
            "ratios: estimates not found under {} (run without --test)",
            criterion_dir().display()
        );
        return;
    };
    println!("bench-elbow, {sqrts} sqrt + {atan2s} atan2 per plan evaluation:");
    println!("  emitted solve        {solve:8.1} ns");
    println!("  emitted solve_branch {branch:8.1} ns");
    println!("  interpreter solve    {interp:8.1} ns");
    println!("  transcendental floor {floor:8.1} ns");
    println!("  emitted solve / floor          {:.2}×", solve / floor);
    println!("  emitted solve_branch / floor   {:.2}×", branch / floor);
    println!("  interpreter / emitted solve    {:.2}×", interp / solve);
}
