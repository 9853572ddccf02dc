//! The report folder of `assess --out`: index.html, the PNG charts (the four overview
//! charts, a heat map per grid scan, the Gumbel plot, the design check),
//! courses.csv, points.csv and result.json. Every file is rendered from the one result
//! model (and the chart series), then written atomically; the same input gives the
//! same bytes.

use std::path::{Path, PathBuf};

use crate::input::survey_csv::SurveyFileInfo;
use crate::model::result::Assessment;
use crate::model::series::ReportSeries;
use crate::report::chart::{self, ChartError, Inputs};
use crate::report::view::View;
use crate::report::{csv_out, html, json, write};

/// One file of the report.
#[derive(Debug, Clone, PartialEq)]
pub struct ReportFile {
    /// File name inside the report folder.
    pub name: String,
    /// Its bytes.
    pub bytes: Vec<u8>,
}

/// Why the report could not be made.
#[derive(Debug, thiserror::Error)]
pub enum ReportError {
    /// A chart failed to draw.
    #[error(transparent)]
    Chart(#[from] ChartError),
    /// CSV rendering failed.
    #[error("cannot render CSV: {0}")]
    Csv(#[from] csv::Error),
    /// A file could not be written.
    #[error("cannot write {path}: {source}")]
    Write {
        /// The file.
        path: String,
        /// Why.
        source: std::io::Error,
    },
    /// The folder is one the tank's inputs are read from.
    #[error(
        "{path}: the report folder must not be the tank's surveys folder (its CSV files \
         would be read as surveys); choose another folder with --out DIR"
    )]
    IntoInputs {
        /// The folder.
        path: String,
    },
}

/// What a report shows beyond the result model.
#[derive(Debug, Clone, Copy)]
pub struct ReportContext<'a> {
    /// The survey files read, as the input layer described them.
    pub files: &'a [SurveyFileInfo],
    /// The generation time, with `--stamp` only.
    pub stamp: Option<&'a str>,
}

/// Renders every file of the report, in a fixed order.
pub fn report_files(
    a: &Assessment,
    s: &ReportSeries,
    v: &View,
    ctx: ReportContext,
) -> Result<Vec<ReportFile>, ReportError> {
    let charts = chart::render_all(Inputs { a, s, v })?;
    let mut files = vec![ReportFile {
        name: "index.html".into(),
        bytes: html::render(a, s, v, &charts, ctx).into_bytes(),
    }];
    for c in charts {
        files.push(ReportFile {
            name: c.file,
            bytes: c.png,
        });
    }
    files.push(ReportFile {
        name: "courses.csv".into(),
        bytes: csv_out::courses_csv(a, v)?.into_bytes(),
    });
    files.push(ReportFile {
        name: "points.csv".into(),
        bytes: csv_out::points_csv(a, v)?.into_bytes(),
    });
    files.push(ReportFile {
        name: "result.json".into(),
        bytes: json::render(a, v).into_bytes(),
    });
    Ok(files)
}

/// Writes `files` into `dir` (created when missing), each atomically. `surveys` is
/// the tank's surveys folder, which the report must never be written into.
pub fn write_folder(dir: &Path, surveys: &Path, files: &[ReportFile]) -> Result<(), ReportError> {
    let shown = dir.display().to_string();
    if let (Ok(a), Ok(b)) = (dir.canonicalize(), surveys.canonicalize())
        && a == b
    {
        return Err(ReportError::IntoInputs { path: shown });
    }
    std::fs::create_dir_all(dir).map_err(|source| ReportError::Write {
        path: shown.clone(),
        source,
    })?;
    for f in files {
        let path = dir.join(&f.name);
        write::write_atomic(&path, &f.bytes).map_err(|source| ReportError::Write {
            path: path.display().to_string(),
            source,
        })?;
    }
    Ok(())
}

/// Longest folder name made from a tank id.
const MAX_FOLDER_NAME: usize = 64;

/// A tank id made safe as one folder name: ASCII letters, digits, `-`, `_` and `.`
/// are kept, every other character becomes `_`, leading dots become `_` (so `..`
/// and hidden names cannot occur), and the name is cut to 64 characters. An id
/// like `../x` or `a/b` can therefore never point outside the folder it is put in.
pub fn safe_folder_name(id: &str) -> String {
    let mut name: String = id
        .trim()
        .chars()
        .map(|c| {
            if c.is_ascii_alphanumeric() || matches!(c, '-' | '_' | '.') {
                c
            } else {
                '_'
            }
        })
        .take(MAX_FOLDER_NAME)
        .collect();
    let dots = name.chars().take_while(|c| *c == '.').count();
    name.replace_range(..dots, &"_".repeat(dots));
    if name.is_empty() {
        name.push_str("tank");
    }
    name
}

/// The default report folder of a tank: `reports/<safe id>/`.
pub fn default_folder(id: &str) -> PathBuf {
    Path::new("reports").join(safe_folder_name(id))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ids_become_one_safe_folder_name() {
        assert_eq!(safe_folder_name("KR-T12"), "KR-T12");
        assert_eq!(safe_folder_name("../x"), "___x");
        assert_eq!(safe_folder_name("a/b"), "a_b");
        assert_eq!(safe_folder_name(".."), "__");
        assert_eq!(safe_folder_name("C:\\tanks\\T 1"), "C__tanks_T_1");
        assert_eq!(safe_folder_name("<script>"), "_script_");
        assert_eq!(safe_folder_name("Tänk 7"), "T_nk_7");
        assert_eq!(safe_folder_name("   "), "tank");
        assert_eq!(safe_folder_name(&"x".repeat(100)).len(), MAX_FOLDER_NAME);
        for id in ["../x", "a/b", "..", "/etc", "x/../../y"] {
            let p = default_folder(id);
            let parts: Vec<_> = p.components().collect();
            assert_eq!(parts.len(), 2, "{id}: {p:?}");
            assert!(
                matches!(parts[1], std::path::Component::Normal(_)),
                "{id}: {p:?}"
            );
        }
    }
}
