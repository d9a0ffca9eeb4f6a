//! The Slurm batch script for a plan: one job array task per shard, each running
//! `ramsift shard run PLAN_DIR` (the task picks its shard from SLURM_ARRAY_TASK_ID,
//! plus an offset when the plan is larger than one array may be).

use std::path::Path;

/// Options of the generated script.
#[derive(Clone, Debug, Default)]
pub struct SlurmOptions {
    pub partition: Option<String>,
    pub time: Option<String>,
    pub mem: Option<String>,
    pub cpus: usize,
    /// How many tasks may run at once (`%N` in `--array`).
    pub throttle: Option<usize>,
    /// Largest array Slurm accepts (MaxArraySize - 1 is the highest index; default 1001).
    pub max_array_size: usize,
}

/// One script per chunk of at most `max_array_size` shards: (file name, contents).
pub fn batch_scripts(
    ramsift: &Path,
    plan_dir: &Path,
    job_name: &str,
    shards: usize,
    options: &SlurmOptions,
) -> Vec<(String, String)> {
    let chunk = options.max_array_size.max(1);
    let mut scripts = Vec::new();
    let mut offset = 0;
    while offset < shards {
        let count = chunk.min(shards - offset);
        let throttle = options
            .throttle
            .map(|t| format!("%{t}"))
            .unwrap_or_default();
        let mut s = String::from("#!/bin/bash\n");
        s.push_str(&format!(
            "# ramsift: refute the shards {offset}..{} of the plan in {}\n",
            offset + count - 1,
            plan_dir.display()
        ));
        s.push_str(&format!("#SBATCH --job-name={job_name}\n"));
        s.push_str(&format!("#SBATCH --array=0-{}{throttle}\n", count - 1));
        s.push_str(&format!(
            "#SBATCH --output={}/shards/slurm-%A_%a.log\n",
            plan_dir.display()
        ));
        s.push_str(&format!(
            "#SBATCH --cpus-per-task={}\n",
            options.cpus.max(1)
        ));
        s.push_str("#SBATCH --ntasks=1\n");
        if let Some(p) = &options.partition {
            s.push_str(&format!("#SBATCH --partition={p}\n"));
        }
        if let Some(t) = &options.time {
            s.push_str(&format!("#SBATCH --time={t}\n"));
        }
        if let Some(m) = &options.mem {
            s.push_str(&format!("#SBATCH --mem={m}\n"));
        }
        s.push_str("set -euo pipefail\n");
        s.push_str(&format!(
            "exec '{}' shard run '{}' --index \"$((SLURM_ARRAY_TASK_ID + {offset}))\"\n",
            ramsift.display(),
            plan_dir.display()
        ));
        let name = if shards <= chunk {
            "submit.sbatch".to_string()
        } else {
            format!("submit-{:03}.sbatch", offset / chunk)
        };
        scripts.push((name, s));
        offset += count;
    }
    scripts
}
