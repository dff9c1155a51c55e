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

const POW10: [f64; 7] = [1.0, 10.0, 100.0, 1e3, 1e4, 1e5, 1e6];

/// Append `x` with exactly `decimals` places (at most 6; rounded half away from zero).
///
/// # Example
/// ```
/// let mut b = Vec::new();
/// provenance_core::output::number::push_fixed(&mut b, 2.0 / 3.0, 2);
/// assert_eq!(b, b"0.67");
/// ```
#[inline]
pub fn push_fixed(buf: &mut Vec<u8>, x: f64, decimals: u32) {
    let d = decimals.min(6) as usize;
    // Truncating x·10ᵈ + ½ rounds half away from zero for the non-negative magnitude.
    let scaled = x.abs() * POW10[d] + 0.5;
    if let Some(e) = table_entry(x, d, scaled) {
        push_entry(buf, e);
        return;
    }
    push_general(buf, x, d, scaled);
}

/// Percentages and ratios written with 2 or 4 decimals come from a table.
#[inline]
fn table_entry(x: f64, d: usize, scaled: f64) -> Option<&'static [u8; 8]> {
    if x >= 0.0 && scaled < (SMALL_MAX + 1) as f64 && (d == 2 || d == 4) {
        let t = if d == 2 { &TWO } else { &FOUR };
        Some(&t[scaled as usize])
    } else {
        None
    }
}

/// Whole numbers of points up to [`SMALL_MAX`] come from a table.
#[inline]
fn whole_entry(n: f64) -> Option<&'static [u8; 8]> {
    (n >= 0.0 && n <= SMALL_MAX as f64 && (n as usize) as f64 == n).then(|| &WHOLE[n as usize])
}

/// A fixed 8-byte copy (one move) then a truncate beats a variable-length copy; the last byte
/// of each entry holds the text's length.
#[inline]
fn push_entry(buf: &mut Vec<u8>, e: &[u8; 8]) {
    let keep = buf.len() + e[7] as usize;
    buf.extend_from_slice(e);
    buf.truncate(keep);
}

/// The general path of [`push_fixed`]: any magnitude and sign.
#[inline(never)]
fn push_general(buf: &mut Vec<u8>, x: f64, d: usize, scaled: f64) {
    if !scaled.is_finite() || scaled >= 1.8e19 {
        buf.extend_from_slice(format!("{x}").as_bytes());
        return;
    }
    let mut v = scaled as u64;
    let negative = x < 0.0 && v != 0;
    // Digits are written right to left into a stack buffer, two at a time, then copied once.
    let mut tmp = [0u8; 32];
    let mut i = tmp.len();
    let mut written = 0;
    while written + 2 <= d {
        let pair = (v % 100) as usize * 2;
        v /= 100;
        i -= 2;
        tmp[i..i + 2].copy_from_slice(&DIGIT_PAIRS[pair..pair + 2]);
        written += 2;
    }
    if written < d {
        i -= 1;
        tmp[i] = b'0' + (v % 10) as u8;
        v /= 10;
    }
    if d > 0 {
        i -= 1;
        tmp[i] = b'.';
    }
    while v >= 100 {
        let pair = (v % 100) as usize * 2;
        v /= 100;
        i -= 2;
        tmp[i..i + 2].copy_from_slice(&DIGIT_PAIRS[pair..pair + 2]);
    }
    if v >= 10 {
        let pair = v as usize * 2;
        i -= 2;
        tmp[i..i + 2].copy_from_slice(&DIGIT_PAIRS[pair..pair + 2]);
    } else {
        i -= 1;
        tmp[i] = b'0' + v as u8;
    }
    if negative {
        i -= 1;
        tmp[i] = b'-';
    }
    buf.extend_from_slice(&tmp[i..]);
}

/// Largest scaled value served from the tables (100.00 or 1.0000).
const SMALL_MAX: usize = 10_000;

