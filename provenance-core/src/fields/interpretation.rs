//! What a provenance field means: the kind of source, and the kinds of basin such sand
//! typically reaches, in our own words after Dickinson & Suczek (1979, AAPG Bull.
//! 63:2164-2182) and Dickinson (1985, in Zuffa (ed.) Provenance of Arenites, 333-361).
//!
//! | provenance | typical receiving basins |
//! |---|---|
//! | stable craton | intracratonic and platform basins, passive-margin wedges, opening ocean basins |
//! | basement uplift | rift troughs, wrench basins |
//! | magmatic arc | trenches, forearc and backarc basins |
//! | recycled orogen | foreland, successor and remnant-ocean basins |
//!
//! This is working backward from the rock to its basin: a hypothesis to weigh against the
//! sand's texture, heavy minerals, palaeocurrents, facies and regional geology. It supports,
//! and never replaces, petrographic judgement.

use super::{Field, Group};

/// The caution every interpreting output carries.
pub const CAUTION: &str = "field assignments and their interpretation support, and do not replace, petrographic judgement; the shipped field vertices are from memory and approximate";

/// Basins fed by stable cratons (Dickinson & Suczek 1979).
pub const CRATON_BASINS: &[&str] = &[
    "intracratonic basins",
    "platform basins",
    "passive-margin wedges",
    "opening ocean basins",
];
/// Basins fed by basement uplifts (Dickinson & Suczek 1979).
pub const UPLIFT_BASINS: &[&str] = &["rift troughs", "wrench basins"];
/// Basins fed by magmatic arcs (Dickinson & Suczek 1979).
pub const ARC_BASINS: &[&str] = &["trenches", "forearc basins", "backarc basins"];
/// Basins fed by recycled orogens (Dickinson & Suczek 1979).
pub const OROGEN_BASINS: &[&str] = &[
    "foreland basins",
    "successor basins",
    "remnant-ocean basins",
];
/// Basins fed by a continental block of either kind: the craton and uplift lists together.
pub const CONTINENTAL_BASINS: &[&str] = &[
    "intracratonic basins",
    "platform basins",
    "passive-margin wedges",
    "opening ocean basins",
    "rift troughs",
    "wrench basins",
];

/// The provenance reading of one field.
///
/// # Example
/// ```
/// use provenance_core::fields::{Field, Group, Interpretation};
/// use provenance_core::geometry::Polygon;
/// let f = Field::new("undissected arc", Group::MagmaticArc, Polygon::new(vec![]));
/// let i = Interpretation::of(&f);
/// assert_eq!(i.provenance, "magmatic arc");
/// assert_eq!(i.receiving_basins, ["trenches", "forearc basins", "backarc basins"]);
/// assert!(i.remark.contains("volcanic"));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Interpretation {
    /// The provenance type.
    pub provenance: &'static str,
    /// The kinds of basin such sand typically reaches; empty for mixed provenance.
    pub receiving_basins: &'static [&'static str],
    /// What the field says about the source, in a sentence.
    pub remark: &'static str,
}

impl Interpretation {
    /// The reading of a field: by its published name where we know it, else by its group.
    ///
    /// # Example
    /// ```
    /// use provenance_core::fields::{Field, Group, Interpretation};
    /// use provenance_core::geometry::Polygon;
    /// let f = Field::new("craton interior", Group::ContinentalBlock, Polygon::new(vec![]));
    /// assert_eq!(Interpretation::of(&f).provenance, "stable craton");
    /// ```
    pub fn of(field: &Field) -> Interpretation {
        let name = field.name.to_ascii_lowercase();
        by_name(name.trim()).unwrap_or_else(|| by_group(field.group))
    }
}

const fn it(
    provenance: &'static str,
    receiving_basins: &'static [&'static str],
    remark: &'static str,
) -> Interpretation {
    Interpretation {
        provenance,
        receiving_basins,
        remark,
    }
}

