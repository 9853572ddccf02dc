//! `strake assess` on small tanks whose every number is worked out by hand below from
//! the published formulas (API 653 4.3.3.1 one-foot t_min and its inverse, API 653
//! 6.3 intervals, methods.md s.6 rates).

use crate::support::{SMALL_SI_TANK, TankFixture, close, json, num, strake};

/// Two surveys ten years apart on the small SI tank of `support`.
fn small_si() -> TankFixture {
    TankFixture::new(SMALL_SI_TANK).survey(
        "surveys.csv",
        "date,course,point,thickness\n\
         2014-06-01,1,A,9.60\n2014-06-01,1,B,9.40\n2014-06-01,1,C,9.55\n\
         2014-06-01,2,D,7.80\n2014-06-01,2,E,7.70\n\
         2014-06-01,3,F,5.90\n2014-06-01,3,G,5.80\n\
         2024-06-01,1,A,9.10\n2024-06-01,1,B,8.90\n2024-06-01,1,C,9.00\n\
         2024-06-01,2,D,7.75\n2024-06-01,2,E,7.72\n\
         2024-06-01,3,F,5.40\n2024-06-01,3,G,5.50\n",
    )
}

/// Worked example, SI (API 653 4.3.3.1, SI form), D = 30 m, G = 0.85, level 7.0 m,
/// A36: S = 171.6 MPa (courses 1-2), 188.8 MPa (course 3), E = 1.0.
///
/// Course 1 (bottom 0, H = 7.0 m):
///   t_min = 4.9 x 30 x (7.0 - 0.3) x 0.85 / 171.6 = 147 x 6.7 = 984.9; x 0.85 =
///   837.165; / 171.6 = 4.87858 mm.
///   Basis (minimum): 9.40 (2014-06-01) -> 8.90 (2024-06-01); 3653 days / 365.25 =
///   10.00137 y; LT = ST = 0.50 / 10.00137 = 0.0499932 mm/y.
///   RL = (8.90 - 4.87858) / 0.0499932 = 4.02142 / 0.0499932 = 80.439 y.
///   H_max = 171.6 x 8.90 / (4.9 x 30 x 0.85) + 0.3 = 1527.24 / 124.95 + 0.3 = 12.5228 m.
/// Course 2 (bottom 2.5, H = 4.5): t_min = 147 x 4.2 x 0.85 / 171.6 = 3.05822 mm;
///   7.70 -> 7.72: LT = -0.02 / 10.00137 = -0.0019997: apparent thickening, rate 0,
///   remaining life none; H_max = 171.6 x 7.72 / 124.95 + 0.3 + 2.5 = 13.4023 m.
/// Course 3 (bottom 5.0, H = 2.0): 147 x 1.7 x 0.85 / 188.8 = 1.12508 < 2.5 -> floor
///   2.5 mm; 5.80 -> 5.40: 0.40 / 10.00137 = 0.0399945 mm/y; RL = 2.90 / 0.0399945 =
///   72.510 y (governs); H_max = 188.8 x 5.40 / 124.95 + 0.3 + 5.0 = 13.4594 m.
/// Tank: UT interval = least of min(RCA / 2N, 15): course 1 4.02142 / 0.0999864 =
///   40.2 -> 15; course 3 2.90 / 0.079989 = 36.3 -> 15; course 2 N = 0 -> 15 => 15 y,
///   due 2024-06-01 + 15 y = 2039-06-01. External min(RCA / 4N, 5) = 5 -> 2029-06-01.
///   Allowable level now: least H_max = 12.5228 m (course 1). At the next UT survey:
///   course 1 8.90 - 0.0499932 x 15 = 8.150102 -> 171.6 x 8.150102 / 124.95 + 0.3 =
///   11.4929 m; course 3 5.40 - 0.0399945 x 15 = 4.800082 -> 188.8 x 4.800082 /
///   124.95 + 5.3 = 12.5530 m; course 2 unchanged 13.4023 => 11.4929 m (course 1).
#[test]
fn si_tank_by_hand() {
    let fx = small_si();
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    let tol = 0.0005;
    assert_eq!(v["tank_id"], "FX-1");
    assert_eq!(v["as_of"], "2024-06-01");
    assert_eq!(v["units"]["thickness"], "mm");
    // course 1
    assert!(close(num(&v, "/courses/0/allowable_stress"), 171.6, tol));
    assert!(close(num(&v, "/courses/0/t_min"), 4.87858, tol));
    assert!(close(num(&v, "/courses/0/t_actual"), 8.90, tol));
    assert!(close(num(&v, "/courses/0/rate_long_term"), 0.0499932, tol));
    assert!(close(num(&v, "/courses/0/rate_short_term"), 0.0499932, tol));
    assert!(
        v["courses"][0]["rate_regression"].is_null(),
        "two surveys: no regression"
    );
    assert!(close(
        num(&v, "/courses/0/remaining_life_years"),
        80.439,
        tol
    ));
    assert!(close(num(&v, "/courses/0/max_fill_height"), 12.5228, tol));
    assert_eq!(v["courses"][0]["status"], "ok");
    // course 2: thickening
    assert!(close(num(&v, "/courses/1/t_min"), 3.05822, tol));
    assert!(close(
        num(&v, "/courses/1/rate_long_term"),
        -0.0019997,
        0.001
    ));
    assert_eq!(num(&v, "/courses/1/rate"), 0.0);
    assert!(v["courses"][1]["remaining_life_years"].is_null());
    assert!(close(num(&v, "/courses/1/max_fill_height"), 13.4023, tol));
    // course 3: floor
    assert!(close(num(&v, "/courses/2/allowable_stress"), 188.8, tol));
    assert_eq!(num(&v, "/courses/2/t_min"), 2.5);
    assert!(close(
        num(&v, "/courses/2/remaining_life_years"),
        72.510,
        tol
    ));
    assert!(close(num(&v, "/courses/2/max_fill_height"), 13.4594, tol));
    // tank
    assert_eq!(v["tank"]["governing_course"], 3);
    assert!(close(num(&v, "/tank/remaining_life_years"), 72.510, tol));
    assert!(close(num(&v, "/tank/max_fill_height"), 12.5228, tol));
    assert!(close(num(&v, "/tank/max_fill_height_next"), 11.4929, tol));
    assert_eq!(num(&v, "/tank/ut_interval_years"), 15.0);
    assert_eq!(num(&v, "/tank/external_interval_years"), 5.0);
    assert_eq!(v["tank"]["next_ut_inspection"], "2039-06-01");
    assert_eq!(v["tank"]["next_external_inspection"], "2029-06-01");
    let warnings: Vec<&str> = v["warnings"]
        .as_array()
        .expect("warnings array")
        .iter()
        .filter_map(|w| w.as_str())
        .collect();
    assert_eq!(
        warnings,
        [
            "course 2: apparent thickening (-0.002 mm/y) treated as 0; check the gauge calibration \
          and the readings of both surveys"
        ]
    );
    assert!(
        v["caution"]
            .as_str()
            .is_some_and(|c| c.contains("qualified engineer"))
    );
}

