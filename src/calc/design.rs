//! New-construction design thickness of a shell course by the one-foot method, and
//! the design and hydrostatic-test stresses.
//!
//! Sources: API 650 5.6.1.1 (minimum nominal thickness), 5.6.2 (stresses), 5.6.3.2
//! (one-foot method), all from memory; methods.md s.2.
//!
//! - S_d = min(2/3 Y, 2/5 T);  S_t = min(3/4 Y, 3/7 T)  (from memory of the table basis)
//! - design:  t_d = 4.9 D (H - 0.3) G / S_d + CA     [USC: 2.6 D (H - 1) G / S_d + CA]
//! - test:    t_t = 4.9 D (H - 0.3) / S_t            [USC: 2.6 D (H - 1) / S_t]
//! - required = max(t_d, t_t, minimum nominal for the diameter)
//! - the one-foot method is limited to D <= 61 m (200 ft).
//!
//! Symbols: D nominal diameter (m | ft), H design liquid level above the bottom of the
//! course (m | ft), G design specific gravity, S_d and S_t (MPa | psi), CA corrosion
//! allowance and t (mm | in). API 650's formulas carry no joint efficiency (E = 1).

use super::constants::{
    DESIGN_TENSILE_FACTOR, DESIGN_YIELD_FACTOR, MIN_NOMINAL_SI, MIN_NOMINAL_USC,
    ONE_FOOT_MAX_DIAMETER_FT, ONE_FOOT_MAX_DIAMETER_M, OneFootForm, TEST_TENSILE_FACTOR,
    TEST_YIELD_FACTOR,
};
use super::materials::UNKNOWN_GRADE;
use super::units::{Length, Stress, Thickness, UnitSystem};
use crate::model::tank::Material;

/// Where a design stress came from.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum StressOrigin {
    /// From Y and T: min(factor_y Y, factor_t T).
    Material {
        /// Specified minimum yield.
        yield_strength: Stress,
        /// Specified minimum tensile.
        tensile_strength: Stress,
        /// factor_y x Y.
        yield_term: Stress,
        /// factor_t x T.
        tensile_term: Stress,
    },
    /// Given in tank.toml (`design_stress` / `test_stress`) or on the command line.
    Given,
}

/// A design-basis stress with its origin.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DesignStress {
    /// The stress.
    pub value: Stress,
    /// How it was obtained.
    pub origin: StressOrigin,
}

fn from_material(y: Stress, t: Stress, fy: f64, ft: f64) -> DesignStress {
    let yield_term = Stress(fy * y.0);
    let tensile_term = Stress(ft * t.0);
    DesignStress {
        value: Stress(yield_term.0.min(tensile_term.0)),
        origin: StressOrigin::Material {
            yield_strength: y,
            tensile_strength: t,
            yield_term,
            tensile_term,
        },
    }
}

/// S_d and S_t of a course: the given values, else from the material (API 650 5.6.2);
/// a material not given takes the code's properties for a material not known.
pub fn design_stresses(
    units: UnitSystem,
    material: &Material,
    design_given: Option<Stress>,
    test_given: Option<Stress>,
) -> (DesignStress, DesignStress) {
    let (y, t) = match material {
        Material::Grade(g) => (g.yield_strength(units), g.tensile_strength(units)),
        Material::Explicit {
            yield_strength,
            tensile_strength,
        } => (*yield_strength, *tensile_strength),
        Material::NotGiven => (
            UNKNOWN_GRADE.yield_strength(units),
            UNKNOWN_GRADE.tensile_strength(units),
        ),
    };
    let pick = |given: Option<Stress>, fy: f64, ft: f64| match given {
        Some(s) => DesignStress {
            value: s,
            origin: StressOrigin::Given,
        },
        None => from_material(y, t, fy, ft),
    };
    (
        pick(design_given, DESIGN_YIELD_FACTOR, DESIGN_TENSILE_FACTOR),
        pick(test_given, TEST_YIELD_FACTOR, TEST_TENSILE_FACTOR),
    )
}

/// Minimum nominal shell thickness for a diameter (API 650 5.6.1.1, from memory).
pub fn minimum_nominal(units: UnitSystem, diameter: Length) -> Thickness {
    let table: &[(f64, f64)] = match units {
        UnitSystem::Si => &MIN_NOMINAL_SI,
        UnitSystem::Usc => &MIN_NOMINAL_USC,
    };
    let mut last = 0.0;
    for (i, &(below, t)) in table.iter().enumerate() {
        last = t;
        // The last-but-one band includes its upper bound (36 to 60 m; 120 to 200 ft).
        let inclusive = i == table.len() - 2;
        if diameter.0 < below || (inclusive && diameter.0 <= below) {
            return Thickness(t);
        }
    }
    Thickness(last)
}

/// Whether the one-foot method applies to this diameter (API 650 5.6.3.1).
pub fn one_foot_applies(units: UnitSystem, diameter: Length) -> bool {
    diameter.0
        <= match units {
            UnitSystem::Si => ONE_FOOT_MAX_DIAMETER_M,
            UnitSystem::Usc => ONE_FOOT_MAX_DIAMETER_FT,
        }
}

