//! Instruction counts of the solver calls the criterion bench times, for
//! `valgrind --tool=callgrind` (repeatable on a busy machine, unlike times). Run it through
//! `tests/benches/instructions.sh`, which runs one measurement per callgrind run with
//! collection switched on only inside [`measure`], then calls `--report` on the counts.
//!
//! - `instructions --list`: the measurement names;
//! - `instructions NAME`: runs that measurement (`CALLS` calls, or fewer for the slow
//!   numerical baselines, printed as `calls NAME N`);
//! - `instructions --report FILE`: reads `NAME INSTRUCTIONS CALLS` lines and prints the
//!   instructions per call and the ratios against the targets of the speed issue;
//! - `instructions --check`: the sanity checks (hand-written form against the emitted solver,
//!   convergence rates of the numerical baselines, solutions found by 32 random starts).

mod reference;

use std::hint::black_box;

use armforge_compiler::plan::OpCounts;
use armforge_compiler::solver::Solver;
use armforge_runtime::math::{atan2, sqrt};
use armforge_runtime::JOINTS;
use armforge_tests::emitted::{bench_elbow, EMITTED_ARMS};
use rand::rngs::StdRng;
use rand::SeedableRng;
use reference::hand::{self, LibmCrate, Math, Platform};
use reference::{numeric, Sample};

/// Calls per measurement of the closed forms.
const CALLS: usize = 256;
/// Calls per measurement of a damped-least-squares solve.
const NUMERIC_CALLS: usize = 16;
/// Calls per measurement of the 32-start search.
const SEARCH_CALLS: usize = 2;
/// Random starts of the search.
const STARTS: usize = 32;

/// Every measurement: the bench arm's calls and references, then every example arm's calls.
fn names() -> Vec<String> {
    let mut names: Vec<String> = [
        "emitted/solve",
        "emitted/solve_branch",
        "emitted/solve_near",
        "emitted/forward",
        "interpreter/solve",
        "hand/solve_all",
        "hand/solve_one",
        "hand/forward",
        "hand-libm/solve_all",
        "hand-libm/solve_one",
        "hand-libm/forward",
        "numeric/dls_nearby",
        "numeric/dls_random",
        "numeric/starts_32",
        "libm/atan2",
        "libm/sqrt",
    ]
    .iter()
    .map(|n| format!("bench-elbow/{n}"))
    .collect();
    for arm in EMITTED_ARMS {
        for call in ["solve", "solve_branch", "solve_near", "forward"] {
            names.push(format!("{}/{call}", arm_name(arm.path)));
        }
    }
    names
}

fn arm_name(path: &str) -> &str {
    let file = path.rsplit('/').next().unwrap_or(path);
    file.strip_suffix(".toml").unwrap_or(file)
}

/// The bench arm's plan: its op counts and the interpreter.
fn plan() -> (OpCounts, OpCounts, Solver) {
    let generated = armforge_tests::emitted::bench_arm_generated();
    (
        generated.plan.op_counts(),
        generated.plan.branch_op_counts(),
        Solver::from_plan(generated.plan.clone()),
    )
}

/// The only code callgrind counts: `calls` runs of `f`.
#[inline(never)]
fn measure(calls: usize, mut f: impl FnMut(usize)) {
    for i in 0..calls {
        f(black_box(i));
    }
}

/// `CALLS` hand-written all-solution solves with the math library `M`.
fn hand_all<M: Math>(samples: &[Sample], out: &mut [[f64; JOINTS]; 8]) -> usize {
    measure(CALLS, |i| {
        black_box(hand::solve_all::<M>(&samples[i % samples.len()].pose, out));
    });
    CALLS
}

/// `CALLS` hand-written one-branch solves (each sample's own branch) with `M`.
fn hand_one<M: Math>(samples: &[Sample], branches: &[(bool, f64, f64)]) -> usize {
    measure(CALLS, |i| {
        let (back, e, w) = branches[i % samples.len()];
        black_box(hand::solve_one::<M>(
            &samples[i % samples.len()].pose,
            back,
            e,
            w,
        ));
    });
    CALLS
}

