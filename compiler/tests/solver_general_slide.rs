//! The general-slide family (R R P whose slide is not ⟂ axis 2, a spherical wrist): round
//! trips on random arms of the three layouts of axes 1 and 2, the count of solutions (at most
//! 4 positions × 2 wrists, and 4 positions on some poses: Pieper 1968, from memory), arms
//! near the singular configurations, the degenerate arms' rejections, and polar arms solved
//! through the general-slide path against their own plan (a cross-check of both).
//! Completeness against Levenberg–Marquardt is in `tests/tests/completeness_families.rs`.

mod common;

use common::{arms, check_round_trip, joint_gap, pose_error};

use armforge_compiler::classify::{classify, Tolerances};
use armforge_compiler::family::general::slide::GENERAL_SLIDE;
use armforge_compiler::family::{Family, FamilyModule};
use armforge_compiler::model::Model;
use armforge_compiler::plan::decoupled_plan;
use armforge_compiler::plan::samples::{
    sample_arm, sample_configuration, sample_count, SampleOptions, SampleRng,
};
use armforge_compiler::solver::Solver;
use armforge_runtime::Solution;

/// The three layouts of axes 1 and 2 the sampler builds: apart (the quartic), meeting,
/// parallel.
fn layouts() -> [(SampleOptions, &'static str, usize); 3] {
    let plain = SampleOptions::default();
    [
        (plain, "apart", 8),
        (
            SampleOptions {
                shoulder_axes_meet: true,
                ..plain
            },
            "meeting",
            8,
        ),
        (
            SampleOptions {
                shoulder_axes_parallel: true,
                ..plain
            },
            "parallel",
            4,
        ),
    ]
}

/// Round trips on random arms of one layout: (poses with `most` solutions, poses, most seen).
fn round_trips(options: SampleOptions, what: &str, most: usize) -> (usize, usize, usize) {
    let (mut full, mut poses, mut seen) = (0, 0, 0);
    for seed in 0..arms() {
        let (model, geometry) = sample_arm(Family::GeneralSlide, seed, &options);
        assert_eq!(geometry.family, Family::GeneralSlide);
        let solver = Solver::new(&model, &geometry);
        let mut rng = SampleRng::new(7100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            poses += 1;
            let n = check_round_trip(&solver, &model, &q, most, &format!("{what} arm {seed}"));
            seen = seen.max(n);
            if n == most {
                full += 1;
            }
        }
    }
    eprintln!("general-slide, axes 1 and 2 {what}: {full} of {poses} poses with {most} solutions, most {seen}");
    (full, poses, seen)
}

#[test]
fn arms_with_axes_1_and_2_apart_round_trip_with_at_most_four_positions() {
    // Pieper 1968 (from memory): a quartic, at most 4 positions, each with 2 wrist solutions;
    // some poses reach all 4.
    let (options, what, most) = layouts()[0];
    let (full, _, _) = round_trips(options, what, most);
    assert!(full > 0, "no pose reached 4 positions");
}

#[test]
fn arms_with_axes_1_and_2_meeting_round_trip_with_at_most_four_positions() {
    // Two roots of the distance from the meeting point × two of Paden–Kahan subproblem 2.
    let (options, what, most) = layouts()[1];
    let (full, _, _) = round_trips(options, what, most);
    assert!(full > 0, "no pose reached 4 positions");
}

#[test]
fn arms_with_axes_1_and_2_parallel_round_trip_with_at_most_two_positions() {
    // One root of the height along the axes × two of the law of cosines.
    let (options, what, most) = layouts()[2];
    let (full, _, _) = round_trips(options, what, most);
    assert!(full > 0, "no pose reached 2 positions");
}

/// The solutions of `solver` at `target`, or none.
fn solutions(solver: &Solver, target: &armforge_runtime::Pose) -> Vec<Solution> {
    solver.solve(target).unwrap_or_default()
}

#[test]
fn polar_arms_through_the_general_slide_path_agree_with_their_own_plan() {
    // The polar family's plan (subproblems, no quartic) and the general-slide quartic on the
    // same arms: the same solutions away from reach boundaries.
    let step = GENERAL_SLIDE.position_step().expect("a decoupled family");
    let (mut compared, mut poses) = (0, 0);
    for seed in 0..sample_count(100) as u64 {
        let (model, geometry) = sample_arm(Family::Polar, seed, &SampleOptions::default());
        let own = Solver::new(&model, &geometry);
        // Axes 1 and 2 nearly meeting, but not within the tolerance, make the quartic
        // ill-conditioned (the general family's path has the same limit).
        let arm = &own.plan().arm;
        let gap = armforge_compiler::classify::decoupled::gap(arm, 1, 2);
        if gap < 1e-3 && gap > 1e-6 * arm.scale {
            continue;
        }
        let mut plan = decoupled_plan(&model, &geometry, step);
        plan.labels_by_solving = true;
        let through = Solver::from_plan(plan);
        let mut rng = SampleRng::new(9100 + seed);
        for _ in 0..10 {
            let q = sample_configuration(&model, &mut rng);
            let target = model.forward(&q);
            let a = solutions(&own, &target);
            let b = solutions(&through, &target);
            poses += 1;
            if a.iter().any(|s| !s.flags.is_empty()) || b.iter().any(|s| !s.flags.is_empty()) {
                continue;
            }
            assert_eq!(
                a.len(),
                b.len(),
                "polar arm {seed}, {q:?}: {a:#?} vs {b:#?}"
            );
            for s in &a {
                assert!(
                    b.iter()
                        .any(|t| joint_gap(&model, &s.joints, &t.joints) < 1e-7),
                    "polar arm {seed}: {s:?} missing from the general-slide path's {b:#?}"
                );
            }
            compared += 1;
        }
    }
    eprintln!("polar arms through the general-slide path: {compared} of {poses} poses compared");
    assert!(compared > poses / 2);
}

/// A configuration of `model` whose wrist center is within `eps` × the arm's size of a
/// configuration where two roots merge: from a sample `q`, the slide moved along the
/// direction that keeps the position Jacobian's determinant smallest is not known in closed
/// form, so the band is sampled by bisection on the determinant's sign along the slide.
fn near_merge(solver: &Solver, model: &Model, q: &[f64; 6]) -> Option<[f64; 6]> {
    let det = |q: &[f64; 6]| -> f64 {
        // Finite-difference position Jacobian of the wrist center (joints 1–3).
        let c = |q: &[f64; 6]| wrist_center(solver, q);
        let h = 1e-6;
        let base = c(q);
        let cols: Vec<[f64; 3]> = (0..3)
            .map(|j| {
                let mut p = *q;
                p[j] += h;
                let x = c(&p);
                [0, 1, 2].map(|i| (x[i] - base[i]) / h)
            })
            .collect();
        let [a, b, cc] = [cols[0], cols[1], cols[2]];
        a[0] * (b[1] * cc[2] - b[2] * cc[1]) - a[1] * (b[0] * cc[2] - b[2] * cc[0])
            + a[2] * (b[0] * cc[1] - b[1] * cc[0])
    };
    let [lo, hi] = model.joints[2].joint.limits;
    let mut a = *q;
    let mut b = *q;
    a[2] = lo;
    b[2] = hi;
    let (da, db) = (det(&a), det(&b));
    if da.signum() == db.signum() {
        return None;
    }
    for _ in 0..60 {
        let mut m = a;
        m[2] = 0.5 * (a[2] + b[2]);
        if det(&m).signum() == da.signum() {
            a = m;
        } else {
            b = m;
        }
    }
    Some(a)
}

/// The wrist center of `q` in the world: the plan's wrist center at zero moved by the
/// joints (joints 4–6 turn about lines through it, so they leave it alone).
fn wrist_center(solver: &Solver, q: &[f64; 6]) -> [f64; 3] {
    let arm = &solver.plan().arm;
    let at_center = armforge_runtime::Pose {
        rotation: [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]],
        translation: arm.wrist_center,
    };
    armforge_runtime::forward(&arm.joints, &arm.base, &at_center, q).translation
}

