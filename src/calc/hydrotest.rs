//! Checks of an in-service shell beside the one-foot t_min: the hydrostatic test height
//! of every course, and for tanks beyond the one-foot method's diameter limit, the
//! variable-design-point thickness for comparison.
//!
//! Sources (from memory; methods.md s.4 and s.7):
//! - Hydrotest height (API 653 4.3.3.2): H_t = S_t E t / (4.9 D) + 0.3 + z_bottom
//!   [USC: 2.6, 1 ft], with G = 1 (water) and S_t the in-service hydrotest stress
//!   (stress.rs); t = t_actual. The tank's height is the least over measured courses.
//! - Over D = 61 m (200 ft), the variable-design-point thickness (API 650 5.6.4) at the
//!   product's G, the maximum liquid level and the in-service S E, never below the
//!   2.5 mm / 0.1 in floor, is reported beside t_min as a comparison only: it never
//!   replaces the one-foot result.

use super::constants::OneFootForm;
use super::design::one_foot_applies;
use super::shell::{CourseLoad, FillHeightCalc, max_fill_height};
use super::stress::{AllowableStress, in_service_test_stress};
use super::units::{Stress, Thickness};
use super::vdp::{Applicability, Condition, VdpCourse, VdpShell, applicability, size_shell};
use crate::model::result::{CourseResult, FillLimit};
use crate::model::tank::Tank;

/// One course's hydrotest height.
#[derive(Debug, Clone, PartialEq)]
pub struct CourseHydrotest {
    /// Course.
    pub course: u32,
    /// S_t in service (None for riveted tanks).
    pub stress: Option<AllowableStress>,
    /// H_t (None without S_t or without readings).
    pub height: Option<FillHeightCalc>,
}

/// Hydrotest heights of the tank.
#[derive(Debug, Clone, PartialEq)]
pub struct Hydrotest {
    /// Per course, bottom first.
    pub courses: Vec<CourseHydrotest>,
    /// The least over courses (None when any measured course has no H_t).
    pub tank: Option<FillLimit>,
}

/// Hydrotest height of each course and of the tank.
pub fn hydrotest(tank: &Tank, courses: &[CourseResult]) -> Hydrotest {
    let mut out = Vec::with_capacity(courses.len());
    for c in courses {
        let material = tank.course(c.number).map(|k| &k.material);
        let stress = material
            .and_then(|m| in_service_test_stress(tank.units, tank.construction, c.number, m));
        let height = match (&stress, &c.condition) {
            (Some(s), Some(k)) => Some(max_fill_height(
                CourseLoad {
                    specific_gravity: 1.0,
                    stress: s.value,
                    ..k.max_fill_height.load
                },
                k.t_actual(),
            )),
            _ => None,
        };
        out.push(CourseHydrotest {
            course: c.number,
            stress,
            height,
        });
    }
    let measured = courses
        .iter()
        .zip(&out)
        .filter(|(c, _)| c.condition.is_some());
    let mut least: Option<FillLimit> = None;
    let mut complete = true;
    for (c, h) in measured {
        match &h.height {
            Some(h) => {
                if least.is_none_or(|l| h.value.0 < l.level.0) {
                    least = Some(FillLimit {
                        level: h.value,
                        course: c.number,
                    });
                }
            }
            None => complete = false,
        }
    }
    Hydrotest {
        courses: out,
        tank: if complete { least } else { None },
    }
}

/// The variable-design-point thickness beside t_min, for tanks over the one-foot limit.
#[derive(Debug, Clone, PartialEq)]
pub struct VariablePointComparison {
    /// L / H with t = the bottom course's t_actual.
    pub applicability: Applicability,
    /// Per course (bottom first): the variable-design-point thickness at the in-service
    /// S E, floored like t_min; None where the method does not apply.
    pub thickness: Vec<Option<Thickness>>,
}

/// None for tanks within the one-foot method's limit.
pub fn variable_point_comparison(
    tank: &Tank,
    courses: &[CourseResult],
) -> Option<VariablePointComparison> {
    if one_foot_applies(tank.units, tank.diameter) {
        return None;
    }
    let bottom = courses
        .first()
        .and_then(|c| c.condition.as_ref())
        .map_or(Thickness(0.0), |k| k.t_actual());
    let appl = applicability(tank.units, tank.diameter, tank.max_fill_height, bottom);
    let floor = OneFootForm::of(tank.units).floor;
    let thickness = if appl.holds {
        let shell = VdpShell {
            units: tank.units,
            diameter: tank.diameter,
            fill_height: tank.max_fill_height,
            specific_gravity: tank.specific_gravity,
            courses: courses
                .iter()
                .map(|c| VdpCourse {
                    height: c.height,
                    bottom_elevation: c.bottom_elevation,
                    stress: Stress(c.stress.value.0 * c.joint_efficiency),
                })
                .collect(),
            condition: Condition::Design,
        };
        size_shell(&shell)
            .iter()
            .map(|k| Some(Thickness(k.value().0.max(floor.0))))
            .collect()
    } else {
        vec![None; courses.len()]
    };
    Some(VariablePointComparison {
        applicability: appl,
        thickness,
    })
}