/// `CALLS` hand-written DH forwards with `M`.
fn hand_forward<M: Math>(samples: &[Sample]) -> usize {
    measure(CALLS, |i| {
        black_box(hand::forward::<M>(&samples[i % samples.len()].joints));
    });
    CALLS
}

fn run(name: &str) -> Option<usize> {
    let samples = reference::samples();
    let s = |i: usize| &samples[i % samples.len()];
    let (_, _, interpreter) = plan();
    let arm = reference::numeric_arm();
    let mut rng = StdRng::seed_from_u64(0x5eed);
    let seeds: Vec<[f64; JOINTS]> = (0..STARTS * SEARCH_CALLS + NUMERIC_CALLS)
        .map(|_| reference::random_joints(&mut rng))
        .collect();
    let hand_branches: Vec<(bool, f64, f64)> = samples
        .iter()
        .map(|x| reference::hand_branch(x).unwrap_or((false, 1.0, 1.0)))
        .collect();
    let mut found = Vec::with_capacity(STARTS);
    let mut out = [[0.0; JOINTS]; 8];
    let calls = match name.strip_prefix("bench-elbow/") {
        Some("emitted/solve") => {
            measure(CALLS, |i| {
                black_box(bench_elbow::solve(&s(i).pose));
            });
            CALLS
        }
        Some("emitted/solve_branch") => {
            measure(CALLS, |i| {
                let _ = black_box(bench_elbow::solve_branch(&s(i).pose, s(i).branch));
            });
            CALLS
        }
        Some("emitted/solve_near") => {
            measure(CALLS, |i| {
                let _ = black_box(bench_elbow::solve_near(&s(i).pose, &s(i).joints));
            });
            CALLS
        }
        Some("emitted/forward") => {
            measure(CALLS, |i| {
                black_box(bench_elbow::forward(&s(i).joints));
            });
            CALLS
        }
        Some("interpreter/solve") => {
            measure(CALLS, |i| {
                let _ = black_box(interpreter.solve(&s(i).pose));
            });
            CALLS
        }
        Some("hand/solve_all") => hand_all::<Platform>(&samples, &mut out),
        Some("hand/solve_one") => hand_one::<Platform>(&samples, &hand_branches),
        Some("hand/forward") => hand_forward::<Platform>(&samples),
        Some("hand-libm/solve_all") => hand_all::<LibmCrate>(&samples, &mut out),
        Some("hand-libm/solve_one") => hand_one::<LibmCrate>(&samples, &hand_branches),
        Some("hand-libm/forward") => hand_forward::<LibmCrate>(&samples),
        Some("numeric/dls_nearby") => {
            measure(NUMERIC_CALLS, |i| {
                let seed = reference::nearby_seed(&s(i).joints);
                black_box(numeric::dls(&arm, &s(i).pose, &seed));
            });
            NUMERIC_CALLS
        }
        Some("numeric/dls_random") => {
            measure(NUMERIC_CALLS, |i| {
                black_box(numeric::dls(&arm, &s(i).pose, &seeds[i]));
            });
            NUMERIC_CALLS
        }
        Some("numeric/starts_32") => {
            measure(SEARCH_CALLS, |i| {
                let seeds = &seeds[i * STARTS..(i + 1) * STARTS];
                black_box(numeric::random_starts(&arm, &s(i).pose, seeds, &mut found));
            });
            SEARCH_CALLS
        }
        Some("libm/atan2") => {
            measure(CALLS, |i| {
                let p = &s(i).pose;
                black_box(atan2(p.translation[1], p.translation[0]));
            });
            CALLS
        }
        Some("libm/sqrt") => {
            measure(CALLS, |i| {
                let p = &s(i).pose;
                black_box(sqrt(p.translation[1] * p.translation[1] + 1.0));
            });
            CALLS
        }
        _ => return run_example_arm(name, &samples),
    };
    Some(calls)
}

