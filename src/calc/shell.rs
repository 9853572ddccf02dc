//! Whole-course minimum thickness and maximum fill height by the one-foot relation.
//!
//! Sources: API 653 4.3.3.1 (in-service t_min, from memory of the clause) and
//! methods.md s.1, s.3 and s.4.
//!
//! - t_min = 4.9 D (H - 0.3) G / (S E)   [SI: mm, m, MPa]
//! - t_min = 2.6 D (H - 1) G / (S E)     [USC: in, ft, psi]
//! - t_min is never less than 2.5 mm (0.1 in).
//! - Inverse (s.4): H_max = S E t / (4.9 D G) + 0.3 + z_bottom  [USC: 2.6, 1 ft]
//!
//! Symbols: D nominal diameter; H liquid height from the bottom of the course to the
//! maximum liquid level; G specific gravity; S allowable stress; E joint efficiency;
//! t thickness; z_bottom elevation of the bottom of the course.
//! The hoop stress is taken 0.3 m (1 ft) above the bottom of the course, where the
//! restraint of the joint below has faded (fact of the trade, common practice).

use super::constants::OneFootForm;
use super::units::{Length, Stress, Thickness, UnitSystem};

/// The inputs shared by t_min and H_max for one course.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct CourseLoad {
    /// Unit system of every number below.
    pub units: UnitSystem,
    /// Nominal tank diameter D.
    pub diameter: Length,
    /// Specific gravity G.
    pub specific_gravity: f64,
    /// Allowable stress S.
    pub stress: Stress,
    /// Joint efficiency E.
    pub joint_efficiency: f64,
    /// Elevation of the bottom of the course.
    pub bottom_elevation: Length,
}

/// A whole-course t_min with its substituted terms.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TminCalc {
    /// The printed form used (coefficient, offset, floor).
    pub form: OneFootForm,
    /// The inputs.
    pub load: CourseLoad,
    /// H: from the bottom of the course to the liquid level (negative when the
    /// course is entirely above the liquid).
    pub liquid_height: Length,
    /// coefficient x D x max(H - offset, 0) x G / (S E).
    pub formula: Thickness,
    /// Whether the 2.5 mm / 0.1 in floor governs.
    pub floor_governs: bool,
    /// t_min = max(formula, floor).
    pub value: Thickness,
}

/// Whole-course minimum acceptable thickness for a liquid level `fill_height`
/// above the tank bottom (API 653 4.3.3.1).
pub fn whole_course_t_min(load: CourseLoad, fill_height: Length) -> TminCalc {
    let form = OneFootForm::of(load.units);
    let liquid_height = Length(fill_height.0 - load.bottom_elevation.0);
    let head = (liquid_height.0 - form.offset.0).max(0.0);
    let formula = Thickness(
        form.coefficient * load.diameter.0 * head * load.specific_gravity
            / (load.stress.0 * load.joint_efficiency),
    );
    let floor_governs = formula.0 < form.floor.0;
    let value = if floor_governs { form.floor } else { formula };
    TminCalc {
        form,
        load,
        liquid_height,
        formula,
        floor_governs,
        value,
    }
}

/// A maximum fill height with its substituted terms.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct FillHeightCalc {
    /// The printed form used.
    pub form: OneFootForm,
    /// The inputs.
    pub load: CourseLoad,
    /// The thickness the course is credited with.
    pub thickness: Thickness,
    /// S E t / (coefficient D G): the liquid head the thickness carries, above the
    /// one-foot point.
    pub head: Length,
    /// True when `thickness` is below the 2.5 mm / 0.1 in floor: no liquid level
    /// makes the course acceptable, and the level is limited to the bottom of the
    /// course (the course must not be wetted until it is repaired).
    pub below_floor: bool,
    /// H_max above the tank bottom.
    pub value: Length,
}

