//! Bad input: every case exits 1 with one line naming the file, the line (and column
//! or key), the value, and what was expected. Whole lines are asserted.

use crate::support::{SMALL_SI_TANK, TankFixture, strake};

/// Runs `assess` and returns (exit code, stderr without the trailing newline).
fn assess_err(fx: &TankFixture) -> (i32, String) {
    let run = strake(["assess", fx.path().to_str().expect("utf-8 path")]);
    assert!(
        run.stdout.is_empty(),
        "nothing on stdout on error: {}",
        run.stdout
    );
    (run.code, run.stderr.trim_end().to_string())
}

fn survey_err(content: &str) -> (i32, String, TankFixture) {
    let fx = TankFixture::new(SMALL_SI_TANK).survey("a.csv", content);
    let (code, err) = assess_err(&fx);
    (code, err, fx)
}

macro_rules! survey_case {
    ($name:ident, $content:expr, $line:expr, $msg:expr) => {
        #[test]
        fn $name() {
            let (code, err, fx) = survey_err($content);
            assert_eq!(code, 1);
            let file = fx.shown("surveys/a.csv");
            assert_eq!(err, format!("error: {file}{}: {}", $line, $msg));
        }
    };
}

survey_case!(
    unknown_column,
    "date,course,thicknes\n2024-01-01,1,9.0\n",
    ":1",
    "unknown column \"thicknes\" (did you mean \"thickness\"?); known columns: date, course, thickness, thickness_mm, thickness_in, point, elevation, elevation_m, elevation_ft, azimuth, note"
);
survey_case!(
    missing_column,
    "date,thickness\n2024-01-01,9.0\n",
    ":1",
    "missing required column \"course\" (the header has: date, thickness)"
);
survey_case!(
    duplicate_column,
    "date,course,DATE,thickness\n2024-01-01,1,2024-01-01,9\n",
    ":1",
    "column \"date\" appears twice (columns 1 and 3)"
);
survey_case!(
    mixed_units,
    "date,course,thickness_mm,thickness_in\n2024-01-01,1,9.0,0.35\n",
    ":1",
    "columns \"thickness_mm\" and \"thickness_in\" both give the thickness: keep one column (one unit) per file"
);
survey_case!(
    text_in_thickness,
    "date;course;thickness\n2024-01-01;1;4,2x\n",
    ":2",
    "column \"thickness\": \"4,2x\" is not a number (expected a thickness in mm, e.g. 12.40)"
);
survey_case!(
    decimal_comma_needs_semicolon,
    "date,course,thickness\n2024-01-01,1,\"4,2\"\n",
    ":2",
    "column \"thickness\": \"4,2\" is not a number (expected a thickness in mm, e.g. 12.40; a decimal comma is accepted only in files delimited by ; or tab)"
);
survey_case!(
    nan_thickness,
    "date,course,thickness\n2024-01-01,1,NaN\n",
    ":2",
    "column \"thickness\": \"NaN\" is not a finite number (expected a thickness in mm, e.g. 12.40)"
);
survey_case!(
    negative_thickness,
    "date,course,thickness\n2024-01-01,1,-1\n",
    ":2",
    "column \"thickness\": -1 mm is not positive, expected a thickness in mm, e.g. 12.40"
);
survey_case!(
    empty_thickness,
    "date,course,thickness\n2024-01-01,1,\n",
    ":2",
    "column \"thickness\": empty, expected a thickness in mm, e.g. 12.40"
);
survey_case!(
    unit_mistake,
    "date,course,thickness\n2024-01-01,1,9.5\n2024-01-01,1,31\n",
    ":3",
    "column \"thickness\": 31 mm is more than 3 x the nominal 10.00 mm of course 1: a unit mistake? name the column thickness_mm or thickness_in to say the unit"
);
survey_case!(
    slashed_date,
    "date,course,thickness\n2023/05/01,1,9.0\n",
    ":2",
    "column \"date\": \"2023/05/01\" is not an ISO date (expected YYYY-MM-DD, e.g. 2024-05-17)"
);
survey_case!(
    impossible_date,
    "date,course,thickness\n2023-02-30,1,9.0\n",
    ":2",
    "column \"date\": \"2023-02-30\" is not a calendar date (expected a day that exists, as YYYY-MM-DD)"
);
survey_case!(
    date_before_service,
    "date,course,thickness\n1999-12-31,1,9.0\n",
    ":2",
    "column \"date\": 1999-12-31 is before the tank went into service (2000-01-01, in_service_since in tank.toml)"
);
survey_case!(
    course_zero,
    "date,course,thickness\n2024-01-01,0,9.0\n",
    ":2",
    "column \"course\": 0 is not a course of this tank, expected 1 to 3 (1 = bottom course)"
);
survey_case!(
    course_beyond,
    "date,course,thickness\n2024-01-01,4,9.0\n",
    ":2",
    "column \"course\": 4 is not a course of this tank, expected 1 to 3 (1 = bottom course)"
);
survey_case!(
    course_text,
    "date,course,thickness\n2024-01-01,one,9.0\n",
    ":2",
    "column \"course\": \"one\" is not a course number (expected a whole number, 1 = bottom course)"
);
survey_case!(
    field_count,
    "date,course,thickness\n2024-01-01,1,9.0,5\n",
    ":2",
    "4 fields, expected 3 as in the header (check the delimiter and quotes)"
);
survey_case!(
    empty_file,
    "",
    "",
    "the file is empty: expected a header row such as \"date,course,thickness\""
);
survey_case!(
    header_only,
    "date,course,thickness\r\n",
    "",
    "no readings: the file has a header row only"
);
/// The same point twice on one date with different values: the inspector must choose.
#[test]
fn conflicting_repeat() {
    let (code, err, fx) =
        survey_err("date,course,point,thickness\n2024-01-01,1,P1,9.00\n2024-01-01,1,P1,9.10\n");
    assert_eq!(code, 1);
    let file = fx.shown("surveys/a.csv");
    assert_eq!(
        err,
        format!(
            "error: {file}:3: point \"P1\" on 2024-01-01 is read twice with different values: 9.00 mm \
             (course 1) at {file}:2 and 9.10 mm (course 1) here; keep the reading you trust and delete \
             the other, or give the repeat its own point id"
        )
    );
}

