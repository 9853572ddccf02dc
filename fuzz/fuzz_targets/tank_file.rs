//! The tank-file reader on arbitrary bytes: a validated tank or an error, never a
//! panic; every tank it accepts is within the plausible ranges.
#![no_main]

use libfuzzer_sys::fuzz_target;
use strake::input::tank_dir::tank_from_bytes;

fuzz_target!(|data: &[u8]| {
    match tank_from_bytes("tank.toml", data) {
        Ok(tank) => {
            assert!(!tank.courses.is_empty());
            assert!(tank.diameter.0.is_finite() && tank.diameter.0 > 0.0);
            assert!(tank.specific_gravity > 0.0 && tank.specific_gravity <= 3.0);
            assert!(tank.max_fill_height.0 <= tank.shell_height().0 + 1e-9);
            for c in &tank.courses {
                assert!(c.height.0 > 0.0 && c.nominal_thickness.0 > 0.0);
            }
        }
        Err(e) => {
            let m = e.to_string();
            assert!(!m.contains('\n'), "one line: {m}");
            assert!(m.len() < 2000, "short: {} bytes", m.len());
        }
    }
});
