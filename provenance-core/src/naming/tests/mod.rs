//! Tests of the naming schemes. Worked examples are derived here from the published rules;
//! each names its source.

mod folk;
mod garzanti;
mod pettijohn;
mod scaling;
mod table;

use crate::counts::{Framework, NonFramework, Sample};

/// A counted sample from counts in the order Qm, Qp, C, P, K, Lv, Ls, Lm.
pub(super) fn counts(c: [u32; 8]) -> Sample {
    let [qm, qp, c, p, k, lv, ls, lm] = c.map(f64::from);
    Sample::counted(
        "test",
        Framework {
            qm,
            qp,
            c,
            p,
            k,
            lv,
            ls,
            lm,
        },
    )
}

/// The same sample with a matrix count.
pub(super) fn with_matrix(mut s: Sample, matrix: u32) -> Sample {
    s.other = NonFramework {
        matrix: Some(f64::from(matrix)),
        ..Default::default()
    };
    s
}
