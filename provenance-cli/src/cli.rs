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
    /// Sandstone names under Folk (1980), Garzanti (2019) and Pettijohn, Potter & Siever (1987).
    ///
    /// A name is blank (null in JSON) when a scheme cannot apply, with the reason in its rule
    /// column; Pettijohn, Potter & Siever (1987) need a matrix column. Chert defaults:
    /// folk=lithic (Folk 1980 puts chert with the rock fragments), garzanti=quartz (as in
    /// Dickinson's QFL) and pettijohn=quartz (from memory).
    Name(NameArgs),
    /// Everything for a count table in one folder: report.html plus CSV/JSON tables and figures.
    Report(ReportArgs),
    /// The report on the bundled (invented) demo data.
    Demo(DemoArgs),
    /// Provenance field sets: list the embedded ones, show one, check a set file.
    #[command(subcommand)]
    Fields(FieldsCommand),
    /// Tectonic setting: the provenance field each sample falls in on each diagram, and the
    /// kinds of basin such sand typically reaches.
    Setting(SettingArgs),
    /// Ternary diagrams for publication, as SVG, PNG or PDF (chosen by the -o extension).
    Plot(PlotArgs),
    /// Petrofacies statistics per group: means, regions, pooling check, pairwise tests.
    Groups(GroupsArgs),
    /// A stratigraphic section figure with change points up-section.
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

/// `sandprov name`.
#[derive(Debug, Args)]
pub struct NameArgs {
    #[command(flatten)]
    pub input: InputArgs,
    #[command(flatten)]
    pub output: OutputArgs,
    /// Instead of the table, write per sample the recalculated poles and the rule behind each
    /// name, in words (to standard output or OUT; not with --format).
    #[arg(long, conflicts_with = "format")]
    pub explain: bool,
    /// Where chert goes in one scheme, as SCHEME=WHERE with WHERE one of quartz, lithic, omit
    /// (repeatable), e.g. --chert garzanti=lithic.
    #[arg(long = "chert", value_name = "SCHEME=WHERE")]
    pub chert: Vec<String>,
}

/// `sandprov report`.
#[derive(Debug, Args)]
pub struct ReportArgs {
    #[command(flatten)]
    pub input: InputArgs,
    /// The report folder (created; an earlier sandprov report there is replaced).
    #[arg(short = 'o', long = "output", value_name = "DIR")]
    pub output: PathBuf,
    /// Group samples by this metadata column (formation, member, section…).
    #[arg(long, value_name = "COLUMN")]
    pub by: Option<String>,
    /// Stratigraphic height column, for the up-section view.
    #[arg(long, value_name = "COLUMN")]
    pub height: Option<String>,
    /// Field sets to use, one per diagram (repeatable): an embedded id or a field-set file.
    /// Default: every embedded set.
    #[arg(long = "fields", value_name = "ID|FILE")]
    pub fields: Vec<String>,
    /// Add a classifier's probabilities to the report: a model file from `sandprov train`, or
    /// the id of an embedded field set for its default model (a smooth version of those fields).
    #[arg(long, value_name = "MODEL.json|ID")]
    pub model: Option<String>,
    /// Print nothing but errors.
    #[arg(long, short = 'q')]
    pub quiet: bool,
}

/// `sandprov demo`.
#[derive(Debug, Args)]
pub struct DemoArgs {
    /// The report folder.
    #[arg(
        short = 'o',
        long = "output",
        value_name = "DIR",
        default_value = "sandprov-demo"
    )]
    pub output: PathBuf,
    /// Add a classifier's probabilities, as `report --model` does.
    #[arg(long, value_name = "MODEL.json|ID")]
    pub model: Option<String>,
    /// Print nothing but errors.
    #[arg(long, short = 'q')]
    pub quiet: bool,
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
    /// Field sets to draw (repeatable), each on its own diagram: an embedded id or a field-set
    /// file, or `none`. Default: the embedded set of every drawn diagram that has one.
    #[arg(long = "fields", value_name = "ID|FILE|none")]
    pub fields: Vec<String>,
    /// Draw each group's closed geometric mean with its 95% confidence and prediction regions
    /// (Weltje 2002); needs --by.
    #[arg(long, requires = "by")]
    pub means: bool,
    /// Draw each sample's 95% confidence region under counting error (logistic-normal in ilr
    /// space, after Weltje 2002).
    #[arg(long)]
    pub regions: bool,
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
