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
///
/// Depth first, each folder's entries in name order, a folder before what is in it.
/// Each folder is listed once: the listing says whether it holds a tank.toml and
/// which folders to search next, so a tank folder costs one listing (its surveys/ is
/// listed by the tank's reader, not here).
pub struct TankWalk {
    /// Folders still to search, with their depth below the root; the next on top.
    pending: Vec<(PathBuf, usize)>,
    /// Finds of the folder searched last, not yet handed out (in order, reversed).
    ready: Vec<Found>,
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
        pending: vec![(root.to_path_buf(), 0)],
        ready: Vec::new(),
    })
}

/// What a listing says an entry is, a symbolic link followed.
enum Kind {
    Folder,
    File,
    Other,
}

impl TankWalk {
    /// Searches `dir`: queues its finds (the folder itself when it holds a tank, then
    /// entries that could not be looked at) and its folders to search.
    fn search(&mut self, dir: PathBuf, depth: usize) {
        let mut finds = Vec::new();
        let listing = std::fs::read_dir(&dir).and_then(|entries| {
            entries
                .map(|e| e.map(|e| (e.file_name(), e.path(), e.file_type())))
                .collect::<std::io::Result<Vec<_>>>()
        });
        let mut entries = match listing {
            Ok(entries) => entries,
            Err(e) => {
                // A folder that cannot be listed may still hold a tank file that can
                // be read; either way the folder is reported.
                if dir.join(TANK_FILE).is_file() {
                    finds.push(Found::Tank(dir.clone()));
                }
                let error = io_error(&dir, e);
                finds.push(Found::Unreadable(dir, error));
                self.queue(finds);
                return;
            }
        };
        entries.sort_by(|a, b| a.0.cmp(&b.0));
        let mut folders = Vec::new();
        let mut is_tank = false;
        for (name, path, file_type) in entries {
            if name.to_str().is_some_and(|n| n.starts_with('.')) {
                // (A hidden tank file is no tank file either.)
                continue;
            }
            let linked = file_type.as_ref().is_ok_and(std::fs::FileType::is_symlink);
            let kind = match file_type {
                Ok(t) if t.is_dir() => Kind::Folder,
                Ok(t) if t.is_file() => Kind::File,
                Ok(t) if t.is_symlink() => match followed(&path) {
                    Ok(kind) => kind,
                    Err(e) => {
                        let error = io_error(&path, e);
                        finds.push(Found::Unreadable(path, error));
                        continue;
                    }
                },
                Ok(_) => Kind::Other,
                Err(e) => {
                    let error = io_error(&path, e);
                    finds.push(Found::Unreadable(path, error));
                    continue;
                }
            };
            match kind {
                Kind::File if name == TANK_FILE => is_tank = true,
                Kind::Folder => folders.push((name, path, linked)),
                _ => {}
            }
        }
        if is_tank {
            finds.insert(0, Found::Tank(dir.clone()));
        }
        // (Pushed last first, so that the first is searched next.)
        for (name, path, linked) in folders.into_iter().rev() {
            // The survey and scan folders of a tank folder hold its files, not tanks.
            if is_tank && (name == SURVEY_DIR || name == SCAN_DIR) {
                continue;
            }
            if let Some(ancestor) = linked.then(|| loop_to(&path, &dir, depth)).flatten() {
                let error = io_error(
                    &path,
                    std::io::Error::other(format!(
                        "a folder loop: {} leads back to {}",
                        path.display(),
                        ancestor.display()
                    )),
                );
                finds.push(Found::Unreadable(path, error));
                continue;
            }
            self.pending.push((path, depth + 1));
        }
        self.queue(finds);
    }

    fn queue(&mut self, finds: Vec<Found>) {
        self.ready.extend(finds.into_iter().rev());
    }
}

/// What a symbolic link leads to.
fn followed(path: &Path) -> std::io::Result<Kind> {
    let meta = std::fs::metadata(path)?;
    Ok(if meta.is_dir() {
        Kind::Folder
    } else if meta.is_file() {
        Kind::File
    } else {
        Kind::Other
    })
}

/// The folder among `parent` and the `depth` folders above it (the ones being
/// searched) that the symbolic link `path` leads to, if any: searching it again would
/// never end. (Only a link can lead there, so only links are looked at.)
fn loop_to(path: &Path, parent: &Path, depth: usize) -> Option<PathBuf> {
    parent
        .ancestors()
        .take(depth + 1)
        .find(|a| same_file::is_same_file(path, a).unwrap_or(false))
        .map(Path::to_path_buf)
}

