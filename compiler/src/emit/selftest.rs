//! The `#[cfg(test)]` round trip carried by every emitted module: seeded random
//! configurations → `forward` → `solve`, needing no dependency (an inline LCG).

use proc_macro2::TokenStream;
use quote::quote;

use super::expr::literal;

/// The test module; `reach` scales the position error.
pub fn module(reach: f64) -> TokenStream {
    let reach = literal(reach).0;
    quote! {
        #[cfg(test)]
        mod tests {
            use super::{branch_of, forward, solve, JOINTS, JOINT_TABLE};

            /// The arm's length scale for position errors (metres).
            #[allow(clippy::approx_constant, clippy::excessive_precision)]
            const REACH: f64 = #reach;

            /// A linear congruential generator (Knuth's MMIX constants): uniform in [0, 1).
            fn next(state: &mut u64) -> f64 {
                *state = state
                    .wrapping_mul(6_364_136_223_846_793_005)
                    .wrapping_add(1_442_695_040_888_963_407);
                (*state >> 11) as f64 / (1u64 << 53) as f64
            }

            fn error(a: &::armforge_runtime::Pose, b: &::armforge_runtime::Pose) -> f64 {
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

            fn same(a: &[f64; JOINTS], b: &[f64; JOINTS]) -> bool {
                let mut close = true;
                for ((x, y), joint) in a.iter().zip(b.iter()).zip(JOINT_TABLE.iter()) {
                    let d = match joint.kind {
                        ::armforge_runtime::JointKind::Revolute => {
                            ::armforge_runtime::internal::wrap(x - y, 0.0)
                        }
                        ::armforge_runtime::JointKind::Prismatic => x - y,
                    };
                    close &= ::armforge_runtime::math::abs(d) < 1e-6;
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
                        let lo = if lo.is_finite() { lo } else { -::core::f64::consts::PI };
                        let hi = if hi.is_finite() { hi } else { ::core::f64::consts::PI };
                        *value = lo + (hi - lo) * next(&mut state);
                    }
                    let target = forward(&q);
                    let solutions = solve(&target);
                    assert!(!solutions.is_empty(), "no solution for a pose made by forward");
                    let mut found = false;
                    for s in solutions.iter() {
                        assert!(error(&forward(&s.joints), &target) < 1e-8);
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
