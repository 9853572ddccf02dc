//! The fleet page (`strake fleet DIR --out`): one self-contained `index.html` (inline
//! CSS and SVG, no script, nothing fetched) with the planning table in due-date order
//! (each tank linked to its own report beside the page), the two fleet charts, the
//! inspections due per year, the tanks whose allowable level is below their operating
//! maximum, the folders that could not be assessed with their errors, and the caution.
//! A print stylesheet gives landscape A4 pages.
//!
//! Rendered from the fleet model, its series and the drawn charts; nothing here
//! computes a value. Every text that comes from a user's file or the command line
//! (tank ids and names, folders, error messages) is escaped.

use std::fmt::Write as _;

use crate::calc::units::UnitSystem;
use crate::model::fleet::{Fleet, FleetEntry, FleetSeries, FleetTank, TankStatus};
use crate::report::caution::CAUTION;
use crate::report::chart::Chart;
use crate::report::fleet::{date_text, length_text, life_text, view};
use crate::report::html::esc;

/// The status badge of a tank (or of a folder that failed: `None`).
fn badge(s: Option<TankStatus>) -> String {
    let (class, text) = match s {
        Some(TankStatus::BelowMinimum) => ("below", "below t_min"),
        Some(TankStatus::NoReadings) => ("none", "no readings"),
        Some(TankStatus::Monitor) => ("monitor", "monitor"),
        Some(TankStatus::Ok) => ("ok", "ok"),
        None => ("error", "error"),
    };
    format!("<span class=\"badge {class}\">{text}</span>")
}

/// The whole page. `units`: the unit system shown (`--units`), else each tank's own.
pub fn render(
    fleet: &Fleet,
    series: &FleetSeries,
    charts: &[Chart],
    units: Option<UnitSystem>,
) -> String {
    let mut o =
        String::with_capacity(32 * 1024 + charts.iter().map(|c| c.svg.len()).sum::<usize>());
    let root = esc(&fleet.root);
    let _ = write!(
        o,
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n\
         <meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n\
         <meta name=\"generator\" content=\"strake {}\">\n\
         <title>Fleet plan {root}</title>\n<style>\n{STYLE}</style>\n</head>\n<body>\n",
        env!("CARGO_PKG_VERSION"),
    );
    let tanks: Vec<&FleetTank> = fleet.tanks().collect();
    let restricted: Vec<&FleetTank> = tanks
        .iter()
        .copied()
        .filter(|t| t.fill_restricted)
        .collect();
    masthead(&mut o, fleet, &root, !restricted.is_empty());
    o.push_str("<main>\n");
    overview(&mut o, fleet, &tanks, series.monitor_years);
    plan(&mut o, fleet, units);
    figures(&mut o, series, charts);
    if !restricted.is_empty() {
        restrictions(&mut o, &restricted, units);
    }
    if fleet.failed() > 0 {
        not_assessed(&mut o, fleet);
    }
    let _ = writeln!(
        o,
        "<section id=\"caution\">\n<h2>Caution</h2>\n<p class=\"caution\"><b>Caution.</b> {}</p>\n\
         <p class=\"note\">Fleet {root} · strake {}.</p>\n</section>\n</main>\n</body>\n</html>",
        esc(CAUTION),
        env!("CARGO_PKG_VERSION")
    );
    o
}

fn masthead(o: &mut String, fleet: &Fleet, root: &str, restricted: bool) {
    let n = fleet.entries.len();
    let _ = write!(
        o,
        "<header class=\"masthead\">\n<p class=\"kicker\">Above-ground storage tanks · \
         inspection plan</p>\n<h1>Fleet {root}</h1>\n<p class=\"meta\">{n} tank folder{} \
         below <b>{root}</b>: {} assessed, {} not assessed · ordered by next due date · \
         strake {}</p>\n<nav class=\"toc\" aria-label=\"Contents\"><ol>\
         <li><a href=\"#plan\">Plan by next due date</a></li>\
         <li><a href=\"#charts\">Charts</a></li>",
        if n == 1 { "" } else { "s" },
        fleet.assessed(),
        fleet.failed(),
        env!("CARGO_PKG_VERSION"),
    );
    if restricted {
        o.push_str("<li><a href=\"#restricted\">Fill height restricted</a></li>");
    }
    if fleet.failed() > 0 {
        o.push_str("<li><a href=\"#not-assessed\">Not assessed</a></li>");
    }
    o.push_str(
        "<li><a href=\"#caution\">Caution</a></li></ol></nav>\n<p class=\"note\">A screening \
         aid: read the caution at the end before relying on it.</p>\n</header>\n",
    );
}