/// Text of `v / 10ᵈ` with `d` decimals for every `v` up to [`SMALL_MAX`], built at compile
/// time: bytes 0..len hold the text, byte 7 its length.
const fn build_table(d: usize) -> [[u8; 8]; SMALL_MAX + 1] {
    let mut t = [[0u8; 8]; SMALL_MAX + 1];
    let scale = match d {
        0 => 1,
        2 => 100,
        _ => 10_000,
    };
    let mut v = 0;
    while v <= SMALL_MAX {
        let (int, mut frac) = (v / scale, v % scale);
        let mut e = [0u8; 8];
        let mut i = 0;
        if int >= 10_000 {
            e[i] = b'0' + (int / 10_000) as u8;
            i += 1;
        }
        if int >= 1000 {
            e[i] = b'0' + (int / 1000 % 10) as u8;
            i += 1;
        }
        if int >= 100 {
            e[i] = b'0' + (int / 100 % 10) as u8;
            i += 1;
        }
        if int >= 10 {
            e[i] = b'0' + (int / 10 % 10) as u8;
            i += 1;
        }
        e[i] = b'0' + (int % 10) as u8;
        i += 1;
        if d > 0 {
            e[i] = b'.';
            i += 1;
        }
        let mut k = d;
        while k > 0 {
            k -= 1;
            e[i + k] = b'0' + (frac % 10) as u8;
            frac /= 10;
        }
        i += d;
        e[7] = i as u8;
        t[v] = e;
        v += 1;
    }
    t
}

static TWO: [[u8; 8]; SMALL_MAX + 1] = build_table(2);
static WHOLE: [[u8; 8]; SMALL_MAX + 1] = build_table(0);
static FOUR: [[u8; 8]; SMALL_MAX + 1] = build_table(4);

const DIGIT_PAIRS: &[u8; 200] = b"\
0001020304050607080910111213141516171819\
2021222324252627282930313233343536373839\
4041424344454647484950515253545556575859\
6061626364656667686970717273747576777879\
8081828384858687888990919293949596979899";

/// Append a number of points: whole numbers without decimals, estimated points with two.
///
/// # Example
/// ```
/// let mut b = Vec::new();
/// provenance_core::output::number::push_points(&mut b, 412.0);
/// assert_eq!(b, b"412");
/// ```
#[inline]
pub fn push_points(buf: &mut Vec<u8>, n: f64) {
    if let Some(e) = whole_entry(n) {
        push_entry(buf, e);
    } else if n.fract() == 0.0 && (0.0..1e18).contains(&n) {
        push_u64(buf, n as u64);
    } else {
        push_fixed(buf, n, PERCENT_DECIMALS);
    }
}

/// Bytes a [`Cells`] writer holds before copying them out.
const CELLS_BYTES: usize = 512;

/// Writes a row's numeric cells into a stack buffer and copies them to the output in a few
/// large pieces: the output vector is touched once per few hundred bytes instead of once per
/// byte. Numbers are written exactly as by [`push_fixed`] and [`push_points`].
///
/// # Example
/// ```
/// use provenance_core::output::number::Cells;
/// let mut out = b"A".to_vec();
/// let mut c = Cells::new(&mut out);
/// c.byte(b',');
/// c.fixed(61.1650485, 2);
/// c.byte(b',');
/// c.points(412.0);
/// c.finish();
/// assert_eq!(out, b"A,61.17,412");
/// ```
pub struct Cells<'a> {
    out: &'a mut Vec<u8>,
    bytes: [u8; CELLS_BYTES],
    len: usize,
}

