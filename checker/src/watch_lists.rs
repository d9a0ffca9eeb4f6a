//! The DRAT checker's watch lists, sized by the proof: every clause owns two
//! watch nodes (node 2c + p watches the literal at position p of clause c), and
//! each literal heads one doubly linked list of nodes per kind (core clauses, and
//! the others). A literal costs 8 bytes and a clause 16, whatever the proof's
//! shape, and a node moves between lists in constant time.

const NONE: u32 = u32::MAX;

pub(crate) struct WatchLists {
    /// For each kind, the first node of each literal's list.
    head: [Vec<u32>; 2],
    next: Vec<u32>,
    prev: Vec<u32>,
}

impl WatchLists {
    pub(crate) fn new(literals: usize) -> Self {
        WatchLists { head: [vec![NONE; literals], vec![NONE; literals]], next: Vec::new(), prev: Vec::new() }
    }

    /// Makes room for the two nodes of clause `id`.
    pub(crate) fn add_clause(&mut self, id: u32) {
        let nodes = 2 * (id as usize + 1);
        self.next.resize(nodes, NONE);
        self.prev.resize(nodes, NONE);
    }

    /// The first node of `lit`'s list of `kind`.
    pub(crate) fn first(&self, kind: u8, lit: u32) -> Option<u32> {
        Some(self.head[kind as usize][lit as usize]).filter(|&n| n != NONE)
    }

    /// The node after `node` in its list.
    pub(crate) fn after(&self, node: u32) -> Option<u32> {
        Some(self.next[node as usize]).filter(|&n| n != NONE)
    }

    /// Puts `node` first in `lit`'s list of `kind`.
    pub(crate) fn link(&mut self, kind: u8, lit: u32, node: u32) {
        let head = &mut self.head[kind as usize][lit as usize];
        let (old, node_index) = (*head, node as usize);
        (self.next[node_index], self.prev[node_index], *head) = (old, NONE, node);
        if old != NONE {
            self.prev[old as usize] = node;
        }
    }

    /// Takes `node` out of `lit`'s list of `kind`.
    pub(crate) fn unlink(&mut self, kind: u8, lit: u32, node: u32) {
        let (before, after) = (self.prev[node as usize], self.next[node as usize]);
        match before {
            NONE => self.head[kind as usize][lit as usize] = after,
            _ => self.next[before as usize] = after,
        }
        if after != NONE {
            self.prev[after as usize] = before;
        }
    }
}
