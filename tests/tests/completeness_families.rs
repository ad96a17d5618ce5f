//! Completeness of the families without a wrist at joints 4–6 (three-parallel, wrist at the
//! base, mid-wrist, base-parallel) on random arms, against an independent numerical method: Levenberg–Marquardt (the
//! `levenberg-marquardt` crate, Moré's MINPACK algorithm: Moré, "The Levenberg–Marquardt
//! algorithm: implementation and theory", 1978) minimises the pose error of the arm's forward
//! kinematics (the product of exponentials evaluated with nalgebra's `Rotation3` and
//! `Isometry3`, independent of the runtime's) from random starts. Every configuration it
//! converges to (residual < 1e-10) must be among the interpreter's solutions, modulo whole
//! turns; the interpreter must list at least as many distinct solutions as it finds.
//!
//! 200 arms per family (× `ARMFORGE_SCALE`), 2 poses per arm, 8 starts per pose; the limits
//! of the sample arms are a full turn each way, so no solution is cut by a limit.

use std::f64::consts::TAU;

use armforge_compiler::classify::{classify, Family, Geometry, Tolerances};
use armforge_compiler::model::Model;
use armforge_compiler::plan::samples::{
    sample_arm, sample_base_parallel, sample_configuration, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::{Pose, JOINTS};
use armforge_tests::sample_count;
use levenberg_marquardt::{LeastSquaresProblem, LevenbergMarquardt};
use nalgebra::storage::Owned;
use nalgebra::{
    Isometry3, Point3, Rotation3, SMatrix, SVector, Translation3, Unit, Vector3, U12, U6,
};

const STARTS: usize = 8;
const POSES: usize = 2;
const CONVERGED: f64 = 1e-10;

/// Forward kinematics with nalgebra: `B · E1(m1) ⋯ E6(m6) · M`, `E(h, p, m)` the rotation by
/// `m` about the line through `p` along `h` (the product of exponentials, Murray, Li & Sastry
/// 1994, §3.2) for revolute joints, the translation by `m h` for slides; `m` the model value.
fn forward(model: &Model, q: &[f64]) -> Isometry3<f64> {
    let iso = |p: &Pose| {
        let r =
            Rotation3::from_matrix_unchecked(nalgebra::Matrix3::from_fn(|i, j| p.rotation[i][j]));
        Isometry3::from_parts(
            Translation3::from(Vector3::from(p.translation)),
            nalgebra::UnitQuaternion::from_rotation_matrix(&r),
        )
    };
    let mut t = iso(&model.base);
    for (j, &x) in model.joints.iter().zip(q) {
        let j = &j.joint;
        let m = j.model_value(x);
        let h = Vector3::from(j.axis).normalize();
        let motion = match j.kind {
            armforge_runtime::JointKind::Revolute => {
                let p = Point3::from(j.point);
                let r = nalgebra::UnitQuaternion::from_axis_angle(&Unit::new_normalize(h), m);
                // Rotation about the line through p: x ↦ p + R (x − p).
                let shift = p.coords - r * p.coords;
                Isometry3::from_parts(Translation3::from(shift), r)
            }
            armforge_runtime::JointKind::Prismatic => Isometry3::from_parts(
                Translation3::from(h * m),
                nalgebra::UnitQuaternion::identity(),
            ),
        };
        t *= motion;
    }
    t * iso(&model.tool)
}

struct InverseKinematics<'a> {
    model: &'a Model,
    target: Isometry3<f64>,
    size: f64,
    q: SVector<f64, 6>,
}

impl InverseKinematics<'_> {
    fn residuals_at(&self, q: &SVector<f64, 6>) -> SVector<f64, 12> {
        let t = forward(self.model, q.as_slice());
        let dp = (t.translation.vector - self.target.translation.vector) / self.size;
        let dr = t.rotation.to_rotation_matrix().into_inner()
            - self.target.rotation.to_rotation_matrix().into_inner();
        SVector::<f64, 12>::from_iterator(dp.iter().chain(dr.iter()).copied())
    }
}

