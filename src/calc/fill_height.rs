//! Allowable liquid level for the stored product and for other specific gravities,
//! now and after a number of years of corrosion at each course's governing rate.
//!
//! Source: API 653 4.3.3.1 inverted (methods.md s.4):
//! H_max = S E t / (4.9 D G) + 0.3 + z_bottom   [USC: 2.6, 1 ft], least over courses,
//! with t = t_actual now, and t_actual - N x years later; and for each scanned area its
//! local form (area.rs, local.rs): H_max = S E t' / (f 4.9 D G) + z, least over its
//! windows, t2 and its least pit, with t' the thickness now or less N x years.

use super::area::{AreaLimit, area_fill_limit};
use super::shell::{CourseLoad, FillHeightCalc, max_fill_height};
use super::units::Thickness;
use crate::model::result::{Assessment, FillLimit};

/// One course's limits in one scenario.
#[derive(Debug, Clone, PartialEq)]
pub struct CourseFill {
    /// Course.
    pub course: u32,
    /// Limit now.
    pub now: FillHeightCalc,
    /// Limit after the years (None without a rate).
    pub later: Option<FillHeightCalc>,
}

/// One scanned area's limits in one scenario.
#[derive(Debug, Clone, PartialEq)]
pub struct AreaFill {
    /// Index into `Assessment::areas`.
    pub area: usize,
    /// Limit now.
    pub now: AreaLimit,
    /// Limit after the years (None without a rate).
    pub later: Option<AreaLimit>,
}

/// One specific gravity.
#[derive(Debug, Clone, PartialEq)]
pub struct FillScenario {
    /// G.
    pub specific_gravity: f64,
    /// True for the tank's own product.
    pub stored_product: bool,
    /// Per measured course.
    pub courses: Vec<CourseFill>,
    /// Least over courses now.
    pub now: Option<FillLimit>,
    /// Least over courses later; None when any measured course lacks a rate.
    pub later: Option<FillLimit>,
    /// Per scanned area.
    pub areas: Vec<AreaFill>,
    /// The area that sets `now` (None when a course does).
    pub now_area: Option<usize>,
    /// The area that sets `later`.
    pub later_area: Option<usize>,
}

fn least(items: impl Iterator<Item = Option<(f64, u32)>>) -> Option<FillLimit> {
    let mut best: Option<FillLimit> = None;
    for item in items {
        let (level, course) = item?;
        if best.is_none_or(|b| level < b.level.0) {
            best = Some(FillLimit {
                level: crate::calc::units::Length(level),
                course,
            });
        }
    }
    best
}

/// The stored product first, then each of `other_sgs`, after `years` of corrosion.
pub fn fill_scenarios(assessment: &Assessment, other_sgs: &[f64], years: f64) -> Vec<FillScenario> {
    let stored = assessment.tank.specific_gravity;
    std::iter::once((stored, true))
        .chain(other_sgs.iter().map(|&g| (g, false)))
        .map(|(g, stored_product)| {
            let courses: Vec<CourseFill> = assessment
                .courses
                .iter()
                .filter_map(|c| {
                    let k = c.condition.as_ref()?;
                    let load = CourseLoad {
                        specific_gravity: g,
                        ..k.max_fill_height.load
                    };
                    Some(CourseFill {
                        course: c.number,
                        now: max_fill_height(load, k.t_actual()),
                        later: k
                            .rate_value()
                            .map(|n| max_fill_height(load, k.t_actual().after(n, years))),
                    })
                })
                .collect();
            let mut now = least(courses.iter().map(|c| Some((c.now.value.0, c.course))));
            let mut later = least(
                courses
                    .iter()
                    .map(|c| c.later.map(|l| (l.value.0, c.course))),
            );
            let areas: Vec<AreaFill> = assessment
                .areas
                .iter()
                .enumerate()
                .filter_map(|(i, a)| {
                    Some(AreaFill {
                        area: i,
                        now: area_fill_limit(a, g, Thickness(0.0))?,
                        later: a.future.rate.and_then(|n| {
                            area_fill_limit(a, g, Thickness(n.0.max(0.0) * years.max(0.0)))
                        }),
                    })
                })
                .collect();
            let (mut now_area, mut later_area) = (None, None);
            for f in &areas {
                let course = assessment.areas[f.area].scan.course;
                let level = f.now.calc.value;
                if now.is_none_or(|b| level.0 < b.level.0) {
                    now = Some(FillLimit { level, course });
                    now_area = Some(f.area);
                }
                match (f.later, later) {
                    (None, _) => {
                        later = None;
                        later_area = None;
                    }
                    (Some(l), Some(b)) if l.calc.value.0 < b.level.0 => {
                        later = Some(FillLimit {
                            level: l.calc.value,
                            course,
                        });
                        later_area = Some(f.area);
                    }
                    _ => {}
                }
            }
            FillScenario {
                specific_gravity: g,
                stored_product,
                courses,
                now,
                later,
                areas,
                now_area,
                later_area,
            }
        })
        .collect()
}
