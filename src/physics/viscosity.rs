//! Kinematic viscosity against temperature: the ASTM D341 (Walther/MacCoull) line,
//! fitted through two points, evaluated at a temperature and inverted; and the
//! link between kinematic and dynamic viscosity.
//!
//! Internally the D341 relation works in cSt (mm²/s) and kelvin, as the standard
//! writes it; the public functions take and return m²/s and K.

use super::checks::{finite, inconsistent, positive, result};
use super::constants::CENTISTOKES as CST;
use super::physics_error::{PhysicsError, PhysicsResult};

/// A viscosity–temperature line of ASTM D341: log₁₀ log₁₀ Z = A − B·log₁₀ T,
/// T in kelvin, Z = ν + 0.7 + exp(−1.47 − 1.84ν − 0.51ν²) with ν in cSt.
///
/// Source: ASTM D341-09(2015) and ASTM D341-20.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct WaltherLine {
    a: f64,
    b: f64,
}

impl WaltherLine {
    /// The line with constants `a` and `b` (log₁₀, T in K, ν in cSt).
    ///
    /// `b` must be positive: viscosity falls as temperature rises.
    ///
    /// Source: ASTM D341-09(2015).
    pub fn new(a: f64, b: f64) -> PhysicsResult<Self> {
        let a = finite("constant A", a)?;
        let b = positive("constant B", b, "")?;
        Ok(Self { a, b })
    }

    /// The line through two measured points: viscosity `nu1_m2_s` (m²/s) at `t1_k` (K)
    /// and `nu2_m2_s` at `t2_k`. `B = [loglog Z₁ − loglog Z₂]/[log T₂ − log T₁]`,
    /// A = loglog Z₁ + B·log T₁.
    ///
    /// Source: ASTM D341-09(2015) (two-point fit).
    pub fn through(t1_k: f64, nu1_m2_s: f64, t2_k: f64, nu2_m2_s: f64) -> PhysicsResult<Self> {
        let t1 = positive("first temperature", t1_k, "K")?;
        let t2 = positive("second temperature", t2_k, "K")?;
        let w1 = walther(positive("first viscosity", nu1_m2_s, "m²/s")? / CST)?;
        let w2 = walther(positive("second viscosity", nu2_m2_s, "m²/s")? / CST)?;
        if t1 == t2 {
            return Err(inconsistent("the two temperatures must differ"));
        }
        let b = (w1 - w2) / (t2.log10() - t1.log10());
        if b.is_nan() || b <= 0.0 {
            return Err(inconsistent(
                "viscosity must fall as temperature rises between the two points",
            ));
        }
        Self::new(
            result("constant A", w1 + b * t1.log10())?,
            result("constant B", b)?,
        )
    }

    /// Constant A (log₁₀, T in K, ν in cSt).
    pub fn a(&self) -> f64 {
        self.a
    }

    /// Constant B (log₁₀, T in K, ν in cSt).
    pub fn b(&self) -> f64 {
        self.b
    }

    /// Kinematic viscosity at `temperature_k` (K), in m²/s, from Z = 10^10^(A − B·log T)
    /// and the D341 inverse ν = (Z − 0.7) − exp(−0.7487 − 3.295(Z−0.7) + 0.6119(Z−0.7)²
    /// − 0.3193(Z−0.7)³).
    ///
    /// Source: ASTM D341-09(2015).
    pub fn viscosity_at(&self, temperature_k: f64) -> PhysicsResult<f64> {
        let t = positive("temperature", temperature_k, "K")?;
        let z = 10f64.powf(10f64.powf(self.a - self.b * t.log10()));
        let nu = result("viscosity", viscosity_from_z(z))?;
        if nu <= 0.0 {
            return Err(PhysicsError::ResultNotFinite { name: "viscosity" });
        }
        Ok(nu * CST)
    }

    /// Temperature, in K, at which the oil has viscosity `nu_m2_s` (m²/s):
    /// log T = (A − loglog Z)/B.
    ///
    /// Source: ASTM D341-09(2015) (the line solved for T).
    pub fn temperature_at(&self, nu_m2_s: f64) -> PhysicsResult<f64> {
        let w = walther(positive("viscosity", nu_m2_s, "m²/s")? / CST)?;
        result("temperature", 10f64.powf((self.a - w) / self.b))
    }
}

/// Z of ASTM D341-09: Z = ν + 0.7 + exp(−1.47 − 1.84ν − 0.51ν²), ν in cSt.
fn z_from_viscosity(nu_cst: f64) -> f64 {
    nu_cst + 0.7 + (-1.47 - 1.84 * nu_cst - 0.51 * nu_cst * nu_cst).exp()
}

/// The D341-09 inverse: ν (cSt) from Z.
fn viscosity_from_z(z: f64) -> f64 {
    let y = z - 0.7;
    y - (-0.7487 - 3.295 * y + 0.6119 * y * y - 0.3193 * y * y * y).exp()
}

/// log₁₀ log₁₀ Z for a viscosity in cSt, where defined (Z > 1).
fn walther(nu_cst: f64) -> PhysicsResult<f64> {
    let z = z_from_viscosity(nu_cst);
    if z > 1.0 && z.is_finite() {
        Ok(z.log10().log10())
    } else {
        Err(PhysicsError::ResultNotFinite { name: "log log Z" })
    }
}

