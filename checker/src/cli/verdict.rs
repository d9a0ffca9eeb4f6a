//! The one verdict vocabulary of every subcommand. In text, detail lines come
//! first and the last line is `PASS: …`, `CONDITIONAL: …` or `FAIL: …`; with
//! `--json`, one object whose `verdict` field holds the same word. Exit codes:
//! 0 PASS (the claim holds, nothing assumed), 1 FAIL (the claim is not shown),
//! 2 FAIL because an input could not be read, 3 CONDITIONAL (the proof holds but
//! rests on premises no bundle certified).

use std::process::ExitCode;

use serde_json::{json, Map, Value};

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Outcome {
    Pass,
    Fail,
    Unreadable,
    Conditional,
}

impl Outcome {
    fn word(self) -> &'static str {
        match self {
            Outcome::Pass => "PASS",
            Outcome::Fail | Outcome::Unreadable => "FAIL",
            Outcome::Conditional => "CONDITIONAL",
        }
    }

    fn code(self) -> u8 {
        match self {
            Outcome::Pass => 0,
            Outcome::Fail => 1,
            Outcome::Unreadable => 2,
            Outcome::Conditional => 3,
        }
    }
}

/// What a subcommand found.
pub struct Report {
    pub outcome: Outcome,
    pub reason: String,
    /// Detail lines for the text form.
    pub lines: Vec<String>,
    /// Extra fields for the JSON form.
    pub fields: Map<String, Value>,
}

impl Report {
    pub fn new(outcome: Outcome, reason: impl Into<String>) -> Self {
        Report { outcome, reason: reason.into(), lines: Vec::new(), fields: Map::new() }
    }

    /// An input that could not be read.
    pub fn unreadable(message: impl std::fmt::Display) -> Self {
        Report::new(Outcome::Unreadable, message.to_string())
    }

    pub fn field(mut self, key: &str, value: impl Into<Value>) -> Self {
        self.fields.insert(key.to_string(), value.into());
        self
    }

    /// Prints the report and returns its exit code.
    pub fn emit(self, json: bool) -> ExitCode {
        let code = self.outcome.code();
        if self.outcome == Outcome::Unreadable {
            eprintln!("ramsift-check: error: {}", self.reason);
        }
        if json {
            let mut object = Map::new();
            object.insert("verdict".into(), json!(self.outcome.word()));
            object.insert("exit_code".into(), json!(code));
            object.insert("reason".into(), json!(self.reason));
            object.extend(self.fields);
            println!("{}", serde_json::to_string_pretty(&Value::Object(object)).unwrap_or_default());
        } else {
            for line in &self.lines {
                println!("{line}");
            }
            println!("{}: {}", self.outcome.word(), self.reason);
        }
        ExitCode::from(code)
    }
}
