//! Loads a tank folder: `tank.toml`, every `surveys/*.csv` and every `scans/*.csv`.
//!
//! [`stream_surveys`] reads the survey files one row at a time and hands each reading
//! on at once (through [`RepeatFilter`], which settles repeated points); nothing keeps
//! the rows unless the receiving [`ReadingSink`] does.

use std::path::{Path, PathBuf};

use super::error::{InputError, InputErrorKind, Location};
use super::scan_csv::read_scan;
use super::survey_csv::{SurveyContext, SurveyFileInfo, read_survey};
use super::tank_file::parse_tank;
use crate::calc::units::{Thickness, UnitSystem};
use crate::model::reading::{Origin, POINT_ROOM, PointNames, ReadingRef, ReadingSet, ReadingSink};
use crate::model::scan::Scan;
use crate::model::tank::Tank;
use crate::model::warning::{Shown, Warning};
use chrono::NaiveDate;

/// Name of the tank file in a tank folder.
pub const TANK_FILE: &str = "tank.toml";
/// Folder of survey files in a tank folder.
pub const SURVEY_DIR: &str = "surveys";
/// Folder of grid scans of local thin areas in a tank folder.
pub const SCAN_DIR: &str = "scans";

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
    let path = dir.join(TANK_FILE);
    // The file at once; only when it cannot be read is the folder looked at, to say
    // why.
    match read_small(&path) {
        Ok(bytes) => tank_from_bytes(&path.display().to_string(), &bytes),
        Err(e) => Err(why_no_tank_file(dir, &path, e)),
    }
}

/// The bytes of a small file (a tank file is a few kilobytes): read into room made
/// beforehand, without asking the file system for the size first.
fn read_small(path: &Path) -> std::io::Result<Vec<u8>> {
    use std::io::Read;
    let mut bytes = Vec::with_capacity(TANK_FILE_ROOM);
    // (Through `take`: `File`'s own `read_to_end` asks for the size first.)
    std::fs::File::open(path)?
        .take(u64::MAX)
        .read_to_end(&mut bytes)?;
    Ok(bytes)
}

/// Bytes made room for when a tank file is read (more are read when it is longer).
const TANK_FILE_ROOM: usize = 16 * 1024;

/// Why `dir`'s tank file at `path` could not be read (`e`).
#[cold]
fn why_no_tank_file(dir: &Path, path: &Path, e: std::io::Error) -> InputError {
    let shown_dir = dir.display().to_string();
    // One look at the folder (what `exists` and `is_dir` would each ask for).
    match std::fs::metadata(dir) {
        Err(_) => {
            return InputError::new(
                Location::file(shown_dir),
                InputErrorKind::Io(std::io::Error::new(
                    std::io::ErrorKind::NotFound,
                    "no such file or folder",
                )),
            );
        }
        Ok(m) if !m.is_dir() => {
            return InputError::new(Location::file(shown_dir), InputErrorKind::NotATankFolder);
        }
        Ok(_) => {}
    }
    if !path.is_file() {
        return InputError::new(Location::file(shown_dir), InputErrorKind::NoTankFile);
    }
    InputError::new(
        Location::file(path.display().to_string()),
        InputErrorKind::Io(e),
    )
}

/// Parses the bytes of a tank file; `shown` names it in messages.
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
    csv_files(dir, SURVEY_DIR)
}

/// The scan files of a tank folder, sorted by name, and the entries of scans/ that
/// are not read.
pub fn scan_files(dir: &Path) -> Result<(Vec<PathBuf>, Vec<PathBuf>), InputError> {
    csv_files(dir, SCAN_DIR)
}

/// Reads every grid scan of the tank folder `dir`.
pub fn read_scans(dir: &Path, tank: &Tank, today: NaiveDate) -> Result<Vec<Scan>, InputError> {
    let mut scans = Vec::new();
    for path in scan_files(dir)?.0 {
        let shown = path.display().to_string();
        let bytes = read_bytes(&path)?;
        scans.push(read_scan(&shown, &bytes, Some(tank), today)?);
    }
    Ok(scans)
}

/// The entries of `dir/sub` that are not read, as warnings.
pub fn not_read(skipped: &[PathBuf]) -> Vec<Warning> {
    skipped
        .iter()
        .map(|p| Warning::NotRead {
            path: p.display().to_string(),
            folder: p.is_dir(),
        })
        .collect()
}

