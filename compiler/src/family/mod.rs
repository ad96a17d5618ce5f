//! The geometry families and their registry.
//!
//! A family is one folder here. It owns everything armforge knows about one shape of arm:
//! its recognition and evidence ([`FamilyModule::recognise`]), its plan
//! ([`FamilyModule::build_plan`]), the items `inspect` reports ([`FamilyModule::evidence`]),
//! the conditions the review sheet lists ([`FamilyModule::conditions`]), the hints `verify`
//! samples and judges by ([`FamilyModule::verify_hints`]) and its branch-label rule (in its
//! plan). Classification, planning, the review sheet and `verify` iterate over [`REGISTRY`];
//! what the workbench needs from a family is data (numbers with their kind), never code, so
//! this crate stays free of the workbench's dependencies.
//!
//! Adding a family: a folder, a variant of [`Family`] and of
//! [`crate::classify::ArmEvidence`], and one line in [`REGISTRY`].

// A rejection is made once per classification; keeping it unboxed keeps the pinned
// `Result<Geometry, Rejection>` (as in `classify`).
#![allow(clippy::result_large_err)]

pub mod base_parallel;
pub mod base_slide;
pub mod base_wrist;
pub mod carriage;
pub mod cartesian;
pub mod cylindrical;
pub mod data;
pub mod decoupled_steps;
pub mod elbow;
pub mod general;
pub mod mid_wrist;
pub mod middle_slide;
pub mod mirror;
pub mod offset_hand;
pub mod polar;
pub mod three_parallel;
pub mod tool_first;

pub use data::{Distance, Judged, Part, Role, SamplerBoundary, Step, Steps, Value, VerifyHints};

use armforge_runtime::internal::BranchRule;
use armforge_runtime::plan::CandidateLayout;
use armforge_runtime::Joint;

use crate::classify::context::Context;
use crate::classify::{ArmEvidence, Geometry, Reach, Rejection, Singularity, WristEvidence};
use crate::model::Model;
use crate::plan::arm::Arm;
use crate::plan::graph::Graph;
use crate::plan::{Plan, Target};

/// The family of an arm: the shape armforge solves it by. The names are armforge's own.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case"))]
pub enum Family {
    /// R R R with axis 2 ∥ axis 3 and axis 1 ∦ axis 2, spherical wrist.
    Elbow,
    /// R R P with the slide ⟂ axis 2 and axis 1 ∦ axis 2, spherical wrist.
    Polar,
    /// R P P with the slides not parallel and not both ⟂ axis 1, spherical wrist.
    Cylindrical,
    /// P P P with independent slides, spherical wrist.
    Cartesian,
    /// R R R of no named family (axis 2 ∦ axis 3), spherical wrist: a quartic.
    General,
    /// Six revolute joints, axes 2–4 parallel, axes 5 and 6 meeting.
    ThreeParallel,
    /// Six revolute joints, axes 2–4 parallel, axes 5 and 6 passing apart (an offset hand).
    OffsetHand,
    /// Axes 1–3 meet (a wrist at the base), joints 6, 5, 4 read from the tool of a family
    /// above.
    BaseWrist,
    /// Six revolute joints, axes 2–4 meeting in a point (a wrist in the middle).
    MidWrist,
    /// Six revolute joints, axes 1–3 parallel (joints 4–6 by the plane–line quartic).
    BaseParallel,
    /// R P R (joint 2 a slide), spherical wrist: a quartic in joint 3, or a quadratic in the
    /// slide when it is ⟂ axis 1.
    MiddleSlide,
    /// Read from the tool: the mirrored arm is of a family that solves any target (axes 3–5
    /// parallel and axes 1 and 2 meeting: a three-parallel mirror).
    ToolFirst,
    /// P P R (two slides, then a turn whose axis is not ⟂ both), spherical wrist.
    Carriage,
    /// R R P of no named family (the slide not ⟂ axis 2), spherical wrist: the general
    /// family's reduction with joint 3 a slide, a quartic in the slide's value.
    GeneralSlide,
    /// P R R with axes 2 and 3 skew, spherical wrist: a quartic in the slide.
    BaseSlide,
}

