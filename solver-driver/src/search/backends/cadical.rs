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

use crate::search::first_answer::{verified, FirstAnswer};
use crate::search::formula::Formula;
use crate::search::job::{SearchError, SearchJob, SearchReport, SearchResult};

/// The backend's name and version recorded in outputs.
pub const SOLVER_NAME: &str = "CaDiCaL (rustsat-cadical 0.7.5)";

fn lit(l: i32) -> Lit {
    Lit::from_ipasir(l).expect("non-zero DIMACS literal")
}

/// A failure of the binding, as a search error.
fn backend_error(e: impl std::fmt::Display) -> SearchError {
    SearchError::Backend(e.to_string())
}

/// Interrupters of the live solvers.
type Interrupters = Mutex<Vec<Box<dyn InterruptSolver + Send>>>;

/// One worker on `solver`: returns Some(result) if it answered. The caller keeps the
/// solver alive until no thread can interrupt it any more.
fn worker(
    solver: &mut CaDiCaL<'_, '_>,
    job: &SearchJob,
    formula: &Formula,
    seed: u64,
    stop: &AtomicBool,
    interrupters: &Interrupters,
) -> Result<Option<SearchResult>, SearchError> {
    solver
        .set_option("seed", (seed % (i32::MAX as u64)) as i32)
        .map_err(backend_error)?;
    for clause in formula.clauses() {
        let lits: Vec<Lit> = clause.iter().map(|&l| lit(l)).collect();
        solver
            .add_clause_ref(lits.as_slice())
            .map_err(backend_error)?;
    }
    let mut rng = ChaCha8Rng::seed_from_u64(seed);
    for var in 1..=formula.variables().colour_variable_count() as i32 {
        solver
            .phase_lit(lit(if rng.gen_bool(0.5) { var } else { -var }))
            .map_err(backend_error)?;
    }
    interrupters
        .lock()
        .expect("interrupter lock")
        .push(Box::new(solver.interrupter()));
    if stop.load(Ordering::SeqCst) {
        return Ok(None);
    }
    job.count_attempt(0);
    match solver.solve().map_err(backend_error)? {
        SolverResult::Sat => {
            let model = solver.full_solution().map_err(backend_error)?;
            let colouring = formula
                .variables()
                .decode(|v| model.lit_value(lit(v as i32)) == TernaryVal::True);
            verified(
                job.spec(),
                colouring,
                format!("CaDiCaL worker with seed {seed}"),
            )
            .map(Some)
        }
        SolverResult::Unsat => Ok(Some(SearchResult::NoneExists)),
        SolverResult::Interrupted => Ok(None),
    }
}

/// Runs the job's thread count of CaDiCaL workers on `formula`; the first answer
/// stops the rest.
pub fn search_cadical(job: &SearchJob, formula: &Formula) -> Result<SearchReport, SearchError> {
    job.check_formula(formula)?;
    let started = Instant::now();
    let threads = job.threads();
    let answer = FirstAnswer::default();
    let interrupters: Interrupters = Mutex::new(Vec::new());
    // Interrupters point into live solvers: every solver is kept until all workers have
    // finished solving and the list is emptied (first barrier, clear, second barrier).
    let barrier = std::sync::Barrier::new(threads);
    let interrupt_all = || {
        answer.stop.store(true, Ordering::SeqCst);
        for i in interrupters.lock().expect("interrupter lock").iter() {
            i.interrupt();
        }
    };
    std::thread::scope(|scope| {
        let handles: Vec<_> = (0..threads)
            .map(|w| {
                let (answer, interrupters, interrupt_all, barrier) =
                    (&answer, &interrupters, &interrupt_all, &barrier);
                scope.spawn(move || {
                    let seed = job
                        .options
                        .seed
                        .wrapping_mul(0x9e37_79b9)
                        .wrapping_add(w as u64);
                    let mut solver = CaDiCaL::default();
                    let outcome =
                        worker(&mut solver, job, formula, seed, &answer.stop, interrupters);
                    let answered = !matches!(outcome, Ok(None));
                    answer.offer(outcome);
                    if answered {
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
            if job.options.timeout.is_some_and(|t| started.elapsed() >= t) || answer.stopped() {
                // Workers that registered late are interrupted again on the next pass.
                interrupt_all();
            }
        }
    });
    answer.into_report(job, started)
}
