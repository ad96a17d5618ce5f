//! Axes 1, 2 and 3 parallel (the base-parallel family): round trips on random arms whose axes
//! 5 and 6 are apart, meeting or parallel, classified and planned through the registry; the
//! mirror (axes 4–6 parallel) read from the tool; and the family's rejections.
//!
//! Check values: Pieper (1968), three consecutive parallel axes: a closed form with at most
//! 8 solutions (from memory); here 4 roots of the plane–line quartic × 2 bends of joints 1–2.

mod common;

use common::{arms, check_round_trip};

use armforge_compiler::classify::context::Context;
use armforge_compiler::classify::{classify, Family, Tolerances};
use armforge_compiler::family::base_parallel::axes_4_5::Placement;
use armforge_compiler::family::base_parallel::BASE_PARALLEL;
use armforge_compiler::family::{FamilyModule, Recognition};
use armforge_compiler::model::Model;
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::samples::{
    sample_arm, sample_base_parallel, sample_base_parallel_placed, sample_configuration,
    SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;

/// Poses with 8 solutions, by layout of axes 5 and 6 (apart, meeting, parallel), and the
/// largest count seen.
fn round_trips(options: SampleOptions) -> ([usize; 3], usize) {
    let mut full = [0; 3];
    let mut most = 0;
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::BaseParallel, seed, &options);
        assert_eq!(geometry.solutions.total, 8, "arm {seed}");
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        let mut rng = SampleRng::new(5000 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("base-parallel arm {seed}");
            let n = check_round_trip(&solver, &model, &q, 8, &what);
            most = most.max(n);
            if n == 8 {
                full[(seed % 3) as usize] += 1;
            }
        }
    }
    (full, most)
}

#[test]
fn random_arms_round_trip_in_every_layout() {
    let (full, most) = round_trips(SampleOptions::default());
    eprintln!(
        "base-parallel: poses with 8 solutions (axes 5–6 apart, meeting, parallel): {full:?} of \
         {} each at most; largest count {most}",
        arms().div_ceil(3) * 10
    );
    // Pieper 1968 (from memory): up to 8 solutions, reached at generic poses.
    assert_eq!(most, 8, "{full:?}");
    let plain_zero = SampleOptions {
        random_zero: false,
        ..SampleOptions::default()
    };
    let (full, _) = round_trips(plain_zero);
    eprintln!("base-parallel, zero offsets and positive senses: {full:?}");
}

/// Axes 4–6 parallel: the mirror of a base-parallel arm, read from the tool by the tool-first
/// family through the base-parallel family's target step. Round trips on random arms.
#[test]
fn arms_whose_axes_4_to_6_are_parallel_round_trip_read_from_the_tool() {
    let mut full = 0;
    for seed in 0..arms() {
        let inner = sample_base_parallel(seed, &SampleOptions::default());
        let mut model = armforge_compiler::family::mirror::mirrored_model(&inner);
        let mut rng = SampleRng::new(7300 + seed);
        model.tool = rng.pose(0.5);
        model.base = rng.pose(1.0);
        let geometry = classify(&model, &Tolerances::default())
            .unwrap_or_else(|r| panic!("arm {seed}: rejected: {r}"));
        assert_eq!(geometry.family, Family::ToolFirst, "arm {seed}");
        assert_eq!(geometry.solutions.total, 8, "arm {seed}");
        let solver = Solver::from_plan(build_plan(&model, &geometry));
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("axes 4–6 parallel, arm {seed}");
            if check_round_trip(&solver, &model, &q, 8, &what) == 8 {
                full += 1;
            }
        }
    }
    eprintln!("axes 4–6 parallel: {full} poses with 8 solutions");
    assert!(full > 0);
}

/// A random arm with axes 4 and 5 placed as `placement` says, classified.
fn placed_arm(seed: u64, placement: Placement) -> (Model, armforge_compiler::classify::Geometry) {
    let model = sample_base_parallel_placed(seed, &SampleOptions::default(), placement);
    let geometry = classify(&model, &Tolerances::default())
        .unwrap_or_else(|r| panic!("{placement:?} arm {seed}: rejected: {r}"));
    assert_eq!(geometry.family, Family::BaseParallel, "arm {seed}");
    assert_eq!(geometry.solutions.total, 8, "arm {seed}");
    (model, geometry)
}

