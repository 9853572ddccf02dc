//! Design check: the required thickness of every course by the one-foot and the
//! variable-design-point methods (API 650 5.6.3 and 5.6.4) against elevation, like the
//! shell profile: each method's required thickness (the largest of design, hydrotest
//! and the minimum nominal thickness) as a step line, their design and hydrotest
//! components as markers at each course's mid-height, the minimum nominal thickness for
//! the diameter, the nominal plate and the design liquid level. The numbers are those
//! of `strake required` (`ReportSeries::design`); nothing is sized here.

use plotters::prelude::*;

use super::draw::{
    AXIS_SIZE, Dash, DrawResult, LEGEND_X, LegendEntry, MarginLabel, Marker, Pen, Shape, Stroke,
    TICK_SIZE, TITLE_HEIGHT, draw_legend, draw_margin_labels, legend_layout, legend_width,
    palette::*,
};
use super::history::tick_decimals;
use super::{Figure, Inputs, WIDTH};
use crate::calc::units::Thickness;
use crate::model::required::RequiredCourse;
use crate::report::verdict::sg_text;

/// The chart.
pub struct RequiredChart<'a>(pub Inputs<'a>);

const PLOT_H: f64 = 600.0;
const RIGHT: f64 = 190.0;
const SIDE: f64 = 10.0;
/// Where the markers sit in a course, as a fraction of its height from its bottom.
const ONE_FOOT_AT: f64 = 0.62;
const VDP_AT: f64 = 0.38;

const NOMINAL: Stroke = Stroke::new(GREY, 2.0, Dash::Long);
const ONE_FOOT: Stroke = Stroke::new(DEEP_BLUE, 3.2, Dash::Solid);
const VDP: Stroke = Stroke::new(ORANGE, 2.6, Dash::Short);
const MIN_NOMINAL: Stroke = Stroke::new(PURPLE, 2.2, Dash::Dot);
const LEVEL: Stroke = Stroke::new(SKY, 2.6, Dash::Long);
const LIQUID: RGBColor = RGBColor(232, 243, 251);
const BOUNDARY: Stroke = Stroke::new(LIGHT, 1.0, Dash::Solid);
const ONE_FOOT_DESIGN: Marker = Marker::new(Shape::Circle, DEEP_BLUE, true, 4.5);
const ONE_FOOT_TEST: Marker = Marker::new(Shape::Triangle, DEEP_BLUE, false, 5.0);
const VDP_DESIGN: Marker = Marker::new(Shape::Square, ORANGE, true, 4.5);
const VDP_TEST: Marker = Marker::new(Shape::Diamond, ORANGE, false, 5.5);

impl RequiredChart<'_> {
    fn vdp_applies(&self) -> bool {
        self.0.s.design.vdp_applicability.holds
    }
    fn legend(&self) -> Vec<LegendEntry> {
        let d = &self.0.s.design;
        let v = self.0.v;
        let mut e = vec![LegendEntry::line(
            "required, one-foot method (largest of design, test, minimum)",
            ONE_FOOT,
            None,
        )];
        if self.vdp_applies() {
            e.push(LegendEntry::line(
                "required, variable-design-point method",
                VDP,
                None,
            ));
        }
        e.push(LegendEntry::marker(
            format!(
                "one-foot design (SG {}, S_d, + CA)",
                sg_text(d.specific_gravity)
            ),
            ONE_FOOT_DESIGN,
        ));
        e.push(LegendEntry::marker(
            "one-foot hydrotest (water, S_t)",
            ONE_FOOT_TEST,
        ));
        if self.vdp_applies() {
            e.push(LegendEntry::marker(
                "variable-design-point design",
                VDP_DESIGN,
            ));
            e.push(LegendEntry::marker(
                "variable-design-point hydrotest",
                VDP_TEST,
            ));
        }
        let min_nominal = d.courses.first().map(|c| c.minimum_nominal);
        if let Some(t) = min_nominal {
            e.push(LegendEntry::line(
                format!(
                    "minimum nominal {} for D {}",
                    v.thk_text(t),
                    v.len_text(d.diameter)
                ),
                MIN_NOMINAL,
                None,
            ));
        }
        e.push(LegendEntry::line("nominal thickness", NOMINAL, None));
        e.push(LegendEntry::line(
            format!("design liquid level {}", v.len_text(d.fill_height)),
            LEVEL,
            None,
        ));
        e
    }
}

