//! The plan's expression graph: a straight-line SSA graph built with constant folding and
//! common-subexpression elimination (hash-consing), so that a zero offset removes its terms, a
//! unit axis its multiplications, and a term shared by several branches is computed once.

use std::collections::{BTreeSet, HashMap};

use armforge_runtime::plan::{Op, ValueId};

/// Index of a node.
pub type Id = ValueId;

/// Constants this close to a whole number are taken as that number (1e-12 is far below any
/// meaningful dimension in metres or any direction cosine written in a file).
const SNAP: f64 = 1e-12;

/// One node: an operation, and for named nodes the name and the equation it computes.
#[derive(Clone, Debug, PartialEq)]
pub struct Node {
    /// The operation (operands are earlier nodes).
    pub op: Op,
    /// A Rust identifier for the emitted `let`, when the builder named the node.
    pub name: Option<String>,
    /// The equation with this arm's numbers, for comments.
    pub note: Option<String>,
    /// How a constant follows the scalar of an emitted module.
    pub scaling: Scaling,
}

/// How a constant follows the scalar an emitted module computes in. Plans are written for
/// `f64`; a tolerance grows with the scalar's epsilon, a number of the arm does not.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq, Hash)]
pub enum Scaling {
    /// A number of the arm or of the math: the same in every scalar.
    #[default]
    Fixed,
    /// A tolerance that is the product of `n` tolerances each growing with the square root
    /// of the scalar's epsilon (`Growth::SquareRoot`): a squared length or sine tolerance has
    /// `n = 2` (so it grows with the epsilon itself, ×2^29 for `f32`), a fourth power `n = 4`.
    Tolerance(u8),
    /// A floor that only keeps a value off zero (`1e-300` in `f64`): the scalar's own
    /// (`1e-30` in `f32`, whose smallest normal number is about 1.2e-38).
    Floor,
}

/// `x`, or the number with at most 12 significant digits within 1e-14 relative of it
/// (`0.5 − 0.59` gives `-0.09`, not `-0.08999999999999997`; unit conversions and frame walks
/// leave such noise): the plan then shows the description's own numbers, changed far less
/// than any tolerance of the solver.
fn tidy(x: f64) -> f64 {
    let short: f64 = format!("{x:.11e}").parse().unwrap_or(x);
    if (short - x).abs() <= 1e-14 * x.abs() {
        short
    } else {
        x
    }
}

/// Hashable identity of an operation (constants by their bits).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
struct Key(u8, u64, u32, u32);

fn key(op: &Op) -> Key {
    match *op {
        Op::Input(s) => Key(0, s as u64, 0, 0),
        Op::Const(c) => Key(1, c.to_bits(), 0, 0),
        Op::Add(a, b) => Key(2, a as u64, b, 0),
        Op::Sub(a, b) => Key(3, a as u64, b, 0),
        Op::Mul(a, b) => Key(4, a as u64, b, 0),
        Op::Div(a, b) => Key(5, a as u64, b, 0),
        Op::Neg(a) => Key(6, a as u64, 0, 0),
        Op::Abs(a) => Key(7, a as u64, 0, 0),
        Op::Sqrt(a) => Key(8, a as u64, 0, 0),
        Op::Atan2(a, b) => Key(9, a as u64, b, 0),
        Op::Min(a, b) => Key(10, a as u64, b, 0),
        Op::Max(a, b) => Key(11, a as u64, b, 0),
        Op::Select(c, a, b) => Key(12, ((c as u64) << 32) | a as u64, b, 0),
        Op::Cbrt(a) => Key(13, a as u64, 0, 0),
        Op::Cos(a) => Key(14, a as u64, 0, 0),
    }
}

/// The identity of a constant that follows the scalar differs from a fixed one's.
fn scaled_key(op: &Op, scaling: Scaling) -> Key {
    match (scaling, op) {
        (Scaling::Tolerance(n), Op::Const(c)) => Key(13, c.to_bits(), u32::from(n), 0),
        (Scaling::Floor, Op::Const(c)) => Key(14, c.to_bits(), 0, 0),
        _ => key(op),
    }
}

