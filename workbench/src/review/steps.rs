//! §4 The solve, step by step: each equation with symbols, then with this arm's numbers.
//! The steps follow the plan builders in `plan/` (decouple, elbow, polar, cylindrical,
//! cartesian, wrist); the numbers come from [`Facts`], computed as those builders compute them.

use std::fmt::Write as _;

use super::facts::Facts;
use super::show::Show;
use armforge_compiler::classify::Family;
use armforge_compiler::family::general::plan::Constants as GeneralConstants;
use armforge_compiler::family::Steps;
use armforge_compiler::plan::vec3::num;
use armforge_compiler::plan::Plan;

/// Writes §3 (the method) and §4 (the steps).
pub fn write(out: &mut String, plan: &Plan, facts: &Facts, s: &Show) {
    if let Some(steps) = plan.arm.family.module().steps(plan) {
        given(out, &steps, s);
        finishing(out, plan, s);
        return;
    }
    method(out, plan.arm.family);
    let _ = writeln!(out, "## 4. The solve, step by step\n");
    let _ = writeln!(
        out,
        "Inputs: the target pose `T` (rotation `R_T`, translation `t_T`, world frame) and two \
         reference angles (the current joints 1 and 4 in `solve_near`, zero otherwise), used \
         only where a joint is free (§6). Symbols: `h_i` axis of joint i, `p_i` its point \
         nearest the base origin, `θ_i` its model value (§1), `c` the wrist center at zero, \
         `E_i(θ)` the motion of joint i, `R_i` its rotation, `x⊥h` the part of `x` \
         perpendicular to `h`. Lengths below are in {}.\n",
        s.units.length.symbol()
    );
    wrist_center(out, facts, s);
    match plan.arm.family {
        Family::Elbow => {
            joint_one(out, facts, s, 2);
            elbow(out, facts, s);
        }
        Family::Polar => {
            joint_one(out, facts, s, 2);
            polar(out, facts, s);
        }
        Family::Cylindrical => cylindrical(out, facts, s),
        Family::Cartesian => cartesian(out, facts, s),
        Family::General => general(out, plan, s),
        _ => {}
    }
    wrist(out, plan.arm.family, facts, s);
    finishing(out, plan, s);
}

fn method(out: &mut String, family: Family) {
    let _ = writeln!(out, "## 3. The method\n");
    let _ = writeln!(
        out,
        "- **Kinematic decoupling** (Pieper 1968): the axes of joints 4–6 meet in the wrist \
         center `c`, so joints 4–6 never move it. Its target position depends on joints 1–3 \
         only; they are solved first, then joints 4–6 for each of their solutions."
    );
    let first = match family {
        Family::Elbow => {
            "- **Joints 1–3 (elbow family)**: joint 1 by *rotating a point into a plane* \
             (`a cos θ + b sin θ = e`, 0–2 roots); joint 3 by the **law of cosines** on the \
             distance from axis 2 to the wrist center (0–2 roots); joint 2 by **Paden–Kahan \
             subproblem 1**, rotating a point onto a point about one axis (Paden 1986; Murray, \
             Li & Sastry 1994, §3.3)."
        }
        Family::Polar => {
            "- **Joints 1–3 (polar family)**: joint 1 by *rotating a point into a plane* \
             (0–2 roots); the slide from the distance to axis 2 (a quadratic, 0–2 roots); \
             joint 2 by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, \
             §3.3)."
        }
        Family::Cylindrical => {
            "- **Joints 1–3 (cylindrical family)**: the height along axis 1 is linear in the \
             slides, the distance from axis 1 quadratic: one quadratic after substitution \
             (0–2 roots); joint 1 by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & \
             Sastry 1994, §3.3)."
        }
        Family::Cartesian => {
            "- **Joints 1–3 (cartesian family)**: a 3×3 linear system, inverted once by \
             Cramer's rule when the solver is generated."
        }
        Family::General => {
            "- **Joints 1–3 (general family)**: joint 1 keeps the wrist center's distance from \
             a point of axis 1 and its height along axis 1; eliminating joint 2 from those two \
             equations leaves a **quartic** in the half-angle tangent of joint 3 (Pieper 1968), \
             solved by **Ferrari's method** with two Newton steps per root (0–4 roots); joints \
             2 and 1 by **Paden–Kahan subproblem 1** (Paden 1986; Murray, Li & Sastry 1994, \
             §3.3)."
        }
        _ => "",
    };
    let _ = writeln!(out, "{first}");
    let _ = writeln!(
        out,
        "- **Joints 4–6 (spherical wrist)**: joints 4 and 5 by **Paden–Kahan subproblem 2** \
         (two rotations taking axis 6 onto its target direction, 0–2 solutions), joint 6 by \
         subproblem 1.\n- No step iterates: the operation count is fixed (§9).\n"
    );
}

