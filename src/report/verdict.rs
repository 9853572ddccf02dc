//! The verdict in plain words: is the tank fit, until when, up to what level, and
//! when to look again. Built from the result model only.

use crate::calc::life::{IntervalBasis, RemainingLife};
use crate::model::result::{Assessment, TankInterval};
use crate::report::view::{View, years_text};

/// The verdict as a list of sentences (one paragraph when joined with spaces).
pub fn verdict_sentences(a: &Assessment, v: &View) -> Vec<String> {
    let mut out = Vec::new();
    let s = &a.summary;
    let level = v.len_text(a.tank.max_fill_height);
    let sg = sg_text(a.tank.specific_gravity);
    let measured = a.courses.iter().filter(|c| c.condition.is_some()).count();

    // Fitness now.
    if s.below_minimum.is_empty() {
        out.push(format!(
            "Every measured course ({measured} of {}) is at or above its t_min for SG {sg} at a \
             liquid level of {level}.",
            a.courses.len()
        ));
    } else {
        let parts: Vec<String> = s
            .below_minimum
            .iter()
            .filter_map(|n| {
                let c = a.courses.iter().find(|c| c.number == *n)?;
                let k = c.condition.as_ref()?;
                Some(format!(
                    "course {n} ({} measured, {} required)",
                    v.thk_text(k.t_actual()),
                    v.thk_text(c.t_min.value)
                ))
            })
            .collect();
        out.push(format!(
            "NOT FIT for SG {sg} at {level}: {} below t_min.",
            join_and(&parts) + if parts.len() == 1 { " is" } else { " are" }
        ));
    }

    // Scanned areas.
    for area in &a.areas {
        let name = scan_name(&area.scan.file);
        let which = format!("The scanned area on course {} ({name})", area.scan.course);
        out.push(match area.acceptable {
            Some(true) => format!(
                "{which} meets the local-area rules of API 653 4.3.2 with the corrosion expected \
                 by the next inspection."
            ),
            Some(false) => {
                let failed = area.failed_rules();
                format!(
                    "{which} does not meet the {} rule{} of API 653 4.3.2 at {level} with the \
                     corrosion expected by the next inspection.",
                    join_and(&failed.iter().map(|s| s.to_string()).collect::<Vec<_>>()),
                    if failed.len() == 1 { "" } else { "s" }
                )
            }
            None => format!(
                "{which} could not be averaged (no window with half its cells measured): its \
                 t1 rule is not decided."
            ),
        });
    }

    // Life.
    match (s.governing_course, s.remaining_life) {
        (Some(n), Some(life)) => {
            let c = a.courses.iter().find(|c| c.number == n);
            let k = c.and_then(|c| c.condition.as_ref());
            let rate = k
                .and_then(|k| k.rate)
                .map(|r| format!("{} ({} rate)", v.rate_text(r.value), r.basis.name()))
                .unwrap_or_default();
            match life {
                RemainingLife::Years(y) if y <= 0.0 => {
                    out.push(format!(
                        "Course {n} governs: no remaining corrosion allowance."
                    ));
                }
                RemainingLife::Years(y) => {
                    let when = k
                        .and_then(|k| k.retirement_date)
                        .map(|d| format!(", reaching t_min about {}", d.format("%Y-%m")))
                        .unwrap_or_default();
                    out.push(format!(
                        "Course {n} governs with {} years of remaining life at {rate}{when}.",
                        years_text(y)
                    ));
                }
                RemainingLife::NoMeasurableLoss => out.push(format!(
                    "No measurable corrosion on any course (governing rate 0); course {n} is \
                     listed as governing."
                )),
                RemainingLife::Unknown => {}
            }
        }
        _ => {
            let any_rate = a
                .courses
                .iter()
                .any(|c| c.condition.as_ref().is_some_and(|k| k.rate.is_some()));
            out.push(if any_rate {
                "No measurable corrosion on any course with a known rate (governing rates 0): \
                 remaining life is not limited by corrosion."
                    .to_string()
            } else {
                "No governing corrosion rate is known (see the warnings): remaining life \
                 cannot be projected."
                    .to_string()
            });
        }
    }

    // Fill height.
    if let Some(now) = s.max_fill_height {
        let max = a.tank.max_fill_height;
        let shell = a.tank.shell_height();
        let limit = |l: crate::model::result::FillLimit, area: Option<usize>, next: bool| {
            let who = match area.and_then(|i| a.areas.get(i)) {
                Some(x) => {
                    let rule = if next {
                        x.max_fill_height_next.as_ref()
                    } else {
                        Some(&x.max_fill_height)
                    };
                    format!(
                        "the scanned area on course {} ({}{})",
                        l.course,
                        scan_name(&x.scan.file),
                        rule.map_or(String::new(), |r| format!(", {} rule", r.kind.name()))
                    )
                }
                None => format!("course {}", l.course),
            };
            if l.level.0 >= shell.0 {
                format!(
                    "the full shell height of {} ({who}, the most limiting, would carry {})",
                    v.len_text(shell),
                    v.len_text(l.level)
                )
            } else {
                format!("{}, set by {who}", v.len_text(l.level))
            }
        };
        out.push(format!(
            "Allowable liquid level now: {}.",
            limit(now, s.max_fill_height_area, false)
        ));
        if let Some(next) = s.max_fill_height_next {
            let when = s
                .next_ut_inspection
                .map(|d| format!(" ({d})"))
                .unwrap_or_default();
            out.push(format!(
                "At the next UT survey{when}: {}.",
                limit(next, s.max_fill_height_next_area, true)
            ));
        }
        if now.level.0 < max.0 {
            out.push(format!(
                "The operating maximum of {level} exceeds the allowable level: restrict the \
                 fill height to {} or repair.",
                v.len_text(now.level)
            ));
        } else if s.max_fill_height_next.is_some_and(|n| n.level.0 < max.0) {
            out.push(format!(
                "The operating maximum of {level} is allowed now but not at the next survey: \
                 plan a repair or a lower fill height before then."
            ));
        } else if s.max_fill_height_next.is_some() {
            out.push(format!("The operating maximum of {level} is within both."));
        } else {
            out.push(format!("The operating maximum of {level} is within it."));
        }
    }

    // Dates.
    let due =
        |d: Option<chrono::NaiveDate>| d.map_or("not computed".to_string(), |d| d.to_string());
    out.push(format!(
        "Next UT thickness survey due {} ({}); next external inspection due {} ({}).",
        due(s.next_ut_inspection),
        interval_text(&s.ut_interval),
        due(s.next_external_inspection),
        interval_text(&s.external_interval)
    ));
    out
}

