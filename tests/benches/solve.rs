//! Speed of the emitted solvers against hand-written and numerical references, as ratios
//! measured in one run (`cargo bench -p armforge-tests --bench solve`).
//!
//! Group `bench-elbow` (one call per iteration, cycling through 256 reachable poses made by
//! forward kinematics from seeded random configurations):
//!
//! - `emitted/{forward, solve, solve_branch, solve_near}`: the emitted module (`solve_branch`
//!   for the pose's own branch, `solve_near` from the configuration the pose came from);
//! - `interpreter/solve`: the generator's interpreter on the same plan;
//! - `hand/{solve_all, solve_one, forward}`: a plain hand-written closed form of the same arm
//!   (`reference/hand.rs`): what the emitted code must beat;
//! - `numeric/{dls_nearby, dls_random, starts_32}`: damped least squares on the geometric
//!   Jacobian (tolerance 1e-10, at most 100 iterations) from a seed 0.05 rad away and from a
//!   random seed, and "every solution by 32 random starts" (`reference/numeric.rs`);
//! - `floor/transcendentals`: only the plan's count of `sqrt` and `atan2` calls on numbers
//!   from the same poses — the cost no closed form of this arm can avoid.
//!
//! Group `arms`: `ARM/{solve, solve_branch, solve_near, forward}` for every example arm.
//!
//! After the run the ratios are read from criterion's estimates and printed. The same calls
//! are counted in instructions by `tests/benches/instructions.sh` (callgrind), which is
//! repeatable on a busy machine.

mod reference;

use std::hint::black_box;
use std::path::PathBuf;
use std::time::Duration;

use armforge_compiler::solver::Solver;
use armforge_runtime::math::{atan2, sqrt};
use armforge_runtime::{Pose, JOINTS};
use armforge_tests::emitted::{bench_elbow, EMITTED_ARMS};
use criterion::Criterion;
use rand::rngs::StdRng;
use rand::SeedableRng;
use reference::{hand, numeric, POSES};

const GROUP: &str = "bench-elbow";

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
    let generated = armforge_tests::emitted::bench_arm_generated();
    let counts = generated.plan.op_counts();
    let interpreter = Solver::from_plan(generated.plan.clone());
    let samples = reference::samples();
    let hand_branches: Vec<_> = samples
        .iter()
        .map(|s| reference::hand_branch(s).unwrap_or((false, 1.0, 1.0)))
        .collect();
    let arm = reference::numeric_arm();
    let mut rng = StdRng::seed_from_u64(0x5eed);
    let seeds: Vec<[f64; JOINTS]> = (0..POSES * 32)
        .map(|_| reference::random_joints(&mut rng))
        .collect();
    let mut criterion = Criterion::default().configure_from_args();
    let mut group = criterion.benchmark_group(GROUP);
    let mut i = 0;
    let mut next = || {
        i = (i + 1) % POSES;
        i
    };
    let mut out = [[0.0; JOINTS]; 8];
    let mut found = Vec::new();
    group.bench_function("emitted/forward", |b| {
        b.iter(|| bench_elbow::forward(black_box(&samples[next()].joints)))
    });
    group.bench_function("emitted/solve", |b| {
        b.iter(|| bench_elbow::solve(black_box(&samples[next()].pose)))
    });
    group.bench_function("emitted/solve_branch", |b| {
        b.iter(|| {
            let s = &samples[next()];
            bench_elbow::solve_branch(black_box(&s.pose), s.branch)
        })
    });
    group.bench_function("emitted/solve_near", |b| {
        b.iter(|| {
            let s = &samples[next()];
            bench_elbow::solve_near(black_box(&s.pose), &s.joints)
        })
    });
    group.bench_function("interpreter/solve", |b| {
        b.iter(|| interpreter.solve(black_box(&samples[next()].pose)))
    });
    group.bench_function("hand/solve_all", |b| {
        b.iter(|| hand::solve_all::<hand::Platform>(black_box(&samples[next()].pose), &mut out))
    });
    group.bench_function("hand-libm/solve_all", |b| {
        b.iter(|| hand::solve_all::<hand::LibmCrate>(black_box(&samples[next()].pose), &mut out))
    });
    group.bench_function("hand/solve_one", |b| {
        b.iter(|| {
            let k = next();
            let (back, e, w) = hand_branches[k];
            hand::solve_one::<hand::Platform>(black_box(&samples[k].pose), back, e, w)
        })
    });
    group.bench_function("hand/forward", |b| {
        b.iter(|| hand::forward::<hand::Platform>(black_box(&samples[next()].joints)))
    });
    group.bench_function("floor/transcendentals", |b| {
        b.iter(|| transcendental_floor(black_box(&samples[next()].pose), counts.sqrt, counts.atan2))
    });
    group.bench_function("numeric/dls_nearby", |b| {
        b.iter(|| {
            let s = &samples[next()];
            numeric::dls(&arm, black_box(&s.pose), &reference::nearby_seed(&s.joints))
        })
    });
    group.bench_function("numeric/dls_random", |b| {
        b.iter(|| {
            let k = next();
            numeric::dls(&arm, black_box(&samples[k].pose), &seeds[k])
        })
    });
    group.sample_size(10);
    group.bench_function("numeric/starts_32", |b| {
        b.iter(|| {
            let k = next();
            let seeds = &seeds[k * 32..(k + 1) * 32];
            numeric::random_starts(&arm, black_box(&samples[k].pose), seeds, &mut found)
        })
    });
    group.finish();
    bench_every_arm(&mut criterion);
    criterion.final_summary();
    report_ratios(counts.sqrt, counts.atan2);
}

