//! The default strategy of `ramsift find` (`--method auto`): structured families
//! first, then local search feeding the SAT driver, with one complete SAT worker
//! running throughout so that "no colouring exists" stays a complete answer.
//!
//! 1. **Structured stage**, on one thread before the full formula is built (at
//!    most a quarter of the time limit, and 30 s without one; each family at most
//!    a twentieth, 2 s at least): circulant colourings at n; circulant colourings at n + 1 with a vertex
//!    deleted (deleting a vertex keeps a colouring valid); the other abelian Cayley
//!    families and the 2- and 3-block circulants at n. Each is exact for its family.
//! 2. **Circulant neighbour seeds**: up to 16 distinct circulant colourings at
//!    n − 1, if any exist; each fixes every edge among the first n − 1 vertices and
//!    the SAT driver colours the edges of the last vertex (one extension attempt
//!    each). They are also the first starts of local search, with the last
//!    vertex's edges drawn at random.
//! 3. **Local search and seeded SAT, alternating**: a slice of tabu search on the
//!    helper threads; if it does not reach zero, each of its best near-solutions
//!    becomes seeds for SAT attempts: all edges in no remaining monochromatic clique
//!    fixed, then the same with a random fifth of them released. The slice doubles
//!    each round.
//!
//! Specifications with forbidden graphs other than cliques go to the SAT portfolio
//! ([`crate::search::portfolio`]) alone.
//!
//! Worker 0 solves the unrestricted formula for the whole run on its own thread. With
//! one thread, stages 1 and 2 run first and then worker 0 alone (no stage 3).

use std::borrow::Borrow;
use std::io;
use std::sync::atomic::{AtomicBool, Ordering};
use std::time::{Duration, Instant};

use rand::seq::SliceRandom;
use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;

use ramsift_encoder::{Colouring, RamseySpec};

use crate::local::{local_search, LocalOptions, LocalState, MAX_LOCAL_ORDER};
use crate::search::attempt::{run_attempt, AttemptOutcome, AttemptPlan};
use crate::search::formula::Formula;
use crate::search::portfolio::{
    complete_worker, luby, verified, FirstAnswer, SearchError, SearchOptions, SearchProgress,
    SearchReport, SearchResult,
};
use crate::search::seeding::{Seed, SeedKind};
use crate::structured::{
    family_colourings, search_family, AbelianGroup, EdgeOrbits, FamilyChoice, FamilyOutcome,
    FamilySearchError,
};

/// Runs the hybrid search on the formula of K_n (no symmetry breaking assumed).
pub fn hybrid_search(
    formula: &Formula,
    spec: &RamseySpec,
    options: &SearchOptions,
    progress: &SearchProgress,
    tick: impl FnMut(Duration),
) -> Result<SearchReport, SearchError> {
    let order = formula.variables().order();
    auto_search(spec, order, options, progress, tick, || Ok(Some(formula)))
}

/// The hybrid search with the formula built only after the structured stage: at
/// orders where the full formula is large (C(35,9) ≈ 7·10^7 clauses for (3,9;35))
/// a structured colouring is often found long before the formula could be built.
pub fn auto_search<F: Borrow<Formula>>(
    spec: &RamseySpec,
    order: usize,
    options: &SearchOptions,
    progress: &SearchProgress,
    mut tick: impl FnMut(Duration),
    build: impl FnOnce() -> Result<Option<F>, SearchError>,
) -> Result<SearchReport, SearchError> {
    let started = Instant::now();
    let report = |result| SearchReport {
        result,
        attempts: progress.attempts.load(Ordering::SeqCst),
        elapsed: started.elapsed(),
        threads: options.threads.max(1),
    };
    if spec.is_cliques() {
        tick(Duration::ZERO);
        let stop = AtomicBool::new(false);
        if let Some(found) = structured_stage(spec, order, options, &stop, progress)? {
            return Ok(report(found));
        }
    }
    let remaining = options.timeout.map(|t| t.saturating_sub(started.elapsed()));
    if remaining == Some(Duration::ZERO) {
        return Ok(report(SearchResult::Unknown));
    }
    let rest = SearchOptions {
        timeout: remaining,
        ..options.clone()
    };
    let Some(formula) = build()? else {
        // The formula would not fit in memory: local search alone, to the deadline.
        let mut later = local_search_only(spec, order, &rest, progress)?;
        later.elapsed = started.elapsed();
        return Ok(later);
    };
    let offset = started.elapsed();
    let mut later = later_stages(formula.borrow(), spec, &rest, progress, |e| {
        tick(offset + e)
    })?;
    later.elapsed = started.elapsed();
    Ok(later)
}

