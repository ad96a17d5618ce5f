//! The general position step on random arms: every candidate that passes its check places the
//! wrist center on the target (forward kinematics, product of exponentials: Murray, Li &
//! Sastry, A Mathematical Introduction to Robotic Manipulation, 1994, §3.2), the configuration
//! the target came from is among them, labels read back, at most 4 solutions (Pieper 1968).

use armforge_runtime::fk::joint_motion;
use armforge_runtime::internal::{branch_of, BranchRule, WristRule};
use armforge_runtime::plan::{evaluate, Op};
use armforge_runtime::{Joint, JointKind, Pose};

use super::*;
use crate::family::Family;
use crate::plan::decouple;
use crate::plan::samples::{sample_count, SampleRng};

fn revolute(axis: [f64; 3], point: [f64; 3]) -> Joint {
    Joint {
        kind: JointKind::Revolute,
        axis,
        point,
        direction: 1.0,
        offset: 0.0,
        limits: [-std::f64::consts::PI, std::f64::consts::PI],
    }
}

/// A random general arm (direct joint data; the wrist is three joints through `c`).
fn random_arm(rng: &mut SampleRng) -> Arm {
    let h1 = rng.direction();
    let h2 = rng.direction_away_from(&h1, 0.9);
    let h3 = rng.direction();
    let p1 = rng.point(0.2);
    let p2 = num::add(&p1, &rng.point(0.4));
    let p3 = num::add(&p2, &rng.point(0.6));
    let c = num::add(&p3, &rng.point(0.6));
    let mut joints = [revolute([0.0, 0.0, 1.0], c); 6];
    for (j, (h, p)) in joints.iter_mut().zip([(h1, p1), (h2, p2), (h3, p3)]) {
        *j = revolute(h, p);
    }
    joints[3] = revolute(rng.direction(), c);
    joints[4] = revolute(rng.direction(), c);
    joints[5] = revolute(rng.direction(), c);
    for j in joints.iter_mut() {
        j.point = num::perpendicular(&j.point, &j.axis);
    }
    Arm {
        family: Family::Elbow,
        joints,
        base: Pose::IDENTITY,
        tool: Pose {
            rotation: Pose::IDENTITY.rotation,
            translation: c,
        },
        wrist_center: c,
        scale: 2.0,
    }
}

/// The wrist center after joints 1–3 at `q` (base frame).
fn place(arm: &Arm, q: &[f64; 3]) -> [f64; 3] {
    let mut p = arm.wrist_center;
    for i in (0..3).rev() {
        p = joint_motion(&arm.joints[i], q[i]).transform_point(&p);
    }
    p
}

struct Position {
    ops: Vec<Op>,
    slots: Vec<(ArmSolution, [u32; 4])>,
    rule: BranchRule,
}

fn position_plan(arm: &Arm) -> Position {
    let k = constants(arm);
    let mut g = Graph::new();
    let t = decouple::target(&mut g);
    let sols = solve(&mut g, arm, &k, &t, t.translation);
    let roots: Vec<Id> = sols
        .iter()
        .flat_map(|s| {
            [
                s.angles[0],
                s.angles[1],
                s.angles[2],
                s.checks[0].have_squared,
            ]
        })
        .collect();
    let (compact, map) = g.compact(&roots);
    let m = |id: Id| map[id as usize].unwrap();
    let slots = sols
        .iter()
        .map(|s| {
            let ids = [
                m(s.angles[0]),
                m(s.angles[1]),
                m(s.angles[2]),
                m(s.checks[0].have_squared),
            ];
            (s.clone(), ids)
        })
        .collect();
    let (shoulder, elbow) = rules(arm, &k);
    Position {
        ops: compact.nodes().iter().map(|n| n.op).collect(),
        slots,
        rule: BranchRule {
            shoulder,
            elbow,
            wrist: WristRule {
                normal: [0.0, 0.0, 1.0],
                axis5: [1.0, 0.0, 0.0],
                axis6: [1.0, 0.0, 0.0],
            },
            mirrored: false,
        },
    }
}

/// The real solutions (joints 1–3) the plan finds for the wrist-center target `target`.
fn real_solutions(arm: &Arm, plan: &Position, target: [f64; 3]) -> Vec<([f64; 3], Branch)> {
    let mut inputs = [0.0; 16];
    inputs[9..12].copy_from_slice(&target);
    inputs[12] = 1.0;
    inputs[14] = 1.0;
    let mut values = vec![0.0; plan.ops.len()];
    assert!(evaluate(&plan.ops, &inputs, &mut values));
    let tol = 1e-10 * arm.scale;
    plan.slots
        .iter()
        .filter(|(_, ids)| values[ids[3] as usize] <= tol * tol)
        .map(|(s, ids)| {
            let q = [ids[0], ids[1], ids[2]].map(|i| values[i as usize]);
            (
                q,
                Branch {
                    shoulder: s.shoulder,
                    elbow: s.elbow,
                    wrist: armforge_runtime::Wrist::Leading,
                },
            )
        })
        .collect()
}

use armforge_runtime::Branch;

fn angle_gap(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(std::f64::consts::TAU);
    d.min(std::f64::consts::TAU - d)
}

#[test]
fn random_general_arms_place_the_wrist_center_and_find_the_source_configuration() {
    let mut rng = SampleRng::new(21);
    let arms = sample_count(200);
    let poses = 20;
    let (mut worst, mut missing, mut mislabelled, mut most, mut four) = (0.0f64, 0, 0, 0, 0);
    let mut counts = [0usize; 5];
    for _ in 0..arms {
        let arm = random_arm(&mut rng);
        let plan = position_plan(&arm);
        for _ in 0..poses {
            let q = [0; 3].map(|_| rng.range(-3.1, 3.1));
            let target = place(&arm, &q);
            let found = real_solutions(&arm, &plan, target);
            // Distinct solutions (two slots never hold the same root, but a double root can
            // appear in two).
            let mut distinct: Vec<[f64; 3]> = Vec::new();
            for (s, branch) in &found {
                let p = place(&arm, s);
                worst = worst.max(num::norm(&num::sub(&p, &target)));
                let mut joints = arm.joints;
                for j in joints.iter_mut() {
                    j.limits = [-10.0, 10.0];
                }
                let full = [s[0], s[1], s[2], 0.0, 0.0, 0.0];
                let read = branch_of(&plan.rule, &joints, &full);
                if (read.shoulder, read.elbow) != (branch.shoulder, branch.elbow) {
                    mislabelled += 1;
                }
                if !distinct
                    .iter()
                    .any(|d| (0..3).all(|i| angle_gap(d[i], s[i]) < 1e-6))
                {
                    distinct.push(*s);
                }
            }
            let has_source = found
                .iter()
                .any(|(s, _)| (0..3).all(|i| angle_gap(s[i], q[i]) < 1e-6));
            if !has_source {
                missing += 1;
            }
            most = most.max(distinct.len());
            counts[distinct.len().min(4)] += 1;
            if distinct.len() == 4 {
                four += 1;
            }
        }
    }
    eprintln!(
        "general position step: {arms} arms × {poses} poses, worst wrist-center error {worst:.2e} m, \
         source configuration missing {missing}, mislabelled {mislabelled}, solutions per pose {counts:?}"
    );
    assert!(worst < 1e-9, "{worst:e}");
    assert!(most <= 4);
    assert!(four > 0);
    assert_eq!(missing, 0);
}
