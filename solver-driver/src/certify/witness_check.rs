//! Every witness is verified by the checker crate's own code before it is reported.

use ramsift_checker::{check_colouring, Claim, ColourMatrix, Verdict};
use ramsift_encoder::{Colouring, RamseySpec};

/// The colouring as the checker's matrix type.
pub fn to_matrix(colouring: &Colouring) -> ColourMatrix {
    let mut matrix = ColourMatrix::filled(colouring.order(), 0);
    for j in 0..colouring.order() {
        for i in 0..j {
            matrix.set(i, j, colouring.colour(i, j));
        }
    }
    matrix
}

/// The checker's claim for a specification, read by the checker's own parser from
/// the specification's text (so a disagreement between the two parsers shows up as
/// a rejected witness rather than passing silently).
pub fn to_claim(spec: &RamseySpec) -> Claim {
    Claim::parse(&spec.to_string())
        .expect("the checker reads every specification the encoder writes")
}

/// The checker's verdict on a colouring for a specification.
pub fn verify_witness(spec: &RamseySpec, colouring: &Colouring) -> Verdict {
    check_colouring(&to_matrix(colouring), &to_claim(spec))
}
