//! Design check: the required thickness of every course by the one-foot and the
//! variable-design-point methods (API 650 5.6.3 and 5.6.4) against elevation, like the
//! shell profile: each method's required thickness (the largest of design, hydrotest
//! and the minimum nominal thickness) as a step line, their design and hydrotest
//! components as markers at each course's mid-height, the minimum nominal thickness for
//! the diameter, the nominal plate and the design liquid level. The numbers are those
//! of `strake required` (`ReportSeries::design`); nothing is sized here.

use plotters::prelude::*;

use super::draw::{
    Dash, DrawResult, ElevationPlot, LIQUID_LEVEL, LegendEntry, Marker, Pen, Shape, Stroke,
    figure_size, legend_below, palette::*,
};
use super::{Figure, Inputs};
use crate::calc::units::Thickness;
use crate::model::required::RequiredCourse;
use crate::report::verdict::sg_text;

/// The chart.
pub struct RequiredChart<'a>(pub Inputs<'a>);

const PLOT_H: f64 = 600.0;
/// Where the markers sit in a course, as a fraction of its height from its bottom.
const ONE_FOOT_AT: f64 = 0.62;
const VDP_AT: f64 = 0.38;

const NOMINAL: Stroke = Stroke::new(GREY, 2.0, Dash::Long);
const ONE_FOOT: Stroke = Stroke::new(DEEP_BLUE, 3.2, Dash::Solid);
const VDP: Stroke = Stroke::new(ORANGE, 2.6, Dash::Short);
const MIN_NOMINAL: Stroke = Stroke::new(PURPLE, 2.2, Dash::Dot);
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
            LIQUID_LEVEL,
            None,
        ));
        e
    }
}

impl Figure for RequiredChart<'_> {
    const ID: &'static str = "chart-required";
    const TITLE: &'static str = "Design check: required thickness against elevation";

    fn size(&self) -> (u32, u32) {
        figure_size(PLOT_H, &self.legend())
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
        let e = ElevationPlot::draw(
            pen,
            v,
            d.courses
                .iter()
                .map(|c| (c.number, c.bottom_elevation, c.height)),
            (x1, y1),
            level,
            PLOT_H,
        )?;
        let steps = |thickness: fn(&RequiredCourse) -> Option<Thickness>| {
            e.steps(v, d.courses.iter().map(thickness))
        };
        for p in steps(|c| c.nominal) {
            pen.line(&p, &NOMINAL)?;
        }
        if let Some(c) = d.courses.first() {
            let t = v.thk(c.minimum_nominal);
            pen.line(&[e.m(t, 0.0), e.m(t, shell)], &MIN_NOMINAL)?;
        }
        for p in steps(|c| Some(c.required_one_foot)) {
            pen.line(&p, &ONE_FOOT)?;
        }
        for p in steps(|c| c.required_vdp) {
            pen.line(&p, &VDP)?;
        }
        e.level_line(pen)?;
        for (c, span) in d.courses.iter().zip(e.courses()) {
            pen.marker(
                e.m(v.thk(c.one_foot.test), span.at(ONE_FOOT_AT)),
                &ONE_FOOT_TEST,
            )?;
            pen.marker(
                e.m(v.thk(c.one_foot.design), span.at(ONE_FOOT_AT)),
                &ONE_FOOT_DESIGN,
            )?;
            if let Some(t) = c.vdp_test_thickness() {
                pen.marker(e.m(v.thk(t), span.at(VDP_AT)), &VDP_TEST)?;
            }
            if let Some(t) = c.vdp_design_thickness() {
                pen.marker(e.m(v.thk(t), span.at(VDP_AT)), &VDP_DESIGN)?;
            }
        }
        e.margin_labels(pen, format!("design level {}", v.len_text(d.fill_height)))?;
        legend_below(pen, &self.legend(), PLOT_H)
    }
}
