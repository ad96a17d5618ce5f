//! Page layout: one scale for every view, view frames inside panels, panels in a grid.

use super::primitives::text_width;
use super::style;
use super::view::ViewKind;

/// Space around the arm inside a view frame, px (room for labels and arrowheads).
const FRAME_PADDING: f64 = 24.0;
/// Height of a view's heading inside its frame, px.
const FRAME_HEADING: f64 = 16.0;
/// Gap between views and between panels, px.
const GAP: f64 = 12.0;
/// Page margin, px.
pub const MARGIN: f64 = 16.0;
/// Height of the page's title block, px.
pub const TITLE_HEIGHT: f64 = 58.0;
/// Height of one caption line above a panel's views, px.
pub const CAPTION_LINE: f64 = 15.0;
/// The narrowest page, px (room for the footer).
const MIN_PAGE_WIDTH: f64 = 760.0;
/// A view's extent never drops below this share of the largest extent (a top view of an arm
/// standing straight up would otherwise be a sliver).
const MIN_EXTENT_SHARE: f64 = 0.3;

/// An axis-aligned rectangle in a view's plane, metres.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Bounds {
    /// Lower-left corner.
    pub min: [f64; 2],
    /// Upper-right corner.
    pub max: [f64; 2],
}

impl Bounds {
    /// The smallest rectangle holding every point (`None` for no points).
    pub fn of(points: impl IntoIterator<Item = [f64; 2]>) -> Option<Bounds> {
        let mut points = points.into_iter();
        let first = points.next()?;
        let mut b = Bounds {
            min: first,
            max: first,
        };
        for p in points {
            b.min = [b.min[0].min(p[0]), b.min[1].min(p[1])];
            b.max = [b.max[0].max(p[0]), b.max[1].max(p[1])];
        }
        Some(b)
    }

    /// Width and height.
    pub fn size(&self) -> [f64; 2] {
        [self.max[0] - self.min[0], self.max[1] - self.min[1]]
    }

    /// The rectangle grown about its centre to at least `extent` in each direction.
    fn at_least(&self, extent: f64) -> Bounds {
        let mut b = *self;
        for k in 0..2 {
            let missing = extent - (b.max[k] - b.min[k]);
            if missing > 0.0 {
                b.min[k] -= missing / 2.0;
                b.max[k] += missing / 2.0;
            }
        }
        b
    }
}

/// How the views of one panel are arranged.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Arrangement {
    /// Side by side.
    Row,
    /// One above the other.
    Column,
}

/// One view of one panel, placed on the page.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ViewFrame {
    /// Which projection.
    pub kind: ViewKind,
    /// Index of the panel the view belongs to.
    pub panel: usize,
    /// Left edge, px.
    pub left: f64,
    /// Top edge, px.
    pub top: f64,
    /// Width, px.
    pub width: f64,
    /// Height, px.
    pub height: f64,
    /// Where the world origin lands, px.
    pub origin: [f64; 2],
    /// Pixels per metre.
    pub scale: f64,
}

impl ViewFrame {
    /// A world point on the page, px (y grows downwards, as in SVG).
    pub fn page_point(&self, world: &[f64; 3]) -> [f64; 2] {
        let [u, v] = self.kind.project(world);
        [
            self.origin[0] + self.scale * u,
            self.origin[1] - self.scale * v,
        ]
    }

    /// A world direction on the page (unit-free: px per metre times the projected direction).
    pub fn direction_on_page(&self, direction: &[f64; 3]) -> [f64; 2] {
        let [u, v] = self.kind.project(direction);
        [u, -v]
    }

    /// The part of the view plane inside the frame, metres.
    pub fn world_window(&self) -> Bounds {
        Bounds {
            min: [
                (self.left - self.origin[0]) / self.scale,
                (self.origin[1] - (self.top + self.height)) / self.scale,
            ],
            max: [
                (self.left + self.width - self.origin[0]) / self.scale,
                (self.origin[1] - (self.top + FRAME_HEADING)) / self.scale,
            ],
        }
    }

    /// Where the view's heading is written, px.
    pub fn heading_anchor(&self) -> [f64; 2] {
        [self.left + 6.0, self.top + 12.0]
    }
}