/// The JSON fields appear in the order of formats.md.
#[test]
fn json_field_order_follows_the_contract() {
    let fx = small_si();
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]);
    let text = &run.stdout;
    let order = [
        "\"tank_id\"",
        "\"as_of\"",
        "\"units\"",
        "\"courses\"",
        "\"course\"",
        "\"bottom_elevation\"",
        "\"nominal_thickness\"",
        "\"allowable_stress\"",
        "\"joint_efficiency\"",
        "\"t_min\"",
        "\"t_actual\"",
        "\"t_average\"",
        "\"cov\"",
        "\"rate_long_term\"",
        "\"rate_short_term\"",
        "\"rate_regression\"",
        "\"rate_regression_upper\"",
        "\"rate\"",
        "\"remaining_life_years\"",
        "\"max_fill_height\"",
        "\"status\"",
        "\"tank\"",
        "\"governing_course\"",
        "\"ut_interval_years\"",
        "\"external_interval_years\"",
        "\"next_ut_inspection\"",
        "\"next_external_inspection\"",
        "\"warnings\"",
        "\"caution\"",
    ];
    let mut at = 0;
    for key in order {
        let found = text[at..]
            .find(key)
            .unwrap_or_else(|| panic!("{key} missing or out of order"));
        at += found;
    }
}