/// A date after today: a year no test run will reach.
#[test]
fn date_in_the_future() {
    let (code, err, fx) = survey_err("date,course,thickness\n2999-01-01,1,9.0\n");
    assert_eq!(code, 1);
    let today = chrono::Local::now().date_naive();
    assert_eq!(
        err,
        format!(
            "error: {}:2: column \"date\": 2999-01-01 is after today ({today}), expected the date the survey was made",
            fx.shown("surveys/a.csv")
        )
    );
}

/// Bytes that are not UTF-8 in a text column.
#[test]
fn invalid_utf8() {
    let fx = TankFixture::new(SMALL_SI_TANK).survey(
        "a.csv",
        b"date,course,thickness,note\n2024-01-01,1,9.0,\xff\xfe\n",
    );
    let (code, err) = assess_err(&fx);
    assert_eq!(code, 1);
    assert_eq!(
        err,
        format!(
            "error: {}:2: column \"note\": text is not valid UTF-8 (save the file as UTF-8)",
            fx.shown("surveys/a.csv")
        )
    );
}

fn tank_err(toml: &str) -> (i32, String, String) {
    let fx = TankFixture::new(toml);
    let (code, err) = assess_err(&fx);
    (code, err, fx.shown("tank.toml"))
}

macro_rules! tank_case {
    ($name:ident, $toml:expr, $pos:expr, $msg:expr) => {
        #[test]
        fn $name() {
            let (code, err, file) = tank_err($toml);
            assert_eq!(code, 1);
            assert_eq!(err, format!("error: {file}{}: {}", $pos, $msg));
        }
    };
}

const HEAD: &str = "id = \"T\"\nunits = \"SI\"\n";

