//! Shared helpers for armforge's workspace integration tests.
//!
//! The centre piece is [`ReferenceArm`]: an independent reading of a description file (the
//! `toml` crate with serde, not armforge's reader) and an independent forward kinematics with
//! `nalgebra`, written from the textbook definitions:
//!
//! - standard DH: the product of the link matrices `A_i` (Spong, Hutchinson & Vidyasagar,
//!   Robot Modeling and Control, 2006, eq. 3.10);
//! - modified DH: the product of the link matrices `ⁱ⁻¹T_i` (Craig, Introduction to Robotics,
//!   3rd ed., 2005, eq. 3.6);
//! - axes: `B · E_1 ⋯ E_n · M` with each `E_i` an [`Isometry3`] built from
//!   [`UnitQuaternion::from_axis_angle`] about the line through the joint's point (Murray, Li &
//!   Sastry, A Mathematical Introduction to Robotic Manipulation, 1994, §3.2).
//!
//! Later tests (solver round trips) reuse it: joint values are in SI units (radians, metres).

pub mod emitted;

use std::path::{Path, PathBuf};

use armforge_runtime::Pose;
use nalgebra::{
    Isometry3, Matrix3, Matrix4, Rotation3, Translation3, Unit, UnitQuaternion, Vector3,
};
use rand::Rng;
use serde::Deserialize;

/// The workspace root (the folder with `arms/`).
pub fn workspace_root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR"))
        .parent()
        .expect("the tests crate lives in the workspace")
        .to_path_buf()
}

/// The example arms: every `arms/*.toml`, sorted by name.
pub fn example_arm_paths() -> Vec<PathBuf> {
    toml_files_in(&workspace_root().join("arms"))
}

/// The folder of the checked-in emitted modules of the sample-arm fixtures
/// (`armforge_compiler::plan::samples::fixtures`).
pub fn generated_dir() -> PathBuf {
    workspace_root()
        .join("tests")
        .join("tests")
        .join("generated")
}

/// A file or folder under `tests/fixtures/`.
pub fn fixture(relative: &str) -> PathBuf {
    workspace_root()
        .join("tests")
        .join("fixtures")
        .join(relative)
}

/// Every `*.toml` directly in a folder, sorted by name.
pub fn toml_files_in(folder: &Path) -> Vec<PathBuf> {
    let mut paths: Vec<PathBuf> = std::fs::read_dir(folder)
        .unwrap_or_else(|e| panic!("cannot list {}: {e}", folder.display()))
        .map(|entry| entry.expect("readable folder entry").path())
        .filter(|p| p.extension().is_some_and(|e| e == "toml"))
        .collect();
    paths.sort();
    paths
}

#[derive(Deserialize)]
struct RawFile {
    length_unit: Option<String>,
    angle_unit: Option<String>,
    convention: String,
    joint: Vec<RawJoint>,
    tool: Option<RawFrame>,
    base: Option<RawFrame>,
}

#[derive(Deserialize)]
struct RawJoint {
    #[serde(rename = "type")]
    kind: String,
    direction: Option<f64>,
    limits: Option<[f64; 2]>,
    a: Option<f64>,
    alpha: Option<f64>,
    d: Option<f64>,
    theta: Option<f64>,
    axis: Option<[f64; 3]>,
    point: Option<[f64; 3]>,
    offset: Option<f64>,
}

#[derive(Deserialize)]
struct RawFrame {
    translation: Option<[f64; 3]>,
    rpy: Option<[f64; 3]>,
    rotation: Option<[[f64; 3]; 3]>,
}

/// How the reference arm's joints are described (SI units).
#[derive(Clone, Debug)]
enum Links {
    /// Standard DH rows `(a, alpha, d, theta)`.
    Dh(Vec<[f64; 4]>),
    /// Modified DH rows, stored as `(a, alpha, d, theta)` like the standard ones.
    ModifiedDh(Vec<[f64; 4]>),
    /// Unit axis, point and offset per joint.
    Axes(Vec<(Vector3<f64>, Vector3<f64>, f64)>),
}

