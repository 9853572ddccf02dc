//! Finds the tank folders of a fleet: every folder below the given one that holds a
//! tank.toml (the given folder itself included), a tank folder inside another one too
//! (none is left out without a word). A tank folder's surveys/ and scans/ are not
//! searched (their files are the tank's); hidden folders (name starting with `.`) are
//! skipped. Symbolic links are followed, and a loop is reported, not walked.

use std::path::{Path, PathBuf};

use super::error::{InputError, InputErrorKind, Location};
use super::tank_dir::{SCAN_DIR, SURVEY_DIR, TANK_FILE};

/// What the search found, in path order.
#[derive(Debug, Default)]
pub struct FoundTanks {
    /// Tank folders.
    pub tanks: Vec<PathBuf>,
    /// Folders that could not be searched, with the error.
    pub unreadable: Vec<(PathBuf, InputError)>,
}

fn io_error(path: &Path, e: std::io::Error) -> InputError {
    InputError::new(
        Location::file(path.display().to_string()),
        InputErrorKind::Io(e),
    )
}

/// One thing the search found.
#[derive(Debug)]
pub enum Found {
    /// A tank folder.
    Tank(PathBuf),
    /// A folder that could not be searched, with the error.
    Unreadable(PathBuf, InputError),
}

/// The search for tank folders below a folder, one find at a time in path order (so
/// that the tanks found first can be assessed while the search goes on).
pub struct TankWalk {
    root: PathBuf,
    walk: walkdir::IntoIter,
    /// The tank folder found last.
    last_tank: Option<PathBuf>,
}

/// The search for tank folders below `root` (an error when `root` is not a folder).
pub fn walk_tank_dirs(root: &Path) -> Result<TankWalk, InputError> {
    let meta = std::fs::metadata(root).map_err(|e| io_error(root, e))?;
    if !meta.is_dir() {
        return Err(io_error(
            root,
            std::io::Error::new(std::io::ErrorKind::NotADirectory, "not a folder"),
        ));
    }
    Ok(TankWalk {
        root: root.to_path_buf(),
        walk: walkdir::WalkDir::new(root)
            .follow_links(true)
            .sort_by_file_name()
            .into_iter(),
        last_tank: None,
    })
}

impl Iterator for TankWalk {
    type Item = Found;

    fn next(&mut self) -> Option<Found> {
        while let Some(entry) = self.walk.next() {
            let entry = match entry {
                Ok(e) => e,
                Err(e) => {
                    let path = e.path().unwrap_or(&self.root).to_path_buf();
                    let message = e.to_string();
                    let io = e
                        .into_io_error()
                        .unwrap_or_else(|| std::io::Error::other(message));
                    let error = io_error(&path, io);
                    return Some(Found::Unreadable(path, error));
                }
            };
            if !entry.file_type().is_dir() {
                continue;
            }
            let hidden = entry.depth() > 0
                && entry
                    .file_name()
                    .to_str()
                    .is_some_and(|n| n.starts_with('.'));
            // The survey and scan folders of a tank folder hold its files, not tanks.
            // (The walk gives a folder before what is in it: the tank folder found
            // last is most often the parent, and needs no second look.)
            let tank_files = entry.depth() > 0
                && (entry.file_name() == SURVEY_DIR || entry.file_name() == SCAN_DIR)
                && entry.path().parent().is_some_and(|p| {
                    self.last_tank.as_deref() == Some(p) || p.join(TANK_FILE).is_file()
                });
            if hidden || tank_files {
                self.walk.skip_current_dir();
                continue;
            }
            if entry.path().join(TANK_FILE).is_file() {
                let dir = entry.into_path();
                self.last_tank = Some(dir.clone());
                return Some(Found::Tank(dir));
            }
        }
        None
    }
}

/// The error of a search that found nothing at all.
pub fn no_tank_folders(root: &Path) -> InputError {
    InputError::new(
        Location::file(root.display().to_string()),
        InputErrorKind::NoTankFolders,
    )
}

/// Every tank folder below `root`.
pub fn find_tank_dirs(root: &Path) -> Result<FoundTanks, InputError> {
    let mut found = FoundTanks::default();
    for f in walk_tank_dirs(root)? {
        match f {
            Found::Tank(dir) => found.tanks.push(dir),
            Found::Unreadable(path, e) => found.unreadable.push((path, e)),
        }
    }
    if found.tanks.is_empty() && found.unreadable.is_empty() {
        return Err(no_tank_folders(root));
    }
    Ok(found)
}
