//! REFEREE.txt: the plain-language guide to checking a bundle, derived from its
//! manifest and from what is on disk (which premises have bundles). Every line
//! that starts with `$ ` is a command that succeeds when run as written in the
//! bundle's directory.

use std::io;
use std::path::{Path, PathBuf};

use ramsift_encoder::atomic_file::write_atomically;

use super::bundle::{
    premise_folder, FileRecord, Manifest, FORMULA_FILE, GUIDE_FILE, MANIFEST_FILE,
};
use crate::minimality::certificate::CERTIFICATE_FILE;

/// What the claim rests on, exactly: each premise certified by a bundle present
/// in `dir/premises/`, or assumed.
fn premises_text(dir: &Path, manifest: &Manifest) -> String {
    if manifest.premises.is_empty() {
        return "The claim rests on no other Ramsey value: nothing is assumed.".to_string();
    }
    let mut assumed = false;
    let list: Vec<String> = manifest
        .premises
        .iter()
        .map(|p| {
            let folder = premise_folder(p);
            if dir.join(&folder).join(MANIFEST_FILE).is_file() {
                format!(
                    "  - {} ({}): CERTIFIED by the bundle {folder}/, which step 1 checks in full.",
                    p.statement, p.source
                )
            } else {
                assumed = true;
                format!(
                    "  - {} ({}): ASSUMED. No bundle here certifies it.",
                    p.statement, p.source
                )
            }
        })
        .collect();
    let consequence = if assumed {
        "\nBecause of the assumed premise(s), step 1 ends with CONDITIONAL (exit code 3), not PASS;\n\
         give a bundle that certifies a premise with --premise DIR to make the check unconditional."
    } else {
        ""
    };
    format!(
        "The formula bounds vertex degrees with these smaller Ramsey values:\n{}{consequence}",
        list.join("\n")
    )
}

/// Why the symmetry breaking keeps the formula's meaning.
fn symmetry_text(manifest: &Manifest) -> String {
    if manifest.encoding.symmetry.is_empty() {
        "No symmetry breaking was used: the formula says exactly that a colouring exists."
            .to_string()
    } else {
        let list: Vec<String> = manifest
            .encoding
            .justifications
            .iter()
            .map(|s| format!("  - {}: {}", s.scheme, s.justification))
            .collect();
        format!(
            "Symmetry breaking was used (in the formula, or with minimality in its own file). Each scheme keeps at least one copy of every \
             colouring up to relabelling, so the formula is satisfiable exactly when a colouring exists:\n{}",
            list.join("\n")
        )
    }
}

/// The minimality clauses, in words: what each line says and why adding them
/// keeps the claim.
fn minimality_text(manifest: &Manifest, lines: usize) -> String {
    format!(
        "{CERTIFICATE_FILE} lists {lines} clauses the search added by its minimality check, one per line:\n\
         a vertex map p, a colour map s, and the clause. Read the clause's negation as a partial colouring\n\
         (for two colours variable e+1 true is colour 1, false colour 2). Relabel it: position {{i,j}} gets\n\
         s(colour of {{p_i,p_j}}). Compare edge by edge in the order {order} (edge {{i,j}}, i<j,\n\
         has index j(j-1)/2+i; colour 1 is smallest): the relabelled colouring must be smaller at the first\n\
         edge where the two differ, with every colour up to there fixed by the clause. Then every colouring\n\
         that falsifies the clause has a smaller relabelling, so the least member of each class of\n\
         colourings satisfies all these clauses; the formula, unchanged by relabelling, keeps that member.\n\
         Step 1 verifies every line this way, then checks the DRAT trace against the formula together\n\
         with these clauses. Produced by {solver}.",
        order = manifest.encoding.minimality_order.as_deref().unwrap_or("(not stated)"),
        solver = manifest.solver,
    )
}

/// What the proof file(s) are.
fn proof_text(manifest: &Manifest, single: Option<&FileRecord>, shards: &[&FileRecord]) -> String {
    match single {
        Some(p) if shards.is_empty() => format!("{} is a DRAT refutation of it, produced by {}.", p.name, manifest.solver),
        Some(p) => format!(
            "{} is one DRAT refutation of it, composed from {} shard traces (shards/), produced by {}.",
            p.name,
            shards.len(),
            manifest.solver
        ),
        None => format!(
            "The refutation is split into {} shards (shards/): each trace refutes the formula together\n\
             with its cube (a few literals added as unit clauses), and the cubes cover every assignment\n\
             (the coverage tree in {MANIFEST_FILE}). Produced by {}.",
            shards.len(),
            manifest.solver
        ),
    }
}

