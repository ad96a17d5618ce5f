//! Invented arms for tests and benchmarks: random arms of every family (random lengths,
//! offsets, twists, mountings, joint directions and offsets), built directly as models.
//!
//! The samples come from SplitMix64, a few lines here, so that the same seed gives the same
//! arm on every platform and every version: the compiler does not depend on `rand` (the
//! workbench does, for `verify`'s random configurations; the tests use it for their own
//! sampling), and a sample arm must not change when `rand` changes its algorithms.

use armforge_runtime::{Joint, JointKind, Pose};

use super::vec3::num;
use crate::classify::{classify, Family, Geometry, Tolerances};
use crate::diagnostics::Location;
use crate::family::base_parallel::axes_4_5::Placement;
use crate::model::{Model, ModelJoint};
use crate::units::Units;

/// SplitMix64: a tiny deterministic generator for sample arms and configurations.
#[derive(Clone, Debug)]
pub struct SampleRng(u64);

impl SampleRng {
    /// A generator from a seed.
    pub fn new(seed: u64) -> Self {
        SampleRng(seed ^ 0x9E37_79B9_7F4A_7C15)
    }
    /// The next 64 random bits.
    pub fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }
    /// Uniform in `[0, 1)`.
    pub fn unit(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 / (1u64 << 53) as f64
    }
    /// Uniform in `[lo, hi)`.
    pub fn range(&mut self, lo: f64, hi: f64) -> f64 {
        lo + (hi - lo) * self.unit()
    }
    /// `+1` or `−1`.
    pub fn sign(&mut self) -> f64 {
        if self.next_u64() & 1 == 0 {
            1.0
        } else {
            -1.0
        }
    }
    /// A random unit vector.
    pub fn direction(&mut self) -> [f64; 3] {
        loop {
            let v = [
                self.range(-1.0, 1.0),
                self.range(-1.0, 1.0),
                self.range(-1.0, 1.0),
            ];
            let n = num::norm(&v);
            if n > 0.1 && n <= 1.0 {
                return num::scale(&v, 1.0 / n);
            }
        }
    }
    /// A random unit vector whose angle to `h` has a cosine of at most `max_cos` in size.
    pub fn direction_away_from(&mut self, h: &[f64; 3], max_cos: f64) -> [f64; 3] {
        loop {
            let d = self.direction();
            if num::dot(&d, h).abs() <= max_cos {
                return d;
            }
        }
    }
    /// A random unit vector perpendicular to `h`.
    pub fn perpendicular(&mut self, h: &[f64; 3]) -> [f64; 3] {
        loop {
            let d = num::perpendicular(&self.direction(), h);
            if num::norm(&d) > 0.2 {
                return num::unit(&d);
            }
        }
    }
    /// A random vector with components in `[-r, r]`.
    pub fn point(&mut self, r: f64) -> [f64; 3] {
        [self.range(-r, r), self.range(-r, r), self.range(-r, r)]
    }
    /// A random rotation (from a random axis and angle).
    pub fn rotation(&mut self) -> [[f64; 3]; 3] {
        let axis = self.direction();
        let angle = self.range(-std::f64::consts::PI, std::f64::consts::PI);
        let cols = [
            num::rotate(&axis, angle, &[1.0, 0.0, 0.0]),
            num::rotate(&axis, angle, &[0.0, 1.0, 0.0]),
            num::rotate(&axis, angle, &[0.0, 0.0, 1.0]),
        ];
        [
            [cols[0][0], cols[1][0], cols[2][0]],
            [cols[0][1], cols[1][1], cols[2][1]],
            [cols[0][2], cols[1][2], cols[2][2]],
        ]
    }
    /// A random pose within `r` metres of the origin.
    pub fn pose(&mut self, r: f64) -> Pose {
        Pose {
            rotation: self.rotation(),
            translation: self.point(r),
        }
    }
}

/// Options for sample arms.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SampleOptions {
    /// Revolute limits are `±revolute_range` (radians); `π` gives one turn.
    pub revolute_range: f64,
    /// Wrist axes at right angles (`h4 ⟂ h5 ⟂ h6`) instead of random twists.
    pub orthogonal_wrist: bool,
    /// Random joint directions (±1) and offsets.
    pub random_zero: bool,
    /// Axis 2 meets axis 1 (no offset across the shoulder; offsets along axis 2 and in the
    /// forearm stay): the facing and across postures then reach the same distances, so generic
    /// reachable poses have all 8 solutions.
    pub shoulder_axes_meet: bool,
    /// Axis 2 parallel to axis 1, apart (general family only): one of the general family's
    /// two sub-cases with quadratics; `shoulder_axes_meet` gives the other.
    pub shoulder_axes_parallel: bool,
}

impl Default for SampleOptions {
    fn default() -> Self {
        SampleOptions {
            revolute_range: std::f64::consts::PI,
            orthogonal_wrist: false,
            random_zero: true,
            shoulder_axes_meet: false,
            shoulder_axes_parallel: false,
        }
    }
}

