//! Loads a tank folder: `tank.toml` and every `surveys/*.csv`.

use std::collections::HashMap;
use std::path::{Path, PathBuf};

use chrono::NaiveDate;

use super::error::{InputError, InputErrorKind, Location};
use super::survey_csv::{SurveyContext, SurveyFileInfo, read_survey};
use super::tank_file::parse_tank;
use crate::model::reading::{Reading, ReadingSet};
use crate::model::tank::Tank;
use crate::model::warning::{Shown, Warning};

/// Name of the tank file in a tank folder.
pub const TANK_FILE: &str = "tank.toml";
/// Folder of survey files in a tank folder.
pub const SURVEY_DIR: &str = "surveys";

/// Everything read from one tank folder.
#[derive(Debug, Clone)]
pub struct TankFolder {
    /// The folder, as the user gave it.
    pub dir: String,
    /// The tank.
    pub tank: Tank,
    /// Readings of every survey file.
    pub readings: ReadingSet,
    /// What each survey file held.
    pub files: Vec<SurveyFileInfo>,
    /// Remarks made while reading (repeated rows).
    pub warnings: Vec<Warning>,
}

/// Display form of `dir` joined with `name`.
pub fn display_join(dir: &Path, name: &str) -> String {
    dir.join(name).display().to_string()
}

fn read_bytes(path: &Path) -> Result<Vec<u8>, InputError> {
    std::fs::read(path).map_err(|e| {
        InputError::new(
            Location::file(path.display().to_string()),
            InputErrorKind::Io(e),
        )
    })
}

/// Reads and validates `dir/tank.toml`.
pub fn load_tank_file(dir: &Path) -> Result<Tank, InputError> {
    let shown_dir = dir.display().to_string();
    if !dir.exists() {
        return Err(InputError::new(
            Location::file(shown_dir),
            InputErrorKind::Io(std::io::Error::new(
                std::io::ErrorKind::NotFound,
                "no such file or folder",
            )),
        ));
    }
    if !dir.is_dir() {
        return Err(InputError::new(
            Location::file(shown_dir),
            InputErrorKind::NotATankFolder,
        ));
    }
    let path = dir.join(TANK_FILE);
    if !path.is_file() {
        return Err(InputError::new(
            Location::file(shown_dir),
            InputErrorKind::NoTankFile,
        ));
    }
    let bytes = read_bytes(&path)?;
    tank_from_bytes(&path.display().to_string(), &bytes)
}

/// Validates the bytes of a tank file; `shown` names it in messages. Text that is not
/// UTF-8 is refused at the line and column of the first bad byte.
pub fn tank_from_bytes(shown: &str, bytes: &[u8]) -> Result<Tank, InputError> {
    let text = std::str::from_utf8(bytes).map_err(|e| {
        let offset = e.valid_up_to();
        let valid = String::from_utf8_lossy(&bytes[..offset]);
        InputError::new(
            Location::at_offset(shown, &valid, offset),
            InputErrorKind::NotUtf8 {
                column: None,
                byte: bytes.get(offset).copied(),
            },
        )
    })?;
    parse_tank(shown, text)
}

/// The survey files of a tank folder, sorted by name (none when there is no
/// surveys/ folder), and the other entries of surveys/ that are not read (so that a
/// survey saved as .xlsx or .txt is reported, not silently left out). Hidden entries
/// (names starting with '.') are skipped without a word.
pub fn survey_files(dir: &Path) -> Result<(Vec<PathBuf>, Vec<PathBuf>), InputError> {
    let folder = dir.join(SURVEY_DIR);
    if !folder.is_dir() {
        return Ok((Vec::new(), Vec::new()));
    }
    let entries = std::fs::read_dir(&folder).map_err(|e| {
        InputError::new(
            Location::file(folder.display().to_string()),
            InputErrorKind::Io(e),
        )
    })?;
    let mut files = Vec::new();
    let mut skipped = Vec::new();
    for entry in entries {
        let entry = entry.map_err(|e| {
            InputError::new(
                Location::file(folder.display().to_string()),
                InputErrorKind::Io(e),
            )
        })?;
        let path = entry.path();
        let is_csv = path
            .extension()
            .is_some_and(|x| x.eq_ignore_ascii_case("csv"));
        let hidden = path
            .file_name()
            .is_some_and(|n| n.to_string_lossy().starts_with('.'));
        if hidden {
            continue;
        }
        if is_csv && path.is_file() {
            files.push(path);
        } else {
            skipped.push(path);
        }
    }
    files.sort();
    skipped.sort();
    Ok((files, skipped))
}

