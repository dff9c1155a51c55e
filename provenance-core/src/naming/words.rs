//! Numbers in rule texts: short, but never rounded onto a threshold they do not reach.

/// `value` with `decimals` places, or more when that rounding would show a threshold the
/// value does not equal (94.996 is written 94.996, not 95.0, beside "below 95%").
pub(crate) fn shown(value: f64, decimals: usize, thresholds: &[f64]) -> String {
    let mut d = decimals;
    loop {
        let s = format!("{value:.d$}");
        // Only a threshold within one unit of the last place can print the same.
        let unit = 10f64.powi(-(d as i32));
        let collides = thresholds
            .iter()
            .any(|t| *t != value && (t - value).abs() <= unit && format!("{t:.d$}") == s);
        if !collides || d >= 9 {
            return s;
        }
        d += 1;
    }
}

/// A percentage for rule texts: one decimal and a percent sign.
pub(crate) fn pct(value: f64, thresholds: &[f64]) -> String {
    format!("{}%", shown(value, 1, thresholds))
}

/// A ratio for rule texts: two decimals.
pub(crate) fn ratio(value: f64, thresholds: &[f64]) -> String {
    shown(value, 2, thresholds)
}

/// `part` as percent of `whole`, 0 when `whole` is 0.
pub(crate) fn share(part: f64, whole: f64) -> f64 {
    if whole > 0.0 {
        100.0 * part / whole
    } else {
        0.0
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rounding_never_lands_on_a_threshold_not_reached() {
        assert_eq!(pct(94.996, &[95.0]), "94.996%");
        assert_eq!(pct(95.04, &[95.0]), "95.04%");
        assert_eq!(pct(94.94, &[95.0]), "94.9%");
        assert_eq!(pct(95.0, &[95.0]), "95.0%");
        assert_eq!(pct(62.35, &[95.0, 75.0]), "62.4%");
        assert_eq!(ratio(1.0 / 3.0 - 1e-6, &[1.0 / 3.0]), "0.333332");
        assert_eq!(ratio(1.0 / 3.0, &[1.0 / 3.0]), "0.33");
    }
}
