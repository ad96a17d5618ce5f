//! Classification of a model's geometry: the spherical wrist, the family of joints 1–3 and
//! the evidence for both; or a precise rejection.
//!
//! (Skeleton: the classifier fills this in. The solver relies only on `Geometry::family` and
//! `Geometry::wrist_center`.)

/// The family of the first three joints. The names are armforge's own.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum Family {
    /// R R R with axis 2 ∥ axis 3 and axis 1 ∦ axis 2.
    Elbow,
    /// R R P with the slide ⟂ axis 2.
    Polar,
    /// R P P.
    Cylindrical,
    /// P P P.
    Cartesian,
}

/// What the classifier found: the family and the wrist center.
#[derive(Clone, Debug, PartialEq)]
pub struct Geometry {
    /// The family of joints 1–3.
    pub family: Family,
    /// The wrist center in the base frame with every model value at zero, metres.
    pub wrist_center: [f64; 3],
}
