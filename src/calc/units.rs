//! Unit systems and the quantities that cross function boundaries.
//!
//! A tank declares one unit system and every formula is evaluated in the form the
//! codes print for that system (methods.md, "Two unit systems are first-class").
//! Each quantity below is a newtype holding a number *in the tank's own unit* for
//! that quantity, so a length (m or ft) can never be passed where a thickness
//! (mm or in) is expected. Conversions between systems happen only at the edges
//! (reading a unit-suffixed column, printing with `--units`), through the exact
//! factors below.
//!
//! | quantity    | SI    | USC   |
//! |-------------|-------|-------|
//! | `Length`    | m     | ft    |
//! | `Thickness` | mm    | in    |
//! | `Stress`    | MPa   | psi   |
//! | `Rate`      | mm/y  | in/y  |

use std::fmt;

/// Millimetres per inch: exact by definition of the international inch (1959).
pub const MM_PER_IN: f64 = 25.4;
/// Metres per foot: exact by definition of the international foot (1959).
pub const M_PER_FT: f64 = 0.3048;
/// Millimetres per metre (definition of the prefix).
pub const MM_PER_M: f64 = 1000.0;
/// Inches per foot (definition).
pub const IN_PER_FT: f64 = 12.0;
/// Pascals per psi: 1 lbf/in2 = 4.448 221 615 260 5 N / (0.0254 m)^2 (exact from the
/// definitions of the pound-force and the inch).
pub const PA_PER_PSI: f64 = 4.448_221_615_260_5 / (0.0254 * 0.0254);

/// The unit system a tank is described in.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum UnitSystem {
    /// m, mm, MPa.
    Si,
    /// ft, in, psi.
    Usc,
}

impl UnitSystem {
    /// The other system (for `--units`).
    pub fn other(self) -> Self {
        match self {
            UnitSystem::Si => UnitSystem::Usc,
            UnitSystem::Usc => UnitSystem::Si,
        }
    }
    /// Name as written in tank.toml.
    pub fn name(self) -> &'static str {
        match self {
            UnitSystem::Si => "SI",
            UnitSystem::Usc => "USC",
        }
    }
    /// Unit of `Length`.
    pub fn length_unit(self) -> &'static str {
        match self {
            UnitSystem::Si => "m",
            UnitSystem::Usc => "ft",
        }
    }
    /// Unit of `Thickness`.
    pub fn thickness_unit(self) -> &'static str {
        match self {
            UnitSystem::Si => "mm",
            UnitSystem::Usc => "in",
        }
    }
    /// Unit of `Stress`.
    pub fn stress_unit(self) -> &'static str {
        match self {
            UnitSystem::Si => "MPa",
            UnitSystem::Usc => "psi",
        }
    }
    /// Unit of `Rate`.
    pub fn rate_unit(self) -> &'static str {
        match self {
            UnitSystem::Si => "mm/y",
            UnitSystem::Usc => "in/y",
        }
    }
    /// Thickness units in one length unit: 1000 mm per m, 12 in per ft (exact, by
    /// definition). A grid scan gives its pitches in the thickness unit; elevations
    /// are in the length unit.
    pub fn thickness_units_per_length_unit(self) -> f64 {
        match self {
            UnitSystem::Si => MM_PER_M,
            UnitSystem::Usc => IN_PER_FT,
        }
    }
    /// A distance given in the thickness unit (mm or in), as a `Length` (m or ft).
    pub fn as_length(self, distance: Thickness) -> Length {
        Length(distance.0 / self.thickness_units_per_length_unit())
    }
    /// A `Length` (m or ft) in the thickness unit (mm or in).
    pub fn as_thickness_unit(self, length: Length) -> Thickness {
        Thickness(length.0 * self.thickness_units_per_length_unit())
    }
    /// Size of one thickness unit of this system in millimetres.
    fn mm_per_thickness_unit(self) -> f64 {
        match self {
            UnitSystem::Si => 1.0,
            UnitSystem::Usc => MM_PER_IN,
        }
    }
    /// Size of one length unit of this system in metres.
    fn m_per_length_unit(self) -> f64 {
        match self {
            UnitSystem::Si => 1.0,
            UnitSystem::Usc => M_PER_FT,
        }
    }
    /// Size of one stress unit of this system in pascals.
    fn pa_per_stress_unit(self) -> f64 {
        match self {
            UnitSystem::Si => 1.0e6,
            UnitSystem::Usc => PA_PER_PSI,
        }
    }
}

impl fmt::Display for UnitSystem {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

macro_rules! quantity {
    ($(#[$doc:meta])* $name:ident, $factor:ident) => {
        $(#[$doc])*
        #[derive(Debug, Clone, Copy, PartialEq, PartialOrd, Default)]
        pub struct $name(pub f64);

        impl $name {
            /// The same quantity expressed in another unit system.
            pub fn convert(self, from: UnitSystem, to: UnitSystem) -> Self {
                if from == to {
                    self
                } else {
                    $name(self.0 * from.$factor() / to.$factor())
                }
            }
            /// The number, in the tank's unit for this quantity.
            pub fn value(self) -> f64 {
                self.0
            }
        }
    };
}

quantity!(
    /// A length or elevation in the tank's length unit (m or ft).
    Length,
    m_per_length_unit
);
quantity!(
    /// A wall thickness in the tank's thickness unit (mm or in).
    Thickness,
    mm_per_thickness_unit
);
quantity!(
    /// A stress in the tank's stress unit (MPa or psi).
    Stress,
    pa_per_stress_unit
);
quantity!(
    /// A corrosion rate in the tank's thickness unit per year (mm/y or in/y).
    Rate,
    mm_per_thickness_unit
);

impl Thickness {
    /// Thickness lost over `years` at `rate`.
    pub fn after(self, rate: Rate, years: f64) -> Thickness {
        Thickness(self.0 - rate.0 * years)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_factors() {
        // 1 in = 25.4 mm and 1 ft = 0.3048 m by definition (international yard and
        // pound agreement, 1959); 1 psi = 6894.757 Pa (NIST SP 811, appendix B).
        assert_eq!(
            Thickness(1.0).convert(UnitSystem::Usc, UnitSystem::Si).0,
            25.4
        );
        assert_eq!(
            Length(10.0).convert(UnitSystem::Usc, UnitSystem::Si).0,
            3.048
        );
        let mpa = Stress(1000.0).convert(UnitSystem::Usc, UnitSystem::Si).0;
        assert!((mpa - 6.894_757).abs() < 1e-6, "{mpa}");
    }

    /// 50 mm = 0.05 m; 6 in = 0.5 ft (definitions of the units).
    #[test]
    fn grid_distances_as_lengths() {
        assert_eq!(UnitSystem::Si.as_length(Thickness(50.0)), Length(0.05));
        assert_eq!(UnitSystem::Usc.as_length(Thickness(6.0)), Length(0.5));
        assert_eq!(
            UnitSystem::Usc.as_thickness_unit(Length(3.0)),
            Thickness(36.0)
        );
    }

    #[test]
    fn round_trip() {
        let s = Stress(171.6);
        let back = s
            .convert(UnitSystem::Si, UnitSystem::Usc)
            .convert(UnitSystem::Usc, UnitSystem::Si);
        assert!((back.0 - 171.6).abs() < 1e-9);
    }
}
