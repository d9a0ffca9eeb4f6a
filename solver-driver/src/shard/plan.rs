//! Cube planning: a decision tree over variables of the formula whose leaves are the
//! shards. Each split is chosen by lookahead: for a sample of free variables v, unit
//! propagation is run under cube ∧ v and cube ∧ ¬v, and the variable maximising
//! (assigned(v) + 1)·(assigned(¬v) + 1) is taken (the product rule of lookahead
//! solvers), so both branches shrink the problem. The leaf with the most free
//! variables is split next, until there are as many leaves as shards asked for.
//! Since every split has both polarities as children, the leaves' cubes cover every
//! assignment exactly once: their disjunction is a tautology.

use std::path::Path;
use std::sync::atomic::{AtomicUsize, Ordering};

use serde::{Deserialize, Serialize};

use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};

use super::error::ShardError;
use super::propagate::Propagator;
use super::PLAN_FILE;
use crate::certify::bundle::hash_file;
use crate::output::json_file::write_json;
use crate::search::formula::Formula;

/// The identifier of the plan layout.
pub const PLAN_FORMAT: &str = "ramsift-plan 1";

/// The coverage tree: a leaf (shard index) or a split on a variable.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
#[serde(untagged)]
pub enum PlanTree {
    Leaf {
        leaf: usize,
    },
    Split {
        split: i32,
        positive: Box<PlanTree>,
        negative: Box<PlanTree>,
    },
}

/// One shard: its cube and the planner's estimate of its difficulty.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Cube {
    pub index: usize,
    pub literals: Vec<i32>,
    /// Clauses implied under the cube, in order: each is RUP from the formula, the
    /// cube and the ones before it (failed literals the planner fixed, and the
    /// refutations of branches that propagation settles). A shard run writes them
    /// as the first lemmas of its trace and gives the unit ones to the solver.
    #[serde(default)]
    pub lemmas: Vec<Vec<i32>>,
    /// Colour variables left unassigned by unit propagation under the cube.
    pub free_variables: usize,
    /// True when unit propagation alone refutes the cube.
    pub refuted_by_propagation: bool,
    /// Share of the total estimated work (2^(free/10), normalised), in percent.
    pub estimated_share_percent: f64,
}

/// A plan: the instance, its formula's fingerprint, the cubes and the tree.
#[derive(Clone, Debug, Serialize, Deserialize)]
pub struct Plan {
    pub plan_format: String,
    pub spec: String,
    /// The vertex count of each colour's forbidden graph (plans before this
    /// name called it `clique_sizes`).
    #[serde(alias = "clique_sizes")]
    pub vertex_counts: Vec<usize>,
    pub order: usize,
    pub symmetry: Vec<String>,
    pub variables: usize,
    pub clauses: u64,
    pub formula_sha256: String,
    pub cubes: Vec<Cube>,
    pub tree: PlanTree,
}

impl Plan {
    /// Reads the plan of a plan directory.
    pub fn read(plan_dir: &Path) -> Result<Plan, ShardError> {
        let path = plan_dir.join(PLAN_FILE);
        let text = std::fs::read_to_string(&path).map_err(ShardError::io(&path))?;
        let plan: Plan = serde_json::from_str(&text).map_err(|e| ShardError::NotAPlan {
            path: path.clone(),
            message: e.to_string(),
        })?;
        if plan.plan_format != PLAN_FORMAT {
            return Err(ShardError::PlanFormat {
                path,
                found: plan.plan_format,
                expected: PLAN_FORMAT,
            });
        }
        Ok(plan)
    }

    /// Writes the plan into a plan directory, atomically.
    pub fn write(&self, plan_dir: &Path) -> Result<(), ShardError> {
        let path = plan_dir.join(PLAN_FILE);
        write_json(&path, self).map_err(ShardError::io(&path))
    }

    /// Rebuilds the plan's encoding and checks it matches what the plan recorded.
    pub fn encoding(&self) -> Result<RamseyEncoding, ShardError> {
        let instance_error = |e: &dyn std::fmt::Display| ShardError::PlanInstance(e.to_string());
        let spec: RamseySpec = self.spec.parse().map_err(|e| instance_error(&e))?;
        let instance = Instance::new(spec, self.order).map_err(|e| instance_error(&e))?;
        let symmetry: SymmetrySet = self
            .symmetry
            .join(",")
            .parse()
            .map_err(|e| instance_error(&e))?;
        let encoding =
            RamseyEncoding::with_symmetry(&instance, &symmetry, &EncodingLimits::default())
                .map_err(|e| instance_error(&e))?;
        if encoding.variable_count() != self.variables || encoding.clause_count() != self.clauses {
            return Err(ShardError::PlanEncodingChanged);
        }
        Ok(encoding)
    }
}