tank_case!(
    toml_syntax,
    "id = \"T\nunits = \"SI\"\n",
    ":1:8",
    "TOML syntax: invalid basic string, expected `\"`"
);
tank_case!(
    unknown_key,
    &format!("{HEAD}diamter = 30.0\n"),
    ":3:1",
    "unknown key \"diamter\"; did you mean \"diameter\"?"
);
tank_case!(
    wrong_type,
    &format!("{HEAD}diameter = \"thirty\"\n"),
    ":3:12",
    "key \"diameter\": text \"thirty\", expected a number in m"
);
tank_case!(
    missing_key,
    &format!("{HEAD}diameter = 30\nmax_fill_height = 5\n"),
    "",
    "missing required key \"specific_gravity\""
);
tank_case!(
    bad_units,
    "id = \"T\"\nunits = \"metric\"\n",
    ":2:9",
    "key \"units\": \"metric\" is not a unit system, expected \"SI\" (m, mm, MPa) or \"USC\" (ft, in, psi)"
);
tank_case!(
    zero_diameter,
    &format!("{HEAD}diameter = 0\n"),
    ":3:12",
    "key \"diameter\": 0 is not positive, expected a number of m above 0"
);
tank_case!(
    sg_too_high,
    &format!("{HEAD}diameter = 30\nmax_fill_height = 5\nspecific_gravity = 3.5\n"),
    ":5:20",
    "key \"specific_gravity\": 3.5 is out of range, expected more than 0 and at most 3 (water = 1.0)"
);
tank_case!(
    unknown_material,
    &format!(
        "{HEAD}diameter = 30\nmax_fill_height = 5\nspecific_gravity = 1\n[[course]]\nheight = 6\nnominal_thickness = 8\nmaterial = \"A36X\"\n"
    ),
    ":9:12",
    "course 1, key \"material\": \"A36X\" is not in the built-in table (did you mean \"A36\"?); use one of A283-C, A285-C, A36, A131-A, A131-B, A516-55, A516-60, A516-65, A516-70, A573-58, A573-65, A573-70, A537-1, A537-2, A662-B, A662-C, unknown or give yield_strength and tensile_strength instead"
);
tank_case!(
    fill_above_shell,
    &format!(
        "{HEAD}diameter = 30\nmax_fill_height = 9\nspecific_gravity = 1\n[[course]]\nheight = 6\nnominal_thickness = 8\nmaterial = \"A36\"\n"
    ),
    ":4:19",
    "key \"max_fill_height\": 9 m is above the shell height 6 m (the sum of the course heights), expected at most 6"
);
tank_case!(
    yield_above_tensile,
    &format!(
        "{HEAD}diameter = 30\nmax_fill_height = 5\nspecific_gravity = 1\n[[course]]\nheight = 6\nnominal_thickness = 8\nyield_strength = 400\ntensile_strength = 250\n"
    ),
    ":9:18",
    "course 1, key \"yield_strength\": 400 MPa is above tensile_strength 250 MPa: expected yield below tensile (are the two swapped?)"
);
tank_case!(
    bad_joint_efficiency,
    &format!(
        "{HEAD}diameter = 30\nmax_fill_height = 5\nspecific_gravity = 1\njoint_efficiency = 1.2\n"
    ),
    ":6:20",
    "key \"joint_efficiency\": 1.2 is out of range, expected more than 0 and at most 1 (e.g. 0.85)"
);
tank_case!(
    missing_course_key,
    &format!(
        "{HEAD}diameter = 30\nmax_fill_height = 5\nspecific_gravity = 1\n[[course]]\nheight = 6\nmaterial = \"A36\"\n"
    ),
    ":6:1",
    "missing required key \"nominal_thickness\" in course 1"
);

/// No tank.toml at all.
#[test]
fn missing_tank_file() {
    let dir = tempfile::tempdir().expect("temp dir");
    let shown = dir.path().display().to_string();
    let run = strake(["assess", &shown]);
    assert_eq!(run.code, 1);
    assert_eq!(
        run.stderr.trim_end(),
        format!(
            "error: {shown}: no tank.toml here: a tank folder holds tank.toml and surveys/*.csv"
        )
    );
}

/// Usage errors are clap's: exit 2.
#[test]
fn usage_error_exits_2() {
    let run = strake(["assess"]);
    assert_eq!(run.code, 2);
    let run = strake(["assess", ".", "--sg", "4"]);
    assert_eq!(run.code, 2);
    assert!(
        run.stderr
            .contains("4 is out of range, expected more than 0 and at most 3"),
        "{}",
        run.stderr
    );
}
