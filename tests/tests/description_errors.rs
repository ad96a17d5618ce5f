//! Every kind of bad description file is reported with its place (line:column), its key and
//! what is wrong, all problems of a file at once, and never with a panic.
//!
//! Each file in `tests/fixtures/bad/` lists the diagnostics it must produce in comment lines
//! `# expect: LINE:COLUMN KEY | TEXT` (`-` for no key); the file must produce exactly those.

use std::path::Path;

use armforge_compiler::description::load_str;
use armforge_compiler::diagnostics::Diagnostics;
use armforge_compiler::model::Model;
use armforge_compiler::pipeline::{load_model, PipelineError};
use armforge_tests::{example_arm_paths, fixture, toml_files_in};

/// The description at `path` through the one file-loading entry point, or its problems.
fn load_file(path: &Path) -> Result<Model, Diagnostics> {
    match load_model(path, &path.display().to_string()) {
        Ok(model) => Ok(model),
        Err(PipelineError::Unreadable(d) | PipelineError::Description(d)) => Err(d),
        Err(PipelineError::Rejected(r)) => panic!("loading does not classify: {r}"),
    }
}

/// One expected diagnostic.
#[derive(Debug)]
struct Expected {
    line: usize,
    column: usize,
    key: String,
    text: String,
}

fn expectations(path: &Path) -> Vec<Expected> {
    let text = std::fs::read_to_string(path).unwrap();
    text.lines()
        .filter_map(|l| l.strip_prefix("# expect: "))
        .map(|l| {
            let (place_key, text) = l.split_once(" | ").expect("`PLACE KEY | TEXT`");
            let (place, key) = place_key.split_once(' ').expect("`LINE:COLUMN KEY`");
            let (line, column) = place.split_once(':').expect("`LINE:COLUMN`");
            Expected {
                line: line.parse().unwrap(),
                column: column.parse().unwrap(),
                key: if key == "-" {
                    String::new()
                } else {
                    key.to_string()
                },
                text: text.to_string(),
            }
        })
        .collect()
}

fn check_against_expectations(path: &Path, diagnostics: &Diagnostics) {
    let expected = expectations(path);
    assert!(
        !expected.is_empty(),
        "{} lists no expectations",
        path.display()
    );
    let found: Vec<String> = diagnostics
        .items
        .iter()
        .map(|d| {
            format!(
                "{}:{} {} | {}",
                d.location.line, d.location.column, d.key, d.message
            )
        })
        .collect();
    assert_eq!(
        expected.len(),
        diagnostics.items.len(),
        "{}: expected {expected:#?}\nfound {found:#?}",
        path.display()
    );
    for e in &expected {
        let hit = diagnostics.items.iter().any(|d| {
            d.location.line == e.line
                && d.location.column == e.column
                && d.key == e.key
                && d.message.contains(&e.text)
        });
        assert!(
            hit,
            "{}: no diagnostic {e:?}\nfound {found:#?}",
            path.display()
        );
    }
}

#[test]
fn every_bad_fixture_gives_exactly_its_expected_diagnostics() {
    let files = toml_files_in(&fixture("bad"));
    assert!(files.len() >= 20, "the bad fixtures are present");
    for path in files {
        match load_file(&path) {
            Ok(_) => panic!("{} was accepted", path.display()),
            Err(diagnostics) => check_against_expectations(&path, &diagnostics),
        }
    }
}

#[test]
fn the_report_shows_file_line_column_key_source_line_and_caret() {
    let path = fixture("bad/limits-order.toml");
    let report = load_file(&path).unwrap_err().to_string();
    let shown = path.display().to_string();
    let expected = format!(
        "error: {shown}:9:10: `joint[1].limits`: min 170° is not less than max -170°; \
         write `limits = [min, max]` with min < max\n  |\n9 | limits = [170, -170]\n  |          ^\n"
    );
    assert!(report.starts_with(&expected), "{report}");
}

#[test]
fn problems_across_sections_are_all_reported_in_file_order() {
    let text = r#"name = "many problems"
length_unit = "inch"
convention = "dh"
[[joint]]
type = "revolute"
a = nan
limits = [1, 0]
[[joint]]
kind = "revolute"
[tool]
rpy = [0, 0]
"#;
    let d = load_str(text, "inline.toml").unwrap_err();
    let places: Vec<(usize, usize, &str)> = d
        .items
        .iter()
        .map(|i| (i.location.line, i.location.column, i.key.as_str()))
        .collect();
    assert_eq!(
        places,
        vec![
            (1, 8, "name"),
            (2, 15, "length_unit"),
            (6, 5, "joint[1].a"),
            (7, 10, "joint[1].limits"),
            (8, 1, "joint[2].type"),
            (9, 1, "joint[2].kind"),
            (11, 7, "tool.rpy"),
        ]
    );
    assert!(d
        .to_string()
        .starts_with("error: inline.toml:1:8: `name`: "));
}

#[test]
fn an_unreadable_file_is_one_diagnostic_without_a_place() {
    let d = load_file(Path::new("/nonexistent/arm.toml")).unwrap_err();
    assert_eq!(d.items.len(), 1);
    let report = d.to_string();
    assert!(
        report.starts_with("error: /nonexistent/arm.toml: cannot read the file"),
        "{report}"
    );
}

#[test]
fn every_prefix_of_every_example_arm_reads_without_panic() {
    // Truncated files exercise every partial state of the parser and the checks.
    for path in example_arm_paths() {
        let text = std::fs::read_to_string(&path).unwrap();
        let ends = (0..=text.len()).filter(|&i| text.is_char_boundary(i));
        for end in ends {
            let _ = load_str(&text[..end], "prefix.toml");
        }
    }
}

#[test]
fn every_single_line_removal_from_an_example_arm_reads_without_panic() {
    for path in example_arm_paths() {
        let text = std::fs::read_to_string(&path).unwrap();
        let lines: Vec<&str> = text.lines().collect();
        for skip in 0..lines.len() {
            let mutated: Vec<&str> = lines
                .iter()
                .enumerate()
                .filter(|(i, _)| *i != skip)
                .map(|(_, l)| *l)
                .collect();
            if let Err(d) = load_str(&mutated.join("\n"), "mutated.toml") {
                assert!(!d.items.is_empty());
                assert!(d.items.iter().all(|i| i.location.line >= 1));
            }
        }
    }
}