/// The reading context of a tank.
pub fn context_of(tank: &Tank, today: NaiveDate) -> SurveyContext {
    SurveyContext {
        units: Some(tank.units),
        nominal: tank.courses.iter().map(|c| c.nominal_thickness).collect(),
        shell_height: Some(tank.shell_height()),
        in_service_since: tank.in_service_since,
        today,
    }
}

/// Loads a whole tank folder. `today` bounds the survey dates.
pub fn load_tank_dir(dir: &Path, today: NaiveDate) -> Result<TankFolder, InputError> {
    let tank = load_tank_file(dir)?;
    let ctx = context_of(&tank, today);
    let mut set = ReadingSet::default();
    let mut files = Vec::new();
    let (survey_paths, skipped) = survey_files(dir)?;
    for (i, path) in survey_paths.iter().enumerate() {
        let shown = path.display().to_string();
        let bytes = read_bytes(path)?;
        let info = read_survey(&shown, &bytes, i as u32, &ctx, &mut set.readings)?;
        set.files.push(shown);
        files.push(info);
    }
    let mut warnings: Vec<Warning> = skipped
        .iter()
        .map(|p| Warning::NotRead {
            path: p.display().to_string(),
            folder: p.is_dir(),
        })
        .collect();
    warnings.extend(remove_repeats(&tank, &mut set)?);
    Ok(TankFolder {
        dir: dir.display().to_string(),
        tank,
        readings: set,
        files,
        warnings,
    })
}

/// The same point on the same date twice: an error when the values differ (the
/// inspector must choose), a warning when they are equal (the repeat is counted once).
pub fn remove_repeats(tank: &Tank, set: &mut ReadingSet) -> Result<Vec<Warning>, InputError> {
    let mut first: HashMap<(&str, NaiveDate), usize> = HashMap::new();
    let mut repeats: Vec<(usize, usize)> = Vec::new();
    for (i, r) in set.readings.iter().enumerate() {
        let Some(point) = r.point.as_deref() else {
            continue;
        };
        match first.get(&(point, r.date)) {
            None => {
                first.insert((point, r.date), i);
            }
            Some(&j) => repeats.push((j, i)),
        }
    }
    let mut warnings = Vec::new();
    let mut drop = vec![false; set.readings.len()];
    for (j, i) in repeats {
        let (a, b): (&Reading, &Reading) = (&set.readings[j], &set.readings[i]);
        if a.thickness != b.thickness || a.course != b.course {
            return Err(InputError::new(
                Location::line(set.file_of(b.origin), b.origin.line),
                InputErrorKind::ConflictingDuplicate {
                    point: b.point.as_deref().unwrap_or("").to_string(),
                    date: b.date,
                    first: set.locate(a.origin),
                    first_value: format!(
                        "{} (course {})",
                        Shown::thickness(a.thickness, tank.units),
                        a.course
                    ),
                    value: format!(
                        "{} (course {})",
                        Shown::thickness(b.thickness, tank.units),
                        b.course
                    ),
                },
            ));
        }
        warnings.push(Warning::DuplicateReading {
            location: set.locate(b.origin),
            first: set.locate(a.origin),
            point: b.point.as_deref().unwrap_or("").to_string(),
            date: b.date,
        });
        drop[i] = true;
    }
    if drop.iter().any(|&d| d) {
        let mut k = 0;
        set.readings.retain(|_| {
            let keep = !drop[k];
            k += 1;
            keep
        });
    }
    Ok(warnings)
}
