//! The VSIDS decision order: a binary max-heap of variables keyed by activity,
//! bumped on conflicts and decayed geometrically (by growing the increment).

/// Activities and the heap of unassigned candidates.
#[derive(Clone, Debug, Default)]
pub struct Activity {
    score: Vec<f64>,
    heap: Vec<u32>,
    /// Position of each variable in `heap`, or `u32::MAX` when absent.
    position: Vec<u32>,
    increment: f64,
}

const ABSENT: u32 = u32::MAX;

impl Activity {
    pub fn new() -> Self {
        Activity {
            increment: 1.0,
            ..Default::default()
        }
    }

    /// Makes room for `variables` variables, inserting the new ones.
    pub fn grow(&mut self, variables: usize) {
        while self.score.len() < variables {
            let v = self.score.len();
            self.score.push(0.0);
            self.position.push(ABSENT);
            self.insert(v);
        }
    }

    pub fn contains(&self, var: usize) -> bool {
        self.position[var] != ABSENT
    }

    pub fn insert(&mut self, var: usize) {
        if self.contains(var) {
            return;
        }
        self.position[var] = self.heap.len() as u32;
        self.heap.push(var as u32);
        self.sift_up(self.heap.len() - 1);
    }

    /// Removes and returns the most active variable.
    pub fn pop(&mut self) -> Option<usize> {
        let top = *self.heap.first()?;
        let last = self.heap.pop().expect("non-empty");
        self.position[top as usize] = ABSENT;
        if !self.heap.is_empty() {
            self.heap[0] = last;
            self.position[last as usize] = 0;
            self.sift_down(0);
        }
        Some(top as usize)
    }

    pub fn bump(&mut self, var: usize) {
        self.score[var] += self.increment;
        if self.score[var] > 1e100 {
            for s in &mut self.score {
                *s *= 1e-100;
            }
            self.increment *= 1e-100;
        }
        if self.contains(var) {
            self.sift_up(self.position[var] as usize);
        }
    }

    /// Ages every activity by `factor` (< 1).
    pub fn decay(&mut self, factor: f64) {
        self.increment /= factor;
    }

    fn above(&self, a: u32, b: u32) -> bool {
        self.score[a as usize] > self.score[b as usize]
    }

    fn sift_up(&mut self, mut i: usize) {
        let v = self.heap[i];
        while i > 0 {
            let parent = (i - 1) / 2;
            if !self.above(v, self.heap[parent]) {
                break;
            }
            self.heap[i] = self.heap[parent];
            self.position[self.heap[i] as usize] = i as u32;
            i = parent;
        }
        self.heap[i] = v;
        self.position[v as usize] = i as u32;
    }

    fn sift_down(&mut self, mut i: usize) {
        let v = self.heap[i];
        loop {
            let mut child = 2 * i + 1;
            if child >= self.heap.len() {
                break;
            }
            if child + 1 < self.heap.len() && self.above(self.heap[child + 1], self.heap[child]) {
                child += 1;
            }
            if !self.above(self.heap[child], v) {
                break;
            }
            self.heap[i] = self.heap[child];
            self.position[self.heap[i] as usize] = i as u32;
            i = child;
        }
        self.heap[i] = v;
        self.position[v as usize] = i as u32;
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pops_in_order_of_activity() {
        let mut a = Activity::new();
        a.grow(5);
        for (v, times) in [(3, 3), (1, 2), (4, 1)] {
            for _ in 0..times {
                a.bump(v);
            }
        }
        assert_eq!(a.pop(), Some(3));
        assert_eq!(a.pop(), Some(1));
        assert_eq!(a.pop(), Some(4));
        a.insert(3);
        assert_eq!(a.pop(), Some(3));
        assert_eq!(a.pop().map(|v| v == 0 || v == 2), Some(true));
        assert!(a.pop().is_some());
        assert_eq!(a.pop(), None);
    }
}
