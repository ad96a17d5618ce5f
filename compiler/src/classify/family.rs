//! Which family joints 1–3 belong to, checking exactly what each family's solve needs.

use armforge_runtime::JointKind;
use nalgebra::{Matrix3, Point3};

use super::context::Context;
use super::lines::angle_between_directions;
use super::reject::{kind_letter, Note, Reason, Rejection};
use super::Family;

/// Decides the family of joints 1–3 of `ctx`'s arm, whose wrist center is `center`.
pub fn decide(ctx: &Context, center: &Point3<f64>) -> Result<Family, Rejection> {
    use JointKind::{Prismatic as P, Revolute as R};
    match [ctx.kind(1), ctx.kind(2), ctx.kind(3)] {
        [R, R, R] => check_elbow(ctx, center).map(|()| Family::Elbow),
        [R, R, P] => check_polar(ctx).map(|()| Family::Polar),
        [R, P, P] => check_cylindrical(ctx).map(|()| Family::Cylindrical),
        [P, P, P] => check_cartesian(ctx).map(|()| Family::Cartesian),
        kinds => {
            let pattern = kinds
                .iter()
                .map(|&k| kind_letter(k).to_string())
                .collect::<Vec<_>>()
                .join(" ");
            // The first joint at which the pattern leaves every family's pattern.
            let families = [[R, R, R], [R, R, P], [R, P, P], [P, P, P]];
            let matching = |n: usize| families.iter().any(|f| f[..n] == kinds[..n]);
            let first_odd = (1..=3).find(|&n| !matching(n)).unwrap_or(3);
            Err(ctx.reject(
                Reason::UnsupportedPattern { pattern },
                first_odd,
                Vec::new(),
            ))
        }
    }
}

/// Joint 1 must be able to turn the wrist center into the plane joints 2–3 keep it in.
fn check_axis_1_not_parallel_to_2(ctx: &Context) -> Result<(), Rejection> {
    if ctx.parallel(1, 2) {
        let notes = if ctx.three_parallel(1) {
            vec![Note::ThreeParallelAxes { first: 1 }]
        } else {
            Vec::new()
        };
        let angle = ctx.angle(1, 2);
        return Err(ctx.reject(Reason::Axes1And2Parallel { angle }, 2, notes));
    }
    Ok(())
}

/// Elbow: axis 1 ∦ axis 2, axis 2 ∥ axis 3, an upper arm (axes 2 and 3 apart) and a forearm
/// (wrist center off axis 3), so the law of cosines sets joint 3.
fn check_elbow(ctx: &Context, center: &Point3<f64>) -> Result<(), Rejection> {
    check_axis_1_not_parallel_to_2(ctx)?;
    if !ctx.parallel(2, 3) {
        let angle = ctx.angle(2, 3);
        let notes = vec![Note::PieperQuartic];
        return Err(ctx.reject(Reason::ElbowAxes2And3NotParallel { angle }, 3, notes));
    }
    let distance = ctx.gap(2, 3);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject(Reason::ElbowAxes2And3Coincide { distance }, 3, Vec::new()));
    }
    let distance = ctx.line(3).distance_to(center);
    if distance <= ctx.tol.distance {
        return Err(ctx.reject(Reason::WristCenterOnAxis3 { distance }, 3, Vec::new()));
    }
    Ok(())
}

/// Polar: axis 1 ∦ axis 2 and the slide ⟂ axis 2, so the wrist center's component along
/// axis 2 stays fixed while joints 2 and 3 move.
fn check_polar(ctx: &Context) -> Result<(), Rejection> {
    check_axis_1_not_parallel_to_2(ctx)?;
    let angle = ctx.angle(2, 3);
    if angle < std::f64::consts::FRAC_PI_2 - ctx.tol.angle {
        return Err(ctx.reject(Reason::PolarSlideNotPerpendicular { angle }, 3, Vec::new()));
    }
    Ok(())
}

/// Cylindrical: the component of the wrist center along axis 1 is `h₁·s₂ d₂ + h₁·s₃ d₃` plus a
/// constant, its distance from axis 1 a quadratic. The solve is well-posed when the slides are
/// independent (the quadratic's leading coefficient is then the squared length of the
/// combination ⟂ axis 1, which is not zero) and one slide has a component along axis 1 (so the
/// linear equation can be solved for it).
fn check_cylindrical(ctx: &Context) -> Result<(), Rejection> {
    if ctx.parallel(2, 3) {
        let angle = ctx.angle(2, 3);
        return Err(ctx.reject(Reason::CylindricalSlidesParallel { angle }, 3, Vec::new()));
    }
    let perpendicular = |n: usize| ctx.angle(1, n) >= std::f64::consts::FRAC_PI_2 - ctx.tol.angle;
    if perpendicular(2) && perpendicular(3) {
        let angles = [ctx.angle(1, 2), ctx.angle(1, 3)];
        return Err(ctx.reject(
            Reason::CylindricalSlidesPerpendicularToAxis1 { angles },
            3,
            Vec::new(),
        ));
    }
    Ok(())
}

/// Cartesian: the three slides must be linearly independent (a 3×3 linear system).
fn check_cartesian(ctx: &Context) -> Result<(), Rejection> {
    for (a, b) in [(1, 2), (1, 3), (2, 3)] {
        if ctx.parallel(a, b) {
            let reason = Reason::CartesianSlidesDependent {
                parallel_pair: Some([a, b]),
                angle: ctx.angle(a, b),
            };
            return Err(ctx.reject(reason, b, Vec::new()));
        }
    }
    let angle = slide_3_out_of_plane(ctx);
    if angle <= ctx.tol.angle {
        let reason = Reason::CartesianSlidesDependent {
            parallel_pair: None,
            angle,
        };
        return Err(ctx.reject(reason, 3, Vec::new()));
    }
    Ok(())
}

/// The angle by which slide 3 leaves the plane of slides 1 and 2 (which are not parallel).
pub fn slide_3_out_of_plane(ctx: &Context) -> f64 {
    let s1 = ctx.line(1).direction.into_inner();
    let s2 = ctx.line(2).direction.into_inner();
    let s3 = ctx.line(3).direction.into_inner();
    let normal = s1.cross(&s2);
    let in_plane = angle_between_directions(&normal, &s3);
    (std::f64::consts::FRAC_PI_2 - in_plane).abs()
}

/// The smallest singular value of the matrix of the three unit slide directions: zero when
/// they are dependent (nalgebra SVD).
pub fn slide_independence(ctx: &Context) -> f64 {
    let m = Matrix3::from_columns(&[
        ctx.line(1).direction.into_inner(),
        ctx.line(2).direction.into_inner(),
        ctx.line(3).direction.into_inner(),
    ]);
    m.singular_values().min()
}