/// Round trips on random arms with axes 4 and 5 placed as `placement` says: poses with all 8
/// solutions, the largest count seen and the poses tried. Every solution reproduces the pose
/// to 1e-9 relative, reads back its own label, none twice, the original among them
/// (`check_round_trip`).
fn placed_round_trips(placement: Placement) -> (usize, usize, usize) {
    let (mut full, mut most, mut poses) = (0, 0, 0);
    for seed in 0..arms() {
        let (model, geometry) = placed_arm(seed, placement);
        let plan = build_plan(&model, &geometry);
        assert_eq!(Placement::of_plan(&plan), placement, "arm {seed}");
        let solver = Solver::from_plan(plan);
        let mut rng = SampleRng::new(6100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let what = format!("base-parallel arm {seed}, axes 4 and 5 {placement:?}");
            let n = check_round_trip(&solver, &model, &q, 8, &what);
            most = most.max(n);
            poses += 1;
            if n == 8 {
                full += 1;
            }
        }
    }
    (full, most, poses)
}

/// Axes 4 and 5 meeting: joint 6 from one equation `a cos θ6 + b sin θ6 = e` (2 roots),
/// joints 4 and 5 by Paden–Kahan subproblem 2 (2 roots; Murray, Li & Sastry, A Mathematical
/// Introduction to Robotic Manipulation, 1994, §3.2, from memory), 2 bends: up to 8 (Pieper
/// 1968, from memory).
#[test]
fn arms_whose_axes_4_and_5_meet_round_trip() {
    let (full, most, poses) = placed_round_trips(Placement::Meeting);
    eprintln!("axes 4 and 5 meeting: {full} of {poses} poses with 8 solutions; largest {most}");
    assert_eq!(most, 8);
}

/// Axes 4 and 5 parallel: joint 6 from `g · R6 n = g · h` (2 roots), the sum θ4 + θ5 by
/// subproblem 1, joint 5 from the height of axis 4's point (2 roots), 2 bends: up to 8.
#[test]
fn arms_whose_axes_4_and_5_are_parallel_round_trip() {
    let (full, most, poses) = placed_round_trips(Placement::Parallel);
    eprintln!("axes 4 and 5 parallel: {full} of {poses} poses with 8 solutions; largest {most}");
    assert_eq!(most, 8);
}

/// A base-parallel sample arm to break.
fn arm(seed: u64) -> Model {
    sample_base_parallel(seed, &SampleOptions::default())
}

/// The rejection of `model`: its kind and message.
fn rejected(model: &Model) -> (String, String) {
    let r = classify(model, &Tolerances::default()).expect_err("rejected");
    (r.reason.kind().to_string(), r.to_string())
}

/// Axis 4 parallel to axes 1–3: four parallel axes, one joint redundant.
#[test]
fn four_parallel_axes_are_rejected() {
    let mut model = arm(0);
    model.joints[3].joint.axis = model.joints[0].joint.axis;
    let (kind, message) = rejected(&model);
    assert_eq!(kind, "four_parallel_axes", "{message}");
    assert!(message.contains("1–4"), "{message}");
}

/// Axes 1 and 2 on one line.
#[test]
fn parallel_axes_on_one_line_are_rejected() {
    let mut model = arm(1);
    model.joints[1].joint.point = model.joints[0].joint.point;
    model.joints[1].joint.axis = model.joints[0].joint.axis;
    let (kind, message) = rejected(&model);
    assert_eq!(kind, "parallel_axes_coincide", "{message}");
}

/// Axes 4, 5 and 6 through one point: the wrist center keeps its height along the parallel
/// axes. The classifier gives the elbow family's reason (it sees a spherical wrist whose
/// joints 1–3 cannot place the center in space); the base-parallel family's own says why.
#[test]
fn a_spherical_wrist_behind_parallel_axes_is_rejected() {
    let mut model = arm(2);
    let c = model.joints[3].joint.point;
    model.joints[4].joint.point = c;
    model.joints[5].joint.point = c;
    model.joints[5].joint.axis = [0.6, 0.0, 0.8];
    let (kind, message) = rejected(&model);
    assert_eq!(kind, "axes_1_and_2_parallel", "{message}");
    assert!(message.contains("wrist center in space"), "{message}");
    let ctx = Context::new(&model, &Tolerances::default()).expect("six joints");
    let Recognition::Degenerate(r) = BASE_PARALLEL.recognise(&ctx) else {
        panic!("not degenerate");
    };
    assert_eq!(
        r.reason.kind(),
        "spherical_wrist_behind_parallel_axes",
        "{r}"
    );
    assert!(r.message.contains("height"), "{r}");
}

