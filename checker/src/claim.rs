//! The forbidden-graph list of a claim, read with the checker's own parser:
//! `4,4` means colour 1 forbids K4 and colour 2 forbids K4 (`K4` is also accepted).

use std::fmt;

/// The most colours a claim may name.
pub const MAX_COLOURS: usize = 16;

/// Forbidden clique sizes, one per colour (colour c forbids `clique_sizes[c-1]`).
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Claim {
    pub clique_sizes: Vec<usize>,
}

impl Claim {
    /// Reads `4,4`; the error says which entry is wrong and why.
    pub fn parse(text: &str) -> Result<Claim, String> {
        let text = text.trim();
        if text.is_empty() {
            return Err("empty list: expected clique sizes such as 4,4".to_string());
        }
        let mut clique_sizes = Vec::new();
        for (index, raw) in text.split(',').enumerate() {
            let token = raw.trim();
            let digits = token.trim_start_matches(['K', 'k']);
            let valid_digits = !digits.is_empty()
                && digits.bytes().all(|b| b.is_ascii_digit())
                && token.len() - digits.len() <= 1;
            let size: usize = match digits.parse() {
                Ok(size) if valid_digits => size,
                _ => {
                    return Err(format!(
                        "entry {} is {:?}: expected a clique size such as 4 or K4",
                        index + 1,
                        token
                    ))
                }
            };
            if size < 2 {
                return Err(format!(
                    "entry {} forbids K{}: a forbidden clique needs at least 2 vertices",
                    index + 1,
                    size
                ));
            }
            clique_sizes.push(size);
        }
        if clique_sizes.len() < 2 || clique_sizes.len() > MAX_COLOURS {
            return Err(format!(
                "{} colour(s) listed: a claim needs between 2 and {MAX_COLOURS}",
                clique_sizes.len()
            ));
        }
        Ok(Claim { clique_sizes })
    }

    pub fn colours(&self) -> usize {
        self.clique_sizes.len()
    }
}

impl fmt::Display for Claim {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let parts: Vec<String> = self.clique_sizes.iter().map(|k| k.to_string()).collect();
        f.write_str(&parts.join(","))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_lists() {
        assert_eq!(Claim::parse("4,4").unwrap().clique_sizes, vec![4, 4]);
        assert_eq!(Claim::parse("K3,3,k3").unwrap().clique_sizes, vec![3, 3, 3]);
    }

    #[test]
    fn rejects_bad_lists() {
        for bad in ["", "4", "4,", "4,x", "4,1", "KK4,4", "-4,4", "4.5,4"] {
            assert!(Claim::parse(bad).is_err(), "{bad:?} accepted");
        }
    }
}
