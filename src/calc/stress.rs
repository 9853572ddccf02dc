//! Allowable stress S of a shell course in service.
//!
//! Source: API 653 4.3.3.1 and table 4.1 (from memory), methods.md s.3.
//!
//! - Welded tanks, the lower two courses: S = min(0.80 Y, 0.429 T).
//! - Welded tanks, every other course:    S = min(0.88 Y, 0.472 T).
//! - T is capped at 80,000 psi (552 MPa) before the factor is applied.
//! - Material not known: Y = 30,000 psi (205 MPa), T = 55,000 psi (380 MPa).
//! - Riveted tanks: S = 21,000 psi (145 MPa) for every course.
//!
//! Symbols: Y specified minimum yield strength, T specified minimum tensile strength,
//! S allowable stress; all in the tank's stress unit (MPa or psi).

use super::constants::{
    HYDROTEST_LOWER_TENSILE_FACTOR, HYDROTEST_LOWER_YIELD_FACTOR, HYDROTEST_UPPER_TENSILE_FACTOR,
    HYDROTEST_UPPER_YIELD_FACTOR, LOWER_COURSE_COUNT, LOWER_TENSILE_FACTOR, LOWER_YIELD_FACTOR,
    UPPER_TENSILE_FACTOR, UPPER_YIELD_FACTOR, riveted_stress, tensile_cap,
};
use super::units::{Stress, UnitSystem};
use crate::model::tank::{Construction, Material};

/// Which rule of the in-service table gave S.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StressRule {
    /// Welded, course 1 or 2: min(0.80 Y, 0.429 T).
    WeldedLowerCourses,
    /// Welded, course 3 and up: min(0.88 Y, 0.472 T).
    WeldedUpperCourses,
    /// Riveted: one fixed value.
    Riveted,
    /// Hydrotest in service, welded, course 1 or 2: min(0.88 Y, 0.472 T).
    HydrotestLowerCourses,
    /// Hydrotest in service, welded, course 3 and up: min(0.9 Y, 0.519 T).
    HydrotestUpperCourses,
}

impl StressRule {
    /// (yield factor, tensile factor) of a welded rule.
    pub fn factors(self) -> Option<(f64, f64)> {
        match self {
            StressRule::WeldedLowerCourses => Some((LOWER_YIELD_FACTOR, LOWER_TENSILE_FACTOR)),
            StressRule::WeldedUpperCourses => Some((UPPER_YIELD_FACTOR, UPPER_TENSILE_FACTOR)),
            StressRule::HydrotestLowerCourses => {
                Some((HYDROTEST_LOWER_YIELD_FACTOR, HYDROTEST_LOWER_TENSILE_FACTOR))
            }
            StressRule::HydrotestUpperCourses => {
                Some((HYDROTEST_UPPER_YIELD_FACTOR, HYDROTEST_UPPER_TENSILE_FACTOR))
            }
            StressRule::Riveted => None,
        }
    }
}

/// Which of the two terms of a welded rule governed.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StressGoverns {
    /// The yield term.
    Yield,
    /// The tensile term.
    Tensile,
    /// A fixed value (riveted).
    Fixed,
}

/// S with everything that went into it.
#[derive(Debug, Clone, PartialEq)]
pub struct AllowableStress {
    /// The rule applied.
    pub rule: StressRule,
    /// Y used (None for riveted).
    pub yield_strength: Option<Stress>,
    /// T as given (None for riveted).
    pub tensile_strength: Option<Stress>,
    /// T after the cap (None for riveted).
    pub tensile_used: Option<Stress>,
    /// factor x Y (None for riveted).
    pub yield_term: Option<Stress>,
    /// factor x T_used (None for riveted).
    pub tensile_term: Option<Stress>,
    /// Which term governed.
    pub governs: StressGoverns,
    /// S.
    pub value: Stress,
}