/// §3 and §4 as a family gives them ([`armforge_compiler::family::FamilyModule::steps`]).
fn given(out: &mut String, steps: &Steps, s: &Show) {
    let _ = writeln!(out, "## 3. The method\n");
    for m in &steps.method {
        let _ = writeln!(out, "- {m}");
    }
    let _ = writeln!(out, "\n## 4. The solve, step by step\n");
    let _ = writeln!(
        out,
        "Inputs: the target pose `T` (world frame) and two reference angles (the current \
         values of the joints `solve_near` holds where they are free, zero otherwise). \
         Symbols: `h_i` axis of joint i, `p_i` its point nearest the base origin, `θ_i` its \
         model value (§1), `E_i(θ)` the motion of joint i, `R_i` its rotation, `x⊥h` the part \
         of `x` perpendicular to `h`. Lengths below are in {}.\n",
        s.units.length.symbol()
    );
    for (i, step) in steps.steps.iter().enumerate() {
        let _ = writeln!(out, "### 4.{} {}\n", i + 1, step.title);
        let _ = writeln!(out, "{}\n", step.text);
        block(out, &step.equations);
        let _ = writeln!(out, "This arm:\n");
        let numbers: Vec<String> = step
            .numbers
            .iter()
            .map(|line| line.iter().map(|p| super::family::part(p, s)).collect())
            .collect();
        block(out, &numbers);
    }
}

fn block(out: &mut String, lines: &[String]) {
    let _ = writeln!(out, "```text");
    for l in lines {
        let _ = writeln!(out, "{l}");
    }
    let _ = writeln!(out, "```\n");
}

fn wrist_center(out: &mut String, f: &Facts, s: &Show) {
    let _ = writeln!(out, "### 4.1 The wrist-center target\n");
    block(
        out,
        &[
            "G   = B⁻¹ T M⁻¹".into(),
            "c_t = G c = B_Rᵀ (R_T c_tool + t_T − B_t),   c_tool = M_Rᵀ (c − M_t)".into(),
            "R456 = (R1 R2 R3)ᵀ rot(G)           (what is left for joints 4–6)".into(),
        ],
    );
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[
            format!("c      = {}", s.point(&f.c())),
            format!("c_tool = {}", s.point(&f.c_tool())),
            format!(
                "B_R    = {},  B_t = {}",
                s.rows(&f.arm.base.rotation),
                s.point(&f.arm.base.translation)
            ),
        ],
    );
}

fn joint_one(out: &mut String, f: &Facts, s: &Show, next: usize) {
    let k = f.joint_one();
    let _ = writeln!(out, "### 4.2 Joint 1: rotate the target into a plane\n");
    let _ = writeln!(
        out,
        "Joints {next} and 3 move the wrist center in planes perpendicular to axis 2, so its \
         component along `h2` is fixed: undoing joint 1 must bring the target to the same \
         component, `h2 · (E1(−θ1) c_t − p2) = h2 · (c − p2)`, which is\n"
    );
    block(
        out,
        &[
            "a cos θ1 + b sin θ1 = e".into(),
            "u = c_t − p1".into(),
            "a = (h2 − (h1·h2) h1) · u".into(),
            "b = (h1 × h2) · u".into(),
            "e = h2·(c − p1) − (h1·h2) (h1·u)".into(),
            "r² = a² + b²,  k = √(r² − e²)".into(),
            "cos θ1 = (a e − σ b k) / r²,  sin θ1 = (b e + σ a k) / r²,  σ = ±1".into(),
        ],
    );
    let _ = writeln!(
        out,
        "Real when `r² ≥ e²` (else the target is inside the cylinder around axis 1 that the \
         arm cannot enter); joint 1 free when `r² = 0` (§6). This arm:\n"
    );
    block(
        out,
        &[
            format!("h1 = {},  p1 = {}", s.dir(&k.h1), s.point(&k.p1)),
            format!("h2 = {},  p2 = {}", s.dir(&k.h2), s.point(&k.p2)),
            format!("a  = {} · u", s.dir(&k.alpha)),
            format!("b  = {} · u", s.dir(&k.beta)),
            format!("e  = {} − {} (h1·u)", s.len(k.e0), s.num(k.cos12)),
        ],
    );
    let _ = writeln!(
        out,
        "With joint 1 undone, the wrist center seen from axis 2 and its squared distance from \
         it:\n"
    );
    block(
        out,
        &[
            "w  = E1(−θ1) c_t − p2 = R1ᵀ u + (p1 − p2)".into(),
            "d² = |w|² − (h2·w)²".into(),
            format!("p1 − p2 = {}", s.point(&num::sub(&k.p1, &k.p2))),
        ],
    );
}

