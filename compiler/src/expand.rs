//! The expansion of the `solver!` proc macro (crate `armforge-macros`), as a library function
//! so that it can be tested without a compiler and the macro crate stays a few lines.
//!
//! Input: `[attributes] [pub] mod NAME = "path/to/arm.toml" [, scalar = f32];` with the path
//! relative to the calling crate's manifest directory; the solver computes in `f64` unless
//! `scalar = f32` says otherwise. Output: `mod NAME { … }` holding exactly the items that
//! [`crate::pipeline::generate_module`] emits for `armforge emit` (the `//` equation comments
//! are not tokens and so are not kept; doc comments are), plus an `include_bytes!` of the
//! description so that Cargo rebuilds when it changes. Every problem, including a bad file and
//! a rejected geometry, becomes a `compile_error!` at the path literal carrying the same
//! located message the CLI prints. Never panics.

use std::path::Path;

use proc_macro2::{Span, TokenStream};
use quote::quote;
use syn::parse::{Parse, ParseStream};
use syn::{Attribute, Ident, LitStr, Token, Visibility};

use crate::classify::Tolerances;
use crate::emit::ScalarType;
use crate::pipeline::{display_path, generate_module_in};

/// What the macro call says: `[attributes] [pub] mod NAME = "path" [, scalar = f32];`.
pub struct MacroInput {
    /// Outer attributes and doc comments, put on the generated module.
    pub attrs: Vec<Attribute>,
    /// Visibility of the generated module.
    pub vis: Visibility,
    /// The module's name.
    pub name: Ident,
    /// The description's path, relative to the calling crate's manifest directory.
    pub path: LitStr,
    /// The scalar the solver computes in (`f64` unless `scalar = f32`).
    pub scalar: ScalarType,
}

/// `, scalar = f32` (or `f64`) after the path, if present.
fn parse_scalar(input: ParseStream) -> syn::Result<ScalarType> {
    if !input.peek(Token![,]) {
        return Ok(ScalarType::F64);
    }
    input.parse::<Token![,]>()?;
    let key: Ident = input.parse()?;
    if key != "scalar" {
        return Err(syn::Error::new(
            key.span(),
            format!("unknown option `{key}`; the one option is `scalar = f64` or `scalar = f32`"),
        ));
    }
    input.parse::<Token![=]>()?;
    let word: Ident = input.parse()?;
    ScalarType::from_name(&word.to_string()).ok_or_else(|| {
        syn::Error::new(
            word.span(),
            format!("expected `f64` or `f32` as the scalar, found `{word}`"),
        )
    })
}

impl Parse for MacroInput {
    fn parse(input: ParseStream) -> syn::Result<Self> {
        let attrs = input.call(Attribute::parse_outer)?;
        let vis: Visibility = input.parse()?;
        input.parse::<Token![mod]>()?;
        let name: Ident = input.parse()?;
        input.parse::<Token![=]>()?;
        let path: LitStr = input.parse().map_err(|e| {
            syn::Error::new(
                e.span(),
                "expected the description's path as a string literal, e.g. \
                 `mod tray_arm = \"arms/tray-arm.toml\";`",
            )
        })?;
        let scalar = parse_scalar(input)?;
        if input.peek(Token![;]) {
            input.parse::<Token![;]>()?;
        }
        if !input.is_empty() {
            return Err(input.error(
                "unexpected tokens after the path; the macro takes one \
                 `mod NAME = \"path\";` or `mod NAME = \"path\", scalar = f32;`",
            ));
        }
        Ok(MacroInput {
            attrs,
            vis,
            name,
            path,
            scalar,
        })
    }
}

/// Expands `solver!(…)`: `manifest_dir` is the calling crate's `CARGO_MANIFEST_DIR` (`None`
/// when it is not set).
pub fn solver_macro(input: TokenStream, manifest_dir: Option<&Path>) -> TokenStream {
    let parsed: MacroInput = match syn::parse2(input) {
        Ok(parsed) => parsed,
        Err(e) => return e.to_compile_error(),
    };
    match expand(&parsed, manifest_dir) {
        Ok(tokens) => tokens,
        Err(e) => e.to_compile_error(),
    }
}

/// The generated module for a parsed macro call, or the error to report at the path.
pub fn expand(input: &MacroInput, manifest_dir: Option<&Path>) -> syn::Result<TokenStream> {
    let at_path = |message: String| syn::Error::new(input.path.span(), message);
    let Some(dir) = manifest_dir else {
        return Err(at_path(
            "CARGO_MANIFEST_DIR is not set: the description's path is relative to the \
             calling crate's manifest directory, so the macro must run under Cargo"
                .to_string(),
        ));
    };
    let written = input.path.value();
    let full = dir.join(&written);
    let generated = generate_module_in(
        &full,
        &display_path(&written),
        &Tolerances::default(),
        input.scalar,
    )
    .map_err(|e| at_path(e.message_without_prefix()))?;
    let file = syn::parse_file(&generated.source).map_err(|e| {
        at_path(format!(
            "armforge emitted a module that does not parse (a generator bug): {e}"
        ))
    })?;
    let Some(full_text) = full.to_str() else {
        return Err(at_path(format!(
            "the description's full path is not valid UTF-8: {}",
            full.display()
        )));
    };
    let include = LitStr::new(full_text, Span::call_site());
    let attrs = &input.attrs;
    let vis = &input.vis;
    let name = &input.name;
    let inner = &file.attrs;
    let items = &file.items;
    Ok(quote! {
        #(#attrs)*
        #vis mod #name {
            #(#inner)*
            #(#items)*
            const _: &[u8] = ::core::include_bytes!(#include);
        }
    })
}
