//! `strake fleet DIR`: every tank folder below DIR, assessed in parallel.
//!
//! Each tank is read, assessed and reduced to its fleet line on a worker thread
//! (rayon); its readings and full assessment are dropped as soon as the line is
//! made, so memory grows with the number of tanks, not with their readings. The
//! lines are then put in planning order (calc::fleet), which does not depend on the
//! order the workers finished in: the output is the same on every run.
//!
//! Without `--out`, each tank is assessed as soon as the search finds it (the search
//! and the tanks share the workers). With `--out`, the search ends first (every report
//! folder is named from all the tank ids), and each worker also writes its tank's
//! report folder (the files of `assess --out`) before dropping the tank, so memory
//! stays that of one report per worker; the fleet page is written last, from the
//! ordered lines.

use std::io::{IsTerminal, Write as _};
use std::path::{Path, PathBuf};

use chrono::NaiveDate;
use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use rayon::prelude::*;

use super::{Global, assess_tank, display, today};
use crate::calc::assess::AssessOptions;
use crate::calc::fleet::{fleet_series, fleet_tank, order_fleet};
use crate::calc::series::report_series;
use crate::calc::units::UnitSystem;
use crate::cli::{FleetArgs, Format};
use crate::input::error::InputError;
use crate::input::fleet::{Found, find_tank_dirs, no_tank_folders, walk_tank_dirs};
use crate::input::tank_dir::{SCAN_DIR, SURVEY_DIR, load_tank_dir, load_tank_file};
use crate::model::fleet::{Fleet, FleetEntry};
use crate::model::result::Assessment;
use crate::report::fleet::{render_csv, render_json, render_text};
use crate::report::fleet_out::{
    FleetOutError, default_folder, report_names, resolved, write_fleet_page,
};
use crate::report::folder::{ReportContext, report_files, write_folder};
use crate::report::view::View;
use crate::report::write;
use crate::{Error, Outcome};

/// Where a tank's report goes (`--out`): the fleet report folder and the tank's
/// folder name in it.
#[derive(Debug, Clone, Copy)]
struct ReportTo<'a> {
    out: &'a Path,
    name: &'a str,
    units: Option<UnitSystem>,
}

/// Runs the command.
pub fn run(args: &FleetArgs, g: Global) -> Result<Outcome, Error> {
    let today = today();
    let out: Option<PathBuf> = args
        .out
        .as_ref()
        .map(|o| o.clone().unwrap_or_else(default_folder));
    let mut entries = match &out {
        Some(dir) => assess_with_reports(&args.dir, dir, today, g)?,
        None => assess_while_searching(&args.dir, today, g.quiet)?,
    };
    order_fleet(&mut entries);
    let fleet = Fleet {
        root: display(&args.dir),
        entries,
    };
    for e in &fleet.entries {
        if let FleetEntry::Failed { message, .. } = e {
            eprintln!("error: {message}");
        }
    }
    let page = match &out {
        Some(dir) => {
            let series = fleet_series(&fleet);
            let files = write_fleet_page(dir, &fleet, &series, g.units)?;
            Some((dir, files))
        }
        None => None,
    };
    let text = match g.format {
        Format::Text => render_text(&fleet, g.units, g.quiet),
        Format::Json => render_json(&fleet, g.units),
        Format::Csv => render_csv(&fleet, g.units).map_err(Error::Render)?,
    };
    write::print(&text, g.color).map_err(Error::Output)?;
    if g.format == Format::Csv {
        write::caution_to_stderr().map_err(Error::Output)?;
    }
    if let Some((dir, files)) = page {
        let reports = fleet
            .entries
            .iter()
            .filter(|e| matches!(e, FleetEntry::Tank(t) if t.report.is_some()))
            .count();
        let mut err = std::io::stderr().lock();
        writeln!(
            err,
            "report: {} (the fleet page and {} PNG charts; {reports} tank report{} beside it)",
            display(&dir.join("index.html")),
            files - 1,
            if reports == 1 { "" } else { "s" }
        )
        .map_err(Error::Output)?;
    }
    if fleet.failed() > 0 {
        Ok(Outcome::InputErrors)
    } else {
        Ok(Outcome::Done)
    }
}

/// Every tank below `root` with its report folder in `out` (`--out`). Every tank's
/// report folder is named before any is written: the names depend on all the tank ids
/// (two tanks may share one), never on which worker finishes first, so the search
/// ends before the first tank is assessed. The tank files are read for their ids
/// (again by each worker: a tank file is read in microseconds, a report drawn in
/// tens of milliseconds).
fn assess_with_reports(
    root: &Path,
    out: &Path,
    today: NaiveDate,
    g: Global,
) -> Result<Vec<FleetEntry>, Error> {
    let found = find_tank_dirs(root)?;
    refuse_inputs(out, &found.tanks)?;
    let ids: Vec<Option<String>> = found
        .tanks
        .par_iter()
        .map(|d| load_tank_file(d).ok().map(|t| t.id))
        .collect();
    let names = report_names(&ids.iter().map(Option::as_deref).collect::<Vec<_>>());
    let bar = progress_bar(found.tanks.len() as u64, g.quiet);
    let mut entries: Vec<FleetEntry> = found
        .tanks
        .par_iter()
        .zip(names.par_iter())
        .map(|(dir, name)| {
            let report = name.as_deref().map(|name| ReportTo {
                out,
                name,
                units: g.units,
            });
            let entry = assess_entry(dir, today, report);
            bar.inc(1);
            entry
        })
        .collect();
    bar.finish_and_clear();
    entries.extend(
        found
            .unreadable
            .into_iter()
            .map(|(path, e)| unreadable(&path, &e)),
    );
    Ok(entries)
}