/// An arm read independently of armforge, with a textbook forward kinematics.
#[derive(Clone, Debug)]
pub struct ReferenceArm {
    /// True for each revolute joint.
    pub revolute: Vec<bool>,
    /// Joint directions (±1).
    pub directions: Vec<f64>,
    /// Joint limits in SI units (one turn for revolute joints without limits; ±1 m for
    /// prismatic joints without limits, to keep random samples sensible).
    pub limits: Vec<[f64; 2]>,
    links: Links,
    tool: Isometry3<f64>,
    base: Isometry3<f64>,
}

impl ReferenceArm {
    /// Reads a description file (panics on a file the reference cannot read: tests only).
    pub fn load(path: &Path) -> ReferenceArm {
        let text = std::fs::read_to_string(path)
            .unwrap_or_else(|e| panic!("cannot read {}: {e}", path.display()));
        Self::from_text(&text)
    }

    /// Reads description text.
    pub fn from_text(text: &str) -> ReferenceArm {
        let raw: RawFile = toml::from_str(text).expect("a description the reference can read");
        let metres = match raw.length_unit.as_deref() {
            Some("mm") => 1e-3,
            _ => 1.0,
        };
        let radians = match raw.angle_unit.as_deref() {
            Some("deg") => std::f64::consts::PI / 180.0,
            _ => 1.0,
        };
        let revolute: Vec<bool> = raw.joint.iter().map(|j| j.kind == "revolute").collect();
        let joint_unit = |r: bool| if r { radians } else { metres };
        let limits = raw
            .joint
            .iter()
            .zip(&revolute)
            .map(|(j, &r)| match (j.limits, r) {
                (Some([lo, hi]), _) => [lo * joint_unit(r), hi * joint_unit(r)],
                (None, true) => [-std::f64::consts::PI, std::f64::consts::PI],
                (None, false) => [-1.0, 1.0],
            })
            .collect();
        let dh_rows = || -> Vec<[f64; 4]> {
            raw.joint
                .iter()
                .map(|j| {
                    [
                        j.a.unwrap_or(0.0) * metres,
                        j.alpha.unwrap_or(0.0) * radians,
                        j.d.unwrap_or(0.0) * metres,
                        j.theta.unwrap_or(0.0) * radians,
                    ]
                })
                .collect()
        };
        let links = match raw.convention.as_str() {
            "dh" => Links::Dh(dh_rows()),
            "modified-dh" => Links::ModifiedDh(dh_rows()),
            "axes" => Links::Axes(
                raw.joint
                    .iter()
                    .zip(&revolute)
                    .map(|(j, &r)| {
                        let axis = Vector3::from(j.axis.expect("axis")).normalize();
                        let point = Vector3::from(j.point.unwrap_or([0.0; 3])) * metres;
                        (axis, point, j.offset.unwrap_or(0.0) * joint_unit(r))
                    })
                    .collect(),
            ),
            other => panic!("unknown convention {other}"),
        };
        let frame = |f: &Option<RawFrame>| {
            f.as_ref().map_or(Isometry3::identity(), |f| {
                frame_isometry(f, metres, radians)
            })
        };
        ReferenceArm {
            directions: raw
                .joint
                .iter()
                .map(|j| j.direction.unwrap_or(1.0))
                .collect(),
            revolute,
            limits,
            links,
            tool: frame(&raw.tool),
            base: frame(&raw.base),
        }
    }

    /// Number of joints.
    pub fn joint_count(&self) -> usize {
        self.revolute.len()
    }

