//! Plan nodes as Rust expressions, with parentheses only where precedence needs them.

use std::collections::BTreeMap;

use armforge_runtime::plan::Op;
use proc_macro2::TokenStream;
use quote::{format_ident, quote};

use super::ScalarType;
use crate::plan::graph::{operands, Graph, Id};

/// Binding strength of an expression (higher binds tighter).
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Prec {
    /// `if … { … } else { … }`: always parenthesised as an operand.
    Block,
    /// `a + b`, `a − b`.
    Sum,
    /// `a · b`, `a / b`.
    Product,
    /// `−a`.
    Unary,
    /// Names, literals, calls.
    Atom,
}

/// A float literal of the module's scalar (unsuffixed, so its type is the one the context
/// needs; absolute paths for π and infinities), with its precedence.
pub fn literal(x: f64, scalar: ScalarType) -> (TokenStream, Prec) {
    let float = scalar.core_module();
    if x == std::f64::consts::PI {
        return (quote!(#float::consts::PI), Prec::Atom);
    }
    if x == -std::f64::consts::PI {
        return (quote!(-#float::consts::PI), Prec::Unary);
    }
    if x == f64::INFINITY {
        return (quote!(#float::INFINITY), Prec::Atom);
    }
    if x == f64::NEG_INFINITY {
        return (quote!(#float::NEG_INFINITY), Prec::Atom);
    }
    let text = format!("{:?}", x.abs());
    let lit: TokenStream = text.parse().unwrap_or_else(|_| quote!(0.0));
    if x < 0.0 {
        (quote!(-#lit), Prec::Unary)
    } else {
        (lit, Prec::Atom)
    }
}

/// A call of the runtime's scalar math (`sqrt`, `atan2`, `sin_cos`, …): every math call the
/// emitter prints goes through here, so the scalar type is chosen in one place.
pub fn math_call(function: &str, args: &[TokenStream]) -> TokenStream {
    let f = format_ident!("{}", function);
    quote!(::armforge_runtime::math::#f(#(#args),*))
}

/// An unsuffixed integer literal.
pub fn index(i: usize) -> proc_macro2::Literal {
    proc_macro2::Literal::usize_unsuffixed(i)
}

/// Which nodes get a `let` and what they are called.
pub struct Bindings {
    names: BTreeMap<Id, String>,
    /// The scalar the module computes in (how constants are printed).
    pub scalar: ScalarType,
}

impl Bindings {
    /// Named nodes and nodes used more than once get a `let` (constants never do).
    pub fn new(g: &Graph, extra_uses: &[Id], scalar: ScalarType) -> Bindings {
        Bindings::within(g, extra_uses, &vec![true; g.nodes().len()], scalar)
    }

    /// [`Bindings::new`] for the part of the graph marked `live` (what one branch needs):
    /// uses are counted within that part only.
    pub fn within(g: &Graph, extra_uses: &[Id], live: &[bool], scalar: ScalarType) -> Bindings {
        let mut uses = vec![0usize; g.nodes().len()];
        for (node, _) in g.nodes().iter().zip(live).filter(|(_, &l)| l) {
            for o in operands(&node.op) {
                uses[o as usize] += 1;
            }
        }
        for &id in extra_uses {
            uses[id as usize] += 1;
        }
        let mut names = BTreeMap::new();
        for (i, node) in g.nodes().iter().enumerate() {
            if matches!(node.op, Op::Const(_)) || !live[i] {
                continue;
            }
            if let Some(name) = &node.name {
                names.insert(i as Id, name.clone());
            } else if uses[i] > 1 || matches!(node.op, Op::Input(_)) {
                names.insert(i as Id, format!("t{i}"));
            }
        }
        Bindings { names, scalar }
    }

    /// The `let` name of a node, if it has one.
    pub fn name(&self, id: Id) -> Option<&str> {
        self.names.get(&id).map(String::as_str)
    }

    /// The nodes with a `let`, in evaluation order.
    pub fn bound(&self) -> impl Iterator<Item = (&Id, &String)> {
        self.names.iter()
    }
}

fn wrap(e: (TokenStream, Prec), at_least: Prec) -> TokenStream {
    let (t, p) = e;
    if p >= at_least {
        t
    } else {
        quote!((#t))
    }
}

/// `(x, y)`, or `(y, x)` when `x` would be written as a bare literal and `y` would not.
fn receiver_first(g: &Graph, b: &Bindings, x: Id, y: Id) -> (Id, Id) {
    let literal = |id: Id| b.name(id).is_none() && g.constant_value(id).is_some();
    if literal(x) && !literal(y) {
        (y, x)
    } else {
        (x, y)
    }
}

/// `min(max(x, lo), hi)` with constant bounds and an inlined `max`: `(x, lo)`.
fn clamp_parts(g: &Graph, b: &Bindings, m: Id, hi: Id) -> Option<(Id, Id)> {
    if b.name(m).is_some() || g.constant_value(hi).is_none() {
        return None;
    }
    match g.op(m) {
        Op::Max(x, lo) if g.constant_value(lo).is_some() => Some((x, lo)),
        _ => None,
    }
}

/// The expression that refers to a node: its name, or its inlined definition.
pub fn reference(g: &Graph, b: &Bindings, id: Id) -> (TokenStream, Prec) {
    if let Some(name) = b.name(id) {
        let ident = format_ident!("{}", name);
        return (quote!(#ident), Prec::Atom);
    }
    definition(g, b, id)
}

/// The defining expression of a node (operands by reference).
pub fn definition(g: &Graph, b: &Bindings, id: Id) -> (TokenStream, Prec) {
    let r = |x: Id| reference(g, b, x);
    match g.op(id) {
        Op::Input(slot) => {
            let s = slot as usize;
            if s < 9 {
                let (row, col) = (index(s / 3), index(s % 3));
                (quote!(target.rotation[#row][#col]), Prec::Atom)
            } else if s < 12 {
                let k = index(s - 9);
                (quote!(target.translation[#k]), Prec::Atom)
            } else {
                let k = index(s - 12);
                (quote!(reference[#k]), Prec::Atom)
            }
        }
        Op::Const(c) => literal(b.scalar.constant(c, g.scaling(id)), b.scalar),
        Op::Add(x, y) => {
            let (x, y) = (wrap(r(x), Prec::Sum), wrap(r(y), Prec::Product));
            (quote!(#x + #y), Prec::Sum)
        }
        Op::Sub(x, y) => {
            let (x, y) = (wrap(r(x), Prec::Sum), wrap(r(y), Prec::Product));
            (quote!(#x - #y), Prec::Sum)
        }
        Op::Mul(x, y) => {
            let (x, y) = (wrap(r(x), Prec::Product), wrap(r(y), Prec::Unary));
            (quote!(#x * #y), Prec::Product)
        }
        Op::Div(x, y) => {
            let (x, y) = (wrap(r(x), Prec::Product), wrap(r(y), Prec::Unary));
            (quote!(#x / #y), Prec::Product)
        }
        Op::Neg(x) => {
            let x = wrap(r(x), Prec::Atom);
            (quote!(-#x), Prec::Unary)
        }
        Op::Abs(x) => (math_call("abs", &[r(x).0]), Prec::Atom),
        Op::Sqrt(x) => (math_call("sqrt", &[r(x).0]), Prec::Atom),
        Op::Cbrt(x) => (math_call("cbrt", &[r(x).0]), Prec::Atom),
        Op::Cos(x) => (math_call("cos", &[r(x).0]), Prec::Atom),
        Op::Atan2(y, x) => (math_call("atan2", &[r(y).0, r(x).0]), Prec::Atom),
        Op::Min(m, hi) if clamp_parts(g, b, m, hi).is_some() => {
            let (x, lo) = clamp_parts(g, b, m, hi).unwrap_or((m, hi));
            (math_call("clamp", &[r(x).0, r(lo).0, r(hi).0]), Prec::Atom)
        }
        // A literal receiver would be an ambiguous float (`(-1.0).max(x)` does not compile):
        // the variable goes first (both are symmetric).
        Op::Min(x, y) => {
            let (x, y) = receiver_first(g, b, x, y);
            let (x, y) = (wrap(r(x), Prec::Atom), r(y).0);
            (quote!(#x.min(#y)), Prec::Atom)
        }
        Op::Max(x, y) => {
            let (x, y) = receiver_first(g, b, x, y);
            let (x, y) = (wrap(r(x), Prec::Atom), r(y).0);
            (quote!(#x.max(#y)), Prec::Atom)
        }
        Op::Select(c, x, y) => {
            let c = wrap(r(c), Prec::Sum);
            let (x, y) = (r(x).0, r(y).0);
            (quote!(if #c >= 0.0 { #x } else { #y }), Prec::Block)
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// `(-1.0).max(x)` does not compile (an ambiguous float literal; The Rust Reference,
    /// "Literal expressions": an unsuffixed float literal's type is inferred): the variable is
    /// the receiver.
    #[test]
    fn a_literal_is_never_the_receiver_of_min_or_max() {
        let mut g = Graph::new();
        let x = g.input(0);
        let c = g.constant(-1.0);
        for op in [Graph::max, Graph::min] {
            let m = op(&mut g, c, x);
            let b = Bindings::new(&g, &[], ScalarType::F64);
            let text = definition(&g, &b, m).0.to_string();
            assert!(!text.starts_with('(') && !text.starts_with('-'), "{text}");
            assert!(text.contains("- 1.0"), "{text}");
        }
    }
}
