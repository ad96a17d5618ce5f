//! The solve plan: a short, fixed sequence of closed-form steps with one arm's constants.
//!
//! From the classified geometry, [`build_plan`] writes the steps as an expression graph
//! ([`graph::Graph`]): the wrist-center target from the pose (kinematic decoupling, Pieper
//! 1968), joints 1–3 of the family with every branch, joints 4–6 of the wrist with both
//! branches. Constants are folded and shared terms computed once while building, so the plan
//! shows this arm's own equations. No step iterates; the operation count is fixed.
//!
//! The same plan feeds two back ends: the interpreter in `armforge_runtime::plan` (through
//! [`crate::solver::Solver`]) and the emitter ([`crate::emit`]).

pub mod arm;
pub mod decouple;
pub mod graph;
pub mod planar;
pub mod plane_line;
pub mod pose;
pub mod quartic;
pub mod render;
pub mod route;
pub mod samples;
pub mod subproblems;
pub mod vec3;
pub mod wrist;

use armforge_runtime::internal::{BranchRule, ElbowRule, Settings, ShoulderRule, WristRule};
use armforge_runtime::plan::{CandidateLayout, CheckLayout, Op};
use armforge_runtime::{Branch, Elbow, Shoulder};

pub use crate::family::base_wrist::plan as mirror;
pub use crate::family::cartesian::plan as cartesian;
pub use crate::family::cylindrical::plan as cylindrical;
pub use crate::family::elbow::plan as elbow;
pub use crate::family::polar::plan as polar;
pub use arm::Arm;
pub use decouple::Target;
use graph::{Graph, Id};

use crate::classify::Geometry;
use crate::model::Model;

/// A rotation that joints 1–3 apply, undone (in order) to find the wrist's rotation.
#[derive(Clone, Copy, Debug)]
pub struct Turn {
    /// Constant unit axis.
    pub axis: [f64; 3],
    /// Cosine of the angle.
    pub cos: Id,
    /// Sine of the angle.
    pub sin: Id,
}

impl Turn {
    /// The turn about the constant unit `axis` whose cosine and sine are `(cos, sin)`.
    pub fn about(axis: [f64; 3], (cos, sin): (Id, Id)) -> Turn {
        Turn { axis, cos, sin }
    }
}

/// One branch of joints 1–3.
#[derive(Clone, Debug)]
pub struct ArmSolution {
    /// Model values of joints 1–3.
    pub angles: [Id; 3],
    /// `R1 R2 R3` as rotations, applied base first; undone in this order.
    pub undo: Vec<Turn>,
    /// Shoulder label.
    pub shoulder: Shoulder,
    /// Elbow label.
    pub elbow: Elbow,
    /// Conditions for the branch to be real.
    pub checks: Vec<CheckLayout>,
    /// `≥ 0` when the wrist center is on axis 1.
    pub on_axis_1: Option<Id>,
}

/// A finished plan: the graph, the candidates it produces, and the arm data both back ends
/// need to finish the job (limits, labels, tolerances).
#[derive(Clone, Debug)]
pub struct Plan {
    /// The planner's view of the arm.
    pub arm: Arm,
    /// The steps, in evaluation order (only what the candidates need).
    pub graph: Graph,
    /// The candidate solutions (one per branch).
    pub candidates: Vec<CandidateLayout>,
    /// How labels are read back from joint values.
    pub rule: BranchRule,
    /// Tolerances.
    pub settings: Settings,
    /// Capacity a solution set needs: one solution per branch, whatever the joint ranges
    /// (equivalent angles are listed by `Solution::equivalents`, not stored).
    pub capacity: usize,
    /// The reference inputs of `solve` (cos, sin of the model values of joints 1 and 4): joint 4
    /// at zero, joint 1 at [`free_joint_1_value`].
    pub zero_reference: [f64; 4],
    /// The joints (0-based) whose reference values are the plan's reference inputs: the one
    /// held when the position step leaves it free (joint 1 of a decoupled arm) and the one held
    /// when the orientation step does (joint 4 of a spherical wrist).
    pub free_joints: [usize; 2],
    /// Labels are read by solving: `branch_of(q)` is the label of the solution at
    /// `forward(q)` nearest `q` (the general family, whose labels of two roots can coincide
    /// and then take a free slot); otherwise, and as the fallback, by [`Plan::rule`].
    pub labels_by_solving: bool,
}

