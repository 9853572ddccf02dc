//! Presentation units and number formatting shared by the renderers. Converting a
//! result to the other unit system for display (`--units`) happens here, at the edge.

use crate::calc::units::{Length, Rate, Stress, Thickness, UnitSystem};

/// Converts result values from the tank's units to the display units.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct View {
    /// The tank's unit system.
    pub from: UnitSystem,
    /// The unit system shown.
    pub to: UnitSystem,
}

impl View {
    /// Shows values in `to` (or in the tank's own system).
    pub fn new(from: UnitSystem, to: Option<UnitSystem>) -> Self {
        View {
            from,
            to: to.unwrap_or(from),
        }
    }
    /// A length in display units.
    pub fn len(&self, v: Length) -> f64 {
        v.convert(self.from, self.to).0
    }
    /// A thickness in display units.
    pub fn thk(&self, v: Thickness) -> f64 {
        v.convert(self.from, self.to).0
    }
    /// A stress in display units.
    pub fn stress(&self, v: Stress) -> f64 {
        v.convert(self.from, self.to).0
    }
    /// A rate in display units.
    pub fn rate(&self, v: Rate) -> f64 {
        v.convert(self.from, self.to).0
    }
    /// Length with its unit, for sentences.
    pub fn len_text(&self, v: Length) -> String {
        format!("{:.2} {}", self.len(v), self.to.length_unit())
    }
    /// Thickness with its unit, for sentences.
    pub fn thk_text(&self, v: Thickness) -> String {
        format!(
            "{:.*} {}",
            self.thk_decimals(),
            self.thk(v),
            self.to.thickness_unit()
        )
    }
    /// Rate with its unit (and mpy in USC), for sentences.
    pub fn rate_text(&self, v: Rate) -> String {
        let r = self.rate(v);
        match self.to {
            UnitSystem::Si => format!("{r:.3} mm/y"),
            UnitSystem::Usc => format!("{r:.4} in/y ({:.1} mpy)", r * 1000.0),
        }
    }
    /// Stress with its unit.
    pub fn stress_text(&self, v: Stress) -> String {
        match self.to {
            UnitSystem::Si => format!("{:.1} MPa", self.stress(v)),
            UnitSystem::Usc => format!("{:.0} psi", self.stress(v)),
        }
    }
    /// Decimals of a thickness: gauge resolution 0.01 mm / 0.001 in (common practice).
    pub fn thk_decimals(&self) -> usize {
        match self.to {
            UnitSystem::Si => 2,
            UnitSystem::Usc => 3,
        }
    }
    /// Decimals of a rate.
    pub fn rate_decimals(&self) -> usize {
        match self.to {
            UnitSystem::Si => 3,
            UnitSystem::Usc => 4,
        }
    }
}

/// `v` rounded to 6 significant digits: machine outputs keep the precision a check
/// needs without printing binary noise.
pub fn sig6(v: f64) -> f64 {
    if v == 0.0 {
        return 0.0; // also turns -0.0 into 0.0
    }
    if !v.is_finite() {
        return v;
    }
    format!("{v:.5e}").parse().unwrap_or(v)
}

/// Years, one decimal.
pub fn years_text(y: f64) -> String {
    format!("{y:.1}")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn six_significant_digits() {
        assert_eq!(sig6(12.489_858_3), 12.4899);
        assert_eq!(sig6(0.000_123_456_78), 0.000_123_457);
        assert_eq!(sig6(24_882.0), 24_882.0);
        assert_eq!(sig6(0.0), 0.0);
    }

    #[test]
    fn converts_for_display() {
        let v = View::new(UnitSystem::Usc, Some(UnitSystem::Si));
        assert_eq!(v.thk(Thickness(1.0)), 25.4);
        assert_eq!(v.thk_text(Thickness(0.5)), "12.70 mm");
    }
}
