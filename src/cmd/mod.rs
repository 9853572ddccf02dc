//! One file per subcommand: glue from options to input, calculation and output.

pub mod assess;
pub mod check;
pub mod fill_height;
pub mod required;

use std::path::Path;

use chrono::NaiveDate;

use crate::Error;
use crate::calc::assess::{AssessOptions, assess};
use crate::calc::units::{Length, UnitSystem};
use crate::cli::{ColorArg, Format, TankArgs, UnitsArg};
use crate::input::error::{InputError, InputErrorKind, Location};
use crate::input::tank_dir::{TankFolder, load_tank_dir};
use crate::model::result::Assessment;
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
) -> Result<(TankFolder, Assessment), Error> {
    let folder = load_tank_dir(&args.dir, today())?;
    if let Some(h) = fill_height {
        let shell = folder.tank.shell_height();
        if h > shell.0 + 1e-9 {
            let lu = folder.tank.units.length_unit();
            return Err(Error::Input(InputError::new(
                Location::file(display(&args.dir)),
                InputErrorKind::InvalidValue {
                    key: "option --fill-height".into(),
                    value: format!("{h} {lu}"),
                    problem: format!("is above the shell height {} {lu}", shell.0),
                },
            )));
        }
    }
    let options = AssessOptions {
        as_of: args.as_of,
        specific_gravity,
        fill_height: fill_height.map(Length),
    };
    let mut a =
        assess(&folder.tank, &folder.readings, options).map_err(|source| Error::Assess {
            dir: display(&args.dir),
            source,
        })?;
    let mut remarks = folder.warnings.clone();
    remarks.append(&mut a.warnings);
    a.warnings = remarks;
    Ok((folder, a))
}

/// A path as the user gave it.
pub fn display(p: &Path) -> String {
    p.display().to_string()
}
