//! The default strategy of `ramsift find` (`--method auto`): structured families
//! first, then local search feeding the SAT driver, with one complete SAT worker
//! running throughout so that "no colouring exists" stays a complete answer.
//!
//! 1. **Structured stage**, on one thread before the full formula is built (30 s
//!    at most in all, 5 s per family, a timeout only cutting them short):
//!    circulant colourings at n; circulant colourings at n + 1 with a vertex
//!    deleted (deleting a vertex keeps a colouring valid); the other abelian Cayley
//!    families and the 2- and 3-block circulants at n. Each is exact for its family.
//!    With two or more threads, focused local search runs on the others meanwhile
//!    (where no family has a colouring, it often finds one long before the families
//!    are done: (3,8;27) has none among them).
//! 2. **Circulant neighbour seeds**: up to 16 distinct circulant colourings at
//!    n − 1, if any exist; each fixes every edge among the first n − 1 vertices and
//!    the SAT driver colours the edges of the last vertex (one extension attempt
//!    each); where none extends, old vertices are freed nearest the obstruction,
//!    one more per round, up to n/4 of them (20 s in all). They are also the
//!    first starts of local search, with the last vertex's edges drawn at random.
//! 3. **Local search and seeded SAT, alternating**: a slice of focused tabu search on the
//!    helper threads; if it does not reach zero, each of its best near-solutions
//!    becomes seeds for SAT attempts: all edges in no remaining monochromatic clique
//!    fixed, then the same with a random fifth of them released. The slice doubles
//!    each round, and the next slice starts from the near-solutions that the SAT
//!    attempts could not finish, each kicked (half of its edges in remaining
//!    copies recoloured at random), before random colourings. Every second slice
//!    searches over the edge orbits of involutions instead, one shape (p 2-cycles,
//!    n − 2p fixed vertices) per restart, shared out by how earlier restarts over
//!    each shape ended ([`crate::local::schedule`], carried from one such slice to
//!    the next): that is where the (4,6;34) colourings are found (BENCHMARKS.md,
//!    "Involutions").
//!
//! Specifications with forbidden graphs other than cliques go to the SAT portfolio
//! ([`crate::search::portfolio`]) alone (the structured families are for cliques),
//! or, when their formula does not fit in memory, to local search alone.
//!
//! Worker 0 solves the unrestricted formula for the whole run on its own thread. With
//! one thread, stages 1 and 2 run first and then worker 0 alone (no stage 3).

use std::sync::atomic::{AtomicBool, Ordering};
use std::time::{Duration, Instant};

use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;

use ramsift_encoder::Colouring;

use super::first_answer::{verified, FirstAnswer};
use super::formula::Formula;
use super::job::{SearchError, SearchJob, SearchReport, SearchResult};
use super::loosening::{extend_loosened, Loosened};
use super::portfolio::{complete_worker, search_until};
use super::seeding::{near_solution_seeds, seeded_attempt, Seed, SeedKind};
use crate::local::moves::kick;
use crate::local::search::LocalProgress;
use crate::local::{
    local_search, LocalOptions, LocalState, Pattern, VertexCycles, MAX_LOCAL_ORDER,
};
use crate::structured::{
    family_colourings, search_family, AbelianGroup, EdgeOrbits, FamilyChoice, FamilyOutcome,
};

/// Runs the hybrid search on `formula`, the formula of the job's K_n (no symmetry
/// breaking assumed).
pub fn hybrid_search(
    job: &SearchJob,
    formula: &Formula,
    tick: impl FnMut(Duration),
) -> Result<SearchReport, SearchError> {
    auto_search(job, tick, || Ok(Some(formula)))
}

/// The hybrid search with the formula built only after the structured stage: at
/// orders where the full formula is large (C(35,9) ≈ 7·10^7 clauses for (3,9;35))
/// a structured colouring is often found long before the formula could be built.
/// `build` gives None when the formula would not fit in memory.
pub fn auto_search<F: std::borrow::Borrow<Formula>>(
    job: &SearchJob,
    mut tick: impl FnMut(Duration),
    build: impl FnOnce() -> Result<Option<F>, SearchError>,
) -> Result<SearchReport, SearchError> {
    let started = Instant::now();
    let deadline = job.deadline_from(started);
    if job.spec().is_cliques() {
        tick(Duration::ZERO);
        let found = if job.threads() >= 2 && job.order() <= MAX_LOCAL_ORDER {
            structured_beside_local(job)?
        } else {
            structured_stage(job, &AtomicBool::new(false))?
        };
        if let Some(found) = found {
            return Ok(job.report(found, started));
        }
    }
    if deadline.is_some_and(|d| Instant::now() >= d) {
        return Ok(job.report(SearchResult::Unknown, started));
    }
    let Some(formula) = build()? else {
        // The formula would not fit in memory: local search alone, to the deadline.
        let result = local_search_only(job, deadline)?;
        return Ok(job.report(result, started));
    };
    let formula = formula.borrow();
    job.check_formula(formula)?;
    let result = if job.spec().is_cliques() {
        later_stages(job, formula, deadline, &mut tick)?
    } else {
        // The structured families are written for cliques; other forbidden graphs
        // go to the SAT portfolio alone.
        search_until(job, formula, deadline, &mut tick)?.result
    };
    Ok(job.report(result, started))
}

