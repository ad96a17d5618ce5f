//! One configuration of the arm drawn in one view frame.

use armforge_runtime::math::{add, cross, dot, norm, scale, sub};
use armforge_runtime::{JointKind, Pose};
use svg::node::element::{Group, Polygon, Polyline, Rectangle as Rect};

use super::labels::Occupancy;
use super::layout::ViewFrame;
use super::primitives::{
    arrow, circle, end_on_axis, length, num, point_list, segment, text, text_width,
};
use super::scene::{ArmScene, JointMark};
use super::style;
use super::symbols::{frame_tips, mount_normal, mount_rim, Lengths};

/// Everything needed to draw one scene in one frame.
#[derive(Clone, Copy, Debug)]
pub struct ViewInput<'a> {
    /// Where and at what scale.
    pub frame: &'a ViewFrame,
    /// The configuration.
    pub scene: &'a ArmScene,
    /// Symbol sizes.
    pub lengths: &'a Lengths,
    /// Grid spacing, metres (the scale bar's length).
    pub grid_step: f64,
    /// A target pose to show under the tool frame.
    pub target: Option<&'a Pose>,
}

/// The SVG group of one view: frame, grid, mount, base, links, joints, wrist center, tool.
///
/// The group carries `data-view`, `data-panel`, `data-scale` (px per metre) and
/// `data-origin-x`/`-y` (the world origin on the page) so that tests and tools can map the
/// drawing back to the world.
pub fn render_view(input: &ViewInput) -> Group {
    let f = input.frame;
    let mut taken = Occupancy::default();
    let mut group = Group::new()
        .set("class", "view")
        .set("data-view", f.kind.name())
        .set("data-panel", f.panel.to_string())
        .set("data-scale", format!("{:.6}", f.scale))
        .set("data-origin-x", format!("{:.4}", f.origin[0]))
        .set("data-origin-y", format!("{:.4}", f.origin[1]))
        .add(background(f))
        .add(grid(f, input.grid_step))
        .add(mount(f, &input.scene.base, input.lengths.mount_radius))
        .add(
            frame_axes(f, &input.scene.base, input.lengths.frame_arrow, 1.2).set("opacity", "0.55"),
        );
    if let Some(target) = input.target {
        group = group.add(target_frame(f, target, input.lengths.frame_arrow));
    }
    group = group
        .add(rails(f, input.scene))
        .add(links(f, input.scene))
        .add(joint_axes(f, input.scene, input.lengths.axis_arrow));
    let (joints, numbers) = joints(f, input.scene, &mut taken);
    group = group.add(joints);
    if let Some(c) = input.scene.wrist_center {
        group = group.add(wrist_center(f.page_point(&c)));
        taken.take(f.page_point(&c), style::WRIST_RADIUS);
    }
    group
        .add(tool(
            f,
            &input.scene.tool,
            input.lengths.frame_arrow,
            &mut taken,
        ))
        .add(numbers.into_iter().fold(Group::new(), |g, n| g.add(n)))
}

fn background(f: &ViewFrame) -> Group {
    Group::new()
        .add(
            Rect::new()
                .set("x", num(f.left))
                .set("y", num(f.top))
                .set("width", num(f.width))
                .set("height", num(f.height))
                .set("rx", "4")
                .set("fill", style::FRAME_FILL)
                .set("stroke", style::FRAME_STROKE),
        )
        .add(
            text(f.heading_anchor(), f.kind.heading(), style::SMALL, "start")
                .set("fill", style::MUTED),
        )
}

/// Grid lines every `step` metres, and the world axes through the origin a little darker.
fn grid(f: &ViewFrame, step: f64) -> Group {
    let window = f.world_window();
    let mut group = Group::new().set("class", "grid");
    if step.is_nan() || step <= 0.0 {
        return group;
    }
    for k in 0..2 {
        let first = (window.min[k] / step).ceil() as i64;
        let last = (window.max[k] / step).floor() as i64;
        if last - first > 200 {
            continue;
        }
        for i in first..=last {
            let at = i as f64 * step;
            let (a, b) = if k == 0 {
                ([at, window.min[1]], [at, window.max[1]])
            } else {
                ([window.min[0], at], [window.max[0], at])
            };
            let colour = if i == 0 {
                style::WORLD_AXES
            } else {
                style::GRID
            };
            group = group.add(segment(
                plane_to_page(f, a),
                plane_to_page(f, b),
                colour,
                0.8,
            ));
        }
    }
    group
}

/// A point of the view plane (metres) on the page.
fn plane_to_page(f: &ViewFrame, p: [f64; 2]) -> [f64; 2] {
    [f.origin[0] + f.scale * p[0], f.origin[1] - f.scale * p[1]]
}

