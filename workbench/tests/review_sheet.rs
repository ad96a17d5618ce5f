//! `armforge explain`: the review sheet of every example arm (insta snapshots, so a change in
//! an equation or a number shows in review), byte-identical across runs, its numbers checked
//! against hand-worked values and against the solver, and the command's exit codes.

mod common;

use common::{classified, examples, workspace};

use std::process::Command;

use armforge_compiler::classify::Family;
use armforge_compiler::plan::build_plan;
use armforge_compiler::plan::vec3::num;
use armforge_compiler::plan::Arm;
use armforge_compiler::solver::Solver;
use armforge_runtime::{joint_motion, Pose};
use armforge_workbench::review::review_sheet;

fn sheet(path: &str, text: &str) -> String {
    let (model, geometry) = classified(path, text);
    review_sheet(&model, &geometry, &build_plan(&model, &geometry))
}

#[test]
fn sheets_of_the_example_arms() {
    let arms = examples();
    assert!(
        arms.len() >= 5,
        "expected the example arms, found {}",
        arms.len()
    );
    for (path, text) in &arms {
        let name = path
            .trim_start_matches("arms/")
            .trim_end_matches(".toml")
            .to_string();
        insta::assert_snapshot!(name, sheet(path, text));
    }
}

#[test]
fn sheets_are_byte_identical_across_runs() {
    for (path, text) in examples() {
        let first = sheet(&path, &text);
        let second = sheet(&path, &text);
        assert_eq!(first, second, "{path}: two runs differ");
    }
}

#[test]
fn every_sheet_carries_the_safety_caution_and_every_section() {
    for (path, text) in examples() {
        let s = sheet(&path, &text);
        assert!(
            s.contains("not a safety function") && s.contains("ISO 10218"),
            "{path}"
        );
        for section in [
            "## 1. The arm as described",
            "## 2. Classification",
            "## 3. The method",
            "## 4. The solve, step by step",
            "## 5. Branches",
            "## 6. Singular configurations",
            "## 7. Reach",
            "## 8. Tolerances",
            "## 9. The plan as evaluated",
        ] {
            assert!(s.contains(section), "{path}: no {section}");
        }
    }
}

#[test]
fn bench_elbow_numbers_match_hand_worked_values() {
    // Worked by hand from arms/bench-elbow-dh.toml (standard DH, Spong, Hutchinson &
    // Vidyasagar 2006, §3.2): the forearm runs 380 mm along x and 75 mm along z from axis 3,
    // so |V| = √(380² + 75²) = 387.330608 mm (Pythagoras) and the stretched arm puts V along
    // L = (0, 0, 400): φ0 = −atan2(380, 75) = −78.83512°.
    let (path, text) = examples()
        .into_iter()
        .find(|(p, _)| p.ends_with("bench-elbow-dh.toml"))
        .expect("bench-elbow example");
    let s = sheet(&path, &text);
    assert!(
        s.contains("V = (380, 0, 75) mm,  |V| = 387.330608 mm"),
        "{s}"
    );
    assert!(s.contains("L = (0, 0, 400) mm,  |L| = 400 mm"));
    assert!(s.contains("φ0 = −78.83512°"));
    // c_tool: the wrist center 90 mm (flange) + 120 mm (gripper) behind the tool point.
    assert!(s.contains("c_tool = (0, 0, −210) mm"));
    let expected = -(380f64.atan2(75.0)).to_degrees();
    assert!((expected + 78.83512).abs() < 1e-5);
}

