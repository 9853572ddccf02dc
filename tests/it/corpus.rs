//! The bad-input corpus: `tests/corpus/<case>/` holds a tank folder (tank.toml,
//! surveys/*.csv) or a lone file, and `expected`:
//!
//! ```text
//! # what the case shows
//! args: assess {dir}
//! exit: 1
//! stderr: error: {dir}/surveys/a.csv:2: column "thickness": ...
//! warning: {dir}/surveys/a.csv:6: course 2: reading ...
//! ```
//!
//! `{dir}` is the case folder as given on the command line (relative to the
//! repository root), `{today}` today's date. `stderr:` lines are the whole standard
//! error, in order. `warning:` lines (exit 0 cases) must each be in the JSON
//! `warnings`, in the text output, and on standard error with `--format csv`.
//! An error case run with `assess` is also run with `assess --format json` and
//! `fill-height` (and `check`, where the message points into one of the folder's
//! files): each must give the same line and exit 1.

use std::path::Path;

use assert_cmd::Command;

use crate::support::{SMALL_SI_TANK, TankFixture, root};

/// One case, as read from its `expected` file.
#[derive(Debug)]
struct Case {
    name: String,
    dir: String,
    args: Vec<String>,
    exit: i32,
    stderr: Vec<String>,
    warnings: Vec<String>,
}

fn today() -> String {
    chrono::Local::now().date_naive().to_string()
}

fn load_cases() -> Vec<Case> {
    let corpus = root().join("tests").join("corpus");
    let mut names: Vec<String> = std::fs::read_dir(&corpus)
        .expect("tests/corpus")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    names
        .into_iter()
        .map(|name| {
            let dir = format!("tests/corpus/{name}");
            let text = std::fs::read_to_string(corpus.join(&name).join("expected"))
                .unwrap_or_else(|e| panic!("{dir}/expected: {e}"));
            let fill = |s: &str| s.replace("{dir}", &dir).replace("{today}", &today());
            let mut case = Case {
                name: name.clone(),
                dir: dir.clone(),
                args: Vec::new(),
                exit: -1,
                stderr: Vec::new(),
                warnings: Vec::new(),
            };
            for line in text.lines() {
                if line.starts_with('#') || line.trim().is_empty() {
                    continue;
                }
                let (key, value) = line
                    .split_once(": ")
                    .unwrap_or_else(|| panic!("{dir}/expected: bad line {line:?}"));
                match key {
                    "args" => case.args = value.split_whitespace().map(fill).collect(),
                    "exit" => case.exit = value.parse().expect("exit code"),
                    "stderr" => case.stderr.push(fill(value)),
                    "warning" => case.warnings.push(fill(value)),
                    _ => panic!("{dir}/expected: unknown key {key:?}"),
                }
            }
            assert!(!case.args.is_empty(), "{dir}/expected: no args");
            assert!(case.exit >= 0, "{dir}/expected: no exit");
            case
        })
        .collect()
}

/// Runs strake from the repository root (so `{dir}` is a relative path).
fn run(args: &[String]) -> (i32, String, String) {
    let out = Command::cargo_bin("strake")
        .expect("binary built")
        .current_dir(root())
        .env("NO_COLOR", "1")
        .args(args)
        .output()
        .expect("strake runs");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
    )
}

fn lines(s: &str) -> Vec<String> {
    s.lines().map(str::to_string).collect()
}

/// Whitespace runs as one space: the text output wraps long sentences.
fn squash(s: &str) -> String {
    s.split_whitespace().collect::<Vec<_>>().join(" ")
}

fn check_case(case: &Case) -> Result<(), String> {
    let (code, stdout, stderr) = run(&case.args);
    let label = format!("{} ({})", case.name, case.args.join(" "));
    if code != case.exit {
        return Err(format!(
            "{label}: exit {code}, expected {}\n{stderr}",
            case.exit
        ));
    }
    if case.exit == 0 {
        let json_args: Vec<String> = case
            .args
            .iter()
            .cloned()
            .chain(["--format".into(), "json".into()])
            .collect();
        let (_, json_out, _) = run(&json_args);
        let v: serde_json::Value =
            serde_json::from_str(&json_out).map_err(|e| format!("{label}: JSON output: {e}"))?;
        let json_warnings: Vec<&str> = v["warnings"]
            .as_array()
            .map(|a| a.iter().filter_map(serde_json::Value::as_str).collect())
            .unwrap_or_default();
        let csv_args: Vec<String> = case
            .args
            .iter()
            .cloned()
            .chain(["--format".into(), "csv".into()])
            .collect();
        let (_, _, csv_err) = run(&csv_args);
        let text = squash(&stdout);
        for w in &case.warnings {
            if !json_warnings.contains(&w.as_str()) {
                return Err(format!(
                    "{label}: {w:?} not in JSON warnings {json_warnings:?}"
                ));
            }
            if !text.contains(&squash(w)) {
                return Err(format!("{label}: {w:?} not in the text output:\n{stdout}"));
            }
            if !csv_err.lines().any(|l| l == format!("warning: {w}")) {
                return Err(format!(
                    "{label}: {w:?} not on stderr with --format csv:\n{csv_err}"
                ));
            }
        }
        if json_warnings.len() != case.warnings.len() {
            return Err(format!(
                "{label}: JSON warnings {json_warnings:?}, expected {:?}",
                case.warnings
            ));
        }
        return Ok(());
    }
    if lines(&stderr) != case.stderr {
        return Err(format!(
            "{label}: stderr\n  got:      {:?}\n  expected: {:?}",
            lines(&stderr),
            case.stderr
        ));
    }
    if case.args.first().map(String::as_str) == Some("assess")
        && case.args.len() == 2
        && case.args[1] == case.dir
    {
        if !stdout.is_empty() {
            return Err(format!("{label}: stdout on error:\n{stdout}"));
        }
        // The same input gives the same error under every command that reads it.
        for other in [
            vec!["assess", case.args[1].as_str(), "--format", "json"],
            vec!["fill-height", case.args[1].as_str()],
        ] {
            let other: Vec<String> = other.into_iter().map(str::to_string).collect();
            let (c, o, e) = run(&other);
            if c != 1 || !o.is_empty() || lines(&e) != case.stderr {
                return Err(format!(
                    "{label}: `{}` gave exit {c}, stderr {e:?}",
                    other.join(" ")
                ));
            }
        }
        // `check` describes a folder without needing readings: it must give the same
        // line wherever the message points into the folder's files.
        if !case
            .stderr
            .iter()
            .all(|l| l.contains(&format!("{}/", case.dir)))
        {
            return Ok(());
        }
        let check = vec!["check".to_string(), case.args[1].clone()];
        let (c, _, e) = run(&check);
        if c != 1 || lines(&e) != case.stderr {
            return Err(format!("{label}: `check` gave exit {c}, stderr {e:?}"));
        }
    }
    Ok(())
}

