//! A plain hand-written closed form of the bench elbow arm (`arms/bench-elbow-dh.toml`): what
//! a careful engineer would write for this one arm with libm `atan2`/`sqrt`, constants typed
//! in, branch-free wrapping, no limits and no labels. The emitted solver must beat it.
//!
//! The arm in standard DH (Craig, Introduction to Robotics, 3rd ed., §3.4 uses the modified
//! form; the standard form `Rz(θ)·Tz(d)·Tx(a)·Rx(α)` is Spong, Hutchinson & Vidyasagar,
//! Robot Modeling and Control, 2006, §3.2):
//! joint 1 `d = 0.45, a = 0.12, α = −90°`; joint 2 `a = 0.4, θ offset −90°`;
//! joint 3 `a = 0.075, α = −90°`; joint 4 `d = 0.38, α = 90°`; joint 5 `α = −90°`;
//! joint 6 `d = 0.09`; tool 0.12 m along the flange's z.
//!
//! The solve is kinematic decoupling (Pieper 1968): the wrist center, joint 1 from its
//! azimuth, joints 2–3 by the law of cosines in the arm's plane, joints 4–6 from
//! `R36 = R03ᵀ R = Rz(θ4) Ry(−θ5) Rz(θ6)` (a Z-Y-Z Euler form, Spong et al. §2.5.1).
//!
//! Every function takes the math library as a type ([`Math`]): the platform's (`f64::atan2`,
//! glibc on the bench machine) or the `libm` crate's, which armforge's runtime calls; the
//! benchmarks compare the emitted solver with both.

use std::f64::consts::{FRAC_PI_2, PI, TAU};

use armforge_runtime::Pose;

const D1: f64 = 0.45;
const A1: f64 = 0.12;
const A2: f64 = 0.4;
const A3: f64 = 0.075;
const D4: f64 = 0.38;
const D6: f64 = 0.09;
const TOOL: f64 = 0.12;
/// `θ2 = q2 − 90°`.
const OFFSET2: f64 = -FRAC_PI_2;
/// The forearm as one link from joint 3 to the wrist center: length and angle.
const L: f64 = 0.387_330_608_137_286_26; // √(0.075² + 0.38²)
const PHI: f64 = 1.375_932_407_106_024_6; // atan2(0.38, 0.075)
/// The centers of the joint ranges (radians), to wrap into.
const CENTER: [f64; 6] = [
    0.0,
    0.349_065_850_398_865_9,
    -0.741_764_932_097_590_1,
    0.0,
    0.0,
    0.0,
];

/// The transcendental functions the hand-written form calls.
pub trait Math {
    /// `atan2(y, x)`.
    fn atan2(y: f64, x: f64) -> f64;
    /// `(sin x, cos x)`.
    fn sin_cos(x: f64) -> (f64, f64);
}

/// The platform's math library through `std` (glibc on the bench machine).
pub struct Platform;

impl Math for Platform {
    #[inline(always)]
    fn atan2(y: f64, x: f64) -> f64 {
        y.atan2(x)
    }
    #[inline(always)]
    fn sin_cos(x: f64) -> (f64, f64) {
        x.sin_cos()
    }
}

/// The `libm` crate (a port of musl's), which armforge's runtime calls.
pub struct LibmCrate;

impl Math for LibmCrate {
    #[inline(always)]
    fn atan2(y: f64, x: f64) -> f64 {
        libm::atan2(y, x)
    }
    #[inline(always)]
    fn sin_cos(x: f64) -> (f64, f64) {
        libm::sincos(x)
    }
}

/// `x` wrapped by whole turns into `[center − π, center + π]`, branch-free (adding and
/// subtracting `1.5·2^52` rounds to the nearest whole number).
#[inline(always)]
fn wrap(x: f64, center: f64) -> f64 {
    const ROUNDER: f64 = 6_755_399_441_055_744.0;
    let turns = ((x - center) * (1.0 / TAU) + ROUNDER) - ROUNDER;
    x - TAU * turns
}

/// The wrist center for a target.
#[inline(always)]
fn wrist_center(t: &Pose) -> [f64; 3] {
    let r = &t.rotation;
    let k = D6 + TOOL;
    [
        t.translation[0] - k * r[0][2],
        t.translation[1] - k * r[1][2],
        t.translation[2] - k * r[2][2],
    ]
}

/// Joints 2–3 of one shoulder for one elbow sign, from the wrist center in the arm's plane:
/// `x` along the upper arm's zero direction, `y` the other in-plane axis.
#[inline(always)]
fn elbow<M: Math>(x: f64, y: f64, sign: f64) -> Option<(f64, f64)> {
    let d = (x * x + y * y - A2 * A2 - L * L) / (2.0 * A2 * L);
    if !(-1.0..=1.0).contains(&d) {
        return None;
    }
    let psi = M::atan2(sign * (1.0 - d * d).sqrt(), d);
    let (sin_psi, cos_psi) = M::sin_cos(psi);
    let theta2 = M::atan2(y, x) - M::atan2(L * sin_psi, A2 + L * cos_psi);
    Some((theta2, psi - PHI))
}

