//! End-to-end tests of the review and research commands: `diff`, `view` (also as
//! a real git textconv driver), `check --format sarif`, batch `eval`, `stats` and
//! `render`. Outputs are snapshotted; every command runs in the workspace root.

use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};

const ROOT: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/../..");
const BIN: &str = env!("CARGO_BIN_EXE_parax");

fn parax_in(dir: &Path, args: &[&str]) -> Output {
    Command::new(BIN)
        .args(args)
        .current_dir(dir)
        .stdin(Stdio::null())
        .output()
        .expect("the parax binary runs")
}

fn parax(args: &[&str]) -> Output {
    parax_in(Path::new(ROOT), args)
}

fn code(o: &Output) -> i32 {
    o.status.code().expect("exited normally")
}

fn stdout(o: &Output) -> String {
    String::from_utf8(o.stdout.clone()).expect("UTF-8 stdout")
}

fn stderr(o: &Output) -> String {
    String::from_utf8(o.stderr.clone()).expect("UTF-8 stderr")
}

/// A fresh folder under the system temp dir, unique to this process and test.
fn temp_dir(name: &str) -> PathBuf {
    let d = std::env::temp_dir().join(format!("parax-review-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&d);
    std::fs::create_dir_all(&d).expect("temp dir");
    d
}

fn git(dir: &Path, args: &[&str]) -> String {
    let o = Command::new("git")
        .args(args)
        .current_dir(dir)
        .env("GIT_CONFIG_NOSYSTEM", "1")
        .env("HOME", dir)
        .env("GIT_AUTHOR_NAME", "Test")
        .env("GIT_AUTHOR_EMAIL", "test@example.invalid")
        .env("GIT_COMMITTER_NAME", "Test")
        .env("GIT_COMMITTER_EMAIL", "test@example.invalid")
        .output()
        .expect("git runs");
    assert!(
        o.status.success(),
        "git {args:?}: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    String::from_utf8(o.stdout).expect("UTF-8")
}

const CHANGED: &str = "crates/cli/tests/data/clinic-review-changed.parax";

#[test]
fn diff_human_and_json() {
    let o = parax(&["diff", "examples/clinic-review.parax", CHANGED]);
    assert_eq!(code(&o), 1, "something changed: {}", stderr(&o));
    let out = stdout(&o);
    // [C] Thibos 1997: SE of -6.00/-1.50 is -6.75 D; of -5.75/-1.50, -6.50 D.
    assert!(out.contains("spherical-equivalent   -6.50 D  ->  -6.75 D   (change -0.25 D)"));
    insta::assert_snapshot!("diff_human", out);
    let o = parax(&[
        "diff",
        "--format",
        "json",
        "examples/clinic-review.parax",
        CHANGED,
    ]);
    assert_eq!(code(&o), 1);
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).expect("JSON");
    assert_eq!(v["blocks"][0]["block"], "eye right");
    insta::assert_snapshot!("diff_json", stdout(&o));
}

#[test]
fn diff_of_identical_files_is_empty_and_exits_zero() {
    let o = parax(&[
        "diff",
        "examples/eye-model.parax",
        "examples/eye-model.parax",
    ]);
    assert_eq!(code(&o), 0);
    assert!(stdout(&o).contains("no change in inputs or derived values"));
}

#[test]
fn diff_missing_file_exits_two() {
    let o = parax(&["diff", "examples/none.parax", "examples/eye-model.parax"]);
    assert_eq!(code(&o), 2);
    assert!(stderr(&o).contains("examples/none.parax"));
}

#[test]
fn view_prints_source_then_values_and_raw_text_on_errors() {
    let o = parax(&["view", "examples/bench-relay.parax"]);
    assert_eq!(code(&o), 0);
    let src = std::fs::read_to_string(Path::new(ROOT).join("examples/bench-relay.parax")).unwrap();
    let out = stdout(&o);
    assert!(out.starts_with(&src));
    assert!(out.contains("# system.two-lens-bench-relay.equivalent-power = +4.00 D\n"));
    let dir = temp_dir("view");
    let bad = "eye right\n  refraction -2 @@ ~~\n";
    std::fs::write(dir.join("bad.parax"), bad).unwrap();
    std::fs::write(dir.join("binary.parax"), [0xffu8, 0xfe, 0x00, 0x41]).unwrap();
    let o = parax_in(&dir, &["view", "bad.parax"]);
    assert_eq!(code(&o), 0);
    assert_eq!(stdout(&o), bad);
    let o = parax_in(&dir, &["view", "binary.parax"]);
    assert_eq!(code(&o), 0);
    assert_eq!(o.stdout, vec![0xffu8, 0xfe, 0x00, 0x41]);
}

/// The README's setup: `.gitattributes` + `git config diff.parax.textconv`, then a
/// real `git diff` and `git log -p` show the derived values that moved; a file
/// that does not parse still diffs.
#[test]
fn git_textconv_shows_moved_values() {
    let dir = temp_dir("git");
    git(&dir, &["init", "-q"]);
    std::fs::write(dir.join(".gitattributes"), "*.parax diff=parax\n").unwrap();
    git(
        &dir,
        &["config", "diff.parax.textconv", &format!("'{BIN}' view")],
    );
    let original =
        std::fs::read_to_string(Path::new(ROOT).join("examples/clinic-review.parax")).unwrap();
    std::fs::write(dir.join("case.parax"), &original).unwrap();
    git(&dir, &["add", "."]);
    git(&dir, &["commit", "-q", "-m", "first"]);
    let changed = original.replace("-5.75 / -1.50 x 175 @ 12 mm", "-6.00 / -1.50 x 175 @ 12 mm");
    std::fs::write(dir.join("case.parax"), &changed).unwrap();
    let d = git(&dir, &["diff"]);
    assert!(
        d.contains("-# eye.right.spherical-equivalent = -6.50 D"),
        "{d}"
    );
    assert!(
        d.contains("+# eye.right.spherical-equivalent = -6.75 D"),
        "{d}"
    );
    assert!(
        d.contains("+  refraction -6.00 / -1.50 x 175 @ 12 mm"),
        "{d}"
    );
    git(&dir, &["commit", "-q", "-am", "second"]);
    let log = git(&dir, &["log", "-p"]);
    assert!(
        log.contains("+# eye.right.spherical-equivalent = -6.75 D"),
        "{log}"
    );
    // `parax diff REV:path path` reads the old version with git.
    let o = parax_in(&dir, &["diff", "HEAD~1:case.parax", "case.parax"]);
    assert_eq!(code(&o), 1, "{}", stderr(&o));
    assert!(stdout(&o).contains("-6.50 D  ->  -6.75 D"));
    // A broken file: git still shows a diff (the raw text) and does not fail.
    std::fs::write(dir.join("case.parax"), "eye right\n  refraction @@ ~~\n").unwrap();
    let d = git(&dir, &["diff"]);
    assert!(d.contains("+  refraction @@ ~~"), "{d}");
}

#[test]
fn sarif_log_of_a_file_with_mistakes() {
    let o = parax(&[
        "check",
        "--format",
        "sarif",
        "crates/cli/tests/data/mistakes.parax",
    ]);
    assert_eq!(code(&o), 1, "the file has errors");
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).expect("JSON");
    assert_eq!(v["version"], "2.1.0");
    let run = &v["runs"][0];
    let rules = run["tool"]["driver"]["rules"].as_array().unwrap();
    assert_eq!(rules.len(), parax_eval::codes::ALL.len());
    let results = run["results"].as_array().unwrap();
    assert!(!results.is_empty());
    for r in results {
        let id = r["ruleId"].as_str().unwrap();
        let idx = r["ruleIndex"].as_u64().unwrap() as usize;
        assert_eq!(rules[idx]["id"], id, "ruleIndex points at the rule");
        let loc = &r["locations"][0]["physicalLocation"];
        assert_eq!(
            loc["artifactLocation"]["uri"], "crates/cli/tests/data/mistakes.parax",
            "repository-relative"
        );
        assert!(loc["region"]["startLine"].as_u64().unwrap() >= 1);
        assert!(loc["region"]["startColumn"].as_u64().unwrap() >= 1);
        assert!(r["partialFingerprints"]["paraxLineHash/v1"].is_string());
    }
    // The missing unit of `12` on line 4 (`  refraction -6.50 / -1.00 x 90 @ 12`),
    // columns counted from 1.
    assert!(results.iter().any(|r| r["ruleId"] == "P0201"
        && r["locations"][0]["physicalLocation"]["region"]["startLine"] == 4
        && r["locations"][0]["physicalLocation"]["region"]["startColumn"] == 35));
    insta::assert_snapshot!("sarif_mistakes", stdout(&o));
}

#[test]
fn sarif_fingerprints_survive_lines_moving() {
    let dir = temp_dir("sarif-move");
    let src = std::fs::read_to_string(Path::new(ROOT).join("crates/cli/tests/data/mistakes.parax"))
        .unwrap();
    std::fs::write(dir.join("a.parax"), &src).unwrap();
    let fp = |dir: &Path| -> Vec<String> {
        let o = parax_in(dir, &["check", "--format", "sarif", "a.parax"]);
        let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
        let mut f: Vec<String> = v["runs"][0]["results"]
            .as_array()
            .unwrap()
            .iter()
            .map(|r| {
                r["partialFingerprints"]["paraxLineHash/v1"]
                    .as_str()
                    .unwrap()
                    .to_owned()
            })
            .collect();
        f.sort();
        f
    };
    let before = fp(&dir);
    std::fs::write(dir.join("a.parax"), format!("# a new first line\n\n{src}")).unwrap();
    assert_eq!(before, fp(&dir));
}

#[test]
fn sarif_log_of_the_examples() {
    let o = parax(&["check", "--format", "sarif", "examples"]);
    assert_eq!(code(&o), 0);
    insta::assert_snapshot!("sarif_examples", stdout(&o));
}

#[allow(dead_code)]
mod support {
    pub mod corpus;
}

#[test]
fn batch_csv_and_jsonl_of_the_examples() {
    let o = parax(&["eval", "--format", "csv", "examples"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    assert!(stderr(&o).contains("evaluated 6 files: 6 ok, 0 failed"));
    let out = stdout(&o);
    let mut reader = csv::Reader::from_reader(out.as_bytes());
    let header: Vec<String> = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_owned)
        .collect();
    assert_eq!(header[..4], ["file", "block", "kind", "status"]);
    assert_eq!(
        reader.records().count(),
        21,
        "one row per evaluated block of the six examples"
    );
    insta::assert_snapshot!("batch_csv", out);
    let o = parax(&["eval", "--format", "jsonl", "examples"]);
    assert_eq!(code(&o), 0);
    let rows: Vec<serde_json::Value> = stdout(&o)
        .lines()
        .map(|l| serde_json::from_str(l).expect("one JSON object per line"))
        .collect();
    assert_eq!(rows.len(), 21);
    // The JSONL keys are the CSV columns, in the same order.
    let keys: Vec<&str> = rows[0]
        .as_object()
        .unwrap()
        .keys()
        .map(String::as_str)
        .collect();
    let mut sorted_header = header.clone();
    sorted_header.sort();
    assert_eq!(
        keys,
        sorted_header.iter().map(String::as_str).collect::<Vec<_>>()
    );
    insta::assert_snapshot!("batch_jsonl", stdout(&o));
}

#[test]
fn batch_over_a_generated_corpus_with_one_broken_file() {
    let dir = temp_dir("corpus");
    let n = 1_000;
    support::corpus::write(&dir.join("cases"), n);
    // One broken file in the middle: a missing unit and an unknown keyword.
    std::fs::write(
        dir.join("cases/case-00500.parax"),
        "eye right\n  refraction -2.00 @ 12\n  refracton -1\n",
    )
    .unwrap();
    let o = parax_in(&dir, &["eval", "--format", "csv", "cases"]);
    assert_eq!(code(&o), 1, "one file failed");
    let err = stderr(&o);
    assert!(
        err.contains("evaluated 1000 files: 999 ok, 1 failed"),
        "{err}"
    );
    assert!(err.contains("cases/case-00500.parax:2:22: P0201"), "{err}");
    let out = stdout(&o);
    let mut reader = csv::Reader::from_reader(out.as_bytes());
    let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.unwrap()).collect();
    assert_eq!(
        rows.len(),
        999 * 2 + 1,
        "two eyes per good file, one error row"
    );
    let errors: Vec<_> = rows.iter().filter(|r| &r[3] == "error").collect();
    assert_eq!(errors.len(), 1);
    assert_eq!(&errors[0][0], "cases/case-00500.parax");
    // Rows come in file order although files are evaluated in parallel.
    assert_eq!(&rows[0][0], "cases/case-00000.parax");
    assert_eq!(&rows[rows.len() - 1][0], "cases/case-00999.parax");
    // Piped: no progress bar on standard error (only the summary and the error).
    assert_eq!(err.lines().count(), 2, "{err}");
}

#[test]
fn stats_against_values_worked_by_hand() {
    // Three invented cases, right eyes -2.00/-1.00×90, -1.00/-2.00×45 and
    // +1.00/-0.50×180 (tag "a"), and one more (tag "b") that is a plain sphere.
    let dir = temp_dir("stats");
    let case = |name: &str, tag: &str, date: &str, rx: &str| {
        std::fs::write(
            dir.join(name),
            format!("# Invented test case.\ncase \"{name}\"\n  date {date}\n  tag {tag}\n\neye right\n  refraction {rx} @ 12 mm\n"),
        )
        .unwrap();
    };
    case("a1.parax", "a", "2024-02-01", "-2.00 / -1.00 x 90");
    case("a2.parax", "a", "2024-05-01", "-1.00 / -2.00 x 45");
    case("a3.parax", "a", "2025-01-09", "+1.00 / -0.50 x 180");
    case("b1.parax", "b", "2025-03-03", "-3.00");
    let o = parax_in(
        &dir,
        &["stats", "--group-by", "tag", "--format", "json", "."],
    );
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let a = &v["groups"][0];
    assert_eq!(a["group"], "a");
    assert_eq!(a["eye"], "right");
    assert_eq!(a["count"], 3);
    let f = |x: &serde_json::Value| x.as_f64().unwrap();
    let close = |a: f64, b: f64, tol: f64| assert!((a - b).abs() <= tol, "{a} vs {b}");
    // [C] Thibos, Wheeler & Horner, Optom Vis Sci 1997 definitions, worked by hand:
    // vectors (−2.50, −0.50, 0), (−2.00, 0, +1.00), (+0.75, +0.25, 0).
    // Mean M −1.25, J0 −1/12, J45 1/3; sample SD 1.75, 0.381881, 0.577350;
    // mean as sph/cyl −0.906408 / −0.687184 × 52.018. Tolerance 1e-6 D, 1e-3°.
    close(f(&a["mean"]["m"]), -1.25, 1e-6);
    close(f(&a["mean"]["j0"]), -1.0 / 12.0, 1e-6);
    close(f(&a["mean"]["j45"]), 1.0 / 3.0, 1e-6);
    close(f(&a["sd"]["m"]), 1.75, 1e-6);
    close(f(&a["sd"]["j0"]), 0.381881, 1e-6);
    close(f(&a["sd"]["j45"]), 0.577350, 1e-6);
    close(f(&a["mean_sphcyl"]["sphere"]), -0.906408, 1e-6);
    close(f(&a["mean_sphcyl"]["cylinder"]), -0.687184, 1e-6);
    close(f(&a["mean_sphcyl"]["axis"]), 52.018, 1e-3);
    assert_eq!(a["mean_sphcyl"]["text"], "-0.91 / -0.69 x 52");
    let b = &v["groups"][1];
    assert_eq!(
        (b["group"].as_str(), b["count"].as_u64()),
        (Some("b"), Some(1))
    );
    assert!(b["sd"].is_null(), "no SD of one refraction");
    // By year: 2024 holds the first two.
    let o = parax_in(
        &dir,
        &["stats", "--group-by", "year", "--format", "json", "."],
    );
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(v["groups"][0]["group"], "2024");
    assert_eq!(v["groups"][0]["count"], 2);
    // [C] mean M of −2.50 and −2.00 is −2.25; tol 1e-9
    close(f(&v["groups"][0]["mean"]["m"]), -2.25, 1e-9);
}

#[test]
fn stats_of_the_examples() {
    let o = parax(&["stats", "examples"]);
    assert_eq!(code(&o), 0);
    insta::assert_snapshot!("stats_examples", stdout(&o));
}

#[test]
fn render_examples_to_svg_and_png() {
    let dir = temp_dir("render");
    let mut names = Vec::new();
    for example in [
        "examples/bench-relay.parax",
        "examples/clinic-review.parax",
        "examples/eye-model.parax",
    ] {
        let o = parax(&["render", example, "--out", dir.to_str().unwrap()]);
        assert_eq!(code(&o), 0, "{}", stderr(&o));
    }
    let mut entries: Vec<PathBuf> = std::fs::read_dir(&dir)
        .unwrap()
        .map(|e| e.unwrap().path())
        .collect();
    entries.sort();
    for p in &entries {
        let name = p.file_name().unwrap().to_string_lossy().into_owned();
        let svg = std::fs::read_to_string(p).unwrap();
        // Valid SVG: resvg parses and rasterises it; the PNG has ink.
        let tree = resvg::usvg::Tree::from_str(&svg, &resvg::usvg::Options::default())
            .unwrap_or_else(|e| panic!("{name}: {e}"));
        let size = tree.size().to_int_size();
        let mut pixmap = resvg::tiny_skia::Pixmap::new(size.width(), size.height()).unwrap();
        resvg::render(
            &tree,
            resvg::tiny_skia::Transform::default(),
            &mut pixmap.as_mut(),
        );
        let ink = pixmap
            .pixels()
            .iter()
            .filter(|c| (c.red(), c.green(), c.blue()) != (255, 255, 255))
            .count();
        assert!(ink > 1_000, "{name}: drawn");
        std::fs::write(p.with_extension("png"), pixmap.encode_png().unwrap()).unwrap();
        insta::assert_snapshot!(format!("render_{name}"), svg);
        names.push(name);
    }
    assert_eq!(
        names,
        [
            "bench-relay.system.two-lens-bench-relay.svg",
            "clinic-review.eye.left.svg",
            "clinic-review.eye.right.svg",
            "eye-model.eye.right.svg",
            "eye-model.system.corrected-reduced-eye.svg",
        ]
    );
    // The relay's final image is real (solid) and there is a chief ray.
    let relay =
        std::fs::read_to_string(dir.join("bench-relay.system.two-lens-bench-relay.svg")).unwrap();
    assert_eq!(
        relay.matches(r#"class="arrow real""#).count(),
        3,
        "object and two real images"
    );
    assert!(relay.contains(r#"class="chief-ray""#));
}

#[test]
fn render_marks_a_virtual_image_dashed() {
    // An invented bench set-up: one negative lens, object 50 cm before it. The
    // image is virtual, 12.5 cm before the lens ([C] L' = −2 − 6 = −8 D,
    // l' = −0.125 m; m = L/L' = 0.25, erect).
    let dir = temp_dir("render-virtual");
    std::fs::write(
        dir.join("minus.parax"),
        "# Invented test case.\nsystem \"minus lens\"\n  object 50 cm before N\n  lens N -6.00 D\n",
    )
    .unwrap();
    let o = parax_in(&dir, &["render", "minus.parax", "--out", "out"]);
    assert_eq!(code(&o), 0, "{}", stderr(&o));
    let svg = std::fs::read_to_string(dir.join("out/minus.system.minus-lens.svg")).unwrap();
    assert_eq!(svg.matches(r#"class="arrow virtual""#).count(), 1);
    assert!(svg.contains("final image (virtual)"));
    assert!(
        svg.contains(r#"class="chief-ray virtual""#),
        "traced back to the virtual image"
    );
    insta::assert_snapshot!("render_virtual_image", svg);
}