fn overview(o: &mut String, fleet: &Fleet, tanks: &[&FleetTank], monitor_years: f64) {
    let count = |s: TankStatus| tanks.iter().filter(|t| t.status == s).count();
    let first = tanks.iter().find(|t| t.next_due.is_some());
    let next = first.map_or("none computed".to_string(), |t| {
        format!(
            "{} <span class=\"sub\">{}</span>",
            date_text(t.next_due),
            esc(&t.tank_id)
        )
    });
    let tile = |o: &mut String, class: &str, label: &str, value: String| {
        let _ = writeln!(
            o,
            "<div class=\"tile {class}\"><dt>{label}</dt><dd>{value}</dd></div>"
        );
    };
    o.push_str("<section id=\"overview\">\n<dl class=\"tiles\">\n");
    tile(o, "", "Next inspection due", next);
    let below = count(TankStatus::BelowMinimum);
    tile(
        o,
        if below > 0 { "act" } else { "" },
        "A course below t_min",
        below.to_string(),
    );
    let monitor = count(TankStatus::Monitor);
    tile(
        o,
        if monitor > 0 { "watch" } else { "" },
        &format!("Monitor (under {monitor_years:.0} years of life)"),
        monitor.to_string(),
    );
    let restricted = tanks.iter().filter(|t| t.fill_restricted).count();
    tile(
        o,
        if restricted > 0 { "act" } else { "" },
        "Fill height restricted",
        restricted.to_string(),
    );
    let none = count(TankStatus::NoReadings);
    tile(
        o,
        if none > 0 { "watch" } else { "" },
        "A course without readings",
        none.to_string(),
    );
    tile(
        o,
        if fleet.failed() > 0 { "act" } else { "" },
        "Folders not assessed",
        fleet.failed().to_string(),
    );
    o.push_str("</dl>\n</section>\n");
}

fn plan(o: &mut String, fleet: &Fleet, units: Option<UnitSystem>) {
    o.push_str(
        "<section id=\"plan\">\n<h2><span class=\"no\">1</span> Plan by next due date</h2>\n\
         <p class=\"note\">Next due: the earlier of the next UT thickness survey and the next \
         external inspection (API 653 6.3 intervals, from each tank's latest survey). Course: \
         the governing course, the one with the least remaining life. Fill now, fill at UT: \
         the allowable liquid level now and at the next UT survey (the least over the \
         courses and scanned areas, at most the shell height), in bold where it is below \
         max fill, the operating maximum. Each tank id opens the tank's own report.</p>\n\
         <div class=\"wide\">\n<table class=\"plan num\">\n<thead><tr><th>#</th><th>Tank</th><th>Next due</th>\
         <th>Next UT</th><th>Next external</th><th>Course</th><th>Life</th><th>Fill now</th>\
         <th>Fill at UT</th><th>Max fill</th><th>Status</th><th>Folder</th></tr>\n\
         <tr class=\"units\"><th></th><th></th><th></th><th></th><th></th><th></th><th>y</th>\
         <th></th><th></th><th></th><th></th><th></th></tr></thead>\n<tbody>\n",
    );
    for (i, e) in fleet.entries.iter().enumerate() {
        match e {
            FleetEntry::Tank(t) => {
                let v = view(t, units);
                let id = match &t.report {
                    Some(r) => format!("<a href=\"{}/index.html\">{}</a>", esc(r), esc(&t.tank_id)),
                    None => esc(&t.tank_id),
                };
                let name = t
                    .name
                    .as_deref()
                    .map(|n| format!("<span class=\"name\">{}</span>", esc(n)))
                    .unwrap_or_default();
                let restricted = if t.fill_restricted {
                    " class=\"restricted\""
                } else {
                    ""
                };
                let restricted_next = if t.fill_restricted_next {
                    " class=\"restricted-next\""
                } else {
                    ""
                };
                let _ = writeln!(
                    o,
                    "<tr class=\"{}\"><td>{}</td><td class=\"text tank\">{id}{name}</td>\
                     <td><b>{}</b></td><td>{}</td><td>{}</td><td>{}</td><td>{}</td>\
                     <td{restricted}>{}</td><td{restricted_next}>{}</td><td>{}</td><td class=\"text\">{}</td>\
                     <td class=\"text path\">{}</td></tr>",
                    status_class(Some(t.status)),
                    i + 1,
                    date_text(t.next_due),
                    date_text(t.next_ut_inspection),
                    date_text(t.next_external_inspection),
                    t.governing_course
                        .map_or_else(|| "-".to_string(), |c| c.to_string()),
                    life_text(t.remaining_life),
                    length_text(&v, t.allowable_fill_height),
                    length_text(&v, t.allowable_fill_height_next),
                    length_text(&v, Some(t.operating_fill_height)),
                    badge(Some(t.status)),
                    path_html(&t.folder),
                );
            }
            FleetEntry::Failed {
                folder, tank_id, ..
            } => {
                let _ = writeln!(
                    o,
                    "<tr class=\"error\"><td>{}</td><td class=\"text tank\">{}</td>\
                     <td colspan=\"8\" class=\"text\"><a href=\"#not-assessed\">not assessed: \
                     see the error below</a></td><td class=\"text\">{}</td>\
                     <td class=\"text path\">{}</td></tr>",
                    i + 1,
                    tank_id.as_deref().map_or("-".to_string(), esc),
                    badge(None),
                    path_html(folder),
                );
            }
        }
    }
    o.push_str("</tbody>\n</table>\n</div>\n</section>\n");
}