/// Every tank below `root`, each assessed as soon as the search finds it (the search
/// and the assessments share the workers), in the order of [`find_tank_dirs`]: the
/// tanks in path order, then the folders that could not be searched.
fn assess_while_searching(
    root: &Path,
    today: NaiveDate,
    quiet: bool,
) -> Result<Vec<FleetEntry>, Error> {
    let search = walk_tank_dirs(root)?;
    // (Its length grows as tanks are found.)
    // (The search stays just ahead of the workers, which take the tanks as it finds
    // them, so the number of tanks is known only at the end: the tanks assessed and
    // those found so far, no bar.)
    let bar = progress_bar(0, quiet);
    set_template(&bar, "{pos} tanks assessed, {len} found so far, {elapsed}");
    let mut entries: Vec<(bool, usize, FleetEntry)> = search
        .inspect(|found| {
            if matches!(found, Found::Tank(_)) {
                bar.inc_length(1);
            }
        })
        .enumerate()
        .par_bridge()
        .map(|(i, found)| match found {
            Found::Tank(dir) => {
                let entry = assess_entry(&dir, today, None);
                bar.inc(1);
                (false, i, entry)
            }
            Found::Unreadable(path, e) => (true, i, unreadable(&path, &e)),
        })
        .collect();
    bar.finish_and_clear();
    if entries.is_empty() {
        return Err(no_tank_folders(root).into());
    }
    entries.sort_unstable_by_key(|&(failed, i, _)| (failed, i));
    Ok(entries.into_iter().map(|(_, _, e)| e).collect())
}

/// The fleet line of a folder the search could not read.
fn unreadable(path: &Path, e: &InputError) -> FleetEntry {
    FleetEntry::Failed {
        folder: display(path),
        tank_id: None,
        message: e.to_string(),
    }
}

/// Refuses a fleet report folder inside a tank's surveys/ or scans/ folder (the
/// files written there would be read, or reported as not read, at the next run).
fn refuse_inputs(out: &Path, tanks: &[PathBuf]) -> Result<(), FleetOutError> {
    let target = resolved(out);
    for dir in tanks {
        for sub in [SURVEY_DIR, SCAN_DIR] {
            let inputs = dir.join(sub);
            if target.starts_with(resolved(&inputs)) {
                return Err(FleetOutError::IntoInputs {
                    path: display(out),
                    inputs: display(&inputs),
                });
            }
        }
    }
    Ok(())
}

/// Writes a tank's report folder, the same files as `assess TANK --out`: the folder
/// is read once more keeping every reading (for the charts), the report rendered and
/// written, and all of it dropped on return.
fn write_tank_report(
    dir: &Path,
    a: &Assessment,
    today: NaiveDate,
    to: ReportTo,
) -> Result<(), Error> {
    let folder = load_tank_dir(dir, today)?;
    let series = report_series(a, &folder.readings);
    let v = View::new(a.tank.units, to.units);
    let ctx = ReportContext {
        files: &folder.files,
        stamp: None,
    };
    let files = report_files(a, &series, &v, ctx)?;
    write_folder(&to.out.join(to.name), &dir.join(SURVEY_DIR), &files)?;
    Ok(())
}

/// One tank folder: its fleet line (and, with `report`, its report folder), or its
/// error.
fn assess_entry(dir: &Path, today: NaiveDate, report: Option<ReportTo>) -> FleetEntry {
    let folder = display(dir);
    let tank = match load_tank_file(dir) {
        Ok(t) => t,
        Err(e) => {
            return FleetEntry::Failed {
                folder,
                tank_id: None,
                message: e.to_string(),
            };
        }
    };
    // The fleet line shows no point; a report of the tank (`--out`) needs them (every
    // other value is the same either way).
    let options = AssessOptions {
        skip_points: report.is_none(),
        ..AssessOptions::default()
    };
    let a = match assess_tank(dir, &tank, today, options) {
        Ok(a) => a,
        Err(e) => {
            return FleetEntry::Failed {
                folder,
                tank_id: Some(tank.id),
                message: e.to_string(),
            };
        }
    };
    let mut line = fleet_tank(folder, &a);
    if let Some(to) = report {
        if let Err(e) = write_tank_report(dir, &a, today, to) {
            return FleetEntry::Failed {
                folder: line.folder,
                tank_id: Some(tank.id),
                message: e.to_string(),
            };
        }
        line.report = Some(to.name.to_string());
    }
    FleetEntry::Tank(Box::new(line))
}

/// A progress bar on standard error when it is a terminal (never when piped or with
/// `--quiet`).
fn progress_bar(len: u64, quiet: bool) -> ProgressBar {
    if quiet || !std::io::stderr().is_terminal() {
        return ProgressBar::hidden();
    }
    let bar = ProgressBar::with_draw_target(Some(len), ProgressDrawTarget::stderr());
    set_template(
        &bar,
        "{bar:40} {pos}/{len} tanks assessed, {elapsed} ({eta} left)",
    );
    bar
}

/// Shows `bar` with `template` (as it was if the template does not parse).
fn set_template(bar: &ProgressBar, template: &str) {
    if let Ok(style) = ProgressStyle::with_template(template) {
        bar.set_style(style);
    }
}
