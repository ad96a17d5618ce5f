//! Completeness against an independent numerical method: for poses of every example arm,
//! Levenberg–Marquardt (the `levenberg-marquardt` crate, an implementation of Moré's MINPACK
//! algorithm: Moré, "The Levenberg–Marquardt algorithm: implementation and theory", 1978)
//! minimises the pose error of the independent nalgebra forward kinematics
//! (`armforge_tests::ReferenceArm`) from many random starts. Every configuration it converges
//! to (residual norm < 1e-10) that lies within the joint limits (after whole turns) must be
//! among the solutions of the emitted solver.
//!
//! The test prints how many distinct solutions the numerical method found versus armforge;
//! it finds a subset (random starts miss some basins), and must never find more.
//!
//! Poses per arm: 300 in release builds, 20 in debug builds, times `ARMFORGE_SCALE`; 32 starts
//! per pose.

use std::f64::consts::TAU;

use armforge_runtime::{Joint, JointKind, Pose, JOINTS};
use armforge_tests::emitted::{EmittedArm, EMITTED_ARMS};
use armforge_tests::ReferenceArm;
use levenberg_marquardt::{LeastSquaresProblem, LevenbergMarquardt};
use nalgebra::storage::Owned;
use nalgebra::{Isometry3, SMatrix, SVector, U12, U6};
use rand::rngs::StdRng;
use rand::SeedableRng;

const STARTS: usize = 32;
const CONVERGED: f64 = 1e-10;

fn poses_per_arm() -> usize {
    armforge_tests::sample_count(if cfg!(debug_assertions) { 20 } else { 300 })
}

/// `T(q) = target` as least squares: the position error divided by the arm's size and the nine
/// rotation-matrix differences (12 residuals, 6 unknowns).
struct InverseKinematics<'a> {
    arm: &'a ReferenceArm,
    target: Isometry3<f64>,
    size: f64,
    q: SVector<f64, 6>,
}

impl InverseKinematics<'_> {
    fn residuals_at(&self, q: &SVector<f64, 6>) -> SVector<f64, 12> {
        let t = self.arm.forward(q.as_slice());
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

    /// Central differences (step 1e-6: truncation error ~1e-12, far below what convergence
    /// needs; the residual itself is always evaluated exactly).
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

/// The configuration moved into the limits by whole turns of its revolute joints, if it can be.
fn into_limits(joints: &[Joint; JOINTS], q: &SVector<f64, 6>) -> Option<[f64; JOINTS]> {
    let mut out = [0.0; JOINTS];
    for i in 0..JOINTS {
        let [lo, hi] = joints[i].limits;
        let mut v = q[i];
        if joints[i].kind == JointKind::Revolute {
            v -= TAU * ((v - lo) / TAU).floor();
        }
        if v < lo - 1e-9 || v > hi + 1e-9 {
            return None;
        }
        out[i] = v;
    }
    Some(out)
}

/// Same configuration, revolute joints compared modulo whole turns.
fn same(joints: &[Joint; JOINTS], a: &[f64; JOINTS], b: &[f64; JOINTS], tol: f64) -> bool {
    (0..JOINTS).all(|i| {
        let d = a[i] - b[i];
        let d = if joints[i].kind == JointKind::Revolute {
            d - TAU * (d / TAU).round()
        } else {
            d
        };
        d.abs() < tol
    })
}

fn pose_of(iso: &Isometry3<f64>) -> Pose {
    let r = iso.rotation.to_rotation_matrix();
    Pose {
        rotation: [0, 1, 2].map(|i| [0, 1, 2].map(|j| r[(i, j)])),
        translation: iso.translation.vector.into(),
    }
}

fn joint_table(arm: &EmittedArm) -> ([Joint; JOINTS], f64) {
    let generated = armforge_compiler::pipeline::generate_module(
        &arm.file(),
        arm.path,
        &armforge_compiler::classify::Tolerances::default(),
    )
    .unwrap_or_else(|e| panic!("{e}"));
    let mut joints = [generated.plan.arm.joints[0]; JOINTS];
    joints.copy_from_slice(&generated.plan.arm.joints);
    (joints, generated.plan.arm.scale)
}

/// (distinct solutions found by LM, distinct solutions of armforge modulo whole turns).
fn check_arm(arm: &EmittedArm, poses: usize, seed: u64) -> (usize, usize) {
    let reference = ReferenceArm::load(&arm.file());
    let (joints, size) = joint_table(arm);
    let mut rng = StdRng::seed_from_u64(seed);
    let (mut found_total, mut armforge_total) = (0, 0);
    for _ in 0..poses {
        let q = reference.random_within(&joints, &mut rng);
        let target = reference.forward(&q);
        let solutions = (arm.solve)(&pose_of(&target))
            .unwrap_or_else(|r| panic!("{}: {q:?} unsolved: {r}", arm.path));
        let mut classes: Vec<[f64; JOINTS]> = Vec::new();
        for s in &solutions {
            if !classes.iter().any(|c| same(&joints, c, &s.joints, 1e-9)) {
                classes.push(s.joints);
            }
        }
        armforge_total += classes.len();
        let mut found: Vec<[f64; JOINTS]> = Vec::new();
        for _ in 0..STARTS {
            let problem = InverseKinematics {
                arm: &reference,
                target,
                size,
                q: SVector::from(reference.random_within(&joints, &mut rng)),
            };
            let (problem, _report) = LevenbergMarquardt::new().minimize(problem);
            let residual = problem.residuals_at(&problem.q).norm();
            if residual >= CONVERGED {
                continue;
            }
            let Some(inside) = into_limits(&joints, &problem.q) else {
                continue;
            };
            assert!(
                solutions
                    .iter()
                    .any(|s| same(&joints, &s.joints, &inside, 1e-6)),
                "{}: Levenberg–Marquardt found {inside:?} (residual {residual:e}) for the pose \
                 of {q:?}, which armforge's solutions {solutions:#?} lack",
                arm.path
            );
            if !found.iter().any(|f| same(&joints, f, &inside, 1e-6)) {
                found.push(inside);
            }
        }
        assert!(found.len() <= classes.len());
        found_total += found.len();
    }
    (found_total, armforge_total)
}

#[test]
fn every_numerical_solution_is_among_armforges() {
    let poses = poses_per_arm();
    for (k, arm) in EMITTED_ARMS.iter().enumerate() {
        let (found, armforge) = check_arm(arm, poses, 0xc0de + k as u64);
        println!(
            "{}: {poses} poses × {STARTS} starts: Levenberg–Marquardt found {found} distinct \
             solutions within the limits, armforge lists {armforge} (modulo whole turns)",
            arm.path
        );
        assert!(
            found > 0,
            "{}: the numerical method found nothing",
            arm.path
        );
    }
}
