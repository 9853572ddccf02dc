//! Grid scans of local thin areas through the real binary: a grid worked out by hand
//! from the published rules (API 653 4.3.2 and the local form of 4.3.3.1, methods.md
//! s.3-s.5), the same tank in SI and USC, `check` and `--as-of` with scans, and bad
//! scan files (whole error lines).

use crate::support::{TankFixture, close, json, num, strake};

/// One course, 9 m high, D 20 m, level 8.0 m, SG 1.0, A36 as explicit strengths
/// (S = min(0.80 x 250, 0.429 x 400) = 171.6 MPa, API 653 table 4.1, from memory).
pub const SI_TANK: &str = r#"
id = "FX-S"
name = "scan fixture"
units = "SI"
diameter = 20.0
max_fill_height = 8.0
specific_gravity = 1.0
in_service_since = 2000-01-01

[[course]]
height = 9.0
nominal_thickness = 8.0
yield_strength = 250
tensile_strength = 400
"#;

/// Two surveys ten years apart: basis (minimum) 7.50 -> 7.00 mm.
pub const SI_SURVEY: &str = "date,course,point,thickness_mm\n\
    2014-06-01,1,A,7.50\n2014-06-01,1,B,7.80\n\
    2024-06-01,1,A,7.00\n2024-06-01,1,B,7.30\n";

/// The grid, bottom row first (z 0.5 to 1.0 m), pitch 100 mm, pit threshold 3.0 mm.
const GRID_MM: [[Option<f64>; 2]; 6] = [
    [Some(5.6), Some(5.8)],
    [Some(5.2), Some(5.5)],
    [Some(5.0), Some(2.4)],
    [Some(5.4), Some(5.3)],
    [Some(5.8), Some(5.6)],
    [Some(6.0), None],
];

fn grid_text(factor: f64) -> String {
    GRID_MM
        .iter()
        .map(|row| {
            row.iter()
                .map(|c| c.map_or(String::new(), |v| format!("{}", v / factor)))
                .collect::<Vec<_>>()
                .join(",")
        })
        .collect::<Vec<_>>()
        .join("\n")
}

pub fn si_fixture() -> TankFixture {
    let scan = format!(
        "# fixture grid, made up\n# course = 1\n# date = 2024-06-01\n# bottom_elevation = 0.5\n\
         # row_pitch = 100\n# column_pitch = 100\n# pit_threshold = 3.0\n{}\n",
        grid_text(1.0)
    );
    TankFixture::new(SI_TANK)
        .survey("s.csv", SI_SURVEY)
        .scan("patch.csv", scan)
}

/// Whole numbers at these keys of `v`.
fn ints(v: &serde_json::Value, keys: &[&str]) -> Vec<Option<u64>> {
    keys.iter().map(|k| v[*k].as_u64()).collect()
}

fn assess_json(fx: &TankFixture) -> serde_json::Value {
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    json(&run)
}

