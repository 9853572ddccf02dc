//! The tank as described by its `tank.toml`, after validation.

use chrono::NaiveDate;

use crate::calc::materials::Grade;
use crate::calc::units::{Length, Stress, Thickness, UnitSystem};

/// How the shell plates are joined.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Construction {
    /// Welded shell (the default).
    Welded,
    /// Riveted shell: one allowable stress for every course.
    Riveted,
}

impl Construction {
    /// Name as written in tank.toml.
    pub fn name(self) -> &'static str {
        match self {
            Construction::Welded => "welded",
            Construction::Riveted => "riveted",
        }
    }
}

/// Which reading of a survey represents a course.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ThicknessBasis {
    /// The least reading (the default; conservative).
    Minimum,
    /// The mean of the readings.
    Average,
}

impl ThicknessBasis {
    /// Name as written in tank.toml.
    pub fn name(self) -> &'static str {
        match self {
            ThicknessBasis::Minimum => "minimum",
            ThicknessBasis::Average => "average",
        }
    }
}

/// Which corrosion rate governs remaining life and intervals.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum RateBasis {
    /// The greater of the long-term and short-term rates.
    Conservative,
    /// First to last survey.
    LongTerm,
    /// Previous to last survey.
    ShortTerm,
    /// Least-squares slope over every survey.
    Regression,
    /// One-sided 95 % upper bound of the regression slope.
    RegressionUpper,
}

impl RateBasis {
    /// Name as written in tank.toml.
    pub fn name(self) -> &'static str {
        match self {
            RateBasis::Conservative => "conservative",
            RateBasis::LongTerm => "long-term",
            RateBasis::ShortTerm => "short-term",
            RateBasis::Regression => "regression",
            RateBasis::RegressionUpper => "regression-upper",
        }
    }
    /// Every basis, in the order of formats.md.
    pub const ALL: [RateBasis; 5] = [
        RateBasis::Conservative,
        RateBasis::LongTerm,
        RateBasis::ShortTerm,
        RateBasis::Regression,
        RateBasis::RegressionUpper,
    ];
}

/// Where a course's strength comes from.
#[derive(Debug, Clone, PartialEq)]
pub enum Material {
    /// A grade of the built-in table (including `unknown`).
    Grade(&'static Grade),
    /// Specified minimum yield and tensile strength given in the tank file.
    Explicit {
        /// Specified minimum yield strength.
        yield_strength: Stress,
        /// Specified minimum tensile strength.
        tensile_strength: Stress,
    },
    /// Not given (accepted for riveted tanks only, where it does not enter S).
    NotGiven,
}

/// One shell course.
#[derive(Debug, Clone, PartialEq)]
pub struct Course {
    /// 1 = bottom course.
    pub number: u32,
    /// Course height.
    pub height: Length,
    /// Elevation of the bottom of the course above the tank bottom.
    pub bottom_elevation: Length,
    /// Nominal (as-built) plate thickness.
    pub nominal_thickness: Thickness,
    /// Plate material.
    pub material: Material,
    /// Per-course joint efficiency override.
    pub joint_efficiency: Option<f64>,
    /// Design corrosion allowance (for `required`; 0 when not given).
    pub corrosion_allowance: Thickness,
    /// Design stress S_d given instead of the material's (for `required`).
    pub design_stress: Option<Stress>,
    /// Hydrostatic test stress S_t given instead of the material's (for `required`).
    pub test_stress: Option<Stress>,
}

/// A validated tank description.
#[derive(Debug, Clone, PartialEq)]
pub struct Tank {
    /// Short tag.
    pub id: String,
    /// Longer name, if given.
    pub name: Option<String>,
    /// The unit system every number of this tank is in.
    pub units: UnitSystem,
    /// Nominal diameter D.
    pub diameter: Length,
    /// Maximum liquid level above the tank bottom.
    pub max_fill_height: Length,
    /// Highest specific gravity of the contents, G.
    pub specific_gravity: f64,
    /// Welded or riveted.
    pub construction: Construction,
    /// Tank-wide joint efficiency E.
    pub joint_efficiency: f64,
    /// Date the tank went into service.
    pub in_service_since: Option<NaiveDate>,
    /// Thickness basis of each survey.
    pub thickness_basis: ThicknessBasis,
    /// Governing corrosion rate rule.
    pub rate_basis: RateBasis,
    /// Courses, bottom first, numbered 1..
    pub courses: Vec<Course>,
}

impl Tank {
    /// Total shell height (sum of the course heights).
    pub fn shell_height(&self) -> Length {
        Length(self.courses.iter().map(|c| c.height.0).sum())
    }
    /// The course with this number, if any.
    pub fn course(&self, number: u32) -> Option<&Course> {
        self.courses.iter().find(|c| c.number == number)
    }
    /// Joint efficiency of a course: its override, else the tank's.
    pub fn joint_efficiency_of(&self, course: &Course) -> f64 {
        course.joint_efficiency.unwrap_or(self.joint_efficiency)
    }
}
