//! The classifier in the report: the most likely class per sample with all class
//! probabilities, a summary, the comparison with the field placement, the model's metadata
//! and its method note.
//!
//! The probabilities themselves come from the report's [`crate::setting::Locator`], which
//! carries the model exactly as `sandprov setting --model` does, so `setting.csv` and the
//! `setting` entries of `results.json` hold them in the same layout. This module adds the
//! views: `classifier.csv`, the `classifier` block of `results.json`, the HTML section and
//! the method note.

use super::html::{escape, table, Cell};
use super::Computed;
use crate::classifier::{ClassifierResult, FeatureSpace, ModelSource, NamedModel};
use crate::diagram::Diagram;
use crate::error::{Error, Result};
use crate::fields::{Group, Placement};
use crate::output::number::round;
use crate::output::number::RATIO_DECIMALS;
use crate::output::push_csv_cell;

/// What the classifier's classes are compared with.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Compare {
    /// Its classes are field names of the report's set with this index: compare fields.
    Field(usize),
    /// Its classes are provenance group names: compare the group of the field in that set.
    Group(usize),
    /// Nothing to compare with (own labels, or no field set for the diagram).
    Nothing,
}

/// One sample's verdict beside its placement.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Row {
    /// The most probable class (index) and its probability.
    pub top: Option<(usize, f64)>,
    /// The field or group the sample falls in on the compared set, or why none.
    pub placement: Option<String>,
    /// Whether the most probable class is that field or group.
    pub agrees: Option<bool>,
}

/// Every sample's verdict, with what it is compared against.
pub(crate) struct Verdicts<'a> {
    pub named: &'a NamedModel,
    pub compare: Compare,
    pub rows: Vec<Row>,
}

/// The classifier of the report, if one was given.
pub(crate) fn named<'a>(c: &'a Computed) -> Option<&'a NamedModel> {
    c.locator.likelihoods()?.classifier()
}

fn result<'a>(c: &'a Computed, i: usize) -> Option<&'a ClassifierResult> {
    c.settings.get(i)?.likelihood.as_ref()?.classifier.as_ref()
}

/// Refuse a model whose composition no sample of the table has grains in.
pub(crate) fn check(c: &Computed) -> Result<()> {
    let Some(m) = named(c) else {
        return Ok(());
    };
    let space = m.model.features.composition;
    let has = |d: Option<Diagram>| {
        c.modes.iter().any(|s| match d {
            Some(d) => s.get(d).is_some(),
            None => !s.empty_framework(),
        })
    };
    let diagram = match space {
        FeatureSpace::Diagram(d) => Some(d),
        FeatureSpace::Framework => None,
    };
    if has(diagram) {
        return Ok(());
    }
    let with_data: Vec<&str> = Diagram::ALL
        .into_iter()
        .filter(|d| has(Some(*d)))
        .map(|d| d.id())
        .collect();
    Err(Error::Training {
        file: m.name.clone(),
        message: format!(
            "the model reads the {space} composition ({}), but no sample of {} has grains in it",
            space.parts().join(", "),
            c.data.file
        ),
        expected: if with_data.is_empty() {
            "a count table with framework grains".into()
        } else {
            format!(
                "a model for a composition the data have grains in ({}, or framework)",
                with_data.join(", ")
            )
        },
    })
}

/// The set to compare with: the model's own diagram, or QFL for a framework model.
fn compare(c: &Computed, m: &NamedModel) -> Compare {
    let diagram = match m.model.features.composition {
        FeatureSpace::Diagram(d) => d,
        FeatureSpace::Framework => Diagram::Qfl,
    };
    let Some(i) = c.set_index(diagram) else {
        return Compare::Nothing;
    };
    let set = &c.locator.sets()[i];
    let classes = &m.model.classes;
    if classes
        .iter()
        .all(|k| set.fields.iter().any(|f| f.name == *k))
    {
        Compare::Field(i)
    } else if classes
        .iter()
        .all(|k| Group::ALL.iter().any(|g| g.name() == k))
    {
        Compare::Group(i)
    } else {
        Compare::Nothing
    }
}

