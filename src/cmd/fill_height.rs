//! `strake fill-height TANK_DIR [--sg G]... [--years N]`.

use super::{Global, load_and_assess};
use crate::calc::fill_height::fill_scenarios;
use crate::cli::{FillHeightArgs, Format};
use crate::report::view::View;
use crate::report::{fill, write};
use crate::{Error, Outcome};

/// Runs the command.
pub fn run(args: &FillHeightArgs, g: Global) -> Result<Outcome, Error> {
    let a = load_and_assess(&args.tank, None, None)?;
    let years = args.years.unwrap_or(a.summary.ut_interval.years);
    let scenarios = fill_scenarios(&a, &args.sgs, years);
    let v = View::new(a.tank.units, g.units);
    let out = match g.format {
        Format::Text => fill::render_text(&a, &scenarios, years, &v),
        Format::Json => fill::render_json(&a, &scenarios, years, &v),
        Format::Csv => fill::render_csv(&a, &scenarios, years, &v).map_err(Error::Render)?,
    };
    write::print(&out, g.color).map_err(Error::Output)?;
    if g.format == Format::Csv {
        write::caution_to_stderr().map_err(Error::Output)?;
    }
    Ok(Outcome::Done)
}