/// Axes 4 and 5 one line: joints 4 and 5 add one motion.
#[test]
fn axes_4_and_5_on_one_line_are_rejected() {
    let mut model = arm(0);
    model.joints[4].joint.axis = model.joints[3].joint.axis;
    model.joints[4].joint.point = model.joints[3].joint.point;
    let (kind, message) = rejected(&model);
    assert_eq!(kind, "axes_4_5_one_line", "{message}");
}

/// Axes 4, 5 and 6 parallel too: the tool turns about two directions only.
#[test]
fn axes_4_to_6_parallel_too_are_rejected() {
    let mut model = arm(3);
    let h4 = model.joints[3].joint.axis;
    let p4 = model.joints[3].joint.point;
    for (j, d) in [(4, 0.2), (5, 0.4)] {
        model.joints[j].joint.axis = h4;
        let across = armforge_compiler::plan::vec3::num::any_perpendicular(&h4);
        model.joints[j].joint.point = [
            p4[0] + d * across[0],
            p4[1] + d * across[1],
            p4[2] + d * across[2],
        ];
    }
    let (kind, message) = rejected(&model);
    assert_eq!(kind, "parallel_axes_1_3_and_4_6", "{message}");
}

/// Axes 5 and 6 on one line.
#[test]
fn axes_5_and_6_on_one_line_are_rejected() {
    let mut model = arm(0);
    model.joints[5].joint.axis = model.joints[4].joint.axis;
    model.joints[5].joint.point = model.joints[4].joint.point;
    let (kind, message) = rejected(&model);
    assert_eq!(kind, "axes_5_6_one_line", "{message}");
}

/// Axis 3 on axis 1 (equal links, folded): joint 1 is free. Every solution there is flagged,
/// and `solve_near` holds joint 1 at its current value, joint 3 taking the rest of the sum
/// `Φ` (the pose is reproduced).
#[test]
fn joint_1_is_held_where_axis_3_is_on_axis_1() {
    let mut model = arm(0);
    // Axis 3 through axis 1's point at zero: with joint 2 at zero, axis 3 lies on axis 1.
    let h = model.joints[0].joint.axis;
    let p1 = model.joints[0].joint.point;
    model.joints[2].joint.point = [p1[0] + 0.1 * h[0], p1[1] + 0.1 * h[1], p1[2] + 0.1 * h[2]];
    let geometry = classify(&model, &Tolerances::default()).expect("base-parallel");
    assert_eq!(geometry.family, Family::BaseParallel);
    let solver = Solver::from_plan(build_plan(&model, &geometry));
    let mut q = [0.3, 0.0, -0.5, 0.4, 0.2, 0.1];
    // Model values to joint values (the sample's zero offsets and senses).
    for (i, x) in q.iter_mut().enumerate() {
        *x = model.joints[i].joint.joint_value(*x);
    }
    let target = model.forward(&q);
    let solutions = solver.solve(&target).expect("solved");
    assert!(
        solutions
            .iter()
            .any(|s| s.flags.contains(armforge_runtime::Flags::ON_AXIS_1)),
        "{solutions:#?}"
    );
    let near = solver.solve_near(&target, &q).expect("solved near");
    let reach = solver.plan().arm.scale;
    assert!(common::pose_error(&solver.forward(&near.joints), &target, reach) < 1e-9);
    assert!(
        common::joint_gap(&model, &near.joints, &q) < 1e-6,
        "{near:?}"
    );
}

/// Axes 4–6 parallel with axes 2 and 3 meeting or parallel: the mirror of a base-parallel arm
/// whose axes 4 and 5 meet or are parallel, read from the tool by the tool-first family
/// through the base-parallel family's target step. Round trips on random arms.
#[test]
fn mirrored_placements_round_trip_read_from_the_tool() {
    for placement in [Placement::Meeting, Placement::Parallel] {
        let (mut full, mut poses) = (0, 0);
        for seed in 0..arms() {
            let inner = sample_base_parallel_placed(seed, &SampleOptions::default(), placement);
            let mut model = armforge_compiler::family::mirror::mirrored_model(&inner);
            let mut rng = SampleRng::new(7700 + seed);
            model.tool = rng.pose(0.5);
            model.base = rng.pose(1.0);
            let geometry = classify(&model, &Tolerances::default())
                .unwrap_or_else(|r| panic!("arm {seed}: rejected: {r}"));
            assert_eq!(geometry.family, Family::ToolFirst, "arm {seed}");
            assert_eq!(geometry.solutions.total, 8, "arm {seed}");
            let solver = Solver::from_plan(build_plan(&model, &geometry));
            for _ in 0..5 {
                let q = sample_configuration(&model, &mut rng);
                let what = format!("axes 4–6 parallel, axes 2–3 {placement:?}, arm {seed}");
                poses += 1;
                if check_round_trip(&solver, &model, &q, 8, &what) == 8 {
                    full += 1;
                }
            }
        }
        eprintln!("axes 4–6 parallel, axes 2 and 3 {placement:?}: {full} of {poses} with 8");
        assert!(full > 0, "{placement:?}");
    }
}