/// The roots of `f` on `[−π, π]` by sign changes on a fine grid and bisection (independent of
/// the plan's closed forms).
fn grid_roots(f: impl Fn(f64) -> f64) -> Vec<f64> {
    let n = 20000;
    let pi = std::f64::consts::PI;
    let mut out = Vec::new();
    for i in 0..n {
        let (mut lo, mut hi) = (
            -pi + 2.0 * pi * i as f64 / n as f64,
            -pi + 2.0 * pi * (i + 1) as f64 / n as f64,
        );
        if f(lo).signum() == f(hi).signum() {
            continue;
        }
        for _ in 0..80 {
            let mid = 0.5 * (lo + hi);
            if f(mid).signum() == f(lo).signum() {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        out.push(0.5 * (lo + hi));
    }
    out
}

/// A middle-slide arm's joints 1–3 from the sheet's equations: (1) and (2) of §4 with its
/// constants `p0, pc, ps, e2, k`; roots of joint 3 by [`grid_roots`].
fn middle_slide_solutions(arm: &Arm, ct: [f64; 3]) -> Vec<[f64; 3]> {
    use armforge_compiler::family::middle_slide::plan::{constants, Layout};
    let k = constants(arm);
    let u = num::sub(&ct, &k.p1);
    let (rho, zeta) = (num::dot(&u, &u), num::dot(&k.h1, &u));
    let p = |t: f64| {
        num::add(
            &k.p0,
            &num::add(&num::scale(&k.pc, t.cos()), &num::scale(&k.ps, t.sin())),
        )
    };
    let mut joints_2_3 = Vec::new();
    match k.layout {
        Layout::Tilted => {
            let d2 = |t: f64| (zeta - num::dot(&k.h1, &p(t))) / k.k;
            let f = |t: f64| {
                let x = num::add(&p(t), &num::scale(&k.e2, d2(t)));
                num::dot(&x, &x) - rho
            };
            joints_2_3.extend(grid_roots(f).into_iter().map(|t| (d2(t), t)));
        }
        Layout::Level => {
            for t in grid_roots(|t| num::dot(&k.h1, &p(t)) - zeta) {
                let beta = num::dot(&k.e2, &p(t));
                let gamma = num::dot(&p(t), &p(t)) - rho;
                let root = (beta * beta - gamma).max(0.0).sqrt();
                joints_2_3.push((-beta + root, t));
                joints_2_3.push((-beta - root, t));
            }
        }
    }
    joints_2_3
        .into_iter()
        .map(|(d2, t3)| {
            let x = num::add(&p(t3), &num::scale(&k.e2, d2));
            let xp = num::sub(&x, &num::scale(&k.h1, num::dot(&k.h1, &x)));
            let t1 = num::dot(&k.h1, &num::cross(&xp, &u)).atan2(num::dot(&xp, &u));
            [t1, d2, t3]
        })
        .collect()
}

/// Joints 1–3 (model values) from the sheet's equations with the sheet's constants, for a
/// wrist-center target `ct`, every branch.
fn sheet_position_solutions(family: Family, arm: &Arm, ct: [f64; 3]) -> Vec<[f64; 3]> {
    let mut out = Vec::new();
    match family {
        Family::Elbow | Family::Polar => {
            let k = armforge_compiler::family::elbow::plan::constants(arm);
            let u = num::sub(&ct, &k.p1);
            let a = num::dot(&k.alpha, &u);
            let b = num::dot(&k.beta, &u);
            let e = k.e0 - k.cos12 * num::dot(&k.h1, &u);
            let r2 = a * a + b * b;
            let kk = (r2 - e * e).max(0.0).sqrt();
            for sigma in [1.0, -1.0] {
                let c1 = (a * e - sigma * b * kk) / r2;
                let s1 = (b * e + sigma * a * kk) / r2;
                let t1 = s1.atan2(c1);
                let w = num::add(&num::rotate(&k.h1, -t1, &u), &k.p1_minus_p2);
                let d2 = num::dot(&w, &w) - num::dot(&k.h2, &w).powi(2);
                if family == Family::Elbow {
                    let el = armforge_compiler::family::elbow::plan::constants(arm).two_link;
                    let (l, v) = el.lengths();
                    let cpsi = ((d2 - l * l - v * v) / (2.0 * l * v)).clamp(-1.0, 1.0);
                    for bend in [1.0, -1.0] {
                        let psi = bend * (1.0 - cpsi * cpsi).sqrt().atan2(cpsi);
                        let phi = el.stretched + psi;
                        let x = num::add(
                            &el.l,
                            &num::add(
                                &num::scale(&el.v, phi.cos()),
                                &num::scale(&num::cross(&el.h, &el.v), phi.sin()),
                            ),
                        );
                        let t2 = num::dot(&k.h2, &num::cross(&x, &w)).atan2(num::dot(&x, &w));
                        out.push([t1, t2, el.sense * phi]);
                    }
                } else {
                    let p = armforge_compiler::family::polar::plan::constants(arm);
                    let pp = num::dot(&p.p, &p.p);
                    for sign in [1.0, -1.0] {
                        let s = -p.m + sign * (d2 - (pp - p.m * p.m)).max(0.0).sqrt();
                        let x = num::add(&p.p, &num::scale(&p.u3, s));
                        let t2 = num::dot(&k.h2, &num::cross(&x, &w)).atan2(num::dot(&x, &w));
                        out.push([t1, t2, s]);
                    }
                }
            }
        }
        Family::Cylindrical => {
            let k = armforge_compiler::family::cylindrical::plan::constants(arm);
            let (h1, p1) = (k.h1, k.p1);
            let y = num::sub(&ct, &p1);
            let z = num::dot(&h1, &y);
            let radial = num::sub(&y, &num::scale(&h1, z));
            let rho2 = num::dot(&radial, &radial);
            let w = num::add(&k.a0, &num::scale(&k.a1, z));
            let dd = num::dot(&k.d, &k.d);
            let dw = num::dot(&k.d, &w);
            let closest = num::dot(&w, &w) - dw * dw / dd;
            for sign in [1.0, -1.0] {
                let s = (-dw + sign * dd.sqrt() * (rho2 - closest).max(0.0).sqrt()) / dd;
                let sk = (z - k.height - k.along_j * s) / k.along_k;
                let x = num::add(&w, &num::scale(&k.d, s));
                let t1 = num::dot(&h1, &num::cross(&x, &radial)).atan2(num::dot(&x, &radial));
                let mut q = [t1, 0.0, 0.0];
                q[k.pivot] = sk;
                q[k.other] = s;
                out.push(q);
            }
        }
        Family::General | Family::GeneralSlide => {
            use armforge_compiler::family::general::plan::Layout;
            let k = armforge_compiler::family::general::plan::constants(arm);
            if k.layout != Layout::Skew && !k.slide {
                return general_quadratic_solutions(&k, ct);
            }
            // A slide: r(d3) = r0 + d3 e3 (e3 = rs), d3 over the slide's stroke.
            let [lo3, hi3] = arm.joints[2].limits.map(|v| arm.joints[2].model_value(v));
            let (lo3, hi3) = (lo3.min(hi3) - 1e-3, lo3.max(hi3) + 1e-3);
            // §4.2–4.3: F(θ3) = X² + Y² + Z² − |r|² with the sheet's constants; its roots by
            // sign changes on a fine grid and bisection (independent of Ferrari's method).
            let u = num::sub(&ct, &k.f1);
            let (rho, zeta) = (num::dot(&u, &u), num::dot(&k.h1, &u));
            let r = |t: f64| {
                if k.slide {
                    return num::add(&k.r0, &num::scale(&k.rs, t));
                }
                num::add(
                    &k.r0,
                    &num::add(&num::scale(&k.rc, t.cos()), &num::scale(&k.rs, t.sin())),
                )
            };
            let xyz = |t: f64| {
                let r = r(t);
                let rr = num::dot(&r, &r);
                let z = num::dot(&k.h2, &r);
                let x = (rho - k.a * k.a - rr) / (2.0 * k.a);
                let y = (zeta - k.cos_a * z) / k.sin_a;
                (r, rr, x, y, z)
            };
            let big_f = |t: f64| {
                let (_, rr, x, y, z) = xyz(t);
                x * x + y * y + z * z - rr
            };
            let n = 20000;
            let pi = std::f64::consts::PI;
            let (start, span) = if k.slide {
                (lo3, hi3 - lo3)
            } else {
                (-pi, 2.0 * pi)
            };
            for i in 0..n {
                let (mut lo, mut hi) = (
                    start + span * i as f64 / n as f64,
                    start + span * (i + 1) as f64 / n as f64,
                );
                if big_f(lo).signum() == big_f(hi).signum() {
                    continue;
                }
                for _ in 0..80 {
                    let mid = 0.5 * (lo + hi);
                    if big_f(mid).signum() == big_f(lo).signum() {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                let t3 = 0.5 * (lo + hi);
                let (r, _, x, y, z) = xyz(t3);
                let (rn, rl, my) = (num::dot(&k.n, &r), num::dot(&k.ell, &r), k.mu * y);
                let t2 = (rn * my - rl * x).atan2(rn * x + rl * my);
                let w = num::add(
                    &num::add(
                        &num::scale(&k.n, k.a + t2.cos() * rn - t2.sin() * rl),
                        &num::scale(&k.ell, t2.sin() * rn + t2.cos() * rl),
                    ),
                    &num::scale(&k.h2, z),
                );
                let wp = num::sub(&w, &num::scale(&k.h1, num::dot(&k.h1, &w)));
                let t1 = num::dot(&k.h1, &num::cross(&wp, &u)).atan2(num::dot(&wp, &u));
                out.push([t1, t2, t3]);
            }
        }
        Family::Carriage => {
            // §4.2: a cos θ3 + b sin θ3 = e, then the slides by their dual directions.
            let k = armforge_compiler::family::carriage::plan::constants(arm);
            let e = num::dot(&k.n, &ct) - k.k0;
            let r2 = k.a * k.a + k.b * k.b;
            let root = (r2 - e * e).max(0.0).sqrt();
            for sigma in [1.0, -1.0] {
                let c3 = (k.a * e - sigma * k.b * root) / r2;
                let s3 = (k.b * e + sigma * k.a * root) / r2;
                let placed = num::add(
                    &k.hub,
                    &num::add(&num::scale(&k.spoke, c3), &num::scale(&k.spoke_turned, s3)),
                );
                let delta = num::sub(&ct, &placed);
                out.push([
                    num::dot(&k.f1, &delta),
                    num::dot(&k.f2, &delta),
                    s3.atan2(c3),
                ]);
            }
        }
        Family::MiddleSlide => {
            return middle_slide_solutions(arm, ct);
        }
        Family::Cartesian => {
            let inv = armforge_compiler::family::cartesian::plan::slides_inverse(arm);
            let shift = num::sub(&ct, &arm.wrist_center);
            out.push([
                num::dot(&inv[0], &shift),
                num::dot(&inv[1], &shift),
                num::dot(&inv[2], &shift),
            ]);
        }
        _ => {}
    }
    out
}

/// Joints 1–3 (model values) from the general page's equations when axes 1 and 2 meet or are
/// parallel (§4.2–4.3): joint 3 from its one equation, then joints 2 and 1.
fn general_quadratic_solutions(
    k: &armforge_compiler::family::general::plan::Constants,
    ct: [f64; 3],
) -> Vec<[f64; 3]> {
    use armforge_compiler::family::general::plan::Layout;
    let u = num::sub(&ct, &k.f1);
    let (rho, zeta) = (num::dot(&u, &u), num::dot(&k.h1, &u));
    let meet = k.layout == Layout::Meet;
    // K1 cos θ3 + K2 sin θ3 = e (meeting), (h2·rc) cos θ3 + (h2·rs) sin θ3 = e (parallel).
    let (a, b, e) = if meet {
        let k0 = num::dot(&k.r0, &k.r0) + num::dot(&k.rc, &k.rc);
        (
            2.0 * num::dot(&k.r0, &k.rc),
            2.0 * num::dot(&k.r0, &k.rs),
            rho - k0,
        )
    } else {
        (
            num::dot(&k.h2, &k.rc),
            num::dot(&k.h2, &k.rs),
            k.cos_a * zeta - num::dot(&k.h2, &k.r0),
        )
    };
    let r2 = a * a + b * b;
    let kk = (r2 - e * e).max(0.0).sqrt();
    let mut out = Vec::new();
    for sign3 in [1.0, -1.0] {
        let t3 = (b * e + sign3 * a * kk).atan2(a * e - sign3 * b * kk);
        let r = num::add(
            &k.r0,
            &num::add(&num::scale(&k.rc, t3.cos()), &num::scale(&k.rs, t3.sin())),
        );
        let z = num::dot(&k.h2, &r);
        let r_perp = num::sub(&r, &num::scale(&k.h2, z));
        for sign in [1.0, -1.0] {
            let t2 = if meet {
                let d = k.cos_a * k.cos_a - 1.0;
                let (al, be) = ((k.cos_a * z - zeta) / d, (k.cos_a * zeta - z) / d);
                let g2 = (num::dot(&r, &r) - al * al - be * be - 2.0 * al * be * k.cos_a)
                    / (k.sin_a * k.sin_a);
                let zp = num::add(
                    &num::add(&num::scale(&k.h1, al), &num::scale(&k.h2, be)),
                    &num::scale(&num::cross(&k.h1, &k.h2), sign * g2.max(0.0).sqrt()),
                );
                num::dot(&k.h2, &num::cross(&r_perp, &zp)).atan2(num::dot(&r_perp, &zp))
            } else {
                let (rn, rl) = (num::dot(&k.n, &r), num::dot(&k.ell, &r));
                let perp2 = rn * rn + rl * rl;
                let x = (rho - zeta * zeta - k.a * k.a - perp2) / (2.0 * k.a);
                let y = sign * (perp2 - x * x).max(0.0).sqrt();
                (rn * y - rl * x).atan2(rn * x + rl * y)
            };
            // w − f1 = a n + R2 r (R2 about h2 through f2 = f1 + a n).
            let w = num::add(&num::scale(&k.n, k.a), &num::rotate(&k.h2, t2, &r));
            let wp = num::sub(&w, &num::scale(&k.h1, num::dot(&k.h1, &w)));
            let t1 = num::dot(&k.h1, &num::cross(&wp, &u)).atan2(num::dot(&wp, &u));
            out.push([t1, t2, t3]);
        }
    }
    out
}

/// Joints 4–6 (model values) from the sheet's wrist equations, both signs, for the rotation
/// left to the wrist `r456 = (R1 R2 R3)ᵀ rot(G)`.
fn sheet_wrist_solutions(arm: &Arm, r456: &[[f64; 3]; 3]) -> Vec<[f64; 3]> {
    let w = armforge_compiler::plan::wrist::WristAxes::of(arm);
    let (h4, h5, h6, x6) = (w.h4, w.h5, w.h6, w.x6);
    let wrist = Pose {
        rotation: *r456,
        translation: [0.0; 3],
    };
    let v = wrist.rotate(&h6);
    let xv = wrist.rotate(&x6);
    let c45 = num::dot(&h4, &h5);
    let b = num::dot(&h5, &h6);
    let den = 1.0 - c45 * c45;
    let a = num::dot(&h4, &v);
    let alpha = (a - c45 * b) / den;
    let beta = (b - c45 * a) / den;
    let hv = num::cross(&h4, &v);
    let gamma2 = (num::dot(&hv, &hv) - (b - c45 * a).powi(2) / den) / den;
    let gamma = gamma2.max(0.0).sqrt();
    let n = num::cross(&h4, &h5);
    let h6p = num::sub(&h6, &num::scale(&h5, b));
    let mut out = Vec::new();
    for sign in [1.0, -1.0] {
        let z = num::add(
            &num::add(&num::scale(&h4, alpha), &num::scale(&h5, beta)),
            &num::scale(&n, sign * gamma),
        );
        let t5 = num::dot(&h5, &num::cross(&h6, &z)).atan2(num::dot(&h6p, &z));
        let t4 = num::dot(&h4, &num::cross(&z, &v)).atan2(num::dot(&z, &v) - a * a);
        let y = num::rotate(&h5, -t5, &num::rotate(&h4, -t4, &xv));
        let t6 = num::dot(&h6, &num::cross(&x6, &y)).atan2(num::dot(&x6, &y));
        out.push([t4, t5, t6]);
    }
    out
}

fn transpose_mul(a: &[[f64; 3]; 3], b: &[[f64; 3]; 3]) -> [[f64; 3]; 3] {
    std::array::from_fn(|i| std::array::from_fn(|j| (0..3).map(|k| a[k][i] * b[k][j]).sum()))
}

fn mul(a: &[[f64; 3]; 3], b: &[[f64; 3]; 3]) -> [[f64; 3]; 3] {
    std::array::from_fn(|i| std::array::from_fn(|j| (0..3).map(|k| a[i][k] * b[k][j]).sum()))
}

fn wrapped(d: f64) -> f64 {
    d - std::f64::consts::TAU * (d / std::f64::consts::TAU).round()
}

#[test]
fn the_sheets_equations_with_its_numbers_give_the_solvers_joints() {
    // The sheet documents the plan builders' method; evaluating its equations with its
    // constants must reproduce joints 1–3 of every solution the solver returns.
    for (path, text) in examples() {
        let (model, geometry) = classified(&path, &text);
        let solver = Solver::new(&model, &geometry);
        let plan = solver.plan();
        if matches!(
            plan.arm.family,
            Family::ThreeParallel
                | Family::OffsetHand
                | Family::BaseWrist
                | Family::MidWrist
                | Family::BaseParallel
                | Family::ToolFirst
                | Family::BaseSlide
        ) {
            // These equations are the pages of the families with a spherical wrist at joints
            // 4–6 (the other families' steps use the same constants as their plans).
            continue;
        }
        let arm = &plan.arm;
        let joints = plan.arm.joints;
        for step in 0..20 {
            // Configurations spread over the limits (midpoints shifted by a fixed pattern).
            let q: [f64; 6] = std::array::from_fn(|i| {
                let [lo, hi] = joints[i].limits;
                let (lo, hi) = (lo.max(-3.0), hi.min(3.0));
                let t = ((step * 7 + i * 3) % 19) as f64 / 19.0;
                lo + (hi - lo) * (0.1 + 0.8 * t)
            });
            let pose = solver.forward(&q);
            let Ok(solutions) = solver.solve(&pose) else {
                panic!("{path}: no solution for {q:?}");
            };
            // Wrist center target: c_t = B⁻¹ T M⁻¹ c.
            let b = &plan.arm.base;
            let m = &plan.arm.tool;
            let ct = b
                .inverse()
                .compose(&pose)
                .compose(&m.inverse())
                .transform_point(&plan.arm.wrist_center);
            let from_sheet = sheet_position_solutions(plan.arm.family, arm, ct);
            for s in &solutions {
                let theta: Vec<f64> = (0..3).map(|i| joints[i].model_value(s.joints[i])).collect();
                let found = from_sheet.iter().any(|t| {
                    (0..3).all(|i| {
                        let d = t[i] - theta[i];
                        let d = match joints[i].kind {
                            armforge_runtime::JointKind::Revolute => {
                                d - std::f64::consts::TAU * (d / std::f64::consts::TAU).round()
                            }
                            armforge_runtime::JointKind::Prismatic => d,
                        };
                        d.abs() < 1e-9
                    })
                });
                assert!(
                    found,
                    "{path}: solution {:?} (model values {theta:?}) not given by the sheet's \
                     equations {from_sheet:?}",
                    s.joints
                );
                if !s.flags.is_empty() {
                    continue;
                }
                // The wrist: r456 = (R1 R2 R3)ᵀ rot(G), rot(G) = B_Rᵀ R_T M_Rᵀ.
                let mut r123 = Pose::IDENTITY.rotation;
                for (joint, q) in joints.iter().zip(&s.joints).take(3) {
                    r123 = mul(&r123, &joint_motion(joint, *q).rotation);
                }
                let m_t: [[f64; 3]; 3] =
                    std::array::from_fn(|i| std::array::from_fn(|j| m.rotation[j][i]));
                let rot_g = mul(&transpose_mul(&b.rotation, &pose.rotation), &m_t);
                let r456 = transpose_mul(&r123, &rot_g);
                let wrist: Vec<f64> = (3..6).map(|i| joints[i].model_value(s.joints[i])).collect();
                let from_sheet = sheet_wrist_solutions(arm, &r456);
                assert!(
                    from_sheet
                        .iter()
                        .any(|t| (0..3).all(|i| wrapped(t[i] - wrist[i]).abs() < 1e-8)),
                    "{path}: wrist {wrist:?} not given by the sheet's equations {from_sheet:?}"
                );
            }
        }
    }
}

fn armforge() -> Command {
    Command::new(env!("CARGO_BIN_EXE_armforge"))
}

#[test]
fn explain_prints_the_library_sheet_and_writes_files() {
    let root = workspace();
    let out = armforge()
        .current_dir(&root)
        .args(["explain", "arms/hotel-loader-axes.toml"])
        .output()
        .expect("armforge runs");
    assert_eq!(out.status.code(), Some(0));
    let text = std::fs::read_to_string(root.join("arms/hotel-loader-axes.toml")).expect("arm");
    assert_eq!(
        String::from_utf8_lossy(&out.stdout),
        sheet("arms/hotel-loader-axes.toml", &text)
    );
    let dir = std::env::temp_dir().join(format!("armforge-explain-{}", std::process::id()));
    std::fs::create_dir_all(&dir).expect("temp dir");
    let file = dir.join("sheet.md");
    let status = armforge()
        .current_dir(&root)
        .args(["explain", "arms/hotel-loader-axes.toml", "-o"])
        .arg(&file)
        .status()
        .expect("armforge runs");
    assert_eq!(status.code(), Some(0));
    assert_eq!(
        std::fs::read_to_string(&file).expect("written"),
        String::from_utf8_lossy(&out.stdout)
    );
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn explain_exit_codes() {
    let root = workspace();
    let rejected = armforge()
        .current_dir(&root)
        .args(["explain", "arms/rejected/offset-wrist.toml"])
        .output()
        .expect("armforge runs");
    assert_eq!(rejected.status.code(), Some(3));
    assert!(rejected.stdout.is_empty());
    let missing = armforge()
        .current_dir(&root)
        .args(["explain", "arms/no-such-arm.toml"])
        .output()
        .expect("armforge runs");
    assert_eq!(missing.status.code(), Some(5));
}

#[test]
fn sheets_of_millimetre_and_degree_arms_speak_no_metres_or_radians() {
    // One unit system per sheet, the file's: no number with ` m`/` rad`, no `metres` or
    // `radians`, no minus sign as a hyphen before a number, no `1e-20`-style noise.
    let root = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("..");
    let mut checked = 0;
    for name in ["bench-elbow-dh", "tray-gantry-axes"] {
        let path = format!("arms/{name}.toml");
        let text = std::fs::read_to_string(root.join(&path)).expect("arm");
        let sheet = sheet(&path, &text);
        assert!(sheet.contains("lengths in mm, angles in deg"), "{name}");
        for word in [
            "metres", "radians", " rad ", " rad)", " rad,", "rad or m", "e-20",
        ] {
            assert!(!sheet.contains(word), "{name}: the sheet says {word:?}");
        }
        let chars: Vec<char> = sheet.chars().collect();
        for (i, w) in chars.windows(3).enumerate() {
            // A digit, a space and `m` that ends a word: a length in metres.
            let ends = chars.get(i + 3).map_or(true, |c| !c.is_alphanumeric());
            assert!(
                !(w[0].is_ascii_digit() && w[1] == ' ' && w[2] == 'm' && ends),
                "{name}: metres at {:?}",
                chars[i.saturating_sub(40)..(i + 10).min(chars.len())]
                    .iter()
                    .collect::<String>()
            );
            // A hyphen as the minus sign of a number (not in a word, not in an exponent).
            let hyphen_minus = w[1] == '-'
                && w[2].is_ascii_digit()
                && !(w[0].is_alphanumeric() || w[0] == '.' || w[0] == '_');
            assert!(
                !hyphen_minus,
                "{name}: a hyphen as minus sign at {:?}",
                chars[i.saturating_sub(40)..(i + 10).min(chars.len())]
                    .iter()
                    .collect::<String>()
            );
        }
        checked += 1;
    }
    assert_eq!(checked, 2);
}