impl Family {
    /// The family's module in the registry.
    pub fn module(self) -> &'static dyn FamilyModule {
        REGISTRY
            .iter()
            .copied()
            .find(|m| m.family() == self)
            .unwrap_or(REGISTRY[0])
    }

    /// The family's name as armforge writes it.
    pub fn name(self) -> &'static str {
        self.module().name()
    }

    /// The kinds of the joints the family's position step solves.
    pub fn pattern(self) -> &'static str {
        self.module().pattern()
    }

    /// The most solutions the position step has for one target (distinct modulo full turns).
    pub fn position_solutions(self) -> u32 {
        self.module().position_solutions()
    }
}

/// Every family, in the order classification tries them: the first that recognises an arm
/// solves it; when none does, the first rejection in this order is the reason given.
pub static REGISTRY: &[&dyn FamilyModule] = &[
    &elbow::ELBOW,
    &polar::POLAR,
    &cylindrical::CYLINDRICAL,
    &cartesian::CARTESIAN,
    &general::GENERAL,
    &three_parallel::THREE_PARALLEL,
    &offset_hand::OFFSET_HAND,
    &base_wrist::BASE_WRIST,
    &mid_wrist::MID_WRIST,
    &base_parallel::BASE_PARALLEL,
    &general::slide::GENERAL_SLIDE,
    &base_slide::BASE_SLIDE,
    &middle_slide::MIDDLE_SLIDE,
    &tool_first::TOOL_FIRST,
    &carriage::CARRIAGE,
];

/// What a family found on an arm it recognises.
#[derive(Clone, Debug)]
pub struct Found {
    /// The point its position step places, base frame at zero, metres (the wrist center).
    pub center: [f64; 3],
    /// The spherical wrist, when the arm has one.
    pub wrist: Option<WristEvidence>,
    /// The family's evidence.
    pub arm: ArmEvidence,
    /// The reach of the placed point, when it has a natural origin.
    pub reach: Option<Reach>,
    /// Every singular configuration, the wrist's first.
    pub singularities: Vec<Singularity>,
    /// Solutions of the position step and, for each, of the orientation step.
    pub solutions: [u32; 2],
}

/// A family's verdict on an arm.
#[derive(Clone, Debug)]
#[allow(clippy::large_enum_variant)]
pub enum Recognition {
    /// The arm is of this family.
    Mine(Found),
    /// Not this family; with the reason when the arm nearly has the family's shape (a
    /// spherical family's wrist is not spherical, say), reported when no family recognises the
    /// arm and none finds it degenerate.
    NotMine(Option<Rejection>),
    /// The arm has the family's shape but fails one of its conditions: the reason, which
    /// takes precedence over every `NotMine` reason.
    Degenerate(Rejection),
}

/// What a family's [`TargetStep`] built on a graph: everything [`crate::plan::assemble`] needs
/// besides the graph.
#[derive(Clone, Debug)]
pub struct TargetSolution {
    /// The planner's arm the candidates were solved on (its numbering, its placed point).
    pub arm: Arm,
    /// One candidate per branch, model values in the arm's joint order.
    pub candidates: Vec<CandidateLayout>,
    /// The label rule `branch_of` applies to the arm's joint values.
    pub rule: BranchRule,
    /// The twist cosines of the orientation step (`Settings::wrist_twist_cosines`).
    pub twist: [f64; 2],
    /// The joints (0-based) held at the reference inputs when free ([`Plan::free_joints`]).
    pub free: [usize; 2],
}

/// The whole solve of a family, for any target: given the model, its classification by the
/// family and a [`Target`] declared on the graph (the plan's inputs, or an expression of them,
/// such as the inverse pose a mirrored arm is solved for), it adds the family's steps to the
/// graph and returns the candidates with their label rule. The reference inputs of the target
/// are the values of [`TargetSolution::free`]. A family whose arm is not decoupled at a
/// spherical wrist offers it ([`FamilyModule::target_step`]), so that other families can solve
/// the arm seen from its tool by it (the mirrored arm: joint `i` is joint `7 − i` about the
/// reversed axis).
pub type TargetStep = fn(&mut Graph, &Model, &Geometry, &Target) -> TargetSolution;

