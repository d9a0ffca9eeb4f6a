//! The parallel local search: one independent run per thread, each restarting from
//! a fresh random colouring (or a given start) when it stops improving. Worker w
//! draws from a ChaCha8 stream seeded with (seed, w), so a run with the same seed
//! and thread count repeats the same moves until the first answer.

use std::sync::atomic::{AtomicBool, AtomicU64, Ordering};
use std::sync::Mutex;
use std::time::{Duration, Instant};

use rand::{Rng, SeedableRng};
use rand_chacha::ChaCha8Rng;

use ramsift_encoder::edges::edge_count;
use ramsift_encoder::{Colouring, Instance};

use super::automorphism::{orbit_tabu_step, EdgeOrbitMoves, VertexCycles};
use super::moves::{anneal_step, focused_tabu_step, tabu_step, TabuList};
use super::pattern::Pattern;
use super::schedule::{AutomorphismSchedule, EndingCosts};
use super::state::{LocalState, MAX_LOCAL_ORDER};
use super::weighting::{weighted_step, CliqueWeights};
use crate::certify::witness_check::verify_witness;
use crate::search::first_answer::worker_pool;
use crate::search::job::SearchError;
use crate::structured::families::cycles_fit;

/// Which move rule.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LocalMethod {
    Tabu,
    /// Tabu search over the bad edges only.
    Focused,
    /// Breakout clique weighting over the bad edges.
    Weighted,
    Anneal,
}

impl std::fmt::Display for LocalMethod {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            LocalMethod::Tabu => "tabu search",
            LocalMethod::Focused => "focused tabu search",
            LocalMethod::Weighted => "clique-weighted search",
            LocalMethod::Anneal => "simulated annealing",
        })
    }
}

/// How a local search runs.
#[derive(Clone, Debug)]
pub struct LocalOptions {
    pub method: LocalMethod,
    pub threads: usize,
    pub seed: u64,
    pub timeout: Option<Duration>,
    /// Starting colourings, used in turn by the restarts before random ones.
    pub starts: Vec<Colouring>,
    /// Restart after this many steps without a new best of the current run
    /// (default: 50 times the number of edges, or of edge orbits with an
    /// automorphism).
    pub stall_steps: Option<u64>,
    /// How many near-solutions (best colourings of distinct restarts) to keep.
    pub keep_near: usize,
    /// Visit only colourings invariant under a vertex permutation: the moves
    /// recolour edge orbits, the restarts draw random invariant colourings, and
    /// `starts` are not used. With several, the restarts share them out
    /// ([`AutomorphismSchedule`]).
    /// Tabu and focused rules only. Empty: every colouring.
    pub automorphisms: Vec<VertexCycles>,
    /// How earlier searches' restarts over `automorphisms` ended (same order; may
    /// be empty): the schedule goes on from them ([`LocalReport::automorphism_endings`]).
    pub automorphism_endings: Vec<EndingCosts>,
}

impl Default for LocalOptions {
    fn default() -> Self {
        LocalOptions {
            method: LocalMethod::Focused,
            threads: std::thread::available_parallelism().map_or(1, |n| n.get()),
            seed: 0,
            timeout: None,
            starts: Vec::new(),
            stall_steps: None,
            keep_near: 8,
            automorphisms: Vec::new(),
            automorphism_endings: Vec::new(),
        }
    }
}

/// Counters readable while the search runs.
#[derive(Debug)]
pub struct LocalProgress {
    pub steps: AtomicU64,
    pub restarts: AtomicU64,
    pub best_cost: AtomicU64,
}

impl Default for LocalProgress {
    fn default() -> Self {
        LocalProgress {
            steps: AtomicU64::new(0),
            restarts: AtomicU64::new(0),
            best_cost: AtomicU64::new(u64::MAX),
        }
    }
}

/// What a local search achieved.
#[derive(Clone, Debug)]
pub struct LocalReport {
    /// A verified colouring with no monochromatic forbidden clique, and who found it.
    pub found: Option<(Colouring, String)>,
    /// Near-solutions, fewest monochromatic copies first.
    pub near: Vec<(u64, Colouring)>,
    pub best_cost: u64,
    pub steps: u64,
    pub restarts: u64,
    pub elapsed: Duration,
    /// How the restarts over each automorphism ended, this search's added to the
    /// ones it was given (empty without automorphisms).
    pub automorphism_endings: Vec<EndingCosts>,
}

