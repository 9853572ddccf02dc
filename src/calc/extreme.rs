//! Extreme-value estimate of the worst wall loss of a course where nobody measured.
//!
//! Sources: methods.md s.8; ASTM G16 (applying statistics to corrosion data: the
//! largest-extreme-value analysis of block maxima and its return period, from memory);
//! the Gumbel (largest extreme value) distribution F(x) = exp(-exp(-(x - u) / a)).
//!
//! - Blocks (this project's rule): at a course's latest survey, the readings that share
//!   an azimuth form one block, the part of a vertical drop that lies on the course
//!   (azimuth 360 is azimuth 0). Readings without an azimuth are left out. The blocks
//!   must be equal (the same number of readings each) and at least 4.
//! - Block maximum: wall loss = nominal - least reading of the block (may be negative
//!   where a plate reads over nominal).
//! - Fits, both reported:
//!   - method of moments: a = s sqrt(6) / pi, u = mean - gamma a (s the sample standard
//!     deviation, n - 1; gamma = 0.5772, Euler's constant);
//!   - maximum likelihood: a solves a = mean - sum(x e^(-x/a)) / sum(e^(-x/a)), then
//!     u = -a ln(sum(e^(-x/a)) / n); Newton's method from the moments estimate.
//!
//!   The maximum-likelihood fit is used (the smaller-variance estimator); the moments
//!   fit only when the iteration does not settle.
//! - Return period: T = course area / block area = (pi D h) / (w h) = pi D / w, with w
//!   the width of shell a drop stands for (constants.rs, this project's convention).
//! - Estimate: y_T = -ln(-ln(1 - 1/T)); x_T = u + a y_T; estimated least thickness =
//!   nominal - x_T, reported beside the least reading, never in its place.
//! - Fit figure: r, the correlation of the Gumbel probability plot (ordered maxima
//!   against the reduced variate y_i = -ln(-ln(i / (n + 1))), plotting position
//!   i / (n + 1), ASTM G16 practice, from memory); r near 1: the maxima lie on the
//!   straight line a Gumbel population gives.
//!
//! Units: losses and thicknesses in the tank's thickness unit; D, h, w in its length
//! unit; areas in its length unit squared.

use std::f64::consts::PI;
use std::fmt;

use statrs::statistics::Statistics;

use super::constants::{
    EULER_GAMMA, EXTREME_MIN_BLOCKS, GUMBEL_ML_MAX_ITERATIONS, GUMBEL_ML_RELATIVE_STEP,
    drop_strip_width,
};
use super::units::{Length, Thickness, UnitSystem};

/// Location u and scale a of a Gumbel (largest) distribution.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct GumbelFit {
    /// u.
    pub location: f64,
    /// a.
    pub scale: f64,
}

impl GumbelFit {
    /// x = u + a y.
    pub fn at(&self, reduced_variate: f64) -> f64 {
        self.location + self.scale * reduced_variate
    }
}

/// Method of moments: a = s sqrt(6) / pi, u = mean - gamma a. None with fewer than
/// two values or no spread.
pub fn fit_moments(x: &[f64]) -> Option<GumbelFit> {
    if x.len() < 2 {
        return None;
    }
    let mean = x.iter().mean();
    let s = x.iter().std_dev();
    if !(s > 0.0 && s.is_finite()) {
        return None;
    }
    let scale = s * 6f64.sqrt() / PI;
    Some(GumbelFit {
        location: mean - EULER_GAMMA * scale,
        scale,
    })
}

/// A maximum-likelihood fit and the Newton steps it took.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct MaxLikelihood {
    /// The fit.
    pub fit: GumbelFit,
    /// Newton steps.
    pub iterations: usize,
}

/// sum(w), sum(x w) / sum(w) and the w-weighted variance of x, with
/// w = e^(-(x - c)/a) and c = min(x) (the shift keeps every w in (0, 1]; it cancels in
/// the ratios and is added back into u).
fn weighted(x: &[f64], a: f64, c: f64) -> (f64, f64, f64) {
    let w: Vec<f64> = x.iter().map(|&xi| (-(xi - c) / a).exp()).collect();
    let s0: f64 = w.iter().sum();
    let m1 = x.iter().zip(&w).map(|(xi, wi)| xi * wi).sum::<f64>() / s0;
    let var = x
        .iter()
        .zip(&w)
        .map(|(xi, wi)| wi * (xi - m1) * (xi - m1))
        .sum::<f64>()
        / s0;
    (s0, m1, var)
}

