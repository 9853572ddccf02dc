//! Shell profile: elevation (vertical) against thickness, course by course: nominal,
//! the latest survey's least and mean reading, t_min at the operating liquid level,
//! and the liquid level itself.

use plotters::prelude::*;

use super::draw::{
    Dash, DrawResult, ElevationPlot, LIQUID_LEVEL, LegendEntry, Marker, Pen, Shape, Stroke,
    figure_size, legend_below, palette::*,
};
use super::{Figure, Inputs};
use crate::calc::units::Thickness;
use crate::model::result::CourseResult;
use crate::report::verdict::sg_text;

/// The chart.
pub struct Profile<'a>(pub Inputs<'a>);

const PLOT_H: f64 = 600.0;

const NOMINAL: Stroke = Stroke::new(GREY, 2.0, Dash::Long);
const T_MIN: Stroke = Stroke::new(VERMILLION, 3.0, Dash::Solid);
const MINIMUM: Stroke = Stroke::new(DEEP_BLUE, 2.4, Dash::Solid);
const MINIMUM_MARK: Marker = Marker::new(Shape::Circle, DEEP_BLUE, true, 4.5);
const MEAN: Stroke = Stroke::new(BLUISH_GREEN, 2.4, Dash::Short);
const MEAN_MARK: Marker = Marker::new(Shape::Square, BLUISH_GREEN, false, 4.5);

impl Profile<'_> {
    fn legend(&self) -> Vec<LegendEntry> {
        let Inputs { a, v, .. } = self.0;
        vec![
            LegendEntry::line("nominal thickness", NOMINAL, None),
            LegendEntry::line("least reading, latest survey", MINIMUM, Some(MINIMUM_MARK)),
            LegendEntry::line("mean reading, latest survey", MEAN, Some(MEAN_MARK)),
            LegendEntry::line(
                format!(
                    "t_min at {} liquid level, SG {}",
                    v.len_text(a.tank.max_fill_height),
                    sg_text(a.tank.specific_gravity)
                ),
                T_MIN,
                None,
            ),
            LegendEntry::line("operating maximum liquid level", LIQUID_LEVEL, None),
        ]
    }
}

impl Figure for Profile<'_> {
    const ID: &'static str = "chart-profile";
    const TITLE: &'static str = "Shell profile: thickness against elevation";

    fn size(&self) -> (u32, u32) {
        figure_size(PLOT_H, &self.legend())
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Inputs { a, v, .. } = self.0;
        pen.title(
            Self::TITLE,
            &format!(
                "Tank {} · latest survey {} · D {}",
                a.tank.id,
                a.latest_survey,
                v.len_text(a.tank.diameter)
            ),
        )?;
        let shell = v.len(a.tank.shell_height());
        let level = v.len(a.tank.max_fill_height);
        let mut xs: Vec<f64> = Vec::new();
        for c in &a.courses {
            xs.push(v.thk(c.nominal_thickness));
            xs.push(v.thk(c.t_min.value));
            if let Some(k) = &c.condition {
                xs.push(v.thk(k.latest.minimum));
                xs.push(v.thk(k.latest.mean));
            }
        }
        let x1 = xs.iter().copied().fold(0.0, f64::max) * 1.08;
        let y1 = shell.max(level) * 1.04;
        let e = ElevationPlot::draw(
            pen,
            v,
            a.courses
                .iter()
                .map(|c| (c.number, c.bottom_elevation, c.height)),
            (x1, y1),
            level,
            PLOT_H,
        )?;
        let steps = |thickness: fn(&CourseResult) -> Option<Thickness>| {
            e.steps(v, a.courses.iter().map(thickness))
        };
        for p in steps(|c| Some(c.nominal_thickness)) {
            pen.line(&p, &NOMINAL)?;
        }
        for p in steps(|c| c.condition.as_ref().map(|k| k.latest.mean)) {
            pen.line(&p, &MEAN)?;
        }
        for p in steps(|c| c.condition.as_ref().map(|k| k.latest.minimum)) {
            pen.line(&p, &MINIMUM)?;
        }
        for p in steps(|c| Some(c.t_min.value)) {
            pen.line(&p, &T_MIN)?;
        }
        e.level_line(pen)?;
        for (c, span) in a.courses.iter().zip(e.courses()) {
            if let Some(k) = &c.condition {
                let mid = span.mid();
                pen.marker(e.m(v.thk(k.latest.mean), mid), &MEAN_MARK)?;
                pen.marker(e.m(v.thk(k.latest.minimum), mid), &MINIMUM_MARK)?;
            }
        }
        // Labels in the right margin: each course at its mid-height, and the level.
        e.margin_labels(
            pen,
            format!("liquid level {}", v.len_text(a.tank.max_fill_height)),
        )?;
        legend_below(pen, &self.legend(), PLOT_H)
    }
}
