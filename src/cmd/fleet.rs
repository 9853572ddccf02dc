//! `strake fleet DIR`: every tank folder below DIR, assessed in parallel.
//!
//! Each tank is read, assessed and reduced to its fleet line on a worker thread
//! (rayon); its readings and full assessment are dropped as soon as the line is
//! made, so memory grows with the number of tanks, not with their readings. The
//! lines are then put in planning order (calc::fleet), which does not depend on the
//! order the workers finished in: the output is the same on every run.

use std::io::IsTerminal;
use std::path::Path;

use chrono::NaiveDate;
use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};
use rayon::prelude::*;

use super::{Global, assess_tank, display, today};
use crate::calc::assess::AssessOptions;
use crate::calc::fleet::{fleet_tank, order_fleet};
use crate::cli::{FleetArgs, Format};
use crate::input::fleet::find_tank_dirs;
use crate::input::tank_dir::load_tank_file;
use crate::model::fleet::{Fleet, FleetEntry};
use crate::report::fleet::{render_csv, render_json, render_text};
use crate::report::write;
use crate::{Error, Outcome};

/// Runs the command.
pub fn run(args: &FleetArgs, g: Global) -> Result<Outcome, Error> {
    let today = today();
    let found = find_tank_dirs(&args.dir)?;
    let bar = progress_bar(found.tanks.len() as u64, g.quiet);
    let mut entries: Vec<FleetEntry> = found
        .tanks
        .par_iter()
        .map(|dir| {
            let entry = assess_entry(dir, today);
            bar.inc(1);
            entry
        })
        .collect();
    bar.finish_and_clear();
    entries.extend(
        found
            .unreadable
            .into_iter()
            .map(|(path, e)| FleetEntry::Failed {
                folder: display(&path),
                tank_id: None,
                message: e.to_string(),
            }),
    );
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
    let out = match g.format {
        Format::Text => render_text(&fleet, g.units, g.quiet),
        Format::Json => render_json(&fleet, g.units),
        Format::Csv => render_csv(&fleet, g.units).map_err(Error::Render)?,
    };
    write::print(&out, g.color).map_err(Error::Output)?;
    if fleet.failed() > 0 {
        Ok(Outcome::InputErrors)
    } else {
        Ok(Outcome::Done)
    }
}

/// One tank folder: its fleet line, or its error.
fn assess_entry(dir: &Path, today: NaiveDate) -> FleetEntry {
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
    // The fleet line shows no point; a report of the tank (`--out`) would need them.
    let options = AssessOptions {
        skip_points: true,
        ..AssessOptions::default()
    };
    match assess_tank(dir, &tank, today, options) {
        Ok(a) => FleetEntry::Tank(Box::new(fleet_tank(folder, &a))),
        Err(e) => FleetEntry::Failed {
            folder,
            tank_id: Some(tank.id),
            message: e.to_string(),
        },
    }
}

/// A progress bar on standard error when it is a terminal (never when piped or with
/// `--quiet`).
fn progress_bar(len: u64, quiet: bool) -> ProgressBar {
    if quiet || !std::io::stderr().is_terminal() {
        return ProgressBar::hidden();
    }
    let bar = ProgressBar::with_draw_target(Some(len), ProgressDrawTarget::stderr());
    if let Ok(style) =
        ProgressStyle::with_template("{bar:40} {pos}/{len} tanks assessed, {elapsed} ({eta} left)")
    {
        bar.set_style(style);
    }
    bar
}