/// The highest liquid level, above the tank bottom, at which a course of thickness
/// `thickness` still meets the whole-course t_min (inverse of API 653 4.3.3.1,
/// methods.md s.4).
pub fn max_fill_height(load: CourseLoad, thickness: Thickness) -> FillHeightCalc {
    let form = OneFootForm::of(load.units);
    let credited = Thickness(thickness.0.max(0.0));
    let head = Length(
        load.stress.0 * load.joint_efficiency * credited.0
            / (form.coefficient * load.diameter.0 * load.specific_gravity),
    );
    let below_floor = thickness.0 < form.floor.0;
    let value = if below_floor {
        load.bottom_elevation
    } else {
        Length(head.0 + form.offset.0 + load.bottom_elevation.0)
    };
    FillHeightCalc {
        form,
        load,
        thickness,
        head,
        below_floor,
        value,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn si_course(bottom: f64) -> CourseLoad {
        CourseLoad {
            units: UnitSystem::Si,
            diameter: Length(36.0),
            specific_gravity: 0.9,
            stress: Stress(171.6),
            joint_efficiency: 1.0,
            bottom_elevation: Length(bottom),
        }
    }

    /// Worked example, SI (API 653 4.3.3.1 SI form, by hand):
    /// D = 36 m, H = 13.8 m, G = 0.9, S = 171.6 MPa (A36, course 1), E = 1.0
    /// t_min = 4.9 x 36 x (13.8 - 0.3) x 0.9 / (171.6 x 1.0)
    ///       = 4.9 x 36 = 176.4; x 13.5 = 2381.4; x 0.9 = 2143.26; / 171.6 = 12.4899 mm
    #[test]
    fn si_bottom_course_by_hand() {
        let t = whole_course_t_min(si_course(0.0), Length(13.8));
        assert!((t.value.0 - 12.489_86).abs() < 1e-4, "{}", t.value.0);
        assert!(!t.floor_governs);
        assert_eq!(t.liquid_height, Length(13.8));
    }

    /// Worked example, USC (API 653 4.3.3.1, by hand):
    /// D = 120 ft, H = 40 ft, G = 1.0, S = 23,600 psi (A283-C lower course,
    /// table 4.1 from memory), E = 0.85
    /// t_min = 2.6 x 120 x (40 - 1) x 1.0 / (23,600 x 0.85)
    ///       = 312 x 39 = 12,168 / 20,060 = 0.60658 in
    #[test]
    fn usc_course_by_hand() {
        let load = CourseLoad {
            units: UnitSystem::Usc,
            diameter: Length(120.0),
            specific_gravity: 1.0,
            stress: Stress(23_600.0),
            joint_efficiency: 0.85,
            bottom_elevation: Length(0.0),
        };
        let t = whole_course_t_min(load, Length(40.0));
        assert!((t.value.0 - 0.606_58).abs() < 1e-5, "{}", t.value.0);
    }

    /// Worked example, course above the liquid: bottom at 14.4 m, level 13.8 m.
    /// H = 13.8 - 14.4 = -0.6 m -> no head -> formula 0 -> floor 2.5 mm governs
    /// (API 653 4.3.3.1: t_min not less than 2.5 mm).
    #[test]
    fn course_above_liquid_gets_the_floor() {
        let t = whole_course_t_min(si_course(14.4), Length(13.8));
        assert_eq!(t.formula, Thickness(0.0));
        assert!(t.floor_governs);
        assert_eq!(t.value, Thickness(2.5));
    }

    /// Top course wetted only 1.8 m: 4.9 x 36 x 1.5 x 0.9 / 188.8 = 1.2613 mm < 2.5 -> floor.
    #[test]
    fn shallow_head_floor_governs() {
        let mut load = si_course(12.0);
        load.stress = Stress(188.8);
        let t = whole_course_t_min(load, Length(13.8));
        assert!((t.formula.0 - 1.261_33).abs() < 1e-4, "{}", t.formula.0);
        assert_eq!(t.value, Thickness(2.5));
    }

    /// Inverse by hand: t = 12.0 mm on the SI course above:
    /// head = 171.6 x 1.0 x 12.0 / (4.9 x 36 x 0.9) = 2059.2 / 158.76 = 12.9705 m
    /// H_max = 12.9705 + 0.3 + 0 = 13.2705 m
    #[test]
    fn max_fill_height_by_hand() {
        let h = max_fill_height(si_course(0.0), Thickness(12.0));
        assert!((h.value.0 - 13.270_54).abs() < 1e-4, "{}", h.value.0);
    }

    /// Round trip t_min(H_max(t)) = t (methods.md s.4).
    #[test]
    fn round_trip() {
        for bottom in [0.0, 2.4, 4.8, 12.0] {
            for t in [2.5, 3.0, 8.0, 12.0, 20.0] {
                let load = si_course(bottom);
                let h = max_fill_height(load, Thickness(t));
                let back = whole_course_t_min(load, h.value);
                assert!((back.value.0 - t).abs() < 1e-9, "bottom {bottom} t {t}");
            }
        }
    }

    /// Below the floor, no level is acceptable: the level is limited to the bottom.
    #[test]
    fn below_floor_limits_to_course_bottom() {
        let h = max_fill_height(si_course(12.0), Thickness(2.4));
        assert!(h.below_floor);
        assert_eq!(h.value, Length(12.0));
    }
}