/// `ARM/CALL` for every example arm through its function pointers (poses from its own
/// forward kinematics).
fn run_example_arm(name: &str, _bench: &[Sample]) -> Option<usize> {
    let (arm_part, call) = name.rsplit_once('/')?;
    let arm = EMITTED_ARMS.iter().find(|a| arm_name(a.path) == arm_part)?;
    let joints = arm.random_joints(CALLS, 0xa11);
    let poses: Vec<_> = joints.iter().map(|q| (arm.forward)(q)).collect();
    let branches: Vec<_> = joints.iter().map(|q| (arm.branch_of)(q)).collect();
    match call {
        "solve" => measure(CALLS, |i| {
            black_box((arm.solve_count)(&poses[i]));
        }),
        "solve_branch" => measure(CALLS, |i| {
            let _ = black_box((arm.solve_branch)(&poses[i], branches[i]));
        }),
        "solve_near" => measure(CALLS, |i| {
            let _ = black_box((arm.solve_near)(&poses[i], &joints[i]));
        }),
        "forward" => measure(CALLS, |i| {
            black_box((arm.forward)(&joints[i]));
        }),
        _ => return None,
    }
    Some(CALLS)
}

/// The hand-written form against the emitted solver, and the numerical baselines' rates.
fn check() {
    let samples = reference::samples();
    let emitted_configurations = |x: &Sample| {
        let set = bench_elbow::solve(&x.pose);
        let arm = reference::numeric_arm();
        let mut distinct: Vec<[f64; JOINTS]> = Vec::new();
        for sol in set.iter() {
            if !distinct
                .iter()
                .any(|d| numeric::same_configuration(&arm, d, &sol.joints))
            {
                distinct.push(sol.joints);
            }
        }
        distinct
    };
    let mut worst: f64 = 0.0;
    let mut matched = 0;
    let mut emitted_total = 0;
    for x in &samples {
        let mut out = [[0.0; JOINTS]; 8];
        let n = hand::solve_all::<Platform>(&x.pose, &mut out);
        for q in &out[..n] {
            let p = bench_elbow::forward(q);
            let h = hand::forward::<Platform>(q);
            for r in 0..3 {
                worst = worst.max((p.translation[r] - x.pose.translation[r]).abs());
                worst = worst.max((h.translation[r] - p.translation[r]).abs());
                for c in 0..3 {
                    worst = worst.max((p.rotation[r][c] - x.pose.rotation[r][c]).abs());
                }
            }
        }
        matched += usize::from(reference::hand_branch(x).is_some());
        emitted_total += emitted_configurations(x).len();
    }
    println!("hand-written form: largest pose error of its solutions {worst:.1e}; own branch found for {matched} of {} samples", samples.len());
    let arm = reference::numeric_arm();
    let mut rng = StdRng::seed_from_u64(0x5eed);
    let trials = 64;
    let (mut near_ok, mut random_ok, mut found, mut expected) = (0, 0, 0, 0);
    let mut list = Vec::new();
    for x in samples.iter().take(trials) {
        near_ok +=
            usize::from(numeric::dls(&arm, &x.pose, &reference::nearby_seed(&x.joints)).is_some());
        let seed = reference::random_joints(&mut rng);
        random_ok += usize::from(numeric::dls(&arm, &x.pose, &seed).is_some());
    }
    for x in samples.iter().take(16) {
        let seeds: Vec<_> = (0..STARTS)
            .map(|_| reference::random_joints(&mut rng))
            .collect();
        found += numeric::random_starts(&arm, &x.pose, &seeds, &mut list);
        expected += emitted_configurations(x).len();
    }
    println!("damped least squares (tolerance {:e}, at most {} iterations): converged from a seed 0.05 rad away {near_ok}/{trials}, from a random seed {random_ok}/{trials}", numeric::TOLERANCE, numeric::MAX_ITERATIONS);
    println!("32 random starts: {found} of the {expected} distinct solutions of 16 poses ({:.0}%); emitted solve: {emitted_total} distinct solutions over {} poses", 100.0 * found as f64 / expected.max(1) as f64, samples.len());
}

