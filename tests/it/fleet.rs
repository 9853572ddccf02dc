//! `strake fleet`: every tank folder below a folder, in planning order, with broken
//! folders listed and the others assessed.

use std::path::Path;

use crate::support::{SMALL_SI_TANK, TankFixture, json, root, strake};

/// Copies a sample tank folder to `to` (tank.toml and surveys/), with its id replaced.
fn copy_sample(name: &str, to: &Path, id: Option<&str>) {
    let from = root().join("sample-inspections").join(name);
    std::fs::create_dir_all(to.join("surveys")).expect("mkdir");
    let mut toml = std::fs::read_to_string(from.join("tank.toml")).expect("tank.toml");
    if let Some(id) = id {
        let old = toml
            .lines()
            .find(|l| l.starts_with("id = "))
            .expect("id line")
            .to_string();
        toml = toml.replace(&old, &format!("id = \"{id}\""));
    }
    std::fs::write(to.join("tank.toml"), toml).expect("write");
    for f in std::fs::read_dir(from.join("surveys")).expect("surveys") {
        let f = f.expect("entry").path();
        std::fs::copy(&f, to.join("surveys").join(f.file_name().expect("name"))).expect("copy");
    }
}

#[test]
fn sample_fleet_snapshots() {
    for (format, ext) in [("text", "txt"), ("json", "json"), ("csv", "csv")] {
        let run = strake(["fleet", "sample-inspections", "--format", format]);
        assert_eq!(run.code, 0, "{format}: {}", run.stderr);
        // Piped standard error: no progress bar, nothing at all.
        assert!(run.stderr.is_empty(), "{}", run.stderr);
        insta::assert_snapshot!(format!("fleet-samples-{ext}"), run.stdout);
    }
}

/// Each fleet line carries the same values as the tank's own assessment, and the
/// next due date is the earlier of its two dates (API 653 6.3 intervals, from the
/// assessment).
#[test]
fn lines_agree_with_each_assessment() {
    let fleet = json(&strake(["fleet", "sample-inspections", "--format", "json"]));
    let tanks = fleet["tanks"].as_array().expect("tanks");
    assert_eq!(tanks.len(), 3);
    for t in tanks {
        let folder = t["folder"].as_str().expect("folder");
        let a = json(&strake(["assess", folder, "--format", "json"]));
        assert_eq!(t["tank_id"], a["tank_id"]);
        for (f, g) in [
            ("governing_course", "governing_course"),
            ("remaining_life_years", "remaining_life_years"),
            ("next_ut_inspection", "next_ut_inspection"),
            ("next_external_inspection", "next_external_inspection"),
            ("latest_survey", "latest_survey"),
            ("operating_fill_height", "operating_fill_height"),
        ] {
            assert_eq!(t[f], a["tank"][g], "{folder}: {f}");
        }
        let ut = a["tank"]["next_ut_inspection"].as_str().expect("ut");
        let ext = a["tank"]["next_external_inspection"].as_str().expect("ext");
        assert_eq!(t["next_due"].as_str(), Some(ut.min(ext)), "{folder}");
        // Allowable level: the least over the courses, at most the shell height.
        let shell: f64 = a["courses"]
            .as_array()
            .expect("courses")
            .iter()
            .map(|c| c["height"].as_f64().expect("height"))
            .sum();
        let least = a["tank"]["max_fill_height"].as_f64().expect("level");
        let allowed = t["allowable_fill_height"].as_f64().expect("allowed");
        assert!(
            (allowed - least.min(shell)).abs() < 1e-3,
            "{folder}: {allowed}"
        );
    }
}

