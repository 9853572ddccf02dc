//! Built-in table of shell plate grades: specified minimum yield and tensile strength.
//!
//! Values are the ASTM specified minimums of each grade, written from memory (not
//! checked against the printed ASTM specifications or API 653 table 4.1); both the SI
//! and the USC figure are listed as the specifications print them, not converted.
//! `unknown` carries the properties the in-service code assigns when the material is
//! not known (API 653 table 4.1, from memory).
//!
//! Names match case-insensitively, ignoring spaces, `-`, `_`, `.` and the words
//! "Gr", "Grade", "Cl" and "Class": `A283-C`, `a 283 grade c` and `A283GrC` are one.

use super::constants::{
    UNKNOWN_TENSILE_MPA, UNKNOWN_TENSILE_PSI, UNKNOWN_YIELD_MPA, UNKNOWN_YIELD_PSI,
};
use super::units::{Stress, UnitSystem};

/// One grade of the built-in table.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Grade {
    /// Canonical name, as listed in formats.md.
    pub name: &'static str,
    /// Specified minimum yield strength, psi.
    pub yield_psi: f64,
    /// Specified minimum tensile strength, psi.
    pub tensile_psi: f64,
    /// Specified minimum yield strength, MPa.
    pub yield_mpa: f64,
    /// Specified minimum tensile strength, MPa.
    pub tensile_mpa: f64,
}

impl Grade {
    /// Yield strength in the stress unit of `units`.
    pub fn yield_strength(&self, units: UnitSystem) -> Stress {
        match units {
            UnitSystem::Si => Stress(self.yield_mpa),
            UnitSystem::Usc => Stress(self.yield_psi),
        }
    }
    /// Tensile strength in the stress unit of `units`.
    pub fn tensile_strength(&self, units: UnitSystem) -> Stress {
        match units {
            UnitSystem::Si => Stress(self.tensile_mpa),
            UnitSystem::Usc => Stress(self.tensile_psi),
        }
    }
    /// Whether this is the "material not known" entry.
    pub fn is_unknown(&self) -> bool {
        self.name == UNKNOWN_GRADE.name
    }
}

const fn grade(name: &'static str, ksi: (f64, f64), mpa: (f64, f64)) -> Grade {
    Grade {
        name,
        yield_psi: ksi.0 * 1000.0,
        tensile_psi: ksi.1 * 1000.0,
        yield_mpa: mpa.0,
        tensile_mpa: mpa.1,
    }
}

/// The code's default properties for a material that is not known (API 653 table 4.1,
/// from memory): Y = 30,000 psi (205 MPa), T = 55,000 psi (380 MPa).
pub const UNKNOWN_GRADE: Grade = Grade {
    name: "unknown",
    yield_psi: UNKNOWN_YIELD_PSI,
    tensile_psi: UNKNOWN_TENSILE_PSI,
    yield_mpa: UNKNOWN_YIELD_MPA,
    tensile_mpa: UNKNOWN_TENSILE_MPA,
};

/// ASTM specified minimum properties, (yield, tensile) in ksi and in MPa (from memory).
pub const GRADES: &[Grade] = &[
    grade("A283-C", (30.0, 55.0), (205.0, 380.0)),
    grade("A285-C", (30.0, 55.0), (205.0, 380.0)),
    grade("A36", (36.0, 58.0), (250.0, 400.0)),
    grade("A131-A", (34.0, 58.0), (235.0, 400.0)),
    grade("A131-B", (34.0, 58.0), (235.0, 400.0)),
    grade("A516-55", (30.0, 55.0), (205.0, 380.0)),
    grade("A516-60", (32.0, 60.0), (220.0, 415.0)),
    grade("A516-65", (35.0, 65.0), (240.0, 450.0)),
    grade("A516-70", (38.0, 70.0), (260.0, 485.0)),
    grade("A573-58", (32.0, 58.0), (220.0, 400.0)),
    grade("A573-65", (35.0, 65.0), (240.0, 450.0)),
    grade("A573-70", (42.0, 70.0), (290.0, 485.0)),
    grade("A537-1", (50.0, 70.0), (345.0, 485.0)),
    grade("A537-2", (60.0, 80.0), (415.0, 550.0)),
    grade("A662-B", (40.0, 65.0), (275.0, 450.0)),
    grade("A662-C", (43.0, 70.0), (295.0, 485.0)),
    UNKNOWN_GRADE,
];

/// The matching key of a grade name: upper case, without separators and without
/// the words GRADE/GR/CLASS/CL.
pub fn grade_key(name: &str) -> String {
    let compact: String = name
        .chars()
        .filter(|c| !c.is_whitespace() && !matches!(c, '-' | '_' | '.'))
        .flat_map(char::to_uppercase)
        .collect();
    compact
        .replace("GRADE", "")
        .replace("GR", "")
        .replace("CLASS", "")
        .replace("CL", "")
}

/// Looks a grade up by any accepted spelling.
pub fn find_grade(name: &str) -> Option<&'static Grade> {
    let key = grade_key(name);
    GRADES.iter().find(|g| grade_key(g.name) == key)
}

/// Canonical names of every grade, for error messages.
pub fn grade_names() -> impl Iterator<Item = &'static str> {
    GRADES.iter().map(|g| g.name)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn spellings_match() {
        for spelling in ["A283-C", "a283c", "A 283 Grade C", "A283 Gr C", "a283-gr.c"] {
            assert_eq!(
                find_grade(spelling).map(|g| g.name),
                Some("A283-C"),
                "{spelling}"
            );
        }
        assert_eq!(find_grade("A537 Cl 2").map(|g| g.name), Some("A537-2"));
        assert_eq!(find_grade("A537 Class 1").map(|g| g.name), Some("A537-1"));
        assert_eq!(find_grade("UNKNOWN").map(|g| g.name), Some("unknown"));
        assert_eq!(find_grade("A999"), None);
        assert_eq!(find_grade(""), None);
    }

    #[test]
    fn every_grade_has_yield_below_tensile_in_both_systems() {
        for g in GRADES {
            assert!(g.yield_psi < g.tensile_psi, "{}", g.name);
            assert!(g.yield_mpa < g.tensile_mpa, "{}", g.name);
            // The SI and USC figures of one grade agree within 3 % (they are rounded
            // separately in the specifications; 1 ksi = 6.894757 MPa, NIST SP 811).
            let y = g.yield_psi * 6.894_757e-3;
            assert!((y / g.yield_mpa - 1.0).abs() < 0.03, "{} yield {y}", g.name);
            let t = g.tensile_psi * 6.894_757e-3;
            assert!(
                (t / g.tensile_mpa - 1.0).abs() < 0.03,
                "{} tensile {t}",
                g.name
            );
        }
    }

    #[test]
    fn keys_are_unique() {
        for (i, a) in GRADES.iter().enumerate() {
            for b in &GRADES[i + 1..] {
                assert_ne!(grade_key(a.name), grade_key(b.name));
            }
        }
    }
}
