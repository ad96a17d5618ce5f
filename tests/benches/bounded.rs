//! Bounded time: the instructions of every single call of `solve`, `solve_branch` and
//! `solve_near`, for every example arm in `f64` and `f32`, over poses of six classes, for
//! `valgrind --tool=callgrind`. Run it through `tests/benches/bounded.sh`, which collects only
//! inside [`measure_one`] and dumps the count after each call (`--dump-after`), then calls
//! `--report` on the per-call counts.
//!
//! - `bounded --list`: one line per measured call, in call order (`SCALAR ARM CALL CLASS`);
//! - `bounded --run`: makes every call once, in that order;
//! - `bounded --run-one N`: makes only the `N`-th call (1-based, the line of `--list`), to see
//!   where one call's instructions go (`valgrind --tool=callgrind` and `callgrind_annotate`);
//! - `bounded --dump`: every call's result, to compare two builds;
//! - `bounded --stack`: the deepest stack each call reached, per arm, call and scalar, by
//!   stack painting (see [`stack_depth`]);
//! - `bounded --report FILE`: reads `SCALAR ARM CALL CLASS INSTRUCTIONS` lines and prints the
//!   median and the worst per arm, call and scalar, the worst's class, and the ratio against
//!   the target (worst ≤ 1.3 × median).
//!
//! The classes: `random` (uniform within the limits), `aligned` (joint 5 exactly at either
//! aligned position, or within 1e-12 … 1e-3 rad of one), `axis-1` (the wrist center within
//! 1e-12 … 1e-3 of the arm's size from axis 1), `boundary` (within 1e-12 … 1e-6 inside a reach
//! boundary), `unreachable` (a random pose moved three arm sizes outward) and `nan` (a random
//! pose with one NaN entry). The singular and boundary samples come from `armforge verify`'s
//! sampler (`armforge_workbench::verify::sampler`).

use std::collections::BTreeMap;
use std::hint::black_box;

use armforge_compiler::classify::{classify, Tolerances};
use armforge_compiler::pipeline::load_model;
use armforge_runtime::{Joint, Pose, JOINTS};
use armforge_tests::emitted::{EmittedArm, EMITTED_ARMS, EMITTED_ARMS_F32};
use armforge_workbench::verify::sampler::{Kind, Sampler};

/// Poses per class and arm.
const PER_CLASS: u64 = 16;
/// The target of issue 10: worst ≤ 1.3 × median for each call.
const TARGET: f64 = 1.3;
const CALLS: [&str; 3] = ["solve", "solve_branch", "solve_near"];

/// One pose to solve: its class, the configuration it was made from (the `current` of
/// `solve_near`, whose branch is `solve_branch`'s) and how to spoil the pose (class
/// `unreachable` or `nan`).
struct Case {
    class: &'static str,
    joints: [f64; JOINTS],
    spoil: Spoil,
}

#[derive(Clone, Copy)]
enum Spoil {
    None,
    Outward(f64),
    Nan(usize),
}

/// The only code callgrind counts: one call. The fence after it keeps the call a call (not a
/// tail jump), so that callgrind sees `measure_one` return and dumps the count.
#[inline(never)]
fn measure_one(f: &dyn Fn()) {
    f();
    std::sync::atomic::compiler_fence(std::sync::atomic::Ordering::SeqCst);
}

fn arm_name(path: &str) -> &str {
    let file = path.rsplit('/').next().unwrap_or(path);
    file.strip_suffix(".toml").unwrap_or(file)
}

/// The cases of one arm: `PER_CLASS` of each class.
fn cases(arm: &EmittedArm) -> Vec<Case> {
    let model = load_model(&arm.file(), arm.path).unwrap_or_else(|e| panic!("{e}"));
    let geometry = classify(&model, &Tolerances::default()).unwrap_or_else(|r| panic!("{r}"));
    let joints: [Joint; JOINTS] = model
        .runtime_joints()
        .try_into()
        .unwrap_or_else(|_| panic!("six joints"));
    let size = geometry.resolved.arm_size;
    let sampler = Sampler::new(joints, &geometry, 7);
    let aligned: Vec<f64> = geometry
        .wrist
        .as_ref()
        .map(|w| {
            w.aligned_at
                .iter()
                .map(|&m| joints[4].joint_value(m))
                .collect()
        })
        .unwrap_or_default();
    let mut out = Vec::new();
    let mut index = 0;
    let mut draw =
        |kind: Kind, class: &'static str, out: &mut Vec<Case>, spoil: fn(u64) -> Spoil| {
            if kind != Kind::WithinLimits && !sampler.applies(kind) {
                return;
            }
            let mut made = 0;
            while made < PER_CLASS && index < 100_000 {
                index += 1;
                let Some(s) = sampler.sample(index, kind) else {
                    continue;
                };
                let mut q = s.joints;
                if class == "aligned" && made % 2 == 0 {
                    // Exactly aligned, at either aligned position in turn.
                    if let Some(&a) = aligned.get((made as usize / 2) % aligned.len().max(1)) {
                        let turns = ((q[4] - a) / std::f64::consts::TAU).round();
                        let v = a + std::f64::consts::TAU * turns;
                        if v >= joints[4].limits[0] && v <= joints[4].limits[1] {
                            q[4] = v;
                        }
                    }
                }
                out.push(Case {
                    class,
                    joints: q,
                    spoil: spoil(made),
                });
                made += 1;
            }
        };
    draw(Kind::WithinLimits, "random", &mut out, |_| Spoil::None);
    draw(Kind::WristNearAligned, "aligned", &mut out, |_| Spoil::None);
    draw(Kind::NearAxis1, "axis-1", &mut out, |_| Spoil::None);
    draw(Kind::ReachBoundary, "boundary", &mut out, |_| Spoil::None);
    draw(Kind::WithinLimits, "unreachable", &mut out, |_| {
        Spoil::Outward(3.0)
    });
    draw(Kind::WithinLimits, "nan", &mut out, |k| {
        Spoil::Nan(k as usize % 12)
    });
    for c in out.iter_mut() {
        if let Spoil::Outward(k) = c.spoil {
            c.spoil = Spoil::Outward(k * size);
        }
    }
    out
}

