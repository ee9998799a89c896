//! `parax diff OLD NEW` and `parax view FILE`: what changed between two versions
//! of a case file (input statements by block and keyword; derived values that
//! moved, with the difference), and a one-value-per-line view of a file for git's
//! `textconv`. Values and differences come from `parax-eval`; this module only
//! pairs them up by block and key.

use crate::files;
use crate::render::human;
use parax_eval::{evaluate_with, Derived, DerivedValue, EvalOptions, Evaluation, GENERAL_CAUTION};
use parax_syntax::Parsed;
use serde_json::{json, Value};
use std::collections::BTreeMap;
use std::fmt::Write as _;
use std::path::Path;
use std::process::Command;

/// Output formats of `parax diff`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
pub enum DiffFormat {
    /// For people.
    Human,
    /// For programs.
    Json,
}

/// One version of a file: its name and its evaluation.
struct Version {
    name: String,
    parsed: Parsed,
    ev: Evaluation,
}

/// Read `path`, or `REV:path` from git when no such file exists and the argument
/// has a colon (`HEAD~1:examples/a.parax`, `main:./a.parax`).
fn load(arg: &str) -> Result<Version, String> {
    let p = Path::new(arg);
    let source = if p.exists() || arg == "-" {
        files::read(p)?
    } else if let Some((rev, _)) = arg.split_once(':').filter(|(rev, _)| !rev.is_empty()) {
        let out = Command::new("git")
            .args(["show", arg])
            .output()
            .map_err(|e| format!("{arg}: cannot run git: {e}"))?;
        if !out.status.success() {
            return Err(format!(
                "{arg}: git show failed for revision `{rev}`: {}",
                String::from_utf8_lossy(&out.stderr).trim()
            ));
        }
        String::from_utf8(out.stdout).map_err(|_| format!("{arg}: not UTF-8 text"))?
    } else {
        return Err(format!("{arg}: no such file"));
    };
    let parsed = parax_syntax::parse(&source);
    let ev = evaluate_with(&parsed, EvalOptions::VALUES_ONLY);
    Ok(Version {
        name: arg.to_owned(),
        parsed,
        ev,
    })
}

/// One statement, as a change list sees it.
#[derive(Clone)]
struct Input {
    text: String,
    line: usize,
}

/// The header text of the block holding byte `offset`, without comment.
fn block_of(parsed: &Parsed, offset: usize) -> String {
    parsed
        .blocks
        .iter()
        .find(|b| b.span.start() <= offset && offset <= b.span.end())
        .map(|b| header_text(parsed, b.header))
        .unwrap_or_else(|| "(outside any block)".into())
}

fn header_text(parsed: &Parsed, line: usize) -> String {
    let l = &parsed.lines[line];
    let end = l.comment.map_or(l.span.end(), |c| c.start());
    squash(&parsed.source[l.span.start()..end])
}

fn squash(s: &str) -> String {
    s.split_whitespace().collect::<Vec<_>>().join(" ")
}

/// Statements by block header, then by `keyword#n` (the n-th statement with that
/// keyword in the block, so repeated `lens` or `expect` lines pair up in order).
fn inputs(parsed: &Parsed) -> BTreeMap<String, BTreeMap<(String, usize), Input>> {
    let mut out: BTreeMap<String, BTreeMap<(String, usize), Input>> = BTreeMap::new();
    for b in &parsed.blocks {
        let block = header_text(parsed, b.header);
        let entry = out.entry(block).or_default();
        let mut seen: BTreeMap<String, usize> = BTreeMap::new();
        for i in b.body() {
            let l = &parsed.lines[i];
            let Some(st) = l.statement() else { continue };
            let kw = parsed.keyword(st).to_owned();
            let n = seen.entry(kw.clone()).or_default();
            *n += 1;
            let end = l.comment.map_or(l.span.end(), |c| c.start());
            let text = squash(&parsed.source[st.keyword.end().min(end)..end]);
            entry.insert((kw, *n), Input { text, line: i + 1 });
        }
    }
    out
}

