//! Model counting of the encoder against brute force.

use ramsift_checker::check_colouring;
use ramsift_driver::certify::witness_check::{to_claim, to_matrix};
use ramsift_encoder::{Colouring, EncodingLimits, Instance, RamseyEncoding, RamseySpec};
use ramsift_tests::published::TRIANGLE_FREE_K5_COLOURINGS;

fn satisfied(clauses: &[Vec<i32>], assignment: u32) -> bool {
    clauses.iter().all(|c| {
        c.iter()
            .any(|&l| (assignment >> (l.unsigned_abs() - 1) & 1 == 1) == (l > 0))
    })
}

#[test]
fn cnf_of_3_3_on_5_has_twelve_models() {
    let instance = Instance::new(RamseySpec::cliques(&[3, 3]).unwrap(), 5).unwrap();
    let encoding = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
    let clauses = encoding.clauses();
    assert_eq!(encoding.variable_count(), 10);
    let models = (0u32..1 << 10).filter(|&a| satisfied(&clauses, a)).count();
    // 12 = 4!/2 labelled pentagons (common practice, derivable by hand).
    assert_eq!(models, TRIANGLE_FREE_K5_COLOURINGS);

    // The same count by the checker over all colourings of K5.
    let claim = to_claim(instance.spec());
    let accepted = (0u32..1 << 10)
        .filter(|&bits| {
            let c = Colouring::from_fn(5, 2, |i, j| {
                if bits >> ramsift_encoder::edges::edge_index(i, j) & 1 == 1 {
                    1
                } else {
                    2
                }
            });
            check_colouring(&to_matrix(&c), &claim).is_valid()
        })
        .count();
    assert_eq!(accepted, TRIANGLE_FREE_K5_COLOURINGS);
}

#[test]
fn solver_enumeration_finds_the_same_twelve() {
    use varisat::{ExtendFormula, Lit, Solver};
    let instance = Instance::new(RamseySpec::cliques(&[3, 3]).unwrap(), 5).unwrap();
    let encoding = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
    let mut solver = Solver::new();
    for clause in encoding.clauses() {
        let lits: Vec<Lit> = clause
            .iter()
            .map(|&l| Lit::from_dimacs(l as isize))
            .collect();
        solver.add_clause(&lits);
    }
    let mut count = 0;
    while solver.solve().unwrap() {
        count += 1;
        let blocking: Vec<Lit> = solver.model().unwrap().iter().map(|&l| !l).collect();
        solver.add_clause(&blocking);
        assert!(count <= 100);
    }
    assert_eq!(count, TRIANGLE_FREE_K5_COLOURINGS);
}
