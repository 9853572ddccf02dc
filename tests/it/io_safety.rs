//! What the tool does to the files and pipes around it: input files are never
//! written (bytes and modification times unchanged after every command), a closed
//! output pipe ends the run quietly, and every row read is either used or reported.

use std::collections::BTreeMap;
use std::io::Read;
use std::path::{Path, PathBuf};
use std::process::Stdio;
use std::time::{Duration, SystemTime};

use assert_cmd::cargo::CommandCargoExt;
use chrono::NaiveDate;
use strake::calc::assess::{AssessOptions, assess};
use strake::input::tank_dir::load_tank_dir;
use strake::model::warning::Warning;

use crate::support::{root, sample, strake};

/// Every file under `dir`, sorted.
fn files_under(dir: &Path) -> Vec<PathBuf> {
    let mut out = Vec::new();
    let mut stack = vec![dir.to_path_buf()];
    while let Some(d) = stack.pop() {
        for e in std::fs::read_dir(&d).expect("read dir") {
            let p = e.expect("entry").path();
            if p.is_dir() {
                stack.push(p);
            } else {
                out.push(p);
            }
        }
    }
    out.sort();
    out
}

fn copy_tree(from: &Path, to: &Path) {
    for f in files_under(from) {
        let rel = f.strip_prefix(from).expect("under");
        let dest = to.join(rel);
        std::fs::create_dir_all(dest.parent().expect("parent")).expect("mkdir");
        std::fs::copy(&f, &dest).expect("copy");
    }
}

/// (path, bytes, modification time) of every file under `dir`.
fn snapshot(dir: &Path) -> Vec<(PathBuf, Vec<u8>, SystemTime)> {
    files_under(dir)
        .into_iter()
        .map(|p| {
            let bytes = std::fs::read(&p).expect("read");
            let mtime = std::fs::metadata(&p)
                .and_then(|m| m.modified())
                .expect("mtime");
            (p, bytes, mtime)
        })
        .collect()
}

/// Every command, in every format, on a copy of a sample tank whose files carry an
/// old modification time: afterwards the same files hold the same bytes with the
/// same times, and no file was added (formats.md: input files are never written).
#[test]
fn input_files_are_never_written() {
    let tmp = tempfile::tempdir().expect("temp dir");
    let tank = tmp.path().join("kestrel-t12");
    copy_tree(&sample("kestrel-t12"), &tank);
    // An old, exact time: a write of the same bytes would still move it.
    let old = SystemTime::UNIX_EPOCH + Duration::from_secs(1_000_000_000);
    for f in files_under(&tank) {
        let file = std::fs::File::options()
            .append(true)
            .open(&f)
            .expect("open to set the time");
        file.set_modified(old).expect("set mtime");
    }
    let before = snapshot(&tank);
    assert!(before.iter().all(|(_, _, t)| *t == old));
    let dir = tank.to_str().expect("utf-8 path").to_string();
    let survey = tank
        .join("surveys")
        .join("2026-ut-survey.csv")
        .to_str()
        .expect("utf-8 path")
        .to_string();
    let out = tmp
        .path()
        .join("report")
        .to_str()
        .expect("utf-8 path")
        .to_string();
    let runs: Vec<Vec<&str>> = vec![
        vec!["assess", &dir, "--out", &out, "--stamp"],
        vec!["check", &dir],
        vec!["check", &survey],
        vec!["check", &dir, "--format", "json"],
        vec!["assess", &dir],
        vec!["assess", &dir, "--format", "json"],
        vec!["assess", &dir, "--format", "csv"],
        vec!["assess", &dir, "--units", "usc", "--as-of", "2016-12-31"],
        vec!["assess", &dir, "--sg", "1.0", "--fill-height", "12"],
        vec!["assess", &dir, "--fail-below-minimum"],
        vec!["fill-height", &dir],
        vec!["fill-height", &dir, "--sg", "1.2", "--format", "json"],
        vec!["fill-height", &dir, "--format", "csv", "--years", "10"],
    ];
    for args in &runs {
        let run = strake(args);
        assert!(
            run.code == 0 || run.code == 3,
            "{args:?}: exit {}\n{}",
            run.code,
            run.stderr
        );
    }
    let after = snapshot(&tank);
    assert_eq!(
        before.iter().map(|f| &f.0).collect::<Vec<_>>(),
        after.iter().map(|f| &f.0).collect::<Vec<_>>(),
        "no file added or removed"
    );
    for ((path, b0, t0), (_, b1, t1)) in before.iter().zip(&after) {
        assert!(b0 == b1, "{} changed", path.display());
        assert_eq!(t0, t1, "{} was written", path.display());
    }
}

