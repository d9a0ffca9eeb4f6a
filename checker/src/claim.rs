//! The forbidden-graph list of a claim, read with the checker's own parser:
//! `4,4` means colour 1 and colour 2 both forbid K4; `C4,K4` means colour 1 forbids
//! the 4-cycle. Entries: `k` or `Kk` (clique), `Kk-e`, `Ck`, `Pk`, `Ka:b` (`K1:k` a
//! star), `W_n` (hub joined to C_{n-1}: n vertices, as in DS1), `Bk` (k triangles on one edge),
//! `G6:…` (graph6) and `E:a-b/c-d/…` (edge list). This parser is written apart
//! from the encoder's on purpose; entries naming a complete graph are cliques.

use std::collections::BTreeSet;
use std::fmt;

/// The most colours a claim may name.
pub const MAX_COLOURS: usize = 16;

/// The most vertices of a forbidden graph other than a clique.
pub const MAX_GRAPH_VERTICES: usize = 10;

/// What one colour forbids.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum ClaimGraph {
    Clique(usize),
    /// Another graph, with its entry in canonical form.
    Graph {
        token: String,
        vertices: usize,
        /// (a, b), a < b, sorted.
        edges: Vec<(usize, usize)>,
    },
}

impl ClaimGraph {
    pub fn vertices(&self) -> usize {
        match self {
            ClaimGraph::Clique(k) => *k,
            ClaimGraph::Graph { vertices, .. } => *vertices,
        }
    }

    /// The edges on 0..vertices (all pairs for a clique).
    pub fn edge_list(&self) -> Vec<(usize, usize)> {
        match self {
            ClaimGraph::Clique(k) => (0..*k).flat_map(|b| (0..b).map(move |a| (a, b))).collect(),
            ClaimGraph::Graph { edges, .. } => edges.clone(),
        }
    }
}

impl fmt::Display for ClaimGraph {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ClaimGraph::Clique(k) => write!(f, "{k}"),
            ClaimGraph::Graph { token, .. } => f.write_str(token),
        }
    }
}

/// The forbidden graph of each colour (colour c forbids `forbidden[c-1]`).
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Claim {
    pub forbidden: Vec<ClaimGraph>,
}

fn whole(text: &str) -> Option<usize> {
    (!text.is_empty() && text.bytes().all(|b| b.is_ascii_digit())).then(|| text.parse().ok()).flatten()
}

/// Builds a graph entry from its edges, or a clique when they are all pairs.
fn graph_entry(token: String, vertices: usize, pairs: &[(usize, usize)]) -> Result<ClaimGraph, String> {
    let mut edges = BTreeSet::new();
    for &(a, b) in pairs {
        if a == b || a >= vertices || b >= vertices {
            return Err(format!("edge {a}-{b} is not an edge on vertices 0..{vertices}"));
        }
        edges.insert((a.min(b), a.max(b)));
    }
    if edges.is_empty() {
        return Err("the graph has no edge".into());
    }
    if edges.len() == vertices * (vertices - 1) / 2 {
        return Ok(ClaimGraph::Clique(vertices));
    }
    if vertices > MAX_GRAPH_VERTICES {
        return Err(format!("more than {MAX_GRAPH_VERTICES} vertices"));
    }
    Ok(ClaimGraph::Graph { token, vertices, edges: edges.into_iter().collect() })
}

/// Reads one entry.
fn parse_entry(index: usize, token: &str) -> Result<ClaimGraph, String> {
    let bad = |why: &str| format!("entry {} is {token:?}: {why}", index + 1);
    if let Some(k) = whole(token) {
        if k < 2 {
            return Err(bad("a forbidden graph needs at least 2 vertices"));
        }
        return Ok(ClaimGraph::Clique(k));
    }
    if let Some(code) = token.strip_prefix("G6:") {
        let matrix = crate::graph6::decode_graph6("entry", 0, code.as_bytes()).map_err(|e| bad(&e.message))?;
        let n = matrix.order();
        let edges: Vec<(usize, usize)> =
            (0..n).flat_map(|j| (0..j).map(move |i| (i, j))).filter(|&(i, j)| matrix.colour(i, j) == 1).collect();
        return graph_entry(token.to_string(), n, &edges).map_err(|e| bad(&e));
    }
    if let Some(list) = token.strip_prefix("E:") {
        let pair = |p: &str| p.split_once('-').and_then(|(a, b)| Some((whole(a)?, whole(b)?)));
        let pairs: Vec<(usize, usize)> =
            list.split('/').map(pair).collect::<Option<_>>().ok_or_else(|| bad("expected edges a-b separated by /"))?;
        let n = pairs.iter().map(|&(a, b)| a.max(b) + 1).max().unwrap_or(0);
        let canonical: BTreeSet<(usize, usize)> = pairs.iter().map(|&(a, b)| (a.min(b), a.max(b))).collect();
        let text: Vec<String> = canonical.iter().map(|(a, b)| format!("{a}-{b}")).collect();
        return graph_entry(format!("E:{}", text.join("/")), n, &pairs).map_err(|e| bad(&e));
    }
    let upper = token.to_ascii_uppercase();
    let mut chars = upper.chars();
    let letter = chars.next().ok_or_else(|| bad("empty entry"))?;
    let rest = chars.as_str();
    let need = |k: Option<usize>, min: usize, what: &str| k.filter(|&k| k >= min).ok_or_else(|| bad(what));
    let (token, n, pairs): (String, usize, Vec<(usize, usize)>) = match letter {
        'K' if rest.ends_with("-E") => {
            let k = need(whole(&rest[..rest.len() - 2]), 3, "K_k - e needs k >= 3")?;
            let pairs = (0..k).flat_map(|b| (0..b).map(move |a| (a, b))).filter(|&e| e != (0, 1)).collect();
            (format!("K{k}-e"), k, pairs)
        }
        'K' if rest.contains(':') => {
            let (a, b) = rest.split_once(':').expect("contains ':'");
            let a = need(whole(a), 1, "both parts of K_{a,b} need a vertex")?;
            let b = need(whole(b), 1, "both parts of K_{a,b} need a vertex")?;
            let (a, b) = (a.min(b), a.max(b));
            let pairs = (0..a).flat_map(|x| (a..a + b).map(move |y| (x, y))).collect();
            (format!("K{a}:{b}"), a + b, pairs)
        }
        'K' => {
            let k = need(whole(rest), 2, "expected a clique size of at least 2")?;
            return Ok(ClaimGraph::Clique(k));
        }
        'C' => {
            let k = need(whole(rest), 3, "a cycle needs at least 3 vertices")?;
            (format!("C{k}"), k, (0..k).map(|i| (i, (i + 1) % k)).collect())
        }
        'P' => {
            let k = need(whole(rest), 2, "a path needs at least 2 vertices")?;
            (format!("P{k}"), k, (1..k).map(|i| (i - 1, i)).collect())
        }
        'W' if rest.starts_with('_') => {
            let n = need(whole(&rest[1..]), 4, "a wheel W_n needs n >= 4 vertices")?;
            let pairs = (0..n - 1).flat_map(|i| [(i, (i + 1) % (n - 1)), (i, n - 1)]).collect();
            (format!("W_{n}"), n, pairs)
        }
        'W' | 'S' => return Err(bad("ambiguous in the literature: write W_n (n vertices) or K1:k (a star)")),
        'B' => {
            let k = need(whole(rest), 1, "a book needs a page")?;
            let pairs = std::iter::once((0, 1)).chain((2..k + 2).flat_map(|p| [(0, p), (1, p)])).collect();
            (format!("B{k}"), k + 2, pairs)
        }
        _ => return Err(bad("expected a clique size such as 4 or K4, or a graph such as C5")),
    };
    graph_entry(token, n, &pairs).map_err(|e| bad(&e))
}