/// What `find` does when the formula is too large to hold: local search (up to
/// its largest order) until the deadline; otherwise unknown.
fn local_search_only(
    job: &SearchJob,
    deadline: Option<Instant>,
) -> Result<SearchResult, SearchError> {
    if job.order() > MAX_LOCAL_ORDER {
        return Ok(SearchResult::Unknown);
    }
    let local_options = LocalOptions {
        threads: job.threads(),
        seed: job.options.seed,
        timeout: deadline.map(|d| d.saturating_duration_since(Instant::now())),
        ..LocalOptions::default()
    };
    let local_progress = LocalProgress::default();
    let found = local_search(
        &job.instance,
        &local_options,
        &AtomicBool::new(false),
        &local_progress,
    )?;
    job.progress
        .attempts
        .fetch_add(found.restarts, Ordering::Relaxed);
    match found.found {
        Some((colouring, by)) => verified(job.spec(), colouring, by),
        None => Ok(SearchResult::Unknown),
    }
}

/// Stages 2 and 3 beside the complete worker, until `deadline`.
fn later_stages(
    job: &SearchJob,
    formula: &Formula,
    deadline: Option<Instant>,
    tick: &mut impl FnMut(Duration),
) -> Result<SearchResult, SearchError> {
    let started = Instant::now();
    let threads = job.threads();
    let answer = FirstAnswer::default();
    let stop = &answer.stop;

    std::thread::scope(|scope| {
        let complete = scope.spawn(|| {
            if threads >= 2 {
                answer.offer(complete_worker(job, formula, stop, deadline));
            }
        });
        let helper = scope.spawn(|| {
            answer.offer(helper_stages(job, formula, stop, deadline));
            if threads < 2 && !answer.stopped() {
                answer.offer(complete_worker(job, formula, stop, deadline));
            }
        });
        // The helper may end early (nothing left to try); the complete worker goes on.
        while !(complete.is_finished() && helper.is_finished()) {
            std::thread::sleep(Duration::from_millis(50));
            tick(started.elapsed());
            if deadline.is_some_and(|d| Instant::now() >= d) {
                stop.store(true, Ordering::SeqCst);
            }
        }
    });
    Ok(answer.into_report(job, started)?.result)
}

/// How long the structured families may take in all, with or without --timeout
/// (a timeout only cuts it short).
const STRUCTURED_CAP: Duration = Duration::from_secs(30);
/// How long one structured family may take.
const FAMILY_CAP: Duration = Duration::from_secs(5);

/// The earlier of two optional instants (None: no bound).
fn earliest(a: Option<Instant>, b: Option<Instant>) -> Option<Instant> {
    match (a, b) {
        (Some(a), Some(b)) => Some(a.min(b)),
        (a, b) => a.or(b),
    }
}

/// Deletes the last vertex of a colouring.
fn drop_last_vertex(colouring: &Colouring) -> Colouring {
    Colouring::from_fn(colouring.order() - 1, colouring.colours(), |i, j| {
        colouring.colour(i, j)
    })
}

/// The families stage 1 tries, in order: circulant at n, circulant at n + 1 (to
/// delete a vertex from), the other abelian Cayley families and the block
/// circulants at n.
fn structured_families(order: usize) -> Vec<EdgeOrbits> {
    let mut tries: Vec<EdgeOrbits> = Vec::new();
    tries.extend(EdgeOrbits::circulant(order).ok());
    tries.extend(EdgeOrbits::circulant(order + 1).ok());
    for group in AbelianGroup::all_of_order(order).into_iter().skip(1) {
        tries.extend(EdgeOrbits::cayley(&group).ok());
    }
    tries.extend(
        FamilyChoice::BlockCirculant(None, 0)
            .families(order)
            .unwrap_or_default(),
    );
    tries
}