/// The pose of a case in the scalar of `forward`.
fn pose_of<S: armforge_runtime::Scalar>(forward: fn(&[S; JOINTS]) -> Pose<S>, c: &Case) -> Pose<S> {
    let mut p = forward(&c.joints.map(S::of));
    match c.spoil {
        Spoil::None => {}
        Spoil::Outward(by) => {
            let t = p.translation;
            let norm = t
                .iter()
                .map(|x| x.to_f64() * x.to_f64())
                .sum::<f64>()
                .sqrt()
                .max(1e-9);
            p.translation = t.map(|x| S::of(x.to_f64() * (1.0 + by / norm)));
        }
        Spoil::Nan(k) => {
            if k < 9 {
                p.rotation[k / 3][k % 3] = S::NAN;
            } else {
                p.translation[k - 9] = S::NAN;
            }
        }
    }
    p
}

/// Every call, in order: `(label, call)`.
fn each_call<S: armforge_runtime::Scalar>(
    scalar: &str,
    arms: &[EmittedArm<S>],
    mut visit: impl FnMut(String, &dyn Fn()),
) {
    for (arm, arm64) in arms.iter().zip(EMITTED_ARMS) {
        let name = arm_name(arm.path);
        let cases = cases(arm64);
        for call in CALLS {
            for c in &cases {
                let pose = pose_of(arm.forward, c);
                let q = c.joints.map(S::of);
                let branch = (arm.branch_of)(&q);
                let label = format!("{scalar} {name} {call} {}", c.class);
                match call {
                    "solve" => visit(label, &|| {
                        black_box((arm.solve_count)(black_box(&pose)));
                    }),
                    "solve_branch" => visit(label, &|| {
                        let _ = black_box((arm.solve_branch)(black_box(&pose), branch));
                    }),
                    _ => visit(label, &|| {
                        let _ = black_box((arm.solve_near)(black_box(&pose), &q));
                    }),
                }
            }
        }
    }
}

/// Every call's result (`Debug`), one line each: to check that a change to the solve paths
/// keeps their answers (compare the output of two builds).
fn dump_all() {
    fn one<S: armforge_runtime::Scalar>(scalar: &str, arms: &[EmittedArm<S>]) {
        for (arm, arm64) in arms.iter().zip(EMITTED_ARMS) {
            for c in &cases(arm64) {
                let pose = pose_of(arm.forward, c);
                let q = c.joints.map(S::of);
                let branch = (arm.branch_of)(&q);
                println!(
                    "{scalar} {} {} solve {:?}",
                    arm.path,
                    c.class,
                    (arm.solve)(&pose)
                );
                println!(
                    "{scalar} {} {} branch {:?}",
                    arm.path,
                    c.class,
                    (arm.solve_branch)(&pose, branch)
                );
                println!(
                    "{scalar} {} {} near {:?}",
                    arm.path,
                    c.class,
                    (arm.solve_near)(&pose, &q)
                );
            }
        }
    }
    one("f64", EMITTED_ARMS);
    one("f32", EMITTED_ARMS_F32);
}

fn all_calls(mut visit: impl FnMut(String, &dyn Fn())) {
    each_call("f64", EMITTED_ARMS, &mut visit);
    each_call("f32", EMITTED_ARMS_F32, &mut visit);
}

/// Bytes of stack painted below the caller's frame: far more than any solve call uses.
const PAINTED: usize = 64 * 1024;
const PAINT: u8 = 0xA5;

/// Fills `PAINTED` bytes of stack with `PAINT` in a frame of its own and returns the
/// address of their low end.
#[inline(never)]
fn paint() -> usize {
    let mut area = [PAINT; PAINTED];
    black_box(&mut area);
    area.as_ptr() as usize
}

/// How many bytes below `top` are no longer `PAINT` (reads the stack below its own frame).
#[inline(never)]
fn overwritten(low: usize, top: usize) -> usize {
    let mut depth = 0;
    for address in low..top {
        // SAFETY: the bytes lie in this thread's stack, below the caller's frame and above
        // the lowest frame `paint` made, so they are mapped; they hold whatever the measured
        // call left there, read as plain bytes. A measurement tool, never run in a product.
        let byte = unsafe { std::ptr::read_volatile(address as *const u8) };
        if byte != PAINT {
            depth = top - address;
            break;
        }
    }
    depth
}

