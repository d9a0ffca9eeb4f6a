//! The optional CaDiCaL backend (`--features cadical`, `find --solver cadical`),
//! through the rustsat-cadical binding. Unlike varisat, CaDiCaL has a seed option,
//! settable phases and an interrupt, so every worker is a complete solver on the
//! same formula, diversified by its seed and random initial phases; the first
//! answer wins and interrupts the others.

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Mutex;
use std::time::{Duration, Instant};

use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;
use rustsat::solvers::{Interrupt, InterruptSolver, PhaseLit, Solve, SolverResult};
use rustsat::types::{Lit, TernaryVal};
use rustsat_cadical::CaDiCaL;

use ramsift_encoder::RamseySpec;

use crate::certify::witness_check::verify_witness;
use crate::search::formula::Formula;
use crate::search::portfolio::{SearchError, SearchOptions, SearchReport, SearchResult};

/// The backend's name and version recorded in outputs.
pub const SOLVER_NAME: &str = "CaDiCaL (rustsat-cadical 0.7.5)";

fn lit(l: i32) -> Lit {
    Lit::from_ipasir(l).expect("non-zero DIMACS literal")
}

/// One worker on `solver`: returns Some(result) if it answered. The caller keeps the
/// solver alive until no thread can interrupt it any more.
fn worker(
    solver: &mut CaDiCaL<'_, '_>,
    formula: &Formula,
    spec: &RamseySpec,
    seed: u64,
    stop: &AtomicBool,
    interrupters: &Mutex<Vec<Box<dyn InterruptSolver + Send>>>,
) -> Result<Option<SearchResult>, SearchError> {
    let err = |e: anyhow::Error| SearchError::Backend(e.to_string());
    solver
        .set_option("seed", (seed % (i32::MAX as u64)) as i32)
        .map_err(err)?;
    for clause in formula.clauses() {
        let lits: Vec<Lit> = clause.iter().map(|&l| lit(l)).collect();
        solver.add_clause_ref(lits.as_slice()).map_err(err)?;
    }
    let mut rng = ChaCha8Rng::seed_from_u64(seed);
    for var in 1..=formula.variables().colour_variable_count() as i32 {
        solver
            .phase_lit(lit(if rng.gen_bool(0.5) { var } else { -var }))
            .map_err(err)?;
    }
    interrupters
        .lock()
        .expect("interrupter lock")
        .push(Box::new(solver.interrupter()));
    if stop.load(Ordering::SeqCst) {
        return Ok(None);
    }
    match solver.solve().map_err(err)? {
        SolverResult::Sat => {
            let model = solver.full_solution().map_err(err)?;
            let colouring = formula
                .variables()
                .decode(|v| model.lit_value(lit(v as i32)) == TernaryVal::True);
            let verdict = verify_witness(spec, &colouring);
            if !verdict.is_valid() {
                return Err(SearchError::WitnessRejected(verdict.to_string()));
            }
            Ok(Some(SearchResult::Found {
                colouring,
                found_by: format!("CaDiCaL worker with seed {seed}"),
            }))
        }
        SolverResult::Unsat => Ok(Some(SearchResult::NoneExists)),
        SolverResult::Interrupted => Ok(None),
    }
}

/// Runs `options.threads` CaDiCaL workers; the first answer stops the rest.
pub fn search_cadical(
    formula: &Formula,
    spec: &RamseySpec,
    options: &SearchOptions,
) -> Result<SearchReport, SearchError> {
    let started = Instant::now();
    let threads = options.threads.max(1);
    let stop = AtomicBool::new(false);
    let interrupters: Mutex<Vec<Box<dyn InterruptSolver + Send>>> = Mutex::new(Vec::new());
    let answer: Mutex<Option<Result<SearchResult, SearchError>>> = Mutex::new(None);
    // Interrupters point into live solvers: every solver is kept until all workers have
    // finished solving and the list is emptied (first barrier, clear, second barrier).
    let barrier = std::sync::Barrier::new(threads);
    let interrupt_all = || {
        stop.store(true, Ordering::SeqCst);
        for i in interrupters.lock().expect("interrupter lock").iter() {
            i.interrupt();
        }
    };
    std::thread::scope(|scope| {
        let handles: Vec<_> = (0..threads)
            .map(|w| {
                let (stop, interrupters, answer, interrupt_all, barrier) =
                    (&stop, &interrupters, &answer, &interrupt_all, &barrier);
                scope.spawn(move || {
                    let seed = options
                        .seed
                        .wrapping_mul(0x9e37_79b9)
                        .wrapping_add(w as u64);
                    let mut solver = CaDiCaL::default();
                    let outcome = worker(&mut solver, formula, spec, seed, stop, interrupters);
                    let answer_now = match outcome {
                        Ok(None) => None,
                        Ok(Some(result)) => Some(Ok(result)),
                        Err(e) => Some(Err(e)),
                    };
                    if let Some(value) = answer_now {
                        let mut slot = answer.lock().expect("answer lock");
                        if slot.is_none() {
                            *slot = Some(value);
                        }
                        drop(slot);
                        interrupt_all();
                    }
                    if barrier.wait().is_leader() {
                        interrupters.lock().expect("interrupter lock").clear();
                    }
                    barrier.wait();
                    drop(solver);
                })
            })
            .collect();
        while handles.iter().any(|h| !h.is_finished()) {
            std::thread::sleep(Duration::from_millis(5));
            if options.timeout.is_some_and(|t| started.elapsed() >= t)
                || stop.load(Ordering::SeqCst)
            {
                // Workers that registered late are interrupted again on the next pass.
                interrupt_all();
            }
        }
    });
    let result = answer
        .into_inner()
        .expect("answer lock")
        .unwrap_or(Ok(SearchResult::Unknown))?;
    Ok(SearchReport {
        result,
        attempts: threads as u64,
        elapsed: started.elapsed(),
        threads,
    })
}
