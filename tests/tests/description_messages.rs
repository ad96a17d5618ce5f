//! Messages about hostile description files stay short, located and readable: capped in
//! number, values and source lines cut, non-printing characters shown as `\u{…}`, an invalid
//! UTF-8 file located by line and column.

use std::path::PathBuf;

use armforge_compiler::description::load_str;
use armforge_compiler::diagnostics::MAX_SHOWN;
use armforge_compiler::pipeline::{load_model, PipelineError};

const ARM_START: &str =
    "name = \"messages\"\nconvention = \"dh\"\n[[joint]]\ntype = \"revolute\"\n";

fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("armforge-messages-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir.join(name)
}

#[test]
fn twenty_thousand_unknown_keys_give_fifty_problems_and_a_count() {
    let keys: String = (0..20_000).map(|i| format!("k{i} = 1\n")).collect();
    let text = format!("{ARM_START}[tool]\n{keys}");
    let problems = load_str(&text, "many.toml").unwrap_err();
    assert_eq!(
        problems.items.len(),
        20_000,
        "every problem is still collected"
    );
    let report = problems.to_string();
    assert_eq!(report.matches("unknown key").count(), MAX_SHOWN);
    assert!(
        report.contains("19950 more problems not shown (20000 in all)"),
        "{}",
        &report[report.len().saturating_sub(300)..]
    );
    assert!(report.len() < 40_000, "{} bytes", report.len());
}

#[test]
fn a_ten_megabyte_value_is_not_echoed_whole() {
    let huge = "r".repeat(10_000_000);
    let text = format!("name = \"messages\"\nconvention = \"dh\"\n[[joint]]\ntype = \"{huge}\"\n");
    let problems = load_str(&text, "huge.toml").unwrap_err();
    let report = problems.to_string();
    assert!(report.len() < 2_000, "{} bytes", report.len());
    assert!(report.contains("unknown joint type"), "{report}");
    assert!(report.contains("(10000000 characters)"), "{report}");
    // The caret still sits under the value's opening quote, at 4:8.
    assert!(report.contains("huge.toml:4:8:"), "{report}");
    let caret_line = report.lines().nth(3).unwrap();
    let source_line = report.lines().nth(2).unwrap();
    let caret = caret_line.find('^').unwrap();
    assert_eq!(
        &source_line[caret..caret + 2],
        "\"r",
        "{source_line}\n{caret_line}"
    );
}

#[test]
fn a_huge_number_is_shown_compactly() {
    let text = format!("{ARM_START}direction = 1e308\n");
    let report = load_str(&text, "number.toml").unwrap_err().to_string();
    assert!(report.contains("found 1e308"), "{report}");
    assert!(!report.contains("00000000000"), "{report}");
}

#[test]
fn non_printing_characters_in_names_are_shown_escaped() {
    // NUL (U+0000) and LINE SEPARATOR (U+2028), Unicode Standard, chapter 23 / 5.8.
    let text = "name = \"a\\u0000b\"\nconvention = \"dh\"\n[[joint]]\ntype = \"revolute\"\n\
                name = \"x\\u2028y\"\n";
    let report = load_str(text, "names.toml").unwrap_err().to_string();
    assert!(
        report.contains("\"a\\u{0}b\" contains '\\u{0}'"),
        "{report}"
    );
    assert!(
        report.contains("\"x\\u{2028}y\" contains the non-printing character U+2028"),
        "{report}"
    );
    assert!(
        !report.contains('\0') && !report.contains('\u{2028}'),
        "{report:?}"
    );
}

#[test]
fn an_invalid_utf8_file_is_located_by_line_and_column() {
    let path = scratch("latin1.toml");
    // 0xE9 is "é" in ISO 8859-1; in UTF-8 it starts a three-byte sequence that "r" cannot
    // continue (RFC 3629, §3).
    std::fs::write(&path, b"name = \"lab\"\nconvention = \"dh\"\n# caf\xe9 r\n").unwrap();
    let shown = path.display().to_string();
    let problems = match load_model(&path, &shown) {
        Err(PipelineError::Description(d)) => d,
        other => panic!("expected a description error, found {other:?}"),
    };
    let report = problems.to_string();
    assert!(
        report.starts_with(&format!(
            "error: {shown}:3:6: the file is not UTF-8 text: byte 0xe9"
        )),
        "{report}"
    );
    let _ = std::fs::remove_file(&path);
}

#[test]
fn a_dotted_header_two_hundred_keys_deep_is_located_at_its_depth() {
    let header = vec!["k"; 200].join(".");
    let text = format!("{ARM_START}\n[{header}]\nx = 1\n");
    let problems = load_str(&text, "deep.toml").unwrap_err();
    let place = problems.items[0].location;
    assert_eq!(place.line, 6, "{problems}");
    assert!(place.column > 300, "{problems}");
}
