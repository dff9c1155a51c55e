//! Remembering sample ids to refuse duplicates, in bounded memory.
//!
//! The ids of the current segment of the table sit in memory: their text, their line and a
//! hash index over them. When a segment reaches its limits it is sorted and written to a
//! temporary file (a run), and memory starts afresh; runs are merged when they pile up. A
//! repeat within a segment is caught as its row arrives. A repeat across segments is found by
//! merging the runs: at the end of the table, and before any other refusal is reported, so
//! that the earliest problem in the table is the one named. Small tables never touch disk.

use super::id_runs::{Record, RunSet};
use hashbrown::HashTable;
use std::io;

/// An id used twice: the id, the line of the repeat and the line of its first use.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) struct Repeat {
    pub id: Vec<u8>,
    pub line: u64,
    pub first: u64,
}

/// When the in-memory segment is written out, and how many runs are merged at once.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Limits {
    /// Ids per segment.
    pub entries: usize,
    /// Bytes of id text per segment.
    pub text_bytes: usize,
    /// Runs of one size merged into one run of the next size.
    pub fan_in: usize,
}

impl Default for Limits {
    /// At most 458,752 ids (7/8 of a 2¹⁹-slot index, the index's own load limit, so it never
    /// grows past that) of 24 bytes plus 5 index bytes each, about 13 MiB, and up to 8 MiB of
    /// their text. A 300,000-sample table stays in memory.
    fn default() -> Limits {
        Limits {
            entries: 458_752,
            text_bytes: 8 << 20,
            fan_in: 16,
        }
    }
}

/// One id of the current segment: its key, line and place in the text buffer.
#[derive(Debug, Clone, Copy)]
struct Entry {
    key: u64,
    line: u64,
    start: u32,
    len: u32,
}

/// The ids seen so far.
pub(crate) struct IdRegistry {
    entries: Vec<Entry>,
    text: Vec<u8>,
    index: HashTable<u32>,
    runs: RunSet,
    limits: Limits,
}

impl Default for IdRegistry {
    fn default() -> IdRegistry {
        #[cfg(test)]
        if let Some(limits) = TEST_LIMITS.with(std::cell::Cell::get) {
            return IdRegistry::with_limits(limits);
        }
        IdRegistry::with_limits(Limits::default())
    }
}

#[cfg(test)]
thread_local! {
    /// Small limits for tests of whole tables, so that segments are written out early.
    pub(crate) static TEST_LIMITS: std::cell::Cell<Option<Limits>> = const { std::cell::Cell::new(None) };
}

impl IdRegistry {
    /// A registry spilling to disk past `limits`.
    pub(crate) fn with_limits(limits: Limits) -> IdRegistry {
        IdRegistry {
            entries: Vec::new(),
            text: Vec::new(),
            index: HashTable::new(),
            runs: RunSet::new(limits.fan_in),
            limits,
        }
    }

    /// Remember `id` (with `key` from [`id_key`]) used on `line`, lines coming in increasing
    /// order. Returns the earliest repeat of the table so far when this use is a repeat; the
    /// error is a failure of the temporary files.
    pub(crate) fn insert(&mut self, key: u64, id: &[u8], line: u64) -> io::Result<Option<Repeat>> {
        let (entries, text) = (&self.entries, &self.text);
        let found = self.index.find(key, |&i| {
            let e = &entries[i as usize];
            e.key == key && &text[e.start as usize..(e.start + e.len) as usize] == id
        });
        if let Some(&i) = found {
            let first = self.entries[i as usize].line;
            let here = Repeat {
                id: id.to_vec(),
                line,
                first,
            };
            // A repeat of an id written out earlier may precede this one.
            return Ok(Some(self.repeat_before(line)?.unwrap_or(here)));
        }
        let full = self.entries.len() >= self.limits.entries;
        if full || self.text.len() + id.len() > self.limits.text_bytes {
            self.spill()?;
        }
        let (start, len) = (self.text.len() as u32, id.len() as u32);
        self.text.extend_from_slice(id);
        let i = self.entries.len() as u32;
        self.entries.push(Entry {
            key,
            line,
            start,
            len,
        });
        let entries = &self.entries;
        self.index
            .insert_unique(key, i, |&j| entries[j as usize].key);
        Ok(None)
    }

    /// The earliest repeat whose second use comes before `line`, across everything
    /// remembered. Costs nothing until a segment was written out; then it writes out the
    /// current one too and merges all runs.
    pub(crate) fn repeat_before(&mut self, line: u64) -> io::Result<Option<Repeat>> {
        if self.runs.is_empty() {
            return Ok(None);
        }
        self.spill()?;
        let mut best: Option<Repeat> = None;
        let mut group: Vec<Record> = Vec::new();
        self.runs.scan(|r| {
            if group.first().is_some_and(|g| g.key != r.key) {
                group.clear();
            }
            match group.iter().find(|g| g.id == r.id) {
                // Records of one key come in line order: the first match is the first use.
                Some(first) => {
                    if r.line < line && best.as_ref().is_none_or(|b| r.line < b.line) {
                        best = Some(Repeat {
                            id: r.id.clone(),
                            line: r.line,
                            first: first.line,
                        });
                    }
                }
                None => group.push(r.clone()),
            }
        })?;
        Ok(best)
    }

