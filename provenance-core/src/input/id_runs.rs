//! Sorted runs of sample ids in temporary files, merged in key then line order.
//!
//! A run is a sequence of records `key (u64 LE), line (u64 LE), length (u32 LE), id bytes`,
//! sorted by key then line. Runs are tiered: when `fan_in` runs of one tier pile up they are
//! merged into one run of the next tier, so a table of n ids keeps about
//! `fan_in · log_fan_in(n / segment)` files open and each id is rewritten `log_fan_in` times.
//! Reading a run takes a 32 KiB buffer. The files are anonymous and vanish with the process.

use std::cmp::Reverse;
use std::collections::BinaryHeap;
use std::fs::File;
use std::io::{self, BufReader, BufWriter, Read, Seek, SeekFrom, Write};

/// One id as stored in a run.
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) struct Record {
    pub key: u64,
    pub line: u64,
    pub id: Vec<u8>,
}

/// A sorted run and its tier (0 for a written-out segment).
struct Run {
    tier: u32,
    file: File,
}

/// The runs written so far.
pub(crate) struct RunSet {
    runs: Vec<Run>,
    fan_in: usize,
}

const READ_BUFFER: usize = 32 << 10;

impl RunSet {
    /// No runs yet; `fan_in` (at least 2) runs of a tier are merged into one.
    pub(crate) fn new(fan_in: usize) -> RunSet {
        RunSet {
            runs: Vec::new(),
            fan_in: fan_in.max(2),
        }
    }

    /// True before the first run is written.
    pub(crate) fn is_empty(&self) -> bool {
        self.runs.is_empty()
    }

    /// Write one run of records already in key, line order.
    pub(crate) fn push<'a>(
        &mut self,
        records: impl Iterator<Item = (u64, u64, &'a [u8])>,
    ) -> io::Result<()> {
        let file = tempfile::tempfile()?;
        let mut w = BufWriter::with_capacity(64 << 10, &file);
        for (key, line, id) in records {
            write_record(&mut w, key, line, id)?;
        }
        w.into_inner().map_err(io::IntoInnerError::into_error)?;
        self.runs.push(Run { tier: 0, file });
        self.compact()
    }

    /// Merge the newest `fan_in` runs while they share a tier.
    fn compact(&mut self) -> io::Result<()> {
        while self.runs.len() >= self.fan_in {
            let tail = &self.runs[self.runs.len() - self.fan_in..];
            let tier = tail[0].tier;
            if tail.iter().any(|r| r.tier != tier) {
                break;
            }
            let merged = self.runs.split_off(self.runs.len() - self.fan_in);
            let file = tempfile::tempfile()?;
            let mut w = BufWriter::with_capacity(64 << 10, &file);
            merge(&merged, |r| write_record(&mut w, r.key, r.line, &r.id))?;
            w.into_inner().map_err(io::IntoInnerError::into_error)?;
            self.runs.push(Run {
                tier: tier + 1,
                file,
            });
        }
        Ok(())
    }

    /// Visit every record of every run in key, line order.
    pub(crate) fn scan(&self, mut f: impl FnMut(&Record)) -> io::Result<()> {
        merge(&self.runs, |r| {
            f(r);
            Ok(())
        })
    }
}

fn write_record(w: &mut impl Write, key: u64, line: u64, id: &[u8]) -> io::Result<()> {
    let len = u32::try_from(id.len()).map_err(|_| io::Error::other("sample id too long"))?;
    w.write_all(&key.to_le_bytes())?;
    w.write_all(&line.to_le_bytes())?;
    w.write_all(&len.to_le_bytes())?;
    w.write_all(id)
}

/// Read the next record into `into`; `false` at the end of the run.
fn read_record(r: &mut impl Read, into: &mut Record) -> io::Result<bool> {
    let mut head = [0u8; 20];
    let mut got = 0;
    while got < head.len() {
        match r.read(&mut head[got..])? {
            0 if got == 0 => return Ok(false),
            0 => return Err(io::ErrorKind::UnexpectedEof.into()),
            n => got += n,
        }
    }
    let word = |i: usize| u64::from_le_bytes(head[i..i + 8].try_into().unwrap_or([0; 8]));
    into.key = word(0);
    into.line = word(8);
    let len = u32::from_le_bytes([head[16], head[17], head[18], head[19]]) as usize;
    into.id.resize(len, 0);
    r.read_exact(&mut into.id)?;
    Ok(true)
}

/// Merge `runs` from their starts, handing each record to `sink` in key, line order.
fn merge(runs: &[Run], mut sink: impl FnMut(&Record) -> io::Result<()>) -> io::Result<()> {
    let mut readers = Vec::with_capacity(runs.len());
    let mut current = Vec::with_capacity(runs.len());
    let mut heap = BinaryHeap::with_capacity(runs.len());
    for (i, run) in runs.iter().enumerate() {
        (&run.file).seek(SeekFrom::Start(0))?;
        let mut reader = BufReader::with_capacity(READ_BUFFER, &run.file);
        let mut rec = Record {
            key: 0,
            line: 0,
            id: Vec::new(),
        };
        if read_record(&mut reader, &mut rec)? {
            heap.push(Reverse((rec.key, rec.line, i)));
        }
        readers.push(reader);
        current.push(rec);
    }
    while let Some(Reverse((_, _, i))) = heap.pop() {
        sink(&current[i])?;
        if read_record(&mut readers[i], &mut current[i])? {
            heap.push(Reverse((current[i].key, current[i].line, i)));
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn all(set: &RunSet) -> Vec<(u64, u64, Vec<u8>)> {
        let mut out = Vec::new();
        set.scan(|r| out.push((r.key, r.line, r.id.clone())))
            .unwrap();
        out
    }

    #[test]
    fn runs_merge_in_key_then_line_order_through_tiers() {
        let mut set = RunSet::new(2);
        let mut expected = Vec::new();
        // Seven runs of three records: tiers merge as they pile up (2 → 1, 2 → 1, ...).
        for run in 0..7u64 {
            let mut recs: Vec<(u64, u64, Vec<u8>)> = (0..3u64)
                .map(|i| {
                    (
                        (i * 7 + run) % 5,
                        run * 10 + i,
                        format!("id{run}-{i}").into_bytes(),
                    )
                })
                .collect();
            recs.sort();
            set.push(recs.iter().map(|(k, l, id)| (*k, *l, id.as_slice())))
                .unwrap();
            expected.extend(recs);
        }
        // 7 runs at fan-in 2 leave tiers 2, 1 and 0: three files.
        assert_eq!(set.runs.len(), 3);
        expected.sort();
        assert_eq!(all(&set), expected);
    }

    #[test]
    fn empty_and_long_ids_round_trip() {
        let mut set = RunSet::new(4);
        let long = vec![b'x'; 100_000];
        set.push([(1, 2, &b""[..]), (1, 3, long.as_slice())].into_iter())
            .unwrap();
        assert_eq!(all(&set), vec![(1, 2, Vec::new()), (1, 3, long)]);
    }
}