/// Allowable stress of course `course_number` (1 = bottom) in service.
///
/// `material` is the course's material; for welded tanks `Material::NotGiven` is
/// treated as a material not known (the code's default properties).
pub fn in_service_stress(
    units: UnitSystem,
    construction: Construction,
    course_number: u32,
    material: &Material,
) -> AllowableStress {
    if construction == Construction::Riveted {
        let s = riveted_stress(units);
        return AllowableStress {
            rule: StressRule::Riveted,
            yield_strength: None,
            tensile_strength: None,
            tensile_used: None,
            yield_term: None,
            tensile_term: None,
            governs: StressGoverns::Fixed,
            value: s,
        };
    }
    let rule = if course_number <= LOWER_COURSE_COUNT {
        StressRule::WeldedLowerCourses
    } else {
        StressRule::WeldedUpperCourses
    };
    welded(units, rule, material)
}

/// Hydrostatic test stress S_t of a welded course in service (API 653 4.3.3.2 and
/// table 4.1, from memory): lower two courses min(0.88 Y, 0.472 T), others
/// min(0.9 Y, 0.519 T), T capped as for S. None for a riveted tank (no such rule in
/// the methods this tool implements).
pub fn in_service_test_stress(
    units: UnitSystem,
    construction: Construction,
    course_number: u32,
    material: &Material,
) -> Option<AllowableStress> {
    if construction == Construction::Riveted {
        return None;
    }
    let rule = if course_number <= LOWER_COURSE_COUNT {
        StressRule::HydrotestLowerCourses
    } else {
        StressRule::HydrotestUpperCourses
    };
    Some(welded(units, rule, material))
}