/// `solve`, `solve_branch`, `solve_near` and `forward` of every example arm.
fn bench_every_arm(criterion: &mut Criterion) {
    let mut group = criterion.benchmark_group("arms");
    group.warm_up_time(Duration::from_millis(500));
    group.measurement_time(Duration::from_secs(2));
    for arm in EMITTED_ARMS {
        let name = arm.path.rsplit('/').next().unwrap_or(arm.path);
        let name = name.strip_suffix(".toml").unwrap_or(name);
        let joints = arm.random_joints(POSES, 0xa11);
        let poses: Vec<Pose> = joints.iter().map(|q| (arm.forward)(q)).collect();
        let branches: Vec<_> = joints.iter().map(|q| (arm.branch_of)(q)).collect();
        let mut i = 0;
        let mut next = || {
            i = (i + 1) % POSES;
            i
        };
        group.bench_function(format!("{name}/solve"), |b| {
            b.iter(|| (arm.solve_count)(black_box(&poses[next()])))
        });
        group.bench_function(format!("{name}/solve_branch"), |b| {
            b.iter(|| {
                let k = next();
                (arm.solve_branch)(black_box(&poses[k]), branches[k])
            })
        });
        group.bench_function(format!("{name}/solve_near"), |b| {
            b.iter(|| {
                let k = next();
                (arm.solve_near)(black_box(&poses[k]), &joints[k])
            })
        });
        group.bench_function(format!("{name}/forward"), |b| {
            b.iter(|| (arm.forward)(black_box(&joints[next()])))
        });
    }
    group.finish();
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
    let t = |n: &str| mean_ns(n);
    let ratio = |a: Option<f64>, b: Option<f64>| match (a, b) {
        (Some(a), Some(b)) if b > 0.0 => format!("{:.2}×", a / b),
        _ => "n/a (run without --test)".to_string(),
    };
    println!("bench-elbow, {sqrts} sqrt + {atan2s} atan2 per solve (times: criterion's slope):");
    let rows = [
        (
            "emitted solve / hand-written all solutions",
            "emitted/solve",
            "hand/solve_all",
            "≤ 1.0× (stretch 0.85×)",
        ),
        (
            "emitted solve_branch / hand-written one branch",
            "emitted/solve_branch",
            "hand/solve_one",
            "≤ 1.2×",
        ),
        (
            "emitted solve_near / hand-written one branch",
            "emitted/solve_near",
            "hand/solve_one",
            "≤ 1.5×",
        ),
        (
            "emitted forward / hand-written DH forward",
            "emitted/forward",
            "hand/forward",
            "≤ 1.0×",
        ),
        (
            "interpreter solve / emitted solve",
            "interpreter/solve",
            "emitted/solve",
            "≥ 5×",
        ),
        (
            "DLS from a nearby seed / emitted solve",
            "numeric/dls_nearby",
            "emitted/solve",
            "≥ 5×",
        ),
        (
            "DLS from a random seed / emitted solve",
            "numeric/dls_random",
            "emitted/solve",
            "",
        ),
        (
            "32 random starts / emitted solve",
            "numeric/starts_32",
            "emitted/solve",
            "≥ 500×",
        ),
        (
            "emitted solve / transcendental floor",
            "emitted/solve",
            "floor/transcendentals",
            "",
        ),
    ];
    for (what, a, b, target) in rows {
        println!("  {what:48} {:>10}   target {target}", ratio(t(a), t(b)));
    }
}
