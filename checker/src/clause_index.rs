//! The DRAT checker's index of active clauses by content, for deletions and for
//! lemmas that repeat a present clause. A clause's hash is the wrapping sum of a
//! keyed mix of its literal codes (so the order of its literals does not matter),
//! with a key drawn at random per run, so a crafted proof cannot aim collisions.
//! Buckets (a power of two, at least the number of clauses the check can index,
//! fixed at the start) hold the newest clause of each hash class, and each clause
//! the next older one: at most 12 bytes a clause. Clauses found deleted are
//! unlinked as they are met.

use std::hash::BuildHasher;

const NONE: u32 = u32::MAX;

pub(crate) struct ClauseIndex {
    buckets: Vec<u32>,
    older: Vec<u32>,
    key: u64,
}

/// SplitMix64's finaliser (Steele, Lea & Flood, OOPSLA 2014): a bijective mix.
fn mix(mut z: u64) -> u64 {
    z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
    z ^ (z >> 31)
}

impl ClauseIndex {
    /// An index for up to `clauses` clauses.
    pub(crate) fn new(clauses: usize) -> Self {
        let key = std::collections::hash_map::RandomState::new().hash_one(0u64);
        ClauseIndex { buckets: vec![NONE; clauses.max(1).next_power_of_two()], older: Vec::new(), key }
    }

    /// The hash of a clause's literal codes, in any order (each literal once).
    pub(crate) fn hash(&self, lits: &[u32]) -> u64 {
        lits.iter().fold(0u64, |sum, &l| sum.wrapping_add(mix(self.key ^ l as u64)))
    }

    fn bucket(&self, hash: u64) -> usize {
        (hash as usize) & (self.buckets.len() - 1)
    }

    /// Indexes clause `id` (ids grow by one) under the `hash` of its literals.
    pub(crate) fn insert(&mut self, id: u32, hash: u64) {
        let bucket = self.bucket(hash);
        self.older.resize(id as usize + 1, NONE);
        (self.older[id as usize], self.buckets[bucket]) = (self.buckets[bucket], id);
    }

    /// The newest clause of `hash`'s bucket for which `matches` says Some(true);
    /// those for which it says None (deleted) are unlinked on the way.
    pub(crate) fn find(&mut self, hash: u64, matches: impl Fn(u32) -> Option<bool>) -> Option<u32> {
        let bucket = self.bucket(hash);
        let (mut previous, mut current) = (NONE, self.buckets[bucket]);
        while current != NONE {
            let next = self.older[current as usize];
            match matches(current) {
                Some(true) => return Some(current),
                Some(false) => previous = current,
                None if previous == NONE => self.buckets[bucket] = next,
                None => self.older[previous as usize] = next,
            }
            current = next;
        }
        None
    }
}
