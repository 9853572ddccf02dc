//! Result of `strake required`: the required thickness of every course by the one-foot
//! and the variable-design-point methods, with every intermediate value.

use crate::calc::design::{DesignStress, OneFootDesign};
use crate::calc::units::{Length, Thickness, UnitSystem};
use crate::calc::vdp::{Applicability, CourseCalc};
use crate::model::warning::Warning;

/// One course.
#[derive(Debug, Clone, PartialEq)]
pub struct RequiredCourse {
    /// 1 = bottom.
    pub number: u32,
    /// Height.
    pub height: Length,
    /// Elevation of its bottom.
    pub bottom_elevation: Length,
    /// Nominal thickness, when known (tank folders).
    pub nominal: Option<Thickness>,
    /// Design corrosion allowance.
    pub corrosion_allowance: Thickness,
    /// S_d.
    pub design_stress: DesignStress,
    /// S_t.
    pub test_stress: DesignStress,
    /// One-foot design and test thickness.
    pub one_foot: OneFootDesign,
    /// Variable-design-point, design condition (thickness without CA); None where the
    /// method does not apply.
    pub vdp_design: Option<CourseCalc>,
    /// Variable-design-point, hydrotest condition; None where it does not apply.
    pub vdp_test: Option<CourseCalc>,
    /// Minimum nominal thickness for the diameter.
    pub minimum_nominal: Thickness,
    /// max(one-foot design, one-foot test, minimum nominal).
    pub required_one_foot: Thickness,
    /// max(VDP design + CA, VDP test, minimum nominal); None where VDP does not apply.
    pub required_vdp: Option<Thickness>,
}

impl RequiredCourse {
    /// VDP design thickness including CA.
    pub fn vdp_design_thickness(&self) -> Option<Thickness> {
        self.vdp_design
            .as_ref()
            .map(|c| Thickness(c.value().0 + self.corrosion_allowance.0))
    }
    /// VDP hydrotest thickness.
    pub fn vdp_test_thickness(&self) -> Option<Thickness> {
        self.vdp_test.as_ref().map(CourseCalc::value)
    }
    /// required_one_foot - required_vdp: the steel the refined method saves.
    pub fn difference(&self) -> Option<Thickness> {
        self.required_vdp
            .map(|v| Thickness(self.required_one_foot.0 - v.0))
    }
}

/// The whole shell.
#[derive(Debug, Clone, PartialEq)]
pub struct RequiredShell {
    /// Tank id, for tank folders.
    pub tank_id: Option<String>,
    /// Tank name, for tank folders.
    pub tank_name: Option<String>,
    /// Unit system.
    pub units: UnitSystem,
    /// D.
    pub diameter: Length,
    /// Design liquid level.
    pub fill_height: Length,
    /// Design specific gravity.
    pub specific_gravity: f64,
    /// D within the one-foot method's limit.
    pub one_foot_applies: bool,
    /// L / H of the variable-design-point method.
    pub vdp_applicability: Applicability,
    /// Courses, bottom first.
    pub courses: Vec<RequiredCourse>,
    /// Remarks.
    pub warnings: Vec<Warning>,
}
