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

/// A malformed or unreadable input.
#[derive(Clone, Debug, PartialEq, Eq, thiserror::Error)]
pub struct InputError {
    pub source_name: String,
    pub position: Position,
    pub message: String,
}

impl InputError {
    fn new(source_name: &str, position: Position, message: impl Into<String>) -> Self {
        let (source_name, message) = (source_name.to_string(), message.into());
        InputError { source_name, position, message }
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

impl fmt::Display for InputError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let name = &self.source_name;
        match self.position {
            Position::Line(line) => write!(f, "{name}:{line}: {}", self.message),
            Position::Byte(offset) => write!(f, "{name}: byte {offset}: {}", self.message),
            Position::Whole => write!(f, "{name}: {}", self.message),
        }
    }
}