/// `+1` for non-negative, `−1` for negative.
pub(crate) fn sign(x: f64) -> f64 {
    if x >= 0.0 {
        1.0
    } else {
        -1.0
    }
}

/// Counts of the costly operations in one evaluation of a plan.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct OpCounts {
    /// Square roots.
    pub sqrt: usize,
    /// Arc tangents.
    pub atan2: usize,
    /// Cube roots (Ferrari's resolvent cubic).
    pub cbrt: usize,
    /// Cosines (the trigonometric form of the resolvent cubic's roots).
    pub cos: usize,
    /// Divisions.
    pub div: usize,
    /// Multiplications.
    pub mul: usize,
    /// Additions, subtractions and negations.
    pub add: usize,
    /// Selects, minima, maxima, absolute values.
    pub select: usize,
}

impl Plan {
    /// The operations for the interpreter.
    pub fn ops(&self) -> Vec<Op> {
        self.graph.nodes().iter().map(|n| n.op).collect()
    }

    /// Counts the operations of one evaluation.
    pub fn op_counts(&self) -> OpCounts {
        count_ops(self.graph.nodes().iter())
    }

    /// Counts the operations one branch alone needs (what the emitted `solve_branch` runs),
    /// the most over the branches.
    pub fn branch_op_counts(&self) -> OpCounts {
        let nodes = self.graph.nodes();
        let mut most = OpCounts::default();
        for c in &self.candidates {
            let roots = candidate_roots(c);
            let live = self.graph.needed(&roots);
            let n = count_ops(nodes.iter().zip(&live).filter(|(_, &l)| l).map(|(n, _)| n));
            if (n.atan2, n.sqrt) > (most.atan2, most.sqrt) {
                most = n;
            }
        }
        most
    }
}

impl OpCounts {
    /// The rarer transcendental operations, for cost lines: empty when there are none,
    /// otherwise `", 1 cbrt, 1 cos"` (only what the plan has).
    pub fn rare(&self) -> String {
        let mut out = String::new();
        if self.cbrt > 0 {
            out += &format!(", {} cbrt", self.cbrt);
        }
        if self.cos > 0 {
            out += &format!(", {} cos", self.cos);
        }
        out
    }
}

/// Counts the operations of some nodes.
fn count_ops<'a>(nodes: impl Iterator<Item = &'a graph::Node>) -> OpCounts {
    let mut c = OpCounts::default();
    for n in nodes {
        match n.op {
            Op::Sqrt(_) => c.sqrt += 1,
            Op::Atan2(..) => c.atan2 += 1,
            Op::Cbrt(_) => c.cbrt += 1,
            Op::Cos(_) => c.cos += 1,
            Op::Div(..) => c.div += 1,
            Op::Mul(..) => c.mul += 1,
            Op::Add(..) | Op::Sub(..) | Op::Neg(_) => c.add += 1,
            Op::Select(..) | Op::Min(..) | Op::Max(..) | Op::Abs(_) => c.select += 1,
            Op::Input(_) | Op::Const(_) => {}
        }
    }
    c
}

/// Builds the plan of a classified arm (by its family's module, [`crate::family`]).
pub fn build_plan(model: &Model, geometry: &Geometry) -> Plan {
    geometry.family.module().build_plan(model, geometry)
}

/// What a position step found: a branch per solution and the label rules of joints 1–3.
pub struct Position {
    /// One branch of joints 1–3 per solution.
    pub solutions: Vec<ArmSolution>,
    /// How the shoulder label is read back.
    pub shoulder: ShoulderRule,
    /// How the elbow label is read back.
    pub elbow: ElbowRule,
}