/// `strake ... | head -1`: the reader closes the pipe early. The run ends quietly:
/// exit 0 and nothing on standard error, whatever the command and format, and with an
/// output far larger than a pipe's buffer (64 KiB on Linux).
#[test]
fn broken_pipe_exits_quietly() {
    let t12 = sample("kestrel-t12");
    let t12 = t12.to_str().expect("utf-8 path");
    // `check` of the same tank many times: several hundred KiB of output.
    let mut big: Vec<&str> = vec!["check"];
    big.extend(std::iter::repeat_n(t12, 400));
    let runs: Vec<Vec<&str>> = vec![
        vec!["assess", t12],
        vec!["assess", t12, "--format", "json"],
        vec!["assess", t12, "--format", "csv"],
        vec!["fill-height", t12, "--sg", "1.0"],
        big,
    ];
    for args in &runs {
        for read_first_line in [false, true] {
            let mut child = std::process::Command::cargo_bin("strake")
                .expect("binary built")
                .current_dir(root())
                .env("NO_COLOR", "1")
                .args(args)
                .stdout(Stdio::piped())
                .stderr(Stdio::piped())
                .spawn()
                .expect("spawn strake");
            let mut stdout = child.stdout.take().expect("stdout");
            if read_first_line {
                // Like `head -1`: read a little, then close.
                let mut buf = [0u8; 64];
                let _ = stdout.read(&mut buf);
            }
            drop(stdout);
            let mut stderr = String::new();
            child
                .stderr
                .take()
                .expect("stderr")
                .read_to_string(&mut stderr)
                .expect("read stderr");
            let status = child.wait().expect("wait");
            let label = format!(
                "{} (read first: {read_first_line})",
                args[..args.len().min(4)].join(" ")
            );
            assert_eq!(status.code(), Some(0), "{label}: {stderr}");
            assert!(
                !stderr.contains("error"),
                "{label}: stderr not quiet: {stderr}"
            );
            // CSV warnings and the caution go to stderr by design; nothing else may.
            assert!(
                stderr
                    .lines()
                    .all(|l| l.starts_with("warning: ") || l.starts_with("caution: ")),
                "{label}: {stderr}"
            );
        }
    }
}

/// Data rows of a survey file counted without the reader: lines that are not blank
/// and not `#` comments, less the header (the sample files hold no quoted line breaks).
fn data_rows(path: &Path) -> usize {
    let text = std::fs::read_to_string(path).expect("utf-8 survey");
    let rows = text
        .lines()
        .filter(|l| {
            let t = l.trim_start_matches('\u{feff}').trim();
            !t.is_empty() && !t.starts_with('#') && t.chars().any(|c| !",;\t".contains(c))
        })
        .count();
    rows.saturating_sub(1)
}