/// Worked example, USC, riveted (API 653 4.3.4: S = 21,000 psi, from memory), one
/// survey with the in-service date (rate from nominal), average basis, E = 0.7:
/// D = 50 ft, level 16 ft, G = 1.0, courses 6 ft.
/// Course 1: t_min = 2.6 x 50 x (16 - 1) x 1.0 / (21,000 x 0.7) = 1950 / 14,700 =
///   0.132653 in. Readings 0.270, 0.280, 0.290 -> mean 0.280 in.
///   1950-06-01 -> 2020-06-01 = 25,568 days = 70.0014 y; LT = (0.3125 - 0.280) /
///   70.0014 = 0.000464276 in/y; RL = (0.280 - 0.132653) / 0.000464276 = 317.37 y.
///   H_max = 21,000 x 0.7 x 0.280 / (2.6 x 50 x 1.0) + 1 = 4116 / 130 + 1 = 32.6615 ft.
/// Course 3 (bottom 12 ft, H = 4): 130 x 3 / 14,700 = 0.0265 < 0.1 -> floor 0.1 in.
/// No regression, LT only: UT interval min((0.147347) / (2 x 0.000464276), 15) = 15.
#[test]
fn usc_riveted_single_survey_by_hand() {
    let fx = TankFixture::new(
        r#"
id = "FX-USC"
units = "usc"
diameter = 50
max_fill_height = 16
specific_gravity = 1.0
construction = "riveted"
joint_efficiency = 0.7
in_service_since = 1950-06-01
[assessment]
thickness_basis = "average"
[[course]]
height = 6
nominal_thickness = 0.3125
[[course]]
height = 6
nominal_thickness = 0.25
[[course]]
height = 6
nominal_thickness = 0.1875
"#,
    )
    .survey(
        "2020.csv",
        "date,course,thickness_in\n2020-06-01,1,0.270\n2020-06-01,1,0.280\n2020-06-01,1,0.290\n\
         2020-06-01,2,0.230\n2020-06-01,3,0.170\n",
    );
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    let tol = 0.0005;
    assert_eq!(v["units"]["stress"], "psi");
    assert_eq!(num(&v, "/courses/0/allowable_stress"), 21_000.0);
    assert!(close(num(&v, "/courses/0/t_min"), 0.132653, tol));
    assert!(close(num(&v, "/courses/0/t_actual"), 0.280, tol));
    assert!(close(num(&v, "/courses/0/rate"), 0.000464276, tol));
    assert!(v["courses"][0]["rate_short_term"].is_null());
    assert!(close(
        num(&v, "/courses/0/remaining_life_years"),
        317.37,
        tol
    ));
    assert!(close(num(&v, "/courses/0/max_fill_height"), 32.6615, tol));
    assert_eq!(num(&v, "/courses/2/t_min"), 0.1);
    assert_eq!(num(&v, "/tank/ut_interval_years"), 15.0);
    let w = v["warnings"].to_string();
    assert!(w.contains("initial thickness assumed = nominal"), "{w}");
}

/// A course entirely above the liquid: --fill-height 11 ft puts course 2's bottom
/// (6 ft) 5 ft under the level and course 3's bottom (12 ft) above it: H = -1 ft ->
/// no head -> the 0.1 in floor governs (API 653 4.3.3.1).
#[test]
fn course_above_the_liquid_gets_the_floor() {
    let fx = TankFixture::new(
        r#"
id = "FX-ABOVE"
units = "USC"
diameter = 50
max_fill_height = 16
specific_gravity = 1.0
[[course]]
height = 6
nominal_thickness = 0.3125
material = "A36"
[[course]]
height = 6
nominal_thickness = 0.25
material = "A36"
[[course]]
height = 6
nominal_thickness = 0.1875
material = "A36"
"#,
    )
    .survey(
        "a.csv",
        "date,course,thickness\n2020-06-01,1,0.30\n2020-06-01,2,0.24\n2020-06-01,3,0.18\n",
    );
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
        "--fill-height",
        "11",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    assert_eq!(num(&v, "/courses/2/t_min"), 0.1);
    // Course 2: 2.6 x 50 x (5 - 1) x 1 / 27,376 (A36 upper, 0.472 x 58,000) = 0.018995 -> floor.
    assert_eq!(num(&v, "/courses/1/t_min"), 0.1);
    // Course 1: 2.6 x 50 x (11 - 1) / 24,882 (0.429 x 58,000) = 0.052247 -> floor.
    assert_eq!(num(&v, "/courses/0/t_min"), 0.1);
    assert!(
        v["tank"]["governing_course"].is_null(),
        "one survey, no in-service date: no rate"
    );
    assert_eq!(num(&v, "/tank/ut_interval_years"), 5.0);
}

fn below_minimum_tank() -> TankFixture {
    TankFixture::new(SMALL_SI_TANK).survey(
        "s.csv",
        "date,course,thickness\n2014-06-01,1,5.20\n2024-06-01,1,4.70\n\
         2014-06-01,2,7.0\n2024-06-01,2,6.9\n2014-06-01,3,5.0\n2024-06-01,3,4.9\n",
    )
}

