//! Minimum thickness of a locally thinned area, and the liquid level it allows.
//!
//! Sources: API 653 4.3.3.1 (the locally-thinned-area form, from memory of the clause)
//! and methods.md s.3 and s.4 (local form).
//!
//! - t_min = 4.9 D H G / (S E)   [SI: mm, m, MPa]
//! - t_min = 2.6 D H G / (S E)   [USC: in, ft, psi]
//! - never less than 2.5 mm (0.1 in);
//! - H from the bottom of the area (z) to the maximum liquid level: the one-foot
//!   offset of the whole-course form is not taken off, because a local area has no
//!   joint below it to restrain it.
//!
//! A rule of the form  t - N I >= f t_min  (f = 1 for t1, 0.6 for t2, 0.5 for a pit;
//! N I the corrosion expected by the next inspection, API 653 4.3.2) inverts to the
//! highest liquid level at which it holds (methods.md s.4, local form):
//!
//! - H_max = S E t' / (f 4.9 D G) + z    [USC: 2.6],   t' = t - N I
//! - when t' < f x floor no level satisfies the rule: the level is limited to z, the
//!   bottom of the area (it must not be wetted until repaired).
//!
//! Symbols: D nominal diameter, G specific gravity, S allowable stress of the course,
//! E joint efficiency, z elevation of the bottom of the area, t thickness.

use super::shell::CourseLoad;
use super::units::{Length, Thickness};
use crate::calc::constants::OneFootForm;

/// A local t_min with its substituted terms.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LocalTminCalc {
    /// The printed form (coefficient and floor; its one-foot offset is not used).
    pub form: OneFootForm,
    /// The inputs; `load.bottom_elevation` is z, the bottom of the area.
    pub load: CourseLoad,
    /// H = fill height - z (negative when the area is above the liquid).
    pub liquid_height: Length,
    /// coefficient x D x max(H, 0) x G / (S E).
    pub formula: Thickness,
    /// Whether the 2.5 mm / 0.1 in floor governs.
    pub floor_governs: bool,
    /// t_min = max(formula, floor).
    pub value: Thickness,
}

/// Local t_min of an area whose bottom is at `load.bottom_elevation`, for a liquid
/// level `fill_height` above the tank bottom (API 653 4.3.3.1, local form).
pub fn local_t_min(load: CourseLoad, fill_height: Length) -> LocalTminCalc {
    let form = OneFootForm::of(load.units);
    let liquid_height = Length(fill_height.0 - load.bottom_elevation.0);
    let formula = Thickness(
        form.coefficient * load.diameter.0 * liquid_height.0.max(0.0) * load.specific_gravity
            / (load.stress.0 * load.joint_efficiency),
    );
    let floor_governs = formula.0 < form.floor.0;
    LocalTminCalc {
        form,
        load,
        liquid_height,
        formula,
        floor_governs,
        value: if floor_governs { form.floor } else { formula },
    }
}

/// The highest liquid level at which a local rule holds, with its terms.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LocalFillCalc {
    /// The printed form.
    pub form: OneFootForm,
    /// The inputs; `load.bottom_elevation` is z.
    pub load: CourseLoad,
    /// f: 1 (t1), 0.6 (t2) or 0.5 (pit).
    pub fraction: f64,
    /// t', the thickness credited (after any future corrosion).
    pub thickness: Thickness,
    /// S E t' / (f coefficient D G): the liquid head above z the thickness carries.
    pub head: Length,
    /// True when t' < f x floor: no level satisfies the rule.
    pub below_floor: bool,
    /// H_max above the tank bottom (z when below the floor).
    pub value: Length,
}