/// The grid worked by hand (API 653 4.3.2.1-4.3.2.2 and 4.3.3.1 local form, from
/// memory; methods.md s.3-s.5).
///
/// Rate: 7.50 -> 7.00 mm over 3653 d / 365.25 = 10.00137 y: N = 0.0499932 mm/y.
/// Course t_min (one-foot) = 4.9 x 20 x 7.7 / 171.6 = 4.397436 mm; RCA 2.602564;
/// UT interval min(2.602564 / (2 x 0.0499932), 15) = 15 y: N I = 0.749898 mm.
/// Local t_min(z) = 4.9 x 20 x (8 - z) x 1.0 / 171.6 = 0.5710956 (8 - z):
///   z 0.5: 4.283217; z 0.6: 4.226107; z 0.7: 4.168998 mm.
///
/// row (z)    col 1  col 2
///  6 (1.0)   6.0    -
///  5 (0.9)   5.8    5.6
///  4 (0.8)   5.4    5.3
///  3 (0.7)   5.0    2.4 pit
///  2 (0.6)   5.2    5.5
///  1 (0.5)   5.6    5.8
///
/// t2 = 5.0 (row 3, col 1). L = 1.068 x sqrt(20,000 x 5.0) = 1.068 x 316.2278 =
/// 337.7313 mm; k = floor(3.377) + 1 = 4 rows; 3 windows per column.
/// col 1: rows 1-4 21.2 / 4 = 5.30; rows 2-5 5.35; rows 3-6 5.55.
/// col 2 (pit and empty cell excluded): rows 1-4 16.6 / 3 = 5.5333; rows 2-5
///   16.4 / 3 = 5.4667; rows 3-6 10.9 / 2 = 5.45 (2 of 4 valid: half, kept).
/// t1 = 5.30, col 1 rows 1-4, z 0.5: required 4.283217 + 0.749898 = 5.033115: pass
///   (margin 0.266886, the least of the six windows: critical).
/// t2: 5.0 >= 0.6 x 4.283217 + 0.749898 = 3.319827: pass.
/// Pit depth: 2.4 >= 0.5 x 4.283217 + 0.749898 = 2.891506: FAIL.
/// Pit spacing: ceil(200 / 100) = 2 rows; one pit = 100 mm > 50 mm: FAIL.
/// Levels, S E / (4.9 D G) = 171.6 / 98 = 1.7510204 m/mm:
///   now: t1 1.7510204 x 5.30 + 0.5 = 9.780408; t2 x 5.0 / 0.6 + 0.5 = 15.091837;
///        pit x 2.4 / 0.5 + 0.5 = 8.904898 (least);
///   next: pit 1.7510204 x (2.4 - 0.749898) / 0.5 + 0.5 = 6.278727.
/// Course 1 alone: 1.7510204 x 7.0 + 0.3 = 12.557143 m; so the tank's allowable level
/// is the area's, 8.904898 m now and 6.278727 m at the next survey.
#[test]
fn grid_by_hand() {
    let fx = si_fixture();
    let v = assess_json(&fx);
    let tol = 1e-5;
    let a = &v["areas"][0];
    assert_eq!(a["course"], 1);
    assert_eq!(ints(a, &["rows", "columns"]), [Some(6), Some(2)]);
    assert_eq!(
        ints(a, &["readings", "not_measured", "pits"]),
        [Some(11), Some(1), Some(1)]
    );
    assert!(close(num(a, "/t2"), 5.0, tol));
    assert_eq!(ints(a, &["t2_row", "t2_column"]), [Some(3), Some(1)]);
    assert!(close(num(a, "/averaging_length"), 337.7313, tol));
    assert_eq!(a["window_rows"], 4);
    assert_eq!(
        ints(a, &["windows_used", "windows_skipped"]),
        [Some(6), Some(0)]
    );
    assert!(close(num(a, "/t1"), 5.30, tol));
    assert_eq!(
        ints(a, &["t1_column", "t1_first_row", "t1_last_row"]),
        [Some(1), Some(1), Some(4)]
    );
    assert!(close(num(a, "/future_loss"), 0.749898, tol));
    assert!(close(num(a, "/t1_rule/t_min"), 4.283217, tol));
    assert!(close(num(a, "/t1_rule/required"), 5.033115, tol));
    assert_eq!(a["t1_rule"]["pass"], true);
    assert!(close(num(a, "/t2_rule/required"), 3.319827, tol));
    assert_eq!(a["t2_rule"]["pass"], true);
    assert!(close(num(a, "/pit_depth_rule/measured"), 2.4, tol));
    assert!(close(num(a, "/pit_depth_rule/required"), 2.891506, tol));
    assert_eq!(a["pit_depth_rule"]["pass"], false);
    assert_eq!(a["pit_spacing_rule"]["rows_per_span"], 2);
    assert!(close(num(a, "/pit_spacing_rule/worst_length"), 100.0, tol));
    assert_eq!(a["pit_spacing_rule"]["pass"], false);
    assert_eq!(a["acceptable"], false);
    assert!(close(num(a, "/max_fill_height"), 8.904898, tol));
    assert_eq!(a["max_fill_height_rule"], "pit depth");
    assert!(close(num(a, "/max_fill_height_next"), 6.278727, tol));
    assert!(close(num(&v, "/courses/0/max_fill_height"), 12.557143, tol));
    assert!(close(num(&v, "/tank/max_fill_height"), 8.904898, tol));
    assert!(close(num(&v, "/tank/max_fill_height_next"), 6.278727, tol));
    assert!(
        v["tank"]["max_fill_height_scan"]
            .as_str()
            .is_some_and(|s| s.ends_with("patch.csv"))
    );
    // The text output says which governs and why.
    let run = strake(["assess", fx.path().to_str().expect("utf-8")]);
    let flat = run.stdout.split_whitespace().collect::<Vec<_>>().join(" ");
    for want in [
        "does not meet the pit depth and pit spacing rules of API 653 4.3.2 at 8.00 m",
        "Allowable liquid level now: 8.90 m, set by the scanned area on course 1 (patch.csv, pit depth rule).",
        "At the next UT survey (2039-06-01): 6.28 m, set by the scanned area on course 1 (patch.csv, pit depth rule).",
        "pit depth 2.40 >= 0.5 x 4.28 + 0.75 = 2.89 mm FAIL row 3, column 2",
        "pit spacing 100 <= 50 mm within any 200 mm FAIL column 2, rows 2-3",
        "t1 5.30 >= 4.28 + 0.75 = 5.03 mm pass column 1, rows 1-4, H 7.50 m",
    ] {
        assert!(flat.contains(want), "missing {want:?} in\n{}", run.stdout);
    }
}

