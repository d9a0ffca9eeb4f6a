//! Reader for ramsift's colouring file format (written by `ramsift find`):
//!
//! ```text
//! # comment lines and blank lines may appear anywhere
//! ramsift-colouring spec=4,4 order=17
//! . 1 2 2 …        <- row 0: colour of edge {0,j} for every j, '.' on the diagonal
//! 1 . 1 2 …
//! ```
//!
//! The header names the claim's forbidden graphs (`spec=`) and the order. Then come
//! exactly `order` rows of `order` whitespace-separated entries; entry j of row i is
//! the colour (1..=r) of edge {i, j}. The matrix must be symmetric.

use crate::claim::Claim;
use crate::input_error::InputError;
use crate::matrix::ColourMatrix;

/// The header keyword that starts a colouring file.
pub const MAGIC: &str = "ramsift-colouring";

/// The largest order the checker will read (the matrix is held in memory).
pub const MAX_ORDER: usize = 10_000;

/// A parsed colouring file: the claim in its header and the colouring.
#[derive(Clone, Debug)]
pub struct ColouringFile {
    pub claim: Claim,
    pub matrix: ColourMatrix,
}

/// Parses a colouring file; `name` is used in error messages.
pub fn parse_colouring_file(name: &str, text: &str) -> Result<ColouringFile, InputError> {
    let mut lines =
        text.lines().enumerate().map(|(i, l)| (i + 1, l.trim())).filter(|(_, l)| !l.is_empty() && !l.starts_with('#'));
    let (header_line, header) = lines
        .next()
        .ok_or_else(|| InputError::whole(name, format!("empty file: expected a header line starting with {MAGIC}")))?;
    let (claim, order) = parse_header(name, header_line, header)?;
    let colours = claim.colours();
    let mut matrix = ColourMatrix::filled(order, 0);
    for row in 0..order {
        let (line_no, line) = lines.next().ok_or_else(|| {
            let why = format!("the file ends after {row} matrix rows; the header promises {order}");
            InputError::whole(name, why)
        })?;
        let bad = |why: String| InputError::at_line(name, line_no, why);
        let entries: Vec<&str> = line.split_whitespace().collect();
        if entries.len() != order {
            return Err(bad(format!("row {row} has {} entries, expected {order}", entries.len())));
        }
        for (col, entry) in entries.iter().enumerate() {
            let at = format!("row {row}, column {col}");
            if col == row {
                if *entry != "." {
                    return Err(bad(format!("{at} is the diagonal: expected '.', found {entry:?}")));
                }
                continue;
            }
            let colour: usize = entry
                .parse()
                .ok()
                .filter(|c| (1..=colours).contains(c))
                .ok_or_else(|| bad(format!("{at} is {entry:?}: expected a colour from 1 to {colours}")))?;
            let mirror = matrix.colour(col, row) as usize;
            if col < row && mirror != colour {
                return Err(bad(format!(
                    "{at} is {colour} but row {col}, column {row} is {mirror}: the matrix must be symmetric"
                )));
            }
            matrix.set(row, col, colour as u8);
        }
    }
    if let Some((line_no, _)) = lines.next() {
        let why = format!("unexpected content after the {order} matrix rows");
        return Err(InputError::at_line(name, line_no, why));
    }
    Ok(ColouringFile { claim, matrix })
}

fn parse_header(name: &str, line_no: usize, header: &str) -> Result<(Claim, usize), InputError> {
    let bad = |why: String| InputError::at_line(name, line_no, why);
    let mut words = header.split_whitespace();
    if words.next() != Some(MAGIC) {
        return Err(bad(format!("expected a header line starting with {MAGIC}, found {header:?}")));
    }
    let (mut claim, mut order) = (None, None);
    for word in words {
        let (key, value) =
            word.split_once('=').ok_or_else(|| bad(format!("header field {word:?} is not of the form key=value")))?;
        match key {
            "spec" => claim = Some(Claim::parse(value).map_err(|e| bad(format!("header field spec: {e}")))?),
            "order" => {
                let n = value.parse().ok().filter(|n| (1..=MAX_ORDER).contains(n));
                let why = format!("header field order={value}: expected a whole number from 1 to {MAX_ORDER}");
                order = Some(n.ok_or_else(|| bad(why))?);
            }
            other => return Err(bad(format!("unknown header field {other:?}: expected spec= and order="))),
        }
    }
    let claim = claim.ok_or_else(|| bad("header has no spec= field".into()))?;
    Ok((claim, order.ok_or_else(|| bad("header has no order= field".into()))?))
}

#[cfg(test)]
mod tests {
    use super::*;

    const PENTAGON: &str = "# the pentagon and its complement\nramsift-colouring spec=3,3 order=5\n\
        . 1 2 2 1\n1 . 1 2 2\n2 1 . 1 2\n2 2 1 . 1\n1 2 2 1 .\n";

    #[test]
    fn reads_the_pentagon() {
        let file = parse_colouring_file("p.txt", PENTAGON).unwrap();
        assert_eq!(file.claim.clique_sizes(), Some(vec![3, 3]));
        assert_eq!(file.matrix.order(), 5);
        assert_eq!(file.matrix.colour(0, 1), 1);
        assert_eq!(file.matrix.colour(3, 0), 2);
    }

    fn error_of(text: &str) -> String {
        parse_colouring_file("f", text).unwrap_err().to_string()
    }

    #[test]
    fn errors_say_where_and_what() {
        assert!(error_of("").contains("empty file"));
        assert!(error_of("hello\n").starts_with("f:1: expected a header"));
        assert!(error_of("ramsift-colouring spec=3,3\n").contains("no order="));
        assert!(error_of("ramsift-colouring order=2\n").contains("no spec="));
        assert!(error_of("ramsift-colouring spec=3,3 order=0\n").contains("order=0"));
        assert!(error_of("ramsift-colouring spec=3 order=2\n").contains("spec"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2 x=1\n").contains("unknown header field"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2\n. 1\n").contains("ends after 1"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2\n. 1\n1 . 1\n").starts_with("f:3: row 1 has 3"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2\n1 1\n1 .\n").contains("diagonal"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2\n. 3\n3 .\n").contains("colour from 1 to 2"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2\n. 1\n2 .\n").contains("symmetric"));
        assert!(error_of("ramsift-colouring spec=3,3 order=2\n. 1\n1 .\n. .\n").contains("after the 2 matrix rows"));
    }
}