/// Prints instructions per call and the ratios.
fn report(file: &str) {
    let text = std::fs::read_to_string(file).unwrap_or_default();
    let per_call = |name: &str| -> Option<f64> {
        text.lines().find_map(|l| {
            let mut f = l.split_whitespace();
            (f.next()? == name).then_some(())?;
            let ir: f64 = f.next()?.parse().ok()?;
            let calls: f64 = f.next()?.parse().ok()?;
            Some(ir / calls)
        })
    };
    let b = |n: &str| per_call(&format!("bench-elbow/{n}"));
    let (counts, branch, _) = plan();
    println!(
        "instructions per call (valgrind --tool=callgrind, collection inside the calls only)\n"
    );
    println!("| call | instructions |");
    println!("|---|---:|");
    for name in names() {
        if let Some(v) = per_call(&name) {
            println!("| {name} | {v:.0} |");
        }
    }
    let ratio = |a: Option<f64>, b: Option<f64>| match (a, b) {
        (Some(a), Some(b)) if b > 0.0 => format!("{:.2}×", a / b),
        _ => "n/a".to_string(),
    };
    let floor = match (b("libm/atan2"), b("libm/sqrt")) {
        (Some(a), Some(s)) => Some(counts.atan2 as f64 * a + counts.sqrt as f64 * s),
        _ => None,
    };
    println!(
        "\nbench-elbow plan: {} atan2 + {} sqrt per solve (transcendental floor {:.0} \
         instructions), at most {} atan2 + {} sqrt per solve_branch\n",
        counts.atan2,
        counts.sqrt,
        floor.unwrap_or(f64::NAN),
        branch.atan2,
        branch.sqrt
    );
    println!("| ratio | measured | target |");
    println!("|---|---:|---:|");
    let rows = [
        (
            "emitted solve / hand-written all solutions",
            ratio(b("emitted/solve"), b("hand/solve_all")),
            "≤ 1.0× (stretch 0.85×)",
        ),
        (
            "emitted solve / hand-written all solutions, libm crate",
            ratio(b("emitted/solve"), b("hand-libm/solve_all")),
            "",
        ),
        (
            "emitted solve_branch / hand-written one branch",
            ratio(b("emitted/solve_branch"), b("hand/solve_one")),
            "≤ 1.2×",
        ),
        (
            "emitted solve_near / hand-written one branch",
            ratio(b("emitted/solve_near"), b("hand/solve_one")),
            "≤ 1.5×",
        ),
        (
            "emitted solve_branch / hand-written one branch, libm crate",
            ratio(b("emitted/solve_branch"), b("hand-libm/solve_one")),
            "",
        ),
        (
            "emitted solve_near / hand-written one branch, libm crate",
            ratio(b("emitted/solve_near"), b("hand-libm/solve_one")),
            "",
        ),
        (
            "emitted forward / hand-written DH forward",
            ratio(b("emitted/forward"), b("hand/forward")),
            "≤ 1.0×",
        ),
        (
            "emitted forward / hand-written DH forward, libm crate",
            ratio(b("emitted/forward"), b("hand-libm/forward")),
            "",
        ),
        (
            "interpreter solve / emitted solve",
            ratio(b("interpreter/solve"), b("emitted/solve")),
            "≥ 5×",
        ),
        (
            "DLS from a nearby seed / emitted solve",
            ratio(b("numeric/dls_nearby"), b("emitted/solve")),
            "≥ 5×",
        ),
        (
            "DLS from a random seed / emitted solve",
            ratio(b("numeric/dls_random"), b("emitted/solve")),
            "",
        ),
        (
            "32 random starts / emitted solve",
            ratio(b("numeric/starts_32"), b("emitted/solve")),
            "≥ 500×",
        ),
        (
            "emitted solve / transcendental floor",
            ratio(b("emitted/solve"), floor),
            "",
        ),
    ];
    for (what, measured, target) in rows {
        println!("| {what} | {measured} | {target} |");
    }
}

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match args.first().map(String::as_str) {
        Some("--list") => names().iter().for_each(|n| println!("{n}")),
        Some("--report") => report(args.get(1).map(String::as_str).unwrap_or("")),
        Some("--check") => check(),
        // `cargo bench` passes `--bench`: list what there is, measure nothing.
        Some(name) if !name.starts_with("--") => match run(name) {
            Some(calls) => println!("calls {name} {calls}"),
            None => {
                eprintln!("unknown measurement {name}; see --list");
                std::process::exit(2);
            }
        },
        _ => check(),
    }
}