/// Course 1 measured 4.70 mm against t_min 4.87858 mm (as above): below-minimum,
/// remaining life 0, intervals 0 (API 653 6.3: RCA <= 0, act now).
#[test]
fn below_minimum_course() {
    let fx = below_minimum_tank();
    let dir = fx.path().to_str().expect("utf-8 path");
    let run = strake(["assess", dir, "--format", "json"]);
    assert_eq!(run.code, 0, "a finding is not an error: {}", run.stderr);
    let v = json(&run);
    assert_eq!(v["courses"][0]["status"], "below-minimum");
    assert_eq!(num(&v, "/courses/0/remaining_life_years"), 0.0);
    assert_eq!(num(&v, "/courses/0/ut_interval_years"), 0.0);
    assert_eq!(num(&v, "/tank/ut_interval_years"), 0.0);
    assert_eq!(num(&v, "/tank/external_interval_years"), 0.0);
    assert_eq!(v["tank"]["governing_course"], 1);
    assert_eq!(v["tank"]["next_ut_inspection"], "2024-06-01");
    // 171.6 x 4.70 / 124.95 + 0.3 = 6.7549 m < 7.0 m operating level.
    assert!(close(num(&v, "/tank/max_fill_height"), 6.75491, 0.0005));

    let text = strake(["assess", dir]);
    assert!(text.stdout.contains("NOT FIT for SG 0.85 at 7.00 m: course 1 (4.70 mm measured, 4.88 mm required) is below t_min."), "{}", text.stdout);
    assert!(
        text.stdout
            .contains("restrict the fill height to 6.75 m or repair"),
        "{}",
        text.stdout
    );

    let strict = strake(["assess", dir, "--fail-below-minimum"]);
    assert_eq!(strict.code, 3);
}

/// --as-of uses only the surveys up to that date; --sg changes t_min proportionally.
#[test]
fn as_of_and_what_if() {
    let fx = small_si();
    let dir = fx.path().to_str().expect("utf-8 path");
    let early = json(&strake([
        "assess",
        dir,
        "--format",
        "json",
        "--as-of",
        "2020-01-01",
    ]));
    assert_eq!(early["as_of"], "2020-01-01");
    assert!(close(num(&early, "/courses/0/t_actual"), 9.40, 1e-9));
    assert!(
        early["courses"][0]["rate"].is_number(),
        "one survey + in-service date gives a rate"
    );
    // SG 1.0 instead of 0.85: t_min course 1 = 4.87858 / 0.85 = 5.73951 mm.
    let heavy = json(&strake(["assess", dir, "--format", "json", "--sg", "1.0"]));
    assert!(close(num(&heavy, "/courses/0/t_min"), 5.73951, 0.0005));
    let none = strake(["assess", dir, "--as-of", "2010-01-01"]);
    assert_eq!(none.code, 1);
    assert_eq!(
        none.stderr.trim(),
        format!(
            "error: {dir}: no survey on or before 2010-01-01 (--as-of); the earliest survey is 2014-06-01"
        )
    );
}

/// The CSV course table has the JSON course fields as its header.
#[test]
fn csv_course_table() {
    let fx = small_si();
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "csv",
    ]);
    assert_eq!(run.code, 0);
    let mut lines = run.stdout.lines();
    let header = lines.next().expect("header");
    assert!(header.starts_with(
        "course,bottom_elevation,nominal_thickness,allowable_stress,joint_efficiency,t_min,t_actual"
    ));
    assert_eq!(lines.count(), 3);
}

/// --units prints the other system: 8.90 mm = 0.350394 in.
#[test]
fn units_option_converts_at_the_edge() {
    let fx = small_si();
    let v = json(&strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
        "--units",
        "usc",
    ]));
    assert_eq!(v["units"]["thickness"], "in");
    assert!(close(num(&v, "/courses/0/t_actual"), 8.90 / 25.4, 1e-5));
    assert!(close(
        num(&v, "/courses/0/max_fill_height"),
        12.5228 / 0.3048,
        0.0005
    ));
}

