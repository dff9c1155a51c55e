//! Count-table parsing on arbitrary bytes, in counts and percent mode: never a panic.
#![no_main]

use libfuzzer_sys::fuzz_target;
use provenance_core::input::{CountReader, ReadOptions};

fuzz_target!(|data: &[u8]| {
    for percent in [false, true] {
        let options = ReadOptions {
            percent,
            mapping: None,
        };
        if let Ok(reader) =
            CountReader::from_reader("fuzz.csv", std::io::Cursor::new(data.to_vec()), options)
        {
            for row in reader {
                if row.is_err() {
                    break;
                }
            }
        }
    }
});
