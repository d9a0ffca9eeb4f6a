//! The minimality check as the solver's search hook: at every fixpoint the
//! partial matrix is searched for a smaller relabelling (with a budget; without
//! one once every variable is assigned), and a witness becomes the clause "not all
//! of these edges keep their known colours", written to the certificate with it.

use std::io::{self, Write};
use std::time::Instant;

use ramsift_cdcl::{Assignment, SearchHook};
use ramsift_encoder::VariableMap;

use crate::minimality::certificate::CertificateWriter;
use crate::minimality::matrix::PartialMatrix;
use crate::minimality::search::{find_smaller, relabelled_is_smaller, Verdict};

/// Candidate vertices a partial check may try (measured on (3,7;23) and
/// (3,6;17): see BENCHMARKS.md, "Minimality checks").
pub const DEFAULT_BUDGET: u64 = 20_000;

/// Where the hook's time and clauses went.
#[derive(Clone, Debug, Default, serde::Serialize)]
pub struct MinimalityStats {
    pub checks: u64,
    pub partial_clauses: u64,
    pub complete_clauses: u64,
    pub gave_up: u64,
    pub steps: u64,
    pub check_seconds: f64,
}

/// The hook; see the module documentation.
pub struct MinimalityHook<'w> {
    vars: VariableMap,
    colour_maps: Vec<Vec<u8>>,
    budget: u64,
    certificate: Option<CertificateWriter<Box<dyn Write + 'w>>>,
    write_error: Option<io::Error>,
    pub stats: MinimalityStats,
}

impl<'w> MinimalityHook<'w> {
    /// `colour_maps` lists the colour permutations allowed (identity first).
    pub fn new(vars: VariableMap, colour_maps: Vec<Vec<u8>>, budget: u64) -> Self {
        MinimalityHook {
            vars,
            colour_maps,
            budget,
            certificate: None,
            write_error: None,
            stats: Default::default(),
        }
    }

    /// Writes every clause with its witness to `out`.
    pub fn with_certificate(mut self, out: Box<dyn Write + 'w>) -> io::Result<Self> {
        self.certificate = Some(CertificateWriter::new(
            out,
            self.vars.order(),
            self.vars.colours(),
        )?);
        Ok(self)
    }

    /// Flushes the certificate; the first write error, if any, is returned here.
    pub fn finish(&mut self) -> io::Result<()> {
        if let Some(e) = self.write_error.take() {
            return Err(e);
        }
        if let Some(writer) = self.certificate.take() {
            writer.finish()?;
        }
        Ok(())
    }
}

impl SearchHook for MinimalityHook<'_> {
    fn at_fixpoint(&mut self, assignment: Assignment<'_>, complete: bool) -> Option<Vec<i32>> {
        let started = Instant::now();
        self.stats.checks += 1;
        let matrix = PartialMatrix::read(&self.vars, assignment);
        let budget = (!complete).then_some(self.budget);
        let verdict = find_smaller(&matrix, &self.colour_maps, budget, &mut self.stats.steps);
        let clause = match verdict {
            Verdict::Smaller(witness) => {
                debug_assert!(relabelled_is_smaller(&matrix, &witness));
                let mut true_now = Vec::new();
                for &e in &witness.edges {
                    matrix.reasons(&self.vars, e, &mut true_now);
                }
                let clause: Vec<i32> = true_now.iter().map(|&l| -l).collect();
                if complete {
                    self.stats.complete_clauses += 1;
                } else {
                    self.stats.partial_clauses += 1;
                }
                if let Some(writer) = &mut self.certificate {
                    if let Err(e) = writer.write(&witness, &clause) {
                        self.write_error.get_or_insert(e);
                    }
                }
                Some(clause)
            }
            Verdict::GaveUp => {
                self.stats.gave_up += 1;
                None
            }
            Verdict::NoneFound => None,
        };
        self.stats.check_seconds += started.elapsed().as_secs_f64();
        clause
    }
}
