//! Runs the hooked solver on an encoding: loads the clauses, solves with the
//! minimality hook, and reads a model back as a colouring.

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_cdcl::{Outcome, SearchHook, Solver};
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

/// The caller's stop flag or a signal.
pub fn stopped(stop: &AtomicBool) -> bool {
    stop.load(std::sync::atomic::Ordering::Relaxed) || crate::search::interrupt::interrupted()
}

/// One run to the first answer.
pub fn solve_encoding(
    solver: &mut Solver<'_>,
    encoding: &RamseyEncoding,
    hook: &mut dyn SearchHook,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> (Outcome, Option<Colouring>) {
    let outcome = solver.solve(hook, &|| stopped(stop), deadline);
    let colouring =
        (outcome == Outcome::Satisfiable).then(|| model_colouring(solver, encoding.variables()));
    (outcome, colouring)
}

/// The colour maps the check may use: every permutation of colours with equal
/// forbidden graphs when `swap`, else the identity only.
pub fn colour_maps(spec: &ramsift_encoder::RamseySpec, swap: bool) -> Vec<Vec<u8>> {
    if swap {
        let classes: Vec<String> = spec.forbidden().iter().map(|g| g.to_string()).collect();
        crate::enumerate::canonical::colour_permutations(&classes)
    } else {
        vec![(0..=spec.colours() as u8).collect()]
    }
}

/// What a certified hooked run produced.
#[derive(Debug)]
pub struct HookedRun {
    pub outcome: Outcome,
    pub colouring: Option<Colouring>,
    pub proof_bytes: u64,
    pub certificate_bytes: u64,
    pub solver: ramsift_cdcl::SolverStats,
    pub minimality: crate::minimality::hook::MinimalityStats,
}

/// Solves `encoding` with the minimality hook, writing the DRAT trace to `trace`
/// and the minimality clauses with their witnesses to `certificate`.
pub fn solve_certified(
    encoding: &RamseyEncoding,
    trace: &std::fs::File,
    certificate: &std::fs::File,
    text_proof: bool,
    bytes_seen: Option<&std::sync::atomic::AtomicU64>,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> std::io::Result<HookedRun> {
    use crate::certify::drat_write::DratSink;
    use crate::minimality::hook::{MinimalityHook, DEFAULT_BUDGET};
    use std::io::BufWriter;

    let vars = *encoding.variables();
    let maps = colour_maps(encoding.instance().spec(), true);
    let mut hook = MinimalityHook::new(vars, maps, DEFAULT_BUDGET)
        .with_certificate(Box::new(BufWriter::with_capacity(1 << 20, certificate)))?;
    let mut sink = DratSink::new(
        BufWriter::with_capacity(1 << 20, trace),
        text_proof,
        bytes_seen,
    );
    let (outcome, colouring, solver_stats) = {
        let mut solver = loaded_solver(encoding);
        solver.set_proof(Box::new(&mut sink));
        let (outcome, colouring) = solve_encoding(&mut solver, encoding, &mut hook, stop, deadline);
        (outcome, colouring, solver.stats().clone())
    };
    let proof_bytes = sink.finish()?;
    let certificate_bytes = hook.finish()?;
    Ok(HookedRun {
        outcome,
        colouring,
        proof_bytes,
        certificate_bytes,
        solver: solver_stats,
        minimality: hook.stats,
    })
}