/// The same tank and grid in USC (every number converted exactly: 1 in = 25.4 mm,
/// 1 ft = 0.3048 m, 1 psi = 6894.757 Pa) give the same L (3.7 sqrt(D[ft] t2[in]) vs
/// 1.068 sqrt(D[mm] t2[mm]): 3.7 / sqrt(12) = 1.06810, 0.009 % apart), the same k, t1,
/// t2 and windows, and t_min and levels within the 0.4 % by which the printed 2.6 and
/// 4.9 differ (methods.md s.1, s.5).
#[test]
fn si_and_usc_agree() {
    let mm = 25.4;
    let ft = 0.3048;
    // MPa per psi: 1 lbf = 4.448 221 615 260 5 N over (0.0254 m)^2 (definitions).
    let psi = 4.448_221_615_260_5 / (0.0254 * 0.0254) / 1e6;
    let usc_tank = format!(
        "id = \"FX-U\"\nunits = \"USC\"\ndiameter = {}\nmax_fill_height = {}\nspecific_gravity = 1.0\n\
         in_service_since = 2000-01-01\n[[course]]\nheight = {}\nnominal_thickness = {}\n\
         yield_strength = {}\ntensile_strength = {}\n",
        20.0 / ft,
        8.0 / ft,
        9.0 / ft,
        8.0 / mm,
        250.0 / psi,
        400.0 / psi
    );
    let usc_scan = format!(
        "# course = 1\n# date = 2024-06-01\n# bottom_elevation = {}\n# row_pitch = {}\n\
         # column_pitch = {}\n# pit_threshold = {}\n{}\n",
        0.5 / ft,
        100.0 / mm,
        100.0 / mm,
        3.0 / mm,
        grid_text(mm)
    );
    let usc = TankFixture::new(&usc_tank)
        .survey("s.csv", SI_SURVEY)
        .scan("patch.csv", usc_scan);
    let s = assess_json(&si_fixture());
    let u = assess_json(&usc);
    let (sa, ua) = (&s["areas"][0], &u["areas"][0]);
    let in_mm = |p: &str| num(ua, p) * mm;
    assert!(close(
        in_mm("/averaging_length"),
        num(sa, "/averaging_length"),
        1.5e-4
    ));
    assert_eq!(sa["window_rows"], ua["window_rows"]);
    for p in ["/t1", "/t2", "/least_pit", "/pit_spacing_rule/worst_length"] {
        assert!(close(in_mm(p), num(sa, p), 1e-5), "{p}");
    }
    assert_eq!(sa["t1_column"], ua["t1_column"]);
    assert_eq!(sa["t1_first_row"], ua["t1_first_row"]);
    for p in ["/t1_rule/t_min", "/t2_rule/t_min", "/t1_rule/required"] {
        assert!(close(in_mm(p), num(sa, p), 0.005), "{p}");
    }
    for p in ["/max_fill_height", "/max_fill_height_next"] {
        assert!(close(num(ua, p) * ft, num(sa, p), 0.005), "{p}");
    }
    for p in [
        "/acceptable",
        "/t1_rule/pass",
        "/t2_rule/pass",
        "/pit_depth_rule/pass",
    ] {
        assert_eq!(sa.pointer(p), ua.pointer(p), "{p}");
    }
    assert_eq!(ua["pit_spacing_rule"]["limit"], 2.0);
    assert_eq!(ua["pit_spacing_rule"]["span"], 8.0);
}

/// `--as-of` before the scan's date leaves the scan out, with a warning.
#[test]
fn as_of_leaves_later_scans_out() {
    let fx = si_fixture();
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8"),
        "--as-of",
        "2020-01-01",
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    assert_eq!(v["areas"].as_array().map(Vec::len), Some(0));
    assert!(
        v["warnings"]
            .as_array()
            .expect("warnings")
            .iter()
            .any(|w| w == "1 scan dated after 2020-01-01 left out (--as-of)")
    );
}

