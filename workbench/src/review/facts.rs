//! The constants the sheet's equations use, computed from the plan's view of the arm
//! ([`armforge_compiler::plan::Arm`]: axis points moved to the foot of the perpendicular from the base
//! origin) exactly as the plan builders in `plan/` compute them, so the numbers on the sheet
//! are the numbers in the solver. A test evaluates the sheet's equations with these numbers
//! and compares the joint values with the solver's.

use armforge_compiler::plan::vec3::num;
use armforge_compiler::plan::Arm;

/// Constants of joint 1 for elbow and polar arms (rotate a point into a plane).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct JointOne {
    /// `h1`, `p1`.
    pub h1: [f64; 3],
    /// A point on axis 1.
    pub p1: [f64; 3],
    /// `h2`, `p2`.
    pub h2: [f64; 3],
    /// A point on axis 2.
    pub p2: [f64; 3],
    /// `h2 − (h1·h2) h1`.
    pub alpha: [f64; 3],
    /// `h1 × h2`.
    pub beta: [f64; 3],
    /// `h1 · h2`.
    pub cos12: f64,
    /// `h2 · (c − p1)`.
    pub e0: f64,
}

/// Constants of joints 2 and 3 of an elbow arm.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ElbowConstants {
    /// Upper arm: from axis 2 to axis 3, ⟂ h2.
    pub l: [f64; 3],
    /// Forearm: from axis 3 to the wrist center, ⟂ h2.
    pub v: [f64; 3],
    /// `h2 × V`.
    pub hv: [f64; 3],
    /// `h3 · h2` (±1).
    pub sense: f64,
    /// `φ0 = atan2(L·(h2 × V), L·V)`: joint 3's angle at the stretched arm.
    pub stretched: f64,
}

/// Constants of joints 2 and 3 of a polar arm.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PolarConstants {
    /// `P = (c − p2)⊥h2`.
    pub p: [f64; 3],
    /// The slide direction ⟂ h2, unit.
    pub u3: [f64; 3],
    /// `m = P · u3`.
    pub m: f64,
}

/// Constants of a cylindrical arm.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CylindricalConstants {
    /// The slide eliminated by the height equation (1-based joint number: 2 or 3).
    pub pivot: usize,
    /// The slide solved from the distance (2 or 3).
    pub other: usize,
    /// `h1 · (c − p1)`.
    pub height: f64,
    /// `h1 · u_k` (pivot).
    pub along_k: f64,
    /// `h1 · u_j` (other).
    pub along_j: f64,
    /// `A0`.
    pub a0: [f64; 3],
    /// `A1`.
    pub a1: [f64; 3],
    /// `D`.
    pub d: [f64; 3],
}

/// Everything the sheet measures on the plan's arm.
#[derive(Clone, Debug)]
pub struct Facts {
    /// The plan's arm.
    pub arm: Arm,
}

impl Facts {
    /// Facts of a plan's arm.
    pub fn new(arm: &Arm) -> Facts {
        Facts { arm: arm.clone() }
    }

    /// Axis of joint `n` (1-based).
    pub fn h(&self, n: usize) -> [f64; 3] {
        self.arm.axis(n - 1)
    }

    /// Point of joint `n` (1-based).
    pub fn p(&self, n: usize) -> [f64; 3] {
        self.arm.point(n - 1)
    }

    /// The angle between the lines of axes `i` and `j`, `[0, π/2]`.
    pub fn line_angle(&self, i: usize, j: usize) -> f64 {
        let c = num::dot(&self.h(i), &self.h(j)).abs().min(1.0);
        let s = num::norm(&num::cross(&self.h(i), &self.h(j)));
        s.atan2(c)
    }

    /// The length of the common normal of axes `i` and `j` (distance for parallel axes).
    pub fn gap(&self, i: usize, j: usize) -> f64 {
        let d = num::sub(&self.p(j), &self.p(i));
        let n = num::cross(&self.h(i), &self.h(j));
        let nn = num::norm(&n);
        if nn < 1e-12 {
            num::norm(&num::perpendicular(&d, &self.h(i)))
        } else {
            num::dot(&d, &n).abs() / nn
        }
    }

    /// The distance of `x` from axis `n`.
    pub fn distance_from_axis(&self, n: usize, x: &[f64; 3]) -> f64 {
        num::norm(&num::perpendicular(&num::sub(x, &self.p(n)), &self.h(n)))
    }

