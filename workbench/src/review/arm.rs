//! §1 The arm as described: the joint axes at zero in the file's units, how each joint value
//! maps to the angle or length the equations use, the base and tool, and tool positions for
//! simple configurations that a person can measure on the machine.

use std::fmt::Write as _;

use armforge_runtime::{Joint, JointKind};

use super::show::Show;
use armforge_compiler::model::Model;

/// Writes §1.
pub fn write(out: &mut String, model: &Model, s: &Show) {
    let _ = writeln!(out, "## 1. The arm as described\n");
    if let Some(d) = &model.description {
        let _ = writeln!(out, "{}\n", super::markdown::paragraph(d));
    }
    let _ = writeln!(
        out,
        "Every joint's axis in the base frame with every joint at zero (the product-of-\
         exponentials model, Brockett 1984): a unit direction `h` and, for a revolute joint, a \
         point `p` on the axis. The equations below use the *model value* `θ` (angle or \
         slide length) of each joint; the column `θ from q` gives it from the joint value `q` \
         a controller uses.\n"
    );
    let _ = writeln!(
        out,
        "| joint | name | type | axis h | point p | θ from q | limits of q |\n|---|---|---|---|---|---|---|"
    );
    for (i, j) in model.joints.iter().enumerate() {
        let joint = &j.joint;
        let _ = writeln!(
            out,
            "| {} | {} | {} | {} | {} | {} | {} … {} |",
            i + 1,
            super::markdown::inline(&j.name),
            kind_name(joint.kind),
            s.dir(&joint.axis),
            match joint.kind {
                JointKind::Revolute => s.point(&joint.point),
                JointKind::Prismatic => "—".into(),
            },
            model_value_text(joint, i + 1, s),
            s.joint_value(joint, joint.limits[0]),
            s.joint_value(joint, joint.limits[1]),
        );
    }
    let _ = writeln!(out);
    let _ = writeln!(
        out,
        "- Base pose `B` (the base frame in the world): translation {}, rotation rows {}",
        s.point(&model.base.translation),
        s.rows(&model.base.rotation)
    );
    let _ = writeln!(
        out,
        "- Tool pose at zero `M` (the tool frame in the base frame, every joint at zero): \
         translation {}, rotation rows {}\n",
        s.point(&model.tool.translation),
        s.rows(&model.tool.rotation)
    );
    measurable_positions(out, model, s);
}

fn kind_name(kind: JointKind) -> &'static str {
    match kind {
        JointKind::Revolute => "revolute",
        JointKind::Prismatic => "prismatic",
    }
}

/// `θ4 = q4`, `θ2 = q2 − 90°`, `θ3 = −q3 + 10 mm`.
fn model_value_text(joint: &Joint, n: usize, s: &Show) -> String {
    let q = if joint.direction < 0.0 {
        format!("−q{n}")
    } else {
        format!("q{n}")
    };
    if joint.offset == 0.0 {
        return format!("θ{n} = {q}");
    }
    let sign = if joint.offset < 0.0 { "−" } else { "+" };
    let amount = match joint.kind {
        JointKind::Revolute => s.angle(joint.offset.abs()),
        JointKind::Prismatic => s.len(joint.offset.abs()),
    };
    format!("θ{n} = {q} {sign} {amount}")
}

/// A quarter turn or 100 mm, within the joint's limits when they allow it.
fn probe_value(joint: &Joint, s: &Show) -> f64 {
    let step = match joint.kind {
        JointKind::Revolute => std::f64::consts::FRAC_PI_2,
        JointKind::Prismatic => s.units.length_to_si(if s.units.length.metres() < 1.0 {
            100.0
        } else {
            0.1
        }),
    };
    let [lo, hi] = joint.limits;
    if step <= hi {
        step
    } else if -step >= lo {
        -step
    } else {
        hi
    }
}

fn measurable_positions(out: &mut String, model: &Model, s: &Show) {
    let _ = writeln!(
        out,
        "Tool positions to compare with the machine (world frame, every other joint at zero):\n"
    );
    let _ = writeln!(out, "| configuration | tool position |\n|---|---|");
    let zero = vec![0.0; model.joints.len()];
    let p = model.forward(&zero).translation;
    let _ = writeln!(out, "| every joint at zero | {} |", s.point(&p));
    for (i, j) in model.joints.iter().enumerate() {
        let mut q = zero.clone();
        q[i] = probe_value(&j.joint, s);
        let p = model.forward(&q).translation;
        let _ = writeln!(
            out,
            "| q{} = {} | {} |",
            i + 1,
            s.joint_value(&j.joint, q[i]),
            s.point(&p)
        );
    }
    let _ = writeln!(out);
}
