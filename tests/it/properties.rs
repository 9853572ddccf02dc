//! Properties that must hold for every tank (proptest): the round trip of the
//! one-foot relation, SI/USC equivalence, monotonicity (remaining life, fill height,
//! due dates), and readers that never panic on any bytes.

use chrono::NaiveDate;
use proptest::prelude::*;
use strake::calc::assess::{AssessOptions, assess};
use strake::calc::fill_height::fill_scenarios;
use strake::calc::shell::{CourseLoad, max_fill_height, whole_course_t_min};
use strake::calc::units::{Length, Stress, Thickness, UnitSystem};
use strake::model::reading::{Origin, Reading, ReadingSet};
use strake::model::result::Assessment;
use strake::model::tank::{Construction, Course, Material, RateBasis, Tank, ThicknessBasis};

fn date(y: i32, m: u32, d: u32) -> NaiveDate {
    NaiveDate::from_ymd_opt(y, m, d).expect("valid date")
}

proptest! {
    /// methods.md s.4: t_min(H_max(t)) = t for any course, any unit system, any t at
    /// or above the floor.
    #[test]
    fn one_foot_round_trip(
        usc in any::<bool>(),
        d in 3.0f64..120.0,
        g in 0.5f64..1.6,
        s in 100.0f64..300.0,
        e in 0.6f64..=1.0,
        bottom in 0.0f64..30.0,
        t_over_floor in 0.0f64..40.0,
    ) {
        let units = if usc { UnitSystem::Usc } else { UnitSystem::Si };
        let (s, t) = if usc { (s * 145.04, 0.1 + t_over_floor / 25.4) } else { (s, 2.5 + t_over_floor) };
        let load = CourseLoad {
            units,
            diameter: Length(d),
            specific_gravity: g,
            stress: Stress(s),
            joint_efficiency: e,
            bottom_elevation: Length(bottom),
        };
        let h = max_fill_height(load, Thickness(t));
        let back = whole_course_t_min(load, h.value);
        prop_assert!((back.value.0 - t).abs() <= 1e-9 * t.max(1.0), "t {} back {}", t, back.value.0);
    }
}

/// A welded tank with explicit strengths, and three surveys of readings.
#[derive(Debug, Clone)]
struct Case {
    diameter_m: f64,
    sg: f64,
    heights_m: Vec<f64>,
    nominal_mm: Vec<f64>,
    /// (course index, survey index, thickness mm)
    readings: Vec<(usize, usize, f64)>,
}

const SURVEYS: [(i32, u32, u32); 3] = [(2005, 5, 10), (2014, 6, 3), (2024, 5, 21)];

fn case() -> impl Strategy<Value = Case> {
    (2usize..6, 10.0f64..60.0, 0.6f64..1.2).prop_flat_map(|(n, d, g)| {
        let heights = proptest::collection::vec(1.8f64..3.0, n);
        let loss = proptest::collection::vec((0.0f64..0.15, 0.0f64..0.3), n);
        (Just(d), Just(g), heights, loss).prop_map(|(d, g, heights, loss)| {
            // Nominal: 1.6 x the whole-course need at the bottom of each course
            // (always well above t_min, so no floor and a wide margin).
            let fill: f64 = heights.iter().sum::<f64>() - 0.2;
            let mut bottom = 0.0;
            let mut nominal = Vec::new();
            for h in &heights {
                let need = 4.9 * d * (fill - bottom - 0.3).max(0.0) * g / 180.0;
                nominal.push((need * 1.6).max(6.0));
                bottom += h;
            }
            let mut readings = Vec::new();
            for (c, (rate, scatter)) in loss.iter().enumerate() {
                for (k, _) in SURVEYS.iter().enumerate() {
                    for j in 0..4 {
                        let years = [0.0, 9.07, 19.03][k];
                        let t = nominal[c] * 0.98 - rate * years - scatter * (j as f64) / 4.0;
                        readings.push((c, k, (t * 100.0).round() / 100.0));
                    }
                }
            }
            Case {
                diameter_m: d,
                sg: g,
                heights_m: heights,
                nominal_mm: nominal,
                readings,
            }
        })
    })
}

