//! Shell profile: elevation (vertical) against thickness, course by course: nominal,
//! the latest survey's least and mean reading, t_min at the operating liquid level,
//! and the liquid level itself.

use plotters::prelude::*;

use super::draw::{
    AXIS_SIZE, Dash, DrawResult, LEGEND_X, LegendEntry, MarginLabel, Marker, Pen, Shape, Stroke,
    TICK_SIZE, TITLE_HEIGHT, draw_legend, draw_margin_labels, legend_layout, legend_width,
    palette::*,
};
use super::history::tick_decimals;
use super::{Figure, Inputs, WIDTH};
use crate::calc::units::Thickness;
use crate::model::result::CourseResult;
use crate::report::verdict::sg_text;

/// The chart.
pub struct Profile<'a>(pub Inputs<'a>);

const PLOT_H: f64 = 600.0;
const RIGHT: f64 = 190.0;
const SIDE: f64 = 10.0;

const NOMINAL: Stroke = Stroke::new(GREY, 2.0, Dash::Long);
const T_MIN: Stroke = Stroke::new(VERMILLION, 3.0, Dash::Solid);
const MINIMUM: Stroke = Stroke::new(DEEP_BLUE, 2.4, Dash::Solid);
const MINIMUM_MARK: Marker = Marker::new(Shape::Circle, DEEP_BLUE, true, 4.5);
const MEAN: Stroke = Stroke::new(BLUISH_GREEN, 2.4, Dash::Short);
const MEAN_MARK: Marker = Marker::new(Shape::Square, BLUISH_GREEN, false, 4.5);
const LEVEL: Stroke = Stroke::new(SKY, 2.6, Dash::Long);
const LIQUID: RGBColor = RGBColor(232, 243, 251);
const BOUNDARY: Stroke = Stroke::new(LIGHT, 1.0, Dash::Solid);

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
            LegendEntry::line("operating maximum liquid level", LEVEL, None),
        ]
    }
}

impl Figure for Profile<'_> {
    const ID: &'static str = "chart-profile";
    const TITLE: &'static str = "Shell profile: thickness against elevation";

    fn size(&self) -> (u32, u32) {
        let legend_h = legend_layout(&self.legend(), legend_width()).height();
        (
            WIDTH,
            (TITLE_HEIGHT + PLOT_H + legend_h + 8.0).ceil() as u32,
        )
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
        let area = pen.area(SIDE, TITLE_HEIGHT, f64::from(WIDTH) - 2.0 * SIDE, PLOT_H);
        let mut chart = ChartBuilder::on(&area)
            .margin_right(pen.s(RIGHT))
            .margin_top(pen.s(6.0))
            .x_label_area_size(pen.s(50.0))
            .y_label_area_size(pen.s(76.0))
            .build_cartesian_2d(0.0..x1, 0.0..y1)?;
        let xdec = tick_decimals(x1);
        let xfmt = move |t: &f64| format!("{t:.xdec$}");
        let ydec = tick_decimals(y1);
        let yfmt = move |t: &f64| format!("{t:.ydec$}");
        chart
            .configure_mesh()
            .x_desc(format!("Thickness ({})", v.to.thickness_unit()))
            .y_desc(format!(
                "Elevation above the tank bottom ({})",
                v.to.length_unit()
            ))
            .label_style(pen.font(TICK_SIZE))
            .axis_desc_style(pen.font(AXIS_SIZE))
            .x_labels(10)
            .y_labels(10)
            .x_label_formatter(&xfmt)
            .y_label_formatter(&yfmt)
            .light_line_style(WHITE)
            .bold_line_style(GRID)
            .axis_style(GREY)
            .set_all_tick_mark_size(pen.s(4.0))
            .draw()?;
        let plot = chart.plotting_area();
        let m = |x: f64, y: f64| plot.map_coordinate(&(x, y));
        pen.rect(m(0.0, level), m(x1, 0.0), Some(LIQUID), None)?;
        for c in &a.courses {
            let top = v.len(c.bottom_elevation) + v.len(c.height);
            pen.line(&[m(0.0, top), m(x1, top)], &BOUNDARY)?;
        }
        let steps = |value: &dyn Fn(&CourseResult) -> Option<Thickness>| -> Vec<Vec<(i32, i32)>> {
            let mut paths: Vec<Vec<(i32, i32)>> = vec![Vec::new()];
            for c in &a.courses {
                match value(c) {
                    Some(t) => {
                        let bottom = v.len(c.bottom_elevation);
                        let top = bottom + v.len(c.height);
                        let x = v.thk(t);
                        if let Some(p) = paths.last_mut() {
                            p.push(m(x, bottom));
                            p.push(m(x, top));
                        }
                    }
                    None => paths.push(Vec::new()),
                }
            }
            paths
        };
        for p in steps(&|c| Some(c.nominal_thickness)) {
            pen.line(&p, &NOMINAL)?;
        }
        for p in steps(&|c| c.condition.as_ref().map(|k| k.latest.mean)) {
            pen.line(&p, &MEAN)?;
        }
        for p in steps(&|c| c.condition.as_ref().map(|k| k.latest.minimum)) {
            pen.line(&p, &MINIMUM)?;
        }
        for p in steps(&|c| Some(c.t_min.value)) {
            pen.line(&p, &T_MIN)?;
        }
        pen.line(&[m(0.0, level), m(x1, level)], &LEVEL)?;
        for c in &a.courses {
            if let Some(k) = &c.condition {
                let mid = v.len(c.bottom_elevation) + v.len(c.height) / 2.0;
                pen.marker(m(v.thk(k.latest.mean), mid), &MEAN_MARK)?;
                pen.marker(m(v.thk(k.latest.minimum), mid), &MINIMUM_MARK)?;
            }
        }
        // Labels in the right margin: each course at its mid-height, and the level.
        let mut labels: Vec<MarginLabel> = a
            .courses
            .iter()
            .map(|c| MarginLabel {
                text: format!("course {}", c.number),
                y: m(x1, v.len(c.bottom_elevation) + v.len(c.height) / 2.0).1,
                color: INK,
                marker: None,
            })
            .collect();
        labels.push(MarginLabel {
            text: format!("liquid level {}", v.len_text(a.tank.max_fill_height)),
            y: m(x1, level).1,
            color: DEEP_BLUE,
            marker: None,
        });
        draw_margin_labels(
            pen,
            &labels,
            m(x1, 0.0).0 + pen.s(12.0),
            (m(x1, y1).1, m(x1, 0.0).1),
        )?;
        draw_legend(
            pen,
            &self.legend(),
            LEGEND_X,
            TITLE_HEIGHT + PLOT_H,
            legend_width(),
        )
    }
}
