//! Synthetic count tables for benchmarks and stress tests (never for interpretation).
//!
//! The rows are random framework counts from a fixed-seed generator, so every run of a
//! benchmark reads the same bytes.

use std::io::Write;

/// A small fixed-seed generator (SplitMix64; Steele, Lea & Flood 2014), enough for test data.
#[derive(Debug, Clone)]
pub struct SplitMix64(u64);

impl SplitMix64 {
    /// A generator from a seed.
    pub fn new(seed: u64) -> Self {
        SplitMix64(seed)
    }

    /// The next 64 random bits.
    ///
    /// # Example
    /// ```
    /// let mut a = provenance_core::synthetic::SplitMix64::new(7);
    /// let mut b = provenance_core::synthetic::SplitMix64::new(7);
    /// assert_eq!(a.next_u64(), b.next_u64());
    /// ```
    pub fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// A whole number in `0..bound`.
    pub fn below(&mut self, bound: u32) -> u32 {
        (((self.next_u64() >> 32) * u64::from(bound)) >> 32) as u32
    }
}

/// Write a synthetic count table of `rows` samples (with a `formation` and a `height_m`
/// metadata column) into `out`.
///
/// # Example
/// ```
/// let mut buf = Vec::new();
/// provenance_core::synthetic::write_table(&mut buf, 3, 1).unwrap();
/// let text = String::from_utf8(buf).unwrap();
/// assert_eq!(text.lines().count(), 4);
/// assert!(text.starts_with("sample,formation,height_m,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix\n"));
/// ```
pub fn write_table<W: Write>(out: &mut W, rows: usize, seed: u64) -> std::io::Result<()> {
    let mut rng = SplitMix64::new(seed);
    let mut w = std::io::BufWriter::new(out);
    writeln!(w, "sample,formation,height_m,Qm,Qp,C,P,K,Lv,Ls,Lm,matrix")?;
    for i in 0..rows {
        let f = ["Lower", "Middle", "Upper"][i * 3 / rows.max(1)];
        write!(w, "S{i:07},{f},{}.{}", i / 10, i % 10)?;
        for bound in [220, 25, 20, 90, 50, 80, 40, 30, 60] {
            write!(w, ",{}", rng.below(bound))?;
        }
        writeln!(w)?;
    }
    w.flush()
}