fn tank(case: &Case, units: UnitSystem) -> (Tank, ReadingSet) {
    let len = |m: f64| Length(m).convert(UnitSystem::Si, units);
    let thk = |mm: f64| Thickness(mm).convert(UnitSystem::Si, units);
    let st = |mpa: f64| Stress(mpa).convert(UnitSystem::Si, units);
    let mut bottom = 0.0;
    let courses = case
        .heights_m
        .iter()
        .zip(&case.nominal_mm)
        .enumerate()
        .map(|(i, (h, n))| {
            let c = Course {
                number: i as u32 + 1,
                height: len(*h),
                bottom_elevation: len(bottom),
                nominal_thickness: thk(*n),
                material: Material::Explicit {
                    yield_strength: st(250.0),
                    tensile_strength: st(400.0),
                },
                joint_efficiency: None,
                corrosion_allowance: Thickness(0.0),
                design_stress: None,
                test_stress: None,
            };
            bottom += h;
            c
        })
        .collect();
    let tank = Tank {
        id: "P".into(),
        name: None,
        units,
        diameter: len(case.diameter_m),
        max_fill_height: len(bottom - 0.2),
        specific_gravity: case.sg,
        construction: Construction::Welded,
        joint_efficiency: 1.0,
        in_service_since: Some(date(1990, 1, 1)),
        thickness_basis: ThicknessBasis::Minimum,
        rate_basis: RateBasis::Conservative,
        courses,
    };
    let readings = case
        .readings
        .iter()
        .enumerate()
        .map(|(i, &(c, k, t))| {
            let (y, m, d) = SURVEYS[k];
            Reading {
                date: date(y, m, d),
                course: c as u32 + 1,
                thickness: thk(t),
                point: None,
                elevation: None,
                azimuth: None,
                note: None,
                origin: Origin {
                    file: 0,
                    line: i as u64 + 2,
                },
            }
        })
        .collect();
    (
        tank,
        ReadingSet {
            files: vec!["p.csv".into()],
            readings,
            scans: Vec::new(),
        },
    )
}

