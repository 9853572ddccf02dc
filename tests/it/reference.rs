//! Checks of the methods against references outside the project: physical constants
//! through an independent units library (uom), an independent regression crate
//! (linregress), and the published tables (named beside each check).

use chrono::NaiveDate;
use strake::calc::constants::{ONE_FOOT_COEFFICIENT_SI, ONE_FOOT_COEFFICIENT_USC};
use strake::calc::rates::{BasisPoint, regression, student_t_quantile, years_between};
use strake::calc::units::Thickness;
use uom::si::acceleration::{foot_per_second_squared, meter_per_second_squared};
use uom::si::f64::{Acceleration, Length, MassDensity, Pressure};
use uom::si::length::{foot, inch, meter, millimeter};
use uom::si::mass_density::{kilogram_per_cubic_meter, slug_per_cubic_foot};
use uom::si::pressure::{megapascal, pound_force_per_square_inch};

/// Barlow hoop stress t = p D / (2 S) with p = rho_w g H (methods.md s.1): the
/// coefficient is t / (D H G / S) in the units each form prints.
fn coefficient(
    rho: MassDensity,
    g: Acceleration,
    unit_len: Length,
    unit_stress: Pressure,
) -> Length {
    let head = unit_len; // H = 1 length unit
    let diameter = unit_len; // D = 1 length unit
    let p: Pressure = rho * g * head;
    p * diameter / (2.0 * unit_stress)
}

/// SI: rho_w = 1000 kg/m3, g = 9.81 m/s2 (methods.md s.1), H and D in m, S in MPa,
/// t in mm: 1000 x 9.81 / 2 x 1e-6 x 1e3 = 4.905 -> printed 4.9 (API 653 4.3.3.1).
#[test]
fn si_coefficient_from_physical_constants() {
    let c = coefficient(
        MassDensity::new::<kilogram_per_cubic_meter>(1000.0),
        Acceleration::new::<meter_per_second_squared>(9.81),
        Length::new::<meter>(1.0),
        Pressure::new::<megapascal>(1.0),
    )
    .get::<millimeter>();
    assert!((c - 4.905).abs() < 1e-9, "{c}");
    let rel = (ONE_FOOT_COEFFICIENT_SI - c).abs() / c;
    assert!(rel < 0.002, "4.9 vs {c}: {rel}");
}

/// USC: rho_w = 1.94 slug/ft3, g = 32.2 ft/s2 (methods.md s.1), H and D in ft, S in
/// psi, t in in: 1.94 x 32.2 = 62.47 lbf/ft2 per ft = 0.4338 psi; x 12 / 2 = 2.603
/// -> printed 2.6 (API 653 4.3.3.1).
#[test]
fn usc_coefficient_from_physical_constants() {
    let c = coefficient(
        MassDensity::new::<slug_per_cubic_foot>(1.94),
        Acceleration::new::<foot_per_second_squared>(32.2),
        Length::new::<foot>(1.0),
        Pressure::new::<pound_force_per_square_inch>(1.0),
    )
    .get::<inch>();
    assert!((c - 2.603).abs() < 0.001, "{c}");
    let rel = (ONE_FOOT_COEFFICIENT_USC - c).abs() / c;
    assert!(rel < 0.002, "2.6 vs {c}: {rel}");
}

/// The two printed forms describe the same physics: 4.9 mm.MPa/(m.m) expressed in
/// in.psi/(ft.ft) through exact unit factors (1 in = 25.4 mm, 1 ft = 0.3048 m,
/// 1 psi = 6894.757 Pa) is 4.9 / 25.4 x 6.894757e-3 ... within 0.5 % of 2.6.
#[test]
fn si_and_usc_coefficients_agree() {
    let mm_per_in = Length::new::<inch>(1.0).get::<millimeter>();
    let m_per_ft = Length::new::<foot>(1.0).get::<meter>();
    let mpa_per_psi = Pressure::new::<pound_force_per_square_inch>(1.0).get::<megapascal>();
    // t[in] = t[mm] / 25.4; D, H [m] = [ft] x 0.3048; S [MPa] = [psi] x 6.894757e-3
    let usc = ONE_FOOT_COEFFICIENT_SI / mm_per_in * m_per_ft * m_per_ft / mpa_per_psi;
    assert!(
        (usc / ONE_FOOT_COEFFICIENT_USC - 1.0).abs() < 0.005,
        "{usc}"
    );
}

/// Regression slope and its standard error against the independent crate linregress
/// (ordinary least squares).
#[test]
fn regression_matches_linregress() {
    use linregress::{FormulaRegressionBuilder, RegressionDataBuilder};
    let dates = [
        NaiveDate::from_ymd_opt(2004, 5, 11),
        NaiveDate::from_ymd_opt(2009, 6, 2),
        NaiveDate::from_ymd_opt(2014, 5, 20),
        NaiveDate::from_ymd_opt(2019, 6, 18),
        NaiveDate::from_ymd_opt(2024, 5, 28),
    ];
    let t = [14.62, 14.21, 13.98, 13.51, 13.22];
    let points: Vec<BasisPoint> = dates
        .iter()
        .zip(t)
        .map(|(d, t)| BasisPoint {
            date: d.expect("valid date"),
            thickness: Thickness(t),
        })
        .collect();
    let ours = regression(&points).expect("five surveys");
    let x: Vec<f64> = points
        .iter()
        .map(|p| years_between(points[0].date, p.date))
        .collect();
    let data = RegressionDataBuilder::new()
        .build_from(vec![("T", t.to_vec()), ("X", x)])
        .expect("data");
    let model = FormulaRegressionBuilder::new()
        .data(&data)
        .formula("T ~ X")
        .fit()
        .expect("fit");
    let params = model.parameters();
    let se = model.se();
    assert!((ours.intercept.0 - params[0]).abs() < 1e-9);
    assert!(
        (ours.slope - params[1]).abs() < 1e-12,
        "{} vs {}",
        ours.slope,
        params[1]
    );
    assert!(
        (ours.slope_std_error - se[1]).abs() < 1e-12,
        "{} vs {}",
        ours.slope_std_error,
        se[1]
    );
    // Upper bound: -slope + t(0.95, 3) SE, t(0.95, 3) = 2.353 (statistics tables).
    let expected_upper = -params[1] + 2.353_363 * se[1];
    assert!((ours.rate_upper.0 - expected_upper).abs() < 1e-6);
}

/// Student's t, one-sided 95 % and 97.5 % at 3 degrees of freedom: 2.353 and 3.182
/// (any statistics handbook table, e.g. NIST/SEMATECH e-Handbook 1.3.6.7.2).
#[test]
fn student_t_handbook_values() {
    let t95 = student_t_quantile(0.95, 3.0).expect("dof 3");
    let t975 = student_t_quantile(0.975, 3.0).expect("dof 3");
    assert!((t95 - 2.353).abs() < 5e-4, "{t95}");
    assert!((t975 - 3.182).abs() < 5e-4, "{t975}");
}
