//! ISO 3448 viscosity grades: the 40 °C kinematic-viscosity band of each grade.

use super::checks::positive;
use super::constants::CENTISTOKES as CST;
use super::physics_error::{PhysicsError, PhysicsResult};

/// One ISO viscosity grade: its mid-point and ±10 % limits at 40 °C, in m²/s.
///
/// Source: ISO 3448:1992, Table 1.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ViscosityGrade {
    /// The grade number, e.g. 46 for ISO VG 46.
    pub grade: u32,
    /// Upper limit of kinematic viscosity at 40 °C, m²/s.
    pub max_m2_s: f64,
    /// Mid-point (nominal) kinematic viscosity at 40 °C, m²/s.
    pub mid_m2_s: f64,
    /// Lower limit of kinematic viscosity at 40 °C, m²/s.
    pub min_m2_s: f64,
}

const fn grade(grade: u32, min_cst: f64, mid_cst: f64, max_cst: f64) -> ViscosityGrade {
    ViscosityGrade {
        grade,
        max_m2_s: max_cst * CST,
        mid_m2_s: mid_cst * CST,
        min_m2_s: min_cst * CST,
    }
}

/// The ISO 3448 grades, ascending. Mid-points of VG 2, 3, 5 and 7 are 2.2, 3.2, 4.6
/// and 6.8 cSt, not the grade number.
///
/// Source: ISO 3448:1992, Table 1.
#[rustfmt::skip]
pub const ISO_VISCOSITY_GRADES: [ViscosityGrade; 18] = [
    grade(2, 1.98, 2.2, 2.42),
    grade(3, 2.88, 3.2, 3.52),
    grade(5, 4.14, 4.6, 5.06),
    grade(7, 6.12, 6.8, 7.48),
    grade(10, 9.00, 10.0, 11.0),
    grade(15, 13.5, 15.0, 16.5),
    grade(22, 19.8, 22.0, 24.2),
    grade(32, 28.8, 32.0, 35.2),
    grade(46, 41.4, 46.0, 50.6),
    grade(68, 61.2, 68.0, 74.8),
    grade(100, 90.0, 100.0, 110.0),
    grade(150, 135.0, 150.0, 165.0),
    grade(220, 198.0, 220.0, 242.0),
    grade(320, 288.0, 320.0, 352.0),
    grade(460, 414.0, 460.0, 506.0),
    grade(680, 612.0, 680.0, 748.0),
    grade(1000, 900.0, 1000.0, 1100.0),
    grade(1500, 1350.0, 1500.0, 1650.0),
];

/// The ISO 3448 grade with number `number`, or an error naming the grades that exist.
///
/// Source: ISO 3448:1992, Table 1.
pub fn viscosity_grade(number: u32) -> PhysicsResult<ViscosityGrade> {
    ISO_VISCOSITY_GRADES
        .iter()
        .copied()
        .find(|g| g.grade == number)
        .ok_or(PhysicsError::UnknownGrade { grade: number })
}

/// The grade whose band contains the 40 °C viscosity `nu_40_m2_s` (m²/s), if any
/// (the bands do not touch, so a value between two bands belongs to none).
///
/// Source: ISO 3448:1992, Table 1.
pub fn grade_of_viscosity(nu_40_m2_s: f64) -> PhysicsResult<Option<ViscosityGrade>> {
    let nu = positive("viscosity at 40 °C", nu_40_m2_s, "m²/s")?;
    Ok(ISO_VISCOSITY_GRADES
        .iter()
        .copied()
        .find(|g| (g.min_m2_s..=g.max_m2_s).contains(&nu)))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::physics::testing::assert_close;

    #[test]
    fn limits_are_ten_percent_of_the_mid_point() {
        for g in ISO_VISCOSITY_GRADES {
            // ISO 3448:1992, Table 1: limits are mid-point ±10 %
            assert_close(g.min_m2_s, 0.9 * g.mid_m2_s, 1e-9);
            assert_close(g.max_m2_s, 1.1 * g.mid_m2_s, 1e-9);
        }
    }

    #[test]
    fn grade_lookup() {
        // ISO 3448:1992, Table 1
        assert_close(viscosity_grade(46).unwrap().mid_m2_s, 46e-6, 1e-12);
        assert_close(viscosity_grade(7).unwrap().mid_m2_s, 6.8e-6, 1e-12);
        assert_eq!(
            viscosity_grade(47),
            Err(PhysicsError::UnknownGrade { grade: 47 })
        );
        assert_eq!(
            grade_of_viscosity(44e-6).unwrap().map(|g| g.grade),
            Some(46)
        );
        assert_eq!(grade_of_viscosity(38e-6).unwrap(), None);
        assert!(grade_of_viscosity(-1.0).is_err());
    }
}