/// The graph under construction (and, after [`Graph::compact`], the finished plan body).
#[derive(Clone, Debug, Default)]
pub struct Graph {
    nodes: Vec<Node>,
    index: HashMap<Key, Id>,
    names: BTreeSet<String>,
}

impl Graph {
    /// An empty graph.
    pub fn new() -> Self {
        Self::default()
    }

    /// The nodes in evaluation order.
    pub fn nodes(&self) -> &[Node] {
        &self.nodes
    }

    /// The operation of a node.
    pub fn op(&self, id: Id) -> Op {
        self.nodes[id as usize].op
    }

    /// The constant value of a node, if it is a constant.
    pub fn constant_value(&self, id: Id) -> Option<f64> {
        match self.op(id) {
            Op::Const(c) => Some(c),
            _ => None,
        }
    }

    /// How the constant `id` follows the scalar (`Fixed` for every other node).
    pub fn scaling(&self, id: Id) -> Scaling {
        self.nodes[id as usize].scaling
    }

    fn intern(&mut self, op: Op) -> Id {
        self.intern_scaled(op, Scaling::Fixed)
    }

    fn intern_scaled(&mut self, op: Op, scaling: Scaling) -> Id {
        let k = scaled_key(&op, scaling);
        if let Some(&id) = self.index.get(&k) {
            return id;
        }
        let id = self.nodes.len() as Id;
        self.nodes.push(Node {
            op,
            name: None,
            note: None,
            scaling,
        });
        self.index.insert(k, id);
        id
    }

    /// Names a node (the first name given wins; names are made unique) and records the
    /// equation it computes. Constants and inputs keep their literal form.
    pub fn name(&mut self, id: Id, name: &str, note: impl Into<String>) -> Id {
        if matches!(self.op(id), Op::Const(_)) {
            return id;
        }
        let node = &self.nodes[id as usize];
        if node.name.is_some() {
            return id;
        }
        let mut unique = name.to_string();
        let mut n = 2;
        while self.names.contains(&unique) {
            unique = format!("{name}_{n}");
            n += 1;
        }
        self.names.insert(unique.clone());
        let node = &mut self.nodes[id as usize];
        node.name = Some(unique);
        node.note = Some(note.into());
        id
    }

    /// An input slot.
    pub fn input(&mut self, slot: usize) -> Id {
        self.intern(Op::Input(slot as u32))
    }

    /// A constant (values within 1e-12 of a whole number are snapped to it).
    pub fn constant(&mut self, x: f64) -> Id {
        let r = x.round();
        let x = if (x - r).abs() < SNAP { r } else { tidy(x) };
        // One zero: `-0.0` and `0.0` fold alike.
        let x = if x == 0.0 { 0.0 } else { x };
        self.intern(Op::Const(x))
    }

    /// A threshold on a squared quantity (a squared length or sine tolerance, scaled for
    /// `f32` as [`Scaling::Tolerance`]`(2)`), or below 1e-200 a floor that only keeps a value
    /// off zero ([`Scaling::Floor`]); never snapped to the description's numbers, rounded to
    /// three significant digits so that a reviewer reads `1e-20`, not
    /// `1.0000000000000001e-20`: a threshold moved by less than 0.5 % decides the same cases
    /// for every practical input.
    pub fn exact(&mut self, x: f64) -> Id {
        let scaling = if x.abs() < 1e-200 {
            Scaling::Floor
        } else {
            Scaling::Tolerance(2)
        };
        self.threshold(x, scaling)
    }

    /// A threshold that is itself one tolerance of the square-root kind (scaled as
    /// [`Scaling::Tolerance`]`(1)`): a squared angle between two roots that, near a double root,
    /// rounding separates by about the square root of the epsilon.
    pub fn exact_once(&mut self, x: f64) -> Id {
        self.threshold(x, Scaling::Tolerance(1))
    }

    /// A threshold on a fourth power of a tolerance (scaled as [`Scaling::Tolerance`]`(4)`).
    pub fn exact_fourth(&mut self, x: f64) -> Id {
        self.threshold(x, Scaling::Tolerance(4))
    }

