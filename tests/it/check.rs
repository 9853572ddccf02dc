//! `strake check`: summaries of tank folders and lone files; errors do not stop the
//! other paths; exit 1 when any path fails.

use crate::support::{SMALL_SI_TANK, TankFixture, sample, strake};

#[test]
fn summarises_a_tank_and_flags_suspects() {
    let fx = TankFixture::new(SMALL_SI_TANK).survey(
        "a.csv",
        "date,course,point,thickness\n2024-01-01,1,P1,9.0\n2024-01-01,1,P2,11.5\n\
         2024-01-01,2,P3,3.9\n2024-01-01,2,P4,7.5\n2024-01-01,2,P4,7.5\n",
    );
    let dir = fx.path().to_str().expect("utf-8 path");
    let run = strake(["check", dir]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let file = fx.shown("surveys/a.csv");
    let expected = [
        format!("{dir}: tank FX-1 - fixture tank, SI, 3 courses, D 30 m"),
        "  1 survey file, 4 readings, 1 survey date".to_string(),
        "  date          c1    c2  total".to_string(),
        "  2024-01-01     2     2      4".to_string(),
        "  courses without any reading: 3".to_string(),
        "checked 1 path: 1 readable, 0 with errors".to_string(),
    ];
    for line in expected {
        assert!(
            run.stdout.lines().any(|l| l.starts_with(&line)),
            "missing line {line:?} in\n{}",
            run.stdout
        );
    }
    // Remarks are wrapped to the terminal width: compare them with the wrapping undone.
    let flat = run.stdout.split_whitespace().collect::<Vec<_>>().join(" ");
    for remark in [
        format!(
            "- {file}:3: course 1: reading 11.50 mm is more than 10 % above the nominal 10.00 mm; kept: re-measure or confirm"
        ),
        format!(
            "- {file}:4: course 2: reading 3.90 mm is below half of the nominal 8.00 mm; kept: re-measure or confirm"
        ),
        format!(
            "- {file}:6: point \"P4\" on 2024-01-01 repeats {file}:5 with the same value; counted once"
        ),
    ] {
        assert!(
            flat.contains(&remark),
            "missing {remark:?} in\n{}",
            run.stdout
        );
    }
}

/// Course 2 runs from 2.50 m to 5.00 m; the tolerance is a tenth of its height
/// (0.25 m, constants.rs, common practice): 5.20 m is inside, 5.30 m and 1.00 m are not.
#[test]
fn flags_an_elevation_outside_its_course() {
    let fx = TankFixture::new(SMALL_SI_TANK).survey(
        "a.csv",
        "date,course,point,elevation_m,thickness
2024-01-01,2,P1,5.20,7.9
         2024-01-01,2,P2,5.30,7.9
2024-01-01,2,P3,1.00,7.9
",
    );
    let dir = fx.path().to_str().expect("utf-8 path");
    let run = strake(["check", dir]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let file = fx.shown("surveys/a.csv");
    let flat = run.stdout.split_whitespace().collect::<Vec<_>>().join(" ");
    for (line, elevation) in [(3, "5.30"), (4, "1.00")] {
        let remark = format!(
            "- {file}:{line}: course 2: reading at elevation {elevation} m lies outside the \
             course (2.50 m to 5.00 m); kept on course 2: check the course number or the elevation"
        );
        assert!(
            flat.contains(&remark),
            "missing {remark:?} in\n{}",
            run.stdout
        );
    }
    assert!(
        !flat.contains(&format!("{file}:2:")),
        "5.20 m is inside:\n{}",
        run.stdout
    );
}

#[test]
fn one_bad_path_does_not_stop_the_others() {
    let good = sample("kestrel-t03");
    let run = strake(["check", good.to_str().expect("utf-8"), "no-such-folder"]);
    assert_eq!(run.code, 1);
    assert_eq!(
        run.stderr.trim_end(),
        "error: no-such-folder: cannot read: no such file or folder"
    );
    assert!(run.stdout.contains("tank KR-T03"));
    assert!(
        run.stdout
            .contains("checked 2 paths: 1 readable, 1 with errors")
    );
}

#[test]
fn lone_csv_without_a_tank() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("export.csv");
    std::fs::write(
        &path,
        "date\tcourse\tthickness\n2024-01-01\t1\t9,5\n2024-01-01\t2\t8,1\n",
    )
    .expect("write");
    let shown = path.display().to_string();
    let run = strake(["check", &shown]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    assert!(
        run.stdout.starts_with(&format!(
            "{shown}: 2 readings, 1 survey date, courses 1, 2, delimiter tab"
        )),
        "{}",
        run.stdout
    );
    assert!(run.stdout.contains("no tank.toml above this file"));
}

#[test]
fn a_survey_file_inside_a_tank_is_checked_against_its_tank() {
    let fx = TankFixture::new(SMALL_SI_TANK)
        .survey("a.csv", "date,course,thickness\n2024-01-01,5,9.0\n");
    let file = fx.shown("surveys/a.csv");
    let run = strake(["check", &file]);
    assert_eq!(run.code, 1);
    assert_eq!(
        run.stderr.trim_end(),
        format!(
            "error: {file}:2: column \"course\": 5 is not a course of this tank, expected 1 to 3 (1 = bottom course)"
        )
    );
}

#[test]
fn json_summary() {
    let run = strake([
        "check",
        sample("kestrel-t07").to_str().expect("utf-8"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0);
    let v: serde_json::Value = serde_json::from_str(&run.stdout).expect("JSON");
    assert_eq!(v["paths"][0]["tank_id"], "KR-T07");
    assert_eq!(v["paths"][0]["readings"], 60);
    assert!(
        v["caution"]
            .as_str()
            .is_some_and(|c| c.starts_with("Screening aid only."))
    );
}
