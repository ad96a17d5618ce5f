//! `armforge new` writes descriptions that load, and its three conventions describe one arm.

use std::process::Command;

use armforge_compiler::description::load_str;
use armforge_workbench::scaffold::{starting_description, Convention};

const CONVENTIONS: [Convention; 3] = Convention::ALL;

#[test]
fn every_starting_description_loads() {
    for convention in CONVENTIONS {
        let text = starting_description("starter", convention);
        if let Err(d) = load_str(&text, "starter.toml") {
            panic!("{:?} template does not load:\n{d}", convention);
        }
    }
}

#[test]
fn the_three_conventions_give_the_same_forward_kinematics() {
    let models: Vec<_> = CONVENTIONS
        .iter()
        .map(|&c| load_str(&starting_description("starter", c), "starter.toml").unwrap())
        .collect();
    // A fixed spread of configurations (radians), including zero.
    let configurations: [[f64; 6]; 4] = [
        [0.0; 6],
        [0.3, -0.7, 1.1, 0.4, -0.9, 2.0],
        [-2.5, 0.2, -1.4, 3.0, 0.1, -5.0],
        [1.0, 1.0, 1.0, 1.0, 1.0, 1.0],
    ];
    for q in configurations {
        let reference = models[0].forward(&q);
        for model in &models[1..] {
            let pose = model.forward(&q);
            for r in 0..3 {
                assert!((pose.translation[r] - reference.translation[r]).abs() < 1e-12);
                for c in 0..3 {
                    assert!((pose.rotation[r][c] - reference.rotation[r][c]).abs() < 1e-12);
                }
            }
        }
    }
}

#[test]
fn the_flange_sits_where_the_comments_say() {
    // At zero the flange is 520 mm out and 790 mm up, its z axis along the forearm (+x).
    let model = load_str(&starting_description("starter", Convention::Dh), "s.toml").unwrap();
    let pose = model.forward(&[0.0; 6]);
    let expected = [0.52, 0.0, 0.79];
    for (got, want) in pose.translation.iter().zip(expected) {
        assert!((got - want).abs() < 1e-12, "{pose:?}");
    }
    assert!((pose.rotation[0][2] - 1.0).abs() < 1e-12, "{pose:?}");
}

/// `armforge new` refuses the names the description reader refuses, with the reader's reason,
/// and writes nothing: `fn` is a Rust keyword (The Rust Reference, "Keywords") and cannot name
/// the module the arm becomes.
#[test]
fn new_refuses_a_keyword_name_as_the_reader_does() {
    let dir = std::env::temp_dir().join(format!("armforge-new-keyword-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    let out = Command::new(env!("CARGO_BIN_EXE_armforge"))
        .args(["new", "fn"])
        .current_dir(&dir)
        .output()
        .expect("armforge runs");
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{stderr}");
    assert!(stderr.contains("Rust keyword"), "{stderr}");
    assert!(!dir.join("fn.toml").exists());
    // The reader refuses the same name in a file, for the same reason.
    let text = starting_description("fn", Convention::Dh);
    let problems = load_str(&text, "fn.toml").expect_err("a keyword name is refused");
    assert!(problems.to_string().contains("Rust keyword"), "{problems}");
    let _ = std::fs::remove_dir_all(&dir);
}

/// `--convention` takes the words the file's `convention` key takes, and no others.
#[test]
fn new_takes_the_file_convention_words() {
    for convention in Convention::ALL {
        let word = convention.word();
        assert_eq!(
            armforge_workbench::scaffold::parse_convention(word),
            Ok(convention)
        );
    }
    assert!(armforge_workbench::scaffold::parse_convention("denavit").is_err());
}
