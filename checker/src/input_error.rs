//! The error type for unreadable input: says which file, where in it, and what
//! was expected there.

use std::fmt;

/// Where in an input a problem was found.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum Position {
    /// 1-based line number.
    Line(usize),
    /// 0-based byte offset.
    Byte(u64),
    /// The input as a whole (for example, something missing at the end).
    Whole,
}

impl fmt::Display for Position {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Position::Line(line) => write!(f, ":{line}"),
            Position::Byte(offset) => write!(f, ": byte {offset}"),
            Position::Whole => Ok(()),
        }
    }
}

/// A malformed or unreadable input: `name:line: message`, `name: byte N: message`
/// or `name: message`.
#[derive(Clone, Debug, PartialEq, Eq, thiserror::Error)]
#[error("{source_name}{position}: {message}")]
pub struct InputError {
    pub source_name: String,
    pub position: Position,
    pub message: String,
}

impl InputError {
    fn new(source_name: &str, position: Position, message: impl Into<String>) -> Self {
        InputError { source_name: source_name.to_string(), position, message: message.into() }
    }

    pub fn at_line(source_name: &str, line: usize, message: impl Into<String>) -> Self {
        Self::new(source_name, Position::Line(line), message)
    }

    pub fn at_byte(source_name: &str, offset: u64, message: impl Into<String>) -> Self {
        Self::new(source_name, Position::Byte(offset), message)
    }

    pub fn whole(source_name: &str, message: impl Into<String>) -> Self {
        Self::new(source_name, Position::Whole, message)
    }
}
