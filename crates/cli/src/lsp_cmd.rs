//! `parax lsp`: run the language server (`parax-lsp`) on standard input and
//! output. Editors start it; see `editors/README.md`.

/// Serve until the client exits; 0 on a clean exit, 2 when the runtime could not start.
pub fn run() -> u8 {
    match parax_lsp::run_stdio() {
        Ok(()) => 0,
        Err(e) => {
            eprintln!("parax lsp: {e}");
            2
        }
    }
}