/// A sample arm whose emitted module is checked in as a fixture
/// (`tests/tests/generated/NAME.rs`, compiled and run by the workspace tests).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Fixture {
    /// The fixture's file and module name.
    pub name: &'static str,
    /// The family of the sample arm.
    pub family: Family,
    /// The sample arm's seed.
    pub seed: u64,
    /// The sample arm's options.
    pub options: SampleOptions,
}

impl Fixture {
    /// The sample arm and its geometry.
    pub fn arm(&self) -> (Model, Geometry) {
        sample_arm(self.family, self.seed, &self.options)
    }
}

/// The sample arms with checked-in emitted modules: the one table that the emitter's tests,
/// the fixture refresh and the tests that compile the fixtures all read.
pub fn fixtures() -> [Fixture; 25] {
    let plain = SampleOptions::default();
    let dextrous = SampleOptions {
        orthogonal_wrist: true,
        shoulder_axes_meet: true,
        ..plain
    };
    let two_turns = SampleOptions {
        revolute_range: std::f64::consts::TAU,
        orthogonal_wrist: true,
        ..plain
    };
    let meeting = SampleOptions {
        shoulder_axes_meet: true,
        ..plain
    };
    let parallel = SampleOptions {
        shoulder_axes_parallel: true,
        ..plain
    };
    let fixture = |name, family, seed, options| Fixture {
        name,
        family,
        seed,
        options,
    };
    [
        fixture("elbow_orthogonal", Family::Elbow, 11, dextrous),
        fixture("elbow_twisted", Family::Elbow, 12, plain),
        fixture("elbow_two_turns", Family::Elbow, 13, two_turns),
        fixture("polar", Family::Polar, 14, plain),
        fixture("cylindrical", Family::Cylindrical, 15, plain),
        fixture("cartesian", Family::Cartesian, 16, plain),
        fixture("general", Family::General, 17, plain),
        fixture("general_meeting", Family::General, 22, meeting),
        fixture("general_parallel", Family::General, 23, parallel),
        fixture("three_parallel_layout", Family::ThreeParallel, 18, plain),
        fixture("three_parallel_general", Family::ThreeParallel, 19, plain),
        fixture("offset_hand", Family::OffsetHand, 26, plain),
        fixture("base_wrist_elbow", Family::BaseWrist, 20, plain),
        fixture("base_wrist_polar", Family::BaseWrist, 21, plain),
        fixture("mid_wrist", Family::MidWrist, 24, plain),
        fixture("tool_first_layout", Family::ToolFirst, 24, plain),
        fixture("tool_first_general", Family::ToolFirst, 25, plain),
        fixture("base_parallel", Family::BaseParallel, 26, plain),
        fixture("carriage", Family::Carriage, 27, plain),
        fixture("general_slide", Family::GeneralSlide, 27, plain),
        fixture("general_slide_meeting", Family::GeneralSlide, 28, meeting),
        fixture("general_slide_parallel", Family::GeneralSlide, 29, parallel),
        fixture("base_slide", Family::BaseSlide, 27, plain),
        fixture("middle_slide_level", Family::MiddleSlide, 28, plain),
        fixture("middle_slide_tilted", Family::MiddleSlide, 29, plain),
    ]
}

fn revolute(axis: [f64; 3], point: [f64; 3], range: f64) -> Joint {
    Joint {
        kind: JointKind::Revolute,
        axis,
        point,
        direction: 1.0,
        offset: 0.0,
        limits: [-range, range],
    }
}

fn prismatic(axis: [f64; 3], limits: [f64; 2]) -> Joint {
    Joint {
        kind: JointKind::Prismatic,
        axis,
        point: [0.0; 3],
        direction: 1.0,
        offset: 0.0,
        limits,
    }
}

