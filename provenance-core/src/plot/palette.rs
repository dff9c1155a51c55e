//! Colours and marker shapes of sandprov's figures.
//!
//! The group colours are our own choice, picked so that every pair stays apart (CIELAB ΔE76 of
//! at least 15) for normal vision and under simulated protanopia and deuteranopia (Viénot,
//! Brettel & Mollon 1999, Color Res. Appl. 24:243-252; matrices from memory, unverified), and
//! they span light to dark. Every group also gets its own marker shape, so a figure printed in
//! greyscale still tells the groups apart. The density ramp darkens monotonically.

use std::f64::consts::PI;

/// An sRGB colour.
///
/// # Example
/// ```
/// use provenance_core::plot::Rgb;
/// assert_eq!(Rgb(29, 78, 137).hex(), "#1d4e89");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Rgb(pub u8, pub u8, pub u8);

impl Rgb {
    /// `#rrggbb`.
    pub fn hex(self) -> String {
        format!("#{:02x}{:02x}{:02x}", self.0, self.1, self.2)
    }

    /// Relative luminance (sRGB primaries and transfer curve, IEC 61966-2-1; Rec. 709 weights).
    ///
    /// # Example
    /// ```
    /// use provenance_core::plot::Rgb;
    /// assert!((Rgb(255, 255, 255).luminance() - 1.0).abs() < 1e-12);
    /// assert_eq!(Rgb(0, 0, 0).luminance(), 0.0);
    /// ```
    pub fn luminance(self) -> f64 {
        let [r, g, b] = self.linear();
        0.2126 * r + 0.7152 * g + 0.0722 * b
    }

    /// Linear-light components in 0..=1.
    pub fn linear(self) -> [f64; 3] {
        [self.0, self.1, self.2].map(|c| {
            let c = f64::from(c) / 255.0;
            if c <= 0.04045 {
                c / 12.92
            } else {
                ((c + 0.055) / 1.055).powf(2.4)
            }
        })
    }
}

/// Group colours, in the order groups receive them.
pub const GROUP_COLOURS: [Rgb; 8] = [
    Rgb(0x1d, 0x4e, 0x89), // deep blue
    Rgb(0xe0, 0x8a, 0x2c), // orange
    Rgb(0x5f, 0xb3, 0xa8), // sea green
    Rgb(0xa6, 0x3d, 0x6b), // raspberry
    Rgb(0x26, 0x26, 0x26), // near black
    Rgb(0xf2, 0xd3, 0x5e), // straw
    Rgb(0x9c, 0xc3, 0xe6), // pale blue
    Rgb(0x5e, 0x4b, 0x10), // umber
];

/// The sequential ramp for density shading, light (few samples) to dark (many).
pub const DENSITY_RAMP: [Rgb; 6] = [
    Rgb(0xf2, 0xec, 0xcf),
    Rgb(0xc8, 0xdc, 0xb4),
    Rgb(0x86, 0xbf, 0xa6),
    Rgb(0x4a, 0x96, 0xa0),
    Rgb(0x2e, 0x68, 0x90),
    Rgb(0x23, 0x36, 0x6b),
];

/// Outline colour of markers, frame and text.
pub const INK: Rgb = Rgb(0x1a, 0x1a, 0x1a);
/// Grid lines.
pub const GRID: Rgb = Rgb(0xc8, 0xc8, 0xc8);
/// Field boundaries and names.
pub const FIELD_INK: Rgb = Rgb(0x55, 0x55, 0x55);

/// A marker shape.
///
/// # Example
/// ```
/// use provenance_core::plot::MarkerShape;
/// let outline = MarkerShape::Square.outline(2.0);
/// assert_eq!(outline.len(), 4);
/// assert!(outline.iter().all(|(x, y)| x.abs() <= 2.0 && y.abs() <= 2.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum MarkerShape {
    /// A circle.
    Circle,
    /// A square.
    Square,
    /// A triangle pointing up.
    TriangleUp,
    /// A diamond.
    Diamond,
    /// A triangle pointing down.
    TriangleDown,
    /// A five-pointed star.
    Star,
    /// A plus sign with thick arms.
    Plus,
    /// A hexagon.
    Hexagon,
}

/// Every shape, in the order groups receive them.
pub const SHAPES: [MarkerShape; 8] = [
    MarkerShape::Circle,
    MarkerShape::Square,
    MarkerShape::TriangleUp,
    MarkerShape::Diamond,
    MarkerShape::TriangleDown,
    MarkerShape::Star,
    MarkerShape::Plus,
    MarkerShape::Hexagon,
];

fn regular(n: usize, r: f64, start: f64) -> Vec<(f64, f64)> {
    (0..n)
        .map(|i| {
            let t = start + 2.0 * PI * i as f64 / n as f64;
            (r * t.cos(), -r * t.sin())
        })
        .collect()
}