/// Every sample's verdict; `None` without a model.
pub(crate) fn verdicts<'a>(c: &'a Computed) -> Option<Verdicts<'a>> {
    let named = named(c)?;
    let compare = compare(c, named);
    let rows = (0..c.data.samples.len())
        .map(|i| {
            let top = result(c, i).and_then(ClassifierResult::top);
            // The field or group the sample falls in (`Ok`), or why it falls in none (`Err`).
            let placed: Option<std::result::Result<String, &str>> = match compare {
                Compare::Nothing => None,
                Compare::Field(s) | Compare::Group(s) => {
                    let set = &c.locator.sets()[s];
                    Some(match c.settings[i].diagrams[s].placement {
                        None => Err("no points"),
                        Some(Placement::Outside { .. }) => Err("outside every field"),
                        Some(Placement::Inside { field, .. }) => Ok(match compare {
                            Compare::Group(_) => set.fields[field].group.name().to_string(),
                            _ => set.fields[field].name.clone(),
                        }),
                    })
                }
            };
            let agrees = match (top, &placed) {
                (Some((k, _)), Some(Ok(p))) => Some(named.model.classes[k] == *p),
                _ => None,
            };
            let placement = placed.map(|p| p.unwrap_or_else(str::to_string));
            Row {
                top,
                placement,
                agrees,
            }
        })
        .collect();
    Some(Verdicts {
        named,
        compare,
        rows,
    })
}

impl Verdicts<'_> {
    /// What the classes are compared with, in words (`QFL field (dickinson1985-qfl)`).
    pub fn compared_with(&self, c: &Computed) -> Option<String> {
        let (i, what) = match self.compare {
            Compare::Field(i) => (i, "field"),
            Compare::Group(i) => (i, "provenance group"),
            Compare::Nothing => return None,
        };
        let set = &c.locator.sets()[i];
        Some(format!("{} {what} ({})", set.diagram.label(), set.id))
    }

    /// Samples per most likely class, most frequent first (ties in class order).
    pub fn predicted(&self) -> Vec<(&str, usize)> {
        let classes = &self.named.model.classes;
        let mut n = vec![0usize; classes.len()];
        for r in &self.rows {
            if let Some((k, _)) = r.top {
                n[k] += 1;
            }
        }
        let mut v: Vec<(&str, usize)> = classes
            .iter()
            .map(String::as_str)
            .zip(n)
            .filter(|(_, k)| *k > 0)
            .collect();
        v.sort_by_key(|(_, k)| std::cmp::Reverse(*k));
        v
    }

    /// Ids of the samples whose most likely class differs from their placement.
    pub fn disagreements<'c>(&self, c: &'c Computed) -> Vec<&'c str> {
        c.data
            .samples
            .iter()
            .zip(&self.rows)
            .filter(|(_, r)| r.agrees == Some(false))
            .map(|(s, _)| s.id.as_str())
            .collect()
    }

    fn without_probabilities(&self) -> usize {
        self.rows.iter().filter(|r| r.top.is_none()).count()
    }
}

/// The summary's line (a `<dt>`/`<dd>` pair).
pub(crate) fn summary(c: &Computed, v: &Verdicts) -> String {
    let listed: Vec<String> = v
        .predicted()
        .iter()
        .map(|(k, n)| format!("{} ({n})", escape(k)))
        .collect();
    let mut text = format!(
        "most likely class by {}: {}",
        escape(&v.named.name),
        if listed.is_empty() {
            "none".to_string()
        } else {
            listed.join(", ")
        }
    );
    let none = v.without_probabilities();
    if none > 0 {
        text += &format!("; {none} sample(s) without probabilities");
    }
    if let Some(what) = v.compared_with(c) {
        let d = v.disagreements(c);
        text += &if d.is_empty() {
            format!("; agrees with the {} for every sample", escape(&what))
        } else {
            format!(
                "; differs from the {} for {} sample(s): {}",
                escape(&what),
                d.len(),
                escape(&d.join(", "))
            )
        };
    } else {
        text += "; its classes are not the fields or groups of a field set in this report, so it \
                 is not compared with the field placement";
    }
    format!("<dt>classifier</dt><dd>{text}</dd>\n")
}

/// The caution specific to where the model came from.
fn caution(m: &NamedModel) -> String {
    match &m.source {
        ModelSource::FieldSet(id) => format!(
            "This is the default model of the field set {id}: it was trained on compositions \
             drawn over that set's field polygons, not on sands of known setting. Its \
             probabilities are a smooth version of the same field boundaries (transcribed from \
             memory, unverified), so they are not independent evidence of setting, and its \
             agreement with the field placement is expected by construction. Where the two \
             differ, the sample typically lies near a field boundary, where the model's \
             boundaries (straight in log-ratio coordinates) and the polygon edges part."
        ),
        ModelSource::File(_) => format!(
            "A classifier describes its training data ({}): it can only choose among the \
             classes it was trained on and says nothing about settings absent from them.",
            m.model.training.source
        ),
    }
}