    /// Sort the current segment and write it out as a run; memory starts afresh.
    fn spill(&mut self) -> io::Result<()> {
        if self.entries.is_empty() {
            return Ok(());
        }
        self.entries.sort_unstable_by_key(|e| (e.key, e.line));
        let text = &self.text;
        self.runs.push(self.entries.iter().map(|e| {
            let id = &text[e.start as usize..(e.start + e.len) as usize];
            (e.key, e.line, id)
        }))?;
        self.entries.clear();
        self.text.clear();
        self.index.clear();
        Ok(())
    }
}

/// The key under which a trimmed id is remembered: FNV-1a, 64 bits (Fowler, Noll & Vo;
/// public-domain reference parameters). Keys only place ids; ids are told apart by their text.
pub(crate) fn id_key(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf2_9ce4_8422_2325;
    for b in bytes {
        h ^= u64::from(*b);
        h = h.wrapping_mul(0x0000_0100_0000_01b3);
    }
    h
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;
    use std::collections::HashMap;

    fn tiny() -> IdRegistry {
        IdRegistry::with_limits(Limits {
            entries: 3,
            text_bytes: 64,
            fan_in: 2,
        })
    }

    /// The earliest repeat, by a plain map of every id: the reference for the registry.
    fn reference(ids: &[Vec<u8>]) -> Option<Repeat> {
        let mut first = HashMap::new();
        for (i, id) in ids.iter().enumerate() {
            let line = i as u64 + 2;
            if let Some(&f) = first.get(id) {
                return Some(Repeat {
                    id: id.clone(),
                    line,
                    first: f,
                });
            }
            first.insert(id.clone(), line);
        }
        None
    }

    /// Feed ids from line 2 on, as a reader does, then check the end; `key` may collide.
    fn run(mut r: IdRegistry, ids: &[Vec<u8>], key: fn(&[u8]) -> u64) -> Option<Repeat> {
        for (i, id) in ids.iter().enumerate() {
            if let Some(rep) = r.insert(key(id), id, i as u64 + 2).unwrap() {
                return Some(rep);
            }
        }
        r.repeat_before(u64::MAX).unwrap()
    }

    #[test]
    fn the_first_line_is_kept() {
        let mut r = IdRegistry::default();
        assert_eq!(r.insert(id_key(b"A"), b"A", 2).unwrap(), None);
        assert_eq!(r.insert(id_key(b"B"), b"B", 3).unwrap(), None);
        let rep = r.insert(id_key(b"A"), b"A", 9).unwrap().unwrap();
        assert_eq!((rep.line, rep.first, rep.id.as_slice()), (9, 2, &b"A"[..]));
    }

    #[test]
    fn fnv_reference_values() {
        // FNV-1a 64 reference values (Fowler, Noll & Vo test suite): "" and "a".
        assert_eq!(id_key(b""), 0xcbf2_9ce4_8422_2325);
        assert_eq!(id_key(b"a"), 0xaf63_dc4c_8601_ec8c);
    }

    #[test]
    fn ids_sharing_a_key_are_told_apart_by_their_text() {
        let ids: Vec<Vec<u8>> = [&b"A"[..], b"B", b"C", b"B"].map(|s| s.to_vec()).into();
        let rep = run(IdRegistry::default(), &ids, |_| 7).unwrap();
        assert_eq!((rep.id.as_slice(), rep.line, rep.first), (&b"B"[..], 5, 3));
        let unique: Vec<Vec<u8>> = (0..50).map(|i| format!("S{i}").into_bytes()).collect();
        assert_eq!(run(tiny(), &unique, |_| 7), None);
    }

    #[test]
    fn a_repeat_across_written_out_segments_is_found_at_the_end() {
        let mut ids: Vec<Vec<u8>> = (0..40).map(|i| format!("S{i}").into_bytes()).collect();
        ids.push(b"S1".to_vec());
        let rep = run(tiny(), &ids, id_key).unwrap();
        assert_eq!(
            (rep.id.as_slice(), rep.line, rep.first),
            (&b"S1"[..], 42, 3)
        );
    }

    #[test]
    fn an_earlier_repeat_on_disk_wins_over_a_later_one_in_memory() {
        // S0 repeats at line 12 (its first use is long written out); S20 repeats at 25,
        // within the segment in memory.
        let mut ids: Vec<Vec<u8>> = (0..10).map(|i| format!("S{i}").into_bytes()).collect();
        ids.push(b"S0".to_vec());
        ids.extend((20..32).map(|i| format!("S{i}").into_bytes()));
        ids.push(b"S31".to_vec());
        let rep = run(tiny(), &ids, id_key).unwrap();
        assert_eq!(
            (rep.id.as_slice(), rep.line, rep.first),
            (&b"S0"[..], 12, 2)
        );
    }

    #[test]
    fn only_repeats_before_the_line_asked_count() {
        let mut r = tiny();
        for (i, id) in ["A", "B", "C", "D", "A"].iter().enumerate() {
            // Line 6 repeats A, but the question stops short of it.
            let line = i as u64 + 2;
            if line < 6 {
                assert_eq!(
                    r.insert(id_key(id.as_bytes()), id.as_bytes(), line)
                        .unwrap(),
                    None
                );
            }
        }
        assert_eq!(r.repeat_before(6).unwrap(), None);
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(200))]
        #[test]
        fn the_registry_agrees_with_a_plain_map(
            ids in proptest::collection::vec("[a-e]{1,2}", 0..60),
            collide in any::<bool>(),
        ) {
            let ids: Vec<Vec<u8>> = ids.into_iter().map(String::into_bytes).collect();
            let key: fn(&[u8]) -> u64 = if collide { |b| u64::from(b[0] % 2) } else { id_key };
            prop_assert_eq!(run(tiny(), &ids, key), reference(&ids));
        }
    }
}
