//! What a family hands to the workbench: numbers with their kind (the workbench renders them in
//! the file's units), sampler and judge hints as plain data.

/// A measured value, SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Value {
    /// Yes or no.
    Flag(bool),
    /// Metres.
    Length(f64),
    /// Radians.
    Angle(f64),
    /// A unit direction.
    Direction([f64; 3]),
    /// A point, metres.
    Point([f64; 3]),
    /// A plain number.
    Number(f64),
}

/// One evidence item of `inspect`: a key for JSON, a label for people and the value.
#[derive(Clone, Debug, PartialEq)]
pub struct Judged {
    /// JSON key.
    pub key: &'static str,
    /// What it is, for people.
    pub label: String,
    /// The value.
    pub value: Value,
}

impl Judged {
    /// An item.
    pub fn new(key: &'static str, label: impl Into<String>, value: Value) -> Judged {
        Judged {
            key,
            label: label.into(),
            value,
        }
    }
}

/// A piece of a line of text: words, or a number the workbench shows in the file's units.
#[derive(Clone, Debug, PartialEq)]
pub enum Part {
    /// Words as they are.
    Text(String),
    /// A value.
    Value(Value),
    /// An area (a squared length), square metres.
    Area(f64),
    /// A rotation matrix, its rows.
    Rows([[f64; 3]; 3]),
}

impl Part {
    /// Words.
    pub fn text(s: impl Into<String>) -> Part {
        Part::Text(s.into())
    }
    /// A length, metres.
    pub fn length(x: f64) -> Part {
        Part::Value(Value::Length(x))
    }
    /// An angle, radians.
    pub fn angle(x: f64) -> Part {
        Part::Value(Value::Angle(x))
    }
    /// A plain number.
    pub fn number(x: f64) -> Part {
        Part::Value(Value::Number(x))
    }
    /// A unit direction.
    pub fn direction(v: [f64; 3]) -> Part {
        Part::Value(Value::Direction(v))
    }
    /// A point, metres.
    pub fn point(v: [f64; 3]) -> Part {
        Part::Value(Value::Point(v))
    }
}

/// The distance of a point, carried by some joints, from a joint's axis line at zero.
#[derive(Clone, Debug, PartialEq)]
pub struct Distance {
    /// The point, base frame with every joint at zero, metres.
    pub point: [f64; 3],
    /// The joints (0-based) that move it, applied in this order (the one nearest the point
    /// first); `true` applies the joint's motion undone (a mirrored arm's joint).
    pub moved_by: Vec<(usize, bool)>,
    /// The joint (0-based) whose axis line at zero it is measured from.
    pub axis: usize,
}

/// A reach boundary or singular distance the sampler places samples near.
#[derive(Clone, Debug, PartialEq)]
pub struct SamplerBoundary {
    /// What is measured.
    pub distance: Distance,
    /// The joint (0-based) the sampler moves to place it (one of `distance.moved_by`, or
    /// another joint the distance depends on).
    pub joint: usize,
    /// The boundary value, metres.
    pub at: f64,
    /// `+1` to place samples above it, `−1` below.
    pub side: f64,
}

/// What conditions a joint's value, for `verify`'s judge.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Role {
    /// Conditioned by the first (0) or second (1) tracked axis distance.
    Axis(usize),
    /// Set where two solutions merge at a reach boundary (the bend).
    Bend,
    /// The middle joint of the wrist.
    WristMiddle,
    /// A joint that splits a rotation with another when the wrist lines up.
    WristSplit,
    /// Conditioned by a tracked axis distance (0 or 1), and also split when the wrist lines
    /// up (a joint of a planar chain that a lined-up joint joins).
    AxisAndSplit(usize),
    /// Set at a reach boundary, and also split when the wrist lines up.
    BendAndSplit,
}

/// How `verify` samples and judges an arm of a family.
#[derive(Clone, Debug, PartialEq)]
pub struct VerifyHints {
    /// The joint (0-based) whose value lines the wrist up.
    pub aligned_joint: usize,
    /// Its model values at which the wrist lines up (radians).
    pub aligned_at: Vec<f64>,
    /// The two axis distances that condition the position step (`None` when the joint slides).
    pub axes: [Option<Distance>; 2],
    /// Where a position joint is free (the placed point on its axis), if anywhere.
    pub on_axis: Option<SamplerBoundary>,
    /// Reach boundaries where two solutions merge.
    pub boundaries: Vec<SamplerBoundary>,
    /// What conditions each joint.
    pub roles: [Role; 6],
}

/// One step of the review sheet's §4: what it does, its equations in symbols, then the
/// numbers of this arm.
#[derive(Clone, Debug, PartialEq)]
pub struct Step {
    /// The heading.
    pub title: String,
    /// What the step does and why (Markdown).
    pub text: String,
    /// The equations in symbols.
    pub equations: Vec<String>,
    /// What follows the equations, before this arm's numbers (Markdown; empty for nothing).
    pub after: String,
    /// This arm's numbers, one line each (none: the step has no numbers of its own).
    pub numbers: Vec<Vec<Part>>,
}

/// The inputs and symbols of §4 for a family with no particular ones (followed by the
/// length unit).
pub const INPUTS: &str = "Inputs: the target pose `T` (world frame) and two reference angles \
    (the current values of the joints `solve_near` holds where they are free, zero otherwise). \
    Symbols: `h_i` axis of joint i, `p_i` its point nearest the base origin, `θ_i` its model \
    value (§1), `E_i(θ)` the motion of joint i, `R_i` its rotation, `x⊥h` the part of `x` \
    perpendicular to `h`.";

/// Words in a line of numbers (short for [`Part::text`]).
pub(crate) fn t(s: &str) -> Part {
    Part::text(s)
}

/// The line `h{joint} = …,  p{joint} = …` of one joint's axis and point.
pub(crate) fn axis_line(joint: usize, h: [f64; 3], p: [f64; 3]) -> Vec<Part> {
    vec![
        t(&format!("h{joint} = ")),
        Part::direction(h),
        t(&format!(",  p{joint} = ")),
        Part::point(p),
    ]
}

/// A family's §3 (method, one bullet each) and §4 (the steps).
#[derive(Clone, Debug, PartialEq)]
pub struct Steps {
    /// §4's opening paragraph: the inputs and the symbols (Markdown, [`INPUTS`] unless the
    /// family has more).
    pub inputs: String,
    /// The method's bullets (Markdown).
    pub method: Vec<String>,
    /// The steps, in order.
    pub steps: Vec<Step>,
}