/// The position step of a family whose joints 1–3 place a spherical wrist's center: the
/// branches of joints 1–3 for the wrist-center target `ct` of the target `target`.
pub type PositionStep = fn(&mut Graph, &Arm, &Target, vec3::V3) -> Position;

/// The plan of an arm that decouples at a spherical wrist, with `step` for joints 1–3.
pub fn decoupled_plan(model: &Model, geometry: &Geometry, step: PositionStep) -> Plan {
    let arm = Arm::new(model, geometry);
    let mut g = Graph::new();
    let target = decouple::target(&mut g);
    let (candidates, rule) = decoupled(&mut g, &arm, &target, step);
    let w = wrist::WristAxes::of(&arm);
    let twist = [vec3::num::dot(&w.h4, &w.h5), vec3::num::dot(&w.h5, &w.h6)];
    assemble(arm, &g, &candidates, rule, twist, [0, 3])
}

/// The candidates of an arm that decouples at a spherical wrist (joints 1–3 by `step`, then
/// the wrist), for the target `target`, and its label rules.
pub fn decoupled(
    g: &mut Graph,
    arm: &Arm,
    target: &Target,
    step: PositionStep,
) -> (Vec<CandidateLayout>, BranchRule) {
    let ct = decouple::wrist_center_target(g, arm, target);
    let Position {
        solutions: arm_solutions,
        shoulder: shoulder_rule,
        elbow: elbow_rule,
    } = step(g, arm, target, ct);
    let axes = wrist::WristAxes::of(arm);
    let g6 = decouple::target_direction(g, arm, target, axes.h6, "g6");
    let gx = decouple::target_direction(g, arm, target, axes.x6, "gx");
    let mut candidates = Vec::new();
    for (i, s) in arm_solutions.iter().enumerate() {
        let tag = format!("b{}", i + 1);
        let mut v = g6;
        let mut xv = gx;
        for turn in &s.undo {
            v = vec3::rotate_back(g, turn.axis, turn.cos, turn.sin, v);
            xv = vec3::rotate_back(g, turn.axis, turn.cos, turn.sin, xv);
        }
        let v = vec3::name(
            g,
            v,
            &format!("v_{tag}"),
            "v = R456 h6 = (R1 R2 R3)ᵀ rot(G) h6",
        );
        let xv = vec3::name(
            g,
            xv,
            &format!("xv_{tag}"),
            "R456 x6 = (R1 R2 R3)ᵀ rot(G) x6",
        );
        for w in wrist::solve(g, arm, v, xv, target.reference4, &tag) {
            let mut checks = [None; 4];
            for (slot, c) in checks.iter_mut().zip(s.checks.iter().chain(w.check.iter())) {
                *slot = Some(*c);
            }
            candidates.push(CandidateLayout {
                model_values: [
                    s.angles[0],
                    s.angles[1],
                    s.angles[2],
                    w.angles[0],
                    w.angles[1],
                    w.angles[2],
                ],
                branch: Branch {
                    shoulder: s.shoulder,
                    elbow: s.elbow,
                    wrist: w.wrist,
                },
                checks,
                wrist_aligned: Some(w.aligned),
                on_axis_1: s.on_axis_1,
            });
        }
    }
    let rule = BranchRule {
        shoulder: shoulder_rule,
        elbow: elbow_rule,
        wrist: wrist::rule(arm),
        mirrored: false,
    };
    (candidates, rule)
}

