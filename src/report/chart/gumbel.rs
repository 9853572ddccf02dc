//! Gumbel plot of the extreme-value estimate, one panel per course that has one: the
//! greatest wall loss of each drop, in ascending order, against its reduced variate
//! (plotting position i / (n + 1)); the fitted line loss = u + a y carried to the
//! return period's reduced variate y_T, where x_T, the greatest loss expected over the
//! whole course, is marked; and, where it lies near, the loss that would leave t_min.
//! Every number is the assessment's (calc/extreme.rs); nothing is fitted here.

use plotters::coord::Shift;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, VPos};

use super::draw::{
    Dash, DrawResult, LegendEntry, Marker, Panels, Pen, SMALL_SIZE, Shape, Stroke, extent,
    figure_size, legend_below, mesh, padded, palette::*, tick_format,
};
use super::{Figure, Inputs};
use crate::calc::extreme::{ExtremeValue, FitMethod};
use crate::model::result::CourseResult;

/// The chart.
pub struct GumbelPlot<'a>(pub Inputs<'a>);

const PANEL_H: f64 = 300.0;
/// The t_min allowance is drawn when it lies within this multiple of the panel's
/// greatest loss (further out it would squash the points).
const ALLOWANCE_REACH: f64 = 1.6;

const MAXIMUM: Marker = Marker::new(Shape::Circle, DEEP_BLUE, true, 4.2);
const FIT: Stroke = Stroke::new(ORANGE, 2.6, Dash::Solid);
const ESTIMATE: Marker = Marker::new(Shape::Diamond, VERMILLION, true, 6.5);
const GUIDE: Stroke = Stroke::new(VERMILLION, 1.3, Dash::Dot);
const ALLOWANCE: Stroke = Stroke::new(VERMILLION, 2.0, Dash::Long);

impl GumbelPlot<'_> {
    /// The courses with an estimate, bottom first.
    fn estimated(&self) -> Vec<(&CourseResult, &ExtremeValue)> {
        self.0
            .a
            .courses
            .iter()
            .filter_map(|c| c.extreme_value.as_ref().ok().map(|e| (c, e)))
            .collect()
    }
    /// Whether any course has an estimate to plot.
    pub fn has_panels(&self) -> bool {
        !self.estimated().is_empty()
    }
    fn panels(&self) -> Panels {
        Panels {
            count: self.estimated().len(),
            height: PANEL_H,
        }
    }
    /// nominal - t_min in display units, when it is drawn in the panel.
    fn allowance(&self, c: &CourseResult, e: &ExtremeValue) -> Option<f64> {
        let v = self.0.v;
        let allowance = v.thk(c.nominal_thickness) - v.thk(c.t_min.value);
        let most = e
            .plot
            .iter()
            .map(|p| v.thk(p.loss))
            .fold(v.thk(e.loss), f64::max);
        (allowance >= 0.0 && allowance <= ALLOWANCE_REACH * most.abs()).then_some(allowance)
    }
    fn legend(&self) -> Vec<LegendEntry> {
        let est = self.estimated();
        let methods: Vec<FitMethod> = est.iter().map(|(_, e)| e.method).collect();
        let fit = if methods.iter().all(|m| *m == FitMethod::MaxLikelihood) {
            " (maximum-likelihood fit)"
        } else if methods.iter().all(|m| *m == FitMethod::Moments) {
            " (method-of-moments fit)"
        } else {
            ""
        };
        let mut e = vec![
            LegendEntry::marker(
                "greatest wall loss of a drop, ascending (plotting position i / (n + 1))",
                MAXIMUM,
            ),
            LegendEntry::line(
                format!("fitted line: loss = u + a y{fit}, carried to y_T"),
                FIT,
                None,
            ),
            LegendEntry::marker(
                "x_T at y_T = -ln(-ln(1 - 1/T)): greatest loss expected over the course",
                ESTIMATE,
            ),
        ];
        if est.iter().any(|(c, x)| self.allowance(c, x).is_some()) {
            e.push(LegendEntry::line(
                "loss that would leave t_min (nominal - t_min)",
                ALLOWANCE,
                None,
            ));
        }
        e
    }
}