impl MarkerShape {
    /// The outline as a closed polygon around (0, 0), fitting a box of half-width `r`, with
    /// page orientation (`y` down). Shapes are scaled to look equally heavy.
    pub fn outline(self, r: f64) -> Vec<(f64, f64)> {
        match self {
            MarkerShape::Circle => regular(20, r * 0.92, 0.0),
            MarkerShape::Square => {
                let s = r * 0.8;
                vec![(-s, -s), (s, -s), (s, s), (-s, s)]
            }
            MarkerShape::TriangleUp => regular(3, r, PI / 2.0)
                .into_iter()
                .map(|(x, y)| (x, y + r * 0.2))
                .collect(),
            MarkerShape::TriangleDown => regular(3, r, -PI / 2.0)
                .into_iter()
                .map(|(x, y)| (x, y - r * 0.2))
                .collect(),
            MarkerShape::Diamond => vec![(0.0, -r), (r * 0.8, 0.0), (0.0, r), (-r * 0.8, 0.0)],
            MarkerShape::Star => (0..10)
                .map(|i| {
                    let rad = if i % 2 == 0 { r } else { r * 0.45 };
                    let t = PI / 2.0 + PI * i as f64 / 5.0;
                    (rad * t.cos(), -rad * t.sin() + r * 0.05)
                })
                .collect(),
            MarkerShape::Plus => {
                let (a, b) = (r * 0.95, r * 0.36);
                vec![
                    (-b, -a),
                    (b, -a),
                    (b, -b),
                    (a, -b),
                    (a, b),
                    (b, b),
                    (b, a),
                    (-b, a),
                    (-b, b),
                    (-a, b),
                    (-a, -b),
                    (-b, -b),
                ]
            }
            MarkerShape::Hexagon => regular(6, r * 0.9, PI / 6.0),
        }
    }
}

/// Most groups a figure can draw with distinct colour-and-shape pairs.
pub const MAX_GROUPS: usize = GROUP_COLOURS.len() * SHAPES.len();

/// How one group is drawn.
///
/// # Example
/// ```
/// use provenance_core::plot::{Symbol, MAX_GROUPS};
/// let all: Vec<Symbol> = (0..MAX_GROUPS).map(Symbol::for_group).collect();
/// for (i, a) in all.iter().enumerate() {
///     assert!(all[i + 1..].iter().all(|b| b != a), "symbols are unique");
/// }
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Symbol {
    /// Fill colour.
    pub colour: Rgb,
    /// Shape.
    pub shape: MarkerShape,
}

impl Symbol {
    /// The symbol of group `index` (0-based). The first eight groups differ in both colour and
    /// shape; later groups reuse colours with a shifted shape, so pairs stay unique up to
    /// [`MAX_GROUPS`].
    pub fn for_group(index: usize) -> Symbol {
        let n = GROUP_COLOURS.len();
        let colour = GROUP_COLOURS[index % n];
        let shape = SHAPES[(index % n + index / n) % SHAPES.len()];
        Symbol { colour, shape }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// CIELAB (D65 white) of linear RGB (IEC 61966-2-1 matrix; CIE 1976 formulas).
    fn lab([r, g, b]: [f64; 3]) -> [f64; 3] {
        let x = 0.4124 * r + 0.3576 * g + 0.1805 * b;
        let y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
        let z = 0.0193 * r + 0.1192 * g + 0.9505 * b;
        let f = |t: f64| {
            let d: f64 = 6.0 / 29.0;
            if t > d.powi(3) {
                t.cbrt()
            } else {
                t / (3.0 * d * d) + 4.0 / 29.0
            }
        };
        let (fx, fy, fz) = (f(x / 0.95047), f(y), f(z / 1.08883));
        [116.0 * fy - 16.0, 500.0 * (fx - fy), 200.0 * (fy - fz)]
    }

    fn apply(m: [[f64; 3]; 3], v: [f64; 3]) -> [f64; 3] {
        [0, 1, 2].map(|i| (0..3).map(|j| m[i][j] * v[j]).sum())
    }

    // Dichromat simulation in linear RGB, Viénot, Brettel & Mollon (1999); coefficients from
    // memory, unverified.
    const PROTAN: [[f64; 3]; 3] = [
        [0.11238, 0.88762, 0.0],
        [0.11238, 0.88762, 0.0],
        [0.00401, -0.00401, 1.0],
    ];
    const DEUTAN: [[f64; 3]; 3] = [
        [0.29275, 0.70725, 0.0],
        [0.29275, 0.70725, 0.0],
        [-0.02234, 0.02234, 1.0],
    ];
    const IDENTITY: [[f64; 3]; 3] = [[1.0, 0.0, 0.0], [0.0, 1.0, 0.0], [0.0, 0.0, 1.0]];

    fn delta_e(a: [f64; 3], b: [f64; 3]) -> f64 {
        ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2) + (a[2] - b[2]).powi(2)).sqrt()
    }

    #[test]
    fn group_colours_stay_apart_for_dichromats() {
        for (name, m) in [("normal", IDENTITY), ("protan", PROTAN), ("deutan", DEUTAN)] {
            for (i, a) in GROUP_COLOURS.iter().enumerate() {
                for b in &GROUP_COLOURS[i + 1..] {
                    let d = delta_e(lab(apply(m, a.linear())), lab(apply(m, b.linear())));
                    assert!(
                        d >= 15.0,
                        "{name}: {} vs {} only ΔE {d:.1}",
                        a.hex(),
                        b.hex()
                    );
                }
            }
        }
    }

    #[test]
    fn density_ramp_darkens_monotonically() {
        for w in DENSITY_RAMP.windows(2) {
            assert!(w[1].luminance() < w[0].luminance() - 0.05);
        }
    }

    #[test]
    fn group_colours_show_on_white_paper() {
        // Lightest colour must still differ from white by at least 20% luminance.
        assert!(GROUP_COLOURS.iter().all(|c| c.luminance() < 0.8));
    }

    #[test]
    fn first_eight_groups_differ_in_shape() {
        let shapes: Vec<_> = (0..8).map(|i| Symbol::for_group(i).shape).collect();
        for (i, s) in shapes.iter().enumerate() {
            assert!(!shapes[i + 1..].contains(s));
        }
    }
}