/// The label rules with rounding noise taken out ([`crate::units::snap`]): directions at
/// scale 1, points and lengths at the arm's scale, so that `LABELS` shows `0.55`, not
/// `0.5499999999999999`, and `0`, not `6e-17`. The interpreter and the emitted module read the
/// same snapped rule.
fn snapped_rule(rule: BranchRule, scale: f64) -> BranchRule {
    use crate::units::{snap, snap3};
    let shoulder = match rule.shoulder {
        ShoulderRule::Plane {
            normal,
            point,
            wrist_center,
            facing,
        } => ShoulderRule::Plane {
            normal: snap3(normal, 1.0),
            point: snap3(point, scale),
            wrist_center: snap3(wrist_center, scale),
            facing,
        },
        ShoulderRule::Radial {
            direction,
            point,
            wrist_center,
        } => ShoulderRule::Radial {
            direction: snap3(direction, 1.0),
            point: snap3(point, scale),
            wrist_center: snap3(wrist_center, scale),
        },
        ShoulderRule::Only => ShoulderRule::Only,
    };
    let elbow = match rule.elbow {
        ElbowRule::Bend {
            sense,
            stretched,
            up,
        } => ElbowRule::Bend {
            sense,
            stretched: snap(stretched, core::f64::consts::TAU),
            up,
        },
        ElbowRule::Slide { nearest } => ElbowRule::Slide {
            nearest: snap(nearest, scale),
        },
        ElbowRule::Aspect { up } => ElbowRule::Aspect { up },
        ElbowRule::Only => ElbowRule::Only,
    };
    BranchRule {
        shoulder,
        elbow,
        wrist: WristRule {
            normal: snap3(rule.wrist.normal, 1.0),
            axis5: snap3(rule.wrist.axis5, 1.0),
            axis6: snap3(rule.wrist.axis6, 1.0),
        },
        mirrored: rule.mirrored,
    }
}

/// `(c, s)` scaled to a unit pair. Where a family divides by a squared distance that, near a
/// singular configuration (a cylindrical arm's wrist center near axis 1, a polar arm's near
/// the pivot), rounding makes differ from the product of the two lengths it stands for, the
/// pair drifts off the unit circle, and the wrist would undo something that is not a rotation.
/// `atan2` of the pair (the reported angle) is unchanged, so the wrist undoes exactly the
/// rotation of that angle. A pair with no direction at all, `(0, 0)`, becomes `(1, 0)`, the
/// angle `atan2(0, 0) = 0`.
pub(crate) fn unit_pair(g: &mut Graph, c: Id, s: Id) -> (Id, Id) {
    let cc = g.mul(c, c);
    let ss = g.mul(s, s);
    let r2 = g.add(cc, ss);
    let tiny = g.exact(1e-300);
    let safe = g.max(r2, tiny);
    let r = g.sqrt(safe);
    let one = g.constant(1.0);
    let inv = g.div(one, r);
    let unit_c = g.mul(c, inv);
    let unit_s = g.mul(s, inv);
    let some = g.sub(r2, tiny);
    let zero = g.constant(0.0);
    (g.select(some, unit_c, one), g.select(some, unit_s, zero))
}

/// `(c, s)` turned by the small angle `δ` (`cos δ ≈ 1 − δ²/2`, `sin δ ≈ δ`), made a unit
/// pair again.
pub(crate) fn turn_by(g: &mut Graph, (c, s): (Id, Id), delta: Id) -> (Id, Id) {
    let dd = g.mul(delta, delta);
    let half = g.constant(0.5);
    let hdd = g.mul(half, dd);
    let one = g.constant(1.0);
    let cd = g.sub(one, hdd);
    let nc = {
        let x = g.mul(c, cd);
        let y = g.mul(s, delta);
        g.sub(x, y)
    };
    let ns = g.mul_add2(s, cd, c, delta);
    unit_pair(g, nc, ns)
}