impl Figure for GumbelPlot<'_> {
    const ID: &'static str = "chart-gumbel";
    const TITLE: &'static str = "Gumbel plot of each drop's greatest wall loss, by course";

    fn size(&self) -> (u32, u32) {
        figure_size(self.panels().plot_h(), &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Inputs { a, v, .. } = self.0;
        pen.title(
            Self::TITLE,
            &format!(
                "Tank {} · latest survey of each course · loss = nominal - least reading of a \
                 drop, in {}",
                a.tank.id,
                v.to.thickness_unit()
            ),
        )?;
        let panels = self.panels();
        for (i, (c, e)) in self.estimated().into_iter().enumerate() {
            let caption = format!(
                "Course {} · {} drops · T {:.0} · r {:.3}",
                c.number,
                e.blocks.len(),
                e.return_period,
                e.plot_correlation
            );
            let area = panels.panel(pen, panels.cell(i), &caption)?;
            self.panel(pen, c, e, &area)?;
        }
        legend_below(pen, &self.legend(), panels.plot_h())
    }
}

impl GumbelPlot<'_> {
    fn panel<DB: DrawingBackend>(
        &self,
        pen: &Pen<DB>,
        c: &CourseResult,
        e: &ExtremeValue,
        area: &DrawingArea<DB, Shift>,
    ) -> DrawResult<DB> {
        let v = self.0.v;
        let fit_at = |yv: f64| v.thk(crate::calc::units::Thickness(e.fit.at(yv)));
        let y_first = e.plot.first().map_or(0.0, |p| p.reduced_variate);
        let y_t = e.reduced_variate;
        let (x0, x1) = padded(y_first.min(y_t), y_t.max(y_first), 0.05, 0.5);
        let allowance = self.allowance(c, e);
        let mut ys: Vec<f64> = e.plot.iter().map(|p| v.thk(p.loss)).collect();
        ys.extend([fit_at(x0), v.thk(e.loss)]);
        ys.extend(allowance);
        let (lo, hi) = extent(&ys);
        let (y0, y1) = padded(lo, hi, 0.08, hi.abs() * 0.02 + 1e-9);
        let mut chart = ChartBuilder::on(area)
            .margin_right(pen.s(16.0))
            .margin_top(pen.s(4.0))
            .x_label_area_size(pen.s(46.0))
            .y_label_area_size(pen.s(70.0))
            .build_cartesian_2d(x0..x1, y0..y1)?;
        let yfmt = tick_format(y1 - y0);
        let xfmt = |t: &f64| format!("{t:.0}");
        mesh(pen, &mut chart)
            .x_desc("Reduced variate y")
            .y_desc(format!("Wall loss ({})", v.to.thickness_unit()))
            .x_labels(8)
            .y_labels(6)
            .x_label_formatter(&xfmt)
            .y_label_formatter(&yfmt)
            .draw()?;
        let plot = chart.plotting_area();
        let m = |xv: f64, yv: f64| plot.map_coordinate(&(xv, yv));
        if let Some(al) = allowance {
            pen.line(&[m(x0, al), m(x1, al)], &ALLOWANCE)?;
        }
        let x_t = v.thk(e.loss);
        let at = m(y_t, x_t);
        pen.line(&[m(y_t, y0), at], &GUIDE)?;
        pen.line(&[m(x0, x_t), at], &GUIDE)?;
        let start = x0.max(y_first.min(y_t));
        pen.line(&[m(start, fit_at(start)), at], &FIT)?;
        for p in &e.plot {
            pen.marker(m(p.reduced_variate, v.thk(p.loss)), &MAXIMUM)?;
        }
        pen.marker(at, &ESTIMATE)?;
        pen.text_px(
            &format!("x_T {}", v.thk_text(e.loss)),
            (at.0 - pen.s(10.0), at.1 - pen.s(6.0)),
            SMALL_SIZE,
            VERMILLION,
            (HPos::Right, VPos::Bottom),
        )
    }
}