/// A path, escaped, that may break after each `/` (a long folder wraps at its parts).
fn path_html(path: &str) -> String {
    esc(path).replace('/', "/<wbr>")
}

fn status_class(s: Option<TankStatus>) -> &'static str {
    match s {
        Some(TankStatus::BelowMinimum) | None => "act",
        Some(TankStatus::NoReadings) | Some(TankStatus::Monitor) => "watch",
        Some(TankStatus::Ok) => "fit",
    }
}

/// An inline SVG chart with its id, class and accessible title.
fn inline_svg(c: &Chart) -> String {
    let svg = c.svg.replacen(
        "<svg ",
        &format!(
            "<svg id=\"{}\" class=\"chart\" role=\"img\" aria-labelledby=\"{}-title\" ",
            c.id, c.id
        ),
        1,
    );
    match svg.find('>') {
        Some(end) => format!(
            "{}<title id=\"{}-title\">{}</title>{}",
            &svg[..=end],
            c.id,
            esc(&c.title),
            svg[end + 1..].trim_end()
        ),
        None => svg,
    }
}

fn figures(o: &mut String, s: &FleetSeries, charts: &[Chart]) {
    o.push_str(
        "<section id=\"charts\">\n<h2><span class=\"no\">2</span> Charts</h2>\n\
         <p class=\"note\">Each chart is also beside this page as a PNG file for other \
         documents.</p>\n",
    );
    for (i, c) in charts.iter().enumerate() {
        let caption = match c.id.as_str() {
            "chart-due" => "Each assessed tank's next UT thickness survey and next external \
                            inspection, counted in the month they fall due (UT below, external \
                            stacked above), from the first due month to the last; the number \
                            above a bar is the month's total when the chart spans three years \
                            or less. Dates before today are overdue."
                .to_string(),
            _ => format!(
                "The remaining life of each tank's governing course, least first; bars under \
                 {:.0} years (the dashed line) are the courses to monitor. With more than 40 \
                 tanks the bars are ranked without names; the table above names every tank.",
                s.monitor_years
            ),
        };
        let _ = writeln!(
            o,
            "<figure id=\"fig-{}\">\n{}\n<figcaption><b>Figure {}. {}.</b> {caption} \
             <a href=\"{}\">PNG copy</a></figcaption>\n</figure>",
            &c.id["chart-".len().min(c.id.len())..],
            inline_svg(c),
            i + 1,
            esc(&c.title),
            esc(&c.file)
        );
    }
    if !s.due_years.is_empty() {
        o.push_str(
            "<table class=\"num years\">\n<caption>Inspections due per year</caption>\n\
             <thead><tr><th>Year</th><th>UT surveys</th><th>External</th><th>Total</th></tr>\
             </thead>\n<tbody>\n",
        );
        for y in &s.due_years {
            let _ = writeln!(
                o,
                "<tr><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>",
                y.year,
                y.ut,
                y.external,
                y.ut + y.external
            );
        }
        o.push_str("</tbody>\n</table>\n");
    }
    o.push_str("</section>\n");
}

