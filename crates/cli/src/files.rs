//! Finding case files and reading them.

use std::path::{Path, PathBuf};

/// The extension of case files.
pub const EXTENSION: &str = "parax";

/// Expand paths: files as given, folders searched (sorted) for `*.parax`. An empty
/// list means the current folder. Paths that do not exist are returned as errors.
pub fn collect(paths: &[PathBuf]) -> (Vec<PathBuf>, Vec<String>) {
    let default = [PathBuf::from(".")];
    let paths = if paths.is_empty() {
        &default[..]
    } else {
        paths
    };
    let mut files = Vec::new();
    let mut errors = Vec::new();
    for p in paths {
        if p.is_dir() {
            let walk = walkdir::WalkDir::new(p).sort_by_file_name().into_iter();
            for entry in walk.filter_entry(|e| !is_hidden_or_build(e.path(), p)) {
                match entry {
                    Ok(e) if e.file_type().is_file() && has_extension(e.path()) => {
                        files.push(e.into_path())
                    }
                    Ok(_) => {}
                    Err(err) => errors.push(format!("{}: {err}", p.display())),
                }
            }
        } else if p.is_file() || p.as_os_str() == "-" {
            files.push(p.clone());
        } else {
            errors.push(format!("{}: no such file or folder", p.display()));
        }
    }
    (files, errors)
}

fn has_extension(p: &Path) -> bool {
    p.extension().is_some_and(|e| e == EXTENSION)
}

fn is_hidden_or_build(p: &Path, root: &Path) -> bool {
    p != root
        && p.file_name().and_then(|n| n.to_str()).is_some_and(|n| {
            (n.starts_with('.') && n.len() > 1) || n == "target" || n == "node_modules"
        })
}

/// Read a file (or standard input for `-`) as UTF-8.
/// A file of 4 GiB or more is refused (`P0005`: spans hold 32-bit offsets),
/// by its size before reading when the file system tells it.
pub fn read(path: &Path) -> Result<String, String> {
    let too_large = |bytes: u64| {
        format!(
            "{}: {bytes} bytes; parax reads files under 4 GiB (P0005)",
            display(path)
        )
    };
    let text = if path.as_os_str() == "-" {
        let mut s = String::new();
        std::io::Read::read_to_string(&mut std::io::stdin(), &mut s)
            .map_err(|e| format!("<stdin>: {e}"))?;
        s
    } else {
        // One open and one size query per file (`fs::metadata` and then
        // `fs::read_to_string` asked the file system for the size twice).
        let io_error = |e: std::io::Error| format!("{}: {e}", path.display());
        let mut file = std::fs::File::open(path).map_err(io_error)?;
        let size = file.metadata().map_or(0, |m| m.len());
        if size > parax_syntax::MAX_SOURCE_BYTES as u64 {
            return Err(too_large(size));
        }
        let mut s = String::with_capacity(size as usize + 1);
        std::io::Read::read_to_string(&mut file, &mut s).map_err(io_error)?;
        s
    };
    if text.len() > parax_syntax::MAX_SOURCE_BYTES {
        return Err(too_large(text.len() as u64));
    }
    Ok(text)
}

/// The name to show for a path.
pub fn display(path: &Path) -> String {
    if path.as_os_str() == "-" {
        return "<stdin>".into();
    }
    let s = path.display().to_string();
    s.strip_prefix("./").map(str::to_owned).unwrap_or(s)
}
