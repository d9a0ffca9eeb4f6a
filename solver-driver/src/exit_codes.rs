//! Exit codes of the `ramsift` binary. 10 and 20 follow the SAT Competition
//! convention (satisfiable / unsatisfiable).

/// Success of a command that answers no yes/no question (encode, demo).
pub const SUCCESS: u8 = 0;
/// A timeout or an otherwise unknown answer.
pub const UNKNOWN: u8 = 1;
/// Bad input: malformed files, impossible parameters, instances over the limits.
pub const BAD_INPUT: u8 = 2;
/// A colouring was found (the formula is satisfiable).
pub const FOUND: u8 = 10;
/// No colouring exists (the formula is unsatisfiable).
pub const NONE_EXISTS: u8 = 20;