/// Other classes are listed in the HTML table from this probability up (a display choice;
/// every probability is in the CSV and JSON).
const OTHERS_FROM: f64 = 0.01;

fn probability(p: f64) -> Cell {
    Cell::Number(format!("{p:.2}"))
}

/// The HTML section.
pub(crate) fn section(c: &Computed, v: &Verdicts) -> String {
    let m = &v.named.model;
    let compared = v.compared_with(c);
    let mut header: Vec<String> = vec!["sample".into()];
    if c.groups.is_some() {
        header.push("group".into());
    }
    header.extend(["most likely class".into(), "p".into()]);
    if let Some(what) = &compared {
        header.push(what.clone());
        header.push("same?".into());
    }
    header.push(format!("other classes, p ≥ {OTHERS_FROM}"));
    let rows: Vec<Vec<Cell>> = c
        .data
        .samples
        .iter()
        .zip(&v.rows)
        .enumerate()
        .map(|(i, (s, r))| {
            let mut row = vec![Cell::Text(s.id.clone())];
            if let Some(g) = &c.groups {
                row.push(Cell::Text(g[i].clone()));
            }
            match r.top {
                Some((k, p)) => row.extend([Cell::Text(m.classes[k].clone()), probability(p)]),
                None => row.extend([
                    result(c, i)
                        .and_then(|x| x.note)
                        .map_or(Cell::Empty, |n| Cell::Text(format!("none: {n}"))),
                    Cell::Empty,
                ]),
            }
            if compared.is_some() {
                row.push(r.placement.clone().map_or(Cell::Empty, Cell::Text));
                row.push(match r.agrees {
                    Some(true) => Cell::Text("yes".into()),
                    Some(false) => Cell::Text("no".into()),
                    None => Cell::Empty,
                });
            }
            row.push(
                match (result(c, i).and_then(|x| x.probabilities.as_ref()), r.top) {
                    (Some(p), Some((best, _))) => {
                        let mut others: Vec<(usize, f64)> = p
                            .iter()
                            .copied()
                            .enumerate()
                            .filter(|(k, x)| *k != best && *x >= OTHERS_FROM)
                            .collect();
                        others.sort_by(|a, b| b.1.total_cmp(&a.1));
                        if others.is_empty() {
                            Cell::Text("none".into())
                        } else {
                            Cell::Text(
                                others
                                    .iter()
                                    .map(|(k, x)| format!("{} {x:.2}", m.classes[*k]))
                                    .collect::<Vec<_>>()
                                    .join(", "),
                            )
                        }
                    }
                    _ => Cell::Empty,
                },
            );
            row
        })
        .collect();
    let h: Vec<&str> = header.iter().map(String::as_str).collect();
    let comparison = match &compared {
        Some(what) => format!(
            " Beside it, the {} each sample falls in, and whether the two name the same class.",
            escape(what)
        ),
        None => String::new(),
    };
    format!(
        "<h2 id=\"classifier\">Classifier</h2>\n<p class=\"muted\">{}: {} on the ilr \
         coordinates of the {} composition ({}), {} classes, trained on {} samples. Per sample, \
         the most likely class with its probability p, and the other classes with p of at least \
         {OTHERS_FROM}.{comparison} Every class's probability (they sum to 1) is in \
         classifier.csv, setting.csv (classifier_p_ columns) and results.json. The model's \
         data, date and checksums are under Methods and sources.</p>\n\
         <p class=\"caution\">{}</p>\n{}",
        escape(&v.named.name),
        escape(&m.kind),
        escape(m.features.composition.id()),
        escape(&m.features.parts.join(", ")),
        m.classes.len(),
        m.training.samples,
        escape(&caution(v.named)),
        table(&h, &rows)
    )
}

/// The citation of the method, for the numbered list of sources.
pub(crate) const CITATION: &str = "Classifier: multinomial logistic regression (Cox, D.R. \
(1958) The regression analysis of binary sequences. Journal of the Royal Statistical Society B \
20:215-242; from memory) on the ilr coordinates of the composition (Egozcue et al. 2003) after \
multiplicative replacement of zeros (Martín-Fernández et al. 2003), fitted by L2-penalised \
maximum likelihood (damped Newton steps; Nocedal, J. & Wright, S.J. (2006) Numerical \
Optimization, 2nd ed., Springer; L-BFGS by linfa-logistic for larger problems). Treating provenance fields as a \
classifier refitted by multinomial logistic regression on log-ratios of sands of known setting \
follows Weltje, G.J. (2006) Ternary sandstone composition and provenance: an evaluation of the \
'Dickinson model'. Geological Society, London, Special Publications 264:79-99 (details from \
memory).";

