//! Which automorphism a restart of local search takes when several are given.
//!
//! The restarts first take each in turn, once. After that, every second restart
//! goes to the automorphism whose restarts have so far ended with the fewest
//! monochromatic copies on average, and the others go on in turn. At (4,6;34),
//! over the seventeen involution shapes, 20 s of restarts ended on average with
//! 0.7 copies for thirteen 2-cycles with eight vertices fixed, 4.8 to 6.3 for ten
//! to fourteen fixed, and 7.8 to 24.3 for the others (BENCHMARKS.md,
//! "Involutions"): the shape that holds colourings is the one whose restarts end
//! nearest zero, so it gets about half of the restarts instead of a seventeenth.
//!
//! Each thread keeps its own schedule, so a run with the same seed and thread
//! count repeats itself.

/// How the restarts over one automorphism ended: the sum of their fewest copies,
/// and how many there were. A later search (the next slice of `find`'s default)
/// starts from these instead of trying every automorphism again.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub struct EndingCosts {
    pub sum: u64,
    pub restarts: u64,
}

impl std::ops::AddAssign for EndingCosts {
    fn add_assign(&mut self, other: EndingCosts) {
        self.sum = self.sum.saturating_add(other.sum);
        self.restarts += other.restarts;
    }
}

/// The choices of one thread.
#[derive(Clone, Debug)]
pub struct AutomorphismSchedule {
    /// The next automorphism in turn.
    in_turn: usize,
    /// How far the turns advance (the thread count, so that threads interleave).
    stride: usize,
    restarts: u64,
    /// Earlier searches' endings and this one's, per automorphism.
    known: Vec<EndingCosts>,
    /// This search's endings alone.
    recorded: Vec<EndingCosts>,
}

impl AutomorphismSchedule {
    /// A schedule over `count` automorphisms (at least 1) whose turns start at
    /// `first` and advance by `stride`, knowing how earlier restarts ended
    /// (`earlier`, per automorphism; missing entries count as untried).
    pub fn new(count: usize, first: usize, stride: usize, earlier: &[EndingCosts]) -> Self {
        let count = count.max(1);
        let mut known = vec![EndingCosts::default(); count];
        for (slot, e) in known.iter_mut().zip(earlier) {
            *slot = *e;
        }
        AutomorphismSchedule {
            in_turn: first % count,
            stride: stride.max(1),
            restarts: 0,
            known,
            recorded: vec![EndingCosts::default(); count],
        }
    }

    /// The endings this schedule recorded (not those it was given).
    pub fn recorded(&self) -> &[EndingCosts] {
        &self.recorded
    }

    /// The automorphism for the next restart.
    pub fn choose(&mut self) -> usize {
        let count = self.known.len();
        self.restarts += 1;
        let untried = self.known.iter().any(|e| e.restarts == 0);
        if !untried && self.restarts % 2 == 0 {
            return self.best();
        }
        let choice = if untried {
            // The first pass: the next one in turn that has not run yet.
            (0..count)
                .map(|k| (self.in_turn + k) % count)
                .find(|&i| self.known[i].restarts == 0)
                .unwrap_or(self.in_turn)
        } else {
            self.in_turn
        };
        self.in_turn = (choice + self.stride) % count;
        choice
    }

    /// Records the fewest copies a restart over automorphism `index` reached.
    pub fn record(&mut self, index: usize, cost: u64) {
        let ending = EndingCosts {
            sum: cost,
            restarts: 1,
        };
        for endings in [&mut self.known, &mut self.recorded] {
            if let Some(e) = endings.get_mut(index) {
                *e += ending;
            }
        }
    }

    /// The automorphism with the lowest mean final cost (ties: fewer tries, then
    /// the lower index).
    fn best(&self) -> usize {
        let known = &self.known;
        (0..known.len())
            .min_by(|&a, &b| {
                // Compare sum_a / restarts_a with sum_b / restarts_b without division.
                let left = u128::from(known[a].sum) * u128::from(known[b].restarts);
                let right = u128::from(known[b].sum) * u128::from(known[a].restarts);
                left.cmp(&right)
                    .then(known[a].restarts.cmp(&known[b].restarts))
                    .then(a.cmp(&b))
            })
            .unwrap_or(0)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    #[test]
    fn after_one_pass_every_second_restart_takes_the_lowest_mean() {
        let mut schedule = AutomorphismSchedule::new(4, 2, 1, &[]);
        let costs = [9, 3, 7, 5];
        let first: Vec<usize> = (0..4).map(|_| schedule.choose()).collect();
        assert_eq!(first, vec![2, 3, 0, 1]);
        for (i, &c) in costs.iter().enumerate() {
            schedule.record(i, c);
        }
        let later: Vec<usize> = (0..8).map(|_| schedule.choose()).collect();
        // Restarts 6, 8, 10, 12 take number 1 (mean 3); 5, 7, 9, 11 go on in turn.
        assert_eq!(later, vec![2, 1, 3, 1, 0, 1, 1, 1]);
    }

    #[test]
    fn a_schedule_given_earlier_endings_skips_the_first_pass() {
        let earlier = [
            EndingCosts {
                sum: 10,
                restarts: 2,
            },
            EndingCosts {
                sum: 3,
                restarts: 3,
            },
            EndingCosts {
                sum: 0,
                restarts: 0,
            },
        ];
        let mut schedule = AutomorphismSchedule::new(3, 0, 1, &earlier);
        // Only number 2 is untried; then the mean 1 of number 1 is the lowest.
        assert_eq!(schedule.choose(), 2);
        schedule.record(2, 4);
        assert_eq!(schedule.choose(), 1);
        assert_eq!(
            schedule.recorded(),
            &[
                EndingCosts::default(),
                EndingCosts::default(),
                EndingCosts {
                    sum: 4,
                    restarts: 1
                }
            ]
        );
    }

    proptest! {
        #[test]
        fn every_automorphism_runs_in_the_first_pass_and_the_best_gets_half(
            count in 1usize..20,
            first in 0usize..40,
            stride in 1usize..4,
            costs in proptest::collection::vec(0u64..50, 20),
        ) {
            let mut schedule = AutomorphismSchedule::new(count, first, stride, &[]);
            let mut seen = vec![false; count];
            for _ in 0..count {
                let i = schedule.choose();
                prop_assert!(i < count);
                prop_assert!(!seen[i], "{i} twice in the first pass");
                seen[i] = true;
                schedule.record(i, costs[i]);
            }
            // With each cost fixed, the lowest mean stays the lowest (shared by
            // any that tie).
            let lowest = (0..count).map(|i| costs[i]).min().unwrap();
            let mut to_best = 0;
            for _ in 0..100 {
                let i = schedule.choose();
                prop_assert!(i < count);
                schedule.record(i, costs[i]);
                to_best += usize::from(costs[i] == lowest);
            }
            prop_assert!(to_best >= 50, "{to_best} of 100 to the best");
        }
    }
}
