//! The clause arena: every clause in one `Vec<u32>`, as a two-word header (length;
//! LBD with the learnt and deleted flags) followed by its literals. A clause is
//! named by the offset of its header ([`ClauseRef`]). The first two literals are
//! the watched ones; a clause that is a reason has its implied literal first.

use crate::lit::Lit;

pub type ClauseRef = u32;

const LEARNT: u32 = 1 << 30;
const DELETED: u32 = 1 << 31;
const LBD_MASK: u32 = LEARNT - 1;

#[derive(Clone, Debug, Default)]
pub struct ClauseArena {
    words: Vec<u32>,
    /// Words held by deleted clauses, reclaimed by [`ClauseArena::compact`].
    pub wasted: usize,
}

impl ClauseArena {
    pub fn add(&mut self, lits: &[Lit], learnt: bool, lbd: u32) -> ClauseRef {
        let cref = self.words.len() as ClauseRef;
        self.words.push(lits.len() as u32);
        self.words
            .push(lbd.min(LBD_MASK) | if learnt { LEARNT } else { 0 });
        self.words.extend(lits.iter().map(|l| l.0));
        cref
    }

    #[inline]
    pub fn len(&self, c: ClauseRef) -> usize {
        self.words[c as usize] as usize
    }

    #[inline]
    pub fn lits(&self, c: ClauseRef) -> &[Lit] {
        let start = c as usize + 2;
        let words = &self.words[start..start + self.len(c)];
        // SAFETY: Lit is a transparent wrapper of u32 (single public field).
        unsafe { std::slice::from_raw_parts(words.as_ptr() as *const Lit, words.len()) }
    }

    #[inline]
    pub fn lits_mut(&mut self, c: ClauseRef) -> &mut [Lit] {
        let start = c as usize + 2;
        let len = self.len(c);
        let words = &mut self.words[start..start + len];
        // SAFETY: as in `lits`.
        unsafe { std::slice::from_raw_parts_mut(words.as_mut_ptr() as *mut Lit, words.len()) }
    }

    pub fn is_learnt(&self, c: ClauseRef) -> bool {
        self.words[c as usize + 1] & LEARNT != 0
    }

    pub fn is_deleted(&self, c: ClauseRef) -> bool {
        self.words[c as usize + 1] & DELETED != 0
    }

    pub fn lbd(&self, c: ClauseRef) -> u32 {
        self.words[c as usize + 1] & LBD_MASK
    }

    pub fn delete(&mut self, c: ClauseRef) {
        self.words[c as usize + 1] |= DELETED;
        self.wasted += self.len(c) + 2;
    }

    pub fn total_words(&self) -> usize {
        self.words.len()
    }

    /// Drops deleted clauses; `relocate(old, new)` is told where each live one moved.
    pub fn compact(&mut self, mut relocate: impl FnMut(ClauseRef, ClauseRef)) {
        let mut read = 0usize;
        let mut write = 0usize;
        while read < self.words.len() {
            let size = self.words[read] as usize + 2;
            if self.words[read + 1] & DELETED == 0 {
                self.words.copy_within(read..read + size, write);
                relocate(read as ClauseRef, write as ClauseRef);
                write += size;
            }
            read += size;
        }
        self.words.truncate(write);
        self.wasted = 0;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn compaction_keeps_live_clauses_in_order() {
        let mut arena = ClauseArena::default();
        let lits = |ls: &[i32]| ls.iter().map(|&l| Lit::from_dimacs(l)).collect::<Vec<_>>();
        let a = arena.add(&lits(&[1, 2]), false, 0);
        let b = arena.add(&lits(&[-1, 3, 4]), true, 2);
        let c = arena.add(&lits(&[5, -6]), true, 3);
        arena.delete(b);
        let mut moves = Vec::new();
        arena.compact(|old, new| moves.push((old, new)));
        assert_eq!(moves, vec![(a, 0), (c, 4)]);
        assert_eq!(arena.lits(4), &lits(&[5, -6])[..]);
        assert!(arena.is_learnt(4));
        assert_eq!(arena.lbd(4), 3);
        assert_eq!(arena.total_words(), 8);
    }
}