/// The visible `*.csv` files of `dir/sub` and its other visible entries, both sorted.
fn csv_files(dir: &Path, sub: &str) -> Result<(Vec<PathBuf>, Vec<PathBuf>), InputError> {
    let folder = dir.join(sub);
    // The folder is listed at once: no folder (or a file by that name) holds no files.
    let entries = match std::fs::read_dir(&folder) {
        Ok(entries) => entries,
        Err(e) if e.kind() == std::io::ErrorKind::NotFound || !folder.is_dir() => {
            return Ok((Vec::new(), Vec::new()));
        }
        Err(e) => {
            return Err(InputError::new(
                Location::file(folder.display().to_string()),
                InputErrorKind::Io(e),
            ));
        }
    };
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
        // The entry's type as the folder listing gives it (no look at the file);
        // a symbolic link is followed, as `is_file` does.
        let is_file = match entry.file_type() {
            Ok(t) if !t.is_symlink() => t.is_file(),
            _ => path.is_file(),
        };
        if is_csv && is_file {
            files.push(path);
        } else {
            skipped.push(path);
        }
    }
    // (All in one folder: the order of their names, byte by byte, which is the order
    // of the paths, found without comparing the paths component by component.)
    files.sort_unstable_by(|a, b| a.as_os_str().cmp(b.as_os_str()));
    skipped.sort_unstable_by(|a, b| a.as_os_str().cmp(b.as_os_str()));
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

/// What reading a tank's survey files found, besides the readings themselves.
#[derive(Debug, Clone)]
pub struct SurveysRead {
    /// Files read, as displayed (index = `Origin::file`).
    pub files: Vec<String>,
    /// What each file held.
    pub infos: Vec<SurveyFileInfo>,
    /// Remarks made while reading (repeated rows).
    pub remarks: Vec<Warning>,
}

/// Reads every survey file of the tank folder `dir` (sorted by name), handing each
/// reading to `sink` as its row is parsed. Point ids are keyed by `points`; `today`
/// bounds the survey dates.
pub fn stream_surveys(
    dir: &Path,
    tank: &Tank,
    today: NaiveDate,
    points: &mut PointNames,
    sink: &mut impl ReadingSink,
) -> Result<SurveysRead, InputError> {
    let ctx = context_of(tank, today);
    let mut filter = RepeatFilter::new(tank.units, sink);
    let mut infos = Vec::new();
    let (paths, skipped) = survey_files(dir)?;
    // Room for the repeat check of the first file's points at once.
    filter.entries.reserve(POINT_ROOM);
    for (i, path) in paths.iter().enumerate() {
        let shown = path.display().to_string();
        let file = std::fs::File::open(path)
            .map_err(|e| InputError::new(Location::file(shown.clone()), InputErrorKind::Io(e)))?;
        filter.files.push(shown.clone());
        let info = read_survey(&shown, file, i as u32, &ctx, points, &mut filter)?;
        // The other files likely have as many rows: room for their repeat check at once.
        if i == 0 {
            filter.entries.reserve(info.rows * (paths.len() - 1));
        }
        infos.push(info);
    }
    let (files, repeats) = filter.finish()?;
    let mut remarks = not_read(&skipped);
    remarks.extend(repeats);
    Ok(SurveysRead {
        files,
        infos,
        remarks,
    })
}

/// Loads a whole tank folder, keeping every reading (for `strake check`, which lists
/// them by course and date). `today` bounds the survey dates.
pub fn load_tank_dir(dir: &Path, today: NaiveDate) -> Result<TankFolder, InputError> {
    let tank = load_tank_file(dir)?;
    let mut readings = Vec::new();
    let mut points = PointNames::default();
    let read = stream_surveys(dir, &tank, today, &mut points, &mut readings)?;
    let scans = read_scans(dir, &tank, today)?;
    Ok(TankFolder {
        dir: dir.display().to_string(),
        tank,
        readings: ReadingSet {
            files: read.files,
            readings,
            scans,
        },
        files: read.infos,
        warnings: read.remarks,
    })
}

/// The first reading of a point on a date.
#[derive(Debug, Clone, Copy)]
struct FirstReading {
    thickness: Thickness,
    course: u32,
    origin: Origin,
}

/// One (course, point, date) seen, linked to the one seen before it for the same point
/// key.
#[derive(Debug, Clone, Copy)]
struct Seen {
    date: NaiveDate,
    first: FirstReading,
    /// The previous entry of the same point key, or [`NO_ENTRY`].
    previous: u32,
}