fn elbow(out: &mut String, f: &Facts, s: &Show) {
    let k = f.elbow();
    let (ll, vv) = (num::norm(&k.l), num::norm(&k.v));
    let _ = writeln!(out, "### 4.3 Joint 3: law of cosines\n");
    let _ = writeln!(
        out,
        "`L` is the upper arm (from axis 2 to axis 3, perpendicular to both), `V` the forearm \
         (from axis 3 to the wrist center, perpendicular to `h2`), both at zero; `ψ` is the \
         bend measured from the stretched arm.\n"
    );
    block(
        out,
        &[
            "d² = |L|² + |V|² + 2 |L| |V| cos ψ".into(),
            "cos ψ = (d² − |L|² − |V|²) / (2 |L| |V|),  sin ψ = ±√(1 − cos² ψ)".into(),
            "φ3 = φ0 ± ψ,  φ0 = atan2(L·(h2 × V), L·V)   (φ3 = φ0: stretched)".into(),
            "θ3 = s3 φ3,  s3 = h3·h2 = ±1".into(),
        ],
    );
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[
            format!("L = {},  |L| = {}", s.point(&k.l), s.len(ll)),
            format!("V = {},  |V| = {}", s.point(&k.v), s.len(vv)),
            format!(
                "cos ψ = (d² − {}) / {}",
                s.area(ll * ll + vv * vv),
                s.area(2.0 * ll * vv)
            ),
            format!("φ0 = {},  s3 = {}", s.angle(k.stretched), s.num(k.sense)),
        ],
    );
    let _ = writeln!(
        out,
        "### 4.4 Joint 2: rotate a point onto a point (Paden–Kahan 1)\n"
    );
    block(
        out,
        &[
            "x⊥ = L + R(h2, φ3) V = L + cos φ3 V + sin φ3 (h2 × V)".into(),
            "θ2 = atan2(h2 · (x⊥ × w), x⊥ · w)".into(),
            "R1 R2 R3 = R(h1, θ1) R(h2, θ2 + φ3)   (axes 2 and 3 parallel)".into(),
        ],
    );
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[format!(
            "x⊥ = {} + cos φ3 {} + sin φ3 {}",
            s.point(&k.l),
            s.point(&k.v),
            s.point(&k.hv)
        )],
    );
}

fn polar(out: &mut String, f: &Facts, s: &Show) {
    let k = f.polar();
    let pp = num::dot(&k.p, &k.p);
    let _ = writeln!(
        out,
        "### 4.3 Joint 3: the slide from the distance to axis 2\n"
    );
    let _ = writeln!(
        out,
        "`P` is the wrist center's offset from axis 2 at zero (perpendicular to `h2`), `u3` the \
         slide's direction; the slide `s` moves the wrist center to `P + s u3`.\n"
    );
    block(
        out,
        &[
            "|P + s u3|² = d²".into(),
            "s = −m ± √(d² − (|P|² − m²)),  m = P · u3   (+ extended, − retracted)".into(),
            "θ3 = s".into(),
        ],
    );
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[
            format!("P = {},  u3 = {}", s.point(&k.p), s.dir(&k.u3)),
            format!(
                "m = {},  |P|² − m² = {}",
                s.len(k.m),
                s.area((pp - k.m * k.m).max(0.0))
            ),
        ],
    );
    let _ = writeln!(
        out,
        "### 4.4 Joint 2: rotate a point onto a point (Paden–Kahan 1)\n"
    );
    block(
        out,
        &[
            "x  = P + s u3".into(),
            "θ2 = atan2(h2 · (x × w), x · w)".into(),
            "R1 R2 R3 = R(h1, θ1) R(h2, θ2)".into(),
        ],
    );
}