impl Figure for RequiredChart<'_> {
    const ID: &'static str = "chart-required";
    const TITLE: &'static str = "Design check: required thickness against elevation";

    fn size(&self) -> (u32, u32) {
        let legend_h = legend_layout(&self.legend(), legend_width()).height();
        (
            WIDTH,
            (TITLE_HEIGHT + PLOT_H + legend_h + 8.0).ceil() as u32,
        )
    }

    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB> {
        let Inputs { a, s, v } = self.0;
        let d = &s.design;
        let a_ = &d.vdp_applicability;
        pen.title(
            Self::TITLE,
            &format!(
                "Tank {} · API 650 one-foot and variable-design-point methods · D {} · {}",
                a.tank.id,
                v.len_text(d.diameter),
                if a_.holds {
                    format!("L/H {:.1} ≤ {:.1}", a_.ratio, a_.limit)
                } else {
                    format!(
                        "L/H {:.1} > {:.1}: variable design point not applied",
                        a_.ratio, a_.limit
                    )
                }
            ),
        )?;
        let shell: f64 = d
            .courses
            .last()
            .map_or(0.0, |c| v.len(c.bottom_elevation) + v.len(c.height));
        let level = v.len(d.fill_height);
        let mut xs: Vec<f64> = Vec::new();
        for c in &d.courses {
            xs.extend(
                [
                    Some(c.one_foot.design),
                    Some(c.one_foot.test),
                    c.vdp_design_thickness(),
                    c.vdp_test_thickness(),
                    Some(c.minimum_nominal),
                    Some(c.required_one_foot),
                    c.required_vdp,
                    c.nominal,
                ]
                .into_iter()
                .flatten()
                .map(|t| v.thk(t)),
            );
        }
        let x1 = xs.iter().copied().fold(0.0, f64::max) * 1.08 + 1e-9;
        let y1 = shell.max(level) * 1.04 + 1e-9;
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
        for c in &d.courses {
            let top = v.len(c.bottom_elevation) + v.len(c.height);
            pen.line(&[m(0.0, top), m(x1, top)], &BOUNDARY)?;
        }
        let steps = |value: &dyn Fn(&RequiredCourse) -> Option<Thickness>| {
            let mut paths: Vec<Vec<(i32, i32)>> = vec![Vec::new()];
            for c in &d.courses {
                match value(c) {
                    Some(t) => {
                        let bottom = v.len(c.bottom_elevation);
                        let top = bottom + v.len(c.height);
                        if let Some(p) = paths.last_mut() {
                            p.push(m(v.thk(t), bottom));
                            p.push(m(v.thk(t), top));
                        }
                    }
                    None => paths.push(Vec::new()),
                }
            }
            paths
        };
        for p in steps(&|c| c.nominal) {
            pen.line(&p, &NOMINAL)?;
        }
        if let Some(c) = d.courses.first() {
            let t = v.thk(c.minimum_nominal);
            pen.line(&[m(t, 0.0), m(t, shell)], &MIN_NOMINAL)?;
        }
        for p in steps(&|c| Some(c.required_one_foot)) {
            pen.line(&p, &ONE_FOOT)?;
        }
        for p in steps(&|c| c.required_vdp) {
            pen.line(&p, &VDP)?;
        }
        pen.line(&[m(0.0, level), m(x1, level)], &LEVEL)?;
        for c in &d.courses {
            let at = |f: f64| v.len(c.bottom_elevation) + v.len(c.height) * f;
            pen.marker(m(v.thk(c.one_foot.test), at(ONE_FOOT_AT)), &ONE_FOOT_TEST)?;
            pen.marker(
                m(v.thk(c.one_foot.design), at(ONE_FOOT_AT)),
                &ONE_FOOT_DESIGN,
            )?;
            if let Some(t) = c.vdp_test_thickness() {
                pen.marker(m(v.thk(t), at(VDP_AT)), &VDP_TEST)?;
            }
            if let Some(t) = c.vdp_design_thickness() {
                pen.marker(m(v.thk(t), at(VDP_AT)), &VDP_DESIGN)?;
            }
        }
        let mut labels: Vec<MarginLabel> = d
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
            text: format!("design level {}", v.len_text(d.fill_height)),
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