/// Nothing is dropped silently: every data row of every survey file is either a
/// reading the assessment uses or a row reported in a warning (a repeat counted once,
/// a reading after `--as-of`), and every other entry of surveys/ is reported as not
/// read. Checked on the sample tanks and on the corpus cases that
/// end with warnings.
#[test]
fn every_row_is_used_or_reported() {
    let today = NaiveDate::from_ymd_opt(2026, 12, 1).expect("date");
    let mut folders: Vec<PathBuf> = ["kestrel-t03", "kestrel-t07", "kestrel-t12"]
        .iter()
        .map(|n| sample(n))
        .collect();
    let corpus = root().join("tests").join("corpus");
    for e in std::fs::read_dir(&corpus).expect("corpus") {
        let p = e.expect("entry").path();
        if p.file_name()
            .and_then(|n| n.to_str())
            .is_some_and(|n| n.starts_with("warn-"))
        {
            folders.push(p);
        }
    }
    folders.sort();
    assert!(folders.len() >= 8);
    for dir in &folders {
        let folder = load_tank_dir(dir, today).expect("loads");
        // Rows of the .csv files in surveys/; every other entry there is reported
        // whole, as not read.
        let mut rows = 0;
        for e in std::fs::read_dir(dir.join("surveys")).expect("surveys/") {
            let p = e.expect("entry").path();
            if p.extension().is_some_and(|x| x.eq_ignore_ascii_case("csv")) {
                rows += data_rows(&p);
            } else {
                let shown = p.display().to_string();
                assert!(
                    folder
                        .warnings
                        .iter()
                        .any(|w| matches!(w, Warning::NotRead { path, .. } if *path == shown)),
                    "{shown}: neither read nor reported"
                );
            }
        }
        let reported_repeats = folder
            .warnings
            .iter()
            .filter(|w| matches!(w, Warning::DuplicateReading { .. }))
            .count();
        let read: usize = folder.files.iter().map(|f| f.rows).sum();
        assert_eq!(read, rows, "{}: rows read", dir.display());
        assert_eq!(
            rows,
            folder.readings.readings.len() + reported_repeats,
            "{}: rows = readings kept + repeats reported",
            dir.display()
        );
        // The assessment uses every reading kept, or reports those after --as-of.
        let dates: Vec<NaiveDate> = folder.readings.readings.iter().map(|r| r.date).collect();
        let mut as_ofs = vec![None];
        if let (Some(first), Some(last)) = (dates.iter().min(), dates.iter().max())
            && first < last
        {
            as_ofs.push(Some(*first));
        }
        for as_of in as_ofs {
            let a = assess(
                &folder.tank,
                &folder.readings,
                AssessOptions {
                    as_of,
                    ..AssessOptions::default()
                },
            )
            .expect("assessable");
            let used: usize = a.surveys.iter().map(|s| s.readings).sum();
            let left_out: usize = a
                .warnings
                .iter()
                .map(|w| match w {
                    Warning::ReadingsAfterAsOf { count, .. } => *count,
                    _ => 0,
                })
                .sum();
            assert_eq!(
                used + left_out,
                folder.readings.readings.len(),
                "{} as of {as_of:?}: readings used + left out",
                dir.display()
            );
            if as_of.is_some() {
                assert!(left_out > 0, "{}: --as-of leaves some out", dir.display());
            }
        }
    }
}

/// Every file below `dir` by path relative to it, split into the files under their
/// final names and the temporary files of the atomic writer (`.<name>.tmp-<pid>`,
/// report::write::write_atomic), which a killed run may leave behind.
fn report_tree(dir: &Path) -> (BTreeMap<String, Vec<u8>>, Vec<String>) {
    let mut files = BTreeMap::new();
    let mut temporary = Vec::new();
    if !dir.exists() {
        return (files, temporary);
    }
    for p in files_under(dir) {
        let rel = p.strip_prefix(dir).expect("under").display().to_string();
        let name = p.file_name().expect("name").to_string_lossy().into_owned();
        if name.starts_with('.') && name.contains(".tmp-") {
            temporary.push(rel);
        } else if let Ok(bytes) = std::fs::read(&p) {
            files.insert(rel, bytes);
        }
    }
    (files, temporary)
}

