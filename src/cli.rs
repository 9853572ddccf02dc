//! The command line (clap derive). Only declarations: `cmd` turns them into work.

use std::path::PathBuf;

use chrono::NaiveDate;
use clap::{Args, Parser, Subcommand, ValueEnum};

/// Output format.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Format {
    /// A table and a verdict for people.
    Text,
    /// The JSON contract (see README, "Output formats").
    Json,
    /// CSV, one row per course.
    Csv,
}

/// Unit system to print in.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum UnitsArg {
    /// m, mm, MPa.
    #[value(name = "si", alias = "SI")]
    Si,
    /// ft, in, psi.
    #[value(name = "usc", alias = "USC")]
    Usc,
}

/// When to colour.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum ColorArg {
    /// On a terminal, unless NO_COLOR is set.
    Auto,
    /// Always.
    Always,
    /// Never.
    Never,
}

/// Fitness-for-service screening of storage tank shells from ultrasonic thickness
/// surveys: t_min per course by the one-foot relation, corrosion rates, remaining
/// life, inspection due dates and the allowable fill height.
#[derive(Debug, Parser)]
#[command(
    name = "strake",
    version,
    after_help = "Examples:\n  strake check sample-inspections/*\n  strake assess sample-inspections/kestrel-t12\n  strake fill-height sample-inspections/kestrel-t12 --sg 1.0 --years 10\n  strake fleet sample-inspections\n\nExit codes: 0 done, 1 bad input, 2 usage, 3 a course below t_min (with --fail-below-minimum).\nEvery result is a screening aid: it defers to the applicable code edition, local\nregulations and an authorized inspector's or qualified engineer's judgement."
)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
    /// Print numbers in this unit system instead of the tank's own.
    #[arg(long, global = true, value_enum)]
    pub units: Option<UnitsArg>,
    /// Output format.
    #[arg(long, global = true, value_enum, default_value_t = Format::Text)]
    pub format: Format,
    /// Shorter text output: no verdict paragraph, warnings only counted.
    #[arg(long, short, global = true)]
    pub quiet: bool,
    /// Colour the terminal output.
    #[arg(long, global = true, value_enum, default_value_t = ColorArg::Auto)]
    pub color: ColorArg,
}

/// The commands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Validate tank folders or survey CSV files and summarise what they hold.
    #[command(
        after_help = "Example:\n  strake check sample-inspections/kestrel-t12 new-survey.csv"
    )]
    Check(CheckArgs),
    /// Assess one tank: t_min, rates, remaining life, due dates, allowable fill height.
    #[command(
        after_help = "Examples:\n  strake assess sample-inspections/kestrel-t12\n  strake assess sample-inspections/kestrel-t12 --out\n  strake assess sample-inspections/kestrel-t12 --format json\n  strake assess sample-inspections/kestrel-t12 --as-of 2014-12-31 --sg 1.0"
    )]
    Assess(AssessArgs),
    /// Allowable liquid level for the stored product and other specific gravities.
    #[command(
        name = "fill-height",
        after_help = "Example:\n  strake fill-height sample-inspections/kestrel-t12 --sg 1.0 --sg 1.2 --years 10"
    )]
    FillHeight(FillHeightArgs),
    /// Required course thicknesses for design or re-rating: one-foot and
    /// variable-design-point methods side by side.
    #[command(
        after_help = "Examples:\n  strake required sample-inspections/kestrel-t12\n  strake required --diameter 80 --fill-height 19.2 --sg 0.9 --course-heights 2.4,2.4,2.4,2.4,2.4,2.4,2.4,2.4 --material A516-70 --corrosion-allowance 1.5"
    )]
    Required(RequiredArgs),
    /// Assess every tank folder below a folder, in parallel, and list them by next due
    /// date: governing course, remaining life, due dates, allowable fill height, status.
    #[command(
        after_help = "Examples:\n  strake fleet sample-inspections\n  strake fleet sample-inspections --format csv > plan.csv\n  strake fleet sample-inspections --out\n\nA folder that cannot be assessed is listed with its error and the others go on;\nthe exit code is then 1."
    )]
    Fleet(FleetArgs),
}

/// `strake fleet`.
#[derive(Debug, Args)]
pub struct FleetArgs {
    /// The folder to search: every folder below it that holds a tank.toml is a tank.
    #[arg(value_name = "DIR")]
    pub dir: PathBuf,
    /// Also write each tank's report folder and a fleet page (index.html with the plan
    /// table, links to each tank and charts) to DIR; without a value, to
    /// reports/fleet/.
    #[arg(long, value_name = "DIR", num_args = 0..=1)]
    pub out: Option<Option<PathBuf>>,
}

/// `strake check`.
#[derive(Debug, Args)]
pub struct CheckArgs {
    /// Tank folders (holding tank.toml and surveys/) or survey CSV files.
    #[arg(required = true, value_name = "PATH")]
    pub paths: Vec<PathBuf>,
}

/// Options shared by commands that assess a tank.
#[derive(Debug, Args)]
pub struct TankArgs {
    /// The tank folder (tank.toml and surveys/*.csv).
    #[arg(value_name = "TANK_DIR")]
    pub dir: PathBuf,
    /// Assess with the surveys up to this date (YYYY-MM-DD).
    #[arg(long, value_name = "DATE", value_parser = parse_date)]
    pub as_of: Option<NaiveDate>,
}

