//! Command-line arguments.

use clap::{Args, Parser, Subcommand};
use std::path::PathBuf;

/// Sandstone provenance from point counts: detrital modes, names, provenance fields.
#[derive(Debug, Parser)]
#[command(name = "sandprov", version, about, after_help = crate::exit::HELP)]
pub struct Cli {
    /// What to do.
    #[command(subcommand)]
    pub command: Command,
}

/// The subcommands.
#[derive(Debug, Subcommand)]
pub enum Command {
    /// Recalculated detrital modes (QFL, QmFLt, QmPK, QpLvLsm, LmLvLs) with counting error.
    Modes(ModesArgs),
    /// Points to count for a target precision (Van der Plas & Tobi 1965).
    Plan(PlanArgs),
    /// Ternary diagrams for publication, as SVG, PNG or PDF (chosen by the -o extension).
    Plot(PlotArgs),
}

/// Where the counts come from and how to read them.
#[derive(Debug, Args)]
pub struct InputArgs {
    /// The point-count table (CSV: comma, semicolon or tab).
    pub counts: PathBuf,
    /// A column mapping (TOML) from the lab's columns to sandprov's categories.
    #[arg(long, value_name = "MAP.toml")]
    pub scheme: Option<PathBuf>,
    /// Cells are percentages; an optional `n` column gives the points counted.
    #[arg(long)]
    pub percent: bool,
}

/// Where a table goes.
#[derive(Debug, Args)]
pub struct OutputArgs {
    /// Output format.
    #[arg(long, default_value = "csv", value_parser = ["csv", "json"])]
    pub format: String,
    /// Output file (written whole or not at all); standard output when absent or `-`.
    #[arg(short = 'o', long = "output", value_name = "OUT")]
    pub output: Option<PathBuf>,
}

/// `sandprov modes`.
#[derive(Debug, Args)]
pub struct ModesArgs {
    #[command(flatten)]
    pub input: InputArgs,
    #[command(flatten)]
    pub output: OutputArgs,
    /// In CSV, add 95% Wilson and Clopper-Pearson bounds for every pole (JSON always has them).
    #[arg(long)]
    pub intervals: bool,
}

/// `sandprov plan`.
#[derive(Debug, Args)]
pub struct PlanArgs {
    /// Target precision: 2σ in percentage points.
    #[arg(long = "two-sigma", value_name = "E", default_value_t = 2.0)]
    pub two_sigma: f64,
    /// Expected proportions of the rarest pole you care about, percent (repeatable);
    /// default: a table from 5 to 50.
    #[arg(long = "proportion", value_name = "P")]
    pub proportions: Vec<f64>,
}

/// `sandprov plot`.
#[derive(Debug, Args)]
pub struct PlotArgs {
    #[command(flatten)]
    pub input: InputArgs,
    /// Diagrams to draw, side by side: qfl, qmflt, qmpk, qplvlsm, lmlvls (comma-separated).
    #[arg(long, value_name = "IDS", value_delimiter = ',', required = true)]
    pub diagram: Vec<String>,
    /// Group samples by this metadata column, with one colour and shape per group.
    #[arg(long, value_name = "COLUMN")]
    pub by: Option<String>,
    /// Write each sample's id beside its marker.
    #[arg(long)]
    pub labels: bool,
    /// Printed width: single (85 mm), double (175 mm) or a width such as 120mm.
    #[arg(long, default_value = "single", value_name = "SIZE")]
    pub size: String,
    /// Grid spacing in percent: 10 or 20.
    #[arg(long, default_value = "10", value_parser = ["10", "20"])]
    pub grid: String,
    /// Markers or density shading: auto shades above 2000 samples per diagram.
    #[arg(long, default_value = "auto", value_parser = ["auto", "markers", "density"])]
    pub density: String,
    /// Output file: .svg, .png (300 dpi) or .pdf.
    #[arg(short = 'o', long = "output", value_name = "OUT")]
    pub output: std::path::PathBuf,
}
