//! The emitted modules (compiled by `armforge_macros::solver!`) and the interpreter
//! (`armforge_compiler::solver::Solver` evaluating the same plan) agree to 1e-12 on 10,000
//! poses per example arm: half made by forward kinematics from random configurations
//! (reachable), half random rotations at random places in a box twice the arm's size
//! (mostly unreachable, so the reasons are compared too). `solve`, `solve_branch` and
//! `solve_near` are compared.

use armforge_compiler::classify::Tolerances;
use armforge_compiler::pipeline::generate_module;
use armforge_compiler::solver::Solver;
use armforge_runtime::{Pose, Solution, Unreachable, JOINTS};
use armforge_tests::emitted::{EmittedArm, EMITTED_ARMS};
use armforge_tests::sample_count;
use nalgebra::{Rotation3, Vector3};
use rand::rngs::StdRng;
use rand::{Rng, SeedableRng};

const TOLERANCE: f64 = 1e-12;

fn interpreter(arm: &EmittedArm) -> Solver {
    let generated = generate_module(&arm.file(), arm.path, &Tolerances::default())
        .unwrap_or_else(|e| panic!("{e}"));
    Solver::from_plan(generated.plan)
}

fn random_configuration(solver: &Solver, rng: &mut StdRng) -> [f64; JOINTS] {
    let mut q = [0.0; JOINTS];
    for (value, joint) in q.iter_mut().zip(solver.plan().arm.joints.iter()) {
        let [lo, hi] = joint.limits;
        let (lo, hi) = if lo.is_finite() && hi.is_finite() {
            (lo, hi)
        } else {
            (-1.0, 1.0)
        };
        *value = rng.random_range(lo..hi);
    }
    q
}

fn random_pose(size: f64, rng: &mut StdRng) -> Pose {
    let axis = Vector3::new(
        rng.random_range(-1.0..1.0),
        rng.random_range(-1.0..1.0),
        rng.random_range(-1.0..1.0),
    );
    let r = Rotation3::new(axis * rng.random_range(0.0..3.0));
    let mut rotation = [[0.0; 3]; 3];
    for (i, row) in rotation.iter_mut().enumerate() {
        for (j, x) in row.iter_mut().enumerate() {
            *x = r[(i, j)];
        }
    }
    let translation = [0, 1, 2].map(|_| rng.random_range(-2.0 * size..2.0 * size));
    Pose {
        rotation,
        translation,
    }
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= TOLERANCE * (1.0 + a.abs().max(b.abs()))
}

fn same_solution(a: &Solution, b: &Solution) -> bool {
    a.branch == b.branch
        && a.flags == b.flags
        && (0..JOINTS).all(|i| close(a.joints[i], b.joints[i]))
}

fn same_reason(a: &Unreachable, b: &Unreachable) -> bool {
    use armforge_runtime::PoseProblem::NotOrthonormal;
    match (a, b) {
        (Unreachable::BeyondReach { by: x }, Unreachable::BeyondReach { by: y })
        | (Unreachable::InsideHole { by: x }, Unreachable::InsideHole { by: y })
        | (Unreachable::WristOrientation { by: x }, Unreachable::WristOrientation { by: y }) => {
            close(*x, *y)
        }
        (
            Unreachable::OutsideLimits { joint: i, by: x },
            Unreachable::OutsideLimits { joint: j, by: y },
        ) => i == j && close(*x, *y),
        (
            Unreachable::InvalidPose(NotOrthonormal { error: x }),
            Unreachable::InvalidPose(NotOrthonormal { error: y }),
        ) => close(*x, *y),
        _ => a == b,
    }
}

fn same_single(a: &Result<Solution, Unreachable>, b: &Result<Solution, Unreachable>) -> bool {
    match (a, b) {
        (Ok(a), Ok(b)) => same_solution(a, b),
        (Err(a), Err(b)) => same_reason(a, b),
        _ => false,
    }
}

#[derive(Default)]
struct Tally {
    solved: usize,
    unreachable: usize,
}

