//! Bracketed root finding for the inverse problems (e.g. ν₁₀₀ for a target VI).

/// A root of `f` between `low` and `high` by bisection, or `None` when `f` has the
/// same sign at both ends (no bracket) or is not finite there.
///
/// Bisection is slower than Brent's method (which the reference computations used,
/// `scipy.optimize.brentq`) but cannot fail on a bracketed continuous function; 200
/// halvings reach the resolution of f64 for any finite bracket.
pub(crate) fn bisect(f: impl Fn(f64) -> f64, low: f64, high: f64) -> Option<f64> {
    let (mut lo, mut hi) = (low, high);
    let (mut f_lo, f_hi) = (f(lo), f(hi));
    if !f_lo.is_finite() || !f_hi.is_finite() {
        return None;
    }
    if f_lo == 0.0 {
        return Some(lo);
    }
    if f_hi == 0.0 {
        return Some(hi);
    }
    if f_lo.signum() == f_hi.signum() {
        return None;
    }
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if mid <= lo || mid >= hi {
            break;
        }
        let f_mid = f(mid);
        if !f_mid.is_finite() {
            return None;
        }
        if f_mid == 0.0 {
            return Some(mid);
        }
        if f_mid.signum() == f_lo.signum() {
            lo = mid;
            f_lo = f_mid;
        } else {
            hi = mid;
        }
    }
    Some(0.5 * (lo + hi))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_a_square_root() {
        let root = bisect(|x| x * x - 2.0, 0.0, 2.0).unwrap();
        assert!((root - 2f64.sqrt()).abs() < 1e-15);
    }

    #[test]
    fn no_bracket_no_root() {
        assert_eq!(bisect(|x| x * x + 1.0, -1.0, 1.0), None);
        assert_eq!(bisect(|_| f64::NAN, -1.0, 1.0), None);
    }
}