fn welded(units: UnitSystem, rule: StressRule, material: &Material) -> AllowableStress {
    let (y, t) = match material {
        Material::Grade(g) => (g.yield_strength(units), g.tensile_strength(units)),
        Material::Explicit {
            yield_strength,
            tensile_strength,
        } => (*yield_strength, *tensile_strength),
        Material::NotGiven => {
            let g = super::materials::UNKNOWN_GRADE;
            (g.yield_strength(units), g.tensile_strength(units))
        }
    };
    let (fy, ft) = rule
        .factors()
        .unwrap_or((UPPER_YIELD_FACTOR, UPPER_TENSILE_FACTOR));
    let t_used = Stress(t.0.min(tensile_cap(units).0));
    let yield_term = Stress(fy * y.0);
    let tensile_term = Stress(ft * t_used.0);
    let (value, governs) = if yield_term.0 <= tensile_term.0 {
        (yield_term, StressGoverns::Yield)
    } else {
        (tensile_term, StressGoverns::Tensile)
    };
    AllowableStress {
        rule,
        yield_strength: Some(y),
        tensile_strength: Some(t),
        tensile_used: Some(t_used),
        yield_term: Some(yield_term),
        tensile_term: Some(tensile_term),
        governs,
        value,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::materials::find_grade;

    fn grade(name: &str) -> Material {
        Material::Grade(find_grade(name).expect("grade in table"))
    }

    fn psi(course: u32, m: &Material) -> f64 {
        in_service_stress(UnitSystem::Usc, Construction::Welded, course, m)
            .value
            .0
    }

    /// API 653 table 4.1 (from memory) tabulates S to the nearest 100 psi:
    /// A36 lower two courses 24,900 psi, others 27,400 psi.
    /// Hand: min(0.80 x 36,000 = 28,800; 0.429 x 58,000 = 24,882) = 24,882 -> 24,900;
    ///       min(0.88 x 36,000 = 31,680; 0.472 x 58,000 = 27,376) = 27,376 -> 27,400.
    #[test]
    fn a36_matches_the_in_service_table() {
        let m = grade("A36");
        assert_eq!((psi(1, &m) / 100.0).round() * 100.0, 24_900.0);
        assert_eq!((psi(2, &m) / 100.0).round() * 100.0, 24_900.0);
        assert_eq!((psi(3, &m) / 100.0).round() * 100.0, 27_400.0);
        assert!((psi(1, &m) - 24_882.0).abs() < 1e-9);
    }

    /// API 653 table 4.1 (from memory): A283-C 23,600 psi and 26,000 psi.
    /// Hand: min(24,000; 0.429 x 55,000 = 23,595) -> 23,600;
    ///       min(26,400; 0.472 x 55,000 = 25,960) -> 26,000.
    #[test]
    fn a283c_matches_the_in_service_table() {
        let m = grade("A283-C");
        assert_eq!((psi(2, &m) / 100.0).round() * 100.0, 23_600.0);
        assert_eq!((psi(5, &m) / 100.0).round() * 100.0, 26_000.0);
    }

    /// SI form, A36 (Y 250, T 400 MPa): lower courses min(200, 171.6) = 171.6 MPa
    /// (the figure of the formats.md example); upper min(220, 188.8) = 188.8 MPa.
    #[test]
    fn a36_si() {
        let m = grade("A36");
        let s1 = in_service_stress(UnitSystem::Si, Construction::Welded, 1, &m);
        assert!((s1.value.0 - 171.6).abs() < 1e-9);
        assert_eq!(s1.governs, StressGoverns::Tensile);
        let s3 = in_service_stress(UnitSystem::Si, Construction::Welded, 3, &m);
        assert!((s3.value.0 - 188.8).abs() < 1e-9);
    }

    /// Tensile cap 80,000 psi (API 653 table 4.1, from memory): A537-2 has
    /// T = 80,000 (not above the cap); an explicit T of 100,000 psi is capped:
    /// upper course min(0.88 x 90,000 = 79,200; 0.472 x 80,000 = 37,760) = 37,760.
    #[test]
    fn tensile_is_capped() {
        let m = Material::Explicit {
            yield_strength: Stress(90_000.0),
            tensile_strength: Stress(100_000.0),
        };
        let s = in_service_stress(UnitSystem::Usc, Construction::Welded, 3, &m);
        assert_eq!(s.tensile_used, Some(Stress(80_000.0)));
        assert!((s.value.0 - 37_760.0).abs() < 1e-9);
    }

    /// Material not known: Y 30,000, T 55,000 psi -> same as A283-C (API 653, from memory).
    #[test]
    fn unknown_material_uses_the_code_defaults() {
        assert_eq!(psi(1, &grade("unknown")), psi(1, &grade("A283-C")));
        assert_eq!(psi(1, &Material::NotGiven), psi(1, &grade("A283-C")));
    }

    /// Hydrotest stress in service (API 653 table 4.1, from memory), A36:
    /// lower min(0.88 x 36,000 = 31,680; 0.472 x 58,000 = 27,376) = 27,376 psi;
    /// upper min(0.9 x 36,000 = 32,400; 0.519 x 58,000 = 30,102) = 30,102 psi.
    #[test]
    fn hydrotest_stress() {
        let m = grade("A36");
        let lower =
            in_service_test_stress(UnitSystem::Usc, Construction::Welded, 2, &m).expect("welded");
        assert!((lower.value.0 - 27_376.0).abs() < 1e-9);
        let upper =
            in_service_test_stress(UnitSystem::Usc, Construction::Welded, 3, &m).expect("welded");
        assert!((upper.value.0 - 30_102.0).abs() < 1e-9);
        assert_eq!(
            in_service_test_stress(UnitSystem::Usc, Construction::Riveted, 3, &m),
            None
        );
    }

    /// Riveted: 21,000 psi / 145 MPa for every course (API 653 4.3.4, from memory).
    #[test]
    fn riveted_is_fixed() {
        for course in 1..=4 {
            let s = in_service_stress(
                UnitSystem::Usc,
                Construction::Riveted,
                course,
                &grade("A36"),
            );
            assert_eq!(s.value, Stress(21_000.0));
            let s = in_service_stress(
                UnitSystem::Si,
                Construction::Riveted,
                course,
                &Material::NotGiven,
            );
            assert_eq!(s.value, Stress(145.0));
        }
    }
}