/// One-foot design and test thickness of one course, with its terms.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct OneFootDesign {
    /// The printed form.
    pub form: OneFootForm,
    /// H: design liquid level above the bottom of the course.
    pub liquid_height: Length,
    /// max(H - offset, 0).
    pub head: Length,
    /// Design thickness without CA: coefficient D head G / S_d.
    pub design_corroded: Thickness,
    /// t_d = design_corroded + CA.
    pub design: Thickness,
    /// t_t = coefficient D head / S_t.
    pub test: Thickness,
}

/// The one-foot design and hydrotest thickness of a course (API 650 5.6.3.2).
#[allow(clippy::too_many_arguments)]
pub fn one_foot_design(
    units: UnitSystem,
    diameter: Length,
    fill_height: Length,
    bottom_elevation: Length,
    specific_gravity: f64,
    design_stress: Stress,
    test_stress: Stress,
    corrosion_allowance: Thickness,
) -> OneFootDesign {
    let form = OneFootForm::of(units);
    let liquid_height = Length(fill_height.0 - bottom_elevation.0);
    let head = Length((liquid_height.0 - form.offset.0).max(0.0));
    let design_corroded =
        Thickness(form.coefficient * diameter.0 * head.0 * specific_gravity / design_stress.0);
    OneFootDesign {
        form,
        liquid_height,
        head,
        design_corroded,
        design: Thickness(design_corroded.0 + corrosion_allowance.0),
        test: Thickness(form.coefficient * diameter.0 * head.0 / test_stress.0),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::materials::find_grade;

    /// API 650 table 5-2 (from memory) lists A36 at S_d 160 MPa / 23,200 psi and S_t
    /// 171 MPa / 24,900 psi. Hand: min(2/3 x 250 = 166.7, 2/5 x 400 = 160) = 160;
    /// min(3/4 x 250 = 187.5, 3/7 x 400 = 171.43) = 171.43; USC min(24,000, 23,200) =
    /// 23,200; min(27,000, 24,857) = 24,857 -> 24,900.
    #[test]
    fn a36_design_stresses() {
        let m = Material::Grade(find_grade("A36").expect("grade"));
        let (sd, st) = design_stresses(UnitSystem::Si, &m, None, None);
        assert!((sd.value.0 - 160.0).abs() < 1e-9);
        assert!((st.value.0 - 400.0 * 3.0 / 7.0).abs() < 1e-9);
        let (sd, st) = design_stresses(UnitSystem::Usc, &m, None, None);
        assert!((sd.value.0 - 23_200.0).abs() < 1e-9);
        assert_eq!((st.value.0 / 100.0).round() * 100.0, 24_900.0);
        let given = design_stresses(
            UnitSystem::Si,
            &Material::NotGiven,
            Some(Stress(150.0)),
            Some(Stress(160.0)),
        );
        assert_eq!(
            (given.0.value, given.1.value),
            (Stress(150.0), Stress(160.0))
        );
        // Not given: the unknown-material properties, Y 205, T 380 MPa:
        // S_d = min(2/3 x 205 = 136.67, 2/5 x 380 = 152) = 136.67 MPa.
        let unknown = design_stresses(UnitSystem::Si, &Material::NotGiven, None, None);
        assert!((unknown.0.value.0 - 205.0 * 2.0 / 3.0).abs() < 1e-9);
    }

    /// API 650 5.6.1.1 bands (from memory), at and around their limits.
    #[test]
    fn minimum_nominal_bands() {
        let si = |d| minimum_nominal(UnitSystem::Si, Length(d)).0;
        assert_eq!(
            [si(10.0), si(15.0), si(35.9), si(36.0), si(60.0), si(60.1)],
            [5.0, 6.0, 6.0, 8.0, 8.0, 10.0]
        );
        let usc = |d| minimum_nominal(UnitSystem::Usc, Length(d)).0;
        assert_eq!(
            [usc(49.0), usc(50.0), usc(120.0), usc(200.0), usc(201.0)],
            [0.1875, 0.25, 0.3125, 0.3125, 0.375]
        );
    }

    /// Hand (API 650 5.6.3.2, SI): D = 60 m, H = 19.2 m above the bottom course,
    /// G = 0.9, S_d = 160, S_t = 171.43, CA = 1.5:
    /// t_d = 4.9 x 60 x 18.9 x 0.9 / 160 + 1.5 = 5000.94 / 160 + 1.5 = 31.256 + 1.5 = 32.756 mm
    /// t_t = 4.9 x 60 x 18.9 / 171.43 = 5556.6 / 171.4286 = 32.4135 mm
    #[test]
    fn one_foot_by_hand() {
        let r = one_foot_design(
            UnitSystem::Si,
            Length(60.0),
            Length(19.2),
            Length(0.0),
            0.9,
            Stress(160.0),
            Stress(1200.0 / 7.0),
            Thickness(1.5),
        );
        assert!((r.design.0 - 32.755_875).abs() < 1e-6, "{}", r.design.0);
        assert!((r.test.0 - 32.4135).abs() < 1e-4, "{}", r.test.0);
        assert!(one_foot_applies(UnitSystem::Si, Length(60.0)));
        assert!(!one_foot_applies(UnitSystem::Si, Length(61.5)));
    }
}