/// Stack painting: paints the stack below this frame, makes the call from the same frame
/// depth, and reports how deep it overwrote the paint. The count includes `measure_one`'s and
/// the closure's small frames (and is an upper bound of the call's own use by those few tens
/// of bytes); it misses bytes a call reserves but never writes, which the optimised solve
/// paths do not leave (every local they reserve, they write).
#[inline(never)]
fn stack_depth(f: &dyn Fn()) -> usize {
    let low = paint();
    let top = low + PAINTED;
    measure_one(f);
    overwritten(low, top)
}

/// The deepest stack per arm, call and scalar.
fn stack() {
    let mut deepest: BTreeMap<String, usize> = BTreeMap::new();
    // A thread of its own: the same starting depth for every call.
    std::thread::spawn(move || {
        all_calls(|label, f| {
            let key: Vec<&str> = label.split_whitespace().take(3).collect();
            let d = stack_depth(f);
            let entry = deepest.entry(key.join(" ")).or_default();
            *entry = (*entry).max(d);
        });
        println!("deepest stack per call (stack painting, bytes; SCALAR ARM CALL)");
        for (k, d) in &deepest {
            println!("{k} {d}");
        }
    })
    .join()
    .unwrap_or_else(|_| panic!("stack thread"));
}

/// The median of sorted values.
fn median(sorted: &[f64]) -> f64 {
    let n = sorted.len();
    if n == 0 {
        return f64::NAN;
    }
    if n % 2 == 1 {
        sorted[n / 2]
    } else {
        0.5 * (sorted[n / 2 - 1] + sorted[n / 2])
    }
}

/// Median and worst per arm, call and scalar.
fn report(file: &str) {
    let text = std::fs::read_to_string(file).unwrap_or_default();
    // (arm, call, scalar) → [(instructions, class)]
    let mut groups: BTreeMap<(String, String, String), Vec<(f64, String)>> = BTreeMap::new();
    for line in text.lines() {
        let f: Vec<&str> = line.split_whitespace().collect();
        let [scalar, arm, call, class, ir] = f[..] else {
            continue;
        };
        let Ok(ir) = ir.parse::<f64>() else { continue };
        groups
            .entry((arm.to_string(), call.to_string(), scalar.to_string()))
            .or_default()
            .push((ir, class.to_string()));
    }
    println!("instructions per call (valgrind --tool=callgrind, one dump per call; {PER_CLASS} poses per class)\n");
    println!("| arm | call | scalar | median | worst | worst / median | worst class | median per class (random / aligned / axis-1 / boundary / unreachable / nan) |");
    println!("|---|---|---|---:|---:|---:|---|---|");
    let mut missed = 0;
    for ((arm, call, scalar), v) in &groups {
        let mut all: Vec<f64> = v.iter().map(|x| x.0).collect();
        all.sort_by(f64::total_cmp);
        let (med, worst) = (median(&all), all.last().copied().unwrap_or(f64::NAN));
        let worst_class = v
            .iter()
            .max_by(|a, b| a.0.total_cmp(&b.0))
            .map_or("", |x| x.1.as_str());
        let per_class: Vec<String> = [
            "random",
            "aligned",
            "axis-1",
            "boundary",
            "unreachable",
            "nan",
        ]
        .iter()
        .map(|k| {
            let mut c: Vec<f64> = v.iter().filter(|x| x.1 == *k).map(|x| x.0).collect();
            c.sort_by(f64::total_cmp);
            if c.is_empty() {
                "–".to_string()
            } else {
                format!("{:.0}", median(&c))
            }
        })
        .collect();
        let ratio = worst / med;
        missed += usize::from(ratio > TARGET);
        println!(
            "| {arm} | {call} | {scalar} | {med:.0} | {worst:.0} | {ratio:.2}× | {worst_class} | {} |",
            per_class.join(" / ")
        );
    }
    println!(
        "\n{missed} of {} rows above the target worst ≤ {TARGET} × median",
        groups.len()
    );
}

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    match args.first().map(String::as_str) {
        Some("--list") => all_calls(|label, _| println!("{label}")),
        Some("--run") => all_calls(|_, f| measure_one(f)),
        Some("--dump") => dump_all(),
        Some("--run-one") => {
            let wanted: usize = args.get(1).and_then(|n| n.parse().ok()).unwrap_or(0);
            let mut n = 0;
            all_calls(|_, f| {
                n += 1;
                if n == wanted {
                    measure_one(f);
                }
            });
        }
        Some("--stack") => stack(),
        Some("--report") => report(args.get(1).map(String::as_str).unwrap_or("")),
        // `cargo bench` passes `--bench`: list how many calls there are, measure nothing.
        _ => {
            let mut n = 0;
            all_calls(|_, _| n += 1);
            println!("{n} calls; run tests/benches/bounded.sh to count their instructions");
        }
    }
}
