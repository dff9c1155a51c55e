//! CRLF → LF normalisation of the input stream.

use std::io::Read;

/// Turns CRLF line ends into LF before the CSV parser sees them, so that line numbers in
/// messages match an editor's for Windows-style files too. A lone CR is kept.
pub(crate) struct CrlfToLf<R> {
    inner: R,
    buf: Vec<u8>,
    start: usize,
    end: usize,
    eof: bool,
}

impl<R: Read> CrlfToLf<R> {
    pub(crate) fn new(inner: R) -> Self {
        CrlfToLf {
            inner,
            buf: vec![0; 1 << 16],
            start: 0,
            end: 0,
            eof: false,
        }
    }
}

impl<R: Read> Read for CrlfToLf<R> {
    fn read(&mut self, out: &mut [u8]) -> std::io::Result<usize> {
        let mut w = 0;
        while w < out.len() {
            if self.start == self.end {
                if self.eof || w > 0 {
                    break;
                }
                let n = self.inner.read(&mut self.buf)?;
                self.start = 0;
                self.end = n;
                if n == 0 {
                    self.eof = true;
                    break;
                }
            }
            let b = self.buf[self.start];
            if b == b'\r' {
                if self.start + 1 == self.end && !self.eof {
                    // The CR ends the buffer: keep it and read what follows.
                    self.buf[0] = b'\r';
                    let n = self.inner.read(&mut self.buf[1..])?;
                    self.start = 0;
                    self.end = 1 + n;
                    self.eof = n == 0;
                    continue;
                }
                if self.start + 1 < self.end && self.buf[self.start + 1] == b'\n' {
                    self.start += 1;
                    continue;
                }
                out[w] = b;
                w += 1;
                self.start += 1;
                continue;
            }
            // Copy the run up to the next CR in one go.
            let room = (out.len() - w).min(self.end - self.start);
            let run = &self.buf[self.start..self.start + room];
            let len = run.iter().position(|c| *c == b'\r').unwrap_or(room);
            out[w..w + len].copy_from_slice(&run[..len]);
            w += len;
            self.start += len;
        }
        Ok(w)
    }
}

#[cfg(test)]
mod crlf_tests {
    use super::*;

    fn convert(input: &[u8], chunk: usize) -> Vec<u8> {
        let mut r = CrlfToLf::new(input);
        let mut out = Vec::new();
        let mut buf = vec![0; chunk];
        loop {
            let n = r.read(&mut buf).unwrap();
            if n == 0 {
                break;
            }
            out.extend_from_slice(&buf[..n]);
        }
        out
    }

    #[test]
    fn crlf_becomes_lf_at_any_read_size() {
        for chunk in [1, 2, 3, 7, 4096] {
            assert_eq!(
                convert(b"a\r\nb\rc\r\n\r", chunk),
                b"a\nb\rc\n\r",
                "chunk {chunk}"
            );
        }
    }
}