/// A change of one input statement.
struct InputChange {
    keyword: String,
    old: Option<Input>,
    new: Option<Input>,
}

/// A derived value that moved, appeared or disappeared.
struct ValueChange<'a> {
    key: String,
    name: &'a str,
    old: Option<&'a Derived>,
    new: Option<&'a Derived>,
}

#[derive(Default)]
struct BlockChanges<'a> {
    inputs: Vec<InputChange>,
    values: Vec<ValueChange<'a>>,
}

/// Blocks in first-seen order (old file, then blocks only in the new file).
fn compare<'a>(old: &'a Version, new: &'a Version) -> Vec<(String, BlockChanges<'a>)> {
    let mut order: Vec<String> = Vec::new();
    let mut by_block: BTreeMap<String, BlockChanges<'a>> = BTreeMap::new();
    let note = |b: &str, order: &mut Vec<String>| {
        if !order.iter().any(|o| o == b) {
            order.push(b.to_owned());
        }
    };
    for v in [old, new] {
        for b in &v.parsed.blocks {
            note(&header_text(&v.parsed, b.header), &mut order);
        }
    }
    let (oi, ni) = (inputs(&old.parsed), inputs(&new.parsed));
    for block in &order {
        let empty = BTreeMap::new();
        let o = oi.get(block).unwrap_or(&empty);
        let n = ni.get(block).unwrap_or(&empty);
        let mut keys: Vec<&(String, usize)> = o.keys().chain(n.keys()).collect();
        keys.sort_by_key(|k| {
            let line = o.get(k).or(n.get(k)).map_or(0, |i| i.line);
            (line, (*k).clone())
        });
        keys.dedup();
        for k in keys {
            let (a, b) = (o.get(k), n.get(k));
            if a.map(|i| &i.text) != b.map(|i| &i.text) {
                by_block
                    .entry(block.clone())
                    .or_default()
                    .inputs
                    .push(InputChange {
                        keyword: k.0.clone(),
                        old: a.cloned(),
                        new: b.cloned(),
                    });
            }
        }
    }
    let old_values: BTreeMap<String, &Derived> =
        old.ev.derived.iter().map(|d| (d.key(), d)).collect();
    let new_values: BTreeMap<String, &Derived> =
        new.ev.derived.iter().map(|d| (d.key(), d)).collect();
    let mut keys: Vec<(String, &str, String)> = Vec::new();
    for d in &old.ev.derived {
        keys.push((d.key(), &d.name, block_of(&old.parsed, d.span.start())));
    }
    for d in &new.ev.derived {
        let key = d.key();
        if !old_values.contains_key(&key) {
            keys.push((key, &d.name, block_of(&new.parsed, d.span.start())));
        }
    }
    for (key, name, block) in keys {
        let (a, b) = (old_values.get(&key).copied(), new_values.get(&key).copied());
        if a.map(|d| d.text()) != b.map(|d| d.text()) {
            note(&block, &mut order);
            by_block.entry(block).or_default().values.push(ValueChange {
                key,
                name,
                old: a,
                new: b,
            });
        }
    }
    order
        .into_iter()
        .filter_map(|b| by_block.remove(&b).map(|c| (b, c)))
        .collect()
}

fn difference(c: &ValueChange) -> Option<parax_eval::Difference> {
    match (c.old, c.new) {
        (Some(a), Some(b)) => DerivedValue::difference(&a.value, &b.value),
        _ => None,
    }
}

fn human_report(old: &Version, new: &Version, changes: &[(String, BlockChanges)]) -> String {
    let mut out = String::new();
    let _ = writeln!(out, "--- {}\n+++ {}", old.name, new.name);
    if changes.is_empty() {
        let _ = writeln!(out, "no change in inputs or derived values");
    }
    let opt = |i: &Option<Input>| {
        i.as_ref().map_or("(absent)".to_owned(), |i| {
            format!("{} (line {})", i.text, i.line)
        })
    };
    for (block, c) in changes {
        let _ = writeln!(out, "\n{block}");
        for i in &c.inputs {
            let _ = writeln!(
                out,
                "  input  {:<22} {}  ->  {}",
                i.keyword,
                opt(&i.old),
                opt(&i.new)
            );
        }
        for v in &c.values {
            let text = |d: Option<&Derived>| d.map_or("(absent)".to_owned(), |d| d.text());
            let diff = difference(v)
                .map(|d| format!("   (change {})", d.display()))
                .unwrap_or_default();
            let _ = writeln!(
                out,
                "  value  {:<22} {}  ->  {}{diff}",
                v.name,
                text(v.old),
                text(v.new)
            );
        }
    }
    let _ = writeln!(out, "\n{}", human::caution_line());
    out
}

