//! Viscosity index from the 40 °C and 100 °C viscosities (ASTM D2270 / ISO 2909),
//! and its inverse: the 100 °C viscosity an oil of given grade needs for a given VI.

use super::checks::{finite, positive, result};
use super::constants::CENTISTOKES as CST;
use super::physics_error::{PhysicsError, PhysicsResult};
use super::root::bisect;
use super::viscosity_index_table::INDEX_TABLE;

/// Smallest 100 °C viscosity for which a VI is defined, cSt (ASTM D2270-10(2016)).
const MIN_NU_100_CST: f64 = 2.0;

/// Largest 100 °C viscosity the table covers, cSt; above it the standard's formulas apply.
const TABLE_END_CST: f64 = 70.0;

/// The 40 °C viscosities L (VI 0) and H (VI 100) of the reference oils that share
/// the 100 °C viscosity `nu_100_m2_s` (m²/s), both in m²/s.
///
/// For 2 ≤ Y < 70 cSt, linear interpolation in the standard's table; above,
/// L = 0.8353Y² + 14.67Y − 216 and H = 0.1684Y² + 11.85Y − 97 (Y in cSt).
///
/// Source: ASTM D2270-10(2016), as implemented in `chemicals.viscosity.viscosity_index`
/// (`chemicals` 1.5.2).
pub fn reference_viscosities(nu_100_m2_s: f64) -> PhysicsResult<(f64, f64)> {
    let y = nu_100_cst(nu_100_m2_s)?;
    let (low, high) = if y < TABLE_END_CST {
        (
            interpolate(y, |r| r.low_cst),
            interpolate(y, |r| r.high_cst),
        )
    } else {
        (
            (0.8353 * y + 14.67) * y - 216.0,
            (0.1684 * y + 11.85) * y - 97.0,
        )
    };
    Ok((low * CST, high * CST))
}

/// Viscosity index (unrounded), dimensionless, from `nu_40_m2_s` (U) and `nu_100_m2_s` (Y),
/// both in m²/s.
///
/// VI ≤ 100 (U ≥ H): VI = 100·(L − U)/(L − H). VI > 100: N = (log H − log U)/log Y,
/// VI = (10^N − 1)/0.00715 + 100. Not defined for Y < 2 cSt.
///
/// Source: ASTM D2270-10(2016) via `chemicals` 1.5.2 (`chemicals.viscosity.viscosity_index`).
pub fn viscosity_index(nu_40_m2_s: f64, nu_100_m2_s: f64) -> PhysicsResult<f64> {
    let u = positive("viscosity at 40 °C", nu_40_m2_s, "m²/s")? / CST;
    let y = nu_100_cst(nu_100_m2_s)?;
    let (low, high) = reference_viscosities(nu_100_m2_s)?;
    let (low, high) = (low / CST, high / CST);
    let vi = if u > high {
        100.0 * (low - u) / (low - high)
    } else {
        let n = (high / u).ln() / y.ln();
        (10f64.powf(n) - 1.0) / 0.00715 + 100.0
    };
    result("viscosity index", vi)
}

/// Viscosity index rounded to a whole number as the standard reports it
/// (halves to the even number).
///
/// Source: ASTM D2270-10(2016) via `chemicals` 1.5.2 (`viscosity_index(..., rounding=True)`).
pub fn reported_viscosity_index(nu_40_m2_s: f64, nu_100_m2_s: f64) -> PhysicsResult<f64> {
    Ok(viscosity_index(nu_40_m2_s, nu_100_m2_s)?.round_ties_even())
}

/// The 100 °C viscosity, in m²/s, that gives an oil with 40 °C viscosity `nu_40_m2_s`
/// (m²/s; e.g. an ISO VG mid-point) the viscosity index `index`, found by root finding
/// over 2 cSt ≤ ν₁₀₀ < ν₄₀.
///
/// Source: derived (`chemicals` + `scipy`): ASTM D2270-10(2016) solved for ν₁₀₀
/// (the reference used `scipy.optimize.brentq`; bisection here).
pub fn nu_100_for_index(nu_40_m2_s: f64, index: f64) -> PhysicsResult<f64> {
    let nu_40 = positive("viscosity at 40 °C", nu_40_m2_s, "m²/s")?;
    let target = finite("viscosity index", index)?;
    let low = MIN_NU_100_CST * CST;
    let gap = |nu_100: f64| viscosity_index(nu_40, nu_100).map_or(f64::NAN, |vi| vi - target);
    bisect(gap, low, nu_40).ok_or(PhysicsError::NoSolution {
        name: "viscosity at 100 °C",
        low,
        high: nu_40,
        unit: "m²/s",
    })
}

