//! `parax fmt`: the canonical layout, in place or as a check.

use crate::files;
use parax_syntax::{format::format, parse};
use std::io::Write;
use std::path::PathBuf;

/// Run `parax fmt`; returns the exit status.
pub fn run(paths: &[PathBuf], check: bool) -> u8 {
    if paths.len() == 1 && paths[0].as_os_str() == "-" {
        return match files::read(&paths[0]) {
            Ok(s) => {
                let _ = std::io::stdout().write_all(format(&parse(&s)).as_bytes());
                0
            }
            Err(e) => {
                eprintln!("parax: {e}");
                2
            }
        };
    }
    let (list, errors) = files::collect(paths);
    for e in &errors {
        eprintln!("parax: {e}");
    }
    let mut unformatted = 0;
    let mut failed = !errors.is_empty();
    for path in &list {
        let source = match files::read(path) {
            Ok(s) => s,
            Err(e) => {
                eprintln!("parax: {e}");
                failed = true;
                continue;
            }
        };
        let formatted = format(&parse(&source));
        if formatted == source {
            continue;
        }
        unformatted += 1;
        if check {
            println!(
                "{}: not in canonical layout (run `parax fmt` on it)",
                files::display(path)
            );
        } else if let Err(e) = std::fs::write(path, formatted) {
            eprintln!("parax: {}: {e}", files::display(path));
            failed = true;
        } else {
            println!("formatted {}", files::display(path));
        }
    }
    if failed {
        2
    } else if check && unformatted > 0 {
        1
    } else {
        0
    }
}
