//! Plausible ranges of the tank file's values: a value outside is refused as a typing
//! or unit mistake (mm typed where m is meant, ksi where psi is meant), so that a
//! slip of the keyboard cannot give an answer that looks valid. These are bounds of
//! the trade (common practice), chosen wide enough that no real atmospheric storage
//! tank falls outside; each says why it is there.

use crate::calc::constants::{MAX_SPECIFIC_GRAVITY, T_MIN_FLOOR_IN, T_MIN_FLOOR_MM};
use crate::calc::units::UnitSystem;

/// A closed range of plausible values in one unit system, and why.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Plausible {
    /// Least plausible value.
    pub min: f64,
    /// Greatest plausible value.
    pub max: f64,
    /// What a value outside it most likely is, for the message.
    pub why: &'static str,
}

/// Tank diameter: 1 m to 200 m (3 ft to 650 ft). The largest field-erected tanks are
/// about 120 m across (common practice); 1 m is below any shop-built tank.
pub fn diameter(units: UnitSystem) -> Plausible {
    match units {
        UnitSystem::Si => Plausible {
            min: 1.0,
            max: 200.0,
            why: "is outside 1 to 200 m, the span of storage tanks: a unit mistake (ft, mm)?",
        },
        UnitSystem::Usc => Plausible {
            min: 3.0,
            max: 650.0,
            why: "is outside 3 to 650 ft, the span of storage tanks: a unit mistake (m, in)?",
        },
    }
}

/// Course height: at most 10 m (33 ft). Shell plates are about 1.5 to 3 m wide
/// (common practice).
pub fn course_height(units: UnitSystem) -> Plausible {
    match units {
        UnitSystem::Si => Plausible {
            min: f64::MIN_POSITIVE,
            max: 10.0,
            why: "is over 10 m, taller than any shell plate: a unit mistake (mm)?",
        },
        UnitSystem::Usc => Plausible {
            min: f64::MIN_POSITIVE,
            max: 33.0,
            why: "is over 33 ft, taller than any shell plate: a unit mistake (in)?",
        },
    }
}

/// Nominal thickness: from the absolute minimum of t_min (2.5 mm, 0.1 in; API 653
/// 4.3.3.1) to 100 mm (4 in), over twice the thickest shell plate API 650 allows
/// (45 mm, 1.75 in; from memory). A course thinner than the floor when new, or inches
/// typed into an SI tank, ends here.
pub fn nominal_thickness(units: UnitSystem) -> Plausible {
    match units {
        UnitSystem::Si => Plausible {
            min: T_MIN_FLOOR_MM,
            max: 100.0,
            why: "is outside 2.5 to 100 mm (2.5 mm is the least t_min of any course): a unit \
                  mistake (in)?",
        },
        UnitSystem::Usc => Plausible {
            min: T_MIN_FLOOR_IN,
            max: 4.0,
            why: "is outside 0.1 to 4 in (0.1 in is the least t_min of any course): a unit \
                  mistake (mm)?",
        },
    }
}

/// Specified yield and tensile strength: 70 to 2000 MPa (10,000 to 300,000 psi).
/// Shell steels lie between about 200 and 700 MPa (common practice); ksi typed into a
/// USC tank, or psi into an SI tank, ends outside.
pub fn strength(units: UnitSystem) -> Plausible {
    match units {
        UnitSystem::Si => Plausible {
            min: 70.0,
            max: 2000.0,
            why: "is outside 70 to 2000 MPa, the span of shell steels: a unit mistake (psi, \
                  ksi)?",
        },
        UnitSystem::Usc => Plausible {
            min: 10_000.0,
            max: 300_000.0,
            why: "is outside 10000 to 300000 psi, the span of shell steels: a unit mistake \
                  (ksi, MPa)?",
        },
    }
}

/// Least plausible specific gravity: 0.3. No liquid stored at atmospheric pressure is
/// that light (gasoline is about 0.74, water 1.0; common practice); 0.085 for 0.85 is
/// a typing slip that would raise the allowable level tenfold.
pub const MIN_SPECIFIC_GRAVITY: f64 = 0.3;

/// Specific gravity, the same in both systems: 0.3 to 3 ([`MAX_SPECIFIC_GRAVITY`]).
pub fn specific_gravity() -> Plausible {
    Plausible {
        min: MIN_SPECIFIC_GRAVITY,
        max: MAX_SPECIFIC_GRAVITY,
        why: "is outside 0.3 to 3, the span of stored liquids (water = 1.0): a typing slip?",
    }
}

/// Least plausible joint efficiency: 0.3. The lowest the tank codes give, for
/// single-lap welded joints, is about 0.35 (common practice); 0.085 for 0.85 would
/// raise t_min tenfold.
pub const MIN_JOINT_EFFICIENCY: f64 = 0.3;

/// Longest tank id, in characters: a short tag that heads every output.
pub const MAX_ID_CHARS: usize = 40;
/// Longest tank name, in characters: one line of a report heading.
pub const MAX_NAME_CHARS: usize = 200;
/// Longest monitoring point id, in characters (ids such as "D5-C1-L" or
/// "TML-012-N"; the hot-spot list prints them).
pub const MAX_POINT_CHARS: usize = 64;

/// Earliest plausible survey year. Ultrasonic thickness gauges came into field use in
/// the 1950s (from memory); 1900 leaves room and still catches "0202" for "2020".
pub const EARLIEST_SURVEY_YEAR: i32 = 1900;

/// A survey file whose every reading is under this fraction of its course's nominal
/// thickness is refused as a unit mistake: inches read as mm give about 1/25 of
/// nominal, and no real survey finds a whole shell worn to a fifth of its plate
/// (common practice).
pub const ALL_THIN_FACTOR: f64 = 0.2;

#[cfg(test)]
mod tests {
    use super::*;

    /// Each USC range is the SI range converted, rounded outward to a round number
    /// (1 ft = 0.3048 m, 1 in = 25.4 mm, 1 psi = 6.894757 kPa: exact or NIST values).
    #[test]
    fn ranges_agree_between_systems() {
        let (si, us) = (diameter(UnitSystem::Si), diameter(UnitSystem::Usc));
        assert!(us.min * 0.3048 <= si.min && us.max * 0.3048 >= si.max * 0.99);
        let (si, us) = (
            nominal_thickness(UnitSystem::Si),
            nominal_thickness(UnitSystem::Usc),
        );
        assert!((us.max * 25.4 - si.max).abs() / si.max < 0.02);
        let (si, us) = (strength(UnitSystem::Si), strength(UnitSystem::Usc));
        assert!((us.min * 0.006_894_757 - si.min).abs() / si.min < 0.02);
        assert!((us.max * 0.006_894_757 - si.max).abs() / si.max < 0.04);
    }
}
