//! A chart axis in display units with round tick steps.

/// An axis from `min` to `max` (display units) with ticks every `step`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Axis {
    /// Upper end, a multiple of `step`.
    pub max: f64,
    /// Lower end, a multiple of `step`.
    pub min: f64,
    /// Distance between ticks: 1, 2, 2.5 or 5 times a power of ten.
    pub step: f64,
}

/// Most ticks an axis gets; a round step is picked so that the count stays at or
/// under this, which keeps tick labels apart on a phone-width chart.
const MAX_TICKS: f64 = 8.0;

impl Axis {
    /// The smallest round-stepped axis that holds `low..=high` with at most
    /// eight steps. An empty or reversed range becomes one step above `low`.
    pub fn covering(low: f64, high: f64) -> Axis {
        let high = if high > low { high } else { low + 1.0 };
        let raw = (high - low) / MAX_TICKS;
        let power = 10f64.powf(raw.log10().floor());
        let step = [1.0, 2.0, 2.5, 5.0, 10.0]
            .iter()
            .map(|m| m * power)
            .find(|s| *s >= raw)
            .unwrap_or(10.0 * power);
        Axis {
            max: (high / step).ceil() * step,
            min: (low / step).floor() * step,
            step,
        }
    }

    /// The tick values from `min` to `max`.
    pub fn ticks(&self) -> Vec<f64> {
        let count = ((self.max - self.min) / self.step).round() as usize;
        (0..=count)
            .map(|i| self.min + self.step * i as f64)
            .collect()
    }

    /// Where `value` sits along the axis, 0 at `min` and 1 at `max`.
    pub fn fraction(&self, value: f64) -> f64 {
        (value - self.min) / (self.max - self.min)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn round_steps() {
        let cases = [
            ((0.0, 132.0), (0.0, 140.0, 20.0)),
            ((0.0, 22.0), (0.0, 25.0, 5.0)),
            ((0.0, 1900.0), (0.0, 2000.0, 250.0)),
            ((0.0, 5.8), (0.0, 6.0, 1.0)),
            ((-12.0, 60.0), (-20.0, 60.0, 10.0)),
        ];
        for ((lo, hi), (min, max, step)) in cases {
            let a = Axis::covering(lo, hi);
            assert_eq!((a.min, a.max, a.step), (min, max, step), "{lo}..{hi}");
            assert!(a.ticks().len() <= 9);
        }
    }

    #[test]
    fn an_empty_range_gets_one_unit() {
        let a = Axis::covering(3.0, 3.0);
        assert!(a.min <= 3.0 && a.max >= 4.0, "{a:?}");
    }

    #[test]
    fn fraction_runs_from_zero_to_one() {
        let a = Axis::covering(0.0, 132.0);
        assert_eq!(a.fraction(0.0), 0.0);
        assert_eq!(a.fraction(140.0), 1.0);
        assert_eq!(a.fraction(70.0), 0.5);
    }
}