/// A random arm of `family`: returns the model and its geometry as the classifier finds it.
///
/// # Panics
///
/// If the classifier disagrees with how the sample was built (a bug in one of them).
pub fn sample_arm(family: Family, seed: u64, options: &SampleOptions) -> (Model, Geometry) {
    if family == Family::BaseWrist {
        return sample_base_wrist(seed, options);
    }
    if family == Family::MidWrist {
        return sample_mid_wrist(seed, options);
    }
    if family == Family::ToolFirst {
        return sample_tool_first(seed, options);
    }
    if family == Family::BaseParallel {
        // Axes 4 and 5 apart, meeting (seeds 3 modulo 5) or parallel (4 modulo 5).
        let placement = match seed % 5 {
            3 => Placement::Meeting,
            4 => Placement::Parallel,
            _ => Placement::Apart,
        };
        let model = sample_base_parallel_placed(seed, options, placement);
        let geometry = match classify(&model, &Tolerances::default()) {
            Ok(g) if g.family == family => g,
            other => panic!("sample base-parallel arm {seed}: classified as {other:?}"),
        };
        return (model, geometry);
    }
    if family == Family::ThreeParallel || family == Family::OffsetHand {
        // Even seeds: the layout (axes 1 and 5 ⟂ the parallel axes, axis 6 ⟂ axis 5); odd
        // seeds: every angle.
        let layout = seed % 2 == 0;
        let model = if family == Family::OffsetHand {
            sample_offset_hand(seed, options, layout)
        } else {
            sample_three_parallel(seed, options, layout)
        };
        let geometry = match classify(&model, &Tolerances::default()) {
            Ok(g) if g.family == family => g,
            other => panic!("sample {family:?} arm {seed}: classified as {other:?}"),
        };
        return (model, geometry);
    }
    // The general-slide family's arms keep the seeds they were built (and their fixtures
    // emitted) with when it was the 12th variant of `Family`.
    let tag = match family {
        Family::GeneralSlide => 11,
        // The base-slide sample arms keep the seed they had (and their fixture was emitted
        // with) as the 13th variant.
        Family::BaseSlide => 12,
        _ => family as u64,
    };
    let mut rng = SampleRng::new(seed.wrapping_mul(7919).wrapping_add(tag));
    let range = options.revolute_range;
    let h1 = rng.direction();
    let p1 = rng.point(0.2);
    let (j1, j2, j3, c) = match family {
        Family::Elbow => {
            let h2 = rng.direction_away_from(&h1, 0.85);
            let p2 = if options.shoulder_axes_meet {
                num::add(&p1, &num::scale(&h1, rng.range(-0.3, 0.3)))
            } else {
                num::add(&p1, &rng.point(0.3))
            };
            let h3 = num::scale(&h2, rng.sign());
            let upper = num::scale(&rng.perpendicular(&h2), rng.range(0.3, 0.8));
            let p3 = num::add(
                &num::add(&p2, &upper),
                &num::scale(&h2, rng.range(-0.2, 0.2)),
            );
            let fore = num::scale(&rng.direction(), rng.range(0.3, 0.8));
            let c = num::add(&p3, &fore);
            (
                revolute(h1, p1, range),
                revolute(h2, p2, range),
                revolute(h3, p3, range),
                c,
            )
        }
        Family::Polar => {
            let h2 = rng.direction_away_from(&h1, 0.85);
            let p2 = num::add(&p1, &rng.point(0.3));
            let u3 = rng.perpendicular(&h2);
            let c = num::add(&p2, &rng.point(0.5));
            (
                revolute(h1, p1, range),
                revolute(h2, p2, range),
                prismatic(u3, [-2.0, 2.0]),
                c,
            )
        }
        Family::Cylindrical => {
            let u2 = rng.direction_away_from(&h1, 0.95);
            let u2 = if num::dot(&u2, &h1).abs() < 0.3 {
                num::unit(&num::add(&u2, &h1))
            } else {
                u2
            };
            let u3 = rng.direction_away_from(&u2, 0.8);
            let c = num::add(&p1, &rng.point(0.5));
            (
                revolute(h1, p1, range),
                prismatic(u2, [-3.0, 3.0]),
                prismatic(u3, [-3.0, 3.0]),
                c,
            )
        }
        Family::General => {
            // Axes 1 and 2 apart along their common normal and not parallel (or, with the
            // options, meeting or parallel), axis 3 not parallel to axis 2, the wrist center
            // off axis 3: no named family.
            let (h2, p2) = if options.shoulder_axes_parallel {
                let h2 = num::scale(&h1, rng.sign());
                let across = num::scale(&rng.perpendicular(&h1), rng.range(0.1, 0.5));
                let p2 = num::add(
                    &num::add(&p1, &across),
                    &num::scale(&h1, rng.range(-0.3, 0.3)),
                );
                (h2, p2)
            } else if options.shoulder_axes_meet {
                let h2 = rng.direction_away_from(&h1, 0.9);
                (h2, num::add(&p1, &num::scale(&h1, rng.range(-0.3, 0.3))))
            } else {
                let h2 = rng.direction_away_from(&h1, 0.9);
                let normal = num::unit(&num::cross(&h1, &h2));
                let p2 = num::add(
                    &num::add(&p1, &num::scale(&normal, rng.range(0.05, 0.4) * rng.sign())),
                    &num::add(
                        &num::scale(&h1, rng.range(-0.3, 0.3)),
                        &num::scale(&h2, rng.range(-0.3, 0.3)),
                    ),
                );
                (h2, p2)
            };
            let h3 = rng.direction_away_from(&h2, 0.9);
            let p3 = num::add(&p2, &rng.point(0.6));
            let fore = num::scale(&rng.perpendicular(&h3), rng.range(0.2, 0.7));
            let c = num::add(
                &num::add(&p3, &fore),
                &num::scale(&h3, rng.range(-0.2, 0.2)),
            );
            (
                revolute(h1, p1, range),
                revolute(h2, p2, range),
                revolute(h3, p3, range),
                c,
            )
        }
        Family::GeneralSlide => {
            // Axes 1 and 2 as the general family's (apart, meeting or parallel with the
            // options), the slide at least 15° from ⟂ axis 2 (not the polar family), the wrist
            // center off axis 2.
            let (h2, p2) = if options.shoulder_axes_parallel {
                let h2 = num::scale(&h1, rng.sign());
                let across = num::scale(&rng.perpendicular(&h1), rng.range(0.1, 0.5));
                let p2 = num::add(
                    &num::add(&p1, &across),
                    &num::scale(&h1, rng.range(-0.3, 0.3)),
                );
                (h2, p2)
            } else if options.shoulder_axes_meet {
                let h2 = rng.direction_away_from(&h1, 0.9);
                (h2, num::add(&p1, &num::scale(&h1, rng.range(-0.3, 0.3))))
            } else {
                let h2 = rng.direction_away_from(&h1, 0.9);
                let normal = num::unit(&num::cross(&h1, &h2));
                let p2 = num::add(
                    &num::add(&p1, &num::scale(&normal, rng.range(0.05, 0.4) * rng.sign())),
                    &num::add(
                        &num::scale(&h1, rng.range(-0.3, 0.3)),
                        &num::scale(&h2, rng.range(-0.3, 0.3)),
                    ),
                );
                (h2, p2)
            };
            let e3 = loop {
                let e = rng.direction();
                if num::dot(&e, &h2).abs() > 0.26 {
                    break e;
                }
            };
            let off = num::scale(&rng.perpendicular(&h2), rng.range(0.15, 0.6));
            let c = num::add(&num::add(&p2, &off), &rng.point(0.3));
            (
                revolute(h1, p1, range),
                revolute(h2, p2, range),
                prismatic(e3, [-1.2, 1.2]),
                c,
            )
        }
        Family::BaseSlide => {
            // A slide, then axes 2 and 3 apart along their common normal and not parallel,
            // the wrist center off axis 3.
            let e1 = h1;
            let h2 = rng.direction();
            let p2 = num::add(&p1, &rng.point(0.3));
            let h3 = rng.direction_away_from(&h2, 0.9);
            let normal = num::unit(&num::cross(&h2, &h3));
            let p3 = num::add(
                &num::add(&p2, &num::scale(&normal, rng.range(0.05, 0.4) * rng.sign())),
                &num::add(
                    &num::scale(&h2, rng.range(-0.3, 0.3)),
                    &num::scale(&h3, rng.range(-0.3, 0.3)),
                ),
            );
            let fore = num::scale(&rng.perpendicular(&h3), rng.range(0.2, 0.7));
            let c = num::add(
                &num::add(&p3, &fore),
                &num::scale(&h3, rng.range(-0.2, 0.2)),
            );
            (
                prismatic(e1, [-3.0, 3.0]),
                revolute(h2, p2, range),
                revolute(h3, p3, range),
                c,
            )
        }
        Family::MiddleSlide => {
            // Even seeds: the slide ⟂ axis 1 (level), axis 3 not ∥ axis 1; odd seeds: the
            // slide at least 11.5° off ⟂ axis 1 (tilted), axis 3 anywhere. The wrist center
            // off axis 3.
            let level = seed % 2 == 0;
            let e2 = if level {
                rng.perpendicular(&h1)
            } else {
                let e = rng.direction_away_from(&h1, 0.95);
                if num::dot(&e, &h1).abs() < 0.2 {
                    num::unit(&num::add(&e, &num::scale(&h1, 0.4)))
                } else {
                    e
                }
            };
            let h3 = if level {
                rng.direction_away_from(&h1, 0.9)
            } else {
                rng.direction()
            };
            let p3 = num::add(&p1, &rng.point(0.5));
            let fore = num::scale(&rng.perpendicular(&h3), rng.range(0.2, 0.7));
            let c = num::add(
                &num::add(&p3, &fore),
                &num::scale(&h3, rng.range(-0.2, 0.2)),
            );
            (
                revolute(h1, p1, range),
                prismatic(e2, [-2.0, 2.0]),
                revolute(h3, p3, range),
                c,
            )
        }
        Family::ThreeParallel
        | Family::OffsetHand
        | Family::BaseWrist
        | Family::MidWrist
        | Family::BaseParallel
        | Family::ToolFirst => {
            unreachable!("built above")
        }
        Family::Cartesian => {
            let u1 = rng.direction();
            let u2 = rng.direction_away_from(&u1, 0.8);
            let u3 = loop {
                let u = rng.direction();
                if num::dot(&u, &num::cross(&u1, &u2)).abs() > 0.3 {
                    break u;
                }
            };
            let c = rng.point(0.5);
            (
                prismatic(u1, [-3.0, 3.0]),
                prismatic(u2, [-3.0, 3.0]),
                prismatic(u3, [-3.0, 3.0]),
                c,
            )
        }
        Family::Carriage => {
            // Two slides apart, axis 3 not ⟂ both (away from their normal), the wrist center
            // off axis 3.
            let u2 = rng.direction_away_from(&h1, 0.9);
            let normal = num::unit(&num::cross(&h1, &u2));
            let h3 = rng.direction_away_from(&normal, 0.9);
            let p3 = rng.point(0.3);
            let arm = num::scale(&rng.perpendicular(&h3), rng.range(0.2, 0.7));
            let c = num::add(&num::add(&p3, &arm), &num::scale(&h3, rng.range(-0.2, 0.2)));
            (
                prismatic(h1, [-3.0, 3.0]),
                prismatic(u2, [-3.0, 3.0]),
                revolute(h3, p3, range),
                c,
            )
        }
    };
    let (h4, h5, h6) = if options.orthogonal_wrist {
        let h4 = rng.direction();
        let h5 = rng.perpendicular(&h4);
        let h6 = rng.perpendicular(&h5);
        (h4, h5, h6)
    } else {
        let h4 = rng.direction();
        let h5 = rng.direction_away_from(&h4, 0.8);
        let h6 = rng.direction_away_from(&h5, 0.8);
        (h4, h5, h6)
    };
    let mut joints = [
        j1,
        j2,
        j3,
        revolute(h4, c, range),
        revolute(h5, c, range),
        revolute(h6, c, range),
    ];
    if options.random_zero {
        for j in joints.iter_mut() {
            j.direction = rng.sign();
            j.offset = match j.kind {
                JointKind::Revolute => rng.range(-1.0, 1.0),
                JointKind::Prismatic => rng.range(-0.2, 0.2),
            };
        }
    }
    let tool = Pose {
        rotation: rng.rotation(),
        translation: num::add(&c, &num::scale(&rng.direction(), rng.range(0.0, 0.25))),
    };
    let base = rng.pose(1.0);
    let model = named_model(
        format!("sample_{}_{seed}", family.name()),
        &joints,
        tool,
        base,
        format!("<sample {} {seed}>", family.name()),
    );
    // The geometry comes from the classifier, as in the real pipeline; a sample is built to
    // be of `family` with its wrist center at `c`, so anything else is a bug in one of them.
    let geometry = match classify(&model, &Tolerances::default()) {
        Ok(g) if g.family == family && num::norm(&num::sub(&g.wrist_center, &c)) < 1e-9 => g,
        Ok(g) => panic!(
            "sample arm {seed}: built as {} with wrist center {c:?}, classified as {:?} with {:?}",
            family.name(),
            g.family,
            g.wrist_center
        ),
        Err(rejection) => panic!(
            "sample arm {seed} of the {} family is rejected: {rejection}",
            family.name()
        ),
    };
    (model, geometry)
}