/// True when a temporary file of the atomic writer exists below `dir` (read without
/// failing on entries that come and go while the run writes).
fn temporary_file_below(dir: &Path) -> bool {
    let mut stack = vec![dir.to_path_buf()];
    while let Some(d) = stack.pop() {
        let Ok(entries) = std::fs::read_dir(&d) else {
            continue;
        };
        for e in entries.flatten() {
            let name = e.file_name().to_string_lossy().into_owned();
            if name.starts_with('.') && name.contains(".tmp-") {
                return true;
            }
            if e.file_type().is_ok_and(|t| t.is_dir()) {
                stack.push(e.path());
            }
        }
    }
    false
}

/// When a trial kills the run.
#[derive(Debug, Clone, Copy)]
enum KillAt {
    /// This long after the first temporary file of the atomic writer is seen (the run
    /// is writing a file at that moment).
    AfterFirstTemporary(Duration),
    /// This fraction of a whole run's duration after the start.
    Fraction(f64),
}

/// Reports are written atomically (formats.md; issue 4, item 4): runs are killed with
/// SIGKILL at several moments while they write a report over an earlier one, and
/// afterwards every file under its final name is byte for byte either the earlier
/// run's version or the new run's, never a part; the only other files are the
/// writer's hidden temporary files (`.<name>.tmp-<pid>`), which no reader takes for a
/// report file.
///
/// The two versions: the report folders of the same tanks written with `--units usc`
/// (the earlier run) and with `--units si` (the new run), so that a file of the new
/// run differs from the earlier one. The kills land just after a temporary file
/// appears (a write in progress) and at fixed fractions of a run; a kill that comes
/// after the run has finished is harmless and the check still holds. The test asserts
/// the property in every trial, and that at least one trial killed a running process.
#[test]
fn killed_while_writing_leaves_each_report_file_old_or_new() {
    use std::os::unix::process::ExitStatusExt;
    let tmp = tempfile::tempdir().expect("temp dir");
    // A fleet of four tanks: each worker writes its tank's report files as it finishes,
    // so a run writes files over most of its duration.
    let fleet = tmp.path().join("fleet");
    for (i, name) in ["kestrel-t12", "kestrel-t03", "kestrel-t07"]
        .iter()
        .cycle()
        .take(4)
        .enumerate()
    {
        let to = fleet.join(format!("t{i}"));
        copy_tree(&sample(name), &to);
        let toml = std::fs::read_to_string(to.join("tank.toml")).expect("tank.toml");
        let id_line = toml
            .lines()
            .find(|l| l.starts_with("id = "))
            .expect("id line")
            .to_string();
        std::fs::write(
            to.join("tank.toml"),
            toml.replace(&id_line, &format!("id = \"T{i}\"")),
        )
        .expect("write tank.toml");
    }
    let fleet_arg = fleet.to_str().expect("utf-8 path").to_string();
    let command = |out: &Path, units: &str, args: &[&str]| {
        let mut c = std::process::Command::cargo_bin("strake").expect("binary built");
        c.current_dir(root())
            .env("NO_COLOR", "1")
            .args(args)
            .arg("--out")
            .arg(out)
            .args(["--units", units])
            .stdout(Stdio::null())
            .stderr(Stdio::null());
        c
    };
    let t12 = sample("kestrel-t12");
    let t12 = t12.to_str().expect("utf-8 path");
    // Files a report folder holds: as many as the committed sample report of that tank
    // (tests/it/report.rs keeps those current); a fleet page adds three.
    let count = |id: &str| {
        std::fs::read_dir(root().join("reports").join(id))
            .expect("committed report")
            .count()
    };
    let fleet_files = 3 + ["KR-T12", "KR-T03", "KR-T07", "KR-T12"]
        .iter()
        .map(|id| count(id))
        .sum::<usize>();
    let jobs: [(&str, Vec<&str>, usize); 2] = [
        ("fleet", vec!["fleet", &fleet_arg], fleet_files),
        ("assess", vec!["assess", t12], count("KR-T12")),
    ];
    let mut killed_running = 0;
    let mut mixed = 0;
    let mut seen_temporary = 0;
    for (label, args, file_count) in &jobs {
        let (old_dir, new_dir) = (tmp.path().join("old"), tmp.path().join("new"));
        let _ = std::fs::remove_dir_all(&old_dir);
        let _ = std::fs::remove_dir_all(&new_dir);
        assert!(
            command(&old_dir, "usc", args)
                .status()
                .expect("runs")
                .success()
        );
        let started = std::time::Instant::now();
        assert!(
            command(&new_dir, "si", args)
                .status()
                .expect("runs")
                .success()
        );
        let whole = started.elapsed();
        let (old, old_temp) = report_tree(&old_dir);
        let (new, new_temp) = report_tree(&new_dir);
        assert_eq!(old.len(), *file_count, "{label}: {:?}", old.keys());
        assert_eq!(
            old.keys().collect::<Vec<_>>(),
            new.keys().collect::<Vec<_>>(),
            "{label}"
        );
        assert!(old_temp.is_empty() && new_temp.is_empty(), "{label}");
        let differing = old.iter().filter(|(k, v)| new[*k] != **v).count();
        assert!(
            differing * 2 > old.len(),
            "{label}: the two versions differ"
        );
        let moments = [
            KillAt::AfterFirstTemporary(Duration::ZERO),
            KillAt::AfterFirstTemporary(Duration::from_millis(3)),
            KillAt::AfterFirstTemporary(Duration::from_millis(30)),
            KillAt::Fraction(0.3),
            KillAt::Fraction(0.6),
            KillAt::Fraction(0.9),
        ];
        for (trial, moment) in moments.iter().enumerate() {
            let out = tmp.path().join(format!("{label}-{trial}"));
            copy_tree(&old_dir, &out);
            let mut child = command(&out, "si", args).spawn().expect("spawn strake");
            let spawned = std::time::Instant::now();
            match *moment {
                KillAt::AfterFirstTemporary(delay) => {
                    // Poll until a temporary file shows, or the run ends.
                    loop {
                        if temporary_file_below(&out) {
                            seen_temporary += 1;
                            break;
                        }
                        if child.try_wait().expect("try_wait").is_some()
                            || spawned.elapsed() > whole * 20 + Duration::from_secs(30)
                        {
                            break;
                        }
                    }
                    std::thread::sleep(delay);
                }
                KillAt::Fraction(f) => std::thread::sleep(whole.mul_f64(f)),
            }
            let _ = child.kill(); // SIGKILL on Unix; an error only if it had ended.
            let status = child.wait().expect("wait");
            if status.signal() == Some(9) {
                killed_running += 1;
            }
            let (now, _temporary) = report_tree(&out);
            let mut from_new = 0;
            for (name, bytes) in &old {
                let got = now
                    .get(name)
                    .unwrap_or_else(|| panic!("{label} {moment:?}: {name} is gone"));
                if got == bytes {
                    continue;
                }
                assert!(
                    *got == new[name],
                    "{label} {moment:?}: {name} is neither the old nor the new version \
                     ({} bytes; old {}, new {})",
                    got.len(),
                    bytes.len(),
                    new[name].len()
                );
                from_new += 1;
            }
            assert_eq!(
                now.keys().collect::<Vec<_>>(),
                old.keys().collect::<Vec<_>>(),
                "{label} {moment:?}: no other file under a final name"
            );
            if from_new > 0 && from_new < differing {
                mixed += 1;
            }
            // A later whole run brings every file to the new version.
            if trial == 0 {
                assert!(command(&out, "si", args).status().expect("runs").success());
                assert_eq!(report_tree(&out).0, new, "{label} {moment:?}: rerun");
            }
        }
    }
    eprintln!(
        "note: {killed_running} of 12 runs killed while running, {mixed} left a mix of \
         old and new files, a temporary file seen in {seen_temporary} of 6 polls"
    );
    assert!(killed_running > 0, "no run was killed while it ran");
    // Files do go through temporary files (35 files a fleet run, each renamed into
    // place): a writer that wrote the final names directly would never show one.
    assert!(seen_temporary > 0, "no temporary file was ever seen");
}