#[test]
fn near_merging_roots_the_solutions_still_reproduce_the_pose() {
    // Where two roots of the quartic merge (the position Jacobian singular: a reach
    // boundary), the solutions found still reproduce the pose, and the configuration itself
    // is found (within the tolerance the flags allow).
    let (mut tried, mut found) = (0, 0);
    for seed in 0..sample_count(100) as u64 {
        let (model, geometry) = sample_arm(Family::GeneralSlide, seed, &SampleOptions::default());
        let solver = Solver::new(&model, &geometry);
        let reach = solver.plan().arm.scale;
        let mut rng = SampleRng::new(9300 + seed);
        let q = sample_configuration(&model, &mut rng);
        let Some(q) = near_merge(&solver, &model, &q) else {
            continue;
        };
        tried += 1;
        let target = model.forward(&q);
        let sols = solutions(&solver, &target);
        for s in &sols {
            let e = pose_error(&solver.forward(&s.joints), &target, reach);
            assert!(e < 1e-6, "arm {seed}: {s:?} misses by {e:e} near a merge");
        }
        if sols.iter().any(|s| joint_gap(&model, &s.joints, &q) < 1e-4) {
            found += 1;
        }
    }
    eprintln!("near merging roots: {found} of {tried} configurations found");
    assert!(tried > 10);
    assert!(found * 10 >= tried * 9, "{found} of {tried}");
}