/// The environment variable that scales every randomized test: `ARMFORGE_SCALE=K` runs `K`
/// times each test's default sample count (default 1; CI runs the defaults).
pub const SCALE_VARIABLE: &str = "ARMFORGE_SCALE";

/// A test's sample count: `default` times `ARMFORGE_SCALE` (1 when unset). The one knob for
/// every randomized test of the workspace, so a long run is `ARMFORGE_SCALE=20 cargo test
/// --workspace --release`.
///
/// # Panics
/// When `ARMFORGE_SCALE` is set to anything but a positive whole number (tests only).
pub fn sample_count(default: usize) -> usize {
    match std::env::var(SCALE_VARIABLE) {
        Err(_) => default,
        Ok(text) => match text.trim().parse::<usize>() {
            Ok(k) if k > 0 => default.saturating_mul(k),
            _ => panic!("{SCALE_VARIABLE}={text:?}: expected a positive whole number"),
        },
    }
}

/// Random joint values within the model's limits (finite limits; infinite ones use ±π).
pub fn sample_configuration(model: &Model, rng: &mut SampleRng) -> [f64; 6] {
    let mut q = [0.0; 6];
    for (out, j) in q.iter_mut().zip(model.joints.iter()) {
        let [lo, hi] = j.joint.limits;
        let lo = if lo.is_finite() {
            lo
        } else {
            -std::f64::consts::PI
        };
        let hi = if hi.is_finite() {
            hi
        } else {
            std::f64::consts::PI
        };
        *out = rng.range(lo, hi);
    }
    q
}

