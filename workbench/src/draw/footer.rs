//! The page's footer: a scale bar, the units, a legend of the symbols and the joints' names.

use armforge_runtime::JointKind;
use svg::node::element::{Group, Polygon, Rectangle as Rect};

use super::layout::{PageLayout, MARGIN};
use super::primitives::{
    arrow, circle, end_on_axis, num, point_list, segment, text, text_width, wrap_words,
};
use super::scale_bar::ScaleBar;
use super::style;
use super::Drawing;
use armforge_compiler::model::Model;

/// The shortest scale bar, px.
const MIN_BAR_PX: f64 = 60.0;
/// Height of one footer line, px.
const FOOTER_LINE: f64 = 22.0;

/// The footer: scale bar and units, a legend of the symbols, the joints' names. Returns the
/// group and its height.
pub fn footer(drawing: &Drawing, layout: &PageLayout, bar: &ScaleBar) -> (Group, f64) {
    let top = layout.footer_top;
    let right = layout.width - MARGIN;
    let mut group = Group::new().set("class", "footer");
    let readable = ScaleBar::at_least(&drawing.model.units, MIN_BAR_PX / layout.scale);
    let (scale_group, scale_right) = scale_bar(&readable, layout.scale, [MARGIN, top + 14.0]);
    group = group.add(scale_group);
    let units = drawing.model.units;
    let note = format!(
        "grid {} · world frame · every view at the same scale · lengths in {}, angles in {}",
        bar.label,
        units.length.symbol(),
        units.angle.symbol()
    );
    group = group.add(
        text(
            [scale_right + 16.0, top + 18.0],
            &note,
            style::NORMAL,
            "start",
        )
        .set("fill", style::MUTED),
    );
    let mut cursor = [MARGIN, top + 24.0 + FOOTER_LINE];
    for item in legend_items(drawing) {
        let width = 22.0 + text_width(&item.label, style::NORMAL) + 14.0;
        if cursor[0] + width > right && cursor[0] > MARGIN {
            cursor = [MARGIN, cursor[1] + FOOTER_LINE];
        }
        group = group.add(legend_entry(&item, cursor));
        cursor[0] += width;
    }
    let names = joint_names(drawing.model);
    let max_chars = ((right - MARGIN) / (0.6 * style::NORMAL)) as usize;
    for line in wrap_words(&names, max_chars) {
        cursor = [MARGIN, cursor[1] + FOOTER_LINE];
        group = group
            .add(text([MARGIN, cursor[1]], &line, style::NORMAL, "start").set("fill", style::TEXT));
    }
    (group, cursor[1] - top + 8.0)
}

/// The scale bar at `at` (left end, baseline of the labels): returns the group and its right
/// edge, px.
fn scale_bar(bar: &ScaleBar, px_per_metre: f64, at: [f64; 2]) -> (Group, f64) {
    let length = bar.metres * px_per_metre;
    let y = at[1];
    let x0 = at[0] + 4.0;
    let x1 = x0 + length;
    let mut group = Group::new()
        .set("class", "scale-bar")
        .set("data-length-px", num(length))
        .set("data-length", bar.label.clone())
        .add(
            Rect::new()
                .set("x", num(x0))
                .set("y", num(y - 3.0))
                .set("width", num(length / 2.0))
                .set("height", "6")
                .set("fill", style::TEXT),
        )
        .add(
            Rect::new()
                .set("x", num(x0 + length / 2.0))
                .set("y", num(y - 3.0))
                .set("width", num(length / 2.0))
                .set("height", "6")
                .set("fill", "white")
                .set("stroke", style::TEXT),
        );
    for x in [x0, x1] {
        group = group.add(segment([x, y - 6.0], [x, y + 3.0], style::TEXT, 1.0));
    }
    group = group
        .add(text([x0, y + 15.0], "0", style::SMALL, "middle").set("fill", style::TEXT))
        .add(text([x1, y + 15.0], &bar.label, style::SMALL, "middle").set("fill", style::TEXT));
    (group, x1 + text_width(&bar.label, style::SMALL) / 2.0)
}

/// One symbol of the legend.
struct LegendItem {
    symbol: Symbol,
    label: String,
}

enum Symbol {
    Revolute,
    Prismatic,
    PositiveAxis,
    Toward,
    Away,
    Wrist,
    ToolFrame,
    Mount,
    Target,
}

