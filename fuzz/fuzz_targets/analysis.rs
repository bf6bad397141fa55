//! The whole analysis on two files (the input split at its first NUL byte:
//! the root design, then a second file it may `use "shared/site.plenum"`):
//! model, then engine. No panic, and every number of the evaluation finite.
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let (root, other) = plenum_gen::oracle::split_analysis_input(data);
    if let Err(e) = plenum_gen::oracle::check_analysis(&root, &other) {
        panic!("{e}");
    }
});
