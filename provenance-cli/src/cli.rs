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
    /// Petrofacies statistics per group: means, regions, pooling check, pairwise tests.
    Groups(GroupsArgs),
    /// A stratigraphic section figure (SVG) with change points up-section.
    Section(SectionArgs),
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

/// `sandprov groups`.
#[derive(Debug, Args)]
pub struct GroupsArgs {
    #[command(flatten)]
    pub input: InputArgs,
    #[command(flatten)]
    pub output: OutputArgs,
    /// The metadata column that names each sample's group (formation, member, section).
    #[arg(long, value_name = "COLUMN")]
    pub by: String,
    /// Level of the confidence and prediction regions.
    #[arg(long, default_value_t = 0.95)]
    pub level: f64,
    /// Random splits of a permutation test when exact enumeration is too long.
    #[arg(long, default_value_t = provenance_core::petrofacies::DEFAULT_PERMUTATIONS)]
    pub permutations: usize,
    /// Seed of the permutation tests (the same seed gives the same output).
    #[arg(long, default_value_t = provenance_core::petrofacies::DEFAULT_SEED)]
    pub seed: u64,
    /// Also write the pairwise tests as CSV to this file.
    #[arg(long, value_name = "FILE.csv")]
    pub pairwise: Option<PathBuf>,
    /// Also write the region curves (long format) as CSV to this file.
    #[arg(long, value_name = "FILE.csv")]
    pub regions: Option<PathBuf>,
}

/// `sandprov section`.
#[derive(Debug, Args)]
pub struct SectionArgs {
    #[command(flatten)]
    pub input: InputArgs,
    /// The metadata column with each sample's stratigraphic height (or depth with --depth).
    #[arg(long, value_name = "COLUMN")]
    pub height: String,
    /// The --height column holds depths: larger values are deeper (older).
    #[arg(long)]
    pub depth: bool,
    /// The metadata column naming each sample's group, drawn as bands.
    #[arg(long, value_name = "COLUMN")]
    pub by: Option<String>,
    /// The figure (SVG; PNG and PDF are not available for sections yet).
    #[arg(short = 'o', long = "output", value_name = "OUT.svg")]
    pub output: PathBuf,
    /// Also write the change points, as JSON (.json) or CSV (.csv) by the file's extension.
    #[arg(long, value_name = "OUT.json|OUT.csv")]
    pub changes: Option<PathBuf>,
    /// Diagrams whose ilr coordinates enter change detection (comma-separated).
    #[arg(
        long,
        value_name = "LIST",
        default_value = "qfl",
        value_delimiter = ','
    )]
    pub diagram: Vec<String>,
    /// Penalty factor: a change must gain more than FACTOR·(d + 1)·ln n.
    #[arg(long, value_name = "FACTOR", default_value_t = 1.5)]
    pub penalty: f64,
    /// Fewest samples between change points.
    #[arg(long, value_name = "N", default_value_t = 3)]
    pub min_segment: usize,
    /// A heading above the figure.
    #[arg(long)]
    pub title: Option<String>,
    /// Page width in millimetres.
    #[arg(long, value_name = "MM", default_value_t = 175.0)]
    pub width_mm: f64,
    /// Page height in millimetres.
    #[arg(long, value_name = "MM", default_value_t = 230.0)]
    pub height_mm: f64,
}
