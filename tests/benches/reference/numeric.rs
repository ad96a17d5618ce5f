//! The numerical baselines: damped least squares on the geometric Jacobian (Wampler 1986;
//! Nakamura & Hanafusa 1986; Buss, "Introduction to inverse kinematics with Jacobian
//! transpose, pseudoinverse and damped least squares methods", 2004, §5), from one seed, and
//! "every solution by 32 random starts".

use armforge_runtime::{joint_motion, Joint, Pose, JOINTS};
use nalgebra::{Matrix6, Vector6};

/// Converged when the pose error (metres and radians, Euclidean) is below this.
pub const TOLERANCE: f64 = 1e-10;
/// At most this many iterations.
pub const MAX_ITERATIONS: usize = 100;
/// Damping factor λ of `Δq = Jᵀ (J Jᵀ + λ² I)⁻¹ e` (common practice: small against the
/// arm's singular values, so convergence stays quadratic away from singularities).
const DAMPING: f64 = 1e-3;

/// The arm a baseline works on: its joint table, base and tool.
#[derive(Clone, Copy)]
pub struct Arm {
    /// Joints in the base frame at zero.
    pub joints: &'static [Joint; JOINTS],
    /// Base in the world.
    pub base: Pose,
    /// Tool at zero, in the base frame.
    pub tool: Pose,
}

/// The tool pose and the geometric Jacobian (linear rows first) at `q`.
fn pose_and_jacobian(arm: &Arm, q: &[f64; JOINTS]) -> (Pose, Matrix6<f64>) {
    let mut frames = [Pose::IDENTITY; JOINTS];
    let mut t = arm.base;
    for i in 0..JOINTS {
        frames[i] = t;
        t = t.compose(&joint_motion(&arm.joints[i], q[i]));
    }
    let tool = t.compose(&arm.tool);
    let mut jac = Matrix6::zeros();
    for (i, (joint, frame)) in arm.joints.iter().zip(frames.iter()).enumerate() {
        let w = frame.rotate(&joint.axis);
        let w = [
            w[0] * joint.direction,
            w[1] * joint.direction,
            w[2] * joint.direction,
        ];
        let column = match joint.kind {
            armforge_runtime::JointKind::Revolute => {
                let p = frames[i].transform_point(&joint.point);
                let r = [
                    tool.translation[0] - p[0],
                    tool.translation[1] - p[1],
                    tool.translation[2] - p[2],
                ];
                let v = [
                    w[1] * r[2] - w[2] * r[1],
                    w[2] * r[0] - w[0] * r[2],
                    w[0] * r[1] - w[1] * r[0],
                ];
                Vector6::new(v[0], v[1], v[2], w[0], w[1], w[2])
            }
            armforge_runtime::JointKind::Prismatic => Vector6::new(w[0], w[1], w[2], 0.0, 0.0, 0.0),
        };
        jac.set_column(i, &column);
    }
    (tool, jac)
}

/// Position error and orientation error `½ Σ r_k × r*_k` (columns; Siciliano et al.,
/// Robotics: Modelling, Planning and Control, 2009, §3.7.3).
fn error(current: &Pose, target: &Pose) -> Vector6<f64> {
    let (a, b) = (&current.rotation, &target.rotation);
    let mut o = [0.0; 3];
    for k in 0..3 {
        let (x, y) = ([a[0][k], a[1][k], a[2][k]], [b[0][k], b[1][k], b[2][k]]);
        o[0] += 0.5 * (x[1] * y[2] - x[2] * y[1]);
        o[1] += 0.5 * (x[2] * y[0] - x[0] * y[2]);
        o[2] += 0.5 * (x[0] * y[1] - x[1] * y[0]);
    }
    let (p, t) = (&current.translation, &target.translation);
    Vector6::new(t[0] - p[0], t[1] - p[1], t[2] - p[2], o[0], o[1], o[2])
}

/// Damped least squares from `seed`: the joint values when it converged.
#[inline(never)]
pub fn dls(arm: &Arm, target: &Pose, seed: &[f64; JOINTS]) -> Option<[f64; JOINTS]> {
    let mut q = *seed;
    for _ in 0..MAX_ITERATIONS {
        let (pose, jac) = pose_and_jacobian(arm, &q);
        let e = error(&pose, target);
        if e.norm() < TOLERANCE {
            return Some(q);
        }
        let jjt = jac * jac.transpose() + Matrix6::identity() * (DAMPING * DAMPING);
        let y = jjt.cholesky()?.solve(&e);
        let dq = jac.transpose() * y;
        for (v, d) in q.iter_mut().zip(dq.iter()) {
            *v += d;
        }
    }
    None
}

/// `q` wrapped into the joints' limits by whole turns where possible; `None` when a joint
/// stays outside them.
pub fn within_limits(arm: &Arm, q: &[f64; JOINTS]) -> Option<[f64; JOINTS]> {
    let mut out = *q;
    for (v, j) in out.iter_mut().zip(arm.joints.iter()) {
        let [lo, hi] = j.limits;
        if j.kind == armforge_runtime::JointKind::Revolute {
            let tau = std::f64::consts::TAU;
            *v -= tau * ((*v - lo) / tau).floor();
        }
        if *v < lo - 1e-9 || *v > hi + 1e-9 {
            return None;
        }
    }
    Some(out)
}

/// True when two configurations are one (modulo whole turns of revolute joints).
pub fn same_configuration(arm: &Arm, a: &[f64; JOINTS], b: &[f64; JOINTS]) -> bool {
    a.iter()
        .zip(b.iter())
        .zip(arm.joints.iter())
        .all(|((x, y), j)| {
            let d = x - y;
            let d = if j.kind == armforge_runtime::JointKind::Revolute {
                let tau = std::f64::consts::TAU;
                d - tau * (d / tau).round()
            } else {
                d
            };
            d.abs() < 1e-6
        })
}

/// "Every solution" by damped least squares from `seeds`: the distinct configurations found
/// within the limits, written into `found`; returns how many.
#[inline(never)]
pub fn random_starts(
    arm: &Arm,
    target: &Pose,
    seeds: &[[f64; JOINTS]],
    found: &mut Vec<[f64; JOINTS]>,
) -> usize {
    found.clear();
    for seed in seeds {
        let Some(q) = dls(arm, target, seed).and_then(|q| within_limits(arm, &q)) else {
            continue;
        };
        if !found.iter().any(|f| same_configuration(arm, f, &q)) {
            found.push(q);
        }
    }
    found.len()
}
