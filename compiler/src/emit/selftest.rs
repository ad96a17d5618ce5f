//! The `#[cfg(test)]` round trip carried by every emitted module: seeded random
//! configurations → `forward` → `solve`, needing no dependency (an inline LCG).

use proc_macro2::TokenStream;
use quote::quote;

use super::expr::literal;
use super::ScalarType;

/// The bounds of the round trip in a scalar: the pose error (sum of the rotation entries'
/// errors and the position errors over the reach) and the joint error of the recovered
/// configuration (radians or metres). `f32` carries about 7 significant digits, so its bounds
/// are those of the workspace's f32 round trip (`tests/tests/emitted_f32.rs`).
pub fn bounds(scalar: ScalarType) -> (f64, f64) {
    match scalar {
        ScalarType::F64 => (1e-8, 1e-6),
        ScalarType::F32 => (F32_POSE_BOUND, F32_JOINT_BOUND),
    }
}

/// Largest pose error of an `f32` solver's solutions (see [`bounds`]).
pub const F32_POSE_BOUND: f64 = 1e-3;
/// Largest joint error of the configuration an `f32` solver recovers (see [`bounds`]).
pub const F32_JOINT_BOUND: f64 = 1e-2;

/// The test module; `reach` scales the position error.
pub fn module(reach: f64, scalar: ScalarType) -> TokenStream {
    let reach = literal(reach, scalar).0;
    let (pose_bound, joint_bound) = bounds(scalar);
    let (pose_bound, joint_bound) = (
        literal(pose_bound, scalar).0,
        literal(joint_bound, scalar).0,
    );
    let (ty, generic, float) = (scalar.ty(), scalar.generic(), scalar.core_module());
    let draw = match scalar {
        ScalarType::F64 => quote!(next(&mut state)),
        ScalarType::F32 => quote!(next(&mut state) as f32),
    };
    quote! {
        #[cfg(test)]
        mod tests {
            use super::{branch_of, forward, solve, JOINTS, JOINT_TABLE};

            /// The arm's length scale for position errors (metres).
            #[allow(clippy::approx_constant, clippy::excessive_precision)]
            const REACH: #ty = #reach;

            /// A linear congruential generator (Knuth's MMIX constants): uniform in [0, 1).
            fn next(state: &mut u64) -> f64 {
                *state = state
                    .wrapping_mul(6_364_136_223_846_793_005)
                    .wrapping_add(1_442_695_040_888_963_407);
                (*state >> 11) as f64 / (1u64 << 53) as f64
            }

            fn error(a: &::armforge_runtime::Pose #generic, b: &::armforge_runtime::Pose #generic) -> #ty {
                let mut e = 0.0;
                for (ra, rb) in a.rotation.iter().zip(b.rotation.iter()) {
                    for (x, y) in ra.iter().zip(rb.iter()) {
                        e += ::armforge_runtime::math::abs(x - y);
                    }
                }
                for (x, y) in a.translation.iter().zip(b.translation.iter()) {
                    e += ::armforge_runtime::math::abs(x - y) / REACH;
                }
                e
            }

            fn same(a: &[#ty; JOINTS], b: &[#ty; JOINTS]) -> bool {
                let mut close = true;
                for ((x, y), joint) in a.iter().zip(b.iter()).zip(JOINT_TABLE.iter()) {
                    let d = match joint.kind {
                        ::armforge_runtime::JointKind::Revolute => {
                            ::armforge_runtime::internal::wrap(x - y, 0.0)
                        }
                        ::armforge_runtime::JointKind::Prismatic => x - y,
                    };
                    close &= ::armforge_runtime::math::abs(d) < #joint_bound;
                }
                close
            }

            #[test]
            fn round_trip() {
                let mut state = 0x5eed_u64;
                for _ in 0..256 {
                    let mut q = [0.0; JOINTS];
                    for (value, joint) in q.iter_mut().zip(JOINT_TABLE.iter()) {
                        let [lo, hi] = joint.limits;
                        let lo = if lo.is_finite() { lo } else { -#float::consts::PI };
                        let hi = if hi.is_finite() { hi } else { #float::consts::PI };
                        *value = lo + (hi - lo) * #draw;
                    }
                    let target = forward(&q);
                    let solutions = solve(&target);
                    assert!(!solutions.is_empty(), "no solution for a pose made by forward");
                    let mut found = false;
                    for s in solutions.iter() {
                        assert!(error(&forward(&s.joints), &target) < #pose_bound);
                        if s.flags.is_empty() {
                            assert_eq!(branch_of(&s.joints), s.branch);
                        }
                        found |= same(&s.joints, &q);
                    }
                    assert!(found, "the original configuration is not among the solutions");
                }
            }
        }
    }
}
