//! `strake assess TANK_DIR`.

use super::{Global, load_and_assess};
use crate::cli::{AssessArgs, Format};
use crate::report::view::View;
use crate::report::{csv_out, json, text, write};
use crate::{Error, Outcome};

/// Runs the command.
pub fn run(args: &AssessArgs, g: Global) -> Result<Outcome, Error> {
    let a = load_and_assess(&args.tank, args.sg, args.fill_height)?;
    let v = View::new(a.tank.units, g.units);
    let out = match g.format {
        Format::Text => text::render(&a, &v, g.quiet),
        Format::Json => json::render(&a, &v),
        Format::Csv => csv_out::courses_csv(&a, &v).map_err(Error::Render)?,
    };
    write::print(&out, g.color).map_err(Error::Output)?;
    if g.format == Format::Csv {
        // CSV rows hold courses only: the warnings go to standard error, one a line.
        write::warnings_to_stderr(&a.warnings).map_err(Error::Output)?;
    }
    if args.fail_below_minimum && !a.summary.below_minimum.is_empty() {
        Ok(Outcome::BelowMinimum)
    } else {
        Ok(Outcome::Done)
    }
}
