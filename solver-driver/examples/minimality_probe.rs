//! Runs the hooked solver with the minimality check on one instance and prints
//! where the time went: `cargo run --release -p ramsift-driver --example
//! minimality_probe -- SPEC N [BUDGET] [--no-hook] [--degree-bounds]`.

use std::sync::atomic::AtomicBool;
use std::time::Instant;

use ramsift_cdcl::NoHook;
use ramsift_driver::enumerate::canonical::colour_maps;
use ramsift_driver::minimality::hook::{MinimalityHook, DEFAULT_BUDGET};
use ramsift_driver::minimality::solve::{loaded_solver, solve_encoding};
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec, Scheme, SymmetrySet};

fn main() {
    let args: Vec<String> = std::env::args().skip(1).collect();
    let spec: RamseySpec = args[0].parse().expect("a specification");
    let n: usize = args[1].parse().expect("an order");
    let budget = args
        .get(2)
        .and_then(|b| b.parse().ok())
        .unwrap_or(DEFAULT_BUDGET);
    let hooked = !args.iter().any(|a| a == "--no-hook");
    let schemes: &[Scheme] = if args.iter().any(|a| a == "--degree-bounds") {
        &[Scheme::DegreeBounds]
    } else {
        &[]
    };
    let instance = Instance::new(spec.clone(), n).expect("a valid instance");
    let encoding = RamseyEncoding::with_symmetry(
        &instance,
        &SymmetrySet::of(schemes),
        &EncodingLimits::default(),
    )
    .expect("encodes");
    let mut hook = MinimalityHook::new(*encoding.variables(), colour_maps(&spec, true), budget);
    let started = Instant::now();
    let mut solver = loaded_solver(&encoding);
    let (outcome, _) = if hooked {
        solve_encoding(
            &mut solver,
            &encoding,
            &mut hook,
            &AtomicBool::new(false),
            None,
        )
    } else {
        solve_encoding(
            &mut solver,
            &encoding,
            &mut NoHook,
            &AtomicBool::new(false),
            None,
        )
    };
    println!("{outcome:?} in {:.3}s", started.elapsed().as_secs_f64());
    println!("solver: {:?}", solver.stats());
    println!("hook: {:?}", hook.stats);
}