/// The model values θ about unit `axis` at which `x · R(axis, θ) c = 0` (none when the
/// equation `A cos θ + B sin θ + C = 0` has no root).
fn zero_turns(axis: [f64; 3], x: [f64; 3], c: [f64; 3]) -> Vec<f64> {
    use armforge_compiler::plan::vec3::num;
    let along = num::dot(&axis, &c);
    let c_perp = num::sub(&c, &num::scale(&axis, along));
    let (a, b) = (num::dot(&x, &c_perp), num::dot(&x, &num::cross(&axis, &c)));
    let k = num::dot(&x, &axis) * along;
    let r = a.hypot(b);
    if r < 1e-6 || k.abs() >= r {
        return Vec::new();
    }
    let (phi, d) = (b.atan2(a), (-k / r).acos());
    vec![phi + d, phi - d]
}

/// Near-singular bands: joint 4 approaching a value at which two solutions of joints 4 and 5
/// merge (axes 4 and 5 meeting: `γ = 0` in Paden–Kahan subproblem 2, where `h · R4 (h4 × h5)
/// = 0`; parallel: the two roots of joint 5's equation, where `h · R4 (d × h5) = 0`), at
/// distances 1e-2 … 1e-8 rad. Every solution reproduces the pose to 1e-9 and `solve_near`
/// from the configuration comes back to it within `1e-9 + 1e-10 / δ` rad (two roots `δ`
/// apart: rounding moves them by about its size over `δ`).
#[test]
fn near_singular_bands_of_joints_4_and_5_keep_the_pose() {
    use armforge_compiler::plan::vec3::num;
    for placement in [Placement::Meeting, Placement::Parallel] {
        let (mut checked, mut worst, mut worst_pose) = (0, 0.0f64, 0.0f64);
        for seed in 0..arms() / 4 {
            let (model, geometry) = placed_arm(seed, placement);
            let solver = Solver::from_plan(build_plan(&model, &geometry));
            let reach = solver.plan().arm.scale;
            let joint = |i: usize| &model.joints[i].joint;
            let (h, h4, h5) = (
                num::unit(&joint(0).axis),
                num::unit(&joint(3).axis),
                num::unit(&joint(4).axis),
            );
            let c = match placement {
                Placement::Meeting => num::cross(&h4, &h5),
                _ => num::cross(&num::sub(&joint(3).point, &joint(4).point), &h5),
            };
            let mut rng = SampleRng::new(7900 + seed);
            for at in zero_turns(h4, h, c) {
                for delta in [1e-2, 1e-4, 1e-6, 1e-8] {
                    let mut q = sample_configuration(&model, &mut rng);
                    q[3] = joint(3).joint_value(at + delta);
                    let target = model.forward(&q);
                    let what = format!("{placement:?} arm {seed}, joint 4 at {delta:e} from {at}");
                    let solutions = solver
                        .solve(&target)
                        .unwrap_or_else(|r| panic!("{what}: unsolved: {r}"));
                    for s in &solutions {
                        let err = common::pose_error(&solver.forward(&s.joints), &target, reach);
                        assert!(err < 1e-9, "{what}: {s:?} misses by {err:e}");
                    }
                    let near = solver
                        .solve_near(&target, &q)
                        .unwrap_or_else(|r| panic!("{what}: solve_near: {r}"));
                    let err = common::pose_error(&solver.forward(&near.joints), &target, reach);
                    assert!(err < 1e-9, "{what}: solve_near misses by {err:e}");
                    let gap = common::joint_gap(&model, &near.joints, &q);
                    assert!(gap < 1e-9 + 1e-10 / delta, "{what}: {gap:e} from {q:?}");
                    worst = worst.max(gap * delta);
                    worst_pose = worst_pose.max(err);
                    checked += 1;
                }
            }
        }
        eprintln!(
            "{placement:?} near-singular bands: {checked} poses, joints within {worst:.1e} / δ, \
             pose within {worst_pose:.1e}"
        );
        assert!(checked > 0, "{placement:?}");
    }
}
