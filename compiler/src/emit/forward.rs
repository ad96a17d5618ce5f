//! The emitted `forward`: the product of exponentials (Brockett 1984; Murray, Li & Sastry
//! 1994, ch. 3) with the arm's constants folded. Each revolute joint costs one `sin_cos`; each
//! motion `E_i` is Rodrigues' formula with its constant axis and point, so an axis along a
//! coordinate direction or a point at the origin removes its terms, and the products of the
//! fixed frames are worked out once here, not at run time.

use armforge_runtime::{Joint, JointKind, Pose, JOINTS};
use proc_macro2::{Ident, TokenStream};
use quote::{format_ident, quote};

use super::expr::{literal, math_call, reference, Bindings};
use super::items::{lets, lint_allowances};
use super::ScalarType;
use crate::plan::graph::{Graph, Id};

/// A rigid motion as graph nodes: rotation rows and translation.
struct Motion {
    rotation: [[Id; 3]; 3],
    translation: [Id; 3],
}

impl Motion {
    fn constant(g: &mut Graph, pose: &Pose) -> Motion {
        let rotation = pose.rotation.map(|row| row.map(|x| g.constant(x)));
        let translation = pose.translation.map(|x| g.constant(x));
        Motion {
            rotation,
            translation,
        }
    }

    /// `self · other` (apply `other` first).
    fn then(&self, g: &mut Graph, other: &Motion) -> Motion {
        let (a, b) = (&self.rotation, &other.rotation);
        let dot = |g: &mut Graph, row: [Id; 3], col: [Id; 3]| {
            let x = g.mul(row[0], col[0]);
            let y = g.mul(row[1], col[1]);
            let z = g.mul(row[2], col[2]);
            let xy = g.add(x, y);
            g.add(xy, z)
        };
        let mut rotation = [[0; 3]; 3];
        let mut translation = [0; 3];
        for r in 0..3 {
            for c in 0..3 {
                rotation[r][c] = dot(g, a[r], [b[0][c], b[1][c], b[2][c]]);
            }
            let moved = dot(g, a[r], other.translation);
            translation[r] = g.add(moved, self.translation[r]);
        }
        Motion {
            rotation,
            translation,
        }
    }
}

/// `k0 + kc · c + ks · s` with constant coefficients (zero terms fold away).
fn linear(g: &mut Graph, k0: f64, kc: f64, c: Id, ks: f64, s: Id) -> Id {
    let (k0, kc, ks) = (g.constant(k0), g.constant(kc), g.constant(ks));
    let cc = g.mul(kc, c);
    let ss = g.mul(ks, s);
    let sum = g.add(cc, ss);
    g.add(k0, sum)
}

/// The motion of joint `i` on inputs `2i` (sine or slide) and `2i + 1` (cosine).
fn joint_motion(g: &mut Graph, joint: &Joint, i: usize) -> Motion {
    let h = joint.axis;
    let n = i + 1;
    if joint.kind == JointKind::Prismatic {
        let d = g.input(2 * i);
        let d = g.name(d, &format!("d{n}"), "slide length");
        let rotation = Pose::IDENTITY
            .rotation
            .map(|row| row.map(|x| g.constant(x)));
        let translation = h.map(|k| {
            let k = g.constant(k);
            g.mul(k, d)
        });
        return Motion {
            rotation,
            translation,
        };
    }
    let s = g.input(2 * i);
    let s = g.name(s, &format!("s{n}"), "sine of the model value");
    let c = g.input(2 * i + 1);
    let c = g.name(c, &format!("c{n}"), "cosine of the model value");
    // Rodrigues: R = h hᵀ + c (I − h hᵀ) + s [h]×; a rotation about the line through p
    // moves by t = (I − R) p.
    let cross = [[0.0, -h[2], h[1]], [h[2], 0.0, -h[0]], [-h[1], h[0], 0.0]];
    let eye = |a: usize, b: usize| if a == b { 1.0 } else { 0.0 };
    let p = joint.point;
    let mut rotation = [[0; 3]; 3];
    let mut translation = [0; 3];
    for a in 0..3 {
        for b in 0..3 {
            let hh = h[a] * h[b];
            rotation[a][b] = linear(g, hh, eye(a, b) - hh, c, cross[a][b], s);
        }
        // t_a = Σ_b (δ_ab − h_a h_b)(1 − c) p_b − s Σ_b K_ab p_b.
        let perp: f64 = (0..3).map(|b| (eye(a, b) - h[a] * h[b]) * p[b]).sum();
        let turn: f64 = (0..3).map(|b| cross[a][b] * p[b]).sum();
        translation[a] = linear(g, perp, -perp, c, -turn, s);
    }
    Motion {
        rotation,
        translation,
    }
}