fn by_name(name: &str) -> Option<Interpretation> {
    Some(match name {
        "craton interior" => it(
            "stable craton",
            CRATON_BASINS,
            "mature quartzose sand from the low-relief interior of a stable craton, often recycled from older sandstones",
        ),
        "transitional continental" => it(
            "stable craton passing to basement uplift",
            CONTINENTAL_BASINS,
            "quartzofeldspathic sand from a continental block where cratonic platforms give way to uplifted basement",
        ),
        "basement uplift" => it(
            "basement uplift",
            UPLIFT_BASINS,
            "arkosic sand shed quickly from fault-bounded uplifts of crystalline basement",
        ),
        "recycled orogen" => it(
            "recycled orogen",
            OROGEN_BASINS,
            "quartz- or chert-rich lithic sand recycled from the uplifted sedimentary and metasedimentary rocks of an orogen: subduction complexes, collision belts or foreland uplifts",
        ),
        "quartzose recycled" => it(
            "recycled orogen",
            OROGEN_BASINS,
            "quartz-rich sand recycled from older sedimentary cover in an orogen, little diluted by fresh lithic detritus",
        ),
        "transitional recycled" => it(
            "recycled orogen",
            OROGEN_BASINS,
            "sand recycled from an orogen, with quartz and lithic fragments in similar measure",
        ),
        "lithic recycled" => it(
            "recycled orogen",
            OROGEN_BASINS,
            "lithic-rich sand recycled from the sedimentary, metasedimentary and chert-bearing rocks of an orogen",
        ),
        "mixed" => it(
            "mixed",
            &[],
            "detritus from more than one kind of source; read it with the other diagrams and the regional setting",
        ),
        "dissected arc" => it(
            "magmatic arc",
            ARC_BASINS,
            "volcano-plutonic sand from an arc eroded down to its plutonic roots",
        ),
        "transitional arc" => it(
            "magmatic arc",
            ARC_BASINS,
            "mixed volcanic and plutonic detritus from a partly eroded arc",
        ),
        "undissected arc" => it(
            "magmatic arc",
            ARC_BASINS,
            "volcaniclastic sand from an arc whose volcanic cover is still intact",
        ),
        "continental block" => it(
            "continental block (stable craton or basement uplift)",
            CONTINENTAL_BASINS,
            "feldspathic to quartzose sand carrying K-feldspar, from cratons or uplifted basement",
        ),
        "magmatic arc" => it(
            "magmatic arc",
            ARC_BASINS,
            "plagioclase-rich sand from an arc",
        ),
        "arc orogen sources" => it(
            "magmatic arc",
            ARC_BASINS,
            "lithic sand dominated by volcanic fragments from an arc orogen",
        ),
        "subduction complex sources" => it(
            "recycled orogen",
            OROGEN_BASINS,
            "chert-, volcanic- and sedimentary-lithic sand from an uplifted subduction complex",
        ),
        "collision suture and fold-thrust belt sources" => it(
            "recycled orogen",
            OROGEN_BASINS,
            "sedimentary- and metasedimentary-lithic sand from a collision suture or fold-thrust belt",
        ),
        _ => return None,
    })
}

fn by_group(group: Group) -> Interpretation {
    match group {
        Group::ContinentalBlock => it(
            "continental block (stable craton or basement uplift)",
            CONTINENTAL_BASINS,
            "sand from a continental block",
        ),
        Group::MagmaticArc => it("magmatic arc", ARC_BASINS, "sand from a magmatic arc"),
        Group::RecycledOrogen => it(
            "recycled orogen",
            OROGEN_BASINS,
            "sand recycled from an orogen",
        ),
        Group::Mixed => it(
            "mixed",
            &[],
            "detritus from more than one kind of source; read it with the other diagrams and the regional setting",
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geometry::Polygon;

    fn field(name: &str, group: Group) -> Field {
        Field::new(name, group, Polygon::new(vec![]))
    }

    // The provenance-to-basin table after Dickinson & Suczek (1979) and Dickinson (1985).
    #[test]
    fn table_rows_hold() {
        let craton = Interpretation::of(&field("craton interior", Group::ContinentalBlock));
        assert_eq!(craton.provenance, "stable craton");
        assert!(craton.receiving_basins.contains(&"passive-margin wedges"));
        let uplift = Interpretation::of(&field("Basement Uplift", Group::ContinentalBlock));
        assert_eq!(uplift.receiving_basins, ["rift troughs", "wrench basins"]);
        let arc = Interpretation::of(&field("dissected arc", Group::MagmaticArc));
        assert!(arc.receiving_basins.contains(&"forearc basins"));
        let orogen = Interpretation::of(&field("lithic recycled", Group::RecycledOrogen));
        assert_eq!(orogen.provenance, "recycled orogen");
        assert!(orogen.receiving_basins.contains(&"remnant-ocean basins"));
    }

    #[test]
    fn unknown_names_fall_back_to_the_group() {
        let i = Interpretation::of(&field("our lab's arc field", Group::MagmaticArc));
        assert_eq!(i.provenance, "magmatic arc");
        let m = Interpretation::of(&field("blend", Group::Mixed));
        assert!(m.receiving_basins.is_empty());
    }
}
