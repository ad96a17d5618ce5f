//! The views of a drawing: orthographic projections of the world frame onto a coordinate plane.

use armforge_runtime::math::{cross, dot};

/// An orthographic view of the world frame.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum ViewKind {
    /// The x–z plane seen from −y: x to the right, z up.
    Side,
    /// The x–y plane seen from +z (from above): x to the right, y up.
    Top,
    /// The y–z plane seen from +x: y to the right, z up.
    End,
}

impl ViewKind {
    /// The world direction drawn to the right.
    pub fn right(self) -> [f64; 3] {
        match self {
            ViewKind::Side | ViewKind::Top => [1.0, 0.0, 0.0],
            ViewKind::End => [0.0, 1.0, 0.0],
        }
    }

    /// The world direction drawn upwards.
    pub fn up(self) -> [f64; 3] {
        match self {
            ViewKind::Side | ViewKind::End => [0.0, 0.0, 1.0],
            ViewKind::Top => [0.0, 1.0, 0.0],
        }
    }

    /// The world direction pointing out of the page, towards the viewer (`right × up`).
    pub fn toward_viewer(self) -> [f64; 3] {
        cross(&self.right(), &self.up())
    }

    /// The view's name in the SVG (`data-view`).
    pub fn name(self) -> &'static str {
        match self {
            ViewKind::Side => "side",
            ViewKind::Top => "top",
            ViewKind::End => "end",
        }
    }

    /// The heading printed above the view.
    pub fn heading(self) -> &'static str {
        match self {
            ViewKind::Side => "side: x → right, z ↑ (seen from −y)",
            ViewKind::Top => "top: x → right, y ↑ (seen from +z)",
            ViewKind::End => "end: y → right, z ↑ (seen from +x)",
        }
    }

    /// The world point projected onto the view plane, `[right, up]` in metres.
    pub fn project(self, p: &[f64; 3]) -> [f64; 2] {
        [dot(&self.right(), p), dot(&self.up(), p)]
    }

    /// How far the point lies towards the viewer, metres.
    pub fn depth(self, p: &[f64; 3]) -> f64 {
        dot(&self.toward_viewer(), p)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn views_are_right_handed_and_seen_from_the_stated_side() {
        assert_eq!(ViewKind::Side.toward_viewer(), [0.0, -1.0, 0.0]);
        assert_eq!(ViewKind::Top.toward_viewer(), [0.0, 0.0, 1.0]);
        assert_eq!(ViewKind::End.toward_viewer(), [1.0, 0.0, 0.0]);
    }
}
