//! Column-mapping parsing on arbitrary text, then use against a fixed table: never a panic.
#![no_main]

use libfuzzer_sys::fuzz_target;
use provenance_core::input::{CountReader, Mapping, ReadOptions};

const TABLE: &str = "sample,Qm,Qp,C,P,K,Lv,Ls,Lm,Slide,Qm a,Qm b\nA,1,2,3,4,5,6,7,8,S1,9,10\n";

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    if let Ok(mapping) = Mapping::parse("fuzz.toml", text) {
        let options = ReadOptions {
            percent: false,
            mapping: Some(mapping),
        };
        if let Ok(reader) = CountReader::from_reader("t.csv", TABLE.as_bytes(), options) {
            let _ = reader.collect::<Vec<_>>();
        }
    }
});
