//! The plane–line step on random joints, lines and planes: each real root reaches the two
//! numbers when its turns are applied by nalgebra's axis–angle rotations (an implementation
//! outside this project), the turns the numbers came from are among the roots, and there are at
//! most 4 (the quartic's degree; Pieper 1968).

use armforge_runtime::plan::evaluate;
use nalgebra::{Rotation3, Unit, Vector3};

use super::*;
use crate::plan::samples::{sample_count, SampleRng};

fn v(a: [f64; 3]) -> Vector3<f64> {
    Vector3::from(a)
}

/// Turn the point `x` by `angle` about the line `(h, p)` (nalgebra).
fn turn_point(h: [f64; 3], p: [f64; 3], angle: f64, x: Vector3<f64>) -> Vector3<f64> {
    let r = Rotation3::from_axis_angle(&Unit::new_normalize(v(h)), angle);
    v(p) + r * (x - v(p))
}

/// Turn the direction `x` by `angle` about `h` (nalgebra).
fn turn_dir(h: [f64; 3], angle: f64, x: Vector3<f64>) -> Vector3<f64> {
    Rotation3::from_axis_angle(&Unit::new_normalize(v(h)), angle) * x
}

struct Case {
    k: PlaneLine,
    a: Vector3<f64>,
    o: Vector3<f64>,
    n: Vector3<f64>,
    q: Vector3<f64>,
}

impl Case {
    fn random(rng: &mut SampleRng) -> Case {
        Case {
            k: PlaneLine {
                line_joint: (rng.direction(), rng.point(0.5)),
                plane_joint: (rng.direction(), rng.point(0.5)),
                scale: 1.0,
            },
            a: v(rng.direction()),
            o: v(rng.point(0.5)),
            n: v(rng.direction()),
            q: v(rng.point(0.5)),
        }
    }

    /// `(n′ · a′, n′ · (o′ − q′))` after the turns (nalgebra).
    fn numbers(&self, psi_l: f64, psi_p: f64) -> (f64, f64) {
        let (hl, pl) = self.k.line_joint;
        let (hp, pp) = self.k.plane_joint;
        let a = turn_dir(hl, psi_l, self.a);
        let o = turn_point(hl, pl, psi_l, self.o);
        let n = turn_dir(hp, psi_p, self.n);
        let q = turn_point(hp, pp, psi_p, self.q);
        (n.dot(&a), n.dot(&(o - q)))
    }
}

/// Runs the step on one case for the numbers `(c, d)`: each root's `(ψL, ψP, residual)`.
fn roots(case: &Case, c: f64, d: f64) -> Vec<(f64, f64, f64)> {
    let mut g = Graph::new();
    let input = |g: &mut Graph, i: usize| [0, 1, 2].map(|j| g.input(i + j));
    let aim = Aim {
        direction: input(&mut g, 0),
        point: input(&mut g, 3),
        normal: input(&mut g, 6),
        on_plane: input(&mut g, 9),
        cos: g.input(12),
        distance: g.input(13),
    };
    let found = solve(&mut g, &case.k, &aim, "t");
    let wanted: Vec<Id> = found
        .iter()
        .flat_map(|r| {
            [
                r.line_turn.0,
                r.line_turn.1,
                r.plane_turn.0,
                r.plane_turn.1,
                r.residual,
            ]
        })
        .collect();
    let (compact, map) = g.compact(&wanted);
    let ops: Vec<_> = compact.nodes().iter().map(|n| n.op).collect();
    let mut inputs = [0.0; 16];
    for (i, x) in [case.a, case.o, case.n, case.q].iter().enumerate() {
        inputs[3 * i..3 * i + 3].copy_from_slice(x.as_slice());
    }
    inputs[12] = c;
    inputs[13] = d;
    let mut values = vec![0.0; ops.len()];
    assert!(evaluate(&ops, &inputs, &mut values));
    let at = |id: Id| values[map[id as usize].unwrap() as usize];
    found
        .iter()
        .map(|r| {
            (
                at(r.line_turn.1).atan2(at(r.line_turn.0)),
                at(r.plane_turn.1).atan2(at(r.plane_turn.0)),
                at(r.residual),
            )
        })
        .collect()
}

fn angle_gap(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(std::f64::consts::TAU);
    d.min(std::f64::consts::TAU - d)
}

#[test]
fn real_roots_reach_the_numbers_and_include_the_source() {
    let mut rng = SampleRng::new(71);
    let tol = 1e-10;
    let mut four = 0;
    let cases = sample_count(2000);
    for _ in 0..cases {
        let case = Case::random(&mut rng);
        let (psi_l, psi_p) = (rng.range(-3.1, 3.1), rng.range(-3.1, 3.1));
        let (c, d) = case.numbers(psi_l, psi_p);
        let found = roots(&case, c, d);
        let real: Vec<_> = found.iter().filter(|r| r.2 <= tol * tol).collect();
        for r in &real {
            let (c2, d2) = case.numbers(r.0, r.1);
            assert!(
                (c2 - c).abs() < 1e-9 && (d2 - d).abs() < 1e-9,
                "{r:?} misses"
            );
        }
        assert!(
            real.iter()
                .any(|r| angle_gap(r.0, psi_l) < 1e-6 && angle_gap(r.1, psi_p) < 1e-6),
            "source ({psi_l}, {psi_p}) not among {found:?}"
        );
        let mut distinct: Vec<(f64, f64)> = Vec::new();
        for r in &real {
            if !distinct
                .iter()
                .any(|x| angle_gap(x.0, r.0) < 1e-7 && angle_gap(x.1, r.1) < 1e-7)
            {
                distinct.push((r.0, r.1));
            }
        }
        assert!(distinct.len() <= 4);
        four += usize::from(distinct.len() == 4);
    }
    // Four real roots occur on some cases (the bound is reached).
    assert!(four > 0, "no case with 4 roots in {cases}");
    eprintln!("plane–line: {four} of {cases} cases with 4 roots");
}