/// `direction · joints[i] + offset`, folded.
fn model_value(joint: &Joint, i: usize, scalar: ScalarType) -> TokenStream {
    let k = super::expr::index(i);
    let q = quote!(joints[#k]);
    let scaled = if joint.direction == 1.0 {
        q
    } else if joint.direction == -1.0 {
        quote!(-#q)
    } else {
        let d = literal(joint.direction, scalar).0;
        quote!(#d * #q)
    };
    if joint.offset == 0.0 {
        scaled
    } else {
        let (off, _) = literal(joint.offset.abs(), scalar);
        if joint.offset < 0.0 {
            quote!(#scaled - #off)
        } else {
            quote!(#scaled + #off)
        }
    }
}

/// The emitted `forward` function.
pub fn function(
    joints: &[Joint; JOINTS],
    base: &Pose,
    tool: &Pose,
    scalar: ScalarType,
) -> TokenStream {
    let mut g = Graph::new();
    let mut t = Motion::constant(&mut g, base);
    for (i, joint) in joints.iter().enumerate() {
        let m = joint_motion(&mut g, joint, i);
        t = t.then(&mut g, &m);
    }
    let tool = Motion::constant(&mut g, tool);
    let t = t.then(&mut g, &tool);
    let roots: Vec<Id> = t
        .rotation
        .iter()
        .flatten()
        .chain(t.translation.iter())
        .copied()
        .collect();
    let (g, map) = g.compact(&roots);
    let m = |id: Id| map[id as usize].unwrap_or(0);
    let roots: Vec<Id> = roots.into_iter().map(m).collect();
    let b = Bindings::new(&g, &roots, scalar);
    let inputs = joints.iter().enumerate().map(|(i, joint)| {
        let value = model_value(joint, i, scalar);
        let n = i + 1;
        if joint.kind == JointKind::Prismatic {
            let d = format_ident!("d{n}");
            quote!(let #d = #value;)
        } else {
            let (s, c) = (format_ident!("s{n}"), format_ident!("c{n}"));
            let call = math_call("sin_cos", &[value]);
            quote!(let (#s, #c) = #call;)
        }
    });
    let (steps, _) = lets(&g, &b, false);
    let entry = |id: Id| reference(&g, &b, id).0;
    // Every entry gets its own `let`, so the pose literal holds only names: an entry such as
    // `a * b - c` inside an array literal reads like a missing comma once expanded by a macro.
    let names: Vec<Ident> = [
        "r11", "r12", "r13", "r21", "r22", "r23", "r31", "r32", "r33",
    ]
    .iter()
    .chain(["px", "py", "pz"].iter())
    .map(|n| format_ident!("{n}"))
    .collect();
    let entries = names.iter().zip(roots.iter()).map(|(name, &id)| {
        let value = entry(id);
        quote!(let #name = #value;)
    });
    let row = |k: usize| names[3 * k..3 * k + 3].to_vec();
    let (r0, r1, r2, p) = (row(0), row(1), row(2), row(3));
    let lints = lint_allowances();
    let (ty, generic) = (scalar.ty(), scalar.generic());
    quote! {
        /// Forward kinematics: the tool pose in the world for joint values (SI units). The
        /// product of exponentials with this arm's axes, base and tool folded in: one
        /// `sin_cos` per revolute joint.
        #lints
        #[allow(unused_variables)]
        pub fn forward(joints: &[#ty; JOINTS]) -> ::armforge_runtime::Pose #generic {
            #(#inputs)*
            #(#steps)*
            #(#entries)*
            ::armforge_runtime::Pose {
                rotation: [[#(#r0),*], [#(#r1),*], [#(#r2),*]],
                translation: [#(#p),*],
            }
        }
    }
}
