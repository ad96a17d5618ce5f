//! The interpreter facade: solve an arm at run time from its plan, in SI units.
//!
//! The CLI's `solve` and `verify` use this; emitted modules run the same plan as straight-line
//! Rust. Both finish through `armforge_runtime::internal`, so their answers agree.

use armforge_runtime::internal::{self, Candidate};
use armforge_runtime::plan::{self as rplan, Op};
use armforge_runtime::{Branch, Pose, Solution, Unreachable, JOINTS};

use crate::classify::{classify, Geometry, Rejection, Tolerances};
use crate::model::Model;
use crate::plan::{build_plan, Plan};

/// A joint of a solution outside its limits, and by how much (radians or metres).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct LimitViolation {
    /// 0-based joint index.
    pub joint: usize,
    /// How far beyond the nearest limit.
    pub by: f64,
}

/// An arm's solver, evaluating its plan with the runtime interpreter.
#[derive(Clone, Debug)]
pub struct Solver {
    plan: Plan,
    ops: Vec<Op>,
}

impl Solver {
    /// The solver of a classified model.
    pub fn new(model: &Model, geometry: &Geometry) -> Solver {
        Self::from_plan(build_plan(model, geometry))
    }

    /// The solver of a model: classifies it with the default tolerances first.
    pub fn for_model(model: &Model) -> Result<Solver, Box<Rejection>> {
        let geometry = classify(model, &Tolerances::default()).map_err(Box::new)?;
        Ok(Self::new(model, &geometry))
    }

    /// The solver of a plan.
    pub fn from_plan(plan: Plan) -> Solver {
        let ops = plan.ops();
        Solver { plan, ops }
    }

    /// The plan being interpreted.
    pub fn plan(&self) -> &Plan {
        &self.plan
    }

    /// The largest number of solutions one target can have.
    pub fn capacity(&self) -> usize {
        self.plan.capacity
    }

    /// Forward kinematics: the tool pose in the world for joint values (SI).
    pub fn forward(&self, joints: &[f64; JOINTS]) -> Pose {
        armforge_runtime::forward(
            &self.plan.arm.joints,
            &self.plan.arm.base,
            &self.plan.arm.tool,
            joints,
        )
    }

    /// The branch label of a configuration.
    pub fn branch_of(&self, joints: &[f64; JOINTS]) -> Branch {
        let (table, settings) = (&self.plan.arm.joints, &self.plan.settings);
        if self.plan.labels_by_solving {
            // The label of the solution at forward(q) nearest q (as the emitted module does).
            let target = self.forward(joints);
            let reference = internal::reference_of(table, joints, self.plan.free_joints);
            let anchor = internal::anchors_near(table, joints, settings.limit_tolerance);
            let candidates = self.candidates(&target, &reference);
            if let Ok(s) =
                internal::nearest_candidate(table, settings, &candidates, joints, &anchor)
            {
                return s.branch;
            }
        }
        internal::branch_of(&self.plan.rule, table, joints)
    }

    /// The plan's candidates as evaluated, without the free joint 1 moved.
    fn evaluated(&self, target: &Pose, reference: &[f64; 4]) -> Vec<Candidate> {
        let inputs = rplan::inputs(target, reference);
        let mut values = vec![0.0; self.ops.len()];
        rplan::evaluate(&self.ops, &inputs, &mut values);
        self.plan
            .candidates
            .iter()
            .map(|layout| rplan::candidate(layout, &values))
            .collect()
    }

    /// The candidates, with joint 1 moved where the wrist center is on axis 1 and the held
    /// value puts joint 5 outside its limits (`internal::free_joint_1`, as emitted modules do).
    fn candidates(&self, target: &Pose, reference: &[f64; 4]) -> Vec<Candidate> {
        let mut candidates = self.evaluated(target, reference);
        let arm = &self.plan.arm;
        internal::free_joint_1(
            &arm.joints,
            [&arm.base, &arm.tool],
            &self.plan.settings,
            target,
            reference,
            &mut candidates,
            |r, i| self.evaluated(target, r).get(i).copied(),
        );
        candidates
    }

    fn finish(
        &self,
        target: &Pose,
        reference: &[f64; 4],
        only: Option<Branch>,
    ) -> Result<Vec<Solution>, Unreachable> {
        internal::check_pose(target)?;
        let candidates = self.candidates(target, reference);
        let mut out = vec![Solution::EMPTY; self.plan.capacity.max(1)];
        let len = internal::finish(
            &self.plan.arm.joints,
            &self.plan.settings,
            &candidates,
            only,
            &mut out,
        )?;
        out.truncate(len);
        Ok(out)
    }

    /// Every solution within the limits, or why there is none. Free joints at singular poses
    /// are held at the plan's zero reference (joint 4 at zero; joint 1 nearest zero with both
    /// shoulder solutions within its limits).
    ///
    /// A target farther than [`internal::FAR`] is answered by the same target brought in to
    /// that distance along its ray, with the reason's lengths scaled back (`internal::far`).
    pub fn solve(&self, target: &Pose) -> Result<Vec<Solution>, Unreachable> {
        internal::check_pose(target)?;
        if let Some(far) = internal::far_target(target) {
            if let Err(reason) = self.solve(&far.target) {
                return Err(internal::scale_reason(
                    &self.plan.arm.joints,
                    reason,
                    far.scale,
                ));
            }
        }
        self.finish(target, &self.plan.zero_reference, None)
    }