impl LeastSquaresProblem<f64, U12, U6> for InverseKinematics<'_> {
    type ResidualStorage = Owned<f64, U12>;
    type JacobianStorage = Owned<f64, U12, U6>;
    type ParameterStorage = Owned<f64, U6>;

    fn set_params(&mut self, x: &SVector<f64, 6>) {
        self.q = *x;
    }

    fn params(&self) -> SVector<f64, 6> {
        self.q
    }

    fn residuals(&self) -> Option<SVector<f64, 12>> {
        Some(self.residuals_at(&self.q))
    }

    /// Central differences (step 1e-6).
    fn jacobian(&self) -> Option<SMatrix<f64, 12, 6>> {
        let h = 1e-6;
        let mut jacobian = SMatrix::<f64, 12, 6>::zeros();
        for j in 0..6 {
            let mut plus = self.q;
            let mut minus = self.q;
            plus[j] += h;
            minus[j] -= h;
            let column = (self.residuals_at(&plus) - self.residuals_at(&minus)) / (2.0 * h);
            jacobian.set_column(j, &column);
        }
        Some(jacobian)
    }
}

/// Same configuration, revolute joints modulo whole turns.
fn same(a: &[f64], b: &[f64], tol: f64) -> bool {
    a.iter().zip(b).all(|(x, y)| {
        let d = x - y;
        (d - TAU * (d / TAU).round()).abs() < tol
    })
}

fn pose_of(iso: &Isometry3<f64>) -> Pose {
    let r = iso.rotation.to_rotation_matrix();
    Pose {
        rotation: [0, 1, 2].map(|i| [0, 1, 2].map(|j| r[(i, j)])),
        translation: iso.translation.vector.into(),
    }
}

/// (distinct LM solutions, distinct interpreter solutions) over the random arms of `family`.
fn check_family(family: Family) -> (usize, usize) {
    check_arms(family, SampleOptions::default())
}

/// [`check_family`] for the random arms of `family` built with `options` (a full turn each
/// way on every revolute joint).
fn check_arms(family: Family, options: SampleOptions) -> (usize, usize) {
    let options = SampleOptions {
        revolute_range: TAU,
        ..options
    };
    check_models(family, |seed| sample_arm(family, seed, &options))
}

/// [`check_family`] for the arms `arm(seed)` (named `family` in messages).
fn check_models(family: Family, arm: impl Fn(u64) -> (Model, Geometry)) -> (usize, usize) {
    let (mut found_total, mut listed_total) = (0, 0);
    for seed in 0..sample_count(200) as u64 {
        let (model, geometry) = arm(seed);
        let solver = Solver::new(&model, &geometry);
        let size = solver.plan().arm.scale;
        let mut rng = SampleRng::new(seed * 13 + 1);
        for _ in 0..POSES {
            let q = sample_configuration(&model, &mut rng);
            let target = forward(&model, &q);
            let solutions = solver
                .solve(&pose_of(&target))
                .unwrap_or_else(|r| panic!("{family:?} arm {seed}: {q:?} unsolved: {r}"));
            let mut classes: Vec<[f64; JOINTS]> = Vec::new();
            for s in &solutions {
                if !classes.iter().any(|c| same(c, &s.joints, 1e-9)) {
                    classes.push(s.joints);
                }
            }
            let mut found: Vec<SVector<f64, 6>> = Vec::new();
            for _ in 0..STARTS {
                let start = sample_configuration(&model, &mut rng);
                let problem = InverseKinematics {
                    model: &model,
                    target,
                    size,
                    q: SVector::from(start),
                };
                let (problem, _) = LevenbergMarquardt::new().minimize(problem);
                if problem.residuals_at(&problem.q).norm() >= CONVERGED {
                    continue;
                }
                let x = problem.q;
                // Slides only within their limits (revolute joints have a full turn each way).
                let inside = model.joints.iter().zip(x.iter()).all(|(j, &v)| {
                    let [lo, hi] = j.joint.limits;
                    j.joint.kind == armforge_runtime::JointKind::Revolute
                        || (v >= lo - 1e-9 && v <= hi + 1e-9)
                });
                if !inside {
                    continue;
                }
                assert!(
                    classes.iter().any(|c| same(c, x.as_slice(), 1e-6)),
                    "{family:?} arm {seed}: Levenberg–Marquardt found {x:?} for the pose of \
                     {q:?}, which the solutions {classes:?} lack"
                );
                if !found.iter().any(|f| same(f.as_slice(), x.as_slice(), 1e-6)) {
                    found.push(x);
                }
            }
            assert!(found.len() <= classes.len());
            found_total += found.len();
            listed_total += classes.len();
        }
    }
    (found_total, listed_total)
}