/// The numbered checking steps, with their commands; `minimality` gives the
/// variables and the clause count of the formula with the minimality clauses.
fn check_steps(
    single: Option<&FileRecord>,
    shards: &[&FileRecord],
    minimality: Option<(usize, u64)>,
) -> String {
    let mut steps: Vec<String> = [
        "Each line that starts with \"$ \" is a command to run in this directory, exactly as written.",
        "",
        "1. Everything at once, with ramsift's standalone checker. It regenerates the formula from the",
        "   claim with its own code, compares it with the bundled formula as a set of clauses, verifies",
        "   every SHA-256 in the manifest, checks the proof, the coverage of the shards if any, and",
        "   the premise bundles the claim uses; the last line says PASS, CONDITIONAL or FAIL:",
        "     $ ramsift-check bundle .",
    ]
    .map(String::from)
    .to_vec();
    // With minimality, the traces refute the formula with the minimality clauses
    // appended (their verification is part of step 1 only).
    let formula = match minimality {
        Some((variables, clauses)) => {
            steps.extend([
                "2. The traces alone are checked against the formula with the minimality clauses appended;".to_string(),
                "   this builds that formula:".to_string(),
                format!(
                    "     $ {{ echo 'p cnf {variables} {clauses}'; gunzip -c {FORMULA_FILE} | grep -v '^[cp]'; tail -n +3 {CERTIFICATE_FILE} | cut -d/ -f3; }} > with-minimality.cnf"
                ),
            ]);
            "with-minimality.cnf"
        }
        None => FORMULA_FILE,
    };
    match (single, minimality) {
        (Some(p), Some(_)) => {
            steps.push(format!("     $ ramsift-check drat {formula} {}", p.name));
        }
        (Some(p), None) => {
            let proof = &p.name;
            steps.extend([
                "2. The proof alone against the formula (the checker reads gzip directly):".to_string(),
                format!("     $ ramsift-check drat {FORMULA_FILE} {proof}"),
                format!("   Any other DRAT checker takes the decompressed formula, formula.cnf, with {proof}:"),
                format!("     $ gunzip -kf {FORMULA_FILE}"),
                "3. For a formally verified LRAT checker, convert the proof, then check the conversion:".to_string(),
                format!("     $ ramsift-check drat {FORMULA_FILE} {proof} --emit-lrat proof.lrat"),
                format!("     $ ramsift-check lrat {FORMULA_FILE} proof.lrat"),
            ]);
        }
        (None, _) => {
            let number = if minimality.is_some() { "  " } else { "2." };
            steps.push(format!(
                "{number} Each shard's trace alone refutes the formula under its cube (not the formula alone);"
            ));
            steps.push("   that the cubes cover every case is checked by step 1:".into());
            for shard in shards {
                let cube: Vec<String> =
                    shard.cube.iter().flatten().map(|l| l.to_string()).collect();
                steps.push(format!(
                    "     $ ramsift-check drat {formula} {} --cube={}",
                    shard.name,
                    cube.join(",")
                ));
            }
        }
    }
    steps.join("\n") + "\n"
}

/// The referee's guide, in words.
pub fn guide_text(dir: &Path, manifest: &Manifest) -> String {
    let single = manifest.files.iter().find(|f| f.role == "drat-proof");
    let shards: Vec<&FileRecord> = manifest
        .files
        .iter()
        .filter(|f| f.role == "shard-proof")
        .collect();
    let minimality_lines = manifest
        .files
        .iter()
        .find(|f| f.role == "minimality-clauses")
        .and_then(|f| std::fs::read_to_string(dir.join(&f.name)).ok())
        .map(|text| text.lines().count().saturating_sub(2));
    let mut proof = proof_text(manifest, single, &shards);
    if let Some(lines) = minimality_lines {
        proof = format!("{proof}\n\n{}", minimality_text(manifest, lines));
    }
    let with_minimality = minimality_lines.map(|lines| {
        (
            manifest.encoding.variables,
            manifest.encoding.clauses + lines as u64,
        )
    });
    let (symmetry, steps) = (
        symmetry_text(manifest),
        check_steps(single, &shards, with_minimality),
    );
    format!(
        "What is claimed\n\
         ---------------\n\
         {statement}: {meaning}.\n\n\
         {premises}\n\n\
         How it is shown\n\
         ---------------\n\
         {FORMULA_FILE} is a CNF formula that is satisfiable exactly when some colouring avoids every\n\
         forbidden graph (its header states the variable map). {proof}\n\n\
         {symmetry}\n\n\
         How to check it\n\
         ---------------\n\
         {steps}",
        statement = manifest.claim.statement,
        meaning = manifest.claim.meaning,
        premises = premises_text(dir, manifest),
    )
}

/// Writes (or rewrites, once premise bundles exist) the guide.
pub fn write_guide(dir: &Path, manifest: &Manifest) -> io::Result<PathBuf> {
    let guide_path = dir.join(GUIDE_FILE);
    let guide = guide_text(dir, manifest);
    write_atomically(&guide_path, |w| w.write_all(guide.as_bytes()))?;
    Ok(guide_path)
}