/// Maximum likelihood: Newton's method on g(a) = a - mean + sum(x w) / sum(w), whose
/// derivative 1 + var_w(x) / a^2 is at least 1 (one root); then
/// u = -a ln(sum(e^(-x/a)) / n). None when the moments fit is not defined or the
/// iteration does not settle.
pub fn fit_max_likelihood(x: &[f64]) -> Option<MaxLikelihood> {
    let start = fit_moments(x)?;
    let n = x.len() as f64;
    let mean = x.iter().mean();
    let c = x.iter().copied().fold(f64::INFINITY, f64::min);
    let mut a = start.scale;
    for iterations in 1..=GUMBEL_ML_MAX_ITERATIONS {
        let (_, m1, var) = weighted(x, a, c);
        let g = a - mean + m1;
        let slope = 1.0 + var / (a * a);
        let mut next = a - g / slope;
        if next.is_nan() || next <= 0.0 {
            next = a / 2.0;
        }
        let step = (next - a).abs();
        a = next;
        if !a.is_finite() {
            return None;
        }
        if step <= GUMBEL_ML_RELATIVE_STEP * a {
            let (s0, _, _) = weighted(x, a, c);
            return Some(MaxLikelihood {
                fit: GumbelFit {
                    location: c - a * (s0 / n).ln(),
                    scale: a,
                },
                iterations,
            });
        }
    }
    None
}

/// y_T = -ln(-ln(1 - 1/T)) (the standard Gumbel quantile of probability 1 - 1/T);
/// None unless T > 1.
pub fn reduced_variate(return_period: f64) -> Option<f64> {
    (return_period > 1.0 && return_period.is_finite())
        .then(|| -(-(1.0 - 1.0 / return_period).ln()).ln())
}

/// One point of the Gumbel probability plot.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct PlotPoint {
    /// y_i = -ln(-ln(i / (n + 1))).
    pub reduced_variate: f64,
    /// The i-th smallest block maximum of wall loss.
    pub loss: Thickness,
}

/// The maxima in ascending order against their reduced variates (plotting position
/// i / (n + 1)).
pub fn probability_plot(maxima: &[f64]) -> Vec<PlotPoint> {
    let mut sorted = maxima.to_vec();
    sorted.sort_by(f64::total_cmp);
    let n = sorted.len() as f64;
    sorted
        .iter()
        .enumerate()
        .map(|(i, &x)| PlotPoint {
            reduced_variate: -(-((i as f64 + 1.0) / (n + 1.0)).ln()).ln(),
            loss: Thickness(x),
        })
        .collect()
}

/// Pearson correlation of the plot's points (statrs' sample covariance and standard
/// deviations); None with fewer than 3 points or no spread.
pub fn plot_correlation(points: &[PlotPoint]) -> Option<f64> {
    if points.len() < 3 {
        return None;
    }
    let y: Vec<f64> = points.iter().map(|p| p.reduced_variate).collect();
    let x: Vec<f64> = points.iter().map(|p| p.loss.0).collect();
    let (sx, sy) = (x.iter().std_dev(), y.iter().std_dev());
    if !(sx > 0.0 && sy > 0.0) {
        return None;
    }
    Some(x.iter().covariance(y.iter()) / (sx * sy))
}

/// The readings of one course at one survey, grouped by drop (azimuth) while they
/// stream past: per azimuth the count and the least reading; readings without an
/// azimuth are only counted. Memory grows with the number of drops, not readings.
#[derive(Debug, Clone, Default)]
pub struct Drops {
    /// Per azimuth, in increasing order: its bits (0 to 360 degrees, 360 folded to
    /// 0), readings and least reading.
    by_azimuth: Vec<(u64, usize, f64)>,
    /// Where the last reading went: survey files list a drop's readings together, or
    /// go round the drops in turn, so the next reading's drop is nearly always this
    /// one or the one after it.
    last: usize,
    /// Readings without an azimuth.
    without: usize,
}