/// An upright elbow arm of the common layout (invented dimensions): axis 1 vertical through
/// the origin, a `shoulder` offset forward (e.g. 0.12 m) at 0.45 m height, a 0.40 m upper arm standing
/// up at zero, a 0.075 m step and a 0.38 m forearm pointing forward along x, a wrist with
/// axes x, y, x at right angles and a 0.09 m flange. `lateral` shifts the elbow sideways
/// (along axis 2), which makes the wrist center stay that far from axis 1. One-turn limits.
pub fn upright_elbow_arm(shoulder: f64, lateral: f64) -> (Model, Geometry) {
    let range = std::f64::consts::PI;
    let x = [1.0, 0.0, 0.0];
    let y = [0.0, 1.0, 0.0];
    let z = [0.0, 0.0, 1.0];
    let c = [shoulder + 0.38, lateral, 0.925];
    let joints = [
        revolute(z, [0.0; 3], range),
        revolute(y, [shoulder, 0.0, 0.45], range),
        revolute(y, [shoulder, lateral, 0.85], range),
        revolute(x, c, range),
        revolute(y, c, range),
        revolute(x, c, range),
    ];
    let names = [
        "waist",
        "shoulder",
        "elbow",
        "forearm-roll",
        "wrist-bend",
        "flange-roll",
    ];
    let tool = Pose {
        rotation: Pose::IDENTITY.rotation,
        translation: [shoulder + 0.47, lateral, 0.925],
    };
    let model = Model {
        name: "upright_elbow".to_string(),
        description: Some("invented upright elbow arm for armforge's own tests".to_string()),
        source_path: "<upright elbow arm>".to_string(),
        ..named_model(String::new(), &joints, tool, Pose::IDENTITY, String::new())
    };
    let model = with_joint_names(model, names);
    let geometry = match classify(&model, &Tolerances::default()) {
        Ok(g) if g.family == Family::Elbow && num::norm(&num::sub(&g.wrist_center, &c)) < 1e-9 => g,
        other => panic!("the upright elbow arm must classify as an elbow arm: {other:?}"),
    };
    (model, geometry)
}