/// The model of a sample arm with joint 3's slide replaced by `slide` (unit) and the wrist
/// center moved to `center` (the wrist axes through it).
fn with_slide(model: &Model, slide: [f64; 3], center: Option<[f64; 3]>) -> Model {
    let mut m = model.clone();
    m.joints[2].joint.axis = slide;
    if let Some(c) = center {
        for j in 3..6 {
            m.joints[j].joint.point = c;
        }
    }
    m
}

#[test]
fn degenerate_arms_are_rejected_with_the_reason() {
    // Axes 1 and 2 parallel with the slide ⟂ them: no joint changes the height along axis 1
    // (every column of the position Jacobian ⟂ the axes, common practice).
    let (model, _) = sample_arm(
        Family::GeneralSlide,
        3,
        &SampleOptions {
            shoulder_axes_parallel: true,
            ..SampleOptions::default()
        },
    );
    let h = model.joints[0].joint.axis;
    let across = [h[1] - h[2], h[2] - h[0], h[0] - h[1]];
    let norm = across.iter().map(|x| x * x).sum::<f64>().sqrt();
    let across = across.map(|x| x / norm);
    let flat = with_slide(&model, across, None);
    let r = classify(&flat, &Tolerances::default()).expect_err("degenerate");
    assert!(r.to_string().contains("height along axis 1"), "{r}");
    // The slide along axis 2 with the wrist center on axis 2: joint 2 cannot move it.
    let (model, _) = sample_arm(Family::GeneralSlide, 4, &SampleOptions::default());
    let h2 = model.joints[1].joint.axis;
    let p2 = model.joints[1].joint.point;
    let c = [0, 1, 2].map(|i| p2[i] + 0.4 * h2[i]);
    let along = with_slide(&model, h2, Some(c));
    let r = classify(&along, &Tolerances::default()).expect_err("degenerate");
    assert!(r.to_string().contains("joint 2 cannot move"), "{r}");
    // Off axis 2 the same slide is fine (a cylinder about axis 2 swept about axis 1).
    let c = [0, 1, 2].map(|i| c[i] + 0.3 * across[i]);
    let off = with_slide(&model, h2, Some(c));
    let g = classify(&off, &Tolerances::default()).expect("recognised");
    assert_eq!(g.family, Family::GeneralSlide);
}

#[test]
fn the_tray_telescope_reaches_four_positions() {
    // An invented example arm of our lab: the telescope makes about 61° with the hinge axis.
    let path =
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("../arms/tray-telescope-axes.toml");
    let model = armforge_compiler::pipeline::load_model(&path, "tray-telescope")
        .unwrap_or_else(|e| panic!("{e}"));
    let solver = Solver::for_model(&model).unwrap_or_else(|r| panic!("{r}"));
    assert_eq!(solver.plan().arm.family, Family::GeneralSlide);
    let mut rng = SampleRng::new(27);
    let (mut eight, poses) = (0, sample_count(300));
    for _ in 0..poses {
        let q = sample_configuration(&model, &mut rng);
        if check_round_trip(&solver, &model, &q, 8, "tray-telescope") == 8 {
            eight += 1;
        }
    }
    eprintln!("tray-telescope: {eight} of {poses} poses with 8 solutions");
    // Pieper 1968 (from memory): up to 4 positions; this arm reaches them.
    assert!(eight > 0);
}
