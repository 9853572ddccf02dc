//! One file per subcommand: glue from options to input, calculation and output.

pub mod assess;
pub mod check;
pub mod fill_height;
pub mod fleet;
pub mod required;

use std::path::Path;

use chrono::NaiveDate;

use crate::Error;
use crate::calc::assess::{AssessOptions, assess_tally};
use crate::calc::tally::Tally;
use crate::calc::units::{Length, UnitSystem};
use crate::cli::{ColorArg, Format, TankArgs, UnitsArg};
use crate::input::error::{InputError, InputErrorKind, Location};
use crate::input::tank_dir::{load_tank_file, read_scans, stream_surveys};
use crate::model::reading::PointNames;
use crate::model::result::Assessment;
use crate::model::tank::Tank;
use crate::report::write::ColorWhen;

/// Options every command shares.
#[derive(Debug, Clone, Copy)]
pub struct Global {
    /// Print in this unit system.
    pub units: Option<UnitSystem>,
    /// Output format.
    pub format: Format,
    /// Shorter output.
    pub quiet: bool,
    /// Colour.
    pub color: ColorWhen,
}

impl Global {
    /// From the parsed command line.
    pub fn new(units: Option<UnitsArg>, format: Format, quiet: bool, color: ColorArg) -> Self {
        Global {
            units: units.map(|u| match u {
                UnitsArg::Si => UnitSystem::Si,
                UnitsArg::Usc => UnitSystem::Usc,
            }),
            format,
            quiet,
            color: match color {
                ColorArg::Auto => ColorWhen::Auto,
                ColorArg::Always => ColorWhen::Always,
                ColorArg::Never => ColorWhen::Never,
            },
        }
    }
}

/// Today's date on this machine: no survey may be dated later.
pub fn today() -> NaiveDate {
    chrono::Local::now().date_naive()
}

/// Loads a tank folder and assesses it with what-if values.
pub fn load_and_assess(
    args: &TankArgs,
    specific_gravity: Option<f64>,
    fill_height: Option<f64>,
) -> Result<Assessment, Error> {
    let options = AssessOptions {
        as_of: args.as_of,
        specific_gravity,
        fill_height: fill_height.map(Length),
        skip_points: false,
    };
    assess_dir(&args.dir, today(), options)
}

/// Reads a tank folder and assesses it. The survey files stream through a [`Tally`]
/// (nothing per reading is kept) and the tally is dropped on return, so memory is
/// that of one tank's courses, survey dates and points. `today` bounds survey dates.
pub fn assess_dir(
    dir: &Path,
    today: NaiveDate,
    options: AssessOptions,
) -> Result<Assessment, Error> {
    let tank = load_tank_file(dir)?;
    assess_tank(dir, &tank, today, options)
}

/// [`assess_dir`] for a tank whose tank.toml is already read.
pub fn assess_tank(
    dir: &Path,
    tank: &Tank,
    today: NaiveDate,
    options: AssessOptions,
) -> Result<Assessment, Error> {
    let mut tally = Tally::new(tank, options);
    let mut names = PointNames::default();
    let read = stream_surveys(dir, tank, today, &mut names, &mut tally)?;
    let scans = read_scans(dir, tank, today)?;
    if let Some(h) = options.fill_height {
        let shell = tank.shell_height();
        if h.0 > shell.0 + 1e-9 {
            let lu = tank.units.length_unit();
            return Err(Error::Input(InputError::new(
                Location::file(display(dir)),
                InputErrorKind::InvalidValue {
                    key: "option --fill-height".into(),
                    value: format!("{} {lu}", h.0),
                    problem: format!("is above the shell height {} {lu}", shell.0),
                },
            )));
        }
    }
    let mut a = assess_tally(tank, &tally, &names, &read.files, &scans).map_err(|source| {
        Error::Assess {
            dir: display(dir),
            source,
        }
    })?;
    let mut remarks = read.remarks;
    remarks.append(&mut a.warnings);
    a.warnings = remarks;
    Ok(a)
}

/// A path as the user gave it.
pub fn display(p: &Path) -> String {
    p.display().to_string()
}
