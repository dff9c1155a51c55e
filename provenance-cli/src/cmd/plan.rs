//! `sandprov plan`.

use crate::cli::PlanArgs;
use provenance_core::error::{Error, Result};
use provenance_core::stats::points_needed;

pub fn run(a: PlanArgs) -> Result<()> {
    let ps = if a.proportions.is_empty() {
        vec![5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 40.0, 50.0]
    } else {
        a.proportions.clone()
    };
    println!("proportion_pct,two_sigma_pct,points_needed");
    for p in ps {
        let n = points_needed(p, a.two_sigma).ok_or_else(|| Error::Usage {
            message: format!(
                "--proportion {p} with --two-sigma {}: expected a proportion from 0 to 100 and a precision above 0",
                a.two_sigma
            ),
        })?;
        println!("{p},{},{n}", a.two_sigma);
    }
    Ok(())
}