fn run(case: &Case, units: UnitSystem) -> Assessment {
    let (t, r) = tank(case, units);
    assess(&t, &r, AssessOptions::default()).expect("assessable")
}

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs().max(1e-12)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    /// The same tank described in SI and in USC (exact unit conversion of every input)
    /// gives the same verdict, and values within 1 %: the printed forms differ only by
    /// rounding (4.9 vs 4.9011 from 2.6; 0.3 m vs 1 ft). Where the floor governs, the
    /// standard itself prints two floors 1.6 % apart (2.5 mm vs 0.1 in = 2.54 mm), so
    /// there both must be at their floor and remaining life is not compared.
    #[test]
    fn si_and_usc_agree(case in case()) {
        let si = run(&case, UnitSystem::Si);
        let us = run(&case, UnitSystem::Usc);
        let floor_course = |n: Option<u32>| {
            n.is_some_and(|n| {
                si.courses.iter().chain(&us.courses).any(|c| c.number == n && c.t_min.floor_governs)
            })
        };
        let tank_level_comparable = !floor_course(si.summary.governing_course)
            && !floor_course(us.summary.governing_course)
            && !floor_course(si.summary.ut_interval.course)
            && !floor_course(us.summary.ut_interval.course);
        for (a, b) in si.courses.iter().zip(&us.courses) {
            let (ka, kb) = (a.condition.as_ref().expect("measured"), b.condition.as_ref().expect("measured"));
            let floor = a.t_min.floor_governs || b.t_min.floor_governs;
            if floor {
                let fb = b.t_min.value.convert(UnitSystem::Usc, UnitSystem::Si).0;
                prop_assert!(rel(fb, a.t_min.value.0) < 0.017, "t_min {} vs {}", a.t_min.value.0, fb);
                continue;
            }
            let tmin_b = b.t_min.value.convert(UnitSystem::Usc, UnitSystem::Si).0;
            prop_assert!(rel(tmin_b, a.t_min.value.0) < 0.01, "t_min {} vs {}", a.t_min.value.0, tmin_b);
            // The status is the same unless the reading lies between the two t_min, or
            // the two remaining lives straddle the 10-year monitor threshold.
            let dt = (tmin_b - a.t_min.value.0).abs();
            let between = (ka.t_actual().0 - a.t_min.value.0).abs() <= dt + 1e-9;
            let straddle = match (ka.remaining_life.years(), kb.remaining_life.years()) {
                (Some(x), Some(y)) => x.min(y) < 10.0 && x.max(y) >= 10.0,
                _ => false,
            };
            if !between && !straddle {
                prop_assert_eq!(ka.status, kb.status);
            }
            let ha = ka.max_fill_height.value.0;
            let hb = kb.max_fill_height.value.convert(UnitSystem::Usc, UnitSystem::Si).0;
            prop_assert!(rel(hb, ha) < 0.01, "H_max {} vs {}", ha, hb);
            // RL = margin / N: the two forms' t_min differ by dt (under 1 %), so RL may
            // differ by at most dt / N; and by under 1 % where the margin is wide.
            match (ka.remaining_life.years(), kb.remaining_life.years(), ka.rate_value()) {
                (Some(x), Some(y), Some(n)) if n.0 > 0.0 => {
                    let dt = (tmin_b - a.t_min.value.0).abs();
                    prop_assert!((x - y).abs() * n.0 <= dt * 1.0001 + 1e-9, "RL {} vs {}", x, y);
                    let margin = ka.t_actual().0 - a.t_min.value.0;
                    if margin > 0.5 * a.t_min.value.0 {
                        prop_assert!(rel(y, x) < 0.01, "RL {} vs {}", x, y);
                    }
                }
                (x, y, _) => prop_assert_eq!(x.is_some(), y.is_some()),
            }
        }
        if !tank_level_comparable {
            return Ok(());
        }
        // The governing course is the one with the least remaining life: the same in
        // both forms, unless two courses tie within the forms' difference (each course's
        // life moves by at most dt / N between the forms, see above), when either may
        // govern.
        let (ga, gb) = (si.summary.governing_course, us.summary.governing_course);
        if ga != gb {
            // Per course: its life in each form and how far the forms may move it (dt / N).
            let life = |n: Option<u32>| {
                let a = si.courses.iter().find(|c| Some(c.number) == n)?;
                let b = us.courses.iter().find(|c| Some(c.number) == n)?;
                let (ka, kb) = (a.condition.as_ref()?, b.condition.as_ref()?);
                let dt = (b.t_min.value.convert(UnitSystem::Usc, UnitSystem::Si).0 - a.t_min.value.0).abs();
                let slack = ka.rate_value().filter(|n| n.0 > 0.0).map_or(0.0, |n| dt / n.0);
                Some((ka.remaining_life.years()?, kb.remaining_life.years()?, slack))
            };
            let tie = match (life(ga), life(gb)) {
                (Some((xa, ya, sa)), Some((xb, yb, sb))) => {
                    let close = |p: f64, q: f64| (p - q).abs() <= sa + sb + 0.01 * p.max(q) + 1e-9;
                    close(xa, xb) && close(ya, yb)
                }
                _ => false,
            };
            prop_assert!(
                tie,
                "governing course {:?} vs {:?}: (SI life, USC life, slack) {:?} and {:?}",
                ga, gb, life(ga), life(gb)
            );
        }
        // The UT interval is the least over the courses of RCA / (2 N); each course's
        // moves by at most dt / (2 N) between the forms, so the least moves by at most
        // the largest of these (whichever course sets it).
        let (ua, ub) = (si.summary.ut_interval.years, us.summary.ut_interval.years);
        let slack = si
            .courses
            .iter()
            .zip(&us.courses)
            .filter_map(|(a, b)| {
                let dt = (b.t_min.value.convert(UnitSystem::Usc, UnitSystem::Si).0 - a.t_min.value.0).abs();
                let rate = a.condition.as_ref()?.rate_value()?.0;
                (rate > 0.0).then(|| dt / (2.0 * rate))
            })
            .fold(0.0, f64::max);
        prop_assert!((ua - ub).abs() <= 0.01 * ua + slack * 1.0001 + 1e-9, "UT interval {} vs {}", ua, ub);
        let (da, db) = (si.summary.next_ut_inspection, us.summary.next_ut_inspection);
        if let (Some(da), Some(db)) = (da, db) {
            let allowed = 3 + ((ua - ub).abs() * 365.25).ceil() as i64;
            prop_assert!((da - db).num_days().abs() <= allowed, "{} vs {}", da, db);
        }
    }

    /// Thinner latest readings never lengthen the remaining life of any course, and
    /// never improve its status.
    #[test]
    fn thinner_readings_never_lengthen_life(case in case(), cut in 0.01f64..2.0) {
        let before = run(&case, UnitSystem::Si);
        let mut thinner = case.clone();
        for r in &mut thinner.readings {
            if r.1 == SURVEYS.len() - 1 {
                r.2 = (r.2 - cut).max(0.05);
            }
        }
        let after = run(&thinner, UnitSystem::Si);
        for (a, b) in before.courses.iter().zip(&after.courses) {
            let (ka, kb) = (a.condition.as_ref().expect("measured"), b.condition.as_ref().expect("measured"));
            let la = ka.remaining_life.sort_key();
            let lb = kb.remaining_life.sort_key();
            prop_assert!(lb <= la, "course {}: {:?} -> {:?}", a.number, ka.remaining_life, kb.remaining_life);
            prop_assert!(kb.status <= ka.status, "status improved");
        }
    }
}