/// Drops made room for at once: surveys take a course's readings on 8 to 16 drops
/// round the shell (common practice).
const DROP_ROOM: usize = 16;

/// The same drops (where the last reading went is no part of the value).
impl PartialEq for Drops {
    fn eq(&self, other: &Self) -> bool {
        self.by_azimuth == other.by_azimuth && self.without == other.without
    }
}

impl Drops {
    /// Adds one reading.
    #[inline]
    pub fn push(&mut self, azimuth: Option<f64>, thickness: Thickness) {
        match azimuth {
            None => self.without += 1,
            Some(a) => {
                // Non-negative finite degrees: their bit patterns sort as the numbers do;
                // + 0.0 turns -0.0 into 0.0.
                let bits = (if a >= 360.0 { a - 360.0 } else { a } + 0.0).to_bits();
                let n = self.by_azimuth.len();
                let next = if self.last + 1 < n { self.last + 1 } else { 0 };
                let i = match self.by_azimuth.get(self.last) {
                    Some(d) if d.0 == bits => self.last,
                    _ if n > 0 && self.by_azimuth[next].0 == bits => next,
                    _ => match self.by_azimuth.binary_search_by_key(&bits, |d| d.0) {
                        Ok(i) => i,
                        Err(i) => {
                            // (Room for a course's usual drops at once.)
                            if n == 0 {
                                self.by_azimuth.reserve(DROP_ROOM);
                            }
                            self.by_azimuth.insert(i, (bits, 0, f64::INFINITY));
                            i
                        }
                    },
                };
                let drop = &mut self.by_azimuth[i];
                drop.1 += 1;
                drop.2 = drop.2.min(thickness.0);
                self.last = i;
            }
        }
    }
    /// Readings added.
    pub fn len(&self) -> usize {
        self.without + self.by_azimuth.iter().map(|d| d.1).sum::<usize>()
    }
    /// No reading added.
    pub fn is_empty(&self) -> bool {
        self.len() == 0
    }
}

/// One block: the readings of a drop on the course.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Block {
    /// Azimuth of the drop, degrees.
    pub azimuth: f64,
    /// Readings in it.
    pub readings: usize,
    /// Its least reading.
    pub least: Thickness,
    /// nominal - least.
    pub max_loss: Thickness,
}

/// Which fit the estimate uses.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FitMethod {
    /// Maximum likelihood.
    MaxLikelihood,
    /// Method of moments (when maximum likelihood does not settle).
    Moments,
}

impl FitMethod {
    /// Name in every output.
    pub fn name(self) -> &'static str {
        match self {
            FitMethod::MaxLikelihood => "maximum-likelihood",
            FitMethod::Moments => "moments",
        }
    }
}

/// Why no estimate is made for a course.
#[derive(Debug, Clone, PartialEq)]
pub enum NotApplicable {
    /// The course has no readings.
    NoReadings,
    /// No reading of the latest survey carries an azimuth.
    NoAzimuth,
    /// Too few drops.
    TooFewBlocks {
        /// Drops found.
        found: usize,
        /// Drops needed.
        needed: usize,
    },
    /// Drops with different numbers of readings.
    UnequalBlocks {
        /// Readings per drop, least and most.
        least: usize,
        /// Most.
        most: usize,
    },
    /// Every block maximum is the same.
    NoSpread,
    /// The fit could not be made (non-finite numbers).
    FitFailed,
}

impl fmt::Display for NotApplicable {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            NotApplicable::NoReadings => f.write_str("the course has no readings"),
            NotApplicable::NoAzimuth => f.write_str(
                "no reading of the course's latest survey has an azimuth, so the readings \
                 cannot be grouped into drops",
            ),
            NotApplicable::TooFewBlocks { found, needed } => write!(
                f,
                "{found} drop{} on the course at its latest survey; a fit needs at least {needed}",
                if *found == 1 { "" } else { "s" }
            ),
            NotApplicable::UnequalBlocks { least, most } => write!(
                f,
                "the drops hold different numbers of readings ({least} to {most}); the \
                 method needs equal blocks"
            ),
            NotApplicable::NoSpread => {
                f.write_str("every drop has the same greatest loss: no spread to fit")
            }
            NotApplicable::FitFailed => f.write_str("the fit did not give finite parameters"),
        }
    }
}

