//! Runs the hooked solver on an encoding: loads the clauses, solves with the
//! minimality hook, and reads a model back as a colouring.

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_cdcl::{Outcome, SearchHook, Solver};

use crate::enumerate::canonical::colour_maps;
use crate::search::interrupt::stop_requested;
use ramsift_encoder::edges::edge_index;
use ramsift_encoder::{Colouring, RamseyEncoding, VariableMap};

/// A solver holding every clause of `encoding`.
pub fn loaded_solver<'p>(encoding: &RamseyEncoding) -> Solver<'p> {
    let mut solver = Solver::new();
    solver.reserve_variables(encoding.variable_count());
    encoding
        .for_each_clause::<()>(|clause| {
            solver.add_clause(clause);
            Ok(())
        })
        .expect("adding clauses cannot fail");
    solver
}

/// The colouring of the solver's current (complete) assignment.
pub fn model_colouring(solver: &Solver<'_>, vars: &VariableMap) -> Colouring {
    vars.decode(|v| solver.model_value(v) == Some(true))
}

/// The clause that only the labelled colouring `colouring` falsifies.
pub fn blocking_clause(vars: &VariableMap, colouring: &Colouring) -> Vec<i32> {
    let n = vars.order();
    (0..n)
        .flat_map(|j| (0..j).map(move |i| (i, j)))
        .map(|(i, j)| -vars.colour_literal(edge_index(i, j), colouring.colour(i, j) as usize))
        .collect()
}

/// One run to the first answer.
pub fn solve_encoding(
    solver: &mut Solver<'_>,
    encoding: &RamseyEncoding,
    hook: &mut dyn SearchHook,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> (Outcome, Option<Colouring>) {
    let outcome = solver.solve(hook, &|| stop_requested(stop), deadline);
    let colouring =
        (outcome == Outcome::Satisfiable).then(|| model_colouring(solver, encoding.variables()));
    (outcome, colouring)
}

/// What a certified hooked run produced.
#[derive(Debug)]
pub struct HookedRun {
    pub outcome: Outcome,
    pub colouring: Option<Colouring>,
    pub proof_bytes: u64,
    pub solver: ramsift_cdcl::SolverStats,
    pub minimality: crate::minimality::hook::MinimalityStats,
}

/// Where a certified hooked run writes.
pub struct CertifiedOutputs<'a> {
    /// The DRAT trace.
    pub trace: &'a std::fs::File,
    /// The minimality clauses with their witnesses.
    pub certificate: &'a std::fs::File,
    /// Text DRAT instead of binary.
    pub text_proof: bool,
    /// Counts trace bytes for progress lines.
    pub bytes_seen: Option<&'a std::sync::atomic::AtomicU64>,
}

/// Solves `encoding`, with `units` added as unit clauses (a shard's cube), with
/// the minimality hook (partial checks limited to `budget` candidate vertices),
/// writing the trace and the certificate.
pub fn solve_certified(
    encoding: &RamseyEncoding,
    units: &[i32],
    outputs: CertifiedOutputs<'_>,
    budget: u64,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> std::io::Result<HookedRun> {
    use crate::certify::drat_write::DratSink;
    use crate::minimality::hook::MinimalityHook;
    use std::io::BufWriter;

    let vars = *encoding.variables();
    let maps = colour_maps(encoding.instance().spec(), true);
    let mut hook = MinimalityHook::new(vars, maps, budget).with_certificate(Box::new(
        BufWriter::with_capacity(1 << 20, outputs.certificate),
    ))?;
    let mut sink = DratSink::new(
        BufWriter::with_capacity(1 << 20, outputs.trace),
        outputs.text_proof,
        outputs.bytes_seen,
    );
    let (outcome, colouring, solver_stats) = {
        let mut solver = loaded_solver(encoding);
        for &unit in units {
            solver.add_clause(&[unit]);
        }
        solver.set_proof(Box::new(&mut sink));
        let (outcome, colouring) = solve_encoding(&mut solver, encoding, &mut hook, stop, deadline);
        (outcome, colouring, solver.stats().clone())
    };
    let proof_bytes = sink.finish()?;
    hook.finish()?;
    Ok(HookedRun {
        outcome,
        colouring,
        proof_bytes,
        solver: solver_stats,
        minimality: hook.stats,
    })
}