/// The whole page: its size, every view frame, where panel captions and the footer go.
#[derive(Clone, Debug, PartialEq)]
pub struct PageLayout {
    /// Page width, px.
    pub width: f64,
    /// Page height, px.
    pub height: f64,
    /// Pixels per metre, the same in every view.
    pub scale: f64,
    /// Every view of every panel.
    pub frames: Vec<ViewFrame>,
    /// The top-left corner of each panel's caption, px.
    pub captions: Vec<[f64; 2]>,
    /// The top of the footer, px.
    pub footer_top: f64,
    /// The width of one panel, px.
    pub panel_width: f64,
}

/// What the layout needs to know.
#[derive(Clone, Debug)]
pub struct LayoutRequest<'a> {
    /// The views of each panel, in order.
    pub views: &'a [ViewKind],
    /// How a panel's views are arranged.
    pub arrangement: Arrangement,
    /// Number of panels.
    pub panels: usize,
    /// Panels per row.
    pub columns: usize,
    /// Caption lines above each panel's views.
    pub caption_lines: usize,
    /// The largest view extent is drawn this many px long.
    pub largest_extent_px: f64,
    /// Height of the footer, px.
    pub footer_height: f64,
    /// The extent of the drawing in each view (same order as `views`), metres.
    pub bounds: &'a [Bounds],
}

/// The narrowest frame that holds the view's heading, px.
fn heading_width(kind: ViewKind) -> f64 {
    text_width(kind.heading(), style::SMALL) + 14.0
}

/// Places every view of every panel with one common scale.
pub fn lay_out(request: &LayoutRequest) -> PageLayout {
    let largest = request
        .bounds
        .iter()
        .flat_map(|b| b.size())
        .fold(1e-6, f64::max);
    let scale = request.largest_extent_px / largest;
    let bounds: Vec<Bounds> = request
        .bounds
        .iter()
        .map(|b| b.at_least(MIN_EXTENT_SHARE * largest))
        .collect();
    let sizes: Vec<[f64; 2]> = bounds
        .iter()
        .zip(request.views)
        .map(|(b, kind)| {
            let [w, h] = b.size();
            [
                (w * scale + 2.0 * FRAME_PADDING).max(heading_width(*kind)),
                h * scale + 2.0 * FRAME_PADDING + FRAME_HEADING,
            ]
        })
        .collect();
    let caption_height = request.caption_lines as f64 * CAPTION_LINE + 4.0;
    let (views_width, views_height) = match request.arrangement {
        Arrangement::Row => (
            sizes.iter().map(|s| s[0]).sum::<f64>() + GAP * (sizes.len().max(1) - 1) as f64,
            sizes.iter().map(|s| s[1]).fold(0.0, f64::max),
        ),
        Arrangement::Column => (
            sizes.iter().map(|s| s[0]).fold(0.0, f64::max),
            sizes.iter().map(|s| s[1]).sum::<f64>() + GAP * (sizes.len().max(1) - 1) as f64,
        ),
    };
    let panel_size = [views_width, caption_height + views_height];
    let columns = request.columns.clamp(1, request.panels.max(1));
    let rows = request.panels.div_ceil(columns).max(1);
    let grid_width = columns as f64 * panel_size[0] + (columns - 1) as f64 * GAP;
    let width = (grid_width + 2.0 * MARGIN).max(MIN_PAGE_WIDTH);
    let mut frames = Vec::with_capacity(request.panels * sizes.len());
    let mut captions = Vec::with_capacity(request.panels);
    for panel in 0..request.panels {
        let left = MARGIN + (panel % columns) as f64 * (panel_size[0] + GAP);
        let top = TITLE_HEIGHT + (panel / columns) as f64 * (panel_size[1] + GAP);
        captions.push([left, top]);
        let mut cursor = [left, top + caption_height];
        for ((kind, b), size) in request.views.iter().zip(&bounds).zip(&sizes) {
            frames.push(ViewFrame {
                kind: *kind,
                panel,
                left: cursor[0],
                top: cursor[1],
                width: size[0],
                height: size[1],
                origin: [
                    cursor[0] + (size[0] - b.size()[0] * scale) / 2.0 - b.min[0] * scale,
                    cursor[1] + FRAME_HEADING + FRAME_PADDING + b.max[1] * scale,
                ],
                scale,
            });
            match request.arrangement {
                Arrangement::Row => cursor[0] += size[0] + GAP,
                Arrangement::Column => cursor[1] += size[1] + GAP,
            }
        }
    }
    let footer_top = TITLE_HEIGHT + rows as f64 * (panel_size[1] + GAP);
    PageLayout {
        width,
        height: footer_top + request.footer_height + MARGIN,
        scale,
        frames,
        captions,
        footer_top,
        panel_width: panel_size[0],
    }
}