    /// `det [u1 u2 u3]` of the first three axes.
    pub fn slide_determinant(&self) -> f64 {
        num::dot(&self.h(1), &num::cross(&self.h(2), &self.h(3)))
    }

    /// The wrist center at zero.
    pub fn c(&self) -> [f64; 3] {
        self.arm.wrist_center
    }

    /// Joint 1 of elbow and polar arms (as `plan::elbow`).
    pub fn joint_one(&self) -> JointOne {
        let (h1, p1, h2, p2) = (self.h(1), self.p(1), self.h(2), self.p(2));
        let cos12 = num::dot(&h1, &h2);
        JointOne {
            h1,
            p1,
            h2,
            p2,
            alpha: num::sub(&h2, &num::scale(&h1, cos12)),
            beta: num::cross(&h1, &h2),
            cos12,
            e0: num::dot(&h2, &num::sub(&self.c(), &p1)),
        }
    }

    /// Joints 2 and 3 of an elbow arm (as `plan::elbow`).
    pub fn elbow(&self) -> ElbowConstants {
        let (h2, p2) = (self.h(2), self.p(2));
        let (h3, p3) = (self.h(3), self.p(3));
        let l = num::perpendicular(&num::sub(&p3, &p2), &h2);
        let v = num::perpendicular(&num::sub(&self.c(), &p3), &h2);
        let hv = num::cross(&h2, &v);
        ElbowConstants {
            l,
            v,
            hv,
            sense: if num::dot(&h3, &h2) >= 0.0 { 1.0 } else { -1.0 },
            stretched: num::dot(&l, &hv).atan2(num::dot(&l, &v)),
        }
    }

    /// Joints 2 and 3 of a polar arm (as `plan::polar`).
    pub fn polar(&self) -> PolarConstants {
        let h2 = self.h(2);
        let u3 = num::unit(&num::perpendicular(&self.h(3), &h2));
        let p = num::perpendicular(&num::sub(&self.c(), &self.p(2)), &h2);
        PolarConstants {
            p,
            u3,
            m: num::dot(&p, &u3),
        }
    }

    /// Joints 1–3 of a cylindrical arm (as `plan::cylindrical`).
    pub fn cylindrical(&self) -> CylindricalConstants {
        let (h1, p1) = (self.h(1), self.p(1));
        let (u2, u3) = (self.h(2), self.h(3));
        let (pivot, other) = if num::dot(&h1, &u2).abs() >= num::dot(&h1, &u3).abs() {
            (2, 3)
        } else {
            (3, 2)
        };
        let (uk, uj) = (self.h(pivot), self.h(other));
        let along_k = num::dot(&h1, &uk);
        let along_j = num::dot(&h1, &uj);
        let ck = num::sub(&self.c(), &p1);
        let height = num::dot(&h1, &ck);
        let uk_perp = num::perpendicular(&uk, &h1);
        let uj_perp = num::perpendicular(&uj, &h1);
        CylindricalConstants {
            pivot,
            other,
            height,
            along_k,
            along_j,
            a0: num::sub(
                &num::perpendicular(&ck, &h1),
                &num::scale(&uk_perp, height / along_k),
            ),
            a1: num::scale(&uk_perp, 1.0 / along_k),
            d: num::sub(&uj_perp, &num::scale(&uk_perp, along_j / along_k)),
        }
    }

    /// `U⁻¹` of a cartesian arm by Cramer's rule (as `plan::cartesian`).
    pub fn cartesian_inverse(&self) -> [[f64; 3]; 3] {
        let (u1, u2, u3) = (self.h(1), self.h(2), self.h(3));
        let det = self.slide_determinant();
        let det = if det.abs() > 1e-300 { det } else { 1.0 };
        [
            num::scale(&num::cross(&u2, &u3), 1.0 / det),
            num::scale(&num::cross(&u3, &u1), 1.0 / det),
            num::scale(&num::cross(&u1, &u2), 1.0 / det),
        ]
    }

    /// The wrist center seen from the tool frame: `c_tool = M_Rᵀ (c − M_t)`.
    pub fn c_tool(&self) -> [f64; 3] {
        armforge_compiler::plan::decouple::wrist_center_in_tool(&self.arm)
    }

    /// The aligned position of joint 5 (model value): `θa = atan2(h5·(h6 × h4), h6·h4)`.
    pub fn aligned_at(&self) -> f64 {
        let (h4, h5, h6) = (self.h(4), self.h(5), self.h(6));
        num::dot(&h5, &num::cross(&h6, &h4)).atan2(num::dot(&h6, &h4))
    }
}
