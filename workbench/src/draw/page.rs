//! The whole page: title, panels with captions, and a footer with the scale bar and legend.

use armforge_runtime::JointKind;
use svg::node::element::{Group, Rectangle as Rect, TSpan, Text};
use svg::Document;

use super::footer::footer;
use super::layout::{lay_out, Arrangement, Bounds, LayoutRequest, PageLayout, MARGIN};
use super::primitives::{num, text, wrap_words};
use super::render_view::{render_view, ViewInput};
use super::scale_bar::ScaleBar;
use super::scene::{ArmScene, Skeleton};
use super::style;
use super::symbols::{extent_points, frame_tips, Lengths};
use super::Drawing;
use armforge_compiler::model::Model;
use armforge_compiler::units::{AngleUnit, LengthUnit};

/// The largest view extent of a page with one panel, px.
const SINGLE_PANEL_EXTENT: f64 = 360.0;
/// The largest view extent of a page with several panels, px.
const MULTI_PANEL_EXTENT: f64 = 240.0;
/// How much wider bold text runs than regular text.
const BOLD_WIDTH: f64 = 1.12;
/// Joint values per caption line when a panel's views are stacked (narrow panels).
const VALUES_PER_NARROW_LINE: usize = 3;

/// Renders a drawing to an SVG document.
pub fn render(drawing: &Drawing) -> String {
    let model = drawing.model;
    let skeleton = Skeleton::of(model);
    let scenes: Vec<ArmScene> = drawing
        .panels
        .iter()
        .map(|p| ArmScene::new(model, &skeleton, &p.joint_values, drawing.wrist_center))
        .collect();
    let lengths = Lengths::for_scenes(&scenes, drawing.target.as_ref());
    let mut world_points: Vec<[f64; 3]> = scenes
        .iter()
        .flat_map(|s| extent_points(s, &lengths))
        .collect();
    if let Some(t) = &drawing.target {
        world_points.push(t.translation);
        world_points.extend(frame_tips(t, lengths.frame_arrow));
    }
    let bounds: Vec<Bounds> = drawing
        .views
        .iter()
        .map(|v| {
            Bounds::of(world_points.iter().map(|p| v.project(p))).unwrap_or(Bounds {
                min: [-0.5; 2],
                max: [0.5; 2],
            })
        })
        .collect();
    let largest = bounds.iter().flat_map(|b| b.size()).fold(0.0, f64::max);
    let bar = ScaleBar::for_extent(&model.units, largest);
    let request = |caption_lines| LayoutRequest {
        views: &drawing.views,
        arrangement: drawing.arrangement,
        panels: drawing.panels.len(),
        columns: drawing.columns,
        caption_lines,
        largest_extent_px: if drawing.panels.len() > 1 {
            MULTI_PANEL_EXTENT
        } else {
            SINGLE_PANEL_EXTENT
        },
        footer_height: 0.0,
        bounds: &bounds,
    };
    let panel_width = lay_out(&request(1)).panel_width;
    let captions: Vec<Vec<CaptionLine>> = drawing
        .panels
        .iter()
        .map(|p| caption_lines(model, p, drawing.arrangement, panel_width))
        .collect();
    let mut layout = lay_out(&request(captions.iter().map(Vec::len).max().unwrap_or(1)));
    let (footer, footer_height) = footer(drawing, &layout, &bar);
    layout.height += footer_height;

    let mut document = Document::new()
        .set(
            "viewBox",
            format!("0 0 {} {}", num(layout.width), num(layout.height)),
        )
        .set("width", num(layout.width))
        .set("height", num(layout.height))
        .set("font-family", style::FONT)
        .add(
            Rect::new()
                .set("width", "100%")
                .set("height", "100%")
                .set("fill", "white"),
        )
        .add(title(drawing, &layout));
    for (panel, (lines, corner)) in captions.iter().zip(&layout.captions).enumerate() {
        document = document.add(caption(lines, *corner, panel));
    }
    for frame in &layout.frames {
        document = document.add(render_view(&ViewInput {
            frame,
            scene: &scenes[frame.panel],
            lengths: &lengths,
            grid_step: bar.metres,
            target: drawing.target.as_ref(),
        }));
    }
    document.add(footer).to_string()
}

fn title(drawing: &Drawing, layout: &PageLayout) -> Group {
    let model = drawing.model;
    let name = TSpan::new(armforge_compiler::text::escape_line(&model.name))
        .set("font-weight", "bold")
        .set("font-size", num(style::TITLE));
    let subject =
        TSpan::new(format!("  — {}", drawing.subject)).set("font-size", num(style::NORMAL + 1.0));
    let heading = Text::new("")
        .set("x", num(MARGIN))
        .set("y", "28.00")
        .set("fill", style::TEXT)
        .add(name)
        .add(subject);
    let max_chars = ((layout.width - 2.0 * MARGIN) / (0.6 * style::NORMAL)) as usize;
    let about = model
        .description
        .as_deref()
        .map(first_line)
        .unwrap_or_else(|| model.source_path.clone());
    let about = text(
        [MARGIN, 47.0],
        &shorten(&about, max_chars),
        style::NORMAL,
        "start",
    )
    .set("fill", style::MUTED);
    Group::new().set("class", "title").add(heading).add(about)
}