/// SHA-256 of the plan directory's plan.json (None if it cannot be read).
pub fn plan_sha256(plan_dir: &Path) -> Option<String> {
    hash_file(&plan_dir.join(PLAN_FILE))
        .ok()
        .map(|(sha, _)| sha)
}

/// A node of the tree being grown.
enum Node {
    Leaf(Leaf),
    Split {
        var: i32,
        positive: usize,
        negative: usize,
        /// How many fixed literals the branches inherited from the split leaf.
        inherited: usize,
    },
}

/// A leaf: its decisions, the lemmas implied under them (each RUP from the
/// decisions and the earlier ones; the units are fixed literals), and the colour
/// variables still free after propagation.
#[derive(Clone, Debug, Default)]
struct Leaf {
    cube: Vec<i32>,
    implied: Vec<Vec<i32>>,
    free: usize,
    refuted: bool,
    /// Refuted by unit propagation alone (None), or by both polarities of this
    /// variable failing (Some).
    refuted_on: Option<i32>,
    /// No colour variable is left to split on.
    closed: bool,
    probed: bool,
}

/// A split: the variable and the free colour variables of its two branches.
struct Split {
    var: i32,
    free: (usize, usize),
    score: u64,
}

/// Candidate variables the lookahead tries per pass over a leaf.
const LOOKAHEAD_SAMPLE: usize = 48;
/// Passes over a leaf while they keep finding failed literals.
const FAILED_LITERAL_PASSES: usize = 3;

/// Sets the propagator to `leaf` (its cube and fixed literals); false if that
/// conflicts, which refutes the leaf.
fn enter(p: &mut Propagator, leaf: &mut Leaf) -> bool {
    let units: Vec<i32> = leaf
        .implied
        .iter()
        .filter(|c| c.len() == 1)
        .map(|c| c[0])
        .collect();
    let ready = p
        .reset()
        .and_then(|_| p.assume_all(&leaf.cube))
        .and_then(|_| p.assume_all(&units));
    if ready.is_err() {
        (leaf.refuted, leaf.refuted_on, leaf.free) = (true, None, 0);
    }
    ready.is_ok()
}

/// One lookahead pass over a sample of the free colour variables of the leaf the
/// propagator is set to. A polarity that fails is fixed the other way (pushed to
/// `leaf.implied`); both failing refutes the leaf (Err). Returns the best split
/// among the variables whose both polarities propagate: the largest
/// (gain(v) + 1)·(gain(¬v) + 1), the product rule of lookahead solvers.
fn lookahead_pass(
    p: &mut Propagator,
    leaf: &mut Leaf,
    colour_variables: usize,
) -> Result<Option<Split>, ()> {
    let candidates: Vec<i32> = (1..=colour_variables as i32)
        .filter(|&v| !p.is_assigned(v))
        .collect();
    let step = (candidates.len() / LOOKAHEAD_SAMPLE).max(1);
    let mut best: Option<Split> = None;
    for &v in candidates.iter().step_by(step) {
        if p.is_assigned(v) {
            continue;
        }
        let free_now = colour_variables - p.assigned_counted();
        let mut branch = |lit: i32| {
            let mark = p.mark();
            let free = p
                .assume(lit)
                .map(|_| colour_variables - p.assigned_counted());
            p.undo_to(mark);
            free.ok()
        };
        let (positive, negative) = (branch(v), branch(-v));
        match (positive, negative) {
            (None, None) => {
                (leaf.refuted, leaf.refuted_on, leaf.free) = (true, Some(v), 0);
                return Err(());
            }
            (Some(a), Some(b)) => {
                let score = (free_now.saturating_sub(a) as u64 + 1)
                    * (free_now.saturating_sub(b) as u64 + 1);
                if best.as_ref().is_none_or(|s| score > s.score) {
                    best = Some(Split {
                        var: v,
                        free: (a, b),
                        score,
                    });
                }
            }
            (failed_positive, _) => {
                let fixed = if failed_positive.is_none() { -v } else { v };
                leaf.implied.push(vec![fixed]);
                p.assume(fixed)
                    .expect("its other polarity failed, this one did not");
            }
        }
    }
    Ok(best)
}