/// The 100 °C viscosity in cSt, checked to be at least 2 cSt.
fn nu_100_cst(nu_100_m2_s: f64) -> PhysicsResult<f64> {
    let y = finite("viscosity at 100 °C", nu_100_m2_s)? / CST;
    if y < MIN_NU_100_CST {
        return Err(PhysicsError::TooSmall {
            name: "viscosity at 100 °C",
            value: nu_100_m2_s,
            min: MIN_NU_100_CST * CST,
            unit: "m²/s",
        });
    }
    Ok(y)
}

/// Linear interpolation in the table at `y` cSt (2 ≤ y < 70) of the column `column`.
fn interpolate(
    y: f64,
    column: impl Fn(&super::viscosity_index_table::IndexTableRow) -> f64,
) -> f64 {
    let upper = INDEX_TABLE
        .iter()
        .position(|r| r.nu_100_cst > y)
        .unwrap_or(INDEX_TABLE.len() - 1)
        .max(1);
    let (a, b) = (&INDEX_TABLE[upper - 1], &INDEX_TABLE[upper]);
    let fraction = (y - a.nu_100_cst) / (b.nu_100_cst - a.nu_100_cst);
    column(a) + fraction * (column(b) - column(a))
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::testing::*;
    use crate::physics::viscosity::WaltherLine;
    use crate::physics::viscosity_grade::viscosity_grade;

    #[test]
    fn library_docstring_example() {
        // ASTM D2270 via `chemicals` 1.5.2: U 73.3, Y 8.86 → 92
        assert_eq!(
            reported_viscosity_index(73.3 * CST, 8.86 * CST).unwrap(),
            92.0
        );
        // ASTM D2270 via `chemicals` 1.5.2: L = 119.94, H = 69.48 interpolated; VI 92.43
        let (l, h) = reference_viscosities(8.86 * CST).unwrap();
        assert_printed(l / CST, 119.94, 2);
        assert_printed(h / CST, 69.48, 2);
        assert_printed(viscosity_index(73.3 * CST, 8.86 * CST).unwrap(), 92.43, 2);
    }

    #[test]
    fn vg46_with_6_8_cst() {
        // ASTM D2270 via `chemicals` 1.5.2: 101.6 (rounded 102)
        assert_printed(viscosity_index(46.0 * CST, 6.8 * CST).unwrap(), 101.6, 1);
        assert_eq!(
            reported_viscosity_index(46.0 * CST, 6.8 * CST).unwrap(),
            102.0
        );
        // ASTM D2270 via `chemicals` 1.5.2: L = 73.48, H = 46.44 (tabulated)
        let (l, h) = reference_viscosities(6.8 * CST).unwrap();
        assert_printed(l / CST, 73.48, 2);
        assert_printed(h / CST, 46.44, 2);
    }

    #[test]
    fn table_spot_values() {
        // ASTM D2270 via `chemicals` 1.5.2
        let rows = [
            (5.0, 40.23, 28.49),
            (5.4, 47.31, 32.37),
            (8.0, 100.0, 59.6),
            (8.7, 116.2, 67.64),
            (11.4, 184.9, 100.2),
        ];
        for (y, l, h) in rows {
            let (low, high) = reference_viscosities(y * CST).unwrap();
            assert_close(low / CST, l, 1e-12);
            assert_close(high / CST, h, 1e-12);
        }
    }

    #[test]
    fn above_the_table() {
        // ASTM D2270-10(2016): above 70 cSt, L = 0.8353Y² + 14.67Y − 216, H = 0.1684Y² + 11.85Y − 97
        let (l, h) = reference_viscosities(80.0 * CST).unwrap();
        assert_close(l / CST, 0.8353 * 6400.0 + 14.67 * 80.0 - 216.0, 1e-12);
        assert_close(h / CST, 0.1684 * 6400.0 + 11.85 * 80.0 - 97.0, 1e-12);
    }

    #[test]
    fn below_two_cst_is_undefined() {
        let err = viscosity_index(5.0 * CST, 1.9 * CST).unwrap_err();
        assert!(matches!(err, PhysicsError::TooSmall { .. }), "{err}");
        assert!(viscosity_index(f64::NAN, 6.8 * CST).is_err());
    }

    #[test]
    fn nu_100_of_vg46_at_vi_100() {
        let nu40 = viscosity_grade(46).unwrap().mid_m2_s;
        // derived (`chemicals` + `scipy`): 6.760 cSt
        assert_printed(nu_100_for_index(nu40, 100.0).unwrap() / CST, 6.760, 3);
    }

    #[test]
    fn vi_100_oils_table() {
        // derived, not a published table: ν₁₀₀ for VI = 100, then D341 at 20/50/60/80 °C
        // (grade, ν₁₀₀ cSt, its decimals, [(°C, ν cSt, decimals)])
        type Row = (u32, f64, i32, [(f64, f64, i32); 4]);
        let rows: [Row; 7] = [
            (
                10,
                2.659,
                3,
                [
                    (20.0, 20.4, 1),
                    (50.0, 7.5, 1),
                    (60.0, 5.79, 2),
                    (80.0, 3.76, 2),
                ],
            ),
            (
                15,
                3.410,
                3,
                [
                    (20.0, 33.8, 1),
                    (50.0, 10.8, 1),
                    (60.0, 8.11, 2),
                    (80.0, 5.01, 2),
                ],
            ),
            (
                22,
                4.294,
                3,
                [
                    (20.0, 54.4, 1),
                    (50.0, 15.3, 1),
                    (60.0, 11.12, 2),
                    (80.0, 6.55, 2),
                ],
            ),
            (
                32,
                5.362,
                3,
                [
                    (20.0, 86.8, 1),
                    (50.0, 21.5, 1),
                    (60.0, 15.13, 2),
                    (80.0, 8.48, 2),
                ],
            ),
            (
                46,
                6.760,
                3,
                [
                    (20.0, 134.5, 1),
                    (50.0, 29.9, 1),
                    (60.0, 20.56, 2),
                    (80.0, 11.05, 2),
                ],
            ),
            (
                68,
                8.731,
                3,
                [
                    (20.0, 214.1, 1),
                    (50.0, 42.9, 1),
                    (60.0, 28.71, 2),
                    (80.0, 14.77, 2),
                ],
            ),
            (
                100,
                11.384,
                3,
                [
                    (20.0, 334.7, 1),
                    (50.0, 61.5, 1),
                    (60.0, 40.19, 2),
                    (80.0, 19.87, 2),
                ],
            ),
        ];
        for (grade, nu100, decimals, temperatures) in rows {
            let nu40 = viscosity_grade(grade).unwrap().mid_m2_s;
            let y = nu_100_for_index(nu40, 100.0).unwrap();
            assert_printed(y / CST, nu100, decimals);
            let line = WaltherLine::through(313.15, nu40, 373.15, y).unwrap();
            for (t, nu, d) in temperatures {
                assert_printed(line.viscosity_at(t + 273.15).unwrap() / CST, nu, d);
            }
        }
    }

    #[test]
    fn published_typical_values_are_not_all_vi_100() {
        // computed: VG 32 ≈ 5.5 → VI ≈ 108, VG 46 ≈ 6.5 → 88, VG 68 ≈ 8.5 → 94, VG 100 ≈ 11.4 → 100
        for (nu40, nu100, vi) in [
            (32.0, 5.5, 108.0),
            (46.0, 6.5, 88.0),
            (68.0, 8.5, 94.0),
            (100.0, 11.4, 100.0),
        ] {
            assert_printed(viscosity_index(nu40 * CST, nu100 * CST).unwrap(), vi, 0);
        }
    }

    #[test]
    fn operating_limits_of_vi_100_oils() {
        // ASTM D341 applied to the VI-100 oils, roots by bisection: VG 46 reaches 20 cSt at ≈ 60.8 °C
        let rows = [
            (32, [51.9, 59.0, 72.6]),
            (46, [60.8, 68.2, 82.5]),
            (68, [70.3, 78.0, 93.1]),
        ];
        // 80 SUS and 60 SUS converted exactly per ASTM D2161 via `chemicals` 1.5.2: 15.66 and 10.33 cSt
        let limits = [20.0, 15.66, 10.33];
        for (grade, temperatures) in rows {
            let nu40 = viscosity_grade(grade).unwrap().mid_m2_s;
            let line =
                WaltherLine::through(313.15, nu40, 373.15, nu_100_for_index(nu40, 100.0).unwrap())
                    .unwrap();
            for (nu, t) in limits.iter().zip(temperatures) {
                assert_printed(line.temperature_at(nu * CST).unwrap() - 273.15, t, 1);
            }
        }
    }

    #[test]
    fn no_solution_is_an_error() {
        // VG 2 cannot reach VI 100 with ν₁₀₀ ≥ 2 cSt
        let nu40 = viscosity_grade(2).unwrap().mid_m2_s;
        assert!(matches!(
            nu_100_for_index(nu40, 100.0),
            Err(PhysicsError::NoSolution { .. })
        ));
    }

    proptest! {
        #[test]
        fn thicker_at_100_means_higher_index(nu40 in 10.0f64..400.0, share in 0.05f64..0.3, step in 0.01f64..0.5) {
            let y = (nu40 * share).max(2.0);
            let a = viscosity_index(nu40 * CST, y * CST).unwrap();
            let b = viscosity_index(nu40 * CST, (y + step) * CST).unwrap();
            prop_assert!(b >= a, "{nu40} {y}: {a} then {b}");
        }

        #[test]
        fn root_reproduces_the_index(grade in prop::sample::select(vec![10u32, 15, 22, 32, 46, 68, 100, 150, 220]), vi in 60.0f64..160.0) {
            let nu40 = viscosity_grade(grade).unwrap().mid_m2_s;
            let y = nu_100_for_index(nu40, vi).unwrap();
            prop_assert!((viscosity_index(nu40, y).unwrap() - vi).abs() < 1e-6);
        }
    }
}