/// Stage 1: the structured families; `Some` when a colouring was found.
pub fn structured_stage(
    job: &SearchJob,
    stop: &AtomicBool,
) -> Result<Option<SearchResult>, SearchError> {
    let started = Instant::now();
    let order = job.order();
    // The same caps with and without --timeout; a timeout only cuts them short.
    let structured_deadline = earliest(Some(started + STRUCTURED_CAP), job.deadline_from(started));
    for orbits in structured_families(order) {
        if super::interrupt::should_stop(stop, structured_deadline) {
            return Ok(None);
        }
        job.progress.attempts.fetch_add(1, Ordering::Relaxed);
        // No single family may take more than FAMILY_CAP: large block-circulant
        // formulas can be slow.
        let family_deadline = structured_deadline.map(|d| d.min(Instant::now() + FAMILY_CAP));
        let report = search_family(&orbits, job.spec(), stop, family_deadline)?;
        if let FamilyOutcome::Found {
            colouring,
            description,
            ..
        } = report.outcome
        {
            let at = orbits.order;
            let (colouring, by) = if at > order {
                let by = format!(
                    "{} at order {at} with its last vertex deleted ({description})",
                    report.family
                );
                (drop_last_vertex(&colouring), by)
            } else {
                (colouring, format!("{} ({description})", report.family))
            };
            return verified(job.spec(), colouring, by).map(Some);
        }
    }
    Ok(None)
}

/// Stage 1 on this thread and local search on the others until the stage ends;
/// the first colouring found (by either) is the answer.
fn structured_beside_local(job: &SearchJob) -> Result<Option<SearchResult>, SearchError> {
    let stop = AtomicBool::new(false);
    let progress = LocalProgress::default();
    let options = LocalOptions {
        threads: job.threads() - 1,
        seed: job.options.seed,
        timeout: job.options.timeout,
        ..LocalOptions::default()
    };
    let (structured, local) = std::thread::scope(|scope| {
        let local = scope.spawn(|| local_search(&job.instance, &options, &stop, &progress));
        let structured = structured_stage(job, &stop);
        stop.store(true, Ordering::SeqCst);
        (
            structured,
            local
                .join()
                .expect("the local search thread does not panic"),
        )
    });
    if let Some(found) = structured? {
        return Ok(Some(found));
    }
    let local = local?;
    job.progress
        .attempts
        .fetch_add(local.restarts, Ordering::Relaxed);
    match local.found {
        Some((colouring, by)) => verified(
            job.spec(),
            colouring,
            format!("{by}, beside the structured stage"),
        )
        .map(Some),
        None => Ok(None),
    }
}

/// The seeded SAT attempts of stages 2 and 3, numbered in turn on one rng.
struct SeededAttempts<'a> {
    job: &'a SearchJob,
    formula: &'a Formula,
    stop: &'a AtomicBool,
    deadline: Option<Instant>,
    rng: ChaCha8Rng,
    attempts: u64,
}

impl SeededAttempts<'_> {
    fn try_seed(&mut self, seed: &Seed) -> Result<Option<SearchResult>, SearchError> {
        self.attempts += 1;
        let who = format!("SAT attempt {}", self.attempts);
        let (job, formula, attempt) = (self.job, self.formula, self.attempts);
        seeded_attempt(
            job,
            formula,
            seed,
            &mut self.rng,
            attempt,
            &who,
            self.stop,
            self.deadline,
        )
    }
}

/// Stages 2 and 3; `Some` when a colouring was found.
fn helper_stages(
    job: &SearchJob,
    formula: &Formula,
    stop: &AtomicBool,
    deadline: Option<Instant>,
) -> Result<Option<SearchResult>, SearchError> {
    let mut attempts = SeededAttempts {
        job,
        formula,
        stop,
        deadline,
        rng: ChaCha8Rng::seed_from_u64(job.options.seed),
        attempts: 0,
    };
    let starts = match circulant_neighbour_stage(&mut attempts)? {
        Ok(found) => return Ok(Some(found)),
        Err(starts) => starts,
    };
    // Stage 3: local search slices and seeded SAT attempts, only beside a complete
    // worker (with one thread the complete worker runs next, on this thread).
    if job.order() > MAX_LOCAL_ORDER || job.options.threads < 2 {
        return Ok(None);
    }
    local_and_seeded_rounds(&mut attempts, starts)
}

/// Time for the loosened extensions of stage 2, shared by the circulant colourings.
const LOOSENED_CAP: Duration = Duration::from_secs(20);

