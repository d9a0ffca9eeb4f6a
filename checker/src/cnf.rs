//! DIMACS CNF reader (SAT Competition format): `c` comment lines, one problem line
//! `p cnf V C`, then C clauses of non-zero integers within ±V, each ended by 0.
//! The reader is strict: the clause count must match the header, and nothing but
//! comments may follow the last clause.

use crate::input_error::InputError;

/// A formula: clauses as DIMACS literals, stored flat (every literal in one
/// array, and where each clause ends), 4 bytes a literal and 8 a clause.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct Cnf {
    pub variables: usize,
    literals: Vec<i32>,
    ends: Vec<usize>,
}

impl Cnf {
    /// A formula of the given clauses.
    pub fn new(variables: usize, clauses: Vec<Vec<i32>>) -> Self {
        let mut cnf = Cnf { variables, ..Cnf::default() };
        clauses.iter().for_each(|c| cnf.push(c));
        cnf
    }

    /// The number of clauses.
    pub fn len(&self) -> usize {
        self.ends.len()
    }

    pub fn is_empty(&self) -> bool {
        self.ends.is_empty()
    }

    /// Clause `index`.
    pub fn clause(&self, index: usize) -> &[i32] {
        let start = if index == 0 { 0 } else { self.ends[index - 1] };
        &self.literals[start..self.ends[index]]
    }

    /// The clauses in order.
    pub fn clauses(&self) -> impl Iterator<Item = &[i32]> + '_ {
        (0..self.len()).map(|i| self.clause(i))
    }

    /// Every literal of every clause.
    pub fn all_literals(&self) -> &[i32] {
        &self.literals
    }

    /// Appends a clause.
    pub fn push(&mut self, clause: &[i32]) {
        self.literals.extend_from_slice(clause);
        self.ends.push(self.literals.len());
    }

    /// The clauses as owned vectors (for tests and tools that edit a formula).
    pub fn to_vecs(&self) -> Vec<Vec<i32>> {
        self.clauses().map(<[i32]>::to_vec).collect()
    }

    /// Sorts the literals of every clause and then the clauses, in place: two
    /// formulas equal as multisets of clauses are then equal.
    pub fn normalize(&mut self) {
        let mut start = 0;
        for &end in &self.ends {
            self.literals[start..end].sort_unstable();
            start = end;
        }
        let mut order: Vec<u32> = (0..self.len() as u32).collect();
        order.sort_unstable_by(|&a, &b| self.clause(a as usize).cmp(self.clause(b as usize)));
        let mut sorted = Cnf { variables: self.variables, ..Cnf::default() };
        sorted.literals.reserve_exact(self.literals.len());
        sorted.ends.reserve_exact(self.ends.len());
        order.iter().for_each(|&i| sorted.push(self.clause(i as usize)));
        *self = sorted;
    }
}

fn is_comment_or_blank(line: &str) -> bool {
    line.is_empty()
        || line.strip_prefix('c').is_some_and(|rest| rest.is_empty() || rest.starts_with(char::is_whitespace))
}

/// `p cnf V C` as (V, C).
fn problem_line(line: &str) -> Option<(usize, usize)> {
    match line.split_whitespace().collect::<Vec<_>>().as_slice() {
        ["p", "cnf", v, c] => v.parse::<usize>().ok().zip(c.parse::<usize>().ok()),
        _ => None,
    }
}

/// The problem line's (variables, clauses), read before any clause is stored, so
/// that a caller can compare them with what it expects first.
pub fn parse_header(name: &str, bytes: &[u8]) -> Result<(usize, usize), InputError> {
    let mut lines = bytes.split(|&b| b == b'\n').map(String::from_utf8_lossy).enumerate();
    let Some((index, line)) = lines.find(|(_, line)| !is_comment_or_blank(line.trim())) else {
        return Err(InputError::whole(name, "no problem line `p cnf V C`"));
    };
    problem_line(line.trim())
        .ok_or_else(|| InputError::at_line(name, index + 1, "expected the problem line `p cnf VARIABLES CLAUSES`"))
}

