//! Property tests across crates: the encoder's CNF and the checker agree on every
//! colouring, and the driver's graph6 writer and the checker's reader round-trip.

use proptest::prelude::*;

use ramsift_checker::check_colouring;
use ramsift_checker::graph6::{decode_graph6, decode_graph6_file};
use ramsift_driver::certify::witness_check::{to_claim, to_matrix};
use ramsift_driver::output::graph6::encode_graph6;
use ramsift_encoder::{Colouring, EncodingLimits, Instance, RamseyEncoding, RamseySpec};

fn colouring_from(order: usize, colours: usize, words: &[u64]) -> Colouring {
    let mut bit = 0usize;
    Colouring::from_fn(order, colours, |_, _| {
        let word = words[bit / 64 % words.len()] >> (bit % 64);
        bit += 3;
        (word % colours as u64 + 1) as u8
    })
}

proptest! {
    #[test]
    fn satisfies_cnf_iff_checker_accepts(
        sizes in proptest::collection::vec(2usize..=4, 2..=3),
        order in 4usize..=8,
        words in proptest::collection::vec(any::<u64>(), 1..4),
    ) {
        let instance = Instance::new(RamseySpec::cliques(&sizes).unwrap(), order).unwrap();
        let encoding = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
        let colouring = colouring_from(order, sizes.len(), &words);
        let values = encoding.variables().assignment_of(&colouring);
        let satisfies = encoding.clauses().iter().all(|c| {
            c.iter().any(|&l| values[l.unsigned_abs() as usize - 1] == (l > 0))
        });
        let accepted = check_colouring(&to_matrix(&colouring), &to_claim(instance.spec())).is_valid();
        prop_assert_eq!(satisfies, accepted);
    }

    /// The same for forbidden graphs other than cliques: the encoder's one clause per
    /// copy against the checker's own subgraph search.
    #[test]
    fn satisfies_cnf_iff_checker_accepts_for_graphs(
        entries in proptest::collection::vec(
            proptest::sample::select(vec!["C4", "C5", "P4", "K1:3", "K4-e", "K2:3", "W_5", "B2", "3", "G6:Dhc", "E:0-1/1-2/2-3/3-0/0-2"]),
            2..=3,
        ),
        order in 5usize..=7,
        words in proptest::collection::vec(any::<u64>(), 1..4),
    ) {
        let spec: RamseySpec = entries.join(",").parse().unwrap();
        let instance = Instance::new(spec, order).unwrap();
        let encoding = RamseyEncoding::new(&instance, &EncodingLimits::default()).unwrap();
        let colouring = colouring_from(order, entries.len(), &words);
        let values = encoding.variables().assignment_of(&colouring);
        let satisfies = encoding.clauses().iter().all(|c| {
            c.iter().any(|&l| values[l.unsigned_abs() as usize - 1] == (l > 0))
        });
        let accepted = check_colouring(&to_matrix(&colouring), &to_claim(instance.spec())).is_valid();
        prop_assert_eq!(satisfies, accepted);
    }

    #[test]
    fn graph6_round_trips(order in 0usize..=100, words in proptest::collection::vec(any::<u64>(), 1..8)) {
        let colouring = colouring_from(order, 2, &words);
        let text = encode_graph6(order, |i, j| colouring.colour(i, j) == 1);
        let matrix = decode_graph6("roundtrip", 0, text.as_bytes()).unwrap();
        prop_assert_eq!(matrix.order(), order);
        for j in 0..order {
            for i in 0..j {
                prop_assert_eq!(matrix.colour(i, j), colouring.colour(i, j));
            }
        }
    }
}

#[test]
fn long_form_orders_beyond_62_round_trip() {
    for order in [62, 63, 64, 100, 300] {
        let colouring = colouring_from(order, 2, &[0x9e37_79b9_7f4a_7c15, 0x2545_f491_4f6c_dd1d]);
        let text = encode_graph6(order, |i, j| colouring.colour(i, j) == 1);
        assert_eq!(text.as_bytes()[0] == 126, order > 62);
        let graphs = decode_graph6_file("f", format!("{text}\n").as_bytes()).unwrap();
        assert_eq!(graphs[0], to_matrix(&colouring));
    }
}
