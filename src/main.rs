use std::process::ExitCode;

use clap::Parser;

/// A tank's assessment makes a few hundred small allocations (the parsed tank file,
/// its courses, the survey bookkeeping); a fleet makes them for thousands of tanks on
/// several threads, where mimalloc's per-thread free lists are faster than the C
/// library's allocator (README, "Speed").
#[global_allocator]
static ALLOCATOR: mimalloc::MiMalloc = mimalloc::MiMalloc;

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
