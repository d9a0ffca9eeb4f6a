//! Probe of the loosened extension: every circulant colouring of K_(N−1) (up to
//! 16) is extended to K_N with old vertices freed nearest the obstruction, each
//! for at most CAP seconds; prints how many vertices were freed and the time.
//!
//! `cargo run --release --example loosening_probe -- SPEC N CAP [SEED]`

use ramsift_driver::search::formula::Formula;
use ramsift_driver::search::loosening::{extend_loosened, Loosened};
use ramsift_driver::structured::{family_colourings, EdgeOrbits};
use ramsift_encoder::{EncodingLimits, Instance, RamseyEncoding, RamseySpec};
use std::sync::atomic::AtomicBool;
use std::time::{Duration, Instant};
fn main() {
    let a: Vec<String> = std::env::args().skip(1).collect();
    let spec: RamseySpec = a[0].parse().unwrap();
    let n: usize = a[1].parse().unwrap();
    let cap: u64 = a[2].parse().unwrap();
    let seed: u64 = a.get(3).map_or(1, |s| s.parse().unwrap());
    let stop = AtomicBool::new(false);
    let bases = family_colourings(
        &EdgeOrbits::circulant(n - 1).unwrap(),
        &spec,
        16,
        &stop,
        None,
    )
    .unwrap();
    println!("{} circulant bases at {}", bases.len(), n - 1);
    let enc = RamseyEncoding::new(
        &Instance::new(spec.clone(), n).unwrap(),
        &EncodingLimits::default(),
    )
    .unwrap();
    let formula = Formula::from_encoding(&enc);
    for (b, base) in bases.iter().enumerate() {
        let t = Instant::now();
        let out = extend_loosened(
            &formula,
            base,
            n - 1,
            seed,
            &stop,
            Some(Instant::now() + Duration::from_secs(cap)),
        )
        .unwrap();
        match out {
            Loosened::Extended { freed, .. } => {
                println!(
                    "base {b}: FOUND with {} freed {:?} in {:.2?}",
                    freed.len(),
                    freed,
                    t.elapsed()
                );
                return;
            }
            Loosened::None { freed } => println!(
                "base {b}: none up to {} freed in {:.2?}",
                freed.len(),
                t.elapsed()
            ),
            Loosened::Stopped { freed } => println!(
                "base {b}: stopped at {} freed {:?} in {:.2?}",
                freed.len(),
                freed,
                t.elapsed()
            ),
        }
    }
}
