//! Cube planning: a decision tree over variables of the formula whose leaves are the
//! shards. Each split is chosen by lookahead: for a sample of free variables v, unit
//! propagation is run under cube ∧ v and cube ∧ ¬v, and the variable maximising
//! (assigned(v) + 1)·(assigned(¬v) + 1) is taken (the product rule of lookahead
//! solvers), so both branches shrink the problem. The leaf with the most free
//! variables is split next, until there are as many leaves as shards asked for.
//! Since every split has both polarities as children, the leaves' cubes cover every
//! assignment exactly once: their disjunction is a tautology.

use std::path::Path;

use serde::{Deserialize, Serialize};

use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, SymmetrySet};

use super::error::ShardError;
use super::propagate::{Propagation, Propagator};
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

enum Node {
    Leaf {
        cube: Vec<i32>,
        free: usize,
        refuted: bool,
    },
    Split {
        var: i32,
        positive: usize,
        negative: usize,
    },
}

/// Free variables after propagation, and whether propagation refuted the cube.
type Measure = (usize, bool);

/// The best split found so far: (score, variable, positive branch, negative branch).
struct Lookahead {
    score: u64,
    var: i32,
    positive: Measure,
    negative: Measure,
}

/// Free colour variables (the edges' variables; auxiliaries are not counted) after
/// propagating `cube`, and whether propagation refutes it.
fn measure(propagator: &Propagator, cube: &[i32], colour_variables: usize) -> Measure {
    match propagator.propagate(cube) {
        Propagation::Conflict => (0, true),
        Propagation::Assigned(a) => {
            let assigned = a
                .iter()
                .filter(|l| l.unsigned_abs() as usize <= colour_variables)
                .count();
            (colour_variables - assigned, false)
        }
    }
}

/// The lookahead split of the leaf `cube`: of a sample of about `sample` free
/// colour variables, the one with the best product of the two branches' gains.
/// None when no colour variable is free.
fn best_split(
    propagator: &Propagator,
    cube: &[i32],
    colour_variables: usize,
    sample: usize,
) -> Option<Lookahead> {
    let assigned: Vec<i32> = match propagator.propagate(cube) {
        Propagation::Assigned(a) => a,
        Propagation::Conflict => Vec::new(),
    };
    let candidates: Vec<i32> = (1..=colour_variables as i32)
        .filter(|v| !assigned.iter().any(|l| l.abs() == *v))
        .collect();
    let free_now = colour_variables
        - assigned
            .iter()
            .filter(|l| l.unsigned_abs() as usize <= colour_variables)
            .count();
    let gain = |m: Measure| {
        if m.1 {
            free_now as u64
        } else {
            free_now.saturating_sub(m.0) as u64
        }
    };
    let step = (candidates.len() / sample).max(1);
    let mut best: Option<Lookahead> = None;
    for &v in candidates.iter().step_by(step) {
        let mut with = cube.to_vec();
        with.push(v);
        let positive = measure(propagator, &with, colour_variables);
        *with.last_mut().expect("pushed") = -v;
        let negative = measure(propagator, &with, colour_variables);
        let score = (gain(positive) + 1) * (gain(negative) + 1);
        if best.as_ref().is_none_or(|b| score > b.score) {
            best = Some(Lookahead {
                score,
                var: v,
                positive,
                negative,
            });
        }
    }
    best
}

/// Numbers the leaves below `at` depth first into `cubes` and builds the
/// serialisable tree.
fn numbered_tree(nodes: &[Node], at: usize, cubes: &mut Vec<Cube>) -> PlanTree {
    match &nodes[at] {
        Node::Leaf {
            cube,
            free,
            refuted,
        } => {
            let index = cubes.len();
            cubes.push(Cube {
                index,
                literals: cube.clone(),
                free_variables: *free,
                refuted_by_propagation: *refuted,
                estimated_share_percent: 0.0,
            });
            PlanTree::Leaf { leaf: index }
        }
        Node::Split {
            var,
            positive,
            negative,
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
    let weights: Vec<f64> = cubes
        .iter()
        .map(|c| {
            if c.refuted_by_propagation {
                0.0
            } else {
                2f64.powf((c.free_variables as f64 - top as f64) / 10.0)
            }
        })
        .collect();
    let total: f64 = weights.iter().sum();
    for (cube, w) in cubes.iter_mut().zip(weights) {
        cube.estimated_share_percent = if total > 0.0 { 100.0 * w / total } else { 0.0 };
    }
}

/// Replaces leaf `target` (whose cube is `cube`) by a split on `best.var` with
/// its two branches as new leaves.
fn split_leaf(nodes: &mut Vec<Node>, target: usize, cube: Vec<i32>, best: Lookahead) {
    let var = best.var;
    let mut positive_cube = cube.clone();
    positive_cube.push(var);
    let mut negative_cube = cube;
    negative_cube.push(-var);
    let (positive, negative) = (nodes.len(), nodes.len() + 1);
    for (cube, (free, refuted)) in [
        (positive_cube, best.positive),
        (negative_cube, best.negative),
    ] {
        nodes.push(Node::Leaf {
            cube,
            free,
            refuted,
        });
    }
    nodes[target] = Node::Split {
        var,
        positive,
        negative,
    };
}

/// Plans `shards` cubes for the encoding (fewer if the tree cannot grow further).
pub fn plan_cubes(encoding: &RamseyEncoding, shards: usize, formula_sha256: String) -> Plan {
    plan_cubes_counted(
        encoding,
        shards,
        formula_sha256,
        &std::sync::atomic::AtomicUsize::new(0),
    )
}

/// [`plan_cubes`], keeping `leaves` at the number of cubes so far (for progress).
pub fn plan_cubes_counted(
    encoding: &RamseyEncoding,
    shards: usize,
    formula_sha256: String,
    leaves_so_far: &std::sync::atomic::AtomicUsize,
) -> Plan {
    let formula = Formula::from_encoding(encoding);
    let propagator = Propagator::new(&formula);
    let colour_variables = formula.variables().colour_variable_count();
    let (free, refuted) = measure(&propagator, &[], colour_variables);
    let mut nodes = vec![Node::Leaf {
        cube: Vec::new(),
        free,
        refuted,
    }];
    let mut leaves = 1;
    while leaves < shards.max(1) {
        leaves_so_far.store(leaves, std::sync::atomic::Ordering::Relaxed);
        // The open leaf with the most free variables.
        let Some(target) = (0..nodes.len())
            .filter(|&i| matches!(nodes[i], Node::Leaf { refuted: false, free, .. } if free > 0))
            .max_by_key(|&i| match nodes[i] {
                Node::Leaf { free, .. } => free,
                _ => 0,
            })
        else {
            break;
        };
        let Node::Leaf { cube, .. } = &nodes[target] else {
            unreachable!()
        };
        let cube = cube.clone();
        // Lookahead costs two propagations per candidate: sample fewer on large formulas.
        let sample = if formula.clause_count() > 20_000 {
            12
        } else {
            48
        };
        let Some(best) = best_split(&propagator, &cube, colour_variables, sample) else {
            break;
        };
        split_leaf(&mut nodes, target, cube, best);
        leaves += 1;
    }

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
        assert_eq!(plan.cubes.len(), 16);
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
        assert!(vars.len() <= 15);
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
}
