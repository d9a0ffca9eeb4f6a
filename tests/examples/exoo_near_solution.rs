//! Writes the published near-solution of Exoo's (4,6;34) construction (the 2×2
//! block colouring before his eleven recolourings, two monochromatic K4s; see
//! `ramsift_tests::constructions::exoo_4_6_34_blocks`) as a colouring file, the
//! input of the repair benchmark in BENCHMARKS.md.
//!
//! `cargo run --release -p ramsift-tests --example exoo_near_solution -- FILE`

use ramsift_driver::output::witness::colouring_text;
use ramsift_encoder::{Instance, RamseySpec};
use ramsift_tests::constructions::exoo_4_6_34_blocks;

fn main() -> std::io::Result<()> {
    let path = std::env::args()
        .nth(1)
        .expect("usage: exoo_near_solution FILE");
    let instance = Instance::new(RamseySpec::cliques(&[4, 6]).unwrap(), 34).unwrap();
    let comments =
        ["Exoo's (4,6;34) block colouring before recolouring: 2 monochromatic K4s".to_string()];
    std::fs::write(
        path,
        colouring_text(&instance, &exoo_4_6_34_blocks(), &comments),
    )
}