/// What `find` does when the formula is too large to hold: local search (for
/// cliques, up to its largest order) until the deadline; otherwise unknown.
fn local_search_only(
    spec: &RamseySpec,
    order: usize,
    options: &SearchOptions,
    progress: &SearchProgress,
) -> Result<SearchReport, SearchError> {
    let started = Instant::now();
    let threads = options.threads.max(1);
    let report = |result| SearchReport {
        result,
        attempts: progress.attempts.load(Ordering::SeqCst),
        elapsed: started.elapsed(),
        threads,
    };
    if !spec.is_cliques() || order > MAX_LOCAL_ORDER {
        return Ok(report(SearchResult::Unknown));
    }
    let local_options = LocalOptions {
        threads,
        seed: options.seed,
        timeout: options.timeout,
        ..LocalOptions::default()
    };
    let local_progress = crate::local::search::LocalProgress::default();
    let found = local_search(
        spec,
        order,
        &local_options,
        &AtomicBool::new(false),
        &local_progress,
    )?;
    progress
        .attempts
        .fetch_add(found.restarts, Ordering::Relaxed);
    match found.found {
        Some((colouring, by)) => Ok(report(verified(spec, colouring, by)?)),
        None => Ok(report(SearchResult::Unknown)),
    }
}

/// Stages 2 and 3 beside the complete worker.
fn later_stages(
    formula: &Formula,
    spec: &RamseySpec,
    options: &SearchOptions,
    progress: &SearchProgress,
    mut tick: impl FnMut(Duration),
) -> Result<SearchReport, SearchError> {
    if !spec.is_cliques() {
        // The structured families and local search are written for cliques; other
        // forbidden graphs go to the SAT portfolio alone.
        return crate::search::portfolio::search(formula, spec, options, progress, tick);
    }
    let started = Instant::now();
    let deadline = options.timeout.map(|t| started + t);
    let threads = options.threads.max(1);
    let answer = FirstAnswer::default();
    let stop = &answer.stop;

    std::thread::scope(|scope| {
        let complete = scope.spawn(|| {
            if threads >= 2 {
                answer.offer(complete_worker(formula, spec, stop, deadline, progress));
            }
        });
        let helper = scope.spawn(|| {
            let helpers = threads.saturating_sub(1).max(1);
            answer.offer(helper_stages(
                formula, spec, options, helpers, stop, deadline, progress,
            ));
            if threads < 2 && !stop.load(Ordering::SeqCst) {
                answer.offer(complete_worker(formula, spec, stop, deadline, progress));
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
    answer.into_report(progress, started, threads)
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

/// Stage 1: circulant at n, circulant at n + 1 minus a vertex, the other abelian
/// Cayley and block-circulant families at n; `Some` when a colouring was found.
pub fn structured_stage(
    spec: &RamseySpec,
    order: usize,
    options: &SearchOptions,
    stop: &AtomicBool,
    progress: &SearchProgress,
) -> Result<Option<SearchResult>, SearchError> {
    let started = Instant::now();
    // The same caps with and without --timeout; a timeout only cuts them short.
    let structured_deadline = earliest(
        Some(started + STRUCTURED_CAP),
        options.timeout.map(|t| started + t),
    );
    let mut tries: Vec<EdgeOrbits> = Vec::new();
    tries.extend(EdgeOrbits::circulant(order).ok());
    tries.extend(EdgeOrbits::circulant(order + 1).ok());
    for group in AbelianGroup::all_of_order(order).into_iter().skip(1) {
        tries.extend(EdgeOrbits::cayley(&group).ok());
    }
    tries.extend(
        FamilyChoice::BlockCirculant(None)
            .families(order)
            .unwrap_or_default(),
    );
    // No single family may take more than FAMILY_CAP: large block-circulant
    // formulas can be slow.
    let family_cap = FAMILY_CAP;
    for orbits in tries {
        if stop.load(Ordering::Relaxed)
            || crate::search::interrupt::interrupted()
            || structured_deadline.is_some_and(|d| Instant::now() >= d)
        {
            return Ok(None);
        }
        progress.attempts.fetch_add(1, Ordering::Relaxed);
        let family_deadline = structured_deadline.map(|d| d.min(Instant::now() + family_cap));
        let report = search_family(&orbits, spec, stop, family_deadline).map_err(|e| match e {
            FamilySearchError::Search(e) => e,
            FamilySearchError::Family(e) => SearchError::Backend(e.to_string()),
        })?;
        if let FamilyOutcome::Found {
            colouring,
            description,
            ..
        } = report.outcome
        {
            let at = orbits.order;
            let (colouring, by) = if at > order {
                (
                    drop_last_vertex(&colouring),
                    format!(
                        "{} at order {at} with its last vertex deleted ({description})",
                        report.family
                    ),
                )
            } else {
                (colouring, format!("{} ({description})", report.family))
            };
            return verified(spec, colouring, by).map(Some);
        }
    }
    Ok(None)
}

/// Stages 2 and 3; `Some` when a colouring was found.
fn helper_stages(
    formula: &Formula,
    spec: &RamseySpec,
    options: &SearchOptions,
    helpers: usize,
    stop: &AtomicBool,
    deadline: Option<Instant>,
    progress: &SearchProgress,
) -> Result<Option<SearchResult>, SearchError> {
    let order = formula.variables().order();
    let structured_deadline = earliest(Some(Instant::now() + STRUCTURED_CAP), deadline);

    // Stage 2: extend a circulant colouring of K_{n−1}.
    let vars = *formula.variables();
    let mut rng = ChaCha8Rng::seed_from_u64(options.seed);
    let mut attempt_no = 0u64;
    let try_seed = |seed: &Seed,
                    rng: &mut ChaCha8Rng,
                    attempt_no: &mut u64|
     -> Result<Option<SearchResult>, SearchError> {
        *attempt_no += 1;
        let mut plan = AttemptPlan::shuffled(formula, rng);
        plan.units = seed.units(&vars);
        plan.budget_bytes = Some(options.base_budget_bytes.saturating_mul(luby(*attempt_no)));
        progress.attempts.fetch_add(1, Ordering::Relaxed);
        let report = run_attempt::<io::Sink>(formula, &plan, stop, deadline, None, false)?;
        progress
            .proof_bytes
            .fetch_add(report.proof_bytes, Ordering::Relaxed);
        match report.outcome {
            AttemptOutcome::Satisfiable(c) => {
                let by = format!(
                    "SAT attempt {attempt_no} seeded by a {} ({} edges fixed)",
                    seed.kind,
                    seed.fixed.len()
                );
                verified(spec, c, by).map(Some)
            }
            _ => Ok(None),
        }
    };
    // Up to 16 distinct circulant colourings of K_{n−1}: each is tried as a seed
    // (all its edges fixed) and kept as a local-search start (the last vertex's
    // edges drawn at random).
    let mut starts: Vec<Colouring> = Vec::new();
    if order >= 3 && !stop.load(Ordering::Relaxed) {
        if let Ok(orbits) = EdgeOrbits::circulant(order - 1) {
            let neighbours =
                family_colourings(&orbits, spec, 16, stop, structured_deadline).unwrap_or_default();
            for colouring in neighbours {
                let seed =
                    Seed::from_colouring(SeedKind::CirculantNeighbour, &colouring, |_, _| true);
                if let Some(found) = try_seed(&seed, &mut rng, &mut attempt_no)? {
                    return Ok(Some(found));
                }
                let r = colouring.colours() as u8;
                starts.push(Colouring::from_fn(order, colouring.colours(), |i, j| {
                    if j < order - 1 {
                        colouring.colour(i, j)
                    } else {
                        rng.gen_range(1..=r)
                    }
                }));
            }
        }
    }

    // Stage 3: local search slices and seeded SAT attempts, only beside a complete
    // worker (with one thread the complete worker runs next, on this thread).
    if order > MAX_LOCAL_ORDER || options.threads < 2 {
        return Ok(None);
    }
    let mut slice = Duration::from_secs(1);
    let mut round = 0u64;
    while !stop.load(Ordering::Relaxed)
        && !crate::search::interrupt::interrupted()
        && deadline.is_none_or(|d| Instant::now() < d)
    {
        round += 1;
        let local_options = LocalOptions {
            threads: helpers,
            seed: options.seed.wrapping_add(round),
            starts: if round == 1 {
                starts.clone()
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
        let local_progress = crate::local::search::LocalProgress::default();
        let report = local_search(spec, order, &local_options, stop, &local_progress)?;
        progress
            .attempts
            .fetch_add(report.restarts, Ordering::Relaxed);
        if let Some((colouring, by)) = report.found {
            return verified(spec, colouring, format!("{by}, round {round}")).map(Some);
        }
        for (_, near) in &report.near {
            for seed in near_solution_seeds(near, spec, &mut rng) {
                if stop.load(Ordering::Relaxed) {
                    return Ok(None);
                }
                if let Some(found) = try_seed(&seed, &mut rng, &mut attempt_no)? {
                    return Ok(Some(found));
                }
            }
        }
        slice *= 2;
    }
    Ok(None)
}

/// Seeds from a near-solution: every edge in no monochromatic forbidden clique
/// fixed; then the same with a random fifth of those edges released.
pub fn near_solution_seeds(near: &Colouring, spec: &RamseySpec, rng: &mut ChaCha8Rng) -> Vec<Seed> {
    let state = LocalState::new(near, &spec.clique_sizes());
    let bad: std::collections::HashSet<(usize, usize)> = state.bad_edges().into_iter().collect();
    let good =
        Seed::from_colouring(SeedKind::NearSolution, near, |i, j| !bad.contains(&(i, j))).fixed;
    let mut released = good.clone();
    released.shuffle(rng);
    released.truncate(good.len() * 4 / 5);
    released.sort_unstable();
    vec![
        Seed {
            kind: SeedKind::NearSolution,
            fixed: good,
        },
        Seed {
            kind: SeedKind::NearSolution,
            fixed: released,
        },
    ]
}

#[cfg(test)]
mod tests {
    use super::*;
    use ramsift_encoder::edges::edge_index;

    #[test]
    fn near_solution_seeds_leave_the_bad_edges_free() {
        // The pentagon colouring of K5 (colour 1 at distance ±1) plus vertex 5,
        // joined in colour 1 to 0 and 2 and in colour 2 to 1, 3 and 4: for (3,3)
        // the colour-2 triangle {1,3,5} is bad, most other edges are not.
        let near = Colouring::from_fn(6, 2, |i, j| match (i, j) {
            (0 | 2, 5) => 1,
            (_, 5) => 2,
            _ if j - i == 1 || j - i == 4 => 1,
            _ => 2,
        });
        let spec = RamseySpec::cliques(&[3, 3]).unwrap();
        let state = LocalState::new(&near, &[3, 3]);
        let bad: Vec<usize> = state
            .bad_edges()
            .into_iter()
            .map(|(i, j)| edge_index(i, j))
            .collect();
        assert!(bad.contains(&edge_index(1, 3)) && !bad.contains(&edge_index(0, 1)));
        let mut rng = ChaCha8Rng::seed_from_u64(1);
        let seeds = near_solution_seeds(&near, &spec, &mut rng);
        assert!(!bad.is_empty() && bad.len() < 15);
        assert_eq!(seeds[0].fixed.len() + bad.len(), 15);
        for seed in &seeds {
            for &(edge, colour) in &seed.fixed {
                assert!(!bad.contains(&edge));
                let (i, j) = ramsift_encoder::edges::edge_endpoints(edge);
                assert_eq!(near.colour(i, j) as usize, colour);
            }
        }
        assert!(seeds[1].fixed.len() < seeds[0].fixed.len());
    }
}