/// Stage 2: up to 16 distinct circulant colourings of K_(n−1), each tried as a
/// seed (all its edges fixed), then with up to n/4 of its vertices freed nearest
/// the obstruction ([`extend_loosened`]; [`LOOSENED_CAP`] for all of them). `Ok`
/// with a colouring found, or `Err` with the local-search starts they give (the
/// last vertex's edges drawn at random).
fn circulant_neighbour_stage(
    attempts: &mut SeededAttempts<'_>,
) -> Result<Result<SearchResult, Vec<Colouring>>, SearchError> {
    let (job, stop) = (attempts.job, attempts.stop);
    let order = job.order();
    let mut starts: Vec<Colouring> = Vec::new();
    if order < 3 || stop.load(Ordering::Relaxed) {
        return Ok(Err(starts));
    }
    let Ok(orbits) = EdgeOrbits::circulant(order - 1) else {
        return Ok(Err(starts));
    };
    let structured_deadline = earliest(Some(Instant::now() + STRUCTURED_CAP), attempts.deadline);
    let neighbours =
        family_colourings(&orbits, job.spec(), 16, stop, structured_deadline).unwrap_or_default();
    let slice = LOOSENED_CAP / neighbours.len().max(1) as u32;
    for colouring in neighbours {
        let seed = Seed::from_colouring(SeedKind::CirculantNeighbour, &colouring, |_, _| true);
        if let Some(found) = attempts.try_seed(&seed)? {
            return Ok(Ok(found));
        }
        let until = earliest(Some(Instant::now() + slice), attempts.deadline);
        attempts.attempts += 1;
        if let Loosened::Extended { result, .. } = extend_loosened(
            attempts.formula,
            &colouring,
            order / 4,
            job.options.seed,
            stop,
            until,
        )? {
            return Ok(Ok(result));
        }
        let r = colouring.colours() as u8;
        let rng = &mut attempts.rng;
        starts.push(Colouring::from_fn(order, colouring.colours(), |i, j| {
            if j < order - 1 {
                colouring.colour(i, j)
            } else {
                rng.gen_range(1..=r)
            }
        }));
    }
    Ok(Err(starts))
}

/// Stage 3: a slice of local search on the helper threads, then SAT attempts
/// seeded by its near-solutions; the slice doubles each round.
fn local_and_seeded_rounds(
    attempts: &mut SeededAttempts<'_>,
    starts: Vec<Colouring>,
) -> Result<Option<SearchResult>, SearchError> {
    let (job, stop, deadline) = (attempts.job, attempts.stop, attempts.deadline);
    let helpers = job.threads().saturating_sub(1).max(1);
    let mut starts = Some(starts);
    let mut slice = Duration::from_secs(1);
    let mut round = 0u64;
    let mut involution_endings = Vec::new();
    while !super::interrupt::should_stop(stop, deadline) {
        round += 1;
        // Even rounds visit only colourings with an involution, a shape per
        // restart; they take no starts (their colourings are invariant ones).
        let over_involutions = round % 2 == 0;
        let local_options = LocalOptions {
            threads: helpers,
            seed: job.options.seed.wrapping_add(round),
            starts: if over_involutions {
                Vec::new()
            } else {
                starts.take().unwrap_or_default()
            },
            automorphisms: if over_involutions {
                VertexCycles::involutions(job.order())
            } else {
                Vec::new()
            },
            automorphism_endings: if over_involutions {
                involution_endings.clone()
            } else {
                Vec::new()
            },
            timeout: Some(match deadline {
                Some(d) => slice.min(d.saturating_duration_since(Instant::now())),
                None => slice,
            }),
            ..LocalOptions::default()
        };
        // A colouring found by local search sets `stop`, ending the complete worker too.
        let report = local_search(
            &job.instance,
            &local_options,
            stop,
            &LocalProgress::default(),
        )?;
        job.progress
            .attempts
            .fetch_add(report.restarts, Ordering::Relaxed);
        if let Some((colouring, by)) = report.found {
            return verified(job.spec(), colouring, format!("{by}, round {round}")).map(Some);
        }
        if over_involutions {
            // The next involution slice goes on from how these restarts ended.
            involution_endings = report.automorphism_endings;
        }
        let patterns = Pattern::for_spec(job.spec());
        let mut next_starts = Vec::new();
        for (_, near) in &report.near {
            for seed in near_solution_seeds(near, &patterns, &mut attempts.rng) {
                if stop.load(Ordering::Relaxed) {
                    return Ok(None);
                }
                if let Some(found) = attempts.try_seed(&seed)? {
                    return Ok(Some(found));
                }
            }
            next_starts.push(kick(
                &mut LocalState::new(near, &patterns),
                &mut attempts.rng,
            ));
        }
        starts.get_or_insert_with(Vec::new).extend(next_starts);
        slice *= 2;
    }
    Ok(None)
}