/// Parses DIMACS CNF text; `name` is used in error messages.
pub fn parse_cnf(name: &str, bytes: &[u8]) -> Result<Cnf, InputError> {
    let text = std::str::from_utf8(bytes)
        .map_err(|e| InputError::at_byte(name, e.valid_up_to() as u64, "not text: expected DIMACS CNF"))?;
    let (mut header, mut cnf, mut current, mut last_line) = (None, Cnf::default(), Vec::new(), 0);
    for (index, line) in text.lines().enumerate() {
        let (line_no, trimmed) = (index + 1, line.trim());
        let bad = |why: String| InputError::at_line(name, line_no, why);
        last_line = line_no;
        if is_comment_or_blank(trimmed) {
            continue;
        }
        if trimmed.starts_with('p') {
            if header.is_some() {
                return Err(bad("a second problem line".into()));
            }
            let (v, c) = problem_line(trimmed).ok_or_else(|| {
                bad(format!("expected the problem line `p cnf VARIABLES CLAUSES`, found {trimmed:?}"))
            })?;
            if v > i32::MAX as usize {
                return Err(bad(format!("{v} variables: more than 32-bit literals can name")));
            }
            header = Some((v, c));
            continue;
        }
        let Some((variables, clause_count)) = header else {
            return Err(bad("clause before the problem line `p cnf V C`".into()));
        };
        for token in trimmed.split_whitespace() {
            let lit: i64 = token.parse().map_err(|_| bad(format!("{token:?} is not an integer literal")))?;
            if lit == 0 && cnf.len() == clause_count {
                return Err(bad(format!("more clauses than the {clause_count} the problem line promises")));
            } else if lit == 0 {
                cnf.push(&current);
                current.clear();
            } else if lit.unsigned_abs() as usize > variables {
                return Err(bad(format!("literal {lit} is outside the {variables} declared variables")));
            } else {
                current.push(lit as i32);
            }
        }
    }
    let Some((variables, clause_count)) = header else {
        return Err(InputError::whole(name, "no problem line `p cnf V C`"));
    };
    if !current.is_empty() {
        return Err(InputError::at_line(name, last_line, "the last clause is not ended by 0"));
    }
    if cnf.len() != clause_count {
        let why = format!("the problem line promises {clause_count} clauses, the file has {}", cnf.len());
        return Err(InputError::whole(name, why));
    }
    cnf.variables = variables;
    Ok(cnf)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn reads_a_small_formula() {
        let cnf = parse_cnf("f", b"c hello\np cnf 2 2\n1 -2 0\n2\n 0\n").unwrap();
        assert_eq!(cnf.to_vecs(), vec![vec![1, -2], vec![2]]);
        let mut shuffled = Cnf::new(2, vec![vec![2], vec![-2, 1]]);
        shuffled.normalize();
        assert_eq!(shuffled.to_vecs(), vec![vec![-2, 1], vec![2]]);
    }

    #[test]
    fn malformed_formulas_say_where() {
        let err = |t: &[u8]| parse_cnf("f", t).unwrap_err().to_string();
        assert!(err(b"1 2 0\n").contains("f:1: clause before"));
        assert!(err(b"p cnf x 1\n").contains("problem line"));
        assert!(err(b"p cnf 2 1\n1 3 0\n").contains("f:2: literal 3 is outside"));
        assert!(err(b"p cnf 2 1\n1 a 0\n").contains("\"a\" is not an integer"));
        assert!(err(b"p cnf 2 1\n1 2\n").contains("not ended by 0"));
        assert!(err(b"p cnf 2 2\n1 2 0\n").contains("promises 2 clauses, the file has 1"));
        assert!(err(b"p cnf 2 1\n1 0 2 0\n").contains("more clauses"));
        assert!(err(b"p cnf 2 1\np cnf 2 1\n").contains("second problem line"));
        assert!(err(b"").contains("no problem line"));
        assert!(err(b"\xff").contains("not text"));
    }
}
