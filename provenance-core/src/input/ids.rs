//! Remembering sample ids to refuse duplicates.

use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};

/// The ids seen so far, as 64-bit keys with the line of their first use: 16 bytes per sample.
#[derive(Default)]
pub(crate) struct IdRegistry {
    seen: HashMap<u64, u64, BuildHasherDefault<PassThrough>>,
}

impl IdRegistry {
    /// Remember `key` (from [`id_key`]) first used on `line`; if it was used before, keep the
    /// first line and return it.
    pub(crate) fn insert(&mut self, key: u64, line: u64) -> Option<u64> {
        match self.seen.entry(key) {
            std::collections::hash_map::Entry::Occupied(e) => Some(*e.get()),
            std::collections::hash_map::Entry::Vacant(e) => {
                e.insert(line);
                None
            }
        }
    }
}

/// The key under which a trimmed id is remembered: FNV-1a, 64 bits (Fowler, Noll & Vo;
/// public-domain reference parameters). Two different ids share a key with probability about
/// n²/2⁶⁵ (below 10⁻⁸ for a million samples); such a pair would be reported as a duplicate.
pub(crate) fn id_key(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf2_9ce4_8422_2325;
    for b in bytes {
        h ^= u64::from(*b);
        h = h.wrapping_mul(0x0000_0100_0000_01b3);
    }
    h
}

/// The id keys are already hashes: the map uses them as they are.
#[derive(Default)]
struct PassThrough(u64);

impl Hasher for PassThrough {
    fn finish(&self) -> u64 {
        self.0
    }
    fn write(&mut self, bytes: &[u8]) {
        self.0 = id_key(bytes);
    }
    fn write_u64(&mut self, v: u64) {
        self.0 = v;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_first_line_is_kept() {
        let mut r = IdRegistry::default();
        assert_eq!(r.insert(id_key(b"A"), 2), None);
        assert_eq!(r.insert(id_key(b"B"), 3), None);
        assert_eq!(r.insert(id_key(b"A"), 9), Some(2));
        assert_eq!(r.insert(id_key(b"A"), 12), Some(2));
    }

    #[test]
    fn fnv_reference_values() {
        // FNV-1a 64 reference values (Fowler, Noll & Vo test suite): "" and "a".
        assert_eq!(id_key(b""), 0xcbf2_9ce4_8422_2325);
        assert_eq!(id_key(b"a"), 0xaf63_dc4c_8601_ec8c);
    }
}