/// Dynamic viscosity, in Pa·s: μ = ν·ρ, with `nu_m2_s` (m²/s) and `density_kg_m3` (kg/m³).
///
/// Source: NIST SP 811 B.8 (centipoise, centistokes); cross-checked with
/// `fluids.core.nu_mu_converter` (`fluids` 1.3.1).
pub fn dynamic_viscosity(nu_m2_s: f64, density_kg_m3: f64) -> PhysicsResult<f64> {
    let nu = positive("kinematic viscosity", nu_m2_s, "m²/s")?;
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    result("dynamic viscosity", nu * rho)
}

/// Kinematic viscosity, in m²/s: ν = μ/ρ, with `mu_pa_s` (Pa·s) and `density_kg_m3` (kg/m³).
///
/// Source: NIST SP 811 B.8 (centipoise, centistokes); `fluids.core.nu_mu_converter`.
pub fn kinematic_viscosity(mu_pa_s: f64, density_kg_m3: f64) -> PhysicsResult<f64> {
    let mu = positive("dynamic viscosity", mu_pa_s, "Pa·s")?;
    let rho = positive("density", density_kg_m3, "kg/m³")?;
    result("kinematic viscosity", mu / rho)
}

#[cfg(test)]
mod tests {
    use proptest::prelude::*;

    use super::*;
    use crate::physics::testing::*;

    fn celsius(t: f64) -> f64 {
        t + 273.15
    }

    fn vg46() -> WaltherLine {
        WaltherLine::through(celsius(40.0), 46.0 * CST, celsius(100.0), 6.8 * CST).unwrap()
    }

    #[test]
    fn vg46_constants_and_sixty_degrees() {
        let line = vg46();
        // ASTM D341: A 9.41799, B 3.68444, 20.62 cSt at 60 °C
        assert_close(line.a(), 9.41799, 1e-5);
        assert_close(line.b(), 3.68444, 1e-5);
        assert_printed(line.viscosity_at(celsius(60.0)).unwrap() / CST, 20.62, 2);
    }

    #[test]
    fn vg46_table() {
        let line = vg46();
        // ASTM D341-09(2015) and ASTM D341-20
        let rows = [
            (0.0, 577.3, 1),
            (20.0, 133.8, 1),
            (25.0, 99.36, 2),
            (40.0, 46.00, 2),
            (50.0, 29.97, 2),
            (60.0, 20.62, 2),
            (65.0, 17.41, 2),
            (70.0, 14.85, 2),
            (80.0, 11.10, 2),
            (82.0, 10.52, 2),
            (100.0, 6.80, 2),
        ];
        for (t, nu, decimals) in rows {
            assert_printed(line.viscosity_at(celsius(t)).unwrap() / CST, nu, decimals);
        }
    }

    #[test]
    fn d341_with_t_plus_273() {
        let line = WaltherLine::through(313.0, 32.0 * CST, 373.0, 5.4 * CST).unwrap();
        // ASTM D341: A 9.5259, B 3.7449, 8.533 cSt at 80 °C
        assert_printed(line.a(), 9.5259, 4);
        assert_printed(line.b(), 3.7449, 4);
        assert_printed(line.viscosity_at(353.0).unwrap() / CST, 8.533, 3);
    }

    #[test]
    fn temperature_for_a_viscosity() {
        let line = vg46();
        // ASTM D341-09(2015) solved for T: 20.62 cSt at 60 °C
        assert_printed(line.temperature_at(20.62 * CST).unwrap() - 273.15, 60.0, 1);
    }

    #[test]
    fn dynamic_viscosity_of_vg46() {
        // fluids.core.nu_mu_converter: ρ 870, ν 46 cSt → 0.04002 Pa·s
        assert_printed(dynamic_viscosity(46.0 * CST, 870.0).unwrap(), 0.04002, 5);
        // Rabie eq. 2.19: ν 46 cSt, ρ 855 → μ 39.33 mPa·s
        assert_printed(
            dynamic_viscosity(46.0 * CST, 855.0).unwrap() * 1e3,
            39.33,
            2,
        );
        assert_close(
            kinematic_viscosity(0.04002, 870.0).unwrap() / CST,
            46.0,
            1e-4,
        );
    }

    #[test]
    fn bad_points_are_errors() {
        let hot_thicker = WaltherLine::through(313.15, 6.8 * CST, 373.15, 46.0 * CST);
        assert!(matches!(
            hot_thicker,
            Err(PhysicsError::Inconsistent { .. })
        ));
        let same = WaltherLine::through(313.15, 46.0 * CST, 313.15, 6.8 * CST);
        assert!(matches!(same, Err(PhysicsError::Inconsistent { .. })));
        assert!(vg46().viscosity_at(f64::NAN).is_err());
        assert!(vg46().viscosity_at(-5.0).is_err());
    }

    proptest! {
        #[test]
        fn hotter_is_thinner(t in 250.0f64..420.0, dt in 0.1f64..50.0) {
            let line = vg46();
            prop_assert!(line.viscosity_at(t + dt).unwrap() < line.viscosity_at(t).unwrap());
        }

        #[test]
        fn temperature_inverts_viscosity(t in 260.0f64..420.0) {
            let line = vg46();
            let nu = line.viscosity_at(t).unwrap();
            let back = line.temperature_at(nu).unwrap();
            // the D341 inverse series is an approximation of Z(ν)⁻¹, good to well under 0.01 K here
            prop_assert!((back - t).abs() < 0.01, "{t} -> {nu} -> {back}");
        }
    }
}