impl<'a> Cells<'a> {
    /// Start writing after what `out` holds.
    pub fn new(out: &'a mut Vec<u8>) -> Cells<'a> {
        Cells {
            out,
            bytes: [0; CELLS_BYTES],
            len: 0,
        }
    }

    /// Room for one more cell of up to 32 bytes.
    #[inline]
    fn room(&mut self) {
        if self.len + 32 > CELLS_BYTES {
            self.out.extend_from_slice(&self.bytes[..self.len]);
            self.len = 0;
        }
    }

    /// One byte (a delimiter).
    #[inline]
    pub fn byte(&mut self, b: u8) {
        self.room();
        self.bytes[self.len] = b;
        self.len += 1;
    }

    #[inline]
    fn entry(&mut self, e: &[u8; 8]) {
        self.room();
        self.bytes[self.len..self.len + 8].copy_from_slice(e);
        self.len += e[7] as usize;
    }

    /// A number with `decimals` places, as [`push_fixed`].
    #[inline]
    pub fn fixed(&mut self, x: f64, decimals: u32) {
        let d = decimals.min(6) as usize;
        let scaled = x.abs() * POW10[d] + 0.5;
        match table_entry(x, d, scaled) {
            Some(e) => self.entry(e),
            None => self.general(|b| push_fixed(b, x, decimals)),
        }
    }

    /// A number of points, as [`push_points`].
    #[inline]
    pub fn points(&mut self, n: f64) {
        match whole_entry(n) {
            Some(e) => self.entry(e),
            None => self.general(|b| push_points(b, n)),
        }
    }

    #[inline(never)]
    fn general(&mut self, write: impl FnOnce(&mut Vec<u8>)) {
        self.out.extend_from_slice(&self.bytes[..self.len]);
        self.len = 0;
        write(self.out);
    }

    /// Copy out what is held.
    pub fn finish(self) {
        self.out.extend_from_slice(&self.bytes[..self.len]);
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
    fn cells_write_as_the_vector_functions() {
        let values = [
            0.0,
            0.004,
            0.005,
            1.0,
            33.333,
            99.995,
            100.0,
            100.01,
            412.0,
            9999.0,
            10_000.0,
            10_001.0,
            1e7,
            12.5,
            -3.0,
            f64::NAN,
        ];
        let mut direct = Vec::new();
        let mut cells = Vec::new();
        let mut c = Cells::new(&mut cells);
        for _ in 0..40 {
            for &x in &values {
                for d in [0, 2, 4] {
                    push_fixed(&mut direct, x, d);
                    direct.push(b',');
                    c.fixed(x, d);
                    c.byte(b',');
                }
                push_points(&mut direct, x);
                direct.push(b';');
                c.points(x);
                c.byte(b';');
            }
        }
        c.finish();
        assert_eq!(
            String::from_utf8(cells).unwrap(),
            String::from_utf8(direct).unwrap()
        );
    }

    #[test]
    fn whole_numbers_from_the_table_match_std() {
        for v in [0u32, 7, 10, 99, 100, 412, 999, 1000, 9999, 10_000] {
            let mut b = Vec::new();
            push_points(&mut b, f64::from(v));
            assert_eq!(String::from_utf8(b).unwrap(), v.to_string());
        }
    }

    #[test]
    fn table_and_general_paths_agree() {
        for v in (0..=10_000).step_by(7) {
            let x = v as f64 / 100.0 + 0.001;
            let mut general = Vec::new();
            // Negative values take the general path; their magnitude must print the same.
            push_fixed(&mut general, -x, 2);
            assert_eq!(
                fixed(x, 2),
                String::from_utf8(general).unwrap().trim_start_matches('-')
            );
        }
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
        assert_eq!(fixed(100.0, 2), "100.00");
        assert_eq!(fixed(100.004, 2), "100.00");
        assert_eq!(fixed(100.006, 2), "100.01");
        assert_eq!(fixed(1.0, 4), "1.0000");
        assert_eq!(fixed(0.99996, 4), "1.0000");
        assert_eq!(fixed(0.0, 4), "0.0000");
        assert_eq!(fixed(0.123_456, 3), "0.123");
        assert_eq!(fixed(7.0, 0), "7");
        assert_eq!(fixed(1.0 / 3.0, 5), "0.33333");
        assert_eq!(fixed(-0.001, 2), "0.00");
    }
}