    /// The world pose of the tool frame for joint values in SI units.
    pub fn forward(&self, q: &[f64]) -> Isometry3<f64> {
        assert_eq!(q.len(), self.joint_count(), "one value per joint");
        let moved = |i: usize| self.directions[i] * q[i];
        let arm = match &self.links {
            Links::Dh(rows) => self.dh_chain(rows, &moved, |[a, alpha, d, theta]| {
                standard_dh_matrix(a, alpha, d, theta)
            }),
            Links::ModifiedDh(rows) => self.dh_chain(rows, &moved, |[a, alpha, d, theta]| {
                modified_dh_matrix(alpha, a, theta, d)
            }),
            Links::Axes(joints) => {
                let product = joints.iter().enumerate().fold(
                    Isometry3::identity(),
                    |t, (i, (axis, point, offset))| {
                        let amount = moved(i) + offset;
                        t * if self.revolute[i] {
                            rotation_about_line(axis, point, amount)
                        } else {
                            Isometry3::from_parts(
                                Translation3::from(axis * amount),
                                UnitQuaternion::identity(),
                            )
                        }
                    },
                );
                product * self.tool
            }
        };
        self.base * arm
    }

    /// The arm's tool pose through a chain of DH rows, `link` being the row's matrix (standard
    /// or modified) of `[a, α, d, θ]` with the joint's motion added.
    fn dh_chain(
        &self,
        rows: &[[f64; 4]],
        moved: &dyn Fn(usize) -> f64,
        link: impl Fn([f64; 4]) -> Matrix4<f64>,
    ) -> Isometry3<f64> {
        let product = rows
            .iter()
            .enumerate()
            .fold(Matrix4::identity(), |t, (i, row)| {
                let [a, alpha, d, theta] = *row;
                let (theta, d) = self.moved_dh(i, theta, d, moved(i));
                t * link([a, alpha, d, theta])
            });
        isometry_of(&product) * self.tool
    }

    fn moved_dh(&self, i: usize, theta: f64, d: f64, amount: f64) -> (f64, f64) {
        if self.revolute[i] {
            (theta + amount, d)
        } else {
            (theta, d + amount)
        }
    }

    /// Uniformly random joint values inside the limits, SI units.
    pub fn random_configuration(&self, rng: &mut impl Rng) -> Vec<f64> {
        self.limits
            .iter()
            .map(|[lo, hi]| rng.random_range(*lo..=*hi))
            .collect()
    }

    /// Uniformly random joint values inside the emitted module's limits `table`, taking this
    /// description's own limits where the module's are unbounded (an unlimited slide).
    pub fn random_within(
        &self,
        table: &[armforge_runtime::Joint; armforge_runtime::JOINTS],
        rng: &mut impl Rng,
    ) -> [f64; armforge_runtime::JOINTS] {
        let mut q = [0.0; armforge_runtime::JOINTS];
        for (i, v) in q.iter_mut().enumerate() {
            let [mut lo, mut hi] = table[i].limits;
            if !(lo.is_finite() && hi.is_finite()) {
                [lo, hi] = self.limits[i];
            }
            *v = rng.random_range(lo..hi);
        }
        q
    }
}

/// The standard DH link matrix `A_i = Rz(θ)·Tz(d)·Tx(a)·Rx(α)` written out
/// (Spong, Hutchinson & Vidyasagar 2006, eq. 3.10).
pub fn standard_dh_matrix(a: f64, alpha: f64, d: f64, theta: f64) -> Matrix4<f64> {
    let (st, ct) = theta.sin_cos();
    let (sa, ca) = alpha.sin_cos();
    #[rustfmt::skip]
    let m = Matrix4::new(
        ct, -st * ca,  st * sa, a * ct,
        st,  ct * ca, -ct * sa, a * st,
        0.0,      sa,       ca,      d,
        0.0,     0.0,      0.0,    1.0,
    );
    m
}

/// The modified DH link matrix `Rx(α)·Tx(a)·Rz(θ)·Tz(d)` written out
/// (Craig, Introduction to Robotics, 3rd ed., 2005, eq. 3.6).
pub fn modified_dh_matrix(alpha: f64, a: f64, theta: f64, d: f64) -> Matrix4<f64> {
    let (st, ct) = theta.sin_cos();
    let (sa, ca) = alpha.sin_cos();
    #[rustfmt::skip]
    let m = Matrix4::new(
        ct,      -st,      0.0,       a,
        st * ca,  ct * ca, -sa, -sa * d,
        st * sa,  ct * sa,  ca,  ca * d,
        0.0,      0.0,     0.0,     1.0,
    );
    m
}

