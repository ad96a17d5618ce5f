//! The module's items: constants of the arm, the public API, the straight-line solver body.

use std::collections::BTreeMap;

use armforge_runtime::internal::{
    BranchRule, CheckKind, ElbowRule, FoldedRule, Settings, ShoulderRule,
};
use armforge_runtime::plan::CandidateLayout;
use armforge_runtime::{Branch, Elbow, Joint, JointKind, Pose, Shoulder, Wrist};
use proc_macro2::TokenStream;
use quote::{format_ident, quote};

use armforge_runtime::math::Growth;

use super::expr::{definition, literal, reference, Bindings};
use super::ScalarType;
use crate::plan::graph::{Graph, Id};
use crate::plan::{candidate_roots, Plan};

/// Prints constants in the module's scalar.
#[derive(Clone, Copy)]
struct Literals(ScalarType);

impl Literals {
    fn lit(self, x: f64) -> TokenStream {
        literal(x, self.0).0
    }

    fn lit3(self, v: &[f64; 3]) -> TokenStream {
        let [a, b, c] = [self.lit(v[0]), self.lit(v[1]), self.lit(v[2])];
        quote!([#a, #b, #c])
    }
}

fn joint(j: &Joint, l: Literals) -> TokenStream {
    let (lit, lit3) = (|x| l.lit(x), |v: &[f64; 3]| l.lit3(v));
    let kind = match j.kind {
        JointKind::Revolute => quote!(::armforge_runtime::JointKind::Revolute),
        JointKind::Prismatic => quote!(::armforge_runtime::JointKind::Prismatic),
    };
    let (axis, point) = (lit3(&j.axis), lit3(&j.point));
    let (direction, offset) = (lit(j.direction), lit(j.offset));
    let (lo, hi) = (lit(j.limits[0]), lit(j.limits[1]));
    quote! {
        ::armforge_runtime::Joint {
            kind: #kind,
            axis: #axis,
            point: #point,
            direction: #direction,
            offset: #offset,
            limits: [#lo, #hi],
        }
    }
}

fn pose(p: &Pose, l: Literals) -> TokenStream {
    let rows: Vec<TokenStream> = p.rotation.iter().map(|r| l.lit3(r)).collect();
    let t = l.lit3(&p.translation);
    quote! {
        ::armforge_runtime::Pose {
            rotation: [#(#rows),*],
            translation: #t,
        }
    }
}

/// The plan's tolerances (written for `f64`) carried to the module's scalar: a length at a
/// reach boundary and the distance between two roots that should be one grow with the square
/// root of the epsilon (see [`Growth`]), a squared sine and a slack at a limit with it.
fn settings(s: &Settings, l: Literals) -> TokenStream {
    let scalar = l.0;
    let (a, b, c, d) = (
        l.lit(scalar.tolerance(s.length_tolerance, Growth::SquareRoot)),
        l.lit(scalar.tolerance(s.angle_tolerance, Growth::Linear)),
        l.lit(scalar.tolerance(s.limit_tolerance, Growth::Linear)),
        l.lit(scalar.tolerance(s.duplicate_tolerance, Growth::SquareRoot)),
    );
    let (w45, w56) = (
        l.lit(s.wrist_twist_cosines[0]),
        l.lit(s.wrist_twist_cosines[1]),
    );
    quote! {
        ::armforge_runtime::internal::Settings {
            length_tolerance: #a,
            angle_tolerance: #b,
            limit_tolerance: #c,
            duplicate_tolerance: #d,
            wrist_twist_cosines: [#w45, #w56],
        }
    }
}

fn rule(r: &BranchRule, l: Literals) -> TokenStream {
    let (lit, lit3) = (|x| l.lit(x), |v: &[f64; 3]| l.lit3(v));
    let shoulder = match r.shoulder {
        ShoulderRule::Plane {
            normal,
            point,
            wrist_center,
            facing,
        } => {
            let (n, p, c, f) = (
                lit3(&normal),
                lit3(&point),
                lit3(&wrist_center),
                lit(facing),
            );
            quote!(::armforge_runtime::internal::ShoulderRule::Plane {
                normal: #n, point: #p, wrist_center: #c, facing: #f,
            })
        }
        ShoulderRule::Radial {
            direction,
            point,
            wrist_center,
        } => {
            let (d, p, c) = (lit3(&direction), lit3(&point), lit3(&wrist_center));
            quote!(::armforge_runtime::internal::ShoulderRule::Radial {
                direction: #d, point: #p, wrist_center: #c,
            })
        }
        ShoulderRule::Only => quote!(::armforge_runtime::internal::ShoulderRule::Only),
    };
    let elbow = match r.elbow {
        ElbowRule::Bend {
            sense,
            stretched,
            up,
        } => {
            let (s, t, u) = (lit(sense), lit(stretched), lit(up));
            quote!(::armforge_runtime::internal::ElbowRule::Bend {
                sense: #s, stretched: #t, up: #u,
            })
        }
        ElbowRule::Slide { nearest } => {
            let n = lit(nearest);
            quote!(::armforge_runtime::internal::ElbowRule::Slide { nearest: #n })
        }
        ElbowRule::Aspect { up } => {
            let u = lit(up);
            quote!(::armforge_runtime::internal::ElbowRule::Aspect { up: #u })
        }
        ElbowRule::Only => quote!(::armforge_runtime::internal::ElbowRule::Only),
    };
    let (n, a5, a6) = (
        lit3(&r.wrist.normal),
        lit3(&r.wrist.axis5),
        lit3(&r.wrist.axis6),
    );
    let mirrored = r.mirrored;
    quote! {
        ::armforge_runtime::internal::BranchRule {
            shoulder: #shoulder,
            elbow: #elbow,
            wrist: ::armforge_runtime::internal::WristRule { normal: #n, axis5: #a5, axis6: #a6 },
            mirrored: #mirrored,
        }
    }
}

fn branch(b: &Branch) -> TokenStream {
    let shoulder = match b.shoulder {
        Shoulder::Facing => quote!(Facing),
        Shoulder::Across => quote!(Across),
        Shoulder::Only => quote!(Only),
    };
    let elbow = match b.elbow {
        Elbow::Up => quote!(Up),
        Elbow::Down => quote!(Down),
        Elbow::Extended => quote!(Extended),
        Elbow::Retracted => quote!(Retracted),
        Elbow::Only => quote!(Only),
    };
    let wrist = match b.wrist {
        Wrist::Leading => quote!(Leading),
        Wrist::Trailing => quote!(Trailing),
    };
    quote! {
        ::armforge_runtime::Branch {
            shoulder: ::armforge_runtime::Shoulder::#shoulder,
            elbow: ::armforge_runtime::Elbow::#elbow,
            wrist: ::armforge_runtime::Wrist::#wrist,
        }
    }
}

fn check_kind(k: CheckKind) -> TokenStream {
    match k {
        CheckKind::None => quote!(None),
        CheckKind::BeyondReach => quote!(BeyondReach),
        CheckKind::InsideHole => quote!(InsideHole),
        CheckKind::WristOrientation => quote!(WristOrientation),
        CheckKind::Residual => quote!(Residual),
    }
}

/// Every node the candidates read directly (they count as uses for `let` decisions).
fn candidate_uses(candidates: &[CandidateLayout]) -> Vec<Id> {
    candidates.iter().flat_map(candidate_roots).collect()
}

fn candidate(plan: &Plan, b: &Bindings, c: &CandidateLayout) -> TokenStream {
    let g = &plan.graph;
    let r = |id: Id| reference(g, b, id).0;
    let values: Vec<TokenStream> = c.model_values.iter().map(|&id| r(id)).collect();
    let label = branch(&c.branch);
    let checks: Vec<TokenStream> = c
        .checks
        .iter()
        .map(|ch| match ch {
            Some(ch) => {
                let kind = check_kind(ch.kind);
                let (have, limit) = (r(ch.have_squared), r(ch.limit));
                quote!(::armforge_runtime::internal::Check {
                    kind: ::armforge_runtime::internal::CheckKind::#kind,
                    have_squared: #have,
                    limit: #limit,
                })
            }
            None => quote!(::armforge_runtime::internal::Check::NONE),
        })
        .collect();
    let flag = |id: Option<Id>| match id {
        Some(id) => {
            let (t, p) = reference(g, b, id);
            if p >= super::expr::Prec::Sum {
                quote!(#t >= 0.0)
            } else {
                quote!((#t) >= 0.0)
            }
        }
        None => quote!(false),
    };
    let (aligned, on_axis) = (flag(c.wrist_aligned), flag(c.on_axis_1));
    quote! {
        ::armforge_runtime::internal::Candidate {
            model_values: [#(#values),*],
            branch: #label,
            checks: [#(#checks),*],
            wrist_aligned: #aligned,
            on_axis_1: #on_axis,
        }
    }
}

/// One `let` per bound node, in evaluation order, and the notes of the named steps; inputs
/// are left out unless `with_inputs` (the caller binds them itself).
pub(super) fn lets(
    g: &Graph,
    b: &Bindings,
    with_inputs: bool,
) -> (Vec<TokenStream>, BTreeMap<String, String>) {
    let mut notes = BTreeMap::new();
    let mut lets = Vec::new();
    for (&id, name) in b.bound() {
        if !with_inputs && matches!(g.op(id), armforge_runtime::plan::Op::Input(_)) {
            continue;
        }
        let ident = format_ident!("{}", name);
        let value = definition(g, b, id).0;
        lets.push(quote!(let #ident = #value;));
        if let Some(note) = &g.nodes()[id as usize].note {
            if !matches!(g.op(id), armforge_runtime::plan::Op::Input(_)) {
                notes.insert(name.clone(), note.clone());
            }
        }
    }
    (lets, notes)
}

/// The lints a straight-line solver body trips by nature (long, many short names, literals
/// as the description wrote them).
pub(super) fn lint_allowances() -> TokenStream {
    quote! {
        #[allow(
            clippy::approx_constant,
            clippy::excessive_precision,
            clippy::too_many_lines,
            clippy::many_single_char_names,
            clippy::similar_names,
            clippy::unreadable_literal,
            clippy::suboptimal_flops
        )]
    }
}

/// The straight-line body of every branch and the notes of its named steps.
fn solver_body(plan: &Plan, scalar: ScalarType) -> (TokenStream, BTreeMap<String, String>) {
    let g = &plan.graph;
    let b = Bindings::new(g, &candidate_uses(&plan.candidates), scalar);
    let (ty, generic) = (scalar.ty(), scalar.generic());
    let (lets, notes) = lets(g, &b, true);
    let candidates: Vec<TokenStream> = plan
        .candidates
        .iter()
        .map(|c| candidate(plan, &b, c))
        .collect();
    let n = super::expr::index(plan.candidates.len());
    let lints = lint_allowances();
    let (guard, pivot_doc) = free_guard(plan);
    // A moved candidate is evaluated again by its own branch's function, not every branch.
    let reruns = (0..plan.candidates.len()).map(|k| {
        let (index, name) = (super::expr::index(k), branch_fn_name(k));
        quote!(#index => ::core::option::Option::Some(#name(target, moved)),)
    });
    let body = quote! {
        /// The closed-form steps: every branch's candidate, in model values. Inlined, so that
        /// in `solve` the candidates stay in registers and their check kinds fold into the
        /// finishing.
        #lints
        #[inline(always)]
        fn candidates(
            target: &::armforge_runtime::Pose #generic,
            reference: &[#ty; 4],
        ) -> [::armforge_runtime::internal::Candidate #generic; #n] {
            #(#lets)*
            [#(#candidates),*]
        }

        /// [`candidates`] as a call of its own, for `solve_near`'s rare fallback: the steps
        /// are inlined once, into `solve`, not a second time.
        #[inline(never)]
        fn candidates_apart(
            target: &::armforge_runtime::Pose #generic,
            reference: &[#ty; 4],
        ) -> [::armforge_runtime::internal::Candidate #generic; #n] {
            candidates(target, reference)
        }

        /// Moves the free joint where a singular pose leaves one free and its held value puts a
        /// joint outside its limits, in place (a rare path; see
        /// `armforge_runtime::internal::free_joint_1`; a moved candidate is evaluated again by
        /// its branch's own function).
        #[inline]
        fn free_joints(
            target: &::armforge_runtime::Pose #generic,
            reference: &[#ty; 4],
            all: &mut [::armforge_runtime::internal::Candidate #generic; #n],
        ) {
            if !may_free(all) {
                return;
            }
            ::armforge_runtime::internal::free_joint_1(
                &JOINT_TABLE,
                [&BASE, &TOOL],
                &SETTINGS,
                target,
                reference,
                all,
                |moved: &[#ty; 4], i: usize| match i {
                    #(#reruns)*
                    _ => ::core::option::Option::None,
                },
            );
        }

        /// True when a candidate may leave a joint free.
        #pivot_doc
        #[inline(always)]
        fn may_free(all: &[::armforge_runtime::internal::Candidate #generic; #n]) -> bool {
            #guard
        }
    };
    (body, notes)
}

/// The early return of `free_joints` when no candidate is singular: a free joint comes only
/// with a flag (wrist aligned, wrist center on axis 1), except at the pivot of an arm whose
/// joint 2 turns and joint 3 slides (no flag: always checked). Fixed by the arm's joint kinds.
fn free_guard(plan: &Plan) -> (TokenStream, TokenStream) {
    let [_, j2, j3, ..] = &plan.arm.joints;
    if j2.kind == JointKind::Revolute && j3.kind == JointKind::Prismatic {
        let doc = " Always, for this arm: at the pivot of joint 2 no flag is set.";
        return (quote!(let _ = all; true), quote!(#[doc = ""] #[doc = #doc]));
    }
    let guard = quote! {
        // Only a flagged candidate has a free joint (every candidate is visited).
        let mut any = false;
        for c in all {
            any |= c.wrist_aligned | c.on_axis_1;
        }
        any
    };
    (guard, quote!())
}

/// The name of the function that computes only candidate `k` (0-based).
fn branch_fn_name(k: usize) -> proc_macro2::Ident {
    format_ident!("branch_{}", k + 1)
}

/// One function per branch: only the steps that branch's candidate needs (one joint-1 root,
/// one elbow root, one wrist root).
fn branch_bodies(plan: &Plan, scalar: ScalarType) -> TokenStream {
    let g = &plan.graph;
    let (ty, generic) = (scalar.ty(), scalar.generic());
    let lints = lint_allowances();
    let fns = plan.candidates.iter().enumerate().map(|(k, c)| {
        let uses = candidate_uses(std::slice::from_ref(c));
        let b = Bindings::within(g, &uses, &g.needed(&uses), scalar);
        let (lets, _) = lets(g, &b, true);
        let value = candidate(plan, &b, c);
        let name = branch_fn_name(k);
        let doc = format!(
            " The closed-form steps of branch {} alone ({}).",
            k + 1,
            c.branch
        );
        quote! {
            #[doc = #doc]
            #lints
            #[allow(unused_variables)]
            #[inline]
            fn #name(
                target: &::armforge_runtime::Pose #generic,
                reference: &[#ty; 4],
            ) -> ::armforge_runtime::internal::Candidate #generic {
                #(#lets)*
                #value
            }
        }
    });
    quote!(#(#fns)*)
}

/// `match` arms from each branch label to its function's candidate: `label => wrap(call)`.
fn branch_arms(plan: &Plan, wrap: impl Fn(TokenStream) -> TokenStream) -> Vec<TokenStream> {
    plan.candidates
        .iter()
        .enumerate()
        .map(|(k, c)| {
            let pattern = branch(&c.branch);
            let name = branch_fn_name(k);
            let call = wrap(quote!(#name(target, &reference)));
            quote!(#pattern => #call,)
        })
        .collect()
}

/// `branch_of`: by the label rules, or (plans whose labels are read by solving) the label of
/// the solution at `forward(q)` nearest `q`, the rules only when there is none.
fn branch_of_fn(plan: &Plan, l: Literals) -> TokenStream {
    let (ty, generic) = (l.0.ty(), l.0.generic());
    if !plan.labels_by_solving {
        if let Some(folded) = armforge_runtime::internal::fold_rule(&plan.rule, &plan.arm.joints) {
            return folded_branch_of(&folded, plan.arm.scale, l);
        }
        return quote! {
            /// The branch label of any configuration; agrees with the labels `solve` reports.
            pub fn branch_of(joints: &[#ty; JOINTS]) -> ::armforge_runtime::Branch {
                ::armforge_runtime::internal::branch_of(&LABELS, &JOINT_TABLE, joints)
            }
        };
    }
    let [a, b] = plan.free_joints.map(super::expr::index);
    quote! {
        /// The branch label of any configuration; agrees with the labels `solve` reports: the
        /// label of the solution at `forward(joints)` nearest `joints` (two roots of this arm's
        /// quartic can share a geometric label, and the second then takes a free one), the
        /// geometric rule when there is no solution within the limits.
        pub fn branch_of(joints: &[#ty; JOINTS]) -> ::armforge_runtime::Branch {
            let target: ::armforge_runtime::Pose #generic = forward(joints);
            let reference = ::armforge_runtime::internal::reference_of(&JOINT_TABLE, joints, [#a, #b]);
            let anchor = ::armforge_runtime::internal::anchors_near(
                &JOINT_TABLE,
                joints,
                SETTINGS.limit_tolerance,
            );
            let mut all = candidates(&target, &reference);
            free_joints(&target, &reference, &mut all);
            match ::armforge_runtime::internal::nearest_candidate(
                &JOINT_TABLE,
                &SETTINGS,
                &all,
                joints,
                &anchor,
            ) {
                ::core::result::Result::Ok(solution) => solution.branch,
                ::core::result::Result::Err(_) => {
                    ::armforge_runtime::internal::branch_of(&LABELS, &JOINT_TABLE, joints)
                }
            }
        }
    }
}

/// `branch_of` of an elbow arm: the rule folded with this arm's constants (two `sin_cos`
/// calls, no forward kinematics), the table printed as a constant the compiler folds.
/// Rounding noise is taken out of the shoulder values (lengths up to the arm's scale squared).
fn folded_branch_of(f: &FoldedRule, scale: f64, l: Literals) -> TokenStream {
    let (ty, generic) = (l.0.ty(), l.0.generic());
    let shoulder: Vec<TokenStream> = f
        .shoulder
        .iter()
        .map(|&x| l.lit(crate::units::snap(x, scale.max(scale * scale))))
        .collect();
    let (facing, up) = (l.lit(f.facing), l.lit(f.up));
    let [bs, bc] = f.bend.map(|x| l.lit(x));
    let (phase, width) = (l.lit(f.wrist_phase), l.lit(f.wrist_half_width));
    quote! {
        /// The label rules with this arm's constants folded in (θi the model values,
        /// ci = cos θi, si = sin θi):
        /// - shoulder: v = k0 + k1·c3 + k2·s3 + c2·(k3 + k4·c3 + k5·s3) + s2·(k6 + k7·c3 + k8·s3),
        ///   the signed distance of the wrist center from the shoulder plane; facing when
        ///   sign v = `facing`;
        /// - elbow: sin(sense·θ3 − stretched) = e_s·s3 + e_c·c3; up when its sign times the
        ///   shoulder side is `up`;
        /// - wrist: leading when |θ5 − φ| (wrapped into [−π, π]) ≤ τ.
        #[allow(clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        const FOLDED_LABELS: ::armforge_runtime::internal::FoldedRule #generic =
            ::armforge_runtime::internal::FoldedRule {
                shoulder: [#(#shoulder),*],
                facing: #facing,
                bend: [#bs, #bc],
                up: #up,
                wrist_phase: #phase,
                wrist_half_width: #width,
            };

        /// The branch label of any configuration; agrees with the labels `solve` reports.
        pub fn branch_of(joints: &[#ty; JOINTS]) -> ::armforge_runtime::Branch {
            ::armforge_runtime::internal::branch_of_folded(&FOLDED_LABELS, &JOINT_TABLE, joints)
        }
    }
}

/// `solve_branch` and `solve_near`: one branch's steps, finished with the arm's constants.
fn branch_api(plan: &Plan, l: Literals) -> TokenStream {
    let (ty, generic) = (l.0.ty(), l.0.generic());
    let pivot = !free_guard(plan).1.is_empty();
    let branch_guard = if pivot {
        quote!()
    } else {
        quote! {
            // Only a flagged candidate has a free joint.
            if !(one[0].wrist_aligned | one[0].on_axis_1) {
                return ::armforge_runtime::internal::finish_one(&JOINT_TABLE, &SETTINGS, &one[0], &CENTERS);
            }
        }
    };
    let reference_call = if plan.free_joints == [0, 3] {
        quote!(::armforge_runtime::internal::reference(
            &JOINT_TABLE,
            current
        ))
    } else {
        let [a, b] = plan.free_joints.map(super::expr::index);
        quote!(::armforge_runtime::internal::reference_of(&JOINT_TABLE, current, [#a, #b]))
    };
    let centers: Vec<TokenStream> = armforge_runtime::internal::centers(&plan.arm.joints)
        .iter()
        .map(|&x| l.lit(x))
        .collect();
    let by_label = branch_arms(plan, |call| call);
    let own = branch_arms(plan, |call| quote!(::core::option::Option::Some(#call)));
    // An arm whose labels are read by solving would solve everything twice (once in
    // `branch_of`): its nearest solution is worked out from every branch directly.
    let own_shortcut = if plan.labels_by_solving {
        quote! {
            // This arm's labels are read by solving: every branch once, the nearest taken.
        }
    } else {
        quote! {
            // Away from singular poses the free joints' reference is not used: try the own
            // branch with the zero reference, and work out `current`'s only when needed.
            let reference = ZERO_REFERENCE;
            let own = match branch_of(current) {
                #(#own)*
                _ => ::core::option::Option::None,
            };
            if let ::core::option::Option::Some(candidate) = own {
                if let ::core::result::Result::Ok(solution) =
                    ::armforge_runtime::internal::finish_one(&JOINT_TABLE, &SETTINGS, &candidate, &anchor)
                {
                    if !solution.flags.is_singular() {
                        return ::core::result::Result::Ok(solution);
                    }
                }
            }
        }
    };
    quote! {
        /// The value each joint is wrapped toward by `solve_branch`: its range's center.
        #[allow(clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        const CENTERS: [#ty; JOINTS] = [#(#centers),*];

        /// The solution nearest to `current`: `current`'s own branch (read by `branch_of`)
        /// when it has one away from singular poses, otherwise the nearest of every branch
        /// (wrap-aware joint distance; directly, for an arm whose labels are read by solving). Each joint whose range exceeds a turn takes the
        /// equivalent angle nearest `current`. At the wrist singularity joint 4 stays at its
        /// current value (joint 1 likewise on axis 1).
        pub fn solve_near(
            target: &::armforge_runtime::Pose #generic,
            current: &[#ty; JOINTS],
        ) -> ::core::result::Result<::armforge_runtime::Solution #generic, ::armforge_runtime::Unreachable #generic> {
            ::armforge_runtime::internal::check_pose(target)?;
            // A target beyond 1e100 m: answered at 1e100 m along its ray, lengths scaled back.
            if let ::core::option::Option::Some(far) = ::armforge_runtime::internal::far_target(target) {
                if let ::core::result::Result::Err(reason) = solve_near(&far.target, current) {
                    return ::core::result::Result::Err(
                        ::armforge_runtime::internal::scale_reason(&JOINT_TABLE, reason, far.scale),
                    );
                }
            }
            let anchor = ::armforge_runtime::internal::anchors_near(
                &JOINT_TABLE,
                current,
                SETTINGS.limit_tolerance,
            );
            #own_shortcut
            let reference = #reference_call;
            let mut all = candidates_apart(target, &reference);
            free_joints(target, &reference, &mut all);
            ::armforge_runtime::internal::nearest_candidate(
                &JOINT_TABLE,
                &SETTINGS,
                &all,
                current,
                &anchor,
            )
        }

        /// The one configuration of `branch` (each joint whose range exceeds a turn at the
        /// equivalent angle nearest its range's center), or why there is none. Computes that
        /// branch alone.
        pub fn solve_branch(
            target: &::armforge_runtime::Pose #generic,
            branch: ::armforge_runtime::Branch,
        ) -> ::core::result::Result<::armforge_runtime::Solution #generic, ::armforge_runtime::Unreachable #generic> {
            ::armforge_runtime::internal::check_pose(target)?;
            // A target beyond 1e100 m: answered at 1e100 m along its ray, lengths scaled back.
            if let ::core::option::Option::Some(far) = ::armforge_runtime::internal::far_target(target) {
                if let ::core::result::Result::Err(reason) = solve_branch(&far.target, branch) {
                    return ::core::result::Result::Err(
                        ::armforge_runtime::internal::scale_reason(&JOINT_TABLE, reason, far.scale),
                    );
                }
            }
            let reference = ZERO_REFERENCE;
            let candidate = match branch {
                #(#by_label)*
                _ => return ::core::result::Result::Err(::armforge_runtime::Unreachable::NoSuchBranch),
            };
            let mut one = [candidate];
            #branch_guard
            ::armforge_runtime::internal::free_joint_1(
                &JOINT_TABLE,
                [&BASE, &TOOL],
                &SETTINGS,
                target,
                &reference,
                &mut one,
                |moved: &[#ty; 4], _: usize| {
                    let reference = *moved;
                    match branch {
                        #(#own)*
                        _ => ::core::option::Option::None,
                    }
                },
            );
            ::armforge_runtime::internal::finish_one(&JOINT_TABLE, &SETTINGS, &one[0], &CENTERS)
        }
    }
}

/// The whole module as tokens, and the notes for the step comments.
pub fn module(
    plan: &Plan,
    with_test: bool,
    scalar: ScalarType,
) -> (TokenStream, BTreeMap<String, String>) {
    let l = Literals(scalar);
    let (ty, generic, trailing) = (scalar.ty(), scalar.generic(), scalar.trailing());
    let joints: Vec<TokenStream> = plan.arm.joints.iter().map(|j| joint(j, l)).collect();
    let base = pose(&plan.arm.base, l);
    let tool = pose(&plan.arm.tool, l);
    let settings = settings(&plan.settings, l);
    let labels = rule(&plan.rule, l);
    // The geometric rule is printed only when `branch_of` (or its fallback) reads it.
    let folded = !plan.labels_by_solving
        && armforge_runtime::internal::fold_rule(&plan.rule, &plan.arm.joints).is_some();
    let labels_const = if folded {
        quote!()
    } else {
        quote! {
            #[allow(clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
            const LABELS: ::armforge_runtime::internal::BranchRule #generic = #labels;
        }
    };
    let zero: Vec<TokenStream> = plan.zero_reference.iter().map(|&x| l.lit(x)).collect();
    let capacity = super::expr::index(plan.capacity);
    let (body, notes) = solver_body(plan, scalar);
    let each: Vec<proc_macro2::Literal> =
        (0..plan.candidates.len()).map(super::expr::index).collect();
    let branches = branch_bodies(plan, scalar);
    let branch_api = branch_api(plan, l);
    let branch_of = branch_of_fn(plan, l);
    let forward =
        super::forward::function(&plan.arm.joints, &plan.arm.base, &plan.arm.tool, scalar);
    let test = if with_test {
        super::selftest::module(plan.arm.scale, scalar)
    } else {
        quote!()
    };
    let tokens = quote! {
        /// Number of joints.
        pub const JOINTS: usize = 6;

        /// The most solutions one target can have: one per branch, whatever the joint ranges
        /// (a joint whose range exceeds a turn holds the equivalent angle nearest its range's
        /// center; `Solution::equivalents(&JOINT_TABLE)` lists its other values).
        pub const CAPACITY: usize = #capacity;

        /// The solutions of one target.
        pub type Solutions = ::armforge_runtime::SolutionSet<CAPACITY #trailing>;

        /// The joints in the base frame with every model value at zero (SI units).
        #[allow(clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        pub const JOINT_TABLE: [::armforge_runtime::Joint #generic; JOINTS] = [#(#joints),*];

        /// The base frame in the world (folded into `forward`; kept for callers).
        #[allow(dead_code, clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        pub const BASE: ::armforge_runtime::Pose #generic = #base;

        /// The tool frame in the base frame with every model value at zero (folded into
        /// `forward`; kept for callers).
        #[allow(dead_code, clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        pub const TOOL: ::armforge_runtime::Pose #generic = #tool;

        #[allow(clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        const SETTINGS: ::armforge_runtime::internal::Settings #generic = #settings;

        #labels_const

        /// Cosine and sine of the model values the free joints start at in `solve`: joint 4 at
        /// zero; joint 1 nearest zero such that both shoulder solutions fit its limits.
        #[allow(clippy::approx_constant, clippy::excessive_precision, clippy::unreadable_literal)]
        const ZERO_REFERENCE: [#ty; 4] = [#(#zero),*];

        #forward


        /// Every solution within the joint limits, one per branch (a joint whose range exceeds
        /// a turn at the equivalent angle nearest its range's center), each with its branch
        /// label and flags; or none, with the reason. At a singular pose the free
        /// joint starts at a reference: joint 4 (wrist aligned) at zero, joint 1 (wrist center
        /// on axis 1) at the value nearest zero that keeps both shoulder solutions within its
        /// limits, joint 2 at a polar arm's pivot at zero or its limit nearest zero. Where that
        /// leaves a joint outside its limits, the free joint moves to the nearest value that
        /// keeps every joint within them (`armforge_runtime::internal::free_joint_1`).
        pub fn solve(target: &::armforge_runtime::Pose #generic) -> Solutions {
            if let ::core::result::Result::Err(reason) =
                ::armforge_runtime::internal::check_pose(target)
            {
                return ::armforge_runtime::SolutionSet::unreachable(reason);
            }
            // A target beyond 1e100 m: answered at 1e100 m along its ray, lengths scaled back.
            if let ::core::option::Option::Some(far) = ::armforge_runtime::internal::far_target(target) {
                if let ::core::option::Option::Some(reason) = solve(&far.target).reason() {
                    return ::armforge_runtime::SolutionSet::unreachable(
                        ::armforge_runtime::internal::scale_reason(&JOINT_TABLE, reason, far.scale),
                    );
                }
            }
            let all = candidates(target, &ZERO_REFERENCE);
            if may_free(&all) {
                // The rare path: a free joint may move (a copy changes behind a call).
                let mut moved = all;
                free_joints(target, &ZERO_REFERENCE, &mut moved);
                return ::armforge_runtime::internal::collect(&JOINT_TABLE, &SETTINGS, &moved);
            }
            // The common path: the candidates as the closed form made them, finished one by
            // one, so the check kinds and flags it fixed fold into the finishing.
            let mut out = ::armforge_runtime::internal::Collector::new();
            #(out.add(&JOINT_TABLE, &SETTINGS, &all[#each]);)*
            if out.is_empty() {
                // No solution: the reason is worked out from a copy (a rare path).
                let failed = all;
                return out.finish(&JOINT_TABLE, &SETTINGS, &failed);
            }
            out.finish(&JOINT_TABLE, &SETTINGS, &[])
        }

        #branch_api

        #branch_of

        #body

        #branches

        #test
    };
    (tokens, notes)
}
