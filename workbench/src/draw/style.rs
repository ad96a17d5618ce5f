//! Colours, line widths and type sizes of a drawing: light, with the arm dark on a pale ground.

/// The font stack for every text.
pub const FONT: &str = "DejaVu Sans, Helvetica, Arial, sans-serif";
/// Ordinary text.
pub const TEXT: &str = "#222222";
/// Secondary text (headings of views, notes).
pub const MUTED: &str = "#6a6a6a";
/// The links between joints.
pub const LINK: &str = "#6e6e6e";
/// Outline and number of a joint.
pub const JOINT: &str = "#27313d";
/// A joint's positive axis.
pub const AXIS: &str = "#7b3fb5";
/// A prismatic joint's rail.
pub const RAIL: &str = "#c9b7df";
/// The wrist center.
pub const WRIST: &str = "#e07b00";
/// The x, y and z axes of a frame.
pub const XYZ: [&str; 3] = ["#d62728", "#2a9d2a", "#1f5fd6"];
/// Fine grid lines.
pub const GRID: &str = "#ececec";
/// The world axes through the origin.
pub const WORLD_AXES: &str = "#cfcfcf";
/// The mount plate.
pub const MOUNT_FILL: &str = "#e4e4e4";
/// The mount plate's outline and hatching.
pub const MOUNT_STROKE: &str = "#9a9a9a";
/// A view's background.
pub const FRAME_FILL: &str = "#fcfcfd";
/// A view's border.
pub const FRAME_STROKE: &str = "#d6d6d6";

/// Width of the links, px.
pub const LINK_WIDTH: f64 = 5.0;
/// Radius of a revolute joint's circle (half the side of a prismatic joint's square), px.
pub const JOINT_RADIUS: f64 = 6.5;
/// Half the diagonal of the wrist center's diamond, px.
pub const WRIST_RADIUS: f64 = 5.5;
/// Size of small text (labels in views), px.
pub const SMALL: f64 = 10.0;
/// Size of ordinary text, px.
pub const NORMAL: f64 = 11.5;
/// Size of the title, px.
pub const TITLE: f64 = 18.0;
/// Below this share of its length, a projected axis is drawn end-on (⊙ or ⊗).
pub const END_ON_SHARE: f64 = 0.3;
