//! The survey reader on arbitrary bytes, with and without a tank: it must return
//! readings or an error, never panic, and every reading it returns must be valid.
#![no_main]

use chrono::NaiveDate;
use libfuzzer_sys::fuzz_target;
use strake::calc::units::{Length, Thickness, UnitSystem};
use strake::input::survey_csv::{SurveyContext, read_survey};
use strake::model::reading::PointNames;

fuzz_target!(|data: &[u8]| {
    // The first byte chooses the context: no tank, an SI tank or a USC tank.
    let (choice, bytes) = match data.split_first() {
        Some((c, rest)) => (*c % 3, rest),
        None => (0, data),
    };
    let today = NaiveDate::from_ymd_opt(2026, 12, 1).expect("date");
    let ctx = match choice {
        0 => SurveyContext {
            units: None,
            nominal: Vec::new(),
            shell_height: None,
            in_service_since: None,
            today,
        },
        1 => SurveyContext {
            units: Some(UnitSystem::Si),
            nominal: vec![Thickness(10.0), Thickness(8.0), Thickness(6.0)],
            shell_height: Some(Length(7.5)),
            in_service_since: NaiveDate::from_ymd_opt(2000, 1, 1),
            today,
        },
        _ => SurveyContext {
            units: Some(UnitSystem::Usc),
            nominal: vec![Thickness(0.375), Thickness(0.25)],
            shell_height: Some(Length(16.0)),
            in_service_since: None,
            today,
        },
    };
    let mut out = Vec::new();
    let mut points = PointNames::default();
    // (The reader streams from an owned `Read`: the bytes are copied into one.)
    let input = std::io::Cursor::new(bytes.to_vec());
    match read_survey("fuzz.csv", input, 0, &ctx, &mut points, &mut out) {
        Ok(info) => {
            assert_eq!(info.rows, out.len(), "every row read is returned");
            for r in &out {
                assert!(r.thickness.0.is_finite() && r.thickness.0 > 0.0);
                assert!(r.course >= 1);
                assert!(r.date <= today);
                if !ctx.nominal.is_empty() {
                    assert!(r.course as usize <= ctx.nominal.len());
                }
            }
        }
        Err(e) => {
            // A message is one line and never echoes a long value whole.
            let m = e.to_string();
            assert!(!m.contains('\n'), "one line: {m}");
            assert!(m.len() < 2000, "short: {} bytes", m.len());
        }
    }
});