/// What the threads of one local search share.
struct Shared<'a> {
    options: &'a LocalOptions,
    patterns: &'a [Pattern],
    order: usize,
    /// Restart after this many steps without a new best, if given.
    stall: Option<u64>,
    /// The edge orbits of each automorphism.
    orbits: Vec<EdgeOrbitMoves>,
    stop: &'a AtomicBool,
    deadline: Option<Instant>,
    progress: &'a LocalProgress,
    found: Mutex<Option<(Colouring, String)>>,
    near: Mutex<Vec<(u64, Colouring)>>,
    start_index: AtomicU64,
    /// The threads' endings per automorphism, added up as they finish.
    endings: Mutex<Vec<EndingCosts>>,
}

/// Runs local search on the instance's K_n for its forbidden graphs.
pub fn local_search(
    instance: &Instance,
    options: &LocalOptions,
    stop: &AtomicBool,
    progress: &LocalProgress,
) -> Result<LocalReport, SearchError> {
    let (spec, order) = (instance.spec(), instance.order());
    if !(2..=MAX_LOCAL_ORDER).contains(&order) {
        return Err(SearchError::LocalOrder {
            order,
            max: MAX_LOCAL_ORDER,
        });
    }
    if !options.automorphisms.is_empty()
        && !matches!(options.method, LocalMethod::Tabu | LocalMethod::Focused)
    {
        return Err(SearchError::AutomorphismRule {
            rule: options.method.to_string(),
        });
    }
    let mut orbits = Vec::new();
    for cycles in &options.automorphisms {
        cycles_fit(cycles, order)?;
        orbits.push(EdgeOrbitMoves::new(cycles));
    }
    let patterns = Pattern::for_spec(spec);
    let started = Instant::now();
    let threads = options.threads.max(1);
    let shared = Shared {
        options,
        patterns: &patterns,
        order,
        stall: options.stall_steps,
        orbits,
        stop,
        deadline: options.timeout.map(|t| started + t),
        progress,
        found: Mutex::new(None),
        near: Mutex::new(Vec::new()),
        start_index: AtomicU64::new(0),
        endings: Mutex::new(vec![EndingCosts::default(); options.automorphisms.len()]),
    };
    let pool = worker_pool(threads)?;
    pool.scope(|scope| {
        for worker in 0..threads {
            let shared = &shared;
            scope.spawn(move |_| local_worker(shared, worker));
        }
    });
    let found = shared.found.into_inner().expect("found lock");
    if let Some((colouring, _)) = &found {
        let verdict = verify_witness(spec, colouring);
        if !verdict.is_valid() {
            return Err(SearchError::WitnessRejected(verdict.to_string()));
        }
    }
    let near = shared.near.into_inner().expect("near lock");
    let mut automorphism_endings = shared.endings.into_inner().expect("endings lock");
    for (total, earlier) in automorphism_endings
        .iter_mut()
        .zip(&options.automorphism_endings)
    {
        *total += *earlier;
    }
    let best_cost = if found.is_some() {
        0
    } else {
        near.first().map_or(u64::MAX, |(c, _)| *c)
    };
    Ok(LocalReport {
        found,
        near,
        best_cost,
        steps: progress.steps.load(Ordering::Relaxed),
        restarts: progress.restarts.load(Ordering::Relaxed),
        elapsed: started.elapsed(),
        automorphism_endings,
    })
}