/// A rate basis that cannot be computed leaves the rate missing, with the reason
/// (methods.md s.6: the regression needs 3 or more surveys); it is never replaced by
/// another basis. Remaining life is then not computed and the UT interval is the
/// no-rate default of 5 years (API 653 6.3.3).
#[test]
fn unavailable_rate_basis_is_missing_not_replaced() {
    let toml = SMALL_SI_TANK.replace(
        "in_service_since = 2000-01-01\n",
        "in_service_since = 2000-01-01\n[assessment]\nrate_basis = \"regression\"\n",
    );
    let fx = TankFixture::new(&toml).survey(
        "s.csv",
        "date,course,thickness\n2014-06-01,1,9.40\n2024-06-01,1,8.90\n2014-06-01,2,7.70\n\
         2024-06-01,2,7.60\n2014-06-01,3,5.80\n2024-06-01,3,5.40\n",
    );
    let v = json(&strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]));
    assert!(v["courses"][0]["rate"].is_null());
    assert!(v["courses"][0]["rate_regression"].is_null());
    assert!(v["courses"][0]["rate_long_term"].is_number());
    assert!(v["courses"][0]["remaining_life_years"].is_null());
    assert!(v["tank"]["governing_course"].is_null());
    assert_eq!(num(&v, "/tank/ut_interval_years"), 5.0);
    assert!(v["tank"]["max_fill_height_next"].is_null());
    assert_eq!(
        v["warnings"][0],
        "course 1: rate basis \"regression\" cannot be computed (a regression needs 3 or more \
         surveys): no governing rate, remaining life not computed; add surveys or choose \
         rate_basis = \"conservative\""
    );
}

/// No measurable corrosion anywhere (every governing rate 0): no course has a finite
/// remaining life, so none governs (formats.md: the course with the least remaining
/// life); the intervals take their caps, 15 and 5 years (API 653 6.3).
#[test]
fn no_measurable_corrosion_has_no_governing_course() {
    let fx = TankFixture::new(SMALL_SI_TANK).survey(
        "s.csv",
        "date,course,thickness\n2014-06-01,1,9.40\n2024-06-01,1,9.45\n2014-06-01,2,7.70\n\
         2024-06-01,2,7.70\n2014-06-01,3,5.80\n2024-06-01,3,5.81\n",
    );
    let dir = fx.path().to_str().expect("utf-8 path");
    let v = json(&strake(["assess", dir, "--format", "json"]));
    assert!(v["tank"]["governing_course"].is_null());
    assert!(v["tank"]["remaining_life_years"].is_null());
    assert_eq!(num(&v, "/courses/1/rate"), 0.0);
    assert_eq!(num(&v, "/tank/ut_interval_years"), 15.0);
    assert_eq!(num(&v, "/tank/external_interval_years"), 5.0);
    let text = strake(["assess", dir]);
    let flat = text.stdout.split_whitespace().collect::<Vec<_>>().join(" ");
    assert!(
        flat.contains("No measurable corrosion on any course with a known rate"),
        "{}",
        text.stdout
    );
}

/// A welded course without a material takes the code's properties for a material
/// not known (API 653 table 4.1, from memory: Y 205 MPa, T 380 MPa): course 1
/// S = min(0.80 x 205 = 164, 0.429 x 380 = 163.02) = 163.02 MPa; and says so.
#[test]
fn missing_material_uses_the_unknown_defaults() {
    let toml = SMALL_SI_TANK.replacen("material = \"A36\"\n", "", 1);
    let fx = TankFixture::new(&toml).survey(
        "s.csv",
        "date,course,thickness\n2024-06-01,1,9.0\n2024-06-01,2,7.5\n2024-06-01,3,5.5\n",
    );
    let v = json(&strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]));
    assert!(close(num(&v, "/courses/0/allowable_stress"), 163.02, 1e-9));
    assert!(close(num(&v, "/courses/1/allowable_stress"), 171.6, 1e-9));
    assert!(
        v["warnings"]
            .to_string()
            .contains("course 1: no material in tank.toml")
    );
}

/// A point id names a location on its course: many survey forms number the points
/// of every course the same way (N, E, S, W), so the same id on two courses on one
/// date is two points, not a repeat.
#[test]
fn point_ids_are_per_course() {
    let fx = TankFixture::new(SMALL_SI_TANK).survey(
        "s.csv",
        "date,course,point,thickness\n2024-06-01,1,N,9.0\n2024-06-01,1,S,9.2\n\
         2024-06-01,2,N,7.0\n2024-06-01,2,S,7.1\n2024-06-01,3,N,5.0\n",
    );
    let run = strake([
        "assess",
        fx.path().to_str().expect("utf-8 path"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    assert_eq!(num(&v, "/courses/0/t_actual"), 9.0);
    assert_eq!(num(&v, "/courses/1/t_actual"), 7.0);
}