fn restrictions(o: &mut String, restricted: &[&FleetTank], units: Option<UnitSystem>) {
    let _ = writeln!(
        o,
        "<section id=\"restricted\">\n<h2><span class=\"no\">3</span> Fill height restricted \
         ({})</h2>\n<p class=\"note\">Tanks whose allowable liquid level now is below their \
         operating maximum: lower the fill height or repair before filling to it.</p>\n<ul>",
        restricted.len()
    );
    for t in restricted {
        let v = view(t, units);
        let _ = writeln!(
            o,
            "<li><b>{}</b>: {} allowed now{}, below the operating maximum {}</li>",
            esc(&t.tank_id),
            length_text(&v, t.allowable_fill_height),
            t.allowable_fill_height_course
                .map(|c| format!(" (set by course {c})"))
                .unwrap_or_default(),
            length_text(&v, Some(t.operating_fill_height)),
        );
    }
    o.push_str("</ul>\n</section>\n");
}

fn not_assessed(o: &mut String, fleet: &Fleet) {
    let _ = writeln!(
        o,
        "<section id=\"not-assessed\">\n<h2>Folders not assessed ({})</h2>\n<p class=\"note\">\
         Each folder below holds a tank.toml but could not be assessed; the message names the \
         file, line and value to correct. The other tanks were assessed all the same.</p>\n\
         <table class=\"errors\">\n<thead><tr><th>Folder</th><th>Tank</th><th>Error</th></tr>\
         </thead>\n<tbody>",
        fleet.failed()
    );
    for e in &fleet.entries {
        if let FleetEntry::Failed {
            folder,
            tank_id,
            message,
        } = e
        {
            let _ = writeln!(
                o,
                "<tr><td class=\"path\">{}</td><td>{}</td><td class=\"message\">{}</td></tr>",
                path_html(folder),
                tank_id.as_deref().map_or("-".to_string(), esc),
                esc(message)
            );
        }
    }
    o.push_str("</tbody>\n</table>\n</section>\n");
}

/// The stylesheet: screen first, then print (landscape A4: the plan table is wide).
const STYLE: &str = r#":root { --ink: #1c232b; --muted: #5b6570; --rule: #d5dbe1; --band: #f3f6f8;
  --accent: #0b5c8a; --fit: #1f7a4d; --watch: #9a6500; --act: #b3261e; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: #fff;
  font: 15px/1.45 "DejaVu Sans", Verdana, "Segoe UI", Arial, sans-serif; }
header.masthead, main { max-width: 1200px; margin: 0 auto; padding: 0 24px; }
header.masthead { padding-top: 20px; }
header.masthead::after { content: ""; display: block; border-bottom: 3px solid var(--accent); }
.kicker { margin: 0; color: var(--accent); font-size: 12px; letter-spacing: .08em; text-transform: uppercase; }
h1 { margin: 4px 0 6px; font-size: 26px; word-break: break-all; }
.meta { margin: 0 0 10px; color: var(--muted); font-size: 13px; }
.meta b { color: var(--ink); font-weight: normal; word-break: break-all; }
nav.toc ol { display: flex; flex-wrap: wrap; gap: 4px 18px; margin: 0 0 12px; padding: 0;
  list-style: none; font-size: 13px; }