    fn threshold(&mut self, x: f64, scaling: Scaling) -> Id {
        let x = if x == 0.0 {
            0.0
        } else if x.is_finite() {
            format!("{x:.2e}").parse().unwrap_or(x)
        } else {
            x
        };
        self.intern_scaled(Op::Const(x), scaling)
    }

    fn is(&self, id: Id, value: f64) -> bool {
        self.constant_value(id) == Some(value)
    }

    /// `a + b`.
    pub fn add(&mut self, a: Id, b: Id) -> Id {
        match (self.constant_value(a), self.constant_value(b)) {
            (Some(x), Some(y)) => return self.constant(x + y),
            (Some(0.0), None) => return b,
            (None, Some(0.0)) => return a,
            (Some(_), None) => return self.add(b, a),
            (None, Some(y)) if y < 0.0 => {
                let c = self.constant(-y);
                return self.sub(a, c);
            }
            _ => {}
        }
        if let Op::Neg(x) = self.op(b) {
            return self.sub(a, x);
        }
        if let Op::Neg(x) = self.op(a) {
            return self.sub(b, x);
        }
        let (a, b) = if self.constant_value(b).is_none() && b < a {
            (b, a)
        } else {
            (a, b)
        };
        self.intern(Op::Add(a, b))
    }

    /// `a − b`.
    pub fn sub(&mut self, a: Id, b: Id) -> Id {
        if a == b {
            return self.constant(0.0);
        }
        match (self.constant_value(a), self.constant_value(b)) {
            (Some(x), Some(y)) => return self.constant(x - y),
            (None, Some(0.0)) => return a,
            (Some(0.0), None) => return self.neg(b),
            (None, Some(y)) if y < 0.0 => {
                let c = self.constant(-y);
                return self.add(a, c);
            }
            _ => {}
        }
        if let Op::Neg(x) = self.op(b) {
            return self.add(a, x);
        }
        if let Op::Neg(x) = self.op(a) {
            let s = self.add(x, b);
            return self.neg(s);
        }
        self.intern(Op::Sub(a, b))
    }

    /// `a · b`.
    pub fn mul(&mut self, a: Id, b: Id) -> Id {
        match (self.constant_value(a), self.constant_value(b)) {
            (Some(x), Some(y)) => return self.constant(x * y),
            (None, Some(_)) => return self.mul(b, a),
            (Some(x), None) => {
                if x == 0.0 {
                    return self.constant(0.0);
                }
                if x == 1.0 {
                    return b;
                }
                if x == -1.0 {
                    return self.neg(b);
                }
                match self.op(b) {
                    Op::Neg(y) => {
                        let k = self.constant(-x);
                        return self.mul(k, y);
                    }
                    Op::Mul(k, y) if self.constant_value(k).is_some() => {
                        let kk = self.constant(x * self.constant_value(k).unwrap_or(1.0));
                        return self.mul(kk, y);
                    }
                    _ => {}
                }
                if x < 0.0 {
                    let k = self.constant(-x);
                    let m = self.intern(Op::Mul(k, b));
                    return self.neg(m);
                }
            }
            (None, None) => {
                if let (Op::Neg(x), Op::Neg(y)) = (self.op(a), self.op(b)) {
                    return self.mul(x, y);
                }
                if let Op::Neg(x) = self.op(a) {
                    let m = self.mul(x, b);
                    return self.neg(m);
                }
                if let Op::Neg(y) = self.op(b) {
                    let m = self.mul(a, y);
                    return self.neg(m);
                }
                let (a, b) = if b < a { (b, a) } else { (a, b) };
                return self.intern(Op::Mul(a, b));
            }
        }
        self.intern(Op::Mul(a, b))
    }

    /// `a / b` (a constant divisor becomes a multiplication by its inverse).
    pub fn div(&mut self, a: Id, b: Id) -> Id {
        if self.is(a, 0.0) {
            return self.constant(0.0);
        }
        if let Some(y) = self.constant_value(b) {
            if y != 0.0 {
                let k = self.constant(1.0 / y);
                return self.mul(k, a);
            }
        }
        self.intern(Op::Div(a, b))
    }

