use std::process::ExitCode;

use clap::Parser;

fn main() -> ExitCode {
    let cli = strake::cli::Cli::parse();
    match strake::run(cli) {
        Ok(outcome) => ExitCode::from(outcome.code()),
        Err(e) if e.is_broken_pipe() => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("error: {e}");
            ExitCode::from(e.code())
        }
    }
}