/// Planning order: next due date ascending; equal dates by tank id. A copy of
/// KR-T12 under the id KR-T00 has the same due date and must come just before it.
#[test]
fn ordered_by_due_date_then_id() {
    let dir = tempfile::tempdir().expect("temp dir");
    copy_sample("kestrel-t12", &dir.path().join("a-site/t12"), None);
    copy_sample(
        "kestrel-t12",
        &dir.path().join("b-site/t00"),
        Some("KR-T00"),
    );
    copy_sample("kestrel-t03", &dir.path().join("b-site/t03"), None);
    copy_sample("kestrel-t07", &dir.path().join("c/d/e/t07"), None);
    let run = strake([
        "fleet",
        dir.path().to_str().expect("utf-8"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    let tanks = v["tanks"].as_array().expect("tanks");
    let ids: Vec<&str> = tanks
        .iter()
        .map(|t| t["tank_id"].as_str().expect("id"))
        .collect();
    // Due dates, from the snapshot of each sample: KR-T07 2028-08-30 (external),
    // KR-T12 2028-10-01 (external), KR-T03 2030-10-07 (external).
    assert_eq!(ids, ["KR-T07", "KR-T00", "KR-T12", "KR-T03"]);
    let due: Vec<&str> = tanks
        .iter()
        .map(|t| t["next_due"].as_str().expect("due"))
        .collect();
    assert!(due.windows(2).all(|w| w[0] <= w[1]), "{due:?}");
}

/// A broken tank folder is listed with its error (file:line and value), the others
/// are assessed, and the exit code is 1.
#[test]
fn broken_folder_is_listed_and_exit_is_1() {
    let dir = tempfile::tempdir().expect("temp dir");
    copy_sample("kestrel-t12", &dir.path().join("t12"), None);
    let broken = TankFixture::new(SMALL_SI_TANK).survey(
        "a.csv",
        "date,course,thickness\n2024-01-01,1,9.0\n2024-01-01,x,9.0\n",
    );
    let target = dir.path().join("t99");
    std::fs::create_dir_all(target.join("surveys")).expect("mkdir");
    std::fs::copy(broken.path().join("tank.toml"), target.join("tank.toml")).expect("copy");
    std::fs::copy(
        broken.path().join("surveys/a.csv"),
        target.join("surveys/a.csv"),
    )
    .expect("copy");
    let root_arg = dir.path().to_str().expect("utf-8");
    let file = target.join("surveys/a.csv").display().to_string();
    let message = format!(
        "{file}:3: column \"course\": \"x\" is not a course number (expected a whole number, 1 = bottom course)"
    );

    let run = strake(["fleet", root_arg]);
    assert_eq!(run.code, 1);
    assert_eq!(run.stderr, format!("error: {message}\n"));
    assert!(run.stdout.contains("KR-T12"), "{}", run.stdout);
    assert!(run.stdout.contains("Errors (1)"), "{}", run.stdout);

    let run = strake(["fleet", root_arg, "--format", "json"]);
    assert_eq!(run.code, 1);
    let v = json(&run);
    assert_eq!(
        (v["assessed"].as_u64(), v["failed"].as_u64()),
        (Some(1), Some(1))
    );
    let last = &v["tanks"][1];
    assert_eq!(last["status"], "error");
    assert_eq!(last["tank_id"], "FX-1");
    assert_eq!(last["error"].as_str(), Some(message.as_str()));
    assert_eq!(v["tanks"][0]["status"], "monitor");

    let run = strake(["fleet", root_arg, "--format", "csv"]);
    assert_eq!(run.code, 1);
    let last = run.stdout.lines().last().expect("rows");
    assert!(last.starts_with("FX-1,,"), "{last}");
    assert!(last.contains(",error,"), "{last}");
}

/// A folder with no tank folder below it is an error of its own.
#[test]
fn no_tank_folder() {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::create_dir_all(dir.path().join("empty/sub")).expect("mkdir");
    let shown = dir.path().display().to_string();
    let run = strake(["fleet", &shown]);
    assert_eq!(run.code, 1);
    assert_eq!(
        run.stderr.trim_end(),
        format!("error: {shown}: no tank folder (a folder holding tank.toml) below this folder")
    );
}

/// Same input, byte-identical output, whatever the number of worker threads and the
/// order they finish in.
#[test]
fn deterministic_across_runs_and_threads() {
    let dir = tempfile::tempdir().expect("temp dir");
    for i in 0..12 {
        let name = ["kestrel-t12", "kestrel-t03", "kestrel-t07"][i % 3];
        copy_sample(
            name,
            &dir.path().join(format!("t{i:02}")),
            Some(&format!("T{}", 11 - i)),
        );
    }
    let arg = dir.path().to_str().expect("utf-8");
    let run = |threads: &str| {
        let out = assert_cmd::Command::cargo_bin("strake")
            .expect("binary")
            .env("NO_COLOR", "1")
            .env("RAYON_NUM_THREADS", threads)
            .args(["fleet", arg, "--format", "json"])
            .output()
            .expect("runs");
        assert!(out.status.success());
        out.stdout
    };
    let first = run("2");
    assert_eq!(first, run("2"));
    assert_eq!(first, run("1"));
    assert_eq!(first, run("4"));
}