/// Every case of the corpus; all failures are listed together.
#[test]
fn every_corpus_case() {
    let cases = load_cases();
    assert!(cases.len() >= 40, "the corpus has {} cases", cases.len());
    let failures: Vec<String> = cases.iter().filter_map(|c| check_case(c).err()).collect();
    assert!(
        failures.is_empty(),
        "{} of {} corpus cases failed:\n{}",
        failures.len(),
        cases.len(),
        failures.join("\n")
    );
}

/// Each case is either an error with its whole message or a warning case; none is
/// empty and none exits 101 (a panic) or 2 (usage).
#[test]
fn corpus_cases_are_well_formed() {
    for case in load_cases() {
        assert!(
            case.exit == 0 || case.exit == 1,
            "{}: exit {}",
            case.name,
            case.exit
        );
        if case.exit == 1 {
            assert!(!case.stderr.is_empty(), "{}: no stderr line", case.name);
            for line in &case.stderr {
                assert!(line.starts_with("error: "), "{}: {line}", case.name);
                // Every message names the file (or folder) it is about.
                assert!(line.contains(&case.dir), "{}: {line}", case.name);
            }
        } else {
            assert!(!case.warnings.is_empty(), "{}: no warning", case.name);
        }
        assert!(Path::new(&root().join(&case.dir)).is_dir());
    }
}

/// A 10 MB single line (generated here, not committed): refused at its line with the
/// value shortened, never echoed whole.
#[test]
fn ten_megabyte_line() {
    const TEN_MB: usize = 10 * 1024 * 1024;
    // A 10 MB value in the thickness column.
    let mut body = b"date,course,thickness\n2024-06-01,1,".to_vec();
    body.extend(std::iter::repeat_n(b'9', TEN_MB));
    body.push(b'\n');
    let fx = TankFixture::new(SMALL_SI_TANK).survey("a.csv", &body);
    let path = fx.path().to_str().expect("utf-8 path").to_string();
    let (code, stdout, stderr) = run(&["assess".into(), path]);
    assert_eq!(code, 1);
    assert!(stdout.is_empty());
    assert_eq!(
        stderr.trim_end(),
        format!(
            "error: {}:2: column \"thickness\": \"{}...\" is not a finite number (expected a thickness in mm, e.g. 12.40)",
            fx.shown("surveys/a.csv"),
            "9".repeat(57)
        )
    );

    // A 10 MB line of text with no line break at all, as the header.
    let body = vec![b'A'; TEN_MB];
    let fx = TankFixture::new(SMALL_SI_TANK).survey("a.csv", &body);
    let path = fx.path().to_str().expect("utf-8 path").to_string();
    let (code, _, stderr) = run(&["assess".into(), path]);
    assert_eq!(code, 1);
    assert_eq!(
        stderr.trim_end(),
        format!(
            "error: {}:1: unknown column \"{}...\"; known columns: date, course, thickness, thickness_mm, thickness_in, point, elevation, elevation_m, elevation_ft, azimuth, note",
            fx.shown("surveys/a.csv"),
            "A".repeat(57)
        )
    );

    // A 10 MB value in tank.toml.
    let big_id = format!("id = \"{}\"\n", "T".repeat(TEN_MB));
    let fx = TankFixture::new(&SMALL_SI_TANK.replace("id = \"FX-1\"\n", &big_id));
    let path = fx.path().to_str().expect("utf-8 path").to_string();
    let (code, _, stderr) = run(&["assess".into(), path]);
    assert_eq!(code, 1);
    assert_eq!(
        stderr.trim_end(),
        format!(
            "error: {}:2:6: key \"id\": \"{}...\" is not a short tag, expected at most 40 characters on one line, e.g. \"T-101\" (the full name goes in \"name\")",
            fx.shown("tank.toml"),
            "T".repeat(57)
        )
    );
}
