//! The scan reader on arbitrary bytes, with no tank, the SI sample tank or the USC
//! sample tank: it must return a grid or an error, never panic; every grid it returns
//! must be whole and valid, and the local-area rules and the local fill height must
//! run on it without a panic.
#![no_main]

use chrono::NaiveDate;
use libfuzzer_sys::fuzz_target;
use strake::calc::area::{FutureLoss, area_fill_limit, assess_area};
use strake::calc::shell::CourseLoad;
use strake::calc::units::{Rate, Stress, UnitSystem};
use strake::input::scan_csv::read_scan;
use strake::input::tank_dir::tank_from_bytes;
use strake::model::tank::Tank;

fn sample(bytes: &[u8]) -> Tank {
    tank_from_bytes("tank.toml", bytes).expect("the sample tank file reads")
}

fuzz_target!(|data: &[u8]| {
    // The first byte chooses the tank: none, the SI sample or the USC sample.
    let (choice, bytes) = match data.split_first() {
        Some((c, rest)) => (*c % 3, rest),
        None => (0, data),
    };
    let tank = match choice {
        0 => None,
        1 => Some(sample(include_bytes!(
            "../../sample-inspections/kestrel-t12/tank.toml"
        ))),
        _ => Some(sample(include_bytes!(
            "../../sample-inspections/kestrel-t03/tank.toml"
        ))),
    };
    let today = NaiveDate::from_ymd_opt(2026, 12, 1).expect("date");
    let scan = match read_scan("fuzz.csv", bytes, tank.as_ref(), today) {
        Ok(scan) => scan,
        Err(e) => {
            // A message is one line and never echoes a long value whole.
            let m = e.to_string();
            assert!(!m.contains('\n'), "one line: {m}");
            assert!(m.len() < 2000, "short: {} bytes", m.len());
            return;
        }
    };
    assert!(scan.rows() >= 1, "a grid has a row");
    assert_eq!(scan.lines.len(), scan.rows(), "a line per row");
    let columns = scan.columns();
    assert!(columns >= 1, "a grid has a column");
    for row in &scan.cells {
        assert_eq!(row.len(), columns, "every row as wide as the first");
        for t in row.iter().flatten() {
            assert!(t.0.is_finite() && t.0 > 0.0, "a reading is positive: {}", t.0);
        }
    }
    assert!(scan.row_pitch.0 > 0.0 && scan.column_pitch.0 > 0.0);
    assert!(scan.date <= today);
    let Some(tank) = tank else { return };
    let Some(course) = tank.courses.iter().find(|c| c.number == scan.course) else {
        panic!("course {} is not a course of the tank", scan.course);
    };
    // A load of the course's kind (the stress is a plausible fixed value: the rules
    // are exercised, not the material table).
    let load = CourseLoad {
        units: tank.units,
        diameter: tank.diameter,
        specific_gravity: 0.9,
        stress: Stress(match tank.units {
            UnitSystem::Si => 160.0,
            UnitSystem::Usc => 23_600.0,
        }),
        joint_efficiency: 0.85,
        bottom_elevation: course.bottom_elevation,
    };
    for rate in [None, Some(Rate(0.0)), Some(Rate(0.2))] {
        let future = FutureLoss::new(rate, 5.0);
        if let Some(area) = assess_area(&scan, load, tank.max_fill_height, future) {
            assert!(area.t2.value.0 > 0.0);
            assert!(area.averaging_length.value.0 > 0.0);
            if let Some(limit) = area_fill_limit(&area, 0.9, future.loss) {
                assert!(!limit.calc.value.0.is_nan(), "a fill height is a number");
            }
        } else {
            // Only a grid with no valid reading (every cell empty or a pit) has no t2.
            let any_valid = (0..scan.rows()).any(|r| (0..columns).any(|c| scan.valid(r, c).is_some()));
            assert!(!any_valid, "a grid with a valid reading is assessed");
        }
    }
});
