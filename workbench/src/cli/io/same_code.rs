//! Whether two Rust files say the same thing, whatever their layout: `emit --check` must not
//! call a module stale because the user ran `cargo fmt` (rustfmt) on their crate.
//!
//! Two files are the same when their tokens are the same — doc comments included, a trailing
//! comma before a closing bracket or `>` aside — and their own-line `//` comments (the emitter writes
//! every comment on its own line) have the same words in the same order. Layout, indentation,
//! line breaks and trailing commas are what rustfmt changes; none of them changes the code.

use std::str::FromStr;

use proc_macro2::{Delimiter, TokenStream, TokenTree};

/// True when `a` and `b` are the same module up to layout (see the module doc).
pub fn same_module(a: &str, b: &str) -> bool {
    if a == b {
        return true;
    }
    match (tokens(a), tokens(b)) {
        (Some(ta), Some(tb)) => ta == tb && comments(a) == comments(b),
        _ => false,
    }
}

/// The file's tokens as text, with a comma right before a closing bracket or a closing `>`
/// of generic arguments dropped; `None`
/// when the file does not lex.
fn tokens(text: &str) -> Option<Vec<String>> {
    let stream = TokenStream::from_str(text).ok()?;
    let mut out = Vec::new();
    flatten(stream, &mut out);
    Some(out)
}

fn flatten(stream: TokenStream, out: &mut Vec<String>) {
    for tree in stream {
        match tree {
            TokenTree::Group(group) => {
                let (open, close) = match group.delimiter() {
                    Delimiter::Parenthesis => ("(", ")"),
                    Delimiter::Brace => ("{", "}"),
                    Delimiter::Bracket => ("[", "]"),
                    Delimiter::None => ("", ""),
                };
                out.push(open.to_string());
                flatten(group.stream(), out);
                if out.last().is_some_and(|t| t == ",") {
                    out.pop();
                }
                out.push(close.to_string());
            }
            other => {
                let token = other.to_string();
                // A trailing comma in generic arguments (`collect::<N,>`), which rustfmt
                // removes; a comma right before `>` occurs nowhere else in Rust.
                if token == ">" && out.last().is_some_and(|t| t == ",") {
                    out.pop();
                }
                out.push(token);
            }
        }
    }
}

/// The words of every own-line `//` comment (not doc comments, which are tokens), in order.
fn comments(text: &str) -> Vec<String> {
    text.lines()
        .map(str::trim_start)
        .filter(|l| l.starts_with("//") && !l.starts_with("///") && !l.starts_with("//!"))
        .map(|l| l[2..].split_whitespace().collect::<Vec<_>>().join(" "))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn layout_and_trailing_commas_do_not_matter() {
        let a = "// note\nfn f(a: f64, b: f64,) -> [f64; 2] {\n    [a,\n     b]\n}\n";
        let b = "// note\nfn f(a: f64, b: f64) -> [f64; 2] {\n    [a, b]\n}\n";
        assert!(same_module(a, b));
        // rustfmt removes the trailing comma of generic arguments.
        assert!(same_module("fn f() { g::<N,>(a) }", "fn f() { g::<N>(a) }"));
        assert!(same_module(
            "fn f() -> X { x => y }",
            "fn f() -> X { x => y }"
        ));
    }

    #[test]
    fn code_and_comments_do() {
        let a = "// note\nfn f() -> f64 { 1.0 }\n";
        assert!(!same_module(a, "// note\nfn f() -> f64 { 2.0 }\n"));
        assert!(!same_module(a, "// other note\nfn f() -> f64 { 1.0 }\n"));
        assert!(!same_module(a, "/// note\nfn f() -> f64 { 1.0 }\n"));
        assert!(!same_module(a, "fn f() -> f64 { 1.0 "));
    }
}