/// `strake assess`.
#[derive(Debug, Args)]
pub struct AssessArgs {
    #[command(flatten)]
    pub tank: TankArgs,
    /// What-if specific gravity instead of the tank file's.
    #[arg(long, value_name = "G", value_parser = parse_sg)]
    pub sg: Option<f64>,
    /// What-if maximum liquid level, in the tank's length unit.
    #[arg(long, value_name = "H", value_parser = parse_positive)]
    pub fill_height: Option<f64>,
    /// Exit with code 3 when a course is below t_min.
    #[arg(long)]
    pub fail_below_minimum: bool,
    /// Also write the report folder (index.html, PNG charts, courses.csv, points.csv,
    /// result.json) to DIR; without a value, to reports/<tank id>/.
    #[arg(long, value_name = "DIR", num_args = 0..=1)]
    pub out: Option<Option<PathBuf>>,
    /// Put the generation time in the report (without it, the same input gives
    /// byte-identical files).
    #[arg(long, requires = "out")]
    pub stamp: bool,
}

/// `strake fill-height`.
#[derive(Debug, Args)]
pub struct FillHeightArgs {
    #[command(flatten)]
    pub tank: TankArgs,
    /// Another specific gravity to evaluate (repeatable).
    #[arg(long = "sg", value_name = "G", value_parser = parse_sg)]
    pub sgs: Vec<f64>,
    /// Years of further corrosion for the "later" column (default: the tank's UT
    /// thickness survey interval).
    #[arg(long, value_name = "N", value_parser = parse_years)]
    pub years: Option<f64>,
}

/// Unit system of an ad-hoc shell.
#[derive(Debug, Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum SystemArg {
    /// m, mm, MPa.
    #[value(name = "si", alias = "SI")]
    Si,
    /// ft, in, psi.
    #[value(name = "usc", alias = "USC")]
    Usc,
}

/// `strake required`.
#[derive(Debug, Args)]
pub struct RequiredArgs {
    /// A tank folder (its tank.toml); or give the shell with the options below.
    #[arg(value_name = "TANK_DIR", required_unless_present = "diameter")]
    pub dir: Option<PathBuf>,
    /// Nominal diameter (m or ft, see --system).
    #[arg(long, value_name = "D", value_parser = parse_positive, conflicts_with = "dir", requires_all = ["fill_height", "sg", "course_heights"])]
    pub diameter: Option<f64>,
    /// Design liquid level above the tank bottom.
    #[arg(long, value_name = "H", value_parser = parse_positive)]
    pub fill_height: Option<f64>,
    /// Design specific gravity.
    #[arg(long, value_name = "G", value_parser = parse_sg)]
    pub sg: Option<f64>,
    /// Course heights, bottom first, comma-separated.
    #[arg(long, value_name = "H1,H2,...", value_delimiter = ',', value_parser = parse_positive)]
    pub course_heights: Vec<f64>,
    /// Plate grade of every course (a grade of the built-in table).
    #[arg(long, value_name = "GRADE", value_parser = parse_grade)]
    pub material: Option<&'static crate::calc::materials::Grade>,
    /// Design stress S_d of every course, instead of the material's (MPa or psi).
    #[arg(long, value_name = "S", value_parser = parse_positive)]
    pub design_stress: Option<f64>,
    /// Hydrostatic test stress S_t of every course, instead of the material's.
    #[arg(long, value_name = "S", value_parser = parse_positive)]
    pub test_stress: Option<f64>,
    /// Design corrosion allowance of every course (mm or in).
    #[arg(long, value_name = "CA", value_parser = parse_non_negative, default_value_t = 0.0)]
    pub corrosion_allowance: f64,
    /// Unit system of the numbers given.
    #[arg(long, value_enum, default_value_t = SystemArg::Si)]
    pub system: SystemArg,
}

fn parse_grade(s: &str) -> Result<&'static crate::calc::materials::Grade, String> {
    crate::calc::materials::find_grade(s).ok_or_else(|| {
        let names: Vec<&str> = crate::calc::materials::grade_names().collect();
        format!(
            "\"{s}\" is not in the built-in table; use one of {}",
            names.join(", ")
        )
    })
}

fn parse_non_negative(s: &str) -> Result<f64, String> {
    let v = parse_number(s)?;
    if v >= 0.0 {
        Ok(v)
    } else {
        Err(format!("{v} is negative"))
    }
}

fn parse_date(s: &str) -> Result<NaiveDate, String> {
    NaiveDate::parse_from_str(s, "%Y-%m-%d")
        .map_err(|_| format!("\"{s}\" is not a date, expected YYYY-MM-DD"))
}

fn parse_number(s: &str) -> Result<f64, String> {
    match s.parse::<f64>() {
        Ok(v) if v.is_finite() => Ok(v),
        _ => Err(format!("\"{s}\" is not a number")),
    }
}

fn parse_sg(s: &str) -> Result<f64, String> {
    let v = parse_number(s)?;
    if v > 0.0 && v < crate::input::limits::MIN_SPECIFIC_GRAVITY {
        Err(format!(
            "{v} is below 0.3, lighter than any stored liquid (water = 1.0): a typing slip?"
        ))
    } else if v > 0.0 && v <= crate::calc::constants::MAX_SPECIFIC_GRAVITY {
        Ok(v)
    } else {
        Err(format!(
            "{v} is out of range, expected more than 0 and at most 3 (water = 1.0)"
        ))
    }
}

fn parse_positive(s: &str) -> Result<f64, String> {
    let v = parse_number(s)?;
    if v > 0.0 {
        Ok(v)
    } else {
        Err(format!("{v} is not positive"))
    }
}

fn parse_years(s: &str) -> Result<f64, String> {
    let v = parse_number(s)?;
    if (0.0..=200.0).contains(&v) {
        Ok(v)
    } else {
        Err(format!("{v} is out of range, expected 0 to 200 years"))
    }
}
