//! `parax check --format sarif`: the diagnostics as a SARIF 2.1.0 log (OASIS
//! Static Analysis Results Interchange Format) for code-review systems. Rule ids
//! are the diagnostic codes of `parax_eval::codes::ALL` with their titles and
//! descriptions; file URIs are relative to the repository root (`SRCROOT`);
//! regions are 1-based with columns in Unicode code points; every result carries
//! a partial fingerprint that survives lines moving up or down.

use parax_eval::codes::ALL;
use parax_eval::{Diagnostic, Severity, GENERAL_CAUTION};
use parax_syntax::Parsed;
use serde_json::{json, Value};
use std::path::{Path, PathBuf};

/// SARIF `level` for a severity.
fn level(s: Severity) -> &'static str {
    match s {
        Severity::Error => "error",
        Severity::Warning => "warning",
        Severity::Info => "note",
    }
}

/// The folder URIs are made relative to: the git work tree holding the current
/// folder, or the current folder outside git.
pub fn root() -> PathBuf {
    let cwd = std::env::current_dir().unwrap_or_else(|_| PathBuf::from("."));
    std::process::Command::new("git")
        .args(["rev-parse", "--show-toplevel"])
        .output()
        .ok()
        .filter(|o| o.status.success())
        .and_then(|o| String::from_utf8(o.stdout).ok())
        .map(|s| PathBuf::from(s.trim()))
        .and_then(|p| p.canonicalize().ok())
        .unwrap_or(cwd)
}

/// `path` relative to `root`, with `/` separators and percent-encoding of the
/// characters a URI reference cannot hold; `None` outside the root.
pub fn relative_uri(root: &Path, path: &Path) -> Option<String> {
    let abs = path.canonicalize().ok()?;
    let rel = abs.strip_prefix(root).ok()?;
    let parts: Vec<String> = rel
        .components()
        .map(|c| encode(&c.as_os_str().to_string_lossy()))
        .collect();
    Some(parts.join("/"))
}

/// Percent-encode everything but unreserved characters (RFC 3986 §2.3), byte by
/// byte: the whole rule is one line, so no URL library is pulled in for it.
fn encode(s: &str) -> String {
    s.bytes()
        .map(|b| {
            if b.is_ascii_alphanumeric() || b"-._~".contains(&b) {
                (b as char).to_string()
            } else {
                format!("%{b:02X}")
            }
        })
        .collect()
}

/// FNV-1a, 64 bit. Hand-rolled on purpose: a fingerprint must stay the same
/// across releases, so the algorithm is fixed here rather than left to a
/// dependency's default hasher (std's `DefaultHasher` is explicitly unstable).
fn fnv1a(text: &str) -> u64 {
    text.bytes().fold(0xcbf2_9ce4_8422_2325, |h, b| {
        (h ^ u64::from(b)).wrapping_mul(0x0100_0000_01b3)
    })
}

/// Where a file is, for a SARIF `artifactLocation`: repository-relative under
/// `SRCROOT` when inside the repository, otherwise an absolute `file://` URI.
pub fn artifact_location(root: &Path, path: &Path) -> Value {
    match relative_uri(root, path) {
        Some(uri) => json!({ "uri": uri, "uriBaseId": "SRCROOT" }),
        None => {
            let abs = path.canonicalize().unwrap_or_else(|_| path.to_path_buf());
            let parts: Vec<String> = abs
                .components()
                .filter_map(|c| match c {
                    std::path::Component::Normal(p) => Some(encode(&p.to_string_lossy())),
                    _ => None,
                })
                .collect();
            json!({ "uri": format!("file:///{}", parts.join("/")) })
        }
    }
}

/// One file's results at `location` (from [`artifact_location`]).
pub fn results(location: &Value, parsed: &Parsed, diags: &[Diagnostic]) -> Vec<Value> {
    let uri = location["uri"].as_str().unwrap_or_default();
    let src = &parsed.source;
    let mut seen: std::collections::HashMap<u64, usize> = Default::default();
    diags
        .iter()
        .map(|d| {
            let (l1, c1) = parsed.index.line_col(src, d.span.start());
            let (mut l2, mut c2) = parsed.index.line_col(src, d.span.end());
            if (l2, c2) <= (l1, c1) {
                (l2, c2) = (l1, c1 + 1);
            }
            // The fingerprint: code, file and the trimmed text of the line at
            // fault (not its number), plus an occurrence count for repeats.
            let line = parsed.index.line_span(src, l1 - 1);
            let base = fnv1a(&format!(
                "{}\u{0}{uri}\u{0}{}",
                d.code,
                src[line.start()..line.end()].trim()
            ));
            let n = seen.entry(base).or_default();
            *n += 1;
            let mut message = d.message.clone();
            let stop = |m: &mut String| {
                if !m.ends_with('.') {
                    m.push('.');
                }
            };
            if let Some(h) = &d.hint {
                stop(&mut message);
                message.push_str(&format!(" Hint: {h}"));
            }
            if let Some(c) = d.caution {
                stop(&mut message);
                message.push_str(&format!(" Caution: {c}"));
            }
            let rule_index = d.code.index();
            json!({
                "ruleId": d.code,
                "ruleIndex": rule_index,
                "level": level(d.severity),
                "message": { "text": message },
                "locations": [{
                    "physicalLocation": {
                        "artifactLocation": location,
                        "region": {
                            "startLine": l1, "startColumn": c1,
                            "endLine": l2, "endColumn": c2,
                            "snippet": { "text": &src[line.start()..line.end()] },
                        },
                    },
                }],
                "partialFingerprints": { "paraxLineHash/v1": format!("{base:016x}:{n}") },
            })
        })
        .collect()
}

/// A rule's friendly name in the Pascal case SARIF asks for: `missing unit` →
/// `MissingUnit`.
fn friendly_name(title: &str) -> String {
    title
        .split(|c: char| !c.is_ascii_alphanumeric())
        .filter(|w| !w.is_empty())
        .map(|w| {
            let mut cs = w.chars();
            cs.next()
                .map(|f| f.to_ascii_uppercase().to_string() + cs.as_str())
                .unwrap_or_default()
        })
        .collect()
}

/// The whole log: one run of `parax`, every rule, the given results.
pub fn log(results: Vec<Value>, unreadable: &[String]) -> Value {
    let rules: Vec<Value> = ALL
        .iter()
        .map(|c| {
            json!({
                "id": c.code,
                "name": friendly_name(c.title),
                "shortDescription": { "text": c.title },
                "fullDescription": { "text": c.description },
            })
        })
        .collect();
    let notifications: Vec<Value> = unreadable
        .iter()
        .map(|e| json!({ "level": "error", "message": { "text": e } }))
        .collect();
    json!({
        "$schema": "https://json.schemastore.org/sarif-2.1.0.json",
        "version": "2.1.0",
        "runs": [{
            "tool": { "driver": {
                "name": "parax",
                "version": env!("CARGO_PKG_VERSION"),
                "informationUri": "https://example.invalid/parax",
                "rules": rules,
            }},
            "columnKind": "unicodeCodePoints",
            "results": results,
            "invocations": [{
                "executionSuccessful": unreadable.is_empty(),
                "toolExecutionNotifications": notifications,
            }],
            "properties": { "caution": GENERAL_CAUTION },
        }],
    })
}