fn cylindrical(out: &mut String, f: &Facts, s: &Show) {
    let k = f.cylindrical();
    let (j, p) = (k.other, k.pivot);
    let _ = writeln!(out, "### 4.2 The slides: height and distance from axis 1\n");
    let _ = writeln!(
        out,
        "Joint 1 turns about axis 1, so it changes neither the wrist center's height along \
         `h1` nor its distance from axis 1. The height is linear in the slides; slide {p} \
         (`u_k`, the one moving more along axis 1) is eliminated with it, and the distance \
         gives a quadratic in slide {j} (`s`, direction `u_j`).\n"
    );
    block(
        out,
        &[
            "y = c_t − p1,  z = h1 · y,  radial = y − z h1,  ρ² = |radial|²".into(),
            "z = h1·(c − p1) + (h1·u_k) s_k + (h1·u_j) s".into(),
            "W = A0 + z A1,  A0 = (c − p1)⊥h1 − (h1·(c − p1)) / (h1·u_k) u_k⊥h1,  A1 = u_k⊥h1 / (h1·u_k)"
                .into(),
            "D = u_j⊥h1 − (h1·u_j) / (h1·u_k) u_k⊥h1".into(),
            "|W + s D|² = ρ²".into(),
            "s   = (−D·W ± |D| √(ρ² − |W⊥D|²)) / |D|²,  |W⊥D|² = |W|² − (D·W)² / |D|²".into(),
            "s_k = (z − h1·(c − p1) − (h1·u_j) s) / (h1·u_k)".into(),
        ],
    );
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[
            format!("h1 = {},  p1 = {}", s.dir(&f.h(1)), s.point(&f.p(1))),
            format!(
                "k = slide {p}, j = slide {j};  h1·u_k = {},  h1·u_j = {},  h1·(c − p1) = {}",
                s.num(k.along_k),
                s.num(k.along_j),
                s.len(k.height)
            ),
            format!("A0 = {},  A1 = {}", s.point(&k.a0), s.dir(&k.a1)),
            format!(
                "D  = {},  |D|² = {}",
                s.dir(&k.d),
                s.num(num::dot(&k.d, &k.d))
            ),
        ],
    );
    let _ = writeln!(
        out,
        "### 4.3 Joint 1: rotate a point onto a point (Paden–Kahan 1)\n"
    );
    block(
        out,
        &[
            "x  = W + s D".into(),
            "θ1 = atan2(h1 · (x × radial), x · radial)".into(),
            "R1 R2 R3 = R(h1, θ1)   (slides do not turn)".into(),
        ],
    );
}

fn cartesian(out: &mut String, f: &Facts, s: &Show) {
    let inv = f.cartesian_inverse();
    let _ = writeln!(out, "### 4.2 The slides: a linear system\n");
    block(
        out,
        &[
            "c_t − c = U s,  U = [u1 u2 u3]".into(),
            "s = U⁻¹ (c_t − c),  rows of U⁻¹ = (u2 × u3, u3 × u1, u1 × u2) / det U".into(),
            "R1 R2 R3 = I   (slides do not turn)".into(),
        ],
    );
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[
            format!("c = {}", s.point(&f.c())),
            format!("θ1 = {} · (c_t − c)", s.dir(&inv[0])),
            format!("θ2 = {} · (c_t − c)", s.dir(&inv[1])),
            format!("θ3 = {} · (c_t − c)", s.dir(&inv[2])),
        ],
    );
}

fn general(out: &mut String, plan: &Plan, s: &Show) {
    use armforge_compiler::family::general::plan::Layout;
    let k = armforge_compiler::family::general::plan::constants(&plan.arm);
    match k.layout {
        Layout::Skew => general_quartic(out, &k, s),
        Layout::Meet => general_meeting(out, &k, s),
        Layout::Parallel => general_parallel(out, &k, s),
    }
    let _ = writeln!(out, "### 4.4 Which roots are real\n");
    let _ = writeln!(
        out,
        "A complex pair of roots gives its real part (a root beyond reach, the nearest \
         value); every candidate is checked by its miss `|E1 E2 E3 c − c_t|`, zero for a real \
         root (at most {} of the length tolerance). Labels: the shoulder is the side of the \
         plane through axis 1 ⟂ `{}` the wrist center (joint 1 undone) is on, the elbow the \
         sign of the position Jacobian; each root goes to the candidate of its label (two \
         roots with one label: the second to a label no root has).\n",
        s.num(1.0),
        if k.layout == Layout::Parallel {
            "ℓ"
        } else {
            "n"
        }
    );
}

