//! The formatter's invariants on every input (`parax_tests::check_format`, the
//! same check the property tests run): the reader's lines are those of the
//! line-break rule (`\n`, `\r\n`, lone `\r`); formatting is idempotent, keeps
//! every character but spaces and tabs on its line (VT, FF, NEL, U+2028, U+2029
//! and lone CR as the reader reads them) and keeps the evaluation (diagnostic
//! codes and messages, derived keys and values).
#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let source = parax_fuzz::text(data);
    if let Err(e) = parax_tests::check_format(&source) {
        panic!("{e}");
    }
});