/// The plan from a family's candidates: compacts the graph, sets the tolerances, the capacity
/// and the reference values of the two joints that `solve` holds when they are free
/// (`free`, 0-based; their cosines and sines are the plan's reference inputs).
pub fn assemble(
    arm: Arm,
    g: &Graph,
    candidates: &[CandidateLayout],
    rule: BranchRule,
    wrist_twist_cosines: [f64; 2],
    free: [usize; 2],
) -> Plan {
    let rule = snapped_rule(rule, arm.scale);
    let (graph, candidates) = compact(g, candidates);
    let settings = Settings {
        length_tolerance: 1e-10 * arm.scale,
        angle_tolerance: 1e-18,
        limit_tolerance: armforge_runtime::equivalents::LIMIT_TOLERANCE,
        duplicate_tolerance: 1e-10,
        wrist_twist_cosines,
    };
    let zero_reference = {
        let m1 = arm.joints[free[0]].model_value(free_joint_1_value(&arm.joints[free[0]]));
        let m4 = arm.joints[free[1]].model_value(0.0);
        // Rounding noise out (−0.5, not −0.49999999999999983), as for every constant a
        // reviewer reads.
        [m1.cos(), m1.sin(), m4.cos(), m4.sin()].map(|x| crate::units::snap(x, 1.0))
    };
    Plan {
        rule,
        capacity: candidates.len(),
        arm,
        graph,
        candidates,
        settings,
        zero_reference,
        free_joints: free,
        labels_by_solving: false,
    }
}

/// The joint value `solve` holds joint 1 at when it is free (the wrist center on axis 1).
///
/// The `across` shoulder solution is the `facing` one turned by half a turn, so the value is the one
/// nearest zero for which both lie within joint 1's limits: zero where the range allows it
/// (one full turn, say), otherwise just inside a limit (e.g. −10° for limits of ±170°, with the
/// back solution at 170°). A range narrower than half a turn keeps the value nearest zero.
pub fn free_joint_1_value(joint: &armforge_runtime::Joint) -> f64 {
    let [lo, hi] = joint.limits;
    let half = core::f64::consts::PI;
    // A little slack so that a value computed as `hi − π` still counts `+ π` as inside.
    let slack = 1e-9;
    let inside = |q: f64| q >= lo - slack && q <= hi + slack;
    let both_inside = |q: f64| inside(q) && (inside(q + half) || inside(q - half));
    if joint.kind == armforge_runtime::JointKind::Prismatic || !lo.is_finite() || !hi.is_finite() {
        return 0.0;
    }
    if both_inside(0.0) {
        return 0.0;
    }
    if hi - lo < half {
        return 0.0_f64.clamp(lo, hi);
    }
    // Both solutions fit for q in [lo, hi − π] ∪ [lo + π, hi]: take the point nearest zero.
    [lo, hi - half, lo + half, hi]
        .into_iter()
        .filter(|&q| both_inside(q))
        .fold(None, |best: Option<f64>, q| match best {
            Some(b) if b.abs() <= q.abs() => Some(b),
            _ => Some(q),
        })
        .unwrap_or(0.0)
}

/// The values a candidate reads from the plan (its model values, checks and flags).
pub fn candidate_roots(c: &CandidateLayout) -> Vec<Id> {
    let mut roots = Vec::new();
    roots.extend(c.model_values);
    for ch in c.checks.iter().flatten() {
        roots.push(ch.have_squared);
        roots.push(ch.limit);
    }
    roots.extend(c.wrist_aligned);
    roots.extend(c.on_axis_1);
    roots
}

fn compact(g: &Graph, candidates: &[CandidateLayout]) -> (Graph, Vec<CandidateLayout>) {
    let roots: Vec<Id> = candidates.iter().flat_map(candidate_roots).collect();
    let (graph, map) = g.compact(&roots);
    let m = |id: Id| map[id as usize].unwrap_or(0);
    let remapped = candidates
        .iter()
        .map(|c| CandidateLayout {
            model_values: c.model_values.map(m),
            branch: c.branch,
            checks: c.checks.map(|ch| {
                ch.map(|ch| CheckLayout {
                    kind: ch.kind,
                    have_squared: m(ch.have_squared),
                    limit: m(ch.limit),
                })
            }),
            wrist_aligned: c.wrist_aligned.map(m),
            on_axis_1: c.on_axis_1.map(m),
        })
        .collect();
    (graph, remapped)
}