    /// `−a`.
    pub fn neg(&mut self, a: Id) -> Id {
        match self.op(a) {
            Op::Const(x) => self.constant(-x),
            Op::Neg(x) => x,
            Op::Sub(x, y) => self.sub(y, x),
            _ => self.intern(Op::Neg(a)),
        }
    }

    /// `|a|`.
    pub fn abs(&mut self, a: Id) -> Id {
        match self.op(a) {
            Op::Const(x) => self.constant(x.abs()),
            Op::Neg(x) => self.abs(x),
            _ => self.intern(Op::Abs(a)),
        }
    }

    /// `√a` of a value that the caller has clamped at zero.
    pub fn sqrt(&mut self, a: Id) -> Id {
        match self.op(a) {
            Op::Const(x) => self.constant(x.max(0.0).sqrt()),
            _ => self.intern(Op::Sqrt(a)),
        }
    }

    /// `√max(a, 0)`: the root of a value that may be slightly negative by rounding.
    pub fn sqrt0(&mut self, a: Id) -> Id {
        let zero = self.constant(0.0);
        let m = self.max(a, zero);
        self.sqrt(m)
    }

    /// `∛a`, the real cube root.
    pub fn cbrt(&mut self, a: Id) -> Id {
        match self.op(a) {
            Op::Const(x) => self.constant(x.cbrt()),
            _ => self.intern(Op::Cbrt(a)),
        }
    }

    /// `cos a`.
    pub fn cos(&mut self, a: Id) -> Id {
        match self.op(a) {
            Op::Const(x) => self.constant(x.cos()),
            _ => self.intern(Op::Cos(a)),
        }
    }

    /// `atan2(y, x)`.
    pub fn atan2(&mut self, y: Id, x: Id) -> Id {
        match (self.constant_value(y), self.constant_value(x)) {
            (Some(a), Some(b)) => self.constant(a.atan2(b)),
            _ => self.intern(Op::Atan2(y, x)),
        }
    }

    /// The smaller of two values.
    pub fn min(&mut self, a: Id, b: Id) -> Id {
        if a == b {
            return a;
        }
        match (self.constant_value(a), self.constant_value(b)) {
            (Some(x), Some(y)) => self.constant(x.min(y)),
            _ => self.intern(Op::Min(a, b)),
        }
    }

    /// The larger of two values.
    pub fn max(&mut self, a: Id, b: Id) -> Id {
        if a == b {
            return a;
        }
        match (self.constant_value(a), self.constant_value(b)) {
            (Some(x), Some(y)) => self.constant(x.max(y)),
            _ => self.intern(Op::Max(a, b)),
        }
    }

    /// `x` limited to `[lo, hi]`.
    pub fn clamp(&mut self, x: Id, lo: f64, hi: f64) -> Id {
        let lo = self.constant(lo);
        let hi = self.constant(hi);
        let m = self.max(x, lo);
        self.min(m, hi)
    }

    /// `if c ≥ 0 { a } else { b }`.
    pub fn select(&mut self, c: Id, a: Id, b: Id) -> Id {
        if a == b {
            return a;
        }
        if let Some(x) = self.constant_value(c) {
            return if x >= 0.0 { a } else { b };
        }
        self.intern(Op::Select(c, a, b))
    }

    /// `a · b + c · d`.
    pub fn mul_add2(&mut self, a: Id, b: Id, c: Id, d: Id) -> Id {
        let x = self.mul(a, b);
        let y = self.mul(c, d);
        self.add(x, y)
    }

    /// Which nodes `roots` need (themselves included), by id.
    pub fn needed(&self, roots: &[Id]) -> Vec<bool> {
        let mut live = vec![false; self.nodes.len()];
        for &r in roots {
            live[r as usize] = true;
        }
        for i in (0..self.nodes.len()).rev() {
            if live[i] {
                for operand in operands(&self.nodes[i].op) {
                    live[operand as usize] = true;
                }
            }
        }
        live
    }

