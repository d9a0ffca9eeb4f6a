//! The one JSON style of every `--json` output: one object per run, pretty-printed
//! with its keys in alphabetical order, always holding `result` (a word: found,
//! none, refuted, unknown, written, done, error, …) and `exit_code` (the process's
//! exit code), with numbers as numbers and times in `seconds`.

use anyhow::Result;
use serde::Serialize;
use serde_json::Value;

/// Prints `record` (a struct or a JSON object) with `result` and `exit_code` added.
pub fn print_record(record: impl Serialize, result: &str, exit_code: u8) -> Result<()> {
    let mut value = serde_json::to_value(record)?;
    let object = match value.as_object_mut() {
        Some(object) => object,
        None => anyhow::bail!("internal error: a --json record must be an object"),
    };
    object.insert("result".into(), Value::from(result));
    object.insert("exit_code".into(), Value::from(exit_code));
    println!("{}", serde_json::to_string_pretty(&value)?);
    Ok(())
}
