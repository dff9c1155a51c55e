//! The full `modes` path (read, recalculate, write CSV and JSON) on arbitrary bytes.
#![no_main]

use libfuzzer_sys::fuzz_target;
use provenance_core::batch::{write_modes, ModesOptions};
use provenance_core::input::{CountReader, ReadOptions};
use provenance_core::output::Format;

fuzz_target!(|data: &[u8]| {
    for (format, intervals) in [(Format::Csv, true), (Format::Json, false)] {
        let Ok(reader) = CountReader::from_reader(
            "fuzz.csv",
            std::io::Cursor::new(data.to_vec()),
            ReadOptions::default(),
        ) else {
            return;
        };
        let mut out = Vec::new();
        if write_modes(reader, &mut out, "out", ModesOptions { format, intervals }).is_ok()
            && format == Format::Json
        {
            let parsed: Result<Vec<serde_json_check::Value>, _> =
                serde_json_check::from_slice(&out);
            assert!(parsed.is_ok(), "modes JSON must always parse");
        }
    }
});
