//! README.md's examples against the code: the macro example is the code `tests/src/readme.rs`
//! compiles (so it names an existing arm and builds), the format example is labelled a fragment
//! or loads as a whole arm, and the command table lists every option people reach for.

use armforge_tests::readme::{bench_elbow, print_solutions};
use armforge_tests::workspace_root;

fn readme() -> String {
    std::fs::read_to_string(workspace_root().join("README.md")).expect("README.md")
}

/// The code between the markers of `tests/src/readme.rs`.
fn compiled_example() -> String {
    let source = include_str!("../src/readme.rs");
    let start = source
        .find("// README example begins\n")
        .expect("begin marker");
    let end = source.find("// README example ends").expect("end marker");
    source[start + "// README example begins\n".len()..end]
        .trim()
        .to_string()
}

#[test]
fn the_readme_macro_example_is_the_compiled_one() {
    let example = compiled_example();
    let readme = readme();
    assert!(
        readme.contains(&format!("```rust\n{example}\n```")),
        "README.md's macro example differs from tests/src/readme.rs:\n{example}"
    );
    // The arm it names exists (relative to this crate, as the README says).
    let path = example
        .split('"')
        .nth(1)
        .expect("a quoted path in the example");
    let arm = workspace_root().join("tests").join(path);
    assert!(arm.is_file(), "{} does not exist", arm.display());
    // And the compiled example runs: the pose of some joint values comes back.
    let joints = [0.1, -0.3, 0.4, 0.2, 0.5, -0.6];
    let target = bench_elbow::forward(&joints);
    print_solutions(&target);
    assert!(bench_elbow::solve(&target).iter().any(|s| s
        .joints
        .iter()
        .zip(joints)
        .all(|(a, b)| (a - b).abs() < 1e-9)));
}

#[test]
fn every_arm_file_the_readme_names_exists() {
    let readme = readme();
    let mut named = 0;
    for (i, _) in readme.match_indices("arms/") {
        let rest = &readme[i..];
        let end = rest.find(".toml").map(|e| e + ".toml".len());
        let Some(end) = end.filter(|&e| !rest[..e].contains(char::is_whitespace)) else {
            continue;
        };
        let path = workspace_root().join(&rest[..end]);
        assert!(
            path.is_file(),
            "README.md names {}, which does not exist",
            &rest[..end]
        );
        named += 1;
    }
    assert!(named >= 3, "README.md names the example arms");
}

#[test]
fn the_readme_command_table_lists_the_options_people_reach_for() {
    let readme = readme();
    for option in [
        "--near",
        "--branch",
        "--seed",
        "--meet-tolerance",
        "--parallel-tolerance",
        "--samples",
        "--joints",
        "--pose",
    ] {
        assert!(
            readme.contains(option),
            "README.md does not mention {option}"
        );
    }
    assert!(
        !readme.contains("side and top views"),
        "draw makes three views"
    );
}

#[test]
fn the_readme_format_example_is_labelled_a_fragment() {
    let readme = readme();
    let example = readme
        .find("### Example")
        .map(|i| &readme[i..])
        .expect("a format example");
    let heading = example.lines().next().unwrap_or_default();
    assert!(heading.contains("fragment"), "{heading}");
}