/// The mount plate about the base origin, with ground hatching on the side away from the arm
/// when the plate is seen edge-on enough.
fn mount(f: &ViewFrame, base: &Pose, radius: f64) -> Group {
    let rim: Vec<[f64; 2]> = mount_rim(base, radius)
        .iter()
        .map(|p| f.page_point(p))
        .collect();
    let mut group = Group::new().set("class", "mount").add(
        Polygon::new()
            .set("points", point_list(&rim))
            .set("fill", style::MOUNT_FILL)
            .set("stroke", style::MOUNT_STROKE)
            .set("stroke-width", "1.50"),
    );
    let normal = mount_normal(base);
    if length(f.direction_on_page(&normal)) < 0.5 {
        return group;
    }
    let along = cross(&normal, &f.kind.toward_viewer());
    let along = scale(&along, 1.0 / norm(&along));
    let strokes = 9;
    for k in 0..strokes {
        let t = -radius + 2.0 * radius * k as f64 / (strokes - 1) as f64;
        let start = add(&base.translation, &scale(&along, t));
        let end = add(
            &start,
            &add(
                &scale(&normal, -0.45 * radius),
                &scale(&along, -0.3 * radius),
            ),
        );
        group = group.add(segment(
            f.page_point(&start),
            f.page_point(&end),
            style::MOUNT_STROKE,
            1.0,
        ));
    }
    group
}

/// A frame's x, y, z arrows (red, green, blue); an axis nearly along the line of sight is
/// drawn end-on.
fn frame_axes(f: &ViewFrame, pose: &Pose, length_m: f64, width: f64) -> Group {
    let origin = f.page_point(&pose.translation);
    let mut group = Group::new().set("class", "frame");
    for (tip, colour) in frame_tips(pose, length_m).iter().zip(style::XYZ) {
        let direction = sub(tip, &pose.translation);
        let on_page = f.direction_on_page(&direction);
        if length(on_page) < style::END_ON_SHARE * length_m {
            let toward = dot(&direction, &f.kind.toward_viewer()) > 0.0;
            group = group.add(end_on_axis(origin, 4.5, toward, colour));
        } else if let Some(a) = arrow(origin, f.page_point(tip), colour, width) {
            group = group.add(a);
        }
    }
    group
}

/// The target pose as a wide pale frame: the tool frame of every solution lies on it.
fn target_frame(f: &ViewFrame, target: &Pose, length_m: f64) -> Group {
    let origin = f.page_point(&target.translation);
    let mut group = Group::new().set("class", "target").set("opacity", "0.28");
    for (tip, colour) in frame_tips(target, length_m).iter().zip(style::XYZ) {
        group = group
            .add(segment(origin, f.page_point(tip), colour, 7.0).set("stroke-linecap", "round"));
    }
    group.add(circle(origin, 6.0).set("fill", style::TEXT))
}

fn rails(f: &ViewFrame, scene: &ArmScene) -> Group {
    scene.joints.iter().filter_map(|j| j.rail).fold(
        Group::new().set("class", "rails"),
        |g, [a, b]| {
            g.add(
                segment(f.page_point(&a), f.page_point(&b), style::RAIL, 9.0)
                    .set("stroke-linecap", "butt"),
            )
        },
    )
}

fn links(f: &ViewFrame, scene: &ArmScene) -> Polyline {
    let points: Vec<[f64; 2]> = scene.links.iter().map(|p| f.page_point(p)).collect();
    Polyline::new()
        .set("class", "links")
        .set("points", point_list(&points))
        .set("fill", "none")
        .set("stroke", style::LINK)
        .set("stroke-width", num(style::LINK_WIDTH))
        .set("stroke-linecap", "round")
        .set("stroke-linejoin", "round")
}

/// Each joint's positive axis as an arrow (a revolute axis also as a dashed line behind the
/// joint); axes along the line of sight are marked on the joint itself.
fn joint_axes(f: &ViewFrame, scene: &ArmScene, length_m: f64) -> Group {
    let mut group = Group::new().set("class", "joint-axes");
    for joint in &scene.joints {
        let on_page = f.direction_on_page(&joint.positive_axis);
        if length(on_page) < style::END_ON_SHARE {
            continue;
        }
        let centre = f.page_point(&joint.centre);
        let tip = f.page_point(&add(&joint.centre, &scale(&joint.positive_axis, length_m)));
        if joint.kind == JointKind::Revolute {
            let tail = f.page_point(&sub(
                &joint.centre,
                &scale(&joint.positive_axis, 0.5 * length_m),
            ));
            group = group.add(
                segment(tail, tip, style::AXIS, 1.0)
                    .set("stroke-dasharray", "4 3")
                    .set("opacity", "0.7"),
            );
        }
        if let Some(a) = arrow(centre, tip, style::AXIS, 1.6) {
            group = group.add(a);
        }
    }
    group
}