nav.toc a { color: var(--accent); text-decoration: none; }
section { margin: 24px 0; }
h2 { font-size: 20px; margin: 0 0 10px; padding-bottom: 4px; border-bottom: 1px solid var(--rule); }
h2 .no { display: inline-block; min-width: 1.6em; color: var(--accent); }
.note { color: var(--muted); font-size: 13px; }
dl.tiles { display: grid; grid-template-columns: repeat(6, 1fr); gap: 10px; margin: 0; }
.tile { background: var(--band); border-left: 6px solid var(--fit); padding: 8px 12px; }
.tile.watch { border-left-color: var(--watch); }
.tile.act { border-left-color: var(--act); }
.tile dt { font-size: 12.5px; color: var(--muted); }
.tile dd { margin: 2px 0 0; font-size: 22px; font-weight: bold; }
.tile dd .sub { display: block; font-size: 13px; font-weight: normal; color: var(--muted); }
table { border-collapse: collapse; margin: 10px 0 16px; font-size: 13.5px; }
caption { text-align: left; font-weight: bold; padding: 4px 0; }
th, td { padding: 3px 8px; border-bottom: 1px solid var(--rule); vertical-align: top; }
thead th { background: var(--band); text-align: right; font-weight: bold; white-space: nowrap; }
thead tr.units th { font-weight: normal; color: var(--muted); font-size: 12px; }
table.num td { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.num td.text, table.num th:nth-child(2), table.num th:last-child { text-align: left; }
table.plan { width: 100%; }
table.plan td.tank a { color: var(--accent); font-weight: bold; }
table.plan td.tank .name { display: block; font-size: 12px; color: var(--muted); white-space: normal; }
td.path { overflow-wrap: anywhere; white-space: normal !important; color: var(--muted); font-size: 12.5px; }
.wide { max-width: 100%; overflow-x: auto; }
td.restricted { color: var(--act); font-weight: bold; }
td.restricted-next { color: var(--watch); font-weight: bold; }
tr.act td:first-child { box-shadow: inset 4px 0 var(--act); }
tr.watch td:first-child { box-shadow: inset 4px 0 var(--watch); }
tr.fit td:first-child { box-shadow: inset 4px 0 var(--fit); }
tr.error td { background: #fdf1f0; }
tr.error a { color: var(--act); }
.badge { font-size: 12px; padding: 0 6px; border-radius: 3px; border: 1px solid; white-space: nowrap; }
.badge.ok { color: var(--fit); }
.badge.monitor, .badge.none { color: var(--watch); font-weight: bold; }
.badge.below, .badge.error { color: #fff; background: var(--act); border-color: var(--act); font-weight: bold; }
table.years { min-width: 320px; }
table.errors { width: 100%; }
table.errors th { text-align: left; }
td.message { font-size: 13px; word-break: break-word; }
figure { margin: 18px 0 16px; }
svg.chart { display: block; width: 100%; max-width: 1000px; height: auto; border: 1px solid var(--rule); }
figcaption { font-size: 13px; margin-top: 6px; max-width: 1000px; }
figcaption a { color: var(--accent); }
.caution { border: 1px solid var(--rule); background: var(--band); padding: 10px 14px; }
@media (max-width: 900px) { dl.tiles { grid-template-columns: repeat(2, 1fr); } }
@page { size: A4 landscape; margin: 12mm 12mm 14mm;
  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 8pt "DejaVu Sans", Verdana, sans-serif; color: #5b6570; } }
@media print {
  body { font-size: 9.5pt; }
  header.masthead, main { max-width: none; padding: 0; }
  .wide { overflow: visible; }
  nav.toc { display: none; }
  .tile, .badge, thead th, tr.error td, .caution, tr.act td:first-child, tr.watch td:first-child,
  tr.fit td:first-child { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  section { margin: 10px 0; }
  h2 { break-after: avoid; page-break-after: avoid; }
  table { font-size: 8pt; }
  thead { display: table-header-group; }
  tr, .tiles, table.years, #caution { break-inside: avoid; page-break-inside: avoid; }
  #charts { break-before: page; page-break-before: always; }
  figure { break-inside: avoid; page-break-inside: avoid; margin: 0 0 6mm; }
  dl.tiles { grid-template-columns: repeat(6, 1fr); }
  .tile dd { font-size: 13pt; }
  svg.chart { border: none; max-height: 170mm; width: auto; max-width: 100%; }
  a { color: inherit; text-decoration: none; }
}
"#;