fn legend_items(drawing: &Drawing) -> Vec<LegendItem> {
    let kinds: Vec<JointKind> = drawing.model.joints.iter().map(|j| j.joint.kind).collect();
    let mut items = Vec::new();
    let mut add = |symbol, label: &str| {
        items.push(LegendItem {
            symbol,
            label: label.to_string(),
        })
    };
    if kinds.contains(&JointKind::Revolute) {
        add(Symbol::Revolute, "revolute joint");
    }
    if kinds.contains(&JointKind::Prismatic) {
        add(Symbol::Prismatic, "prismatic joint on its rail");
    }
    add(
        Symbol::PositiveAxis,
        "positive joint direction (right-hand rule)",
    );
    add(Symbol::Toward, "axis toward you");
    add(Symbol::Away, "axis away from you");
    if drawing.wrist_center.is_some() {
        add(Symbol::Wrist, "wrist center");
    }
    add(Symbol::ToolFrame, "tool frame x y z");
    add(Symbol::Mount, "base frame and mount");
    if drawing.target.is_some() {
        add(Symbol::Target, "target pose");
    }
    items
}

fn legend_entry(item: &LegendItem, at: [f64; 2]) -> Group {
    let c = [at[0] + 8.0, at[1] - 4.0];
    let symbol = match item.symbol {
        Symbol::Revolute => Group::new().add(
            circle(c, 5.5)
                .set("fill", "white")
                .set("stroke", style::JOINT)
                .set("stroke-width", "1.80"),
        ),
        Symbol::Prismatic => Group::new()
            .add(segment(
                [c[0] - 9.0, c[1]],
                [c[0] + 9.0, c[1]],
                style::RAIL,
                8.0,
            ))
            .add(
                Rect::new()
                    .set("x", num(c[0] - 5.0))
                    .set("y", num(c[1] - 5.0))
                    .set("width", "10")
                    .set("height", "10")
                    .set("fill", "white")
                    .set("stroke", style::JOINT)
                    .set("stroke-width", "1.80"),
            ),
        Symbol::PositiveAxis => {
            arrow([c[0] - 8.0, c[1]], [c[0] + 10.0, c[1]], style::AXIS, 1.6).unwrap_or_default()
        }
        Symbol::Toward => end_on_axis(c, 5.0, true, style::AXIS),
        Symbol::Away => end_on_axis(c, 5.0, false, style::AXIS),
        Symbol::Wrist => Group::new().add(
            Polygon::new()
                .set(
                    "points",
                    point_list(&[
                        [c[0], c[1] - 5.0],
                        [c[0] + 5.0, c[1]],
                        [c[0], c[1] + 5.0],
                        [c[0] - 5.0, c[1]],
                    ]),
                )
                .set("fill", style::WRIST),
        ),
        Symbol::ToolFrame => {
            let o = [c[0] - 6.0, c[1] + 5.0];
            [[14.0, 0.0], [8.0, -8.0], [0.0, -13.0]]
                .iter()
                .zip(style::XYZ)
                .filter_map(|(d, colour)| arrow(o, [o[0] + d[0], o[1] + d[1]], colour, 1.5))
                .fold(Group::new(), |g, a| g.add(a))
        }
        Symbol::Mount => Group::new()
            .add(segment(
                [c[0] - 9.0, c[1] + 3.0],
                [c[0] + 9.0, c[1] + 3.0],
                style::MOUNT_STROKE,
                2.0,
            ))
            .add(segment(
                [c[0] - 5.0, c[1] + 3.0],
                [c[0] - 8.0, c[1] + 7.0],
                style::MOUNT_STROKE,
                1.0,
            ))
            .add(segment(
                [c[0], c[1] + 3.0],
                [c[0] - 3.0, c[1] + 7.0],
                style::MOUNT_STROKE,
                1.0,
            ))
            .add(segment(
                [c[0] + 5.0, c[1] + 3.0],
                [c[0] + 2.0, c[1] + 7.0],
                style::MOUNT_STROKE,
                1.0,
            )),
        Symbol::Target => Group::new().set("opacity", "0.28").add(segment(
            [c[0] - 8.0, c[1]],
            [c[0] + 9.0, c[1]],
            style::XYZ[0],
            7.0,
        )),
    };
    Group::new().set("class", "legend").add(symbol).add(
        text([at[0] + 22.0, at[1]], &item.label, style::NORMAL, "start").set("fill", style::TEXT),
    )
}

/// `joints: 1 waist · 2 shoulder · …`, or plain numbers for joints without names.
fn joint_names(model: &Model) -> String {
    let names: Vec<String> = model
        .joints
        .iter()
        .enumerate()
        .map(|(i, j)| {
            let number = i + 1;
            if j.name == format!("joint {number}") {
                format!("{number}")
            } else {
                format!("{number} {}", j.name)
            }
        })
        .collect();
    format!("joints: {}", names.join(" · "))
}
