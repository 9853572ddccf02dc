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

// ---------------------------------------------------------------------------------
// Extreme values (methods.md s.8): our Gumbel fits and return-period formula against
// statrs' Gumbel distribution (cdf, inverse cdf, mean, standard deviation), an
// independent implementation of the same distribution.
// ---------------------------------------------------------------------------------

use statrs::distribution::{ContinuousCDF, Gumbel};
use statrs::statistics::Distribution;
use strake::calc::extreme::{fit_max_likelihood, fit_moments, reduced_variate};

/// The method-of-moments fit of 1, 2, 3, 4, 5 (mean 3, s = sqrt(2.5) exactly) is the
/// Gumbel whose mean and standard deviation, as statrs computes them (u + gamma a and
/// pi a / sqrt(6)), are 3 and sqrt(2.5).
#[test]
fn moments_fit_has_the_sample_moments_by_statrs() {
    let f = fit_moments(&[1.0, 2.0, 3.0, 4.0, 5.0]).expect("spread");
    let g = Gumbel::new(f.location, f.scale).expect("valid");
    assert!((g.mean().expect("mean") - 3.0).abs() < 1e-12);
    assert!((g.std_dev().expect("sd") - 2.5f64.sqrt()).abs() < 1e-12);
}

/// y_T = -ln(-ln(1 - 1/T)) is the standard Gumbel's quantile of 1 - 1/T, and
/// x_T = u + a y_T the quantile of Gumbel(u, a) (statrs inverse_cdf); the cdf of x_T
/// is 1 - 1/T.
#[test]
fn reduced_variate_matches_statrs_quantiles() {
    let standard = Gumbel::new(0.0, 1.0).expect("valid");
    let g = Gumbel::new(1.73, 0.38).expect("valid");
    for t in [2.0, 10.0, 100.0, 376.99] {
        let y = reduced_variate(t).expect("T > 1");
        let p = 1.0 - 1.0 / t;
        assert!((y - standard.inverse_cdf(p)).abs() < 1e-9, "T {t}");
        let x = 1.73 + 0.38 * y;
        assert!((x - g.inverse_cdf(p)).abs() < 1e-9, "T {t}");
        assert!((g.cdf(x) - p).abs() < 1e-12, "T {t}");
    }
}

/// A sample drawn evenly through Gumbel(10, 2) by statrs' inverse cdf at
/// p = i / (n + 1), n = 999: both fits recover u = 10 and a = 2 within 2 % (an even
/// sample holds a little less of the far tail than a random one, so the spread comes
/// out about 1 % low).
#[test]
fn fits_recover_a_statrs_gumbel() {
    let g = Gumbel::new(10.0, 2.0).expect("valid");
    let n = 999;
    let x: Vec<f64> = (1..=n)
        .map(|i| g.inverse_cdf(i as f64 / (n as f64 + 1.0)))
        .collect();
    let m = fit_moments(&x).expect("spread");
    let ml = fit_max_likelihood(&x).expect("settles").fit;
    for (name, f) in [("moments", m), ("maximum likelihood", ml)] {
        assert!((f.location / 10.0 - 1.0).abs() < 0.02, "{name}: {f:?}");
        assert!((f.scale / 2.0 - 1.0).abs() < 0.02, "{name}: {f:?}");
    }
}