/// A random arm with three consecutive parallel axes (joints 2, 3, 4) and axes 5 and 6 meeting
/// (random lengths, offsets along the axes, twists, tool and mounting). With `layout`, axes 1
/// and 5 are perpendicular to the parallel axes and axis 6 perpendicular to axis 5; otherwise
/// their angles are random. Not classified: the model only.
pub fn sample_three_parallel(seed: u64, options: &SampleOptions, layout: bool) -> Model {
    parallel_model(seed, options, layout, false)
}

/// A random arm with axes 2, 3, 4 parallel and axes 5 and 6 passing 0.05–0.25 m apart (the
/// offset-hand family's): [`sample_three_parallel`] with joint 6's axis moved off joint 5's,
/// and, when `seed % 3 == 2`, made parallel to it. Not classified: the model only.
pub fn sample_offset_hand(seed: u64, options: &SampleOptions, layout: bool) -> Model {
    parallel_model(seed, options, layout, true)
}

/// [`sample_three_parallel`], or with `offset` [`sample_offset_hand`].
fn parallel_model(seed: u64, options: &SampleOptions, layout: bool, offset: bool) -> Model {
    let mut rng = SampleRng::new(seed.wrapping_mul(7927).wrapping_add(11));
    let range = options.revolute_range;
    let h = rng.direction();
    let (h1, h5) = if layout {
        (rng.perpendicular(&h), rng.perpendicular(&h))
    } else {
        (
            rng.direction_away_from(&h, 0.85),
            rng.direction_away_from(&h, 0.85),
        )
    };
    let h6 = if layout {
        rng.perpendicular(&h5)
    } else {
        rng.direction_away_from(&h5, 0.85)
    };
    let p1 = rng.point(0.2);
    let p2 = num::add(&p1, &rng.point(0.3));
    let step = |rng: &mut SampleRng, from: &[f64; 3]| {
        let across = num::scale(&rng.perpendicular(&h), rng.range(0.25, 0.7));
        num::add(
            &num::add(from, &across),
            &num::scale(&h, rng.range(-0.15, 0.15)),
        )
    };
    let p3 = step(&mut rng, &p2);
    let p4 = step(&mut rng, &p3);
    let q = num::add(&p4, &rng.point(0.15));
    let mut joints = [
        revolute(h1, p1, range),
        revolute(h, p2, range),
        revolute(num::scale(&h, rng.sign()), p3, range),
        revolute(num::scale(&h, rng.sign()), p4, range),
        revolute(
            h5,
            num::add(&q, &num::scale(&h5, rng.range(-0.1, 0.1))),
            range,
        ),
        revolute(
            h6,
            num::add(&q, &num::scale(&h6, rng.range(-0.1, 0.1))),
            range,
        ),
    ];
    if options.random_zero {
        for j in joints.iter_mut() {
            j.direction = rng.sign();
            j.offset = rng.range(-1.0, 1.0);
        }
    }
    if offset {
        if seed % 3 == 2 {
            joints[5].axis = num::scale(&h5, rng.sign());
        }
        let h6 = joints[5].axis;
        let across = num::cross(&h5, &h6);
        let normal = if num::norm(&across) > 0.1 {
            num::unit(&across)
        } else {
            rng.perpendicular(&h5)
        };
        let shift = num::scale(&normal, rng.range(0.05, 0.25) * rng.sign());
        joints[5].point = num::add(&joints[5].point, &shift);
    }
    let tool = Pose {
        rotation: rng.rotation(),
        translation: num::add(&q, &num::scale(&rng.direction(), rng.range(0.0, 0.2))),
    };
    let base = rng.pose(1.0);
    let kind = if offset {
        "offset_hand"
    } else {
        "three_parallel"
    };
    named_model(
        format!("sample_{kind}_{seed}"),
        &joints,
        tool,
        base,
        format!("<sample {} {seed}>", kind.replace('_', "-")),
    )
}

/// A random arm with its wrist at the base: the mirror of a random arm of a decoupled family
/// (by `seed`: elbow, polar, cylindrical, cartesian), with a random base and tool.
fn sample_base_wrist(seed: u64, options: &SampleOptions) -> (Model, Geometry) {
    let hands = [
        Family::Elbow,
        Family::Polar,
        Family::Cylindrical,
        Family::Cartesian,
        Family::General,
    ];
    let hand = hands[(seed % 5) as usize];
    let (inner, _) = sample_arm(hand, seed, options);
    let mut model = crate::plan::mirror::mirrored_model(&inner);
    let mut rng = SampleRng::new(seed.wrapping_mul(7933).wrapping_add(77));
    model.tool = rng.pose(0.5);
    model.base = rng.pose(1.0);
    model.name = format!("sample_base_wrist_{seed}");
    model.source_path = format!("<sample wrist-at-base {seed}>");
    let geometry = match classify(&model, &Tolerances::default()) {
        Ok(g) if g.family == Family::BaseWrist => g,
        other => panic!("sample wrist-at-base arm {seed}: classified as {other:?}"),
    };
    (model, geometry)
}

