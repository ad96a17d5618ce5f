//! Symbolic 3-vectors on the plan graph: each component a node, constant vectors folded in.

use super::graph::{Graph, Id};

/// A symbolic 3-vector.
pub type V3 = [Id; 3];

/// A constant vector.
pub fn constant(g: &mut Graph, v: [f64; 3]) -> V3 {
    [g.constant(v[0]), g.constant(v[1]), g.constant(v[2])]
}

/// `a + b`.
pub fn add(g: &mut Graph, a: V3, b: V3) -> V3 {
    [g.add(a[0], b[0]), g.add(a[1], b[1]), g.add(a[2], b[2])]
}

/// `a − b`.
pub fn sub(g: &mut Graph, a: V3, b: V3) -> V3 {
    [g.sub(a[0], b[0]), g.sub(a[1], b[1]), g.sub(a[2], b[2])]
}

/// `a + k` for a constant vector `k`.
pub fn add_const(g: &mut Graph, a: V3, k: [f64; 3]) -> V3 {
    let k = constant(g, k);
    add(g, a, k)
}

/// `s · v` for a node `s`.
pub fn scale(g: &mut Graph, s: Id, v: V3) -> V3 {
    [g.mul(s, v[0]), g.mul(s, v[1]), g.mul(s, v[2])]
}

/// `s · k` for a node `s` and a constant vector `k`.
pub fn scale_const(g: &mut Graph, s: Id, k: [f64; 3]) -> V3 {
    let k = constant(g, k);
    scale(g, s, k)
}

/// `a · b`.
pub fn dot(g: &mut Graph, a: V3, b: V3) -> Id {
    let x = g.mul(a[0], b[0]);
    let y = g.mul(a[1], b[1]);
    let z = g.mul(a[2], b[2]);
    let xy = g.add(x, y);
    g.add(xy, z)
}

/// `k · v` for a constant vector `k`.
pub fn dot_const(g: &mut Graph, k: [f64; 3], v: V3) -> Id {
    let k = constant(g, k);
    dot(g, k, v)
}

/// `a × b`.
pub fn cross(g: &mut Graph, a: V3, b: V3) -> V3 {
    [
        {
            let p = g.mul(a[1], b[2]);
            let q = g.mul(a[2], b[1]);
            g.sub(p, q)
        },
        {
            let p = g.mul(a[2], b[0]);
            let q = g.mul(a[0], b[2]);
            g.sub(p, q)
        },
        {
            let p = g.mul(a[0], b[1]);
            let q = g.mul(a[1], b[0]);
            g.sub(p, q)
        },
    ]
}

/// `M · v` for a constant row-major matrix.
pub fn mat_mul_const(g: &mut Graph, m: &[[f64; 3]; 3], v: V3) -> V3 {
    [
        dot_const(g, m[0], v),
        dot_const(g, m[1], v),
        dot_const(g, m[2], v),
    ]
}

/// `Mᵀ · v` for a constant row-major matrix.
pub fn mat_t_mul_const(g: &mut Graph, m: &[[f64; 3]; 3], v: V3) -> V3 {
    let t = transpose(m);
    mat_mul_const(g, &t, v)
}

/// `M · v` for a symbolic row-major matrix.
pub fn mat_mul(g: &mut Graph, m: &[V3; 3], v: V3) -> V3 {
    [dot(g, m[0], v), dot(g, m[1], v), dot(g, m[2], v)]
}

/// Rotation of `v` about the constant unit axis `h` by the angle whose cosine and sine are the
/// nodes `c`, `s` (Rodrigues: `R v = (h·v) h + c (v − (h·v) h) + s (h × v)`).
pub fn rotate(g: &mut Graph, h: [f64; 3], c: Id, s: Id, v: V3) -> V3 {
    let along = dot_const(g, h, v);
    let parallel = scale_const(g, along, h);
    let perpendicular = sub(g, v, parallel);
    let hv = {
        let hk = constant(g, h);
        cross(g, hk, v)
    };
    let a = scale(g, c, perpendicular);
    let b = scale(g, s, hv);
    let ab = add(g, a, b);
    add(g, parallel, ab)
}

/// Rotation of `v` about `h` by the negative of the angle with cosine `c` and sine `s`.
pub fn rotate_back(g: &mut Graph, h: [f64; 3], c: Id, s: Id, v: V3) -> V3 {
    let ns = g.neg(s);
    rotate(g, h, c, ns, v)
}

/// `if c ≥ 0 { a } else { b }`, component by component.
pub fn select(g: &mut Graph, c: Id, a: V3, b: V3) -> V3 {
    [0, 1, 2].map(|i| g.select(c, a[i], b[i]))
}

/// Names the components of a vector (`name_x`, `name_y`, `name_z`).
pub fn name(g: &mut Graph, v: V3, name: &str, note: &str) -> V3 {
    let axes = ["x", "y", "z"];
    let mut out = v;
    for (i, a) in axes.iter().enumerate() {
        out[i] = g.name(v[i], &format!("{name}_{a}"), format!("{note} ({a})"));
    }
    out
}

/// Plain-number helpers for the constants of a plan: the kernel's vector math, plus what only
/// the planner needs.
pub mod num {
    pub use armforge_runtime::math::{add, cross, dot, norm, scale, sub};

    /// `a / |a|` (or `a` when it is zero).
    pub fn unit(a: &[f64; 3]) -> [f64; 3] {
        let n = norm(a);
        if n > 0.0 {
            scale(a, 1.0 / n)
        } else {
            *a
        }
    }
    /// The component of `v` perpendicular to unit `h`.
    pub fn perpendicular(v: &[f64; 3], h: &[f64; 3]) -> [f64; 3] {
        sub(v, &scale(h, dot(h, v)))
    }
    /// Rotation of `v` about unit `h` by `angle`.
    pub fn rotate(h: &[f64; 3], angle: f64, v: &[f64; 3]) -> [f64; 3] {
        let (s, c) = angle.sin_cos();
        let k = dot(h, v) * (1.0 - c);
        let hv = cross(h, v);
        [
            c * v[0] + s * hv[0] + k * h[0],
            c * v[1] + s * hv[1] + k * h[1],
            c * v[2] + s * hv[2] + k * h[2],
        ]
    }
    /// A unit vector perpendicular to unit `h` (the most perpendicular base axis, made
    /// perpendicular).
    pub fn any_perpendicular(h: &[f64; 3]) -> [f64; 3] {
        let axes = [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]];
        let mut best = axes[0];
        let mut best_dot = f64::INFINITY;
        for a in axes {
            let d = dot(&a, h).abs();
            if d < best_dot - 1e-12 {
                best = a;
                best_dot = d;
            }
        }
        unit(&perpendicular(&best, h))
    }
}

fn transpose(m: &[[f64; 3]; 3]) -> [[f64; 3]; 3] {
    [
        [m[0][0], m[1][0], m[2][0]],
        [m[0][1], m[1][1], m[2][1]],
        [m[0][2], m[1][2], m[2][2]],
    ]
}
