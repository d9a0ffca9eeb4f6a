//! The SPEC N arguments shared by the subcommands, and turning them into an encoding.

use std::path::PathBuf;

use anyhow::{Context, Result};
use clap::Args;

use ramsift_driver::search::memory;
use ramsift_encoder::clauses::DEFAULT_MAX_CLAUSES;
use ramsift_encoder::{
    EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetryChoice, SymmetrySet,
};

#[derive(Args, Clone, Debug)]
pub struct InstanceArgs {
    /// Forbidden graph of each colour, comma separated: clique sizes (4,4 or 3,3,3) or
    /// graphs (C4,K4; entries Kk, Kk-e, Ck, Pk, Ka:b (K1:k a star), W_n (n vertices), Bk, G6:…, E:0-1/1-2…).
    #[arg(value_name = "SPEC")]
    pub spec: String,
    /// Order n of the complete graph K_n whose edges are coloured.
    #[arg(value_name = "N")]
    pub order: usize,
    /// Refuse instances needing more clauses than this.
    #[arg(long, value_name = "COUNT", default_value_t = DEFAULT_MAX_CLAUSES)]
    pub max_clauses: u64,
    /// Refuse work whose formula would need more memory than this (e.g. 512M, 16G);
    /// the refusal says the estimate. Default: three quarters of this machine's memory.
    #[arg(long, value_name = "SIZE", value_parser = memory::parse_size)]
    pub max_memory: Option<u64>,
}

impl InstanceArgs {
    pub fn instance(&self) -> Result<Instance> {
        let spec: RamseySpec = self
            .spec
            .parse()
            .with_context(|| format!("specification {:?}", self.spec))?;
        Ok(Instance::new(spec, self.order)?)
    }

    /// The encoding with the static symmetry schemes chosen by `symmetry`
    /// (`default`: every scheme that applies to the specification,
    /// [`SymmetrySet::for_refutation`]); a scheme applied during the search is refused.
    pub fn encoding(&self, symmetry: &SymmetryChoice) -> Result<RamseyEncoding> {
        let instance = self.instance()?;
        let symmetry = symmetry.resolve(|| SymmetrySet::for_refutation(instance.spec()));
        anyhow::ensure!(
            !symmetry.has_dynamic(),
            "--symmetry {symmetry}: minimality is applied during the search by our own solver, \
             which only `ramsift refute` and `ramsift enumerate` run; here choose among \
             colour-swap, lex-leader and degree-bounds"
        );
        self.encoding_with(&instance, &symmetry)
    }

    /// The encoding for `ramsift refute`: `default` is
    /// [`SymmetrySet::for_certified_refutation`], and minimality is allowed.
    pub fn refutation_encoding(&self, symmetry: &SymmetryChoice) -> Result<RamseyEncoding> {
        let instance = self.instance()?;
        let symmetry = symmetry.resolve(|| SymmetrySet::for_certified_refutation(instance.spec()));
        self.encoding_with(&instance, &symmetry)
    }

    fn encoding_with(&self, instance: &Instance, symmetry: &SymmetrySet) -> Result<RamseyEncoding> {
        let limits = EncodingLimits {
            max_clauses: self.max_clauses,
        };
        Ok(RamseyEncoding::with_symmetry(instance, symmetry, &limits)?)
    }
}

impl InstanceArgs {
    /// The `--max-memory` limit in bytes.
    pub fn memory_limit(&self) -> u64 {
        self.max_memory.unwrap_or_else(memory::default_limit)
    }

    /// Whether `solvers` solvers can hold the encoding's formula within the limit.
    pub fn fits(
        &self,
        encoding: &RamseyEncoding,
        what: &str,
        solvers: usize,
    ) -> Result<(), memory::OverMemory> {
        let limit = self.memory_limit();
        memory::check(
            what,
            encoding.literal_count(),
            encoding.clause_count(),
            solvers,
            limit,
        )
    }
}

/// `--out DIR` and `--force`, shared by the commands that write a directory.
#[derive(Args, Clone, Debug)]
pub struct OutDirArgs {
    /// The directory to write (created if needed): the bundle, or the plan.
    #[arg(long, value_name = "DIR")]
    pub out: PathBuf,
    /// Clear the output directory first if it holds anything (otherwise it is refused).
    #[arg(long)]
    pub force: bool,
}

impl OutDirArgs {
    /// Makes the directory ready to be written (see `output::dir::prepare`).
    pub fn prepare(&self) -> Result<()> {
        Ok(ramsift_driver::output::dir::prepare(&self.out, self.force)?)
    }
}

/// Reads `--timeout SECONDS`: a positive, finite number.
pub fn timeout_of(seconds: Option<f64>) -> Result<Option<std::time::Duration>> {
    match seconds {
        Some(t) if !(t.is_finite() && t > 0.0) => {
            anyhow::bail!("--timeout {t}: expected a positive number of seconds")
        }
        t => Ok(t.map(std::time::Duration::from_secs_f64)),
    }
}