/// A rotation by `angle` about the line through `point` along the unit `axis`.
pub fn rotation_about_line(
    axis: &Vector3<f64>,
    point: &Vector3<f64>,
    angle: f64,
) -> Isometry3<f64> {
    let rotation = UnitQuaternion::from_axis_angle(&Unit::new_normalize(*axis), angle);
    Isometry3::from_parts(Translation3::from(*point), UnitQuaternion::identity())
        * Isometry3::from_parts(Translation3::identity(), rotation)
        * Isometry3::from_parts(Translation3::from(-point), UnitQuaternion::identity())
}

fn isometry_of(m: &Matrix4<f64>) -> Isometry3<f64> {
    let r: Matrix3<f64> = m.fixed_view::<3, 3>(0, 0).into();
    let rotation = UnitQuaternion::from_rotation_matrix(&Rotation3::from_matrix_unchecked(r));
    Isometry3::from_parts(Translation3::new(m[(0, 3)], m[(1, 3)], m[(2, 3)]), rotation)
}

fn frame_isometry(f: &RawFrame, metres: f64, radians: f64) -> Isometry3<f64> {
    let t = Vector3::from(f.translation.unwrap_or([0.0; 3])) * metres;
    let rotation = match (&f.rpy, &f.rotation) {
        // nalgebra applies roll, then pitch, then yaw: Rz(yaw)·Ry(pitch)·Rx(roll).
        (Some([roll, pitch, yaw]), _) => {
            UnitQuaternion::from_euler_angles(roll * radians, pitch * radians, yaw * radians)
        }
        (None, Some(rows)) => UnitQuaternion::from_rotation_matrix(
            &Rotation3::from_matrix_unchecked(Matrix3::from_fn(|i, j| rows[i][j])),
        ),
        (None, None) => UnitQuaternion::identity(),
    };
    Isometry3::from_parts(Translation3::from(t), rotation)
}

/// An armforge pose as an `nalgebra` isometry.
pub fn isometry_of_pose(pose: &Pose) -> Isometry3<f64> {
    let r = Matrix3::from_fn(|i, j| pose.rotation[i][j]);
    Isometry3::from_parts(
        Translation3::from(Vector3::from(pose.translation)),
        UnitQuaternion::from_rotation_matrix(&Rotation3::from_matrix_unchecked(r)),
    )
}

/// The largest difference between two poses: `(rotation, translation)`, the largest absolute
/// difference of rotation-matrix entries and of translation components (metres).
pub fn pose_difference(a: &Pose, b: &Isometry3<f64>) -> (f64, f64) {
    let rb = b.rotation.to_rotation_matrix();
    let mut rotation: f64 = 0.0;
    for i in 0..3 {
        for j in 0..3 {
            rotation = rotation.max((a.rotation[i][j] - rb[(i, j)]).abs());
        }
    }
    let translation = (0..3)
        .map(|i| (a.translation[i] - b.translation.vector[i]).abs())
        .fold(0.0, f64::max);
    (rotation, translation)
}

/// The largest difference between two armforge poses: `(rotation, translation)`.
pub fn pose_difference_of(a: &Pose, b: &Pose) -> (f64, f64) {
    let mut rotation: f64 = 0.0;
    let mut translation: f64 = 0.0;
    for i in 0..3 {
        for j in 0..3 {
            rotation = rotation.max((a.rotation[i][j] - b.rotation[i][j]).abs());
        }
        translation = translation.max((a.translation[i] - b.translation[i]).abs());
    }
    (rotation, translation)
}

/// A test's sample count: `default` times `ARMFORGE_SCALE` (see DEVELOPERS.md).
pub use armforge_compiler::plan::samples::sample_count;