/// Probes `leaf`: lookahead passes until one fixes no failed literal (at most
/// [`FAILED_LITERAL_PASSES`]). Returns the split to make, or None when the leaf
/// is refuted or has nothing left to split on (`closed`).
fn probe(p: &mut Propagator, leaf: &mut Leaf, colour_variables: usize) -> Option<Split> {
    leaf.probed = true;
    if !enter(p, leaf) {
        return None;
    }
    let mut best = None;
    for _ in 0..FAILED_LITERAL_PASSES {
        let fixed_before = leaf.implied.len();
        best = lookahead_pass(p, leaf, colour_variables).ok()?;
        if leaf.implied.len() == fixed_before {
            break;
        }
    }
    leaf.free = colour_variables - p.assigned_counted();
    let best = best.filter(|s| !p.is_assigned(s.var));
    leaf.closed = best.is_none() && leaf.free == 0;
    best
}

/// Replaces leaf `target` by a split on `split.var` with its two branches as new
/// leaves (which inherit the leaf's fixed literals).
fn split_leaf(nodes: &mut Vec<Node>, target: usize, split: Split) {
    let Node::Leaf(leaf) = &nodes[target] else {
        unreachable!("only leaves are split")
    };
    let child = |lit: i32, free: usize| {
        let mut cube = leaf.cube.clone();
        cube.push(lit);
        Node::Leaf(Leaf {
            cube,
            implied: leaf.implied.clone(),
            free,
            ..Leaf::default()
        })
    };
    let (positive, negative) = (
        child(split.var, split.free.0),
        child(-split.var, split.free.1),
    );
    let inherited = leaf.implied.len();
    let at = nodes.len();
    nodes.push(positive);
    nodes.push(negative);
    nodes[target] = Node::Split {
        var: split.var,
        positive: at,
        negative: at + 1,
        inherited,
    };
}

/// The lemmas that refute branch `lit` of a split, relative to the split's cube
/// and inherited lemmas, ending with the unit ¬lit: the dead leaf's own lemmas
/// with ¬lit added, then (if a lookahead refuted it on w) ¬lit ∨ ¬w, then ¬lit.
fn refutation(dead: &Leaf, lit: i32, inherited: usize) -> Vec<Vec<i32>> {
    let mut lemmas: Vec<Vec<i32>> = dead.implied[inherited..]
        .iter()
        .map(|c| [&c[..], &[-lit]].concat())
        .collect();
    lemmas.extend(dead.refuted_on.map(|w| vec![-lit, -w]));
    lemmas.push(vec![-lit]);
    lemmas
}

/// Removes the splits that have one branch refuted (by propagation, or by a
/// lookahead on one variable): the other branch takes the split's place, with
/// the refutation's lemmas (ending with the other branch's literal as a unit)
/// inserted among its lemmas. So no cube is spent on a case the planner settled.
fn collapse(nodes: &mut Vec<Node>, at: usize) {
    let Node::Split {
        var,
        positive,
        negative,
        inherited,
    } = nodes[at]
    else {
        return;
    };
    collapse(nodes, positive);
    collapse(nodes, negative);
    let dead = |i: usize| match &nodes[i] {
        Node::Leaf(l) if l.refuted => Some(l.clone()),
        _ => None,
    };
    let (keep, inserted) = match (dead(positive), dead(negative)) {
        (Some(d), None) => (negative, refutation(&d, var, inherited)),
        (None, Some(d)) => (positive, refutation(&d, -var, inherited)),
        _ => return,
    };
    let kept_literal = inserted.last().expect("ends with a unit")[0];
    let mut stack = vec![keep];
    while let Some(i) = stack.pop() {
        match &mut nodes[i] {
            Node::Leaf(leaf) => {
                leaf.cube.retain(|&l| l != kept_literal);
                leaf.implied
                    .splice(inherited..inherited, inserted.iter().cloned());
            }
            Node::Split {
                positive,
                negative,
                inherited: below,
                ..
            } => {
                *below += inserted.len();
                stack.extend([*positive, *negative]);
            }
        }
    }
    nodes[at] = std::mem::replace(&mut nodes[keep], Node::Leaf(Leaf::default()));
}