/// The entries of one point key: the latest date among them and the last one added.
#[derive(Debug, Clone, Copy)]
struct PointEntries {
    latest: NaiveDate,
    last: u32,
}

/// No entry.
const NO_ENTRY: u32 = u32::MAX;

/// Settles repeated points while readings stream past, then hands them on.
///
/// The same point on the same date twice: an error when the values differ (the
/// inspector must choose), a warning when they are equal (the repeat is counted once
/// and not handed on). The error is kept until every file has been read, so that an
/// unreadable row anywhere is reported first, as when the files were read whole.
///
/// What is kept: one entry per (course, point, date), chained per point key (keys are
/// dense, 0, 1, 2, ... within a tank, see `PointNames`). Survey files list each
/// point once per date and come in date order, so a reading is nearly always later
/// than every entry of its point and is added at once; otherwise the point's few
/// entries (one per survey) are searched.
pub struct RepeatFilter<'s, S> {
    inner: &'s mut S,
    units: UnitSystem,
    /// Files read so far, as displayed (index = `Origin::file`).
    pub files: Vec<String>,
    by_key: Vec<PointEntries>,
    entries: Vec<Seen>,
    remarks: Vec<Warning>,
    conflict: Option<InputError>,
}

impl<'s, S: ReadingSink> RepeatFilter<'s, S> {
    /// A filter in front of `inner`, for a tank in `units`.
    pub fn new(units: UnitSystem, inner: &'s mut S) -> Self {
        RepeatFilter {
            inner,
            units,
            files: Vec::new(),
            by_key: Vec::with_capacity(POINT_ROOM),
            entries: Vec::new(),
            remarks: Vec::new(),
            conflict: None,
        }
    }

    fn locate(&self, origin: Origin) -> String {
        let file = self
            .files
            .get(origin.file as usize)
            .map_or("?", String::as_str);
        format!("{file}:{}", origin.line)
    }

    /// The files read and the remarks, or the first conflicting repeat.
    pub fn finish(self) -> Result<(Vec<String>, Vec<Warning>), InputError> {
        match self.conflict {
            Some(e) => Err(e),
            None => Ok((self.files, self.remarks)),
        }
    }
}

impl<S: ReadingSink> ReadingSink for RepeatFilter<'_, S> {
    fn accept(&mut self, r: &ReadingRef<'_>) {
        let Some(point) = r.point else {
            self.inner.accept(r);
            return;
        };
        // A point id names a location on its course: the same id on another course is
        // another point, so an entry matches on course and date.
        let slot = point.key.0 as usize;
        if self.by_key.len() <= slot {
            self.by_key.resize(
                slot + 1,
                PointEntries {
                    latest: NaiveDate::MIN,
                    last: NO_ENTRY,
                },
            );
        }
        let head = self.by_key[slot];
        let mut found = None;
        if head.last != NO_ENTRY && r.date <= head.latest {
            let mut i = head.last;
            while i != NO_ENTRY {
                let e = &self.entries[i as usize];
                if e.date == r.date && e.first.course == r.course {
                    found = Some(e.first);
                    break;
                }
                i = e.previous;
            }
        }
        let Some(a) = found else {
            self.by_key[slot] = PointEntries {
                latest: if head.last == NO_ENTRY {
                    r.date
                } else {
                    head.latest.max(r.date)
                },
                last: self.entries.len() as u32,
            };
            self.entries.push(Seen {
                date: r.date,
                first: FirstReading {
                    thickness: r.thickness,
                    course: r.course,
                    origin: r.origin,
                },
                previous: head.last,
            });
            self.inner.accept(r);
            return;
        };
        if a.thickness != r.thickness {
            if self.conflict.is_none() {
                self.conflict = Some(InputError::new(
                    Location::line(
                        self.files
                            .get(r.origin.file as usize)
                            .map_or("?", String::as_str),
                        r.origin.line,
                    ),
                    InputErrorKind::ConflictingDuplicate {
                        point: point.id.to_string(),
                        date: r.date,
                        first: self.locate(a.origin),
                        first_value: format!(
                            "{} (course {})",
                            Shown::thickness(a.thickness, self.units),
                            a.course
                        ),
                        value: format!(
                            "{} (course {})",
                            Shown::thickness(r.thickness, self.units),
                            r.course
                        ),
                    },
                ));
            }
            return;
        }
        self.remarks.push(Warning::DuplicateReading {
            location: self.locate(r.origin),
            first: self.locate(a.origin),
            point: point.id.to_string(),
            date: r.date,
        });
    }
}
