//! `strake check PATH...`: tank folders, lone survey files and lone scan files (a file
//! in a `scans/` folder, or one whose first line is a `# key = value` line).

use std::path::Path;

use super::{Global, display, today};
use crate::calc::screen::screen;
use crate::cli::{CheckArgs, Format};
use crate::input::error::{InputError, InputErrorKind, Location};
use crate::input::scan_csv::{looks_like_scan, read_scan};
use crate::input::survey_csv::{SurveyContext, read_survey};
use crate::input::tank_dir::{
    RepeatFilter, SCAN_DIR, TANK_FILE, context_of, load_tank_dir, load_tank_file,
};
use crate::model::reading::{PointNames, ReadingSet};
use crate::report::check::{Checked, render_json, render_text};
use crate::report::write;
use crate::{Error, Outcome};

/// Runs the command: every path is checked, errors do not stop the others.
pub fn run(args: &CheckArgs, g: Global) -> Result<Outcome, Error> {
    let today = today();
    let items: Vec<Checked> = args
        .paths
        .iter()
        .map(|p| {
            check_path(p, today).unwrap_or_else(|e| Checked::Failed {
                path: display(p),
                message: e.to_string(),
            })
        })
        .collect();
    let out = match g.format {
        Format::Json => render_json(&items),
        _ => render_text(&items),
    };
    for item in &items {
        if let Checked::Failed { message, .. } = item {
            eprintln!("error: {message}");
        }
    }
    write::print(&out, g.color).map_err(Error::Output)?;
    if items.iter().any(|i| matches!(i, Checked::Failed { .. })) {
        Ok(Outcome::InputErrors)
    } else {
        Ok(Outcome::Done)
    }
}

fn check_path(path: &Path, today: chrono::NaiveDate) -> Result<Checked, InputError> {
    if path.is_dir() {
        let folder = load_tank_dir(path, today)?;
        let screening = screen(Some(&folder.tank), &folder.readings);
        return Ok(Checked::Tank {
            dir: folder.dir,
            tank: Box::new(folder.tank),
            files: folder.files,
            screening,
            remarks: folder.warnings,
            scans: folder.readings.scans,
        });
    }
    let is_csv = path
        .extension()
        .is_some_and(|x| x.eq_ignore_ascii_case("csv"));
    if !path.is_file() || !is_csv {
        let kind = if path.exists() {
            InputErrorKind::NotATankOrCsv
        } else {
            InputErrorKind::Io(std::io::Error::new(
                std::io::ErrorKind::NotFound,
                "no such file or folder",
            ))
        };
        return Err(InputError::new(Location::file(display(path)), kind));
    }
    // A survey file inside TANK/surveys/ is checked against its tank.
    let tank_dir = path
        .parent()
        .and_then(Path::parent)
        .filter(|d| d.join(TANK_FILE).is_file());
    let tank = tank_dir.map(load_tank_file).transpose()?;
    let shown = display(path);
    let bytes = std::fs::read(path)
        .map_err(|e| InputError::new(Location::file(shown.clone()), InputErrorKind::Io(e)))?;
    let in_scans = path
        .parent()
        .and_then(Path::file_name)
        .is_some_and(|n| n == SCAN_DIR);
    if in_scans || looks_like_scan(&bytes) {
        let scan = read_scan(&shown, &bytes, tank.as_ref(), today)?;
        return Ok(Checked::Scan {
            scan: Box::new(scan),
            tank: tank.map(|t| (t.id, t.units)),
        });
    }
    let ctx = match &tank {
        Some(t) => context_of(t, today),
        None => SurveyContext {
            units: None,
            nominal: Vec::new(),
            shell_height: None,
            in_service_since: None,
            today,
        },
    };
    let mut points = PointNames::default();
    let mut readings = Vec::new();
    let input = std::io::Cursor::new(bytes);
    match tank {
        Some(t) => {
            let mut filter = RepeatFilter::new(t.units, &mut readings);
            filter.files.push(shown.clone());
            let info = read_survey(&shown, input, 0, &ctx, &mut points, &mut filter)?;
            let (files, remarks) = filter.finish()?;
            let set = ReadingSet {
                files,
                readings,
                scans: Vec::new(),
            };
            let screening = screen(Some(&t), &set);
            Ok(Checked::Tank {
                dir: info.path.clone(),
                tank: Box::new(t),
                files: vec![info],
                screening,
                remarks,
                scans: Vec::new(),
            })
        }
        None => {
            let info = read_survey(&shown, input, 0, &ctx, &mut points, &mut readings)?;
            let set = ReadingSet {
                files: vec![shown],
                readings,
                scans: Vec::new(),
            };
            Ok(Checked::File {
                screening: screen(None, &set),
                info,
            })
        }
    }
}