/// A random arm with a wrist in the middle: axes 2, 3, 4 meet at a random point `b` (at right
/// angles with `options.orthogonal_wrist`, else at random angles of at most about 58° from
/// the right angle), axis 1 and axis 5 pass 0.2–0.6 m from `b`, and axes 5 and 6 are, by
/// `seed`, apart at a random angle, meeting, or parallel.
fn sample_mid_wrist(seed: u64, options: &SampleOptions) -> (Model, Geometry) {
    let mut rng = SampleRng::new(seed.wrapping_mul(7937).wrapping_add(91));
    let range = options.revolute_range;
    let b = rng.point(0.5);
    let h2 = rng.direction();
    let (h3, h4) = if options.orthogonal_wrist {
        let h3 = rng.perpendicular(&h2);
        (h3, rng.perpendicular(&h3))
    } else {
        let h3 = rng.direction_away_from(&h2, 0.85);
        (h3, rng.direction_away_from(&h3, 0.85))
    };
    let on_axis =
        |rng: &mut SampleRng, h: &[f64; 3]| num::add(&b, &num::scale(h, rng.range(-0.2, 0.2)));
    let off = |rng: &mut SampleRng, h: &[f64; 3]| {
        let away = num::scale(&rng.perpendicular(h), rng.range(0.2, 0.6));
        num::add(&num::add(&b, &away), &num::scale(h, rng.range(-0.2, 0.2)))
    };
    let h1 = rng.direction();
    let p1 = off(&mut rng, &h1);
    let h5 = rng.direction();
    let p5 = off(&mut rng, &h5);
    let (h6, p6) = match seed % 3 {
        0 => (
            rng.direction_away_from(&h5, 0.85),
            num::add(&p5, &rng.point(0.3)),
        ),
        1 => (
            rng.direction_away_from(&h5, 0.85),
            num::add(&p5, &num::scale(&h5, rng.range(-0.2, 0.2))),
        ),
        _ => {
            let apart = num::scale(&rng.perpendicular(&h5), rng.range(0.1, 0.4));
            (num::scale(&h5, rng.sign()), num::add(&p5, &apart))
        }
    };
    let mut joints = [
        revolute(h1, p1, range),
        revolute(h2, on_axis(&mut rng, &h2), range),
        revolute(h3, on_axis(&mut rng, &h3), range),
        revolute(h4, on_axis(&mut rng, &h4), range),
        revolute(h5, p5, range),
        revolute(h6, p6, range),
    ];
    if options.random_zero {
        for j in joints.iter_mut() {
            j.direction = rng.sign();
            j.offset = rng.range(-1.0, 1.0);
        }
    }
    let tool = Pose {
        rotation: rng.rotation(),
        translation: num::add(&p6, &num::scale(&rng.direction(), rng.range(0.0, 0.2))),
    };
    let base = rng.pose(1.0);
    let model = named_model(
        format!("sample_mid_wrist_{seed}"),
        &joints,
        tool,
        base,
        format!("<sample mid-wrist {seed}>"),
    );
    let geometry = match classify(&model, &Tolerances::default()) {
        Ok(g) if g.family == Family::MidWrist => g,
        other => panic!("sample mid-wrist arm {seed}: classified as {other:?}"),
    };
    (model, geometry)
}

/// A random arm whose axes 1, 2 and 3 are parallel: links of 0.2–0.6 m between them, axis 4
/// at least about 32° from them, axes 4 and 5 0.05–0.3 m apart at a random angle, and axes 5
/// and 6, by `seed`, apart at a random angle, meeting, or parallel.
pub fn sample_base_parallel(seed: u64, options: &SampleOptions) -> Model {
    sample_base_parallel_placed(seed, options, Placement::Apart)
}