    /// Keeps only the nodes that `roots` need, renumbered in evaluation order. Returns the
    /// compacted graph and the map from old to new ids.
    pub fn compact(&self, roots: &[Id]) -> (Graph, Vec<Option<Id>>) {
        let live = self.needed(roots);
        let mut map = vec![None; self.nodes.len()];
        let mut out = Graph::new();
        for (i, node) in self.nodes.iter().enumerate() {
            if !live[i] {
                continue;
            }
            let m = |id: Id| map[id as usize].unwrap_or(0);
            let op = remap(&node.op, m);
            let id = out.nodes.len() as Id;
            out.nodes.push(Node {
                op,
                name: node.name.clone(),
                note: node.note.clone(),
                scaling: node.scaling,
            });
            out.index.insert(scaled_key(&op, node.scaling), id);
            if let Some(n) = &node.name {
                out.names.insert(n.clone());
            }
            map[i] = Some(id);
        }
        (out, map)
    }
}

/// The operands of an operation.
pub fn operands(op: &Op) -> Vec<Id> {
    match *op {
        Op::Input(_) | Op::Const(_) => vec![],
        Op::Neg(a) | Op::Abs(a) | Op::Sqrt(a) | Op::Cbrt(a) | Op::Cos(a) => vec![a],
        Op::Add(a, b)
        | Op::Sub(a, b)
        | Op::Mul(a, b)
        | Op::Div(a, b)
        | Op::Atan2(a, b)
        | Op::Min(a, b)
        | Op::Max(a, b) => vec![a, b],
        Op::Select(c, a, b) => vec![c, a, b],
    }
}

fn remap(op: &Op, m: impl Fn(Id) -> Id) -> Op {
    match *op {
        Op::Input(s) => Op::Input(s),
        Op::Const(c) => Op::Const(c),
        Op::Add(a, b) => Op::Add(m(a), m(b)),
        Op::Sub(a, b) => Op::Sub(m(a), m(b)),
        Op::Mul(a, b) => Op::Mul(m(a), m(b)),
        Op::Div(a, b) => Op::Div(m(a), m(b)),
        Op::Neg(a) => Op::Neg(m(a)),
        Op::Abs(a) => Op::Abs(m(a)),
        Op::Sqrt(a) => Op::Sqrt(m(a)),
        Op::Cbrt(a) => Op::Cbrt(m(a)),
        Op::Cos(a) => Op::Cos(m(a)),
        Op::Atan2(a, b) => Op::Atan2(m(a), m(b)),
        Op::Min(a, b) => Op::Min(m(a), m(b)),
        Op::Max(a, b) => Op::Max(m(a), m(b)),
        Op::Select(c, a, b) => Op::Select(m(c), m(a), m(b)),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn folds_zero_and_unit_terms() {
        let mut g = Graph::new();
        let x = g.input(0);
        let zero = g.constant(0.0);
        let one = g.constant(1.0 + 1e-15);
        let a = g.mul(zero, x);
        let b = g.mul(one, x);
        let c = g.add(a, b);
        assert_eq!(c, x);
        assert_eq!(g.sub(x, x), zero);
    }

    #[test]
    fn shares_identical_terms() {
        let mut g = Graph::new();
        let x = g.input(0);
        let y = g.input(1);
        let a = g.mul(x, y);
        let b = g.mul(y, x);
        assert_eq!(a, b);
        let n = g.nodes().len();
        let _ = g.add(a, b);
        let _ = g.add(b, a);
        assert_eq!(g.nodes().len(), n + 1);
    }

    #[test]
    fn compaction_drops_dead_nodes() {
        let mut g = Graph::new();
        let x = g.input(0);
        let y = g.input(1);
        let _dead = g.sqrt(y);
        let k = g.constant(2.0);
        let live = g.mul(k, x);
        let (c, map) = g.compact(&[live]);
        assert_eq!(c.nodes().len(), 3);
        assert_eq!(map[live as usize], Some(2));
    }
}