/// A random grid scan for the local-area properties.
fn grid() -> impl Strategy<Value = (Vec<Vec<Option<f64>>>, f64, f64, Option<f64>)> {
    (
        1usize..12,
        1usize..6,
        prop::sample::select(vec![25.0, 50.0, 100.0]),
    )
        .prop_flat_map(|(rows, cols, pitch)| {
            (
                prop::collection::vec(
                    prop::collection::vec(prop::option::weighted(0.9, 4.0f64..12.0), cols),
                    rows,
                ),
                Just(pitch),
                0.0f64..2.0,
                prop::option::of(3.0f64..6.0),
            )
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    /// Local areas (API 653 4.3.2 with the local t_min, methods.md s.4): a thickness
    /// rule passes exactly when the level the area allows after the same corrosion is
    /// at or above the operating level; t1 is the least window mean and t2 the least
    /// valid reading; every window holds at least half valid cells.
    #[test]
    fn area_rules_agree_with_area_levels(
        (cells, pitch, bottom, pit) in grid(),
        rate in 0.0f64..0.3,
        years in 0.0f64..15.0,
        fill in 3.0f64..12.0,
    ) {
        use strake::calc::area::{FutureLoss, assess_area};
        use strake::model::scan::Scan;
        let scan = Scan {
            file: "p.csv".into(),
            course: 1,
            date: date(2024, 1, 1),
            bottom_elevation: Length(bottom),
            row_pitch: Thickness(pitch),
            column_pitch: Thickness(pitch),
            pit_threshold: pit.map(Thickness),
            lines: (1..=cells.len() as u64).collect(),
            cells: cells.iter().map(|r| r.iter().map(|c| c.map(Thickness)).collect()).collect(),
            delimiter: ',',
        };
        let load = CourseLoad {
            units: UnitSystem::Si,
            diameter: Length(30.0),
            specific_gravity: 0.9,
            stress: Stress(171.6),
            joint_efficiency: 1.0,
            bottom_elevation: Length(0.0),
        };
        let future = FutureLoss::new(Some(strake::calc::units::Rate(rate)), years);
        let Some(a) = assess_area(&scan, load, Length(fill), future) else {
            // No valid reading at all: nothing to judge.
            prop_assert!(scan.cells.iter().flatten().flatten().all(|t| scan.is_pit(*t)));
            return Ok(());
        };
        let valid: Vec<f64> = (0..scan.rows())
            .flat_map(|r| (0..scan.columns()).map(move |c| (r, c)))
            .filter_map(|(r, c)| scan.valid(r, c).map(|t| t.0))
            .collect();
        prop_assert_eq!(a.t2.value.0, valid.iter().copied().fold(f64::INFINITY, f64::min));
        for w in &a.windows.windows {
            prop_assert!(2 * w.valid >= w.rows);
            if let Some(t1) = a.t1_window() {
                prop_assert!(t1.mean.0 <= w.mean.0);
            }
        }
        let next = a.max_fill_height_next.expect("rate given");
        let tol = 1e-9 * fill;
        // Away from the floors, pass <=> level after corrosion >= operating level.
        let floor_free = next.calc.thickness.0 > 2.5 && !next.calc.below_floor
            && a.t2_rule.t_min.formula.0 > 2.5;
        if floor_free {
            let all_pass = a.t1_rule.is_none_or(|r| r.rule.pass)
                && a.t2_rule.pass
                && a.pit_depth_rule.is_none_or(|r| r.pass);
            if all_pass {
                prop_assert!(next.calc.value.0 >= fill - tol, "{} < {}", next.calc.value.0, fill);
            } else {
                prop_assert!(next.calc.value.0 < fill + tol, "{} >= {}", next.calc.value.0, fill);
            }
        }
    }
}

/// Days from the first survey to today (2005-05-10 to 2026-12-01).
const AS_OF_SPAN_DAYS: i64 = 7875;

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    /// A heavier product never raises the allowable liquid level (methods.md s.4:
    /// H_max = S E t / (4.9 D G) + 0.3 + z falls as G rises): per course and for the
    /// tank, now, and later after the same number of years of corrosion.
    #[test]
    fn higher_sg_never_raises_the_fill_height(
        case in case(),
        g1 in 0.3f64..3.0,
        step in 0.001f64..1.5,
        years in 0.0f64..30.0,
    ) {
        let g2 = (g1 + step).min(3.0);
        let a = run(&case, UnitSystem::Si);
        let scenarios = fill_scenarios(&a, &[g1, g2], years);
        let (light, heavy) = (&scenarios[1], &scenarios[2]);
        for (l, h) in light.courses.iter().zip(&heavy.courses) {
            prop_assert!(h.now.value.0 <= l.now.value.0 + 1e-12, "course {} now", l.course);
            if let (Some(ll), Some(hl)) = (l.later, h.later) {
                prop_assert!(hl.value.0 <= ll.value.0 + 1e-12, "course {} later", l.course);
            }
        }
        let level = |f: Option<strake::model::result::FillLimit>| f.map(|f| f.level.0);
        prop_assert!(level(heavy.now) <= level(light.now));
        prop_assert!(level(heavy.later) <= level(light.later));

        // The same through the assessment itself (--sg): the allowable level now.
        let (t, r) = tank(&case, UnitSystem::Si);
        let with = |g: f64| {
            assess(&t, &r, AssessOptions { specific_gravity: Some(g), ..AssessOptions::default() })
                .expect("assessable")
        };
        let (al, ah) = (with(g1), with(g2));
        prop_assert!(level(ah.summary.max_fill_height) <= level(al.summary.max_fill_height));
        for (cl, ch) in al.courses.iter().zip(&ah.courses) {
            let (kl, kh) = (cl.condition.as_ref().expect("measured"), ch.condition.as_ref().expect("measured"));
            prop_assert!(kh.max_fill_height.value.0 <= kl.max_fill_height.value.0 + 1e-12);
        }
    }

    /// A later assessment date without a new survey never brings the next inspections
    /// forward: the due dates run from the latest survey used (API 653 6.3), and the
    /// same surveys give the same dates.
    #[test]
    fn later_as_of_never_moves_due_dates_earlier(
        case in case(),
        d1 in 0i64..AS_OF_SPAN_DAYS,
        gap in 0i64..AS_OF_SPAN_DAYS,
    ) {
        let first = date(SURVEYS[0].0, SURVEYS[0].1, SURVEYS[0].2);
        let as1 = first + chrono::Duration::days(d1);
        // The later date stays before the next survey after the first (no new survey).
        let next_survey = SURVEYS
            .iter()
            .map(|&(y, m, dd)| date(y, m, dd))
            .find(|&d| d > as1);
        let mut as2 = first + chrono::Duration::days((d1 + gap).min(AS_OF_SPAN_DAYS));
        if let Some(next) = next_survey {
            as2 = as2.min(next - chrono::Duration::days(1));
        }
        let surveys_upto = |d: NaiveDate| SURVEYS.iter().filter(|&&(y, m, dd)| date(y, m, dd) <= d).count();
        prop_assert!(as2 >= as1);
        prop_assert_eq!(surveys_upto(as1), surveys_upto(as2));
        let (t, r) = tank(&case, UnitSystem::Si);
        let at = |d: NaiveDate| {
            assess(&t, &r, AssessOptions { as_of: Some(d), ..AssessOptions::default() })
                .expect("assessable")
        };
        let (a1, a2) = (at(as1), at(as2));
        prop_assert_eq!(a1.latest_survey, a2.latest_survey);
        for (n1, n2) in [
            (a1.summary.next_ut_inspection, a2.summary.next_ut_inspection),
            (a1.summary.next_external_inspection, a2.summary.next_external_inspection),
        ] {
            if let (Some(n1), Some(n2)) = (n1, n2) {
                prop_assert!(n2 >= n1, "{} -> {}", n1, n2);
            }
            prop_assert_eq!(n1.is_some(), n2.is_some());
        }
    }
}

// ---------------------------------------------------------------------------------
// The readers never panic: any bytes give readings or an error, never a crash.
// ---------------------------------------------------------------------------------

mod readers {
    use chrono::NaiveDate;
    use proptest::prelude::*;
    use strake::calc::units::{Length, Thickness, UnitSystem};
    use strake::input::scan_csv::read_scan;
    use strake::input::survey_csv::{SurveyContext, read_survey};
    use strake::input::tank_dir::tank_from_bytes;
    use strake::input::tank_file::parse_tank;
    use strake::model::tank::Tank;

    fn contexts() -> [SurveyContext; 2] {
        let today = NaiveDate::from_ymd_opt(2026, 12, 1).expect("date");
        [
            SurveyContext {
                units: None,
                nominal: Vec::new(),
                shell_height: None,
                in_service_since: None,
                today,
            },
            SurveyContext {
                units: Some(UnitSystem::Si),
                nominal: vec![Thickness(10.0), Thickness(8.0)],
                shell_height: Some(Length(5.0)),
                in_service_since: NaiveDate::from_ymd_opt(2000, 1, 1),
                today,
            },
        ]
    }

    /// Reads `bytes` in every context; an accepted file returns one reading per row
    /// and only valid readings; a refused one gives a one-line message of bounded size.
    fn survey_holds(bytes: &[u8]) -> Result<(), TestCaseError> {
        for ctx in contexts() {
            let mut out = Vec::new();
            let mut names = strake::model::reading::PointNames::default();
            let input = std::io::Cursor::new(bytes.to_vec());
            match read_survey("p.csv", input, 0, &ctx, &mut names, &mut out) {
                Ok(info) => {
                    prop_assert_eq!(info.rows, out.len());
                    for r in &out {
                        prop_assert!(r.thickness.0.is_finite() && r.thickness.0 > 0.0);
                        prop_assert!(r.course >= 1 && r.date <= ctx.today);
                    }
                }
                Err(e) => {
                    let m = e.to_string();
                    prop_assert!(m.starts_with("p.csv"), "{}", m);
                    prop_assert!(!m.contains('\n') && m.len() < 1000, "{}", m);
                }
            }
        }
        Ok(())
    }

    fn tank_holds(bytes: &[u8]) -> Result<(), TestCaseError> {
        match tank_from_bytes("tank.toml", bytes) {
            Ok(t) => prop_assert!(!t.courses.is_empty()),
            Err(e) => {
                let m = e.to_string();
                prop_assert!(m.starts_with("tank.toml"), "{}", m);
                prop_assert!(!m.contains('\n') && m.len() < 1000, "{}", m);
            }
        }
        Ok(())
    }

    /// The SI sample tank, for scans read against a tank.
    fn scan_tank() -> Tank {
        tank_from_bytes(
            "tank.toml",
            include_bytes!("../../sample-inspections/kestrel-t12/tank.toml"),
        )
        .expect("the sample tank file reads")
    }

    /// Reads `bytes` as a scan without a tank and against `tank`; an accepted scan is a
    /// whole grid of valid readings; a refused one gives a one-line message of bounded
    /// size.
    fn scan_holds(bytes: &[u8], tank: &Tank) -> Result<(), TestCaseError> {
        let today = NaiveDate::from_ymd_opt(2026, 12, 1).expect("date");
        for tank in [None, Some(tank)] {
            match read_scan("s.csv", bytes, tank, today) {
                Ok(scan) => {
                    prop_assert!(scan.rows() >= 1 && scan.columns() >= 1);
                    prop_assert_eq!(scan.lines.len(), scan.rows());
                    for row in &scan.cells {
                        prop_assert_eq!(row.len(), scan.columns());
                        for t in row.iter().flatten() {
                            prop_assert!(t.0.is_finite() && t.0 > 0.0);
                        }
                    }
                    prop_assert!(scan.row_pitch.0 > 0.0 && scan.column_pitch.0 > 0.0);
                    prop_assert!(scan.date <= today);
                    if let Some(tank) = tank {
                        prop_assert!(tank.courses.iter().any(|c| c.number == scan.course));
                    }
                }
                Err(e) => {
                    let m = e.to_string();
                    prop_assert!(m.starts_with("s.csv"), "{}", m);
                    prop_assert!(!m.contains('\n') && m.len() < 1000, "{}", m);
                }
            }
        }
        Ok(())
    }

    /// Text made of the pieces of a scan file: header lines and grid cells.
    fn scan_like() -> impl Strategy<Value = String> {
        let key = prop_oneof![
            Just("course"),
            Just("date"),
            Just("bottom_elevation"),
            Just("row_pitch"),
            Just("column_pitch"),
            Just("pit_threshold"),
            Just("row_pich"),
        ];
        let value = prop_oneof![
            Just("1".to_string()),
            Just("2024-06-01".to_string()),
            Just("2023-02-30".to_string()),
            Just("0".to_string()),
            Just("nan".to_string()),
            "-?[0-9]{1,3}([.,][0-9]{1,2})?",
            ".{0,4}",
        ];
        let cell = prop_oneof![
            "[0-9]{1,2}([.,][0-9]{1,2})?",
            Just(String::new()),
            Just("-3".to_string()),
            Just("x".to_string()),
            ".{0,3}",
        ];
        let line = prop_oneof![
            3 => (key, value).prop_map(|(k, v)| format!("# {k} = {v}\n")),
            4 => (proptest::collection::vec(cell, 1..6), prop_oneof![Just(","), Just(";"), Just("\t")])
                .prop_map(|(cells, d)| format!("{}\n", cells.join(d))),
            1 => Just("\n".to_string()),
            1 => Just("# a comment\n".to_string()),
            1 => ".{0,6}\n",
        ];
        proptest::collection::vec(line, 0..30).prop_map(|v| v.concat())
    }

    /// Text made of the pieces a survey file is made of, in any order.
    fn survey_like() -> impl Strategy<Value = String> {
        let piece = prop_oneof![
            Just("date".to_string()),
            Just("course".to_string()),
            Just("thickness".to_string()),
            Just("thickness_in".to_string()),
            Just("point".to_string()),
            Just("elevation_m".to_string()),
            Just("azimuth".to_string()),
            Just("note".to_string()),
            Just("2024-06-01".to_string()),
            Just("2023-02-30".to_string()),
            "[0-9]{1,3}(\\.[0-9]{1,2})?",
            "-?[0-9]{0,2}[.,][0-9]{0,3}",
            Just("NaN".to_string()),
            Just("inf".to_string()),
            Just(",".to_string()),
            Just(";".to_string()),
            Just("\t".to_string()),
            Just("\n".to_string()),
            Just("\r\n".to_string()),
            Just("\"".to_string()),
            Just("#".to_string()),
            Just("\u{feff}".to_string()),
            ".{0,4}",
        ];
        proptest::collection::vec(piece, 0..60).prop_map(|v| v.concat())
    }

    /// Text made of the pieces of a tank file.
    fn tank_like() -> impl Strategy<Value = String> {
        let key = prop_oneof![
            Just("id"),
            Just("units"),
            Just("diameter"),
            Just("max_fill_height"),
            Just("specific_gravity"),
            Just("construction"),
            Just("joint_efficiency"),
            Just("in_service_since"),
            Just("height"),
            Just("nominal_thickness"),
            Just("material"),
            Just("yield_strength"),
            Just("tensile_strength"),
            Just("rate_basis"),
            Just("diamter"),
        ];
        let value = prop_oneof![
            Just("\"SI\"".to_string()),
            Just("\"USC\"".to_string()),
            Just("\"A36\"".to_string()),
            Just("1991-05-01".to_string()),
            Just("nan".to_string()),
            Just("inf".to_string()),
            Just("-0.0".to_string()),
            Just("[1, 2]".to_string()),
            Just("{ a = 1 }".to_string()),
            "-?[0-9]{1,6}(\\.[0-9]{1,3})?(e[0-9]{1,3})?",
            "\"[a-z ]{0,8}\"?",
        ];
        let line = prop_oneof![
            4 => (key, value).prop_map(|(k, v)| format!("{k} = {v}\n")),
            1 => Just("[[course]]\n".to_string()),
            1 => Just("[assessment]\n".to_string()),
            1 => ".{0,6}\n",
        ];
        proptest::collection::vec(line, 0..30).prop_map(|v| v.concat())
    }

    proptest! {
        #![proptest_config(ProptestConfig::with_cases(512))]

        #[test]
        fn survey_reader_never_panics_on_bytes(bytes in proptest::collection::vec(any::<u8>(), 0..2048)) {
            survey_holds(&bytes)?;
        }

        #[test]
        fn survey_reader_never_panics_on_survey_like_text(text in survey_like()) {
            survey_holds(text.as_bytes())?;
            let with_header = format!("date,course,point,thickness\n{text}");
            survey_holds(with_header.as_bytes())?;
        }

        #[test]
        fn scan_reader_never_panics_on_bytes(bytes in proptest::collection::vec(any::<u8>(), 0..2048)) {
            scan_holds(&bytes, &scan_tank())?;
        }

        #[test]
        fn scan_reader_never_panics_on_scan_like_text(text in scan_like()) {
            let tank = scan_tank();
            scan_holds(text.as_bytes(), &tank)?;
            // With a whole header first, so that the grid itself is read.
            let with_header = format!(
                "# course = 1\n# date = 2024-06-01\n# bottom_elevation = 0.1\n\
                 # row_pitch = 50\n# column_pitch = 50\n{text}"
            );
            scan_holds(with_header.as_bytes(), &tank)?;
        }

        #[test]
        fn tank_reader_never_panics_on_bytes(bytes in proptest::collection::vec(any::<u8>(), 0..2048)) {
            tank_holds(&bytes)?;
        }

        #[test]
        fn tank_reader_never_panics_on_tank_like_text(text in tank_like()) {
            tank_holds(text.as_bytes())?;
            // parse_tank is the same reader after the UTF-8 check.
            let _ = parse_tank("tank.toml", &text);
        }
    }
}