/// The constants every general page lists.
fn general_constants(out: &mut String, k: &GeneralConstants, s: &Show) {
    let _ = writeln!(out, "This arm:\n");
    block(
        out,
        &[
            format!(
                "f1 = {},  n = {},  ℓ = {}",
                s.point(&k.f1),
                s.dir(&k.n),
                s.dir(&k.ell)
            ),
            format!(
                "a  = {},  cos α = {},  sin α = {},  μ = {}",
                s.len(k.a),
                s.num(k.cos_a),
                s.num(k.sin_a),
                s.num(k.mu)
            ),
            format!(
                "r0 = {},  rc = {},  rs = {}",
                s.point(&k.r0),
                s.point(&k.rc),
                s.point(&k.rs)
            ),
        ],
    );
}

/// Joint 1 by subproblem 1, the same line for every general page.
const JOINT_1_LINE: &str =
    "θ1 = atan2(h1 · ((w − f1)⊥h1 × u), (w − f1)⊥h1 · u)     (the reference on axis 1)";

fn general_meeting(out: &mut String, k: &GeneralConstants, s: &Show) {
    let _ = writeln!(out, "### 4.2 Joint 3: axes 1 and 2 meet\n");
    let _ = writeln!(
        out,
        "Axes 1 and 2 meet at `f1`; `n = h1 × h2 / sin α`, `ℓ = h2 × n`. Joint 3 moves the \
         wrist center to `r(θ3) = E3(θ3) c − f1 = r0 + cos θ3 rc + sin θ3 rs`. Joints 1 and 2 \
         turn about lines through `f1`, so they keep the distance from it (Paden–Kahan \
         subproblem 3): one equation in joint 3 alone, 0–2 roots.\n"
    );
    block(
        out,
        &[
            "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u".into(),
            "|r(θ3)|² = K0 + K1 cos θ3 + K2 sin θ3 = ρ,  K0 = |r0|² + |rc|²,  K1 = 2 r0·rc,  \
             K2 = 2 r0·rs"
                .into(),
            "K1 cos θ3 + K2 sin θ3 = e := ρ − K0:  cos θ3 = (K1 e ∓ K2 k)/R²,  \
             sin θ3 = (K2 e ± K1 k)/R²,  R² = K1² + K2²,  k = √max(R² − e², 0)"
                .into(),
        ],
    );
    general_constants(out, k, s);
    let kk = [
        num::dot(&k.r0, &k.r0) + num::dot(&k.rc, &k.rc),
        2.0 * num::dot(&k.r0, &k.rc),
        2.0 * num::dot(&k.r0, &k.rs),
    ];
    block(
        out,
        &[format!(
            "K0 = {},  K1 = {},  K2 = {}",
            s.area(kk[0]),
            s.area(kk[1]),
            s.area(kk[2])
        )],
    );
    let _ = writeln!(
        out,
        "### 4.3 Joints 2 and 1: Paden–Kahan subproblems 2 and 1\n"
    );
    block(
        out,
        &[
            "Z = h2 · r,  α' = (cos α Z − ζ)/(cos² α − 1),  β' = (cos α ζ − Z)/(cos² α − 1)".into(),
            "γ' = ±√max((|r|² − α'² − β'² − 2 α'β' cos α) / sin² α, 0)".into(),
            "z = α' h1 + β' h2 + γ' (h1 × h2)      (the wrist center between the two turns)".into(),
            "θ2 = atan2(h2 · (r⊥h2 × z), r⊥h2 · z)     (turns r onto z about axis 2)".into(),
            "w − f1 = R2 r".into(),
            JOINT_1_LINE.into(),
        ],
    );
}

