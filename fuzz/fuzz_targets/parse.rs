//! Arbitrary bytes, decoded as lossy UTF-8, through the parser: no panic, and
//! every span in range and on character boundaries.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    if let Err(e) = plenum_gen::oracle::check_parse(&text) {
        panic!("{e}");
    }
});