/// Thread `worker`: restarts (given starts first, then random colourings) until a
/// colouring is found or the search stops.
fn local_worker(shared: &Shared<'_>, worker: usize) {
    let options = shared.options;
    let mut rng = ChaCha8Rng::seed_from_u64(options.seed);
    rng.set_stream(worker as u64 + 1000);
    let stopped = || crate::search::interrupt::should_stop(shared.stop, shared.deadline);
    // With several automorphisms the restarts share them out by the thread's
    // schedule; its turns start at an offset drawn from the thread's stream (so
    // runs with other seeds do not all begin with the first) plus the thread number.
    let offset = match shared.orbits.len() {
        0 | 1 => 0,
        count => rng.gen_range(0..count),
    };
    let mut schedule = AutomorphismSchedule::new(
        shared.orbits.len(),
        offset + worker,
        options.threads,
        &options.automorphism_endings,
    );
    while !stopped() {
        let choice = schedule.choose();
        let orbits = shared.orbits.get(choice);
        let stall = shared
            .stall
            .unwrap_or(50 * orbits.map_or(edge_count(shared.order), |o| o.orbit_count()) as u64)
            .max(1);
        let index = shared.start_index.fetch_add(1, Ordering::Relaxed) as usize;
        let mut state = match (orbits, options.starts.get(index)) {
            (Some(orbits), _) => orbits.random_state(shared.patterns, &mut rng),
            (None, Some(start)) => LocalState::new(start, shared.patterns),
            (None, None) => LocalState::random(shared.order, shared.patterns, &mut rng),
        };
        shared.progress.restarts.fetch_add(1, Ordering::Relaxed);
        let (cost, best) = run_once(
            &mut state,
            options.method,
            orbits,
            stall,
            &mut rng,
            &stopped,
            shared.progress,
        );
        shared.progress.best_cost.fetch_min(cost, Ordering::Relaxed);
        if cost == 0 || !stopped() {
            // A restart cut short says little about its automorphism.
            schedule.record(choice, cost);
        }
        if cost == 0 {
            let mut slot = shared.found.lock().expect("found lock");
            if slot.is_none() {
                *slot = Some((
                    best,
                    match orbits {
                        None => format!(
                            "{} (thread {worker}, restart {})",
                            options.method,
                            index + 1
                        ),
                        Some(orbits) => format!(
                            "{} over the {} edge orbits of an automorphism with cycles {} (thread {worker}, restart {})",
                            options.method,
                            orbits.orbit_count(),
                            orbits.cycles(),
                            index + 1
                        ),
                    },
                ));
            }
            shared.stop.store(true, Ordering::SeqCst);
            break;
        }
        let mut kept = shared.near.lock().expect("near lock");
        kept.push((cost, best));
        kept.sort_by_key(|(c, _)| *c);
        kept.truncate(options.keep_near.max(1));
    }
    let mut endings = shared.endings.lock().expect("endings lock");
    for (total, mine) in endings.iter_mut().zip(schedule.recorded()) {
        *total += *mine;
    }
}

/// One run from `state` until the cost reaches 0, `stall` steps pass without a new
/// best, or the search stops. Returns the best cost and colouring seen.
fn run_once(
    state: &mut LocalState,
    method: LocalMethod,
    orbits: Option<&EdgeOrbitMoves>,
    stall: u64,
    rng: &mut ChaCha8Rng,
    stopped: &dyn Fn() -> bool,
    progress: &LocalProgress,
) -> (u64, Colouring) {
    let mut best_cost = state.cost();
    let mut best = state.to_colouring();
    let mut since_best = 0u64;
    let mut tabu = match orbits {
        Some(orbits) => TabuList::for_items(orbits.orbit_count()),
        None => TabuList::new(state.order()),
    };
    let mut weights = CliqueWeights::new();
    // A tabu step evaluates every edge; an annealing step evaluates one. Annealing
    // runs cool geometrically from 2.0 to 0.05 over (edges / 4 + 1) times the stall
    // length, then end (the restart reheats).
    let anneal_length = stall.saturating_mul(edge_count(state.order()) as u64 / 4 + 1);
    let cooling = (0.05f64 / 2.0).powf(1.0 / anneal_length as f64);
    let mut temperature = 2.0f64;
    let mut steps = 0u64;
    while best_cost > 0 {
        let ended = match method {
            LocalMethod::Tabu | LocalMethod::Focused | LocalMethod::Weighted => since_best >= stall,
            LocalMethod::Anneal => steps >= anneal_length,
        };
        if ended {
            break;
        }
        if steps % 64 == 0 {
            progress.steps.fetch_add(64, Ordering::Relaxed);
            if stopped() {
                break;
            }
        }
        steps += 1;
        if let Some(orbits) = orbits {
            let focused = method == LocalMethod::Focused;
            if !orbit_tabu_step(state, orbits, &mut tabu, best_cost, focused, rng) {
                break;
            }
        } else {
            match method {
                LocalMethod::Tabu => {
                    if !tabu_step(state, &mut tabu, best_cost, rng) {
                        break;
                    }
                }
                LocalMethod::Focused => {
                    if !focused_tabu_step(state, &mut tabu, best_cost, rng) {
                        break;
                    }
                }
                LocalMethod::Weighted => {
                    if !weighted_step(state, &mut weights, &mut tabu, best_cost, rng) {
                        break;
                    }
                }
                LocalMethod::Anneal => {
                    anneal_step(state, temperature, rng);
                    temperature *= cooling;
                }
            }
        }
        if state.cost() < best_cost {
            best_cost = state.cost();
            best = state.to_colouring();
            since_best = 0;
        } else {
            since_best += 1;
        }
    }
    (best_cost, best)
}

#[cfg(test)]
mod tests {
    use super::*;
    use ramsift_encoder::RamseySpec;

    fn run(method: LocalMethod, sizes: &[usize], n: usize, threads: usize) -> LocalReport {
        let options = LocalOptions {
            method,
            threads,
            seed: 3,
            timeout: Some(Duration::from_secs(60)),
            ..LocalOptions::default()
        };
        let stop = AtomicBool::new(false);
        local_search(
            &Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap(),
            &options,
            &stop,
            &LocalProgress::default(),
        )
        .unwrap()
    }