impl Iterator for TankWalk {
    type Item = Found;

    fn next(&mut self) -> Option<Found> {
        loop {
            if let Some(found) = self.ready.pop() {
                return Some(found);
            }
            let (dir, depth) = self.pending.pop()?;
            self.search(dir, depth);
        }
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

#[cfg(test)]
mod tests {
    use std::fs;

    use super::*;

    /// The search as the walkdir crate does it (the reference: an independent,
    /// general-purpose directory walker, following links and reporting loops, with
    /// the same rules for what is a tank and what is not searched).
    fn reference(root: &Path) -> (Vec<PathBuf>, Vec<PathBuf>) {
        let (mut tanks, mut unreadable) = (Vec::new(), Vec::new());
        let mut walk = walkdir::WalkDir::new(root)
            .follow_links(true)
            .sort_by_file_name()
            .into_iter();
        while let Some(entry) = walk.next() {
            let entry = match entry {
                Ok(e) => e,
                Err(e) => {
                    unreadable.push(e.path().unwrap_or(root).to_path_buf());
                    continue;
                }
            };
            if !entry.file_type().is_dir() {
                continue;
            }
            let name = entry.file_name().to_string_lossy();
            let parent_is_tank = entry
                .path()
                .parent()
                .is_some_and(|p| p.join(TANK_FILE).is_file());
            if entry.depth() > 0
                && (name.starts_with('.')
                    || ((name == SURVEY_DIR || name == SCAN_DIR) && parent_is_tank))
            {
                walk.skip_current_dir();
                continue;
            }
            if entry.path().join(TANK_FILE).is_file() {
                tanks.push(entry.path().to_path_buf());
            }
        }
        unreadable.sort();
        (tanks, unreadable)
    }

    fn tank(dir: &Path) {
        fs::create_dir_all(dir.join(SURVEY_DIR)).unwrap();
        fs::write(dir.join(TANK_FILE), "id = \"x\"\n").unwrap();
    }

    /// Every kind of folder the search meets, found as the reference finds it: tanks
    /// in path order (a tank inside a tank, one reached through a link), nothing from
    /// surveys/, scans/ or hidden folders, a tank.toml that is a folder ignored, a
    /// loop and a broken link reported, never followed.
    #[test]
    fn finds_what_a_directory_walker_finds() {
        let dir = tempfile::tempdir().unwrap();
        let root = dir.path().join("fleet");
        tank(&root.join("b-site/t2"));
        tank(&root.join("a-site/t1"));
        tank(&root.join("a-site/t1/archive/t1-old"));
        tank(&root.join("a-site/t1/surveys/not-a-tank"));
        tank(&root.join("a-site/t1/scans/not-a-tank"));
        tank(&root.join("a-site/.trash/t0"));
        tank(&root.join("a-site/t10"));
        fs::create_dir_all(root.join("c-site/odd/tank.toml")).unwrap();
        tank(&dir.path().join("elsewhere/t3"));
        #[cfg(unix)]
        {
            use std::os::unix::fs::symlink;
            symlink(dir.path().join("elsewhere"), root.join("d-linked")).unwrap();
            symlink(&root, root.join("b-site/loop")).unwrap();
            symlink(root.join("gone"), root.join("c-site/broken")).unwrap();
        }
        let mut found = find_tank_dirs(&root).unwrap();
        let mut unreadable: Vec<PathBuf> = found.unreadable.drain(..).map(|(p, _)| p).collect();
        unreadable.sort();
        let (tanks, expected_unreadable) = reference(&root);
        assert_eq!(found.tanks, tanks);
        assert_eq!(unreadable, expected_unreadable);
        let names: Vec<String> = found
            .tanks
            .iter()
            .map(|t| t.strip_prefix(&root).unwrap().display().to_string())
            .collect();
        #[cfg(unix)]
        {
            assert_eq!(
                names,
                [
                    "a-site/t1",
                    "a-site/t1/archive/t1-old",
                    "a-site/t10",
                    "b-site/t2",
                    "d-linked/t3"
                ]
            );
            assert_eq!(
                unreadable,
                [root.join("b-site/loop"), root.join("c-site/broken")]
            );
        }
    }

    /// The root itself may be the tank; a file is no fleet folder.
    #[test]
    fn the_root_may_be_the_tank() {
        let dir = tempfile::tempdir().unwrap();
        tank(dir.path());
        let found = find_tank_dirs(dir.path()).unwrap();
        assert_eq!(found.tanks, [dir.path().to_path_buf()]);
        assert!(find_tank_dirs(&dir.path().join(TANK_FILE)).is_err());
    }
}
