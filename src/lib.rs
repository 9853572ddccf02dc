//! strake: in-service assessment of above-ground storage tank shells from ultrasonic
//! thickness surveys.
//!
//! Layers (data flows one way): [`cli`] declares the command line; [`cmd`] glues a
//! command to [`input`] (the only code that opens files), [`calc`] (the engineering,
//! pure functions) and [`report`] (renderers over the one result model in [`model`]).

pub mod calc;
pub mod cli;
pub mod cmd;
pub mod input;
pub mod model;
pub mod report;

use cli::{Cli, Command};

/// How a successful run ended.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Outcome {
    /// Exit 0.
    Done,
    /// `--fail-below-minimum` and a course is below t_min: exit 3.
    BelowMinimum,
    /// Some inputs had errors, already reported in the output (`check`, `fleet`):
    /// exit 1.
    InputErrors,
}

impl Outcome {
    /// The process exit code.
    pub fn code(self) -> u8 {
        match self {
            Outcome::Done => 0,
            Outcome::InputErrors => 1,
            Outcome::BelowMinimum => 3,
        }
    }
}

/// Everything that stops a command.
#[derive(Debug, thiserror::Error)]
pub enum Error {
    /// A problem in an input file (exit 1).
    #[error(transparent)]
    Input(#[from] input::error::InputError),
    /// The tank cannot be assessed (exit 1).
    #[error("{dir}: {source}")]
    Assess {
        /// Tank folder.
        dir: String,
        /// Why.
        source: calc::assess::AssessError,
    },
    /// The command line is inconsistent in a way clap cannot express (exit 2).
    #[error("{0}")]
    Usage(String),
    /// Rendering CSV failed.
    #[error("cannot render CSV: {0}")]
    Render(#[source] csv::Error),
    /// Writing the output failed.
    #[error("cannot write the output: {0}")]
    Output(#[source] std::io::Error),
    /// The report folder (`assess --out`) could not be made.
    #[error(transparent)]
    Report(#[from] report::folder::ReportError),
    /// The fleet report folder (`fleet --out`) could not be made.
    #[error(transparent)]
    FleetReport(#[from] report::fleet_out::FleetOutError),
}

impl Error {
    /// The process exit code of this error.
    pub fn code(&self) -> u8 {
        match self {
            Error::Usage(_) => 2,
            _ => 1,
        }
    }
    /// True when standard output was closed by the reader (`strake ... | head`).
    pub fn is_broken_pipe(&self) -> bool {
        matches!(self, Error::Output(e) if e.kind() == std::io::ErrorKind::BrokenPipe)
    }
}

/// Runs a parsed command line.
pub fn run(cli: Cli) -> Result<Outcome, Error> {
    let g = cmd::Global::new(cli.units, cli.format, cli.quiet, cli.color);
    match &cli.command {
        Command::Check(a) => cmd::check::run(a, g),
        Command::Assess(a) => cmd::assess::run(a, g),
        Command::FillHeight(a) => cmd::fill_height::run(a, g),
        Command::Required(a) => cmd::required::run(a, g),
        Command::Fleet(a) => cmd::fleet::run(a, g),
    }
}