/// The method note: what the model is, from its metadata.
pub(crate) fn method_note(m: &NamedModel) -> String {
    let model = &m.model;
    let t = &model.training;
    let mut items: Vec<(&str, String)> = vec![
        ("model", m.name.clone()),
        (
            "from",
            match &m.source {
                ModelSource::File(p) => format!("model file {}", p.display()),
                ModelSource::FieldSet(id) => {
                    format!("default model of the embedded field set {id}, rebuilt for this report")
                }
            },
        ),
        ("kind", model.kind.clone()),
        (
            "composition",
            format!(
                "{} ({}); features {}: {}",
                model.features.composition,
                model.features.parts.join(", "),
                model.features.names.join(", "),
                model.features.transform
            ),
        ),
        (
            "classes (training samples)",
            t.per_class
                .iter()
                .map(|(k, n)| format!("{k} ({n})"))
                .collect::<Vec<_>>()
                .join(", "),
        ),
        (
            "training data",
            format!("{} samples: {}", t.samples, t.source),
        ),
        ("trained", t.date.clone()),
        ("data checksum", t.checksum.clone()),
        ("model checksum", model.checksum()),
        (
            "fit",
            format!(
                "L2 penalty α = {}; largest gradient component {:.2e} (tolerance {:.0e}); \
                 training log-loss {:.4}",
                model.l2,
                model.convergence.gradient_max,
                model.convergence.tolerance,
                model.convergence.training_log_loss
            ),
        ),
        (
            "cross-validation",
            match &model.cross_validation {
                Some(cv) => format!(
                    "{}-fold: accuracy {:.3}, log-loss {:.4}",
                    cv.folds, cv.accuracy, cv.log_loss
                ),
                None => "not run".into(),
            },
        ),
        ("note", model.note.clone()),
    ];
    items.push(("caution", caution(m)));
    let mut s = String::from("<h3>Classifier model</h3>\n<dl class=\"summary\">\n");
    for (k, v) in items {
        s.push_str(&format!("<dt>{}</dt><dd>{}</dd>\n", escape(k), escape(&v)));
    }
    s.push_str("</dl>\n");
    s
}

/// `classifier.csv`: one row per sample.
pub(crate) fn csv(c: &Computed, v: &Verdicts) -> Vec<u8> {
    let mut header = vec!["sample".to_string()];
    header.extend(c.data.metadata.iter().cloned());
    header.extend(v.named.csv_columns());
    header.extend(["classifier_reason", "compared_with", "placement", "agrees"].map(String::from));
    let mut buf = Vec::new();
    for (i, h) in header.iter().enumerate() {
        if i > 0 {
            buf.push(b',');
        }
        push_csv_cell(&mut buf, h);
    }
    buf.push(b'\n');
    let compared = v.compared_with(c);
    let empty = ClassifierResult {
        probabilities: None,
        note: None,
    };
    for (i, (s, r)) in c.data.samples.iter().zip(&v.rows).enumerate() {
        push_csv_cell(&mut buf, &s.id);
        for x in &s.metadata {
            buf.push(b',');
            push_csv_cell(&mut buf, x);
        }
        let res = result(c, i).unwrap_or(&empty);
        v.named.push_csv_cells(&mut buf, res);
        buf.push(b',');
        if let Some(n) = res.note {
            push_csv_cell(&mut buf, n);
        }
        buf.push(b',');
        if let Some(w) = &compared {
            push_csv_cell(&mut buf, w);
        }
        buf.push(b',');
        if let Some(p) = &r.placement {
            push_csv_cell(&mut buf, p);
        }
        buf.push(b',');
        if let Some(a) = r.agrees {
            buf.extend_from_slice(if a { b"true" } else { b"false" });
        }
        buf.push(b'\n');
    }
    buf
}

