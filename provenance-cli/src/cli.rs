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
    /// Fit a provenance classifier (multinomial logistic regression on ilr coordinates) to
    /// labelled reference samples, cross-validate it and save it.
    Train(TrainArgs),
    /// Provenance field sets: list the embedded ones, show one, check a set file.
    #[command(subcommand)]
    Fields(FieldsCommand),
    /// Tectonic setting: the provenance field each sample falls in on each diagram, and the
    /// kinds of basin such sand typically reaches.
    Setting(SettingArgs),
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

/// `sandprov train`.
#[derive(Debug, Args)]
pub struct TrainArgs {
    #[command(flatten)]
    pub input: InputArgs,
    /// The metadata column holding each sample's class (for example its known setting).
    #[arg(long, value_name = "COLUMN")]
    pub label: String,
    /// The composition to classify: a diagram, or `framework` (Qm, Qp+C, P, K, Lv, Ls, Lm).
    #[arg(long, value_name = "COMPOSITION", value_parser = ["qfl", "qmflt", "qmpk", "qplvlsm", "lmlvls", "framework"])]
    pub diagram: String,
    /// L2 penalty α (scikit-learn's 1/C); 0 for unpenalised maximum likelihood.
    #[arg(long, value_name = "ALPHA", allow_negative_numbers = true, default_value_t = provenance_core::classifier::DEFAULT_L2)]
    pub l2: f64,
    /// Folds of the stratified cross-validation (at least 2; 0 skips it).
    #[arg(long, value_name = "K", default_value_t = provenance_core::classifier::DEFAULT_FOLDS)]
    pub folds: usize,
    /// The model file to write (JSON, written whole or not at all).
    #[arg(short = 'o', long = "output", value_name = "MODEL.json")]
    pub output: PathBuf,
}

/// `sandprov fields …`.
#[derive(Debug, Subcommand)]
pub enum FieldsCommand {
    /// One line per embedded field set: the id, then the title.
    List,
    /// Print a field set: source, note, and each field's group and vertices.
    Show {
        /// An embedded set id or a field-set file (TOML).
        #[arg(value_name = "ID|FILE")]
        set: String,
        /// Output format.
        #[arg(long, default_value = "text", value_parser = ["text", "json"])]
        format: String,
    },
    /// Validate a field set: vertices sum to 100 and lie in the triangle, polygons are
    /// simple, fields do not overlap; report overlap and uncovered areas and where gaps lie.
    /// Exits with 3 when the set is invalid.
    Check {
        /// A field-set file (TOML) or an embedded set id.
        #[arg(value_name = "FILE|ID")]
        set: String,
    },
}

/// `sandprov setting`.
#[derive(Debug, Args)]
pub struct SettingArgs {
    #[command(flatten)]
    pub input: InputArgs,
    #[command(flatten)]
    pub output: OutputArgs,
    /// Field sets to look samples up in, one per diagram (repeatable): an embedded id or a
    /// field-set file. Default: every embedded set.
    #[arg(long = "fields", value_name = "ID|FILE")]
    pub fields: Vec<String>,
    /// Posterior draws per sample and diagram where membership is sampled (10000 keeps the
    /// Monte Carlo standard error at or below 0.005).
    #[arg(long, value_name = "N", default_value_t = provenance_core::membership::DEFAULT_DRAWS)]
    pub draws: u32,
    /// Seed of the sampled memberships; the same seed gives the same output.
    #[arg(long, value_name = "S", default_value_t = provenance_core::membership::DEFAULT_SEED)]
    pub seed: u64,
    /// Add a classifier's probabilities: a model file from `sandprov train`, or the id of an
    /// embedded field set for its default model (a smooth version of those fields).
    #[arg(long, value_name = "MODEL.json|ID")]
    pub model: Option<String>,
    /// Leave out membership, the group summary and the classifier (field look-up only).
    #[arg(long, conflicts_with = "model")]
    pub no_membership: bool,
}