/// The estimate for one course, with every term.
#[derive(Debug, Clone, PartialEq)]
pub struct ExtremeValue {
    /// The blocks, by azimuth.
    pub blocks: Vec<Block>,
    /// Readings of the latest survey left out for having no azimuth.
    pub readings_without_azimuth: usize,
    /// Nominal thickness of the course.
    pub nominal: Thickness,
    /// w: width of shell one drop stands for.
    pub strip_width: Length,
    /// h: course height.
    pub course_height: Length,
    /// pi D.
    pub circumference: Length,
    /// w h, length unit squared.
    pub block_area: f64,
    /// pi D h, length unit squared.
    pub course_area: f64,
    /// T = course area / block area.
    pub return_period: f64,
    /// The moments fit.
    pub moments: GumbelFit,
    /// The maximum-likelihood fit (None when it did not settle).
    pub max_likelihood: Option<MaxLikelihood>,
    /// Which fit is used.
    pub method: FitMethod,
    /// The fit used.
    pub fit: GumbelFit,
    /// y_T.
    pub reduced_variate: f64,
    /// x_T = u + a y_T: the greatest loss expected over the course.
    pub loss: Thickness,
    /// nominal - x_T.
    pub estimated_least: Thickness,
    /// The least reading of the blocks (the measured minimum).
    pub measured_least: Thickness,
    /// The Gumbel plot, ascending.
    pub plot: Vec<PlotPoint>,
    /// r of the plot.
    pub plot_correlation: f64,
}

