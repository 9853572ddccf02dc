//! The one writer: text to standard output (with or without colour), files written
//! atomically (a temporary file in the same folder, then a rename).

use std::io::{self, Write};
use std::path::Path;

/// When to colour terminal output.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ColorWhen {
    /// On a terminal, unless NO_COLOR is set.
    Auto,
    /// Always.
    Always,
    /// Never.
    Never,
}

/// Writes `text` to standard output. Styles are kept, or stripped when colour is off
/// (anstream honours NO_COLOR and CLICOLOR_FORCE, and strips when not a terminal).
pub fn print(text: &str, color: ColorWhen) -> io::Result<()> {
    let choice = match color {
        ColorWhen::Auto => anstream::ColorChoice::Auto,
        ColorWhen::Always => anstream::ColorChoice::Always,
        ColorWhen::Never => anstream::ColorChoice::Never,
    };
    let mut out = anstream::AutoStream::new(io::stdout().lock(), choice);
    out.write_all(text.as_bytes())?;
    out.flush()
}

/// Writes each warning to standard error as `warning: <sentence>`, one a line (for
/// outputs, such as CSV, that have no place for them).
pub fn warnings_to_stderr(warnings: &[crate::model::warning::Warning]) -> io::Result<()> {
    let mut err = io::stderr().lock();
    for w in warnings {
        writeln!(err, "warning: {w}")?;
    }
    err.flush()
}

/// Writes the caution to standard error as one `caution: <text>` line: CSV output has
/// no place for it, and every output carries it.
pub fn caution_to_stderr() -> io::Result<()> {
    let mut err = io::stderr().lock();
    writeln!(err, "caution: {}", crate::report::caution::CAUTION)?;
    err.flush()
}

/// Writes `bytes` to `path` atomically: a reader sees the old file or the new one,
/// never a part. The temporary file sits beside the target and is renamed over it.
pub fn write_atomic(path: &Path, bytes: &[u8]) -> io::Result<()> {
    let dir = path
        .parent()
        .filter(|p| !p.as_os_str().is_empty())
        .unwrap_or(Path::new("."));
    let name = path
        .file_name()
        .ok_or_else(|| io::Error::new(io::ErrorKind::InvalidInput, "no file name"))?;
    let tmp = dir.join(format!(
        ".{}.tmp-{}",
        name.to_string_lossy(),
        std::process::id()
    ));
    let result = (|| {
        let mut f = std::fs::File::create(&tmp)?;
        f.write_all(bytes)?;
        f.sync_all()?;
        std::fs::rename(&tmp, path)
    })();
    if result.is_err() {
        let _ = std::fs::remove_file(&tmp);
    }
    result
}