impl Claim {
    /// A claim forbidding cliques of these sizes.
    pub fn cliques(sizes: &[usize]) -> Claim {
        Claim { forbidden: sizes.iter().map(|&k| ClaimGraph::Clique(k)).collect() }
    }

    /// Reads `4,4` or `C4,K4`; the error says which entry is wrong and why.
    pub fn parse(text: &str) -> Result<Claim, String> {
        let text = text.trim();
        if text.is_empty() {
            return Err("empty list: expected forbidden graphs such as 4,4".to_string());
        }
        let forbidden = text
            .split(',')
            .enumerate()
            .map(|(index, raw)| parse_entry(index, raw.trim()))
            .collect::<Result<Vec<_>, _>>()?;
        if forbidden.len() < 2 || forbidden.len() > MAX_COLOURS {
            return Err(format!("{} colour(s) listed: a claim needs between 2 and {MAX_COLOURS}", forbidden.len()));
        }
        Ok(Claim { forbidden })
    }

    pub fn colours(&self) -> usize {
        self.forbidden.len()
    }

    /// The clique sizes, when every colour forbids a clique.
    pub fn clique_sizes(&self) -> Option<Vec<usize>> {
        self.forbidden.iter().map(|g| if let ClaimGraph::Clique(k) = g { Some(*k) } else { None }).collect()
    }
}

impl fmt::Display for Claim {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let parts: Vec<String> = self.forbidden.iter().map(|g| g.to_string()).collect();
        f.write_str(&parts.join(","))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_lists() {
        assert_eq!(Claim::parse("4,4").unwrap().clique_sizes(), Some(vec![4, 4]));
        assert_eq!(Claim::parse("K3,3,k3").unwrap().clique_sizes(), Some(vec![3, 3, 3]));
        let claim = Claim::parse("C4,K4").unwrap();
        assert_eq!(claim.clique_sizes(), None);
        assert_eq!(claim.to_string(), "C4,4");
        // C5 in graph6 is Dhc (McKay's graph6 description).
        assert_eq!(
            Claim::parse("G6:Dhc,C5").unwrap().forbidden[0].edge_list(),
            Claim::parse("C5,3").unwrap().forbidden[0].edge_list()
        );
        // A triangle given as a cycle is a clique.
        assert_eq!(Claim::parse("C3,P2").unwrap().clique_sizes(), Some(vec![3, 2]));
    }

    #[test]
    fn rejects_bad_lists() {
        for bad in ["", "4", "4,", "4,x", "4,1", "KK4,4", "-4,4", "4.5,4", "C2,4", "E:0-0,4", "G6:D,4", "Q4,4"] {
            assert!(Claim::parse(bad).is_err(), "{bad:?} accepted");
        }
    }

    #[test]
    fn wheels_follow_the_survey_and_old_spellings_are_refused() {
        // W_n = K_1 + C_{n-1} has n vertices and 2(n-1) edges (Radziszowski DS1, from memory).
        let wheel = &Claim::parse("W_6,3").unwrap().forbidden[0];
        assert_eq!((wheel.vertices(), wheel.edge_list().len()), (6, 10));
        assert_eq!(Claim::parse("W_4,3").unwrap().clique_sizes(), Some(vec![4, 3]), "W_4 is K_4");
        for old in ["W5,3", "S3,3", "W_3,3"] {
            assert!(Claim::parse(old).is_err(), "{old:?} accepted");
        }
    }
}