/// One geometry family: everything armforge knows about one shape of arm.
pub trait FamilyModule: Sync {
    /// The family.
    fn family(&self) -> Family;
    /// Its name as armforge writes it.
    fn name(&self) -> &'static str;
    /// The kinds of the joints its position step solves (`R R R`, …).
    fn pattern(&self) -> &'static str;
    /// The most solutions its position step has for one target.
    fn position_solutions(&self) -> u32;
    /// Recognises the arm of `ctx`, measuring its evidence, or says why not.
    fn recognise(&self, ctx: &Context) -> Recognition;
    /// The plan of a recognised arm.
    fn build_plan(&self, model: &Model, geometry: &Geometry) -> Plan;
    /// The items `inspect` reports for the family's evidence.
    fn evidence(&self, arm: &ArmEvidence) -> Vec<Judged>;
    /// The point the position step places, in words (`wrist center`).
    fn placed_point(&self) -> &'static str {
        "wrist center"
    }
    /// One line on how the arm decouples, for `inspect`.
    fn summary(&self) -> &'static str {
        "wrist: spherical (axes 4, 5, 6 meet in one point)"
    }
    /// What the two factors of the solution count solve (`joints 1–3`, `the wrist`).
    fn solution_parts(&self) -> [&'static str; 2] {
        ["joints 1–3", "the wrist"]
    }
    /// The review sheet's words for the point the labels follow: its symbol once moved, what
    /// that is, and the symbol of the wrist label's normal (`E2 E3 c`, `the wrist center moved
    /// by joints 2 and 3 (joint 1 undone)`, `h4 × h5`).
    fn label_words(&self) -> [&'static str; 3] {
        [
            "E2 E3 c",
            "the wrist center moved by joints 2 and 3 (joint 1 undone)",
            "h4 × h5",
        ]
    }
    /// One sentence on how the arm decouples, for the review sheet.
    fn decoupling(&self) -> &'static str {
        "Wrist: **spherical** (axes 4, 5 and 6 meet in one point, the wrist center)."
    }
    /// What the solve needs, as measured on the plan's arm: one line of parts each.
    fn conditions(&self, plan: &Plan, geometry: &Geometry) -> Vec<Vec<Part>>;
    /// The review sheet's method (§3) and steps (§4) with this arm's numbers, read from the
    /// constants the family's plan is built from.
    fn steps(&self, plan: &Plan) -> Steps;
    /// The review sheet's §7 lines particular to the family (where its solutions merge, what
    /// bounds the placed point), measured on the plan's arm: one line of parts each.
    fn reach_lines(&self, _plan: &Plan, _geometry: &Geometry) -> Vec<Vec<Part>> {
        Vec::new()
    }
    /// The review sheet's §6 equation of one of the family's own singular configurations (in
    /// the plan's terms, with what the solver does there); `None` for the shared ones.
    fn singular_equation(&self, _plan: &Plan, _singularity: &Singularity) -> Option<Vec<Part>> {
        None
    }
    /// The quantity that vanishes when the placed point is on axis 1 (joint 1 free), in the
    /// symbols of the family's §4.
    fn on_axis_1_quantity(&self) -> &'static str {
        "`r² = a² + b² = 0`"
    }
    /// Where `verify` places samples and how it judges them, for the arm's joints (SI).
    fn verify_hints(&self, joints: &[Joint], geometry: &Geometry) -> VerifyHints;
    /// Whether the family's labels are read by solving (the label of the solution nearest a
    /// configuration) rather than by its geometric rule alone: two of its roots can share a
    /// geometric label, and the second then takes a free one.
    fn labels_by_solving(&self) -> bool {
        false
    }
    /// The position step of a family whose joints 1–3 place a spherical wrist's center (the
    /// wrist-at-base family reuses it on the mirrored arm); `None` for the others.
    fn position_step(&self) -> Option<crate::plan::PositionStep> {
        None
    }
    /// The whole solve for an arbitrary target, of a family that is not decoupled at a
    /// spherical wrist (the mirrored families reuse it on the arm seen from its tool); `None`
    /// for the others.
    fn target_step(&self) -> Option<TargetStep> {
        None
    }
}