/// "3.8-year interval, course 1" and the like.
pub fn interval_text(i: &TankInterval) -> String {
    match (i.basis, i.course) {
        (IntervalBasis::NoAllowanceLeft, Some(c)) => {
            format!("now: course {c} has no corrosion allowance left")
        }
        (IntervalBasis::NoRateKnown, _) => {
            format!("{}-year default, no rate known", years_text(i.years))
        }
        (IntervalBasis::Cap, _) => format!("{}-year maximum interval", years_text(i.years)),
        (_, Some(c)) => format!("{}-year interval, set by course {c}", years_text(i.years)),
        (_, None) => format!("{}-year interval", years_text(i.years)),
    }
}

/// A specific gravity with at least two decimals (0.90, 1.00, 0.745).
pub fn sg_text(g: f64) -> String {
    let s = format!("{g}");
    if s.split('.').nth(1).is_some_and(|d| d.len() >= 2) {
        s
    } else {
        format!("{g:.2}")
    }
}

fn join_and(parts: &[String]) -> String {
    match parts {
        [] => String::new(),
        [one] => one.clone(),
        [init @ .., last] => format!("{} and {last}", init.join(", ")),
    }
}

/// The file name of a scan, for sentences.
pub fn scan_name(path: &str) -> String {
    std::path::Path::new(path)
        .file_name()
        .map_or(path.to_string(), |n| n.to_string_lossy().into_owned())
}