fn json_report(old: &Version, new: &Version, changes: &[(String, BlockChanges)]) -> Value {
    let input = |i: &Option<Input>| {
        i.as_ref()
            .map(|i| json!({ "text": i.text, "line": i.line }))
    };
    let value = |d: Option<&Derived>| d.map(|d| json!({ "value": d.value, "text": d.text() }));
    json!({
        "old": old.name,
        "new": new.name,
        "blocks": changes.iter().map(|(block, c)| json!({
            "block": block,
            "inputs": c.inputs.iter().map(|i| json!({
                "keyword": i.keyword, "old": input(&i.old), "new": input(&i.new),
            })).collect::<Vec<_>>(),
            "values": c.values.iter().map(|v| json!({
                "key": v.key,
                "name": v.name,
                "old": value(v.old),
                "new": value(v.new),
                "difference": difference(v).map(|d| json!({ "value": d, "text": d.display() })),
            })).collect::<Vec<_>>(),
        })).collect::<Vec<_>>(),
        "caution": GENERAL_CAUTION,
    })
}

/// Run `parax diff`; exit status 0 when nothing changed, 1 when something did,
/// 2 when a version cannot be read.
pub fn run(old: &str, new: &str, format: DiffFormat) -> u8 {
    let (o, n) = match (load(old), load(new)) {
        (Ok(o), Ok(n)) => (o, n),
        (a, b) => {
            for e in [a.err(), b.err()].into_iter().flatten() {
                eprintln!("parax: {e}");
            }
            return 2;
        }
    };
    let changes = compare(&o, &n);
    match format {
        DiffFormat::Human => print!("{}", human_report(&o, &n, &changes)),
        DiffFormat::Json => println!(
            "{}",
            serde_json::to_string_pretty(&json_report(&o, &n, &changes))
                .expect("JSON of plain values")
        ),
    }
    u8::from(!changes.is_empty())
}

/// Run `parax view`: the file verbatim, then one line per derived value
/// (`key = text`), so that a line diff of two views shows which values moved. A
/// file that is not UTF-8 or has syntax errors is printed unchanged. Always
/// exits 0 when the file can be read, so that git never fails on it.
pub fn view(path: &Path) -> u8 {
    let bytes = if path.as_os_str() == "-" {
        let mut b = Vec::new();
        let _ = std::io::Read::read_to_end(&mut std::io::stdin(), &mut b);
        b
    } else {
        match std::fs::read(path) {
            Ok(b) => b,
            Err(e) => {
                eprintln!("parax: {}: {e}", path.display());
                return 2;
            }
        }
    };
    use std::io::Write as _;
    let mut out = std::io::stdout().lock();
    let Ok(source) = String::from_utf8(bytes.clone()) else {
        let _ = out.write_all(&bytes);
        return 0;
    };
    let parsed = parax_syntax::parse(&source);
    let ev = evaluate_with(&parsed, EvalOptions::VALUES_ONLY);
    let _ = out.write_all(source.as_bytes());
    if !parsed.errors.is_empty() {
        return 0;
    }
    let mut text = String::new();
    if !source.ends_with('\n') && !source.is_empty() {
        text.push('\n');
    }
    let _ = writeln!(
        text,
        "\n# ---- derived by parax (aids only; verify clinically) ----"
    );
    for d in &ev.derived {
        let _ = writeln!(text, "# {} = {}", d.key(), d.text());
    }
    let _ = out.write_all(text.as_bytes());
    0
}
