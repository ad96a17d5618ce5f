use armforge_generator::classify::Family;
use armforge_generator::emit::{emit_module, EmitOptions};
use armforge_generator::plan::build_plan;
use armforge_generator::plan::samples::*;
fn main() {
    let o = SampleOptions {
        shoulder_axes_meet: true,
        orthogonal_wrist: true,
        ..SampleOptions::default()
    };
    let (model, geometry) = sample_arm(Family::Elbow, 0, &o);
    let plan = build_plan(&model, &geometry);
    print!(
        "{}",
        emit_module(
            &model,
            &plan,
            &EmitOptions {
                source_path: "x.toml".into(),
                without_test: false
            }
        )
    );
}
