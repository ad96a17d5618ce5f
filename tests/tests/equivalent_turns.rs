//! Equivalent angles without combinations: the solution set of an arm whose joints all turn
//! ±720° is as small as that of the same arm with ±180° (one solution per branch), `solve`
//! runs on a thread with a 64 KiB stack, and the other in-range values of each joint come
//! from `Solution::equivalents`.

use armforge_runtime::{Pose, SolutionSet, JOINTS};

armforge_runtime::solver!(mod wide = "fixtures/turns/bench-elbow-720.toml");
armforge_runtime::solver!(mod narrow = "fixtures/turns/bench-elbow-180.toml");

/// Joint values (radians) inside both arms' ranges, away from singular poses.
const Q: [f64; JOINTS] = [0.3, -0.4, 0.5, 1.1, -0.7, 2.9];

#[test]
fn the_set_is_as_large_for_two_turns_as_for_half_a_turn_each_way() {
    assert_eq!(wide::CAPACITY, 8);
    assert_eq!(wide::CAPACITY, narrow::CAPACITY);
    assert_eq!(
        core::mem::size_of::<wide::Solutions>(),
        core::mem::size_of::<narrow::Solutions>()
    );
    assert_eq!(
        core::mem::size_of::<wide::Solutions>(),
        core::mem::size_of::<SolutionSet<8>>()
    );
}

#[test]
fn solve_runs_on_a_64_kib_stack() {
    let target: Pose = wide::forward(&Q);
    let count = std::thread::Builder::new()
        .stack_size(64 * 1024)
        .spawn(move || wide::solve(&target).len())
        .expect("spawns")
        .join()
        .expect("solve returns on a 64 KiB stack");
    assert_eq!(count, 8);
}

#[test]
fn each_joint_lists_its_other_turns_and_solve_near_keeps_the_current_values() {
    let target = wide::forward(&Q);
    let set = wide::solve(&target);
    let own = set
        .iter()
        .find(|s| s.branch == wide::branch_of(&Q))
        .expect("the original's branch");
    for (held, q) in own.joints.iter().zip(Q) {
        // The held value is the one nearest the range's center (zero): within half a turn.
        assert!(held.abs() <= core::f64::consts::PI + 1e-12);
        assert!((held - q).abs() < 1e-9, "{own:?}");
    }
    // ±720° around a value within half a turn of zero: two turns one way, one the other.
    let listed = own.equivalents(&wide::JOINT_TABLE);
    assert_eq!(listed.len(), 18);
    assert_eq!(listed.configurations(), 4usize.pow(6) - 1);
    // Every listed value is the same position: the pose does not move.
    for e in own.equivalents(&wide::JOINT_TABLE) {
        let mut q = own.joints;
        q[e.joint] = e.value;
        let p = wide::forward(&q);
        for r in 0..3 {
            assert!((p.translation[r] - target.translation[r]).abs() < 1e-9);
        }
    }
    // Whole turns away on every joint (within ±720°): solve_near gives those values back,
    // not the held ones.
    let turns = [-2.0, 1.0, 1.0, -1.0, 1.0, 1.0];
    let mut current = Q;
    for (c, k) in current.iter_mut().zip(turns) {
        *c += k * core::f64::consts::TAU;
    }
    let near = wide::solve_near(&target, &current).expect("reachable");
    for (got, want) in near.joints.iter().zip(current) {
        assert!((got - want).abs() < 1e-9, "{near:?}");
    }
    assert_eq!(narrow::solve(&target).len(), set.len());
}