fn first_line(s: &str) -> String {
    s.lines()
        .map(str::trim)
        .find(|l| !l.is_empty())
        .unwrap_or("")
        .to_string()
}

fn shorten(s: &str, max_chars: usize) -> String {
    if s.chars().count() <= max_chars {
        s.to_string()
    } else {
        let mut out: String = s.chars().take(max_chars.saturating_sub(1)).collect();
        out.push('…');
        out
    }
}

/// One line of a panel's caption.
struct CaptionLine {
    text: String,
    bold: bool,
}

/// The caption's lines, wrapped to the panel's width: the panel's heading (bold), the joint
/// values in the file's units, and the equivalent values of joints with whole-turn
/// alternatives.
fn caption_lines(
    model: &Model,
    panel: &super::Panel,
    arrangement: Arrangement,
    width: f64,
) -> Vec<CaptionLine> {
    let values: Vec<String> = model
        .joints
        .iter()
        .enumerate()
        .map(|(i, j)| {
            let q = panel.joint_values.get(i).copied().unwrap_or(0.0);
            joint_value(model, j.joint.kind, q)
        })
        .collect();
    let per_line = match arrangement {
        Arrangement::Row => values.len().max(1),
        Arrangement::Column => VALUES_PER_NARROW_LINE,
    };
    let mut plain = Vec::new();
    for (k, chunk) in values.chunks(per_line).enumerate() {
        let first = k * per_line + 1;
        let last = first + chunk.len() - 1;
        let names = if first == last {
            format!("q{first}")
        } else {
            format!("q{first}–q{last}")
        };
        plain.push(format!("{names}: {}", chunk.join(", ")));
    }
    plain.extend(alternatives_line(model, panel));
    let chars =
        |bold_factor: f64| ((width - 4.0) / (bold_factor * 0.58 * style::NORMAL)).max(8.0) as usize;
    let mut lines: Vec<CaptionLine> = wrap_words(&panel.caption, chars(BOLD_WIDTH))
        .into_iter()
        .map(|text| CaptionLine { text, bold: true })
        .collect();
    for line in plain {
        lines.extend(
            wrap_words(&line, chars(1.0))
                .into_iter()
                .map(|text| CaptionLine { text, bold: false }),
        );
    }
    lines
}

/// `also q4 = 180°; q6 = 270° or -450°`: the other values of joints that differ among the
/// panel's equivalent solutions.
fn alternatives_line(model: &Model, panel: &super::Panel) -> Option<String> {
    let mut parts = Vec::new();
    for (i, joint) in model.joints.iter().enumerate() {
        let shown = joint_value(
            model,
            joint.joint.kind,
            panel.joint_values.get(i).copied().unwrap_or(0.0),
        );
        let mut others: Vec<String> = Vec::new();
        for alternative in &panel.alternatives {
            let v = joint_value(
                model,
                joint.joint.kind,
                alternative.get(i).copied().unwrap_or(0.0),
            );
            if v != shown && !others.contains(&v) {
                others.push(v);
            }
        }
        if !others.is_empty() {
            parts.push(format!("q{} = {}", i + 1, others.join(" or ")));
        }
    }
    (!parts.is_empty()).then(|| format!("also {}", parts.join("; ")))
}

/// A joint value in the file's unit, to about a tenth of a degree or millimetre (0.001 rad,
/// 0.1 mm in metres), trailing zeros dropped.
fn joint_value(model: &Model, kind: JointKind, si: f64) -> String {
    let units = &model.units;
    let v = units.joint_from_si(kind, si);
    let decimals = match (kind, units.angle, units.length) {
        (JointKind::Revolute, AngleUnit::Degree, _) => 1,
        (JointKind::Revolute, AngleUnit::Radian, _) => 3,
        (JointKind::Prismatic, _, LengthUnit::Millimetre) => 1,
        (JointKind::Prismatic, _, LengthUnit::Metre) => 4,
    };
    let s = format!("{v:.decimals$}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    let s = if s == "-0" { "0" } else { s };
    match kind {
        JointKind::Revolute => format!("{s}{}", units.angle.display_symbol()),
        JointKind::Prismatic => format!("{s} {}", units.length.symbol()),
    }
}

fn caption(lines: &[CaptionLine], corner: [f64; 2], panel: usize) -> Group {
    let mut group = Group::new()
        .set("class", "caption")
        .set("data-panel", panel.to_string());
    for (k, line) in lines.iter().enumerate() {
        let y = corner[1] + 12.0 + k as f64 * super::layout::CAPTION_LINE;
        let t =
            text([corner[0] + 2.0, y], &line.text, style::NORMAL, "start").set("fill", style::TEXT);
        group = group.add(if line.bold {
            t.set("font-weight", "bold")
        } else {
            t
        });
    }
    group
}
