//! `sandprov`: the command line of sandprov. It maps arguments to `provenance_core` calls and
//! results to files and exit codes; all computation lives in the core crate.

mod cli;
mod cmd;
mod exit;
mod progress;

use clap::Parser;

fn main() {
    let args = cli::Cli::parse();
    let code = match std::panic::catch_unwind(|| cmd::run(args)) {
        Ok(Ok(())) => exit::OK,
        // A reader that stops early (`sandprov … | head`) is not an error.
        Ok(Err(provenance_core::error::Error::Write { source, .. }))
            if source.kind() == std::io::ErrorKind::BrokenPipe =>
        {
            exit::OK
        }
        Ok(Err(e)) => {
            eprintln!("sandprov: error: {e}");
            exit::code_for(&e)
        }
        Err(_) => {
            eprintln!("sandprov: internal failure (a bug); please report it with the input that caused it");
            exit::INTERNAL
        }
    };
    std::process::exit(code);
}
