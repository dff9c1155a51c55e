//! A count table held in memory, its metadata columns, and groups of samples by one of them.

use crate::counts::{normalize_header, Sample};
use crate::error::{Column, Error, Location, Result};
use crate::input::CountReader;
use std::collections::HashMap;

/// Every sample of a count table, with what is needed to name places in it.
///
/// Group statistics need all samples of a group at once, so the table is read whole (a few
/// hundred bytes per sample).
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::petrofacies::Table;
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,formation\nA,1,1,1,1,1,1,1,Upper\n";
/// let r = CountReader::from_reader("t.csv", t.as_bytes(), ReadOptions::default())?;
/// let table = Table::read(r)?;
/// assert_eq!(table.samples.len(), 1);
/// assert_eq!(table.column("Formation")?.name(), "formation");
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone)]
pub struct Table {
    /// The file name used in messages.
    pub file: String,
    /// All header cells, trimmed, in file order.
    pub headers: Vec<String>,
    /// Metadata column names, in the order of [`Sample::metadata`].
    pub metadata: Vec<String>,
    /// Decimal commas are read in numeric metadata (semicolon-delimited tables).
    pub decimal_comma: bool,
    /// The samples, in file order.
    pub samples: Vec<Sample>,
}

/// A metadata column picked by name (`--by`, `--height`).
///
/// # Example
/// ```
/// use provenance_core::input::{CountReader, ReadOptions};
/// use provenance_core::petrofacies::Table;
/// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,height_m\nA,1,1,1,1,1,1,1,\"12.5\"\n";
/// let table = Table::read(CountReader::from_reader("t.csv", t.as_bytes(), Default::default())?)?;
/// let h = table.column("height m")?;
/// assert_eq!(h.number(&table, &table.samples[0])?, 12.5);
/// # Ok::<(), provenance_core::error::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct MetaColumn {
    /// Position in [`Sample::metadata`].
    pub index: usize,
    /// The column of the file (1-based position and header).
    pub column: Column,
}

impl MetaColumn {
    /// The header text.
    pub fn name(&self) -> &str {
        &self.column.name
    }

    fn at(&self, table: &Table, sample: &Sample) -> Location {
        Location::new(&table.file)
            .line(sample.line)
            .column(self.column.clone())
    }

    /// The trimmed text of this column for `sample`.
    pub fn text<'a>(&self, sample: &'a Sample) -> &'a str {
        sample.metadata.get(self.index).map_or("", |s| s.trim())
    }

    /// The cell as a finite number (decimal comma allowed in semicolon tables); refuses blanks
    /// and non-numbers, naming file, line and column.
    pub fn number(&self, table: &Table, sample: &Sample) -> Result<f64> {
        let t = self.text(sample);
        let parsed = if table.decimal_comma {
            t.replacen(',', ".", 1).parse::<f64>()
        } else {
            t.parse::<f64>()
        };
        match parsed {
            Ok(v) if v.is_finite() => Ok(v),
            _ => Err(Error::InvalidValue {
                at: self.at(table, sample),
                value: t.to_string(),
                expected: format!("a finite number (the {} column)", self.column.name),
            }),
        }
    }

    /// The cell as a group name; refuses blanks, naming file, line and column.
    pub fn group_name(&self, table: &Table, sample: &Sample) -> Result<String> {
        let t = self.text(sample);
        if t.is_empty() {
            return Err(Error::InvalidValue {
                at: self.at(table, sample),
                value: String::new(),
                expected: format!(
                    "a non-empty group name in the {} column (every sample needs one)",
                    self.column.name
                ),
            });
        }
        Ok(t.to_string())
    }
}

/// Samples sharing one value of a metadata column.
///
/// # Example
/// ```
/// use provenance_core::petrofacies::Group;
/// let g = Group { name: "Upper".into(), members: vec![0, 2] };
/// assert_eq!(g.members.len(), 2);
/// ```
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Group {
    /// The value of the grouping column.
    pub name: String,
    /// Positions of the group's samples in [`Table::samples`], in file order.
    pub members: Vec<usize>,
}

impl Group {
    /// The group's samples.
    pub fn samples<'a>(&self, table: &'a Table) -> Vec<&'a Sample> {
        self.members.iter().map(|i| &table.samples[*i]).collect()
    }
}

impl Table {
    /// Read every sample of `reader` (the first refusal ends the read).
    pub fn read(reader: CountReader) -> Result<Table> {
        let file = reader.file().to_string();
        let headers = reader.headers().to_vec();
        let metadata = reader.metadata_columns().to_vec();
        let decimal_comma = reader.dialect().decimal_comma;
        let samples = reader.collect::<Result<Vec<_>>>()?;
        Ok(Table {
            file,
            headers,
            metadata,
            decimal_comma,
            samples,
        })
    }

    /// The metadata column called `name`: an exact match first, else the one column whose
    /// header matches ignoring case, spaces, underscores and hyphens. A usage error lists the
    /// metadata columns when none (or several) match.
    pub fn column(&self, name: &str) -> Result<MetaColumn> {
        let exact = self.metadata.iter().position(|m| m == name.trim());
        let index = match exact {
            Some(i) => i,
            None => {
                let key = normalize_header(name);
                let hits: Vec<usize> = (0..self.metadata.len())
                    .filter(|i| normalize_header(&self.metadata[*i]) == key)
                    .collect();
                match hits.as_slice() {
                    [i] => *i,
                    _ => {
                        return Err(Error::Usage {
                            message: format!(
                            "{}: no single metadata column named {name:?}, expected one of {:?}",
                            self.file, self.metadata
                        ),
                        })
                    }
                }
            }
        };
        let header = &self.metadata[index];
        let position = self
            .headers
            .iter()
            .position(|h| h == header)
            .map_or(0, |p| p + 1);
        Ok(MetaColumn {
            index,
            column: Column {
                index: position,
                name: header.clone(),
            },
        })
    }

    /// Groups by the values of `by`, in order of first appearance; a blank value is refused.
    ///
    /// # Example
    /// ```
    /// use provenance_core::input::CountReader;
    /// use provenance_core::petrofacies::Table;
    /// let t = "sample,Qm,Qp,P,K,Lv,Ls,Lm,fm\nA,1,1,1,1,1,1,1,X\nB,1,1,1,1,1,1,1,Y\nC,1,1,1,1,1,1,1,X\n";
    /// let table = Table::read(CountReader::from_reader("t.csv", t.as_bytes(), Default::default())?)?;
    /// let groups = table.groups(&table.column("fm")?)?;
    /// assert_eq!(groups[0].name, "X");
    /// assert_eq!(groups[0].members, [0, 2]);
    /// # Ok::<(), provenance_core::error::Error>(())
    /// ```
    pub fn groups(&self, by: &MetaColumn) -> Result<Vec<Group>> {
        let mut groups: Vec<Group> = Vec::new();
        let mut index: HashMap<String, usize> = HashMap::new();
        for (i, s) in self.samples.iter().enumerate() {
            let name = by.group_name(self, s)?;
            match index.get(&name) {
                Some(&g) => groups[g].members.push(i),
                None => {
                    index.insert(name.clone(), groups.len());
                    groups.push(Group {
                        name,
                        members: vec![i],
                    });
                }
            }
        }
        Ok(groups)
    }
}
