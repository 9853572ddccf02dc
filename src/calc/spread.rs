//! The spread of a course's readings at one survey: the five-number summary the
//! readings chart draws as a box (quartiles, median) with whiskers (least and
//! greatest reading).
//!
//! Source: sample quantiles by Hyndman and Fan (1996), "Sample quantiles in
//! statistical packages", The American Statistician 50(4), definition 8 (median
//! unbiased), as statrs `OrderStatistics::quantile` implements it:
//! h = (n + 1/3) p + 1/3, Q(p) = x_(floor h) + (h - floor h) (x_(floor h + 1) - x_(floor h)),
//! with x_(k) the k-th smallest reading. The median is the middle reading (the mean
//! of the two middle ones for even n). Whiskers go to the least and greatest reading
//! (every reading is also drawn as a dot, so no reading is hidden as an "outlier").
//!
//! Symbols: readings in the tank's thickness unit; p the quantile's probability.

use statrs::statistics::{Data, Max, Min, OrderStatistics};

use super::units::Thickness;
use crate::model::series::FiveNumbers;

/// Five-number summary of `readings`; None when there are none.
pub fn five_numbers(readings: &[f64]) -> Option<FiveNumbers> {
    if readings.is_empty() || readings.iter().any(|r| !r.is_finite()) {
        return None;
    }
    let mut data = Data::new(readings.to_vec());
    Some(FiveNumbers {
        min: Thickness(data.min()),
        q1: Thickness(data.lower_quartile()),
        median: Thickness(data.median()),
        q3: Thickness(data.upper_quartile()),
        max: Thickness(data.max()),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand, Hyndman and Fan definition 8, n = 6, sorted 12.0 12.5 13.0 13.5 14.0 15.0:
    /// p = 0.25: h = (6 + 1/3) x 0.25 + 1/3 = 1.58333 + 0.33333 = 1.91667
    ///   -> x_1 + 0.91667 (x_2 - x_1) = 12.0 + 0.91667 x 0.5 = 12.45833;
    /// p = 0.75: h = (6 + 1/3) x 0.75 + 1/3 = 4.75 + 0.33333 = 5.08333
    ///   -> x_5 + 0.08333 (x_6 - x_5) = 14.0 + 0.08333 x 1.0 = 14.08333;
    /// median = (13.0 + 13.5) / 2 = 13.25. The order of the input does not matter.
    #[test]
    fn quartiles_by_hand() {
        let f = five_numbers(&[13.5, 12.0, 15.0, 12.5, 14.0, 13.0]).expect("readings");
        assert_eq!(f.min, Thickness(12.0));
        assert_eq!(f.max, Thickness(15.0));
        assert_eq!(f.median, Thickness(13.25));
        assert!((f.q1.0 - 12.458_333).abs() < 1e-6, "{}", f.q1.0);
        assert!((f.q3.0 - 14.083_333).abs() < 1e-6, "{}", f.q3.0);
    }

    /// One reading: every number is that reading; no reading: none.
    #[test]
    fn single_and_empty() {
        let f = five_numbers(&[9.1]).expect("one");
        assert_eq!(
            (f.min, f.q1, f.median, f.q3, f.max),
            (
                Thickness(9.1),
                Thickness(9.1),
                Thickness(9.1),
                Thickness(9.1),
                Thickness(9.1)
            )
        );
        assert_eq!(five_numbers(&[]), None);
    }
}