fn general_parallel(out: &mut String, k: &GeneralConstants, s: &Show) {
    let _ = writeln!(out, "### 4.2 Joint 3: axes 1 and 2 parallel\n");
    let _ = writeln!(
        out,
        "Axes 1 and 2 are parallel, `a` apart along `n` (from `f1` on axis 1 to `f2` on axis \
         2), `ℓ = h2 × n`. Joint 3 moves the wrist center to `r(θ3) = E3(θ3) c − f2 = r0 + \
         cos θ3 rc + sin θ3 rs`. Joints 1 and 2 keep its height along the axes: one equation \
         in joint 3 alone, 0–2 roots.\n"
    );
    block(
        out,
        &[
            "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u,  h1 = ±h2 (cos α = ±1)".into(),
            "h2 · r(θ3) = cos α ζ:  (h2·rc) cos θ3 + (h2·rs) sin θ3 = e := cos α ζ − h2·r0".into(),
            "cos θ3 = (A e ∓ B k)/R²,  sin θ3 = (B e ± A k)/R²,  A = h2·rc,  B = h2·rs,  \
             R² = A² + B²,  k = √max(R² − e², 0)"
                .into(),
        ],
    );
    general_constants(out, k, s);
    let _ = writeln!(
        out,
        "### 4.3 Joints 2 and 1: the law of cosines, Paden–Kahan subproblem 1\n"
    );
    block(
        out,
        &[
            "X = (ρ − ζ² − a² − |r⊥h2|²) / (2a)     (= n · R2 r)".into(),
            "Y = ±√max(|r⊥h2|² − X², 0)           (= ℓ · R2 r)".into(),
            "θ2 = atan2((n·r) Y − (ℓ·r) X, (n·r) X + (ℓ·r) Y)".into(),
            "w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2".into(),
            JOINT_1_LINE.into(),
        ],
    );
}

fn general_quartic(out: &mut String, k: &GeneralConstants, s: &Show) {
    let _ = writeln!(out, "### 4.2 Joint 3: a quartic\n");
    let _ = writeln!(
        out,
        "`f1` is the foot on axis 1 of the common normal of axes 1 and 2, `a` its length, `n` \
         its direction, `ℓ = h2 × n`, `α` the angle between the axes; joint 3 moves the wrist \
         center to `r(θ3) = E3(θ3) c − f2 = r0 + cos θ3 rc + sin θ3 rs` (from the normal's \
         foot `f2` on axis 2). Joint 1 keeps `ρ = |c_t − f1|²` and `ζ = h1 · (c_t − f1)`; \
         joint 2 keeps `Z = h2 · r` and `|r|`.\n"
    );
    block(
        out,
        &[
            "u = c_t − f1,  ρ = |u|²,  ζ = h1 · u".into(),
            "X = (ρ − a² − |r|²) / (2a)         (= n · R2 r)".into(),
            "Y = (ζ − cos α Z) / sin α          (= m · R2 r,  m = (h1 − cos α h2)/sin α = μ ℓ)"
                .into(),
            "F(θ3) = X² + Y² + Z² − |r|² = k0 + k1 cos θ3 + k2 sin θ3 + k3 cos 2θ3 + k4 sin 2θ3 = 0"
                .into(),
            "t = tan((θ3 − γ)/2):  (1 + t²)² F = a4 t⁴ + a3 t³ + a2 t² + a1 t + a0,  a4 = F(γ + π)"
                .into(),
            "γ ∈ {−π, −2π/3, …, 2π/3}: the one with the largest |F(γ + π)|".into(),
            "roots: Ferrari (resolvent cubic U³ + 2pU² + (p² − 4r)U − q² = 0, its largest root),"
                .into(),
            "       then two Newton steps t ← t − P(t)/P′(t), each kept when it lowers |P|".into(),
        ],
    );
    general_constants(out, k, s);
    let _ = writeln!(out, "### 4.3 Joints 2 and 1: Paden–Kahan subproblem 1\n");
    block(
        out,
        &[
            "θ2 = atan2((n·r) μY − (ℓ·r) X, (n·r) X + (ℓ·r) μY)      (r⊥h2 onto (X, μY))".into(),
            "then one Newton step on (|w − f1|² − ρ, h1·(w − f1) − ζ) in (θ2, θ3), kept when it \
             lowers the miss"
                .into(),
            "w − f1 = (a + n·R2 r) n + (ℓ·R2 r) ℓ + Z h2".into(),
            JOINT_1_LINE.into(),
        ],
    );
}