/// H_max = S E t' / (f c D G) + z (methods.md s.4, local form, generalised to the
/// fraction f of t_min that the rule asks for).
pub fn local_max_fill_height(
    load: CourseLoad,
    thickness: Thickness,
    fraction: f64,
) -> LocalFillCalc {
    let form = OneFootForm::of(load.units);
    let credited = thickness.0.max(0.0);
    let head = Length(
        load.stress.0 * load.joint_efficiency * credited
            / (fraction * form.coefficient * load.diameter.0 * load.specific_gravity),
    );
    let below_floor = thickness.0 < fraction * form.floor.0;
    LocalFillCalc {
        form,
        load,
        fraction,
        thickness,
        head,
        below_floor,
        value: if below_floor {
            load.bottom_elevation
        } else {
            Length(head.0 + load.bottom_elevation.0)
        },
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calc::units::{Stress, UnitSystem};

    fn si_area(z: f64) -> CourseLoad {
        CourseLoad {
            units: UnitSystem::Si,
            diameter: Length(36.0),
            specific_gravity: 0.9,
            stress: Stress(171.6),
            joint_efficiency: 1.0,
            bottom_elevation: Length(z),
        }
    }

    /// Worked example, SI (API 653 4.3.3.1 local form, by hand): D 36 m, G 0.9,
    /// S 171.6 MPa, E 1.0, area bottom z = 0.10 m, level 13.8 m:
    /// H = 13.8 - 0.10 = 13.70 m; t_min = 4.9 x 36 x 13.70 x 0.9 / 171.6
    ///   = 176.4 x 13.70 = 2416.68; x 0.9 = 2175.012; / 171.6 = 12.674895 mm
    /// (the whole-course form with its 0.3 m offset gives 12.4899 mm at z = 0).
    #[test]
    fn si_local_t_min_by_hand() {
        let t = local_t_min(si_area(0.10), Length(13.8));
        assert!((t.liquid_height.0 - 13.70).abs() < 1e-12);
        assert!((t.value.0 - 12.674_895).abs() < 1e-6, "{}", t.value.0);
        assert!(!t.floor_governs);
    }

    /// Worked example, USC: D 80 ft, G 0.74, S 23,595 psi, E 0.85, z = 0.5 ft, level
    /// 37.5 ft: H = 37.0 ft; t_min = 2.6 x 80 x 37.0 x 0.74 / (23,595 x 0.85)
    ///   = 208 x 37 = 7696; x 0.74 = 5695.04; / 20,055.75 = 0.283960 in.
    #[test]
    fn usc_local_t_min_by_hand() {
        let load = CourseLoad {
            units: UnitSystem::Usc,
            diameter: Length(80.0),
            specific_gravity: 0.74,
            stress: Stress(23_595.0),
            joint_efficiency: 0.85,
            bottom_elevation: Length(0.5),
        };
        let t = local_t_min(load, Length(37.5));
        assert!((t.value.0 - 0.283_960).abs() < 1e-6, "{}", t.value.0);
    }

    /// Above the liquid, and under a shallow head, the floor governs (API 653 4.3.3.1:
    /// not less than 2.5 mm): z 13.5, level 13.8: 176.4 x 0.3 x 0.9 / 171.6 = 0.27755
    /// < 2.5; z 14.0: H = -0.2 -> formula 0.
    #[test]
    fn floor_governs_near_and_above_the_level() {
        let t = local_t_min(si_area(13.5), Length(13.8));
        assert!((t.formula.0 - 0.277_552).abs() < 1e-6);
        assert_eq!(t.value, Thickness(2.5));
        let t = local_t_min(si_area(14.0), Length(13.8));
        assert_eq!((t.formula, t.value), (Thickness(0.0), Thickness(2.5)));
    }

    /// Inverse by hand: t1 12.55 mm at z 0.10 m, f = 1:
    /// head = 171.6 x 1.0 x 12.55 / (1 x 4.9 x 36 x 0.9) = 2153.58 / 158.76 = 13.56501 m;
    /// H_max = 13.56501 + 0.10 = 13.66501 m.
    /// t2 9.0 mm, f = 0.6: head = 171.6 x 9.0 / (0.6 x 158.76) = 1544.4 / 95.256 =
    /// 16.21315 m; + 0.10 = 16.31315 m.
    #[test]
    fn inverse_by_hand() {
        let h = local_max_fill_height(si_area(0.10), Thickness(12.55), 1.0);
        assert!((h.value.0 - 13.665_01).abs() < 1e-5, "{}", h.value.0);
        let h = local_max_fill_height(si_area(0.10), Thickness(9.0), 0.6);
        assert!((h.value.0 - 16.313_15).abs() < 1e-5, "{}", h.value.0);
    }

    /// Round trip (methods.md s.4): f x t_min(H_max(t)) = t, for every fraction.
    #[test]
    fn round_trip() {
        for z in [0.0, 0.35, 2.4, 9.0] {
            for f in [1.0, 0.6, 0.5] {
                for t in [3.0, 8.0, 12.55] {
                    let h = local_max_fill_height(si_area(z), Thickness(t), f);
                    let back = local_t_min(si_area(z), h.value);
                    assert!((f * back.value.0 - t).abs() < 1e-9, "z {z} f {f} t {t}");
                }
            }
        }
    }

    /// Below f x floor no level is acceptable: 1.4 mm < 0.6 x 2.5 = 1.5 mm for t2.
    #[test]
    fn below_the_floor_limits_to_the_area_bottom() {
        let h = local_max_fill_height(si_area(0.35), Thickness(1.4), 0.6);
        assert!(h.below_floor);
        assert_eq!(h.value, Length(0.35));
    }
}
