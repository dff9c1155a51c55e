//! Small HTML building blocks: escaping, tables, the page shell with inline CSS.

/// Escape text for HTML element content and attribute values.
///
/// # Example
/// ```
/// use provenance_core::report::html::escape;
/// assert_eq!(escape("<b a=\"1\">&'"), "&lt;b a=&quot;1&quot;&gt;&amp;&#39;");
/// ```
pub fn escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}

/// A table cell: text (escaped) or numeric (right-aligned).
#[derive(Debug, Clone, PartialEq)]
pub enum Cell {
    /// Text, escaped on output.
    Text(String),
    /// A number already formatted, right-aligned.
    Number(String),
    /// Nothing known.
    Empty,
}

/// An HTML table from a header and rows; every cell is escaped.
///
/// # Example
/// ```
/// use provenance_core::report::html::{table, Cell};
/// let t = table(&["sample", "Q"], &[vec![Cell::Text("<x>".into()), Cell::Number("61.2".into())]]);
/// assert!(t.contains("<td>&lt;x&gt;</td>") && t.contains("<td class=\"num\">61.2</td>"));
/// ```
pub fn table(header: &[&str], rows: &[Vec<Cell>]) -> String {
    let mut s = String::from("<div class=\"scroll\"><table>\n<thead><tr>");
    for h in header {
        s.push_str(&format!("<th>{}</th>", escape(h)));
    }
    s.push_str("</tr></thead>\n<tbody>\n");
    for r in rows {
        s.push_str("<tr>");
        for c in r {
            match c {
                Cell::Text(t) => s.push_str(&format!("<td>{}</td>", escape(t))),
                Cell::Number(n) => s.push_str(&format!("<td class=\"num\">{}</td>", escape(n))),
                Cell::Empty => s.push_str("<td class=\"na\">–</td>"),
            }
        }
        s.push_str("</tr>\n");
    }
    s.push_str("</tbody></table></div>\n");
    s
}

/// The inline style sheet: readable at laptop width, printable on A4. Our own design.
pub const CSS: &str = r#"
:root { --ink: #1d2630; --muted: #5b6876; --rule: #d5dbe1; --band: #f3f5f7; --accent: #2f5d7c; }
* { box-sizing: border-box; }
body { margin: 0; color: var(--ink); background: #fff;
       font: 15px/1.5 "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; }
main { max-width: 1180px; margin: 0 auto; padding: 24px 28px 60px; }
header.top { border-bottom: 3px solid var(--accent); padding-bottom: 10px; margin-bottom: 18px; }
h1 { font-size: 26px; margin: 0 0 4px; }
h2 { font-size: 20px; margin: 34px 0 10px; border-bottom: 1px solid var(--rule); padding-bottom: 4px; }
h3 { font-size: 16px; margin: 20px 0 6px; }
p.meta, .muted { color: var(--muted); font-size: 13px; }
nav.toc { background: var(--band); padding: 8px 14px; border-radius: 6px; font-size: 14px; }
nav.toc a { margin-right: 14px; color: var(--accent); text-decoration: none; }
.caution { border-left: 4px solid #b5651d; background: #fbf4ec; padding: 10px 14px; margin: 14px 0; }
.figures { display: flex; flex-wrap: wrap; gap: 18px; }
figure { margin: 0; flex: 1 1 480px; max-width: 100%; page-break-inside: avoid; break-inside: avoid; }
figure svg { width: 100%; height: auto; }
figcaption { font-size: 13px; color: var(--muted); margin-top: 4px; }
.scroll { overflow-x: auto; margin: 8px 0 16px; }
table { border-collapse: collapse; font-size: 12.5px; }
th, td { border-bottom: 1px solid var(--rule); padding: 3px 7px; text-align: left; vertical-align: top; }
th { background: var(--band); position: sticky; top: 0; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.na { color: #9aa5b1; text-align: center; }
tbody tr:nth-child(even) td { background: #fafbfc; }
dl.summary { display: grid; grid-template-columns: max-content 1fr; gap: 4px 16px; margin: 8px 0; }
dl.summary dt { color: var(--muted); }
dl.summary dd { margin: 0; }
ol.sources li { margin-bottom: 4px; font-size: 14px; }
@media print {
  @page { size: A4; margin: 14mm 12mm; }
  body { font-size: 10.5pt; }
  main { max-width: none; padding: 0; }
  nav.toc { display: none; }
  .scroll { overflow: visible; }
  table { font-size: 8pt; }
  th { position: static; }
  h2 { page-break-after: avoid; break-after: avoid; }
  figure { flex: 1 1 45%; }
}
"#;

/// A complete self-contained page: inline CSS, no external requests.
///
/// # Example
/// ```
/// let p = provenance_core::report::html::page("A <title>", "<p>x</p>");
/// assert!(p.starts_with("<!DOCTYPE html>") && p.contains("A &lt;title&gt;"));
/// assert!(!p.contains("http://") && !p.contains("https://"));
/// ```
pub fn page(title: &str, body: &str) -> String {
    format!(
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n\
         <meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n\
         <title>{}</title>\n<style>{}</style>\n</head>\n<body>\n<main>\n{}\n</main>\n</body>\n</html>\n",
        escape(title),
        CSS,
        body
    )
}