/// Numbers the leaves below `at` depth first into `cubes` and builds the
/// serialisable tree.
fn numbered_tree(nodes: &[Node], at: usize, cubes: &mut Vec<Cube>) -> PlanTree {
    match &nodes[at] {
        Node::Leaf(leaf) => {
            let index = cubes.len();
            cubes.push(Cube {
                index,
                literals: leaf.cube.clone(),
                lemmas: leaf.implied.clone(),
                free_variables: leaf.free,
                refuted_by_propagation: leaf.refuted,
                estimated_share_percent: 0.0,
            });
            PlanTree::Leaf { leaf: index }
        }
        Node::Split {
            var,
            positive,
            negative,
            ..
        } => PlanTree::Split {
            split: *var,
            positive: Box::new(numbered_tree(nodes, *positive, cubes)),
            negative: Box::new(numbered_tree(nodes, *negative, cubes)),
        },
    }
}

/// Shares of 2^(free/10) of the cubes not refuted by propagation, computed
/// relative to the largest so they stay finite.
fn set_estimated_shares(cubes: &mut [Cube]) {
    let top = cubes
        .iter()
        .filter(|c| !c.refuted_by_propagation)
        .map(|c| c.free_variables)
        .max()
        .unwrap_or(0);
    let weight = |c: &Cube| match c.refuted_by_propagation {
        true => 0.0,
        false => 2f64.powf((c.free_variables as f64 - top as f64) / 10.0),
    };
    let total: f64 = cubes.iter().map(weight).sum();
    for cube in cubes.iter_mut() {
        cube.estimated_share_percent = if total > 0.0 {
            100.0 * weight(cube) / total
        } else {
            0.0
        };
    }
}

/// Plans `shards` cubes for the encoding (fewer if the tree cannot grow further).
pub fn plan_cubes(encoding: &RamseyEncoding, shards: usize, formula_sha256: String) -> Plan {
    plan_cubes_counted(encoding, shards, formula_sha256, &AtomicUsize::new(0))
}

/// The open leaf (not refuted, not closed) with the most free variables: the
/// largest estimated work.
fn largest_open_leaf(nodes: &[Node]) -> Option<usize> {
    let free = |i: &usize| match &nodes[*i] {
        Node::Leaf(l) if !l.refuted && !l.closed => Some(l.free),
        _ => None,
    };
    (0..nodes.len())
        .filter(|i| free(i).is_some())
        .max_by_key(free)
}

/// [`plan_cubes`], keeping `open_so_far` at the number of open cubes so far (for
/// progress). Splits the largest open leaf until `shards` leaves are open (not
/// refuted by propagation), then fixes the failed literals of every leaf.
pub fn plan_cubes_counted(
    encoding: &RamseyEncoding,
    shards: usize,
    formula_sha256: String,
    open_so_far: &AtomicUsize,
) -> Plan {
    let formula = Formula::from_encoding(encoding);
    let colour_variables = formula.variables().colour_variable_count();
    let mut propagator = Propagator::new(&formula, colour_variables);
    let mut nodes = vec![Node::Leaf(Leaf {
        free: colour_variables,
        ..Leaf::default()
    })];
    let open = |nodes: &[Node]| {
        nodes
            .iter()
            .filter(|n| matches!(n, Node::Leaf(l) if !l.refuted))
            .count()
    };
    loop {
        while open(&nodes) < shards.max(1) {
            open_so_far.store(open(&nodes), Ordering::Relaxed);
            let Some(target) = largest_open_leaf(&nodes) else {
                break;
            };
            let Node::Leaf(leaf) = &mut nodes[target] else {
                unreachable!("an open leaf")
            };
            if let Some(split) = probe(&mut propagator, leaf, colour_variables) {
                split_leaf(&mut nodes, target, split);
            }
        }
        // Fix the failed literals of the leaves not probed yet; some turn out refuted,
        // and the tree grows again until enough cubes are open.
        for node in nodes.iter_mut() {
            match node {
                Node::Leaf(leaf) if !leaf.probed => {
                    _ = probe(&mut propagator, leaf, colour_variables)
                }
                _ => {}
            }
        }
        if open(&nodes) >= shards.max(1) || largest_open_leaf(&nodes).is_none() {
            break;
        }
    }
    collapse(&mut nodes, 0);
    open_so_far.store(open(&nodes), Ordering::Relaxed);

    let mut cubes = Vec::new();
    let tree = numbered_tree(&nodes, 0, &mut cubes);
    set_estimated_shares(&mut cubes);
    let instance = encoding.instance();
    Plan {
        plan_format: PLAN_FORMAT.to_string(),
        spec: instance.spec().to_string(),
        vertex_counts: instance.spec().vertex_counts(),
        order: instance.order(),
        symmetry: encoding
            .symmetry()
            .schemes()
            .iter()
            .map(|s| s.name().to_string())
            .collect(),
        variables: encoding.variable_count(),
        clauses: encoding.clause_count(),
        formula_sha256,
        cubes,
        tree,
    }
}

