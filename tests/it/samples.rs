//! The sample tanks (invented demo data): output snapshots (insta) for every format,
//! and the README kept true: its commands run, and every output block it shows is
//! what the binary prints today.

use crate::support::{root, strake, strake_at};

const SAMPLES: [&str; 3] = ["kestrel-t12", "kestrel-t03", "kestrel-t07"];

fn sample_arg(name: &str) -> String {
    format!("sample-inspections/{name}")
}

#[test]
fn assess_snapshots() {
    for name in SAMPLES {
        let dir = sample_arg(name);
        for (format, ext) in [("text", "txt"), ("json", "json"), ("csv", "csv")] {
            let run = strake(["assess", &dir, "--format", format]);
            assert_eq!(run.code, 0, "{name} {format}: {}", run.stderr);
            if format == "csv" {
                // CSV rows hold courses only: the warnings and the caution go to
                // standard error, the caution last.
                assert!(
                    run.stderr
                        .lines()
                        .all(|l| l.starts_with("warning: ") || l.starts_with("caution: ")),
                    "{}",
                    run.stderr
                );
                assert!(
                    run.stderr
                        .lines()
                        .last()
                        .is_some_and(|l| l.starts_with("caution: Screening aid only.")),
                    "{}",
                    run.stderr
                );
            } else {
                assert!(run.stderr.is_empty(), "{}", run.stderr);
            }
            insta::assert_snapshot!(format!("assess-{name}-{ext}"), run.stdout);
        }
    }
}

#[test]
fn fill_height_and_check_snapshots() {
    let run = strake([
        "fill-height",
        "sample-inspections/kestrel-t12",
        "--sg",
        "1.0",
        "--sg",
        "1.2",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    insta::assert_snapshot!("fill-height-kestrel-t12", run.stdout);
    let dirs: Vec<String> = SAMPLES.iter().map(|s| sample_arg(s)).collect();
    let run = strake(std::iter::once("check".to_string()).chain(dirs));
    assert_eq!(run.code, 0, "{}", run.stderr);
    insta::assert_snapshot!("check-samples", run.stdout);
}

/// Same input, byte-identical output.
#[test]
fn output_is_deterministic() {
    let a = strake([
        "assess",
        "sample-inspections/kestrel-t12",
        "--format",
        "json",
    ]);
    let b = strake([
        "assess",
        "sample-inspections/kestrel-t12",
        "--format",
        "json",
    ]);
    assert_eq!(a.stdout, b.stdout);
}

fn readme() -> String {
    std::fs::read_to_string(root().join("README.md")).expect("README.md")
}

/// Every `cargo run --release -- ARGS` line of the README runs and succeeds. The
/// commands run in a scratch folder that sees the sample tanks, so a command that
/// writes files (`--out`) writes there, never into the repository (whose committed
/// reports `report::committed_sample_reports_are_current` compares).
#[test]
fn readme_commands_run() {
    let text = readme();
    let commands: Vec<&str> = text
        .lines()
        .filter_map(|l| l.trim().strip_prefix("cargo run --release -- "))
        .collect();
    assert!(!commands.is_empty(), "README shows no command");
    let scratch = tempfile::tempdir().expect("temp dir");
    link_samples(scratch.path());
    for c in commands {
        let run = strake_at(scratch.path(), c.split_whitespace());
        assert_eq!(run.code, 0, "README command `{c}` failed: {}", run.stderr);
        assert!(!run.stdout.is_empty());
        if c.split_whitespace().any(|a| a == "--out") {
            assert!(
                run.stderr.starts_with("report: reports/"),
                "`{c}`: {}",
                run.stderr
            );
        }
    }
}

/// Makes `dir/sample-inspections` show the repository's sample tanks.
fn link_samples(dir: &std::path::Path) {
    let from = root().join("sample-inspections");
    #[cfg(unix)]
    std::os::unix::fs::symlink(&from, dir.join("sample-inspections")).expect("symlink");
    #[cfg(not(unix))]
    copy_dir(&from, &dir.join("sample-inspections"));
}

#[cfg(not(unix))]
fn copy_dir(from: &std::path::Path, to: &std::path::Path) {
    std::fs::create_dir_all(to).expect("dir");
    for e in std::fs::read_dir(from).expect("read dir") {
        let e = e.expect("entry");
        let target = to.join(e.file_name());
        if e.path().is_dir() {
            copy_dir(&e.path(), &target);
        } else {
            std::fs::copy(e.path(), target).expect("copy");
        }
    }
}

/// Each block after `<!-- strake-output: ARGS -->` is exactly what `strake ARGS`
/// prints now. Set STRAKE_BLESS=1 to rewrite the blocks after a deliberate change.
#[test]
fn readme_outputs_are_current() {
    let text = readme();
    let marker = "<!-- strake-output: ";
    let mut out = String::new();
    let mut rest = text.as_str();
    let mut stale = Vec::new();
    let mut blocks = 0;
    while let Some(i) = rest.find(marker) {
        let (before, after) = rest.split_at(i);
        out.push_str(before);
        let end = after.find(" -->").expect("marker closed");
        let args = &after[marker.len()..end];
        let fence = after
            .find("```text\n")
            .expect("a ```text block follows the marker");
        let body_start = fence + "```text\n".len();
        let body_len = after[body_start..].find("```").expect("block closed");
        let shown = &after[body_start..body_start + body_len];
        let run = strake(args.split_whitespace());
        assert_eq!(run.code, 0, "`strake {args}`: {}", run.stderr);
        if shown != run.stdout {
            stale.push(args.to_string());
        }
        out.push_str(&after[..body_start]);
        out.push_str(&run.stdout);
        rest = &after[body_start + body_len..];
        blocks += 1;
    }
    out.push_str(rest);
    assert!(blocks >= 2, "README shows at least two outputs");
    if std::env::var_os("STRAKE_BLESS").is_some() {
        std::fs::write(root().join("README.md"), out).expect("rewrite README");
        return;
    }
    assert!(
        stale.is_empty(),
        "README output blocks are stale for: {stale:?} (run STRAKE_BLESS=1 cargo test readme)"
    );
}

/// The scan example of the README ("Scan CSV") is a valid scan file.
#[test]
fn readme_scan_example_reads() {
    let text = readme();
    let start = text
        .find("# Thin patch of course 1")
        .expect("README shows a scan example");
    let end = start + text[start..].find("```").expect("example block closed");
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("example.csv");
    std::fs::write(&path, &text[start..end]).expect("write");
    let run = strake(["check", path.to_str().expect("utf-8")]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    assert!(run.stdout.contains("grid scan"), "{}", run.stdout);
}
