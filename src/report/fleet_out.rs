//! The fleet report folder of `strake fleet DIR --out [OUTDIR]`: the fleet page
//! (`index.html`) and its two PNG charts in OUTDIR, and each assessed tank's own report
//! folder (as `assess --out` writes it) in `OUTDIR/<folder name>/`. Every file is
//! written atomically; the same input gives the same bytes.

use std::collections::HashSet;
use std::path::{Path, PathBuf};

use crate::calc::units::UnitSystem;
use crate::model::fleet::{Fleet, FleetSeries};
use crate::report::chart::ChartError;
use crate::report::chart::fleet::{DUE_FILE, LIFE_FILE, render_fleet};
use crate::report::folder::safe_folder_name;
use crate::report::{fleet_html, write};

/// The fleet page.
pub const PAGE: &str = "index.html";

/// The files of the fleet page itself, in OUTDIR: no tank folder is given one of these
/// names.
pub const FLEET_FILES: [&str; 3] = [PAGE, DUE_FILE, LIFE_FILE];

/// The default fleet report folder: `reports/fleet/`.
pub fn default_folder() -> PathBuf {
    Path::new("reports").join("fleet")
}

/// Why the fleet page could not be made.
#[derive(Debug, thiserror::Error)]
pub enum FleetOutError {
    /// A chart failed to draw.
    #[error(transparent)]
    Chart(#[from] ChartError),
    /// A file or folder could not be written.
    #[error("cannot write {path}: {source}")]
    Write {
        /// The file.
        path: String,
        /// Why.
        source: std::io::Error,
    },
    /// The folder lies in a folder the tanks' inputs are read from.
    #[error(
        "{path}: the fleet report folder must not be inside a tank's input folder {inputs} \
         (its files would be read as inputs, or reported as files not read); choose another \
         folder with --out DIR"
    )]
    IntoInputs {
        /// The report folder.
        path: String,
        /// The input folder it lies in.
        inputs: String,
    },
}

/// A report folder name for each tank, in the order given (`None` where the tank id
/// is not known, as when its tank.toml cannot be read): the tank id made safe as a
/// folder name ([`safe_folder_name`]); a name already taken, compared without regard
/// to case (so that two tanks stay apart on a file system that ignores case) and
/// including the fleet page's own files, gets `-2`, `-3`, ... The names depend only
/// on the ids and their order.
pub fn report_names(ids: &[Option<&str>]) -> Vec<Option<String>> {
    let mut taken: HashSet<String> = FLEET_FILES.iter().map(|f| f.to_ascii_lowercase()).collect();
    ids.iter()
        .map(|id| {
            id.map(|id| {
                let base = safe_folder_name(id);
                let mut name = base.clone();
                let mut n = 2;
                while !taken.insert(name.to_ascii_lowercase()) {
                    name = format!("{base}-{n}");
                    n += 1;
                }
                name
            })
        })
        .collect()
}

/// Renders the fleet page and its charts and writes them into `dir` (created when
/// missing), each file atomically. Returns the number of files written.
pub fn write_fleet_page(
    dir: &Path,
    fleet: &Fleet,
    series: &FleetSeries,
    units: Option<UnitSystem>,
) -> Result<usize, FleetOutError> {
    let charts = render_fleet(series)?;
    let page = fleet_html::render(fleet, series, &charts, units);
    let mut files: Vec<(&str, &[u8])> = vec![(PAGE, page.as_bytes())];
    files.extend(charts.iter().map(|c| (c.file.as_str(), c.png.as_slice())));
    std::fs::create_dir_all(dir).map_err(|source| FleetOutError::Write {
        path: dir.display().to_string(),
        source,
    })?;
    for (name, bytes) in &files {
        let path = dir.join(name);
        write::write_atomic(&path, bytes).map_err(|source| FleetOutError::Write {
            path: path.display().to_string(),
            source,
        })?;
    }
    Ok(files.len())
}

/// `path` as the file system would resolve it, also when it does not exist yet: its
/// nearest existing ancestor made canonical, with the rest appended.
pub fn resolved(path: &Path) -> PathBuf {
    let mut rest = Vec::new();
    let mut p = path.to_path_buf();
    loop {
        if let Ok(c) = p.canonicalize() {
            return rest
                .iter()
                .rev()
                .fold(c, |acc: PathBuf, part| acc.join(part));
        }
        match (p.file_name().map(|n| n.to_os_string()), p.parent()) {
            (Some(name), Some(parent)) => {
                rest.push(name);
                p = if parent.as_os_str().is_empty() {
                    PathBuf::from(".")
                } else {
                    parent.to_path_buf()
                };
            }
            _ => return path.to_path_buf(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Distinct ids keep their safe names; a repeated id, the same id in another case,
    /// an id that becomes the same safe name and an id named like a fleet page file
    /// each get the next free suffix, in order.
    #[test]
    fn names_are_unique_and_follow_the_order() {
        let names = report_names(&[
            Some("KR-T12"),
            Some("KR-T03"),
            Some("KR-T12"),
            None,
            Some("kr-t12"),
            Some("KR T12"),
            Some("KR_T12"),
            Some("index.html"),
            Some("../x"),
            Some("KR-T12-2"),
        ]);
        let names: Vec<Option<&str>> = names.iter().map(Option::as_deref).collect();
        assert_eq!(
            names,
            [
                Some("KR-T12"),
                Some("KR-T03"),
                Some("KR-T12-2"),
                None,
                Some("kr-t12-3"),
                Some("KR_T12"),
                Some("KR_T12-2"),
                Some("index.html-2"),
                Some("___x"),
                Some("KR-T12-2-2"),
            ]
        );
    }

    #[test]
    fn resolved_paths_need_not_exist() {
        let tmp = tempfile::tempdir().expect("temp");
        let base = tmp.path().canonicalize().expect("canonical");
        assert_eq!(resolved(&tmp.path().join("a/b")), base.join("a").join("b"));
        assert_eq!(resolved(tmp.path()), base);
    }
}
