//! `armforge new` writes descriptions that load, and its three conventions describe one arm.

use armforge_compiler::description::load_str;
use armforge_workbench::scaffold::{starting_description, Convention};

const CONVENTIONS: [Convention; 3] = [Convention::Dh, Convention::ModifiedDh, Convention::Axes];

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
