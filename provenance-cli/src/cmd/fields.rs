//! `sandprov fields list | show | check`.

use crate::cli::FieldsCommand;
use provenance_core::error::{Error, Result};
use provenance_core::fields::{check::check, embedded, FieldSet};
use std::io::Write;

pub fn run(c: FieldsCommand) -> Result<()> {
    match c {
        FieldsCommand::List => list(),
        FieldsCommand::Show { set, format } => show(&set, &format),
        FieldsCommand::Check { set } => check_set(&set),
    }
}

fn print(text: &str) -> Result<()> {
    let mut out = std::io::stdout().lock();
    out.write_all(text.as_bytes())
        .and_then(|_| out.flush())
        .map_err(|source| Error::Write {
            path: "standard output".into(),
            source,
        })
}

fn list() -> Result<()> {
    let sets = embedded::all()?;
    let width = sets.iter().map(|s| s.id.len()).max().unwrap_or(0);
    let mut text = String::new();
    for s in &sets {
        text.push_str(&format!("{:<width$}  {}\n", s.id, s.title));
    }
    print(&text)
}

fn show(spec: &str, format: &str) -> Result<()> {
    let set = FieldSet::resolve(spec)?;
    if format == "json" {
        return print(&set.to_json());
    }
    let poles = set.diagram.poles();
    let mut text = format!(
        "{}: {}\ndiagram: {} ({})\nsource: {}\nnote: {}\n",
        set.id,
        set.title,
        set.diagram,
        poles.join(", "),
        set.source,
        set.note
    );
    for f in &set.fields {
        let vs: Vec<String> = f
            .polygon
            .vertices()
            .iter()
            .map(|v| format!("[{}, {}, {}]", v[0], v[1], v[2]))
            .collect();
        text.push_str(&format!(
            "field {:?} ({}): {}\n",
            f.name,
            f.group,
            vs.join(" ")
        ));
    }
    print(&text)
}

fn check_set(spec: &str) -> Result<()> {
    let set = FieldSet::resolve(spec)?;
    let report = check(&set);
    print(&report.render(&set))?;
    if report.is_valid() {
        Ok(())
    } else {
        Err(Error::InvalidFieldSet {
            file: set.file.clone(),
            problems: report.problem_lines(),
        })
    }
}