    #[test]
    fn both_methods_find_classical_witnesses() {
        // R(3,5) = 14 and R(3,3,3) = 17 (Radziszowski DS1): colourings exist at 13, 16.
        for method in [LocalMethod::Tabu, LocalMethod::Focused, LocalMethod::Anneal] {
            let report = run(method, &[3, 4], 8, 2);
            assert!(report.found.is_some(), "{method}: (3,4;8)");
            assert_eq!(report.best_cost, 0);
        }
        assert!(run(LocalMethod::Tabu, &[3, 5], 13, 2).found.is_some());
    }

    #[test]
    fn no_colouring_means_a_positive_best_cost() {
        // R(3,3) = 6 (DS1): every colouring of K6 has a monochromatic triangle.
        let options = LocalOptions {
            threads: 1,
            timeout: Some(Duration::from_millis(300)),
            ..LocalOptions::default()
        };
        let stop = AtomicBool::new(false);
        let report = local_search(
            &Instance::new(RamseySpec::cliques(&[3, 3]).unwrap(), 6).unwrap(),
            &options,
            &stop,
            &LocalProgress::default(),
        )
        .unwrap();
        assert!(report.found.is_none());
        // Goodman 1959: every 2-colouring of K6 has at least 2 monochromatic triangles.
        assert!(report.best_cost >= 2, "{}", report.best_cost);
        assert!(!report.near.is_empty());
    }

    #[test]
    fn endings_per_automorphism_add_up_across_searches() {
        // R(3,3) = 6 and Goodman 1959: every 2-colouring of K6 has at least two
        // monochromatic triangles, so every restart ends with 2 or more.
        let instance = Instance::new(RamseySpec::cliques(&[3, 3]).unwrap(), 6).unwrap();
        let options = LocalOptions {
            threads: 2,
            timeout: Some(Duration::from_millis(300)),
            automorphisms: vec!["5,1".parse().unwrap(), "2x3".parse().unwrap()],
            ..LocalOptions::default()
        };
        let search = |options: &LocalOptions| {
            local_search(
                &instance,
                options,
                &AtomicBool::new(false),
                &LocalProgress::default(),
            )
            .unwrap()
        };
        let first = search(&options);
        assert_eq!(first.automorphism_endings.len(), 2);
        let counted: u64 = first.automorphism_endings.iter().map(|e| e.restarts).sum();
        // Only a restart cut short by the deadline goes unrecorded, one per thread.
        assert!(counted + 2 >= first.restarts && counted <= first.restarts);
        for e in &first.automorphism_endings {
            assert!(e.restarts > 0 && e.sum >= 2 * e.restarts, "{e:?}");
        }
        let second = search(&LocalOptions {
            automorphism_endings: first.automorphism_endings.clone(),
            ..options
        });
        for (later, earlier) in second
            .automorphism_endings
            .iter()
            .zip(&first.automorphism_endings)
        {
            assert!(later.restarts > earlier.restarts && later.sum > earlier.sum);
        }
    }

    #[test]
    fn restarts_take_the_automorphisms_in_turn_and_a_seed_repeats_a_run() {
        // R(4,4) = 18 and the one (4,4;17) colouring is Paley's (DS1; McKay's
        // data), whose automorphisms x -> ax + b (a a nonzero square) include no
        // 16-cycle: every other restart searches an empty family, the others the
        // circulants.
        let instance = Instance::new(RamseySpec::cliques(&[4, 4]).unwrap(), 17).unwrap();
        // One thread: only taking the two in turn reaches the circulants.
        let options = LocalOptions {
            threads: 1,
            seed: 4,
            timeout: Some(Duration::from_secs(60)),
            automorphisms: vec!["16,1".parse().unwrap(), "17".parse().unwrap()],
            ..LocalOptions::default()
        };
        let report = local_search(
            &instance,
            &options,
            &AtomicBool::new(false),
            &LocalProgress::default(),
        )
        .unwrap();
        let (_, by) = report
            .found
            .expect("a restart over the circulants finds Paley's colouring");
        assert!(by.contains("cycles 17 (thread 0"), "{by}");
        // One thread, the same seed: the same colouring twice.
        let options = LocalOptions {
            threads: 1,
            automorphisms: vec!["8x2,1".parse().unwrap()],
            ..options
        };
        let run = || {
            local_search(
                &instance,
                &options,
                &AtomicBool::new(false),
                &LocalProgress::default(),
            )
            .unwrap()
            .found
            .expect("found")
        };
        assert_eq!(run(), run());
    }
}