/// Joints 4–6 for one wrist sign, given joints 1–3 (DH angles).
#[inline(always)]
fn wrist<M: Math>(t: &Pose, c1: f64, s1: f64, theta23: f64, sign: f64) -> [f64; 3] {
    let (s, c) = M::sin_cos(theta23);
    let r = &t.rotation;
    // Columns of R03 (see the module doc): R03 = [[c1 c, s1, −c1 s], [s1 c, −c1, −s1 s], [−s, 0, −c]].
    let col0 = [c1 * c, s1 * c, -s];
    let col1 = [s1, -c1, 0.0];
    let col2 = [-c1 * s, -s1 * s, -c];
    let dot = |a: &[f64; 3], j: usize| a[0] * r[0][j] + a[1] * r[1][j] + a[2] * r[2][j];
    let (r13, r23, r33) = (dot(&col0, 2), dot(&col1, 2), dot(&col2, 2));
    let (r31, r32) = (dot(&col2, 0), dot(&col2, 1));
    let s5 = sign * (r13 * r13 + r23 * r23).sqrt();
    let theta5 = M::atan2(s5, r33);
    let theta4 = M::atan2(-sign * r23, -sign * r13);
    let theta6 = M::atan2(-sign * r32, sign * r31);
    [theta4, theta5, theta6]
}

/// Joint values from DH angles (joint 2's offset) wrapped into the ranges.
#[inline(always)]
fn joint_values(t: [f64; 6]) -> [f64; 6] {
    let mut q = t;
    q[1] -= OFFSET2;
    for (v, c) in q.iter_mut().zip(CENTER) {
        *v = wrap(*v, c);
    }
    q
}

/// Every solution (up to 8: 2 shoulders × 2 elbows × 2 wrists); returns how many were written.
/// The second wrist solution is `(θ4 + π, −θ5, θ6 + π)` (no extra call).
#[inline(never)]
pub fn solve_all<M: Math>(t: &Pose, out: &mut [[f64; 6]; 8]) -> usize {
    let p = wrist_center(t);
    let rho = (p[0] * p[0] + p[1] * p[1]).sqrt();
    if rho < 1e-12 {
        return 0;
    }
    let theta1 = M::atan2(p[1], p[0]);
    let (c1, s1) = (p[0] / rho, p[1] / rho);
    let u = p[2] - D1;
    let mut n = 0;
    for (t1, c, s, r) in [
        (theta1, c1, s1, rho - A1),
        (theta1 + PI, -c1, -s1, -rho - A1),
    ] {
        for sign in [1.0, -1.0] {
            let Some((t2, t3)) = elbow::<M>(r, -u, sign) else {
                continue;
            };
            let [t4, t5, t6] = wrist::<M>(t, c, s, t2 + t3, 1.0);
            out[n] = joint_values([t1, t2, t3, t4, t5, t6]);
            out[n + 1] = joint_values([t1, t2, t3, t4 + PI, -t5, t6 + PI]);
            n += 2;
        }
    }
    n
}

/// One branch: `back` shoulder, `up` the elbow sign, `flip` the wrist sign.
#[inline(never)]
pub fn solve_one<M: Math>(
    t: &Pose,
    back: bool,
    elbow_sign: f64,
    wrist_sign: f64,
) -> Option<[f64; 6]> {
    let p = wrist_center(t);
    let rho = (p[0] * p[0] + p[1] * p[1]).sqrt();
    if rho < 1e-12 {
        return None;
    }
    let theta1 = M::atan2(p[1], p[0]);
    let k = if back { -1.0 } else { 1.0 };
    let (c1, s1) = (k * p[0] / rho, k * p[1] / rho);
    let t1 = if back { theta1 + PI } else { theta1 };
    let (t2, t3) = elbow::<M>(k * rho - A1, D1 - p[2], elbow_sign)?;
    let [t4, t5, t6] = wrist::<M>(t, c1, s1, t2 + t3, wrist_sign);
    Some(joint_values([t1, t2, t3, t4, t5, t6]))
}

/// One DH link transform `Rz(θ)·Tz(d)·Tx(a)·Rx(α)` as a 3×4 matrix (rotation | translation).
#[inline(always)]
fn link<M: Math>(theta: f64, d: f64, a: f64, ca: f64, sa: f64) -> [[f64; 4]; 3] {
    let (st, ct) = M::sin_cos(theta);
    [
        [ct, -st * ca, st * sa, a * ct],
        [st, ct * ca, -ct * sa, a * st],
        [0.0, sa, ca, d],
    ]
}

/// `a · b` for 3×4 rigid transforms.
#[inline(always)]
fn mul(a: &[[f64; 4]; 3], b: &[[f64; 4]; 3]) -> [[f64; 4]; 3] {
    let mut m = [[0.0; 4]; 3];
    for i in 0..3 {
        for j in 0..4 {
            m[i][j] = a[i][0] * b[0][j] + a[i][1] * b[1][j] + a[i][2] * b[2][j];
        }
        m[i][3] += a[i][3];
    }
    m
}

/// A plain hand-written DH forward: six link matrices multiplied in turn, then the tool.
#[inline(never)]
pub fn forward<M: Math>(q: &[f64; 6]) -> Pose {
    // (θ offset, d, a, cos α, sin α) per link.
    const DH: [(f64, f64, f64, f64, f64); 6] = [
        (0.0, D1, A1, 0.0, -1.0),
        (OFFSET2, 0.0, A2, 1.0, 0.0),
        (0.0, 0.0, A3, 0.0, -1.0),
        (0.0, D4, 0.0, 0.0, 1.0),
        (0.0, 0.0, 0.0, 0.0, -1.0),
        (0.0, D6, 0.0, 1.0, 0.0),
    ];
    let mut m = link::<M>(q[0] + DH[0].0, DH[0].1, DH[0].2, DH[0].3, DH[0].4);
    for i in 1..6 {
        let (o, d, a, ca, sa) = DH[i];
        m = mul(&m, &link::<M>(q[i] + o, d, a, ca, sa));
    }
    let mut pose = Pose::IDENTITY;
    for (i, row) in m.iter().take(3).enumerate() {
        pose.rotation[i] = [row[0], row[1], row[2]];
        pose.translation[i] = row[3] + TOOL * row[2];
    }
    pose
}
