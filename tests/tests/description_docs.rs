//! The examples in the documentation are real: the README's and the format reference's TOML
//! examples read without problems, and the README's error example is what armforge prints.

use armforge_compiler::description::load_str;
use armforge_tests::{fixture, workspace_root};

/// The fenced blocks of one language in Markdown text (`prefix` is stripped from each line,
/// for doc comments).
fn fenced_blocks(text: &str, language: &str, prefix: &str) -> Vec<String> {
    let mut blocks = Vec::new();
    let mut current: Option<Vec<&str>> = None;
    for line in text.lines() {
        let Some(line) = line.strip_prefix(prefix) else {
            continue;
        };
        let line = if prefix.is_empty() {
            line
        } else {
            line.strip_prefix(' ').unwrap_or(line)
        };
        match (&mut current, line.trim()) {
            (None, fence) if fence == format!("```{language}") => current = Some(Vec::new()),
            (Some(lines), "```") => {
                blocks.push(lines.join("\n"));
                current = None;
            }
            (Some(lines), _) => lines.push(line),
            _ => {}
        }
    }
    blocks
}

#[test]
fn the_readme_example_reads() {
    let readme = std::fs::read_to_string(workspace_root().join("README.md")).unwrap();
    let blocks = fenced_blocks(&readme, "toml", "");
    assert_eq!(blocks.len(), 1);
    let model = load_str(&blocks[0], "README.md").unwrap_or_else(|d| panic!("{d}"));
    assert_eq!(model.name, "demo-arm");
}

#[test]
fn the_format_reference_example_reads() {
    let path = workspace_root().join("compiler/src/description/mod.rs");
    let source = std::fs::read_to_string(path).unwrap();
    let blocks = fenced_blocks(&source, "toml", "//!");
    assert_eq!(blocks.len(), 1);
    let model = load_str(&blocks[0], "mod.rs").unwrap_or_else(|d| panic!("{d}"));
    assert_eq!(model.joints.len(), 2);
}

#[test]
fn the_readme_error_example_is_what_armforge_prints() {
    let readme = std::fs::read_to_string(workspace_root().join("README.md")).unwrap();
    let shown = fenced_blocks(&readme, "text", "");
    assert_eq!(shown.len(), 1);
    let text = std::fs::read_to_string(fixture("bad/limits-order.toml")).unwrap();
    let printed = load_str(&text, "arm.toml").unwrap_err().to_string();
    let first = printed.split("\n\n").next().unwrap().trim_end();
    assert_eq!(first, shown[0].trim_end());
}
