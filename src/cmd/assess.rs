//! `strake assess TANK_DIR [--out [DIR]] [--stamp]`.

use std::io::Write as _;

use super::{Global, display, load_and_assess, today};
use crate::calc::series::report_series;
use crate::cli::{AssessArgs, Format};
use crate::input::tank_dir::{SURVEY_DIR, load_tank_dir};
use crate::report::folder::{ReportContext, default_folder, report_files, write_folder};
use crate::report::view::View;
use crate::report::{csv_out, json, text, write};
use crate::{Error, Outcome};

/// Runs the command.
pub fn run(args: &AssessArgs, g: Global) -> Result<Outcome, Error> {
    let a = load_and_assess(&args.tank, args.sg, args.fill_height)?;
    let v = View::new(a.tank.units, g.units);
    let out = match g.format {
        Format::Text => text::render(&a, &v, g.quiet),
        Format::Json => json::render(&a, &v),
        Format::Csv => csv_out::courses_csv(&a, &v).map_err(Error::Render)?,
    };
    let written = match &args.out {
        None => None,
        Some(dir) => {
            let dir = dir.clone().unwrap_or_else(|| default_folder(&a.tank.id));
            // The charts draw every reading: the folder is read again keeping them (the
            // assessment above streamed the readings and kept none).
            let folder = load_tank_dir(&args.tank.dir, today())?;
            let series = report_series(&a, &folder.readings);
            let stamp = args.stamp.then(|| {
                chrono::Utc::now()
                    .format("%Y-%m-%d %H:%M:%S UTC")
                    .to_string()
            });
            let ctx = ReportContext {
                files: &folder.files,
                stamp: stamp.as_deref(),
            };
            let files = report_files(&a, &series, &v, ctx)?;
            write_folder(&dir, &args.tank.dir.join(SURVEY_DIR), &files)?;
            let charts = files.iter().filter(|f| f.name.ends_with(".png")).count();
            Some((dir, files.len(), charts))
        }
    };
    write::print(&out, g.color).map_err(Error::Output)?;
    if g.format == Format::Csv {
        // CSV rows hold courses only: the warnings go to standard error, one a line.
        write::warnings_to_stderr(&a.warnings).map_err(Error::Output)?;
        write::caution_to_stderr().map_err(Error::Output)?;
    }
    if let Some((dir, count, charts)) = written {
        let mut err = std::io::stderr().lock();
        writeln!(
            err,
            "report: {} ({count} files: index.html, {charts} PNG charts, courses.csv, \
             points.csv, result.json)",
            display(&dir.join("index.html"))
        )
        .map_err(Error::Output)?;
    }
    if args.fail_below_minimum && !a.summary.below_minimum.is_empty() {
        Ok(Outcome::BelowMinimum)
    } else {
        Ok(Outcome::Done)
    }
}