    /// Every solution whether or not it is within the joint limits, each with the joints it
    /// violates (empty for solutions that `solve` returns). Revolute joints are wrapped into
    /// the turn centred on their range; equivalent angles are listed as in `solve`.
    pub fn solve_ignoring_limits(
        &self,
        target: &Pose,
    ) -> Result<Vec<(Solution, Vec<LimitViolation>)>, Unreachable> {
        internal::check_pose(target)?;
        let mut open = self.plan.arm.joints;
        for j in open.iter_mut() {
            let [lo, hi] = j.limits;
            let one_turn = !(lo.is_finite() && hi.is_finite()) || hi - lo <= std::f64::consts::TAU;
            if one_turn {
                let center = if lo.is_finite() && hi.is_finite() {
                    0.5 * (lo + hi)
                } else {
                    0.0
                };
                let half = match j.kind {
                    armforge_runtime::JointKind::Revolute => std::f64::consts::PI,
                    armforge_runtime::JointKind::Prismatic => f64::INFINITY,
                };
                j.limits = [center - half, center + half];
            }
        }
        let candidates = self.evaluated(target, &self.plan.zero_reference);
        let mut out = vec![Solution::EMPTY; self.plan.capacity.max(1) * 2];
        let len = internal::finish(&open, &self.plan.settings, &candidates, None, &mut out)?;
        out.truncate(len);
        Ok(out
            .into_iter()
            .map(|s| {
                let violations = self
                    .plan
                    .arm
                    .joints
                    .iter()
                    .zip(s.joints.iter())
                    .enumerate()
                    .filter_map(|(joint, (j, v))| {
                        let by = (j.limits[0] - v).max(v - j.limits[1]);
                        (by > self.plan.settings.limit_tolerance)
                            .then_some(LimitViolation { joint, by })
                    })
                    .collect();
                (s, violations)
            })
            .collect())
    }

    /// The solution nearest to `current`: `current`'s own branch when it has a solution away
    /// from singular poses, otherwise the nearest of every branch (wrap-aware); each joint
    /// whose range exceeds a turn at the equivalent angle nearest `current`. At the wrist
    /// singularity joint 4 stays at its current value, on axis 1 joint 1 does. The same rule
    /// as the emitted `solve_near`.
    pub fn solve_near(
        &self,
        target: &Pose,
        current: &[f64; JOINTS],
    ) -> Result<Solution, Unreachable> {
        internal::check_pose(target)?;
        if let Some(far) = internal::far_target(target) {
            if let Err(reason) = self.solve_near(&far.target, current) {
                return Err(internal::scale_reason(
                    &self.plan.arm.joints,
                    reason,
                    far.scale,
                ));
            }
        }
        let (joints, settings) = (&self.plan.arm.joints, &self.plan.settings);
        let anchor = internal::anchors_near(joints, current, settings.limit_tolerance);
        // Away from singular poses the reference is not used (as in the emitted solver). An
        // arm whose labels are read by solving takes the nearest of every branch directly.
        if !self.plan.labels_by_solving {
            let candidates = self.candidates(target, &self.plan.zero_reference);
            let own = self.branch_of(current);
            if let Some(c) = candidates.iter().find(|c| c.branch == own) {
                if let Ok(s) = internal::finish_one(joints, settings, c, &anchor) {
                    if !s.flags.is_singular() {
                        return Ok(s);
                    }
                }
            }
        }
        let reference = internal::reference_of(joints, current, self.plan.free_joints);
        let candidates = self.candidates(target, &reference);
        internal::nearest_candidate(joints, settings, &candidates, current, &anchor)
    }

    /// The configuration of one branch (each joint whose range exceeds a turn at the
    /// equivalent angle nearest its range's center), or why there is none.
    pub fn solve_branch(&self, target: &Pose, branch: Branch) -> Result<Solution, Unreachable> {
        internal::check_pose(target)?;
        if !self.plan.candidates.iter().any(|c| c.branch == branch) {
            return Err(Unreachable::NoSuchBranch);
        }
        if let Some(far) = internal::far_target(target) {
            if let Err(reason) = self.solve_branch(&far.target, branch) {
                return Err(internal::scale_reason(
                    &self.plan.arm.joints,
                    reason,
                    far.scale,
                ));
            }
        }
        let candidates = self.candidates(target, &self.plan.zero_reference);
        let Some(c) = candidates.iter().find(|c| c.branch == branch) else {
            return Err(Unreachable::BranchUnavailable);
        };
        let joints = &self.plan.arm.joints;
        let centers = internal::centers(joints);
        internal::finish_one(joints, &self.plan.settings, c, &centers)
    }
}