#[test]
fn wrist_at_base_arms_miss_no_numerical_solution() {
    let (found, listed) = check_family(Family::BaseWrist);
    println!(
        "wrist at the base: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn mid_wrist_arms_miss_no_numerical_solution() {
    // Axes 5 and 6 apart, meeting and parallel by turns (the sampler's three layouts).
    let (found, listed) = check_family(Family::MidWrist);
    println!(
        "mid-wrist: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn three_parallel_arms_miss_no_numerical_solution() {
    let (found, listed) = check_family(Family::ThreeParallel);
    println!("three-parallel: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}");
    assert!(found > 0);
}

#[test]
fn base_parallel_arms_miss_no_numerical_solution() {
    // Axes 1–3 parallel; axes 5 and 6 apart, meeting and parallel by turns.
    let (found, listed) = check_family(Family::BaseParallel);
    println!(
        "base-parallel: Levenberg–Marquardt found {found} distinct solutions, armforge lists \
         {listed}"
    );
    assert!(found > 0);
}

#[test]
fn arms_with_axes_4_to_6_parallel_miss_no_numerical_solution() {
    // The mirror of a base-parallel arm, solved by the tool-first family through the
    // base-parallel family's target step.
    let options = SampleOptions {
        revolute_range: TAU,
        ..SampleOptions::default()
    };
    let (found, listed) = check_models(Family::ToolFirst, |seed| {
        let inner = sample_base_parallel(seed, &options);
        let mut model = armforge_compiler::family::mirror::mirrored_model(&inner);
        let mut rng = SampleRng::new(7300 + seed);
        model.tool = rng.pose(0.5);
        model.base = rng.pose(1.0);
        let geometry = classify(&model, &Tolerances::default()).expect("tool-first");
        (model, geometry)
    });
    println!(
        "axes 4–6 parallel: Levenberg–Marquardt found {found} distinct solutions, armforge lists \
         {listed}"
    );
    assert!(found > 0);
}

#[test]
fn offset_hand_arms_miss_no_numerical_solution() {
    // Axes 2–4 parallel, axes 5 and 6 apart (parallel on every third arm): the plane–line
    // quartic must list every solution Levenberg–Marquardt converges to.
    let (found, listed) = check_family(Family::OffsetHand);
    println!(
        "offset hand: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn tool_first_arms_miss_no_numerical_solution() {
    // Axes 3–5 parallel and axes 1 and 2 meeting, solved through the mirrored three-parallel
    // arm: every solution Levenberg–Marquardt converges to must be listed.
    let (found, listed) = check_family(Family::ToolFirst);
    println!(
        "tool-first: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn general_arms_miss_no_numerical_solution() {
    let (found, listed) = check_family(Family::General);
    println!(
        "general: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn general_arms_with_meeting_shoulder_axes_miss_no_numerical_solution() {
    let options = SampleOptions {
        shoulder_axes_meet: true,
        ..SampleOptions::default()
    };
    let (found, listed) = check_arms(Family::General, options);
    println!(
        "general, axes 1 and 2 meeting: Levenberg–Marquardt found {found} distinct solutions, \
         armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn general_arms_with_parallel_shoulder_axes_miss_no_numerical_solution() {
    let options = SampleOptions {
        shoulder_axes_parallel: true,
        ..SampleOptions::default()
    };
    let (found, listed) = check_arms(Family::General, options);
    println!(
        "general, axes 1 and 2 parallel: Levenberg–Marquardt found {found} distinct solutions, \
         armforge lists {listed}"
    );
    assert!(found > 0);
}

/// Base-parallel arms with axes 4 and 5 placed as `placement` says: (found, listed).
fn base_parallel_placed(
    placement: armforge_compiler::family::base_parallel::axes_4_5::Placement,
) -> (usize, usize) {
    let options = SampleOptions {
        revolute_range: TAU,
        ..SampleOptions::default()
    };
    check_models(Family::BaseParallel, |seed| {
        let model = armforge_compiler::plan::samples::sample_base_parallel_placed(
            seed, &options, placement,
        );
        let geometry = classify(&model, &Tolerances::default()).expect("base-parallel");
        (model, geometry)
    })
}

#[test]
fn base_parallel_arms_with_meeting_axes_4_and_5_miss_no_numerical_solution() {
    use armforge_compiler::family::base_parallel::axes_4_5::Placement;
    let (found, listed) = base_parallel_placed(Placement::Meeting);
    println!(
        "base-parallel, axes 4 and 5 meeting: Levenberg–Marquardt found {found} distinct \
         solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn base_parallel_arms_with_parallel_axes_4_and_5_miss_no_numerical_solution() {
    use armforge_compiler::family::base_parallel::axes_4_5::Placement;
    let (found, listed) = base_parallel_placed(Placement::Parallel);
    println!(
        "base-parallel, axes 4 and 5 parallel: Levenberg–Marquardt found {found} distinct \
         solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn carriage_arms_miss_no_numerical_solution() {
    // P P R: two slides and a turn (slides of ±3 m, well beyond the sampled poses' need).
    let (found, listed) = check_family(Family::Carriage);
    println!(
        "carriage: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn general_slide_arms_miss_no_numerical_solution() {
    // R R P with the slide not ⟂ axis 2: axes 1 and 2 apart (the quartic in the slide),
    // meeting and parallel.
    for (options, what) in [
        (SampleOptions::default(), "apart"),
        (
            SampleOptions {
                shoulder_axes_meet: true,
                ..SampleOptions::default()
            },
            "meeting",
        ),
        (
            SampleOptions {
                shoulder_axes_parallel: true,
                ..SampleOptions::default()
            },
            "parallel",
        ),
    ] {
        let (found, listed) = check_arms(Family::GeneralSlide, options);
        println!(
            "general-slide, axes 1 and 2 {what}: Levenberg–Marquardt found {found} distinct \
             solutions, armforge lists {listed}"
        );
        assert!(found > 0);
    }
}

#[test]
fn base_slide_arms_miss_no_numerical_solution() {
    // P R R with axes 2 and 3 skew: the slide's quartic must list every solution
    // Levenberg–Marquardt converges to within the slide's stroke.
    let (found, listed) = check_family(Family::BaseSlide);
    println!(
        "base-slide: Levenberg–Marquardt found {found} distinct solutions, armforge lists {listed}"
    );
    assert!(found > 0);
}

/// The middle-slide arms of one layout (even sampler seeds: the slide ⟂ axis 1; odd: tilted),
/// a full turn each way on every revolute joint.
fn check_middle_slide(level: bool) -> (usize, usize) {
    let options = SampleOptions {
        revolute_range: TAU,
        ..SampleOptions::default()
    };
    check_models(Family::MiddleSlide, |seed| {
        sample_arm(Family::MiddleSlide, 2 * seed + u64::from(!level), &options)
    })
}

#[test]
fn middle_slide_arms_with_a_tilted_slide_miss_no_numerical_solution() {
    // R P R, the slide not ⟂ axis 1: the quartic in joint 3 must list every solution
    // Levenberg–Marquardt converges to (within the slide's stroke).
    let (found, listed) = check_middle_slide(false);
    println!(
        "middle slide, tilted: Levenberg–Marquardt found {found} distinct solutions, armforge \
         lists {listed}"
    );
    assert!(found > 0);
}

#[test]
fn middle_slide_arms_with_a_level_slide_miss_no_numerical_solution() {
    // R P R, the slide ⟂ axis 1: joint 3 from the height, the slide from a quadratic.
    let (found, listed) = check_middle_slide(true);
    println!(
        "middle slide, level: Levenberg–Marquardt found {found} distinct solutions, armforge \
         lists {listed}"
    );
    assert!(found > 0);
}
