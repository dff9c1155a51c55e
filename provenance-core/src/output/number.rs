//! Fast fixed-decimal formatting of output numbers.
//!
//! Percentages and standard deviations are written with two decimals (0.01 percentage points,
//! well below any counting error), ratios with four.

/// Decimals for percentages, sd and interval bounds.
pub const PERCENT_DECIMALS: u32 = 2;
/// Decimals for ratios between 0 and 1.
pub const RATIO_DECIMALS: u32 = 4;

/// Round to `decimals` places, as written in every output.
///
/// # Example
/// ```
/// assert_eq!(provenance_core::output::number::round(61.1650485, 2), 61.17);
/// ```
pub fn round(x: f64, decimals: u32) -> f64 {
    let s = 10f64.powi(decimals as i32);
    (x * s).round() / s
}

fn push_u64(buf: &mut Vec<u8>, mut v: u64) {
    let mut tmp = [0u8; 20];
    let mut i = tmp.len();
    loop {
        i -= 1;
        tmp[i] = b'0' + (v % 10) as u8;
        v /= 10;
        if v == 0 {
            break;
        }
    }
    buf.extend_from_slice(&tmp[i..]);
}

/// Append `x` with exactly `decimals` places (rounded half away from zero).
///
/// # Example
/// ```
/// let mut b = Vec::new();
/// provenance_core::output::number::push_fixed(&mut b, 2.0 / 3.0, 2);
/// assert_eq!(b, b"0.67");
/// ```
pub fn push_fixed(buf: &mut Vec<u8>, x: f64, decimals: u32) {
    let scale = 10u64.pow(decimals);
    let scaled = (x.abs() * scale as f64).round();
    if !x.is_finite() || scaled >= 1e18 {
        buf.extend_from_slice(format!("{x}").as_bytes());
        return;
    }
    let v = scaled as u64;
    if x < 0.0 && v != 0 {
        buf.push(b'-');
    }
    push_u64(buf, v / scale);
    if decimals > 0 {
        buf.push(b'.');
        let frac = v % scale;
        let mut digits = [b'0'; 20];
        let mut f = frac;
        for i in (0..decimals as usize).rev() {
            digits[i] = b'0' + (f % 10) as u8;
            f /= 10;
        }
        buf.extend_from_slice(&digits[..decimals as usize]);
    }
}

/// Append a number of points: whole numbers without decimals, estimated points with two.
///
/// # Example
/// ```
/// let mut b = Vec::new();
/// provenance_core::output::number::push_points(&mut b, 412.0);
/// assert_eq!(b, b"412");
/// ```
pub fn push_points(buf: &mut Vec<u8>, n: f64) {
    if n.fract() == 0.0 && (0.0..1e18).contains(&n) {
        push_u64(buf, n as u64);
    } else {
        push_fixed(buf, n, PERCENT_DECIMALS);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn fixed(x: f64, d: u32) -> String {
        let mut b = Vec::new();
        push_fixed(&mut b, x, d);
        String::from_utf8(b).unwrap()
    }

    #[test]
    fn fixed_matches_std_formatting_away_from_ties() {
        for x in [
            0.0, 0.004, 0.006, 1.0, 9.995_1, 12.345_678, 99.999, 100.0, 1234.5,
        ] {
            assert_eq!(fixed(x, 2), format!("{x:.2}"), "{x}");
            assert_eq!(fixed(-x, 2).trim_start_matches('-'), format!("{x:.2}"));
        }
        assert_eq!(fixed(0.123_456, 4), "0.1235");
        assert_eq!(fixed(-0.001, 2), "0.00");
    }
}
