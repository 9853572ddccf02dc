//! "These files, these arguments -> this stdout, stderr and exit code."

use std::path::{Path, PathBuf};

use assert_cmd::Command;
use tempfile::TempDir;

/// The repository root.
pub fn root() -> PathBuf {
    PathBuf::from(env!("CARGO_MANIFEST_DIR"))
}

/// A sample tank folder.
pub fn sample(name: &str) -> PathBuf {
    root().join("sample-inspections").join(name)
}

/// What a run printed.
#[derive(Debug)]
pub struct Run {
    pub stdout: String,
    pub stderr: String,
    pub code: i32,
}

/// Runs strake with `args` (colour off, so output is plain text).
pub fn strake<I, S>(args: I) -> Run
where
    I: IntoIterator<Item = S>,
    S: AsRef<std::ffi::OsStr>,
{
    strake_at(&root(), args)
}

/// Runs strake with `args` in the working folder `cwd`.
pub fn strake_at<I, S>(cwd: &Path, args: I) -> Run
where
    I: IntoIterator<Item = S>,
    S: AsRef<std::ffi::OsStr>,
{
    let out = Command::cargo_bin("strake")
        .expect("binary built")
        .current_dir(cwd)
        .env("NO_COLOR", "1")
        .args(args)
        .output()
        .expect("strake runs");
    Run {
        stdout: String::from_utf8_lossy(&out.stdout).into_owned(),
        stderr: String::from_utf8_lossy(&out.stderr).into_owned(),
        code: out.status.code().unwrap_or(-1),
    }
}

/// A tank folder in a temporary directory.
pub struct TankFixture {
    pub dir: TempDir,
}

impl TankFixture {
    /// A folder with this tank.toml.
    pub fn new(tank_toml: &str) -> Self {
        let dir = tempfile::tempdir().expect("temp dir");
        std::fs::write(dir.path().join("tank.toml"), tank_toml).expect("write tank.toml");
        TankFixture { dir }
    }
    /// Adds surveys/<name> with these bytes.
    pub fn survey(self, name: &str, content: impl AsRef<[u8]>) -> Self {
        let surveys = self.dir.path().join("surveys");
        std::fs::create_dir_all(&surveys).expect("surveys dir");
        std::fs::write(surveys.join(name), content).expect("write survey");
        self
    }
    /// Adds scans/<name> with these bytes.
    pub fn scan(self, name: &str, content: impl AsRef<[u8]>) -> Self {
        let scans = self.dir.path().join("scans");
        std::fs::create_dir_all(&scans).expect("scans dir");
        std::fs::write(scans.join(name), content).expect("write scan");
        self
    }
    /// The folder.
    pub fn path(&self) -> &Path {
        self.dir.path()
    }
    /// `path/rel` as displayed in messages.
    pub fn shown(&self, rel: &str) -> String {
        self.dir.path().join(rel).display().to_string()
    }
}

/// A small SI tank: D 30 m, three 2.5 m A36 courses (lower two S = 171.6 MPa,
/// upper 188.8 MPa), level 7.0 m, SG 0.85, in service 2000-01-01.
pub const SMALL_SI_TANK: &str = r#"
id = "FX-1"
name = "fixture tank"
units = "SI"
diameter = 30.0
max_fill_height = 7.0
specific_gravity = 0.85
in_service_since = 2000-01-01

[[course]]
height = 2.5
nominal_thickness = 10.0
material = "A36"

[[course]]
height = 2.5
nominal_thickness = 8.0
material = "A36"

[[course]]
height = 2.5
nominal_thickness = 6.0
material = "A36"
"#;

/// Parses JSON output.
pub fn json(run: &Run) -> serde_json::Value {
    serde_json::from_str(&run.stdout).unwrap_or_else(|e| panic!("not JSON ({e}):\n{}", run.stdout))
}

/// A number at a JSON pointer.
pub fn num(v: &serde_json::Value, pointer: &str) -> f64 {
    v.pointer(pointer)
        .and_then(serde_json::Value::as_f64)
        .unwrap_or_else(|| panic!("no number at {pointer} in {v}"))
}

/// Relative closeness.
pub fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * b.abs().max(1e-12)
}