/// The cubes the tree defines (root-to-leaf paths), indexed by leaf.
pub fn tree_cubes(tree: &PlanTree) -> Vec<(usize, Vec<i32>)> {
    fn walk(t: &PlanTree, path: &mut Vec<i32>, out: &mut Vec<(usize, Vec<i32>)>) {
        match t {
            PlanTree::Leaf { leaf } => out.push((*leaf, path.clone())),
            PlanTree::Split {
                split,
                positive,
                negative,
            } => {
                path.push(*split);
                walk(positive, path, out);
                path.pop();
                path.push(-split);
                walk(negative, path, out);
                path.pop();
            }
        }
    }
    let mut out = Vec::new();
    walk(tree, &mut Vec::new(), &mut out);
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use ramsift_encoder::{EncodingLimits, Instance, RamseySpec, SymmetrySet};

    #[test]
    fn cubes_partition_every_assignment() {
        let instance = Instance::new(RamseySpec::cliques(&[4, 4]).unwrap(), 18).unwrap();
        let set: SymmetrySet = "colour-swap,lex-leader".parse().unwrap();
        let encoding =
            RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
        let plan = plan_cubes(&encoding, 16, String::new());
        assert_eq!(
            plan.cubes
                .iter()
                .filter(|c| !c.refuted_by_propagation)
                .count(),
            16
        );
        assert_eq!(
            tree_cubes(&plan.tree),
            plan.cubes
                .iter()
                .map(|c| (c.index, c.literals.clone()))
                .collect::<Vec<_>>()
        );
        // Every assignment of the split variables satisfies exactly one cube.
        let mut vars: Vec<i32> = plan
            .cubes
            .iter()
            .flat_map(|c| c.literals.iter().map(|l| l.abs()))
            .collect();
        vars.sort_unstable();
        vars.dedup();
        assert!(vars.len() <= 20);
        for bits in 0u32..1 << vars.len() {
            let value = |l: i32| {
                let at = vars.iter().position(|&v| v == l.abs()).unwrap();
                (bits >> at & 1 == 1) == (l > 0)
            };
            let matching = plan
                .cubes
                .iter()
                .filter(|c| c.literals.iter().all(|&l| value(l)))
                .count();
            assert_eq!(matching, 1);
        }
        let share: f64 = plan.cubes.iter().map(|c| c.estimated_share_percent).sum();
        assert!((share - 100.0).abs() < 1e-6 || share == 0.0);
    }

    /// Every lemma of every cube is RUP from the formula, the cube and the lemmas
    /// before it, as the checker's own DRAT checker sees it (an empty proof of
    /// formula ∧ cube ∧ earlier lemmas ∧ ¬lemma must succeed by propagation).
    #[test]
    fn every_planned_lemma_is_rup_for_the_checker() {
        use ramsift_checker::cnf::Cnf;
        use ramsift_checker::drat_check::check_drat;
        for (sizes, n, shards) in [
            (&[4, 4][..], 18, 6),
            (&[3, 6][..], 18, 6),
            (&[3, 3, 3][..], 17, 4),
        ] {
            let instance = Instance::new(RamseySpec::cliques(sizes).unwrap(), n).unwrap();
            let set = SymmetrySet::for_refutation(instance.spec());
            let encoding =
                RamseyEncoding::with_symmetry(&instance, &set, &EncodingLimits::default()).unwrap();
            let formula: Vec<Vec<i32>> = encoding.clauses();
            let plan = plan_cubes(&encoding, shards, String::new());
            let lemmas: usize = plan.cubes.iter().map(|c| c.lemmas.len()).sum();
            assert!(lemmas > 0, "({sizes:?};{n}): the planner fixed no literal");
            for cube in &plan.cubes {
                let mut clauses = formula.clone();
                clauses.extend(cube.literals.iter().map(|&l| vec![l]));
                for lemma in &cube.lemmas {
                    let mut negated = clauses.clone();
                    negated.extend(lemma.iter().map(|&l| vec![-l]));
                    let cnf = Cnf::new(encoding.variable_count(), negated);
                    let verdict = check_drat(&cnf, &Default::default(), false);
                    assert!(
                        verdict.is_ok(),
                        "cube {}: lemma {lemma:?} is not RUP",
                        cube.index
                    );
                    clauses.push(lemma.clone());
                }
            }
        }
    }
}