fn compare(arm: &EmittedArm, solver: &Solver, target: &Pose, near: &[f64; JOINTS], t: &mut Tally) {
    let emitted = (arm.solve)(target);
    let interpreted = solver.solve(target);
    match (&emitted, &interpreted) {
        (Ok(e), Ok(i)) => {
            t.solved += 1;
            assert_eq!(e.len(), i.len(), "{}: {target:?}", arm.path);
            for (a, b) in e.iter().zip(i.iter()) {
                assert!(same_solution(a, b), "{}: {a:?} vs {b:?}", arm.path);
            }
            for s in e {
                let one = (arm.solve_branch)(target, s.branch);
                assert!(
                    same_single(&one, &solver.solve_branch(target, s.branch)),
                    "{}: solve_branch {:?}",
                    arm.path,
                    s.branch
                );
            }
        }
        (Err(e), Err(i)) => {
            t.unreachable += 1;
            assert!(same_reason(e, i), "{}: {e:?} vs {i:?}", arm.path);
        }
        _ => panic!(
            "{}: emitted {emitted:?}, interpreter {interpreted:?}",
            arm.path
        ),
    }
    assert!(
        same_single(
            &(arm.solve_near)(target, near),
            &solver.solve_near(target, near)
        ),
        "{}: solve_near",
        arm.path
    );
}

#[test]
fn emitted_modules_and_the_interpreter_agree_on_every_example_arm() {
    let poses = sample_count(10_000);
    for (k, arm) in EMITTED_ARMS.iter().enumerate() {
        let solver = interpreter(arm);
        let size = solver.plan().arm.scale;
        let mut rng = StdRng::seed_from_u64(0xa91ee + k as u64);
        let mut tally = Tally::default();
        for n in 0..poses {
            let q = random_configuration(&solver, &mut rng);
            let near = random_configuration(&solver, &mut rng);
            let target = if n % 2 == 0 {
                (arm.forward)(&q)
            } else {
                random_pose(size, &mut rng)
            };
            assert_eq!((arm.branch_of)(&q), solver.branch_of(&q));
            compare(arm, &solver, &target, &near, &mut tally);
        }
        println!(
            "{}: {} poses solved, {} unreachable, identical answers",
            arm.path, tally.solved, tally.unreachable
        );
        assert!(tally.solved >= poses / 2);
    }
}

#[test]
fn far_targets_get_the_reason_of_their_direction_with_a_finite_amount() {
    // Squares of translations beyond about 1e154 m overflow. A target D metres out misses by
    // D / 1e100 times what the same direction misses by at 1e100 m (beyond reach, or a slide's
    // limit): the arm's own lengths no longer matter there. Emitted modules and the
    // interpreter give the same answer.
    let directions = [[1.0, 0.3, 0.2], [-0.2, 1.0, 0.5], [0.1, -0.4, -1.0]];
    for arm in EMITTED_ARMS.iter() {
        let solver = interpreter(arm);
        for (k, d) in directions.iter().enumerate() {
            let at = |distance: f64| Pose {
                rotation: Pose::IDENTITY.rotation,
                translation: d.map(|x| x * distance),
            };
            let reference = solver.solve(&at(1e90)).expect_err("1e90 m is out of reach");
            for distance in [1e100, 1e150, 1e155, 1e156, 1e200, 1e300, 1e307] {
                let target = at(distance);
                let reason = solver.solve(&target).expect_err("far out of reach");
                assert_eq!(
                    std::mem::discriminant(&reason),
                    std::mem::discriminant(&reference),
                    "{} direction {k} at {distance:e}: {reason:?} vs {reference:?}",
                    arm.path
                );
                let (by, by_ref) = match (reason, reference) {
                    (Unreachable::BeyondReach { by }, Unreachable::BeyondReach { by: r }) => {
                        (by, r)
                    }
                    (
                        Unreachable::OutsideLimits { joint, by },
                        Unreachable::OutsideLimits { joint: j, by: r },
                    ) => {
                        assert_eq!(joint, j, "{} direction {k}", arm.path);
                        (by, r)
                    }
                    other => panic!("{}: {other:?}", arm.path),
                };
                assert!(by.is_finite(), "{} at {distance:e}: {reason:?}", arm.path);
                let ratio = (by / distance) / (by_ref / 1e90);
                assert!(
                    (ratio - 1.0).abs() < 1e-9,
                    "{} at {distance:e}: {ratio}",
                    arm.path
                );
                let emitted = (arm.solve)(&target);
                match &emitted {
                    Err(e) => assert!(same_reason(e, &reason), "{}: {e:?} vs {reason:?}", arm.path),
                    Ok(s) => panic!("{}: emitted solutions {s:?}", arm.path),
                }
                let near = [0.0; JOINTS];
                assert!(
                    same_single(
                        &(arm.solve_near)(&target, &near),
                        &solver.solve_near(&target, &near)
                    ),
                    "{}: solve_near",
                    arm.path
                );
            }
        }
    }
}