fn wrist(out: &mut String, family: Family, f: &Facts, s: &Show) {
    let n = match family {
        Family::Elbow | Family::Polar | Family::General => 5,
        Family::Cylindrical => 4,
        Family::Cartesian => 3,
        _ => 5,
    };
    let (h4, h5, h6) = (f.h(4), f.h(5), f.h(6));
    let c45 = num::dot(&h4, &h5);
    let b = num::dot(&h5, &h6);
    let x6 = num::any_perpendicular(&h6);
    let _ = writeln!(out, "### 4.{n} Joints 4–6: the spherical wrist\n");
    let _ = writeln!(
        out,
        "`v` is where the target sends axis 6, seen after joints 1–3. Joints 4 and 5 take \
         `h6` onto `v` (Paden–Kahan 2): the intermediate `z = R5 h6 = R4ᵀ v` keeps its \
         component along `h4` (`h4·z = h4·v`) and along `h5` (`h5·z = h5·h6`), and `|z| = 1`.\n"
    );
    block(
        out,
        &[
            "v  = R456 h6 = (R1 R2 R3)ᵀ rot(G) h6,   a = h4 · v".into(),
            "α  = (a − (h4·h5)(h5·h6)) / (1 − (h4·h5)²)".into(),
            "β  = ((h5·h6) − (h4·h5) a) / (1 − (h4·h5)²)".into(),
            "γ² (1 − (h4·h5)²) = 1 − α² − β² − 2 α β (h4·h5)                  (|z| = 1)".into(),
            "                  = |h4 × v|² − ((h5·h6) − (h4·h5) a)² / (1 − (h4·h5)²)".into(),
            "z  = α h4 + β h5 ± γ (h4 × h5)          (+ leading, − trailing)".into(),
            "θ5 = atan2(h5 · (h6 × z), h6⊥h5 · z)     (Paden–Kahan 1: h6 onto z about h5)".into(),
            "θ4 = atan2(h4 · (z × v), z · v − a²)     (Paden–Kahan 1: z onto v about h4)".into(),
            "y  = R5ᵀ R4ᵀ R456 x6,  θ6 = atan2(h6 · (x6 × y), x6 · y)   (x6 ⟂ h6)".into(),
        ],
    );
    let _ = writeln!(
        out,
        "Real when `γ² ≥ 0` (else the wrist cannot point axis 6 that way). The two forms of \
         `γ²` are equal; the second keeps its digits near the aligned wrist (`v` nearly along \
         `h4`), and §9 names the form the plan evaluates. This arm:\n"
    );
    let mut lines = vec![
        format!(
            "h4 = {},  h5 = {},  h6 = {}",
            s.dir(&h4),
            s.dir(&h5),
            s.dir(&h6)
        ),
        format!(
            "h4·h5 = {},  h5·h6 = {},  h4 × h5 = {}",
            s.num(c45),
            s.num(b),
            s.dir(&num::cross(&h4, &h5))
        ),
        format!("x6 = {}", s.dir(&x6)),
    ];
    if c45.abs() < 1e-12 && b.abs() < 1e-12 {
        lines.push(format!(
            "right-angled wrist: α = a, β = 0, and the trailing branch is (θ4 + 180°, 2 θa − θ5, \
             θ6 + 180°) with θa = {}",
            s.angle(f.aligned_at())
        ));
    }
    block(out, &lines);
}

fn finishing(out: &mut String, plan: &Plan, s: &Show) {
    let _ = writeln!(out, "### Last step: joint values, limits, duplicates\n");
    let _ = writeln!(
        out,
        "Each candidate's model values become joint values `q_i = (θ_i − offset_i) · \
         direction_i` (§1). A revolute value is wrapped by whole turns to within half a \
         turn of the range's center (where the range is wider than one turn, the other \
         values inside it are listed on request, not stored: one solution per branch). Candidates \
         with a joint beyond its limits by more than {} are dropped; two solutions closer \
         than {} in every joint are returned once. With nothing left the solver says why: \
         beyond reach, inside the unreachable region near the shoulder, wrist orientation out \
         of reach, or outside the limits (joint and amount).\n",
        s.per_kind(plan.settings.limit_tolerance),
        s.per_kind(plan.settings.duplicate_tolerance)
    );
}