/// The joint marks (far ones first) and their numbers, placed clear of each other.
fn joints(
    f: &ViewFrame,
    scene: &ArmScene,
    taken: &mut Occupancy,
) -> (Group, Vec<svg::node::element::Text>) {
    let mut order: Vec<&JointMark> = scene.joints.iter().collect();
    // Depths in whole hundredths of a pixel, so that rounding noise in the joint values
    // cannot reorder joints that sit at the same place.
    let depth = |j: &JointMark| (f.kind.depth(&j.centre) * f.scale * 100.0).round();
    order.sort_by(|a, b| depth(a).total_cmp(&depth(b)).then(a.index.cmp(&b.index)));
    let mut group = Group::new().set("class", "joints");
    for joint in &order {
        group = group.add(joint_mark(f, joint));
        taken.take(f.page_point(&joint.centre), style::JOINT_RADIUS);
    }
    let numbers = scene
        .joints
        .iter()
        .map(|joint| {
            let label = (joint.index + 1).to_string();
            let size = [text_width(&label, style::SMALL), style::SMALL];
            let at = taken.place(f.page_point(&joint.centre), style::JOINT_RADIUS + 1.0, size);
            halo(text(
                [at[0], at[1] + 0.36 * style::SMALL],
                &label,
                style::SMALL,
                "middle",
            ))
            .set("class", "joint-number")
            .set("font-weight", "bold")
            .set("fill", style::JOINT)
        })
        .collect();
    (group, numbers)
}

/// One joint: a circle (revolute) or square (prismatic) at its centre, with ⊙/⊗ when its
/// positive axis points out of or into the page.
fn joint_mark(f: &ViewFrame, joint: &JointMark) -> Group {
    let c = f.page_point(&joint.centre);
    let r = style::JOINT_RADIUS;
    let number = (joint.index + 1).to_string();
    let kind = match joint.kind {
        JointKind::Revolute => "revolute",
        JointKind::Prismatic => "prismatic",
    };
    let mark = Group::new()
        .set("class", "joint")
        .set("data-joint", number)
        .set("data-kind", kind);
    let mark = match joint.kind {
        JointKind::Revolute => mark.add(
            circle(c, r)
                .set("fill", "white")
                .set("stroke", style::JOINT)
                .set("stroke-width", "1.80"),
        ),
        JointKind::Prismatic => mark.add(
            Rect::new()
                .set("x", num(c[0] - r))
                .set("y", num(c[1] - r))
                .set("width", num(2.0 * r))
                .set("height", num(2.0 * r))
                .set("fill", "white")
                .set("stroke", style::JOINT)
                .set("stroke-width", "1.80"),
        ),
    };
    if length(f.direction_on_page(&joint.positive_axis)) < style::END_ON_SHARE {
        let toward = dot(&joint.positive_axis, &f.kind.toward_viewer()) > 0.0;
        mark.add(end_on_axis(c, 0.62 * r, toward, style::AXIS))
    } else {
        mark
    }
}

/// A white outline behind a label's letters, so that lines under it do not hide it.
fn halo(t: svg::node::element::Text) -> svg::node::element::Text {
    t.set("stroke", "white")
        .set("stroke-width", "3")
        .set("stroke-linejoin", "round")
        .set("paint-order", "stroke")
}

fn wrist_center(c: [f64; 2]) -> Polygon {
    let r = style::WRIST_RADIUS;
    Polygon::new()
        .set("class", "wrist-center")
        .set(
            "points",
            point_list(&[
                [c[0], c[1] - r],
                [c[0] + r, c[1]],
                [c[0], c[1] + r],
                [c[0] - r, c[1]],
            ]),
        )
        .set("fill", style::WRIST)
        .set("stroke", "#8a4b00")
        .set("stroke-width", "1.00")
}

/// The tool frame: x, y, z arrows with their letters, and a dot at the tool origin.
fn tool(f: &ViewFrame, pose: &Pose, length_m: f64, taken: &mut Occupancy) -> Group {
    let origin = f.page_point(&pose.translation);
    let mut group = Group::new()
        .set("class", "tool")
        .add(frame_axes(f, pose, length_m, 1.8));
    for ((tip, colour), letter) in frame_tips(pose, length_m)
        .iter()
        .zip(style::XYZ)
        .zip(["x", "y", "z"])
    {
        let on_page = f.direction_on_page(&sub(tip, &pose.translation));
        if length(on_page) < style::END_ON_SHARE * length_m {
            continue;
        }
        let page_tip = f.page_point(tip);
        let size = [text_width(letter, style::SMALL), style::SMALL];
        let at = taken.place(page_tip, 1.0, size);
        group = group.add(
            halo(text(
                [at[0], at[1] + 0.36 * style::SMALL],
                letter,
                style::SMALL,
                "middle",
            ))
            .set("fill", colour)
            .set("font-weight", "bold"),
        );
    }
    taken.take(origin, 3.0);
    group.add(
        circle(origin, 3.0)
            .set("class", "tool-origin")
            .set("fill", style::TEXT),
    )
}