/// Groups `readings` (one course, its latest survey) into drops and fits.
pub fn extreme_value(
    units: UnitSystem,
    diameter: Length,
    course_height: Length,
    nominal: Thickness,
    readings: &Drops,
) -> Result<ExtremeValue, NotApplicable> {
    if readings.is_empty() {
        return Err(NotApplicable::NoReadings);
    }
    let without = readings.without;
    if readings.by_azimuth.is_empty() {
        return Err(NotApplicable::NoAzimuth);
    }
    let blocks: Vec<Block> = readings
        .by_azimuth
        .iter()
        .map(|&(bits, count, least)| Block {
            azimuth: f64::from_bits(bits),
            readings: count,
            least: Thickness(least),
            max_loss: Thickness(nominal.0 - least),
        })
        .collect();
    if blocks.len() < EXTREME_MIN_BLOCKS {
        return Err(NotApplicable::TooFewBlocks {
            found: blocks.len(),
            needed: EXTREME_MIN_BLOCKS,
        });
    }
    let least = blocks.iter().map(|b| b.readings).min().unwrap_or(0);
    let most = blocks.iter().map(|b| b.readings).max().unwrap_or(0);
    if least != most {
        return Err(NotApplicable::UnequalBlocks { least, most });
    }
    let maxima: Vec<f64> = blocks.iter().map(|b| b.max_loss.0).collect();
    let moments = fit_moments(&maxima).ok_or(NotApplicable::NoSpread)?;
    let max_likelihood = fit_max_likelihood(&maxima);
    let (method, fit) = match max_likelihood {
        Some(ml) => (FitMethod::MaxLikelihood, ml.fit),
        None => (FitMethod::Moments, moments),
    };
    let strip_width = drop_strip_width(units);
    let circumference = Length(PI * diameter.0);
    let block_area = strip_width.0 * course_height.0;
    let course_area = circumference.0 * course_height.0;
    let return_period = course_area / block_area;
    let reduced = reduced_variate(return_period).ok_or(NotApplicable::FitFailed)?;
    let loss = fit.at(reduced);
    let plot = probability_plot(&maxima);
    let r = plot_correlation(&plot).ok_or(NotApplicable::NoSpread)?;
    if !(loss.is_finite() && r.is_finite()) {
        return Err(NotApplicable::FitFailed);
    }
    let measured_least = blocks
        .iter()
        .map(|b| b.least)
        .fold(
            Thickness(f64::INFINITY),
            |a, b| if b.0 < a.0 { b } else { a },
        );
    Ok(ExtremeValue {
        blocks,
        readings_without_azimuth: without,
        nominal,
        strip_width,
        course_height,
        circumference,
        block_area,
        course_area,
        return_period,
        moments,
        max_likelihood,
        method,
        fit,
        reduced_variate: reduced,
        loss: Thickness(loss),
        estimated_least: Thickness(nominal.0 - loss),
        measured_least,
        plot,
        plot_correlation: r,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Moments by hand on 1, 2, 3, 4, 5: mean 3, s = sqrt((4 + 1 + 0 + 1 + 4) / 4) =
    /// sqrt(2.5) = 1.5811388; a = 1.5811388 x sqrt(6) / pi = 1.5811388 x 0.7796968 =
    /// 1.2328089; u = 3 - 0.5772157 x 1.2328089 = 2.2884034 (Gumbel mean u + gamma a
    /// and variance pi^2 a^2 / 6, any statistics handbook).
    #[test]
    fn moments_by_hand() {
        let f = fit_moments(&[1.0, 2.0, 3.0, 4.0, 5.0]).expect("spread");
        assert!((f.scale - 1.232_808_9).abs() < 1e-7, "{}", f.scale);
        assert!((f.location - 2.288_403_4).abs() < 1e-7, "{}", f.location);
        // The fitted distribution has the sample's moments back.
        assert!((f.location + EULER_GAMMA * f.scale - 3.0).abs() < 1e-12);
        assert!((f.scale * PI / 6f64.sqrt() - 2.5f64.sqrt()).abs() < 1e-12);
        assert_eq!(fit_moments(&[2.0, 2.0, 2.0]), None);
        assert_eq!(fit_moments(&[2.0]), None);
    }

    /// The maximum-likelihood fit satisfies both likelihood equations
    /// (d lnL / du = 0: n = sum e^(-(x-u)/a); d lnL / da = 0: a = mean -
    /// sum x e^(-x/a) / sum e^(-x/a)).
    #[test]
    fn max_likelihood_solves_its_equations() {
        let x = [1.12, 1.47, 1.31, 2.05, 1.58, 1.26, 1.83, 1.40];
        let ml = fit_max_likelihood(&x).expect("settles");
        let (u, a) = (ml.fit.location, ml.fit.scale);
        let n = x.len() as f64;
        let s0: f64 = x.iter().map(|xi| (-(xi - u) / a).exp()).sum();
        assert!((s0 - n).abs() < 1e-9, "{s0}");
        let w: Vec<f64> = x.iter().map(|xi| (-xi / a).exp()).collect();
        let ratio = x.iter().zip(&w).map(|(xi, wi)| xi * wi).sum::<f64>() / w.iter().sum::<f64>();
        let mean = x.iter().sum::<f64>() / n;
        assert!((a - (mean - ratio)).abs() < 1e-10);
        assert!(ml.iterations < 20);
    }

    /// y_T by hand: T = 100: ln(0.99) = -0.01005034; -ln(0.01005034) = 4.600149.
    /// T = 2: -ln(-ln 0.5) = -ln(0.6931472) = 0.3665129 (the Gumbel median).
    #[test]
    fn reduced_variate_by_hand() {
        assert!((reduced_variate(100.0).expect("T > 1") - 4.600_149).abs() < 1e-6);
        assert!((reduced_variate(2.0).expect("T > 1") - 0.366_512_9).abs() < 1e-7);
        assert_eq!(reduced_variate(1.0), None);
    }

    /// Points on a line y = 2x + 1 correlate with r = 1; the plot's reduced variates
    /// for n = 3 are -ln(-ln(1/4)), -ln(-ln(2/4)), -ln(-ln(3/4)) = -0.3266343,
    /// 0.3665129, 1.2458993.
    #[test]
    fn probability_plot_by_hand() {
        let p = probability_plot(&[3.0, 1.0, 2.0]);
        let y: Vec<f64> = p.iter().map(|q| q.reduced_variate).collect();
        for (got, want) in y.iter().zip([-0.326_634_3, 0.366_512_9, 1.245_899_3]) {
            assert!((got - want).abs() < 1e-7, "{y:?}");
        }
        assert_eq!(p[0].loss, Thickness(1.0));
        let line: Vec<PlotPoint> = (0..5)
            .map(|i| PlotPoint {
                reduced_variate: i as f64,
                loss: Thickness(2.0 * i as f64 + 1.0),
            })
            .collect();
        assert!((plot_correlation(&line).expect("spread") - 1.0).abs() < 1e-12);
    }

    fn r(azimuth: f64, t: f64) -> (Option<f64>, f64) {
        (Some(azimuth), t)
    }

    fn drops(readings: &[(Option<f64>, f64)]) -> Drops {
        let mut d = Drops::default();
        for &(a, t) in readings {
            d.push(a, Thickness(t));
        }
        d
    }

    /// Four drops of two readings, nominal 10 mm, SI, D 12 m, course 1.8 m high:
    /// maxima of loss: az 0: 10 - 9.0 = 1.0; 90: 10 - 8.8 = 1.2; 180: 10 - 9.1 = 0.9;
    /// 270: 10 - 8.5 = 1.5. Moments: mean 1.15, s = sqrt(0.21 / 3) = 0.2645751,
    /// a = 0.2645751 x 0.7796968 = 0.2062884, u = 1.15 - 0.5772157 x 0.2062884 =
    /// 1.0309271. T = pi x 12 / 0.3 = 125.6637 (block 0.3 x 1.8 = 0.54 m2, course
    /// 37.699 x 1.8 = 67.858 m2). Measured least 8.5 mm.
    #[test]
    fn drops_by_hand() {
        let readings = [
            r(0.0, 9.0),
            r(0.0, 9.5),
            r(90.0, 8.8),
            r(90.0, 9.6),
            r(180.0, 9.2),
            r(180.0, 9.1),
            r(360.0, 9.7),
            r(270.0, 8.5),
            r(270.0, 9.9),
            (None, 5.0),
        ];
        // 360 is the 0 drop: it would make that block 3 readings -> unequal.
        let e = extreme_value(
            UnitSystem::Si,
            Length(12.0),
            Length(1.8),
            Thickness(10.0),
            &drops(&readings),
        );
        assert_eq!(e, Err(NotApplicable::UnequalBlocks { least: 2, most: 3 }));
        let mut equal = readings.to_vec();
        equal.retain(|d| d.0 != Some(360.0));
        let e = extreme_value(
            UnitSystem::Si,
            Length(12.0),
            Length(1.8),
            Thickness(10.0),
            &drops(&equal),
        )
        .expect("four equal drops");
        let maxima: Vec<f64> = e.blocks.iter().map(|b| b.max_loss.0).collect();
        for (got, want) in maxima.iter().zip([1.0, 1.2, 0.9, 1.5]) {
            assert!((got - want).abs() < 1e-12, "{maxima:?}");
        }
        assert_eq!(e.readings_without_azimuth, 1);
        assert!((e.moments.scale - 0.206_288_4).abs() < 1e-7);
        assert!((e.moments.location - 1.030_927_1).abs() < 1e-7);
        assert!((e.return_period - 125.663_7).abs() < 1e-4);
        assert!((e.block_area - 0.54).abs() < 1e-12);
        assert_eq!(e.method, FitMethod::MaxLikelihood);
        assert_eq!(e.measured_least, Thickness(8.5));
        let x_t = e.fit.location + e.fit.scale * e.reduced_variate;
        assert!((e.loss.0 - x_t).abs() < 1e-12);
        assert!((e.estimated_least.0 - (10.0 - x_t)).abs() < 1e-12);
        assert!(e.plot_correlation > 0.8 && e.plot_correlation <= 1.0);
    }

    #[test]
    fn not_applicable() {
        let none = [(None, 9.0)];
        let f = |rs: &[(Option<f64>, f64)]| {
            extreme_value(
                UnitSystem::Si,
                Length(12.0),
                Length(1.8),
                Thickness(10.0),
                &drops(rs),
            )
        };
        assert_eq!(f(&[]), Err(NotApplicable::NoReadings));
        assert_eq!(f(&none), Err(NotApplicable::NoAzimuth));
        assert_eq!(
            f(&[r(0.0, 9.0), r(90.0, 9.0), r(180.0, 9.1)]),
            Err(NotApplicable::TooFewBlocks {
                found: 3,
                needed: 4
            })
        );
        assert_eq!(
            f(&[r(0.0, 9.0), r(90.0, 9.0), r(180.0, 9.0), r(270.0, 9.0)]),
            Err(NotApplicable::NoSpread)
        );
    }
}
