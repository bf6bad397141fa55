//! Formatting round trips: when a text formats, formatting again changes
//! nothing, the output parses cleanly, and the minimal edits give the same
//! text.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    if let Err(e) = plenum_gen::oracle::check_format(&text) {
        panic!("{e}");
    }
});