/// A random base-parallel arm whose axes 4 and 5 are placed as `placement` says (apart: the
/// arms of [`sample_base_parallel`]; meeting; parallel). Axes 5 and 6 are apart, meeting or
/// parallel by `seed % 3` as there (for parallel axes 4 and 5, never parallel axes 5 and 6:
/// axes 4–6 parallel are degenerate; for meeting axes 4 and 5, axis 6 keeps at least 0.05 m
/// from their meeting point, which on it would make a spherical wrist).
pub fn sample_base_parallel_placed(
    seed: u64,
    options: &SampleOptions,
    placement: Placement,
) -> Model {
    let mut rng = SampleRng::new(seed.wrapping_mul(7951).wrapping_add(113));
    let range = options.revolute_range;
    let h = rng.direction();
    let p1 = rng.point(0.2);
    let link = |rng: &mut SampleRng, from: &[f64; 3]| {
        let across = num::scale(&rng.perpendicular(&h), rng.range(0.2, 0.6));
        num::add(
            &num::add(from, &across),
            &num::scale(&h, rng.range(-0.2, 0.2)),
        )
    };
    let p2 = link(&mut rng, &p1);
    let p3 = link(&mut rng, &p2);
    let h2 = num::scale(&h, rng.sign());
    let h3 = num::scale(&h, rng.sign());
    let h4 = rng.direction_away_from(&h, 0.85);
    let p4 = num::add(&p3, &rng.point(0.3));
    let mut h5 = rng.direction_away_from(&h4, 0.85);
    let normal = num::unit(&num::cross(&h4, &h5));
    let apart = num::scale(&normal, rng.range(0.05, 0.3) * rng.sign());
    let (along_4, along_5) = (rng.range(-0.2, 0.2), rng.range(-0.2, 0.2));
    let meet = num::add(&p4, &num::scale(&h4, along_4));
    let p5 = match placement {
        Placement::Apart => num::add(
            &num::add(&p4, &apart),
            &num::add(&num::scale(&h4, along_4), &num::scale(&h5, along_5)),
        ),
        Placement::Meeting => num::add(&meet, &num::scale(&h5, along_5)),
        Placement::Parallel => {
            h5 = num::scale(&h4, rng.sign());
            num::add(&meet, &apart)
        }
    };
    let layout_6 = match (placement, seed % 3) {
        (Placement::Parallel, 2) => 0,
        (_, layout) => layout,
    };
    let (h6, p6) = match layout_6 {
        0 => (
            rng.direction_away_from(&h5, 0.85),
            num::add(&p5, &rng.point(0.3)),
        ),
        1 if placement == Placement::Meeting => {
            // On axis 5, at least 0.05 m from the meeting point.
            let off = rng.range(0.05, 0.3) * rng.sign();
            (
                rng.direction_away_from(&h5, 0.85),
                num::add(&meet, &num::scale(&h5, off)),
            )
        }
        1 => (
            rng.direction_away_from(&h5, 0.85),
            num::add(&p5, &num::scale(&h5, rng.range(-0.2, 0.2))),
        ),
        _ => {
            let apart = num::scale(&rng.perpendicular(&h5), rng.range(0.1, 0.4));
            (num::scale(&h5, rng.sign()), num::add(&p5, &apart))
        }
    };
    let mut joints = [
        revolute(h, p1, range),
        revolute(h2, p2, range),
        revolute(h3, p3, range),
        revolute(h4, p4, range),
        revolute(h5, p5, range),
        revolute(h6, p6, range),
    ];
    if options.random_zero {
        for j in joints.iter_mut() {
            j.direction = rng.sign();
            j.offset = rng.range(-1.0, 1.0);
        }
    }
    let tool = Pose {
        rotation: rng.rotation(),
        translation: num::add(&p6, &num::scale(&rng.direction(), rng.range(0.0, 0.2))),
    };
    let base = rng.pose(1.0);
    named_model(
        format!("sample_base_parallel_{seed}"),
        &joints,
        tool,
        base,
        format!("<sample base-parallel {seed}>"),
    )
}

/// A random tool-first arm: the mirror of a random three-parallel arm (even seeds: the layout,
/// axes 1 and 5 ⟂ the parallel axes and axis 6 ⟂ axis 5; odd seeds: every angle), so its axes
/// 3–5 are parallel and axes 1 and 2 meet, with a random base and tool.
fn sample_tool_first(seed: u64, options: &SampleOptions) -> (Model, Geometry) {
    let inner = sample_three_parallel(seed, options, seed % 2 == 0);
    let mut model = crate::family::mirror::mirrored_model(&inner);
    let mut rng = SampleRng::new(seed.wrapping_mul(7937).wrapping_add(101));
    model.tool = rng.pose(0.5);
    model.base = rng.pose(1.0);
    let mut model = with_joint_names(model, ["j1", "j2", "j3", "j4", "j5", "j6"]);
    model.name = format!("sample_tool_first_{seed}");
    model.source_path = format!("<sample tool-first {seed}>");
    let geometry = match classify(&model, &Tolerances::default()) {
        Ok(g) if g.family == Family::ToolFirst => g,
        other => panic!("sample tool-first arm {seed}: classified as {other:?}"),
    };
    (model, geometry)
}

/// `model` with its joints renamed.
fn with_joint_names(mut model: Model, names: [&str; 6]) -> Model {
    for (joint, name) in model.joints.iter_mut().zip(names) {
        joint.name = name.to_string();
    }
    model
}

fn named_model(name: String, joints: &[Joint; 6], tool: Pose, base: Pose, path: String) -> Model {
    let names = ["j1", "j2", "j3", "j4", "j5", "j6"];
    Model {
        name,
        description: Some("invented sample arm for armforge's own tests".to_string()),
        units: Units::default(),
        joints: joints
            .iter()
            .zip(names)
            .map(|(joint, name)| ModelJoint {
                joint: *joint,
                name: name.to_string(),
                location: Location::default(),
            })
            .collect(),
        tool,
        base,
        source_path: path,
    }
}