/// `check` lists the scans of a tank folder and checks a lone scan file.
#[test]
fn check_lists_and_checks_scans() {
    let fx = si_fixture();
    let run = strake(["check", fx.path().to_str().expect("utf-8")]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let flat = run.stdout.split_whitespace().collect::<Vec<_>>().join(" ");
    let file = fx.shown("scans/patch.csv");
    assert!(
        flat.contains(&format!(
            "1 grid scan: - {file}: course 1, 2024-06-01, 6 rows x 2 columns, bottom row at 0.5 m, \
             row pitch 100 mm, column pitch 100 mm, 11 readings, 1 not measured, 1 pit (below 3 mm), \
             delimiter comma"
        )),
        "{}",
        run.stdout
    );
    let run = strake(["check", &file]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    assert!(
        run.stdout.starts_with(&format!("{file}: grid scan\n")),
        "{}",
        run.stdout
    );
    assert!(run.stdout.contains("checked against tank FX-S"));
}

// ---------------------------------------------------------------------------------
// Bad scan files: exit 1 and one whole error line naming the file, line (and column),
// the value and what was expected.
// ---------------------------------------------------------------------------------

const HEADER: &str = "# course = 1\n# date = 2024-06-01\n# bottom_elevation = 0.5\n\
                      # row_pitch = 100\n# column_pitch = 100\n";
const GRID: &str = "5.6,5.8\n5.2,5.5\n";

fn scan_err(content: &str) -> (i32, String, String) {
    let fx = TankFixture::new(SI_TANK)
        .survey("s.csv", SI_SURVEY)
        .scan("bad.csv", content);
    let run = strake(["assess", fx.path().to_str().expect("utf-8")]);
    assert!(run.stdout.is_empty(), "{}", run.stdout);
    (
        run.code,
        run.stderr.trim_end().to_string(),
        fx.shown("scans/bad.csv"),
    )
}

macro_rules! scan_case {
    ($name:ident, $content:expr, $pos:expr, $msg:expr) => {
        #[test]
        fn $name() {
            let content: String = $content.into();
            let (code, err, file) = scan_err(&content);
            assert_eq!(code, 1);
            assert_eq!(err, format!("error: {file}{}: {}", $pos, $msg));
        }
    };
}

scan_case!(
    unknown_key,
    HEADER.replace("row_pitch", "row_pich") + GRID,
    ":4:3",
    "unknown key \"row_pich\" in the scan header; did you mean \"row_pitch\"?"
);
scan_case!(
    missing_key,
    HEADER.replace("# column_pitch = 100\n", "") + GRID,
    "",
    "missing required key \"column_pitch\" in the scan header, expected the spacing of the grid's columns, in the thickness unit (mm or in)"
);
scan_case!(
    repeated_key,
    format!("{HEADER}# course = 1\n{GRID}"),
    ":6:12",
    "key \"course\": \"1\" repeats the key of line 1: give each key once"
);
scan_case!(
    header_not_a_number,
    HEADER.replace("row_pitch = 100", "row_pitch = fifty") + GRID,
    ":4:15",
    "key \"row_pitch\": \"fifty\" is not a number, expected a distance in mm, e.g. 50"
);
scan_case!(
    header_not_positive,
    HEADER.replace("column_pitch = 100", "column_pitch = 0") + GRID,
    ":5:18",
    "key \"column_pitch\": \"0\" is not positive, expected a distance in mm above 0"
);
scan_case!(
    pitch_in_metres,
    HEADER.replace("row_pitch = 100", "row_pitch = 0.1") + GRID,
    ":4:15",
    "key \"row_pitch\": \"0.1\" is below 1 mm, the least spacing a probe can be stepped at: a unit mistake? expected the distance in mm, e.g. 50"
);
scan_case!(
    course_not_in_tank,
    HEADER.replace("course = 1", "course = 2") + GRID,
    ":1:12",
    "key \"course\": \"2\" is not a course of this tank, expected 1 to 1 (1 = bottom course)"
);
scan_case!(
    course_not_a_number,
    HEADER.replace("course = 1", "course = one") + GRID,
    ":1:12",
    "key \"course\": \"one\" is not a course number, expected a whole number, 1 to 1 (1 = bottom course)"
);
scan_case!(
    slashed_date,
    HEADER.replace("2024-06-01", "2024/06/01") + GRID,
    ":2:10",
    "key \"date\": \"2024/06/01\" is not an ISO date, expected YYYY-MM-DD, e.g. 2024-05-17"
);
scan_case!(
    date_before_service,
    HEADER.replace("2024-06-01", "1999-12-31") + GRID,
    ":2:10",
    "key \"date\": \"1999-12-31\" is before the tank went into service (2000-01-01, in_service_since in tank.toml)"
);
scan_case!(
    cell_not_a_number,
    format!("{HEADER}5.6,x\n"),
    ":6",
    "grid column 2: \"x\" is not a number (expected a thickness in mm, e.g. 12.40)"
);
scan_case!(
    decimal_comma_needs_semicolon,
    format!("{HEADER}\"5,6\",5.8\n"),
    ":6",
    "grid column 1: \"5,6\" is not a number (expected a thickness in mm, e.g. 12.40; a decimal comma is accepted only in files delimited by ; or tab)"
);
scan_case!(
    cell_not_positive,
    format!("{HEADER}5.6,5.8\n-5,5.5\n"),
    ":7",
    "grid column 1: -5 mm is not positive, expected a thickness in mm, e.g. 12.40, or an empty cell for a point not measured"
);
scan_case!(
    cell_unit_mistake,
    format!("{HEADER}5.6,31\n"),
    ":6",
    "grid column 2: 31 mm is more than 3 x the nominal 8.00 mm of course 1: a unit mistake? scan readings are in the tank's thickness unit (mm)"
);
scan_case!(
    short_row,
    format!("{HEADER}5.6,5.8\n5.2\n"),
    ":7",
    "1 cell, expected 2 as in the first row of the grid (line 6); leave a cell empty for a point not measured"
);
scan_case!(
    key_below_grid,
    format!("{HEADER}{GRID}# pit_threshold = 3\n"),
    ":8",
    "key line \"# pit_threshold = ...\" below the first row of the grid (line 6): put every key line in the header block above the grid"
);
scan_case!(
    grid_outside_course,
    HEADER.replace("bottom_elevation = 0.5", "bottom_elevation = 8.95") + GRID,
    ":3:22",
    "key \"bottom_elevation\": \"8.95\" puts the grid (2 rows at 100 mm, from 8.95 m to 9.05 m) outside course 1, which spans 0 m to 9 m; expected the elevation of the bottom row, with the whole grid within the course (split a scan that crosses a joint)"
);
scan_case!(
    every_reading_a_pit,
    format!("{HEADER}# pit_threshold = 6\n{GRID}"),
    ":6:19",
    "key \"pit_threshold\": \"6\" leaves no reading for t2: every reading of the grid is below 6 mm (the thickest is 5.8 mm); expected the thickness below which a reading counts as a pit"
);
scan_case!(
    empty_scan,
    String::new(),
    "",
    "the file is empty: expected a header block of \"# key = value\" lines (course, date, bottom_elevation, row_pitch, column_pitch) and a grid of readings below it"
);
scan_case!(
    header_without_grid,
    HEADER.to_string(),
    "",
    "no readings: the scan has a header block and no grid of readings below it"
);
scan_case!(
    grid_of_empty_cells,
    format!("{HEADER},\n,\n"),
    "",
    "no readings: every cell of the grid is empty"
);

/// Extreme values (methods.md s.8): where no course can be estimated, the text names
/// each course's reason; the JSON carries it beside a null estimate. Course 1 has
/// three drops (fewer than the four a fit needs), course 2 readings without azimuth.
#[test]
fn extreme_value_reasons_per_course() {
    let fx = TankFixture::new(
        "id = \"EV\"\nunits = \"SI\"\ndiameter = 20.0\nmax_fill_height = 4.0\n\
         specific_gravity = 1.0\n[[course]]\nheight = 2.5\nnominal_thickness = 8.0\n\
         material = \"A36\"\n[[course]]\nheight = 2.5\nnominal_thickness = 6.0\n\
         material = \"A36\"\n",
    )
    .survey(
        "s.csv",
        "date,course,azimuth,thickness\n2024-06-01,1,0,7.5\n2024-06-01,1,90,7.4\n\
         2024-06-01,1,180,7.6\n2024-06-01,2,,5.8\n",
    );
    let run = strake(["assess", fx.path().to_str().expect("utf-8")]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let flat = run.stdout.split_whitespace().collect::<Vec<_>>().join(" ");
    for want in [
        "course 1: not estimated: 3 drops on the course at its latest survey; a fit needs at least 4",
        "course 2: not estimated: no reading of the course's latest survey has an azimuth, so the readings cannot be grouped into drops",
    ] {
        assert!(flat.contains(want), "missing {want:?} in\n{}", run.stdout);
    }
    let v = assess_json(&fx);
    assert!(v["courses"][0]["extreme_value"].is_null());
    assert_eq!(
        v["courses"][0]["extreme_value_reason"],
        "3 drops on the course at its latest survey; a fit needs at least 4"
    );
}