/// The `classifier` block of `results.json`; per-sample probabilities stay in the
/// `setting` entries (`classifier.probabilities`), as `sandprov setting --model` writes them.
pub(crate) fn json(c: &Computed, v: &Verdicts) -> serde_json::Value {
    let m = &v.named.model;
    let samples: Vec<serde_json::Value> = c
        .data
        .samples
        .iter()
        .zip(&v.rows)
        .map(|(s, r)| {
            serde_json::json!({
                "sample": s.id,
                "top": r.top.map(|(k, _)| &m.classes[k]),
                "probability": r.top.map(|(_, p)| round(p, RATIO_DECIMALS)),
                "placement": r.placement,
                "agrees": r.agrees,
            })
        })
        .collect();
    let predicted: serde_json::Map<String, serde_json::Value> = v
        .predicted()
        .into_iter()
        .map(|(k, n)| (k.to_string(), n.into()))
        .collect();
    serde_json::json!({
        "model": v.named.name,
        "source": match &v.named.source {
            ModelSource::File(p) => serde_json::json!({"file": p.display().to_string()}),
            ModelSource::FieldSet(id) => serde_json::json!({"default_model_of": id}),
        },
        "checksum": m.checksum(),
        "kind": m.kind,
        "features": m.features,
        "classes": m.classes,
        "l2": m.l2,
        "training": m.training,
        "convergence": m.convergence,
        "cross_validation": m.cross_validation,
        "note": m.note,
        "caution": caution(v.named),
        "compared_with": v.compared_with(c),
        "predicted": predicted,
        "disagreements": v.disagreements(c),
        "samples": samples,
    })
}

#[cfg(test)]
mod tests {
    use crate::classifier::NamedModel;
    use crate::error::Error;
    use crate::input::{CountReader, ReadOptions};
    use crate::petrofacies::Table;
    use crate::report::{build, ReportOptions};

    fn table(text: &'static str) -> Table {
        let r = CountReader::from_reader("t.csv", text.as_bytes(), ReadOptions::default()).unwrap();
        Table::read(r).unwrap()
    }

    fn options(id: &str) -> ReportOptions {
        ReportOptions {
            model: Some(NamedModel::resolve(id, "2025-01-01").unwrap()),
            ..Default::default()
        }
    }

    fn file<'a>(files: &'a crate::report::ReportFiles, name: &str) -> &'a [u8] {
        &files
            .files()
            .iter()
            .find(|(p, _)| p.to_str() == Some(name))
            .unwrap()
            .1
    }

    #[test]
    fn a_model_of_a_diagram_without_grains_is_refused_naming_it() {
        // Invented: Qm, P and K are zero everywhere.
        let t = table("sample,Qm,Qp,P,K,Lv,Ls,Lm\nA,0,40,0,0,30,20,10\n");
        let e = build(&t, &options("dickinson-suczek1979-qmpk")).unwrap_err();
        assert!(matches!(e, Error::Training { .. }), "{e:?}");
        let s = e.to_string();
        assert!(
            s.starts_with("default model of dickinson-suczek1979-qmpk: the model reads the qmpk composition (Qm, P, K), but no sample of t.csv has grains in it")
                && s.contains("(qfl, qmflt, qplvlsm, lmlvls, or framework)"),
            "{s}"
        );
    }

    #[test]
    fn the_classifier_table_compares_fields_and_counts_disagreements() {
        // Invented: a quartz-rich sand, a lithic-volcanic one, and one without grains.
        let t = table(
            "sample,Qm,Qp,P,K,Lv,Ls,Lm\nQ,380,10,5,0,0,0,5\nV,40,5,60,5,260,20,10\nE,0,0,0,0,0,0,0\n",
        );
        let files = build(&t, &options("dickinson1985-qfl")).unwrap();
        let csv = String::from_utf8(file(&files, "classifier.csv").to_vec()).unwrap();
        let lines: Vec<&str> = csv.lines().collect();
        assert_eq!(lines.len(), 4);
        assert!(lines[1].starts_with("Q,default model of dickinson1985-qfl,craton interior,"));
        assert!(lines[1].ends_with(",,QFL field (dickinson1985-qfl),craton interior,true"));
        assert!(lines[2].contains(",undissected arc,") && lines[2].ends_with(",true"));
        // No grains: no probabilities, the reason, no placement and no verdict.
        assert!(lines[3].ends_with(
            ",the model's composition has no grains,QFL field (dickinson1985-qfl),no points,"
        ));
        let json: serde_json::Value = serde_json::from_slice(file(&files, "results.json")).unwrap();
        let c = &json["classifier"];
        assert_eq!(c["predicted"]["craton interior"], 1);
        assert_eq!(c["predicted"]["undissected arc"], 1);
        assert_eq!(c["disagreements"], serde_json::json!([]));
        assert_eq!(c["samples"][2]["top"], serde_json::Value::Null);
        let html = String::from_utf8(file(&files, "report.html").to_vec()).unwrap();
        assert!(html.contains("1 sample(s) without probabilities"));
        assert!(html.contains("agrees with the QFL field (dickinson1985-qfl) for every sample"));
    }
}
