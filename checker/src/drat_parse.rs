//! DRAT proof reader (Wetzler, Heule & Hunt, SAT 2014), text and binary.
//!
//! Text: each step is `l1 … lk 0` (add a lemma) or `d l1 … lk 0` (delete a clause).
//! Binary: byte `a` (0x61) or `d` (0x64), then each literal l as the unsigned
//! number u = 2l (l > 0) or -2l+1 (l < 0) in little-endian base-128 (7 bits per
//! byte, high bit set on all but the last), then a 0 byte.
//!
//! The format is detected from the content: binary if the first byte is `a` or
//! any of the first 1024 bytes is outside printable ASCII and white space.

use crate::input_error::InputError;

/// Whether a step adds a lemma or deletes a clause.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum StepKind {
    Add,
    Delete,
}

/// One proof step, with the byte offset where it starts in the (decompressed) file.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct DratStep {
    pub kind: StepKind,
    pub literals: Vec<i32>,
    pub offset: u64,
}

/// A whole proof stored flat: every literal in one array, and per step only its
/// offset (the top bit marks a deletion) and length, 12 bytes a step. A step
/// "1 0" of four bytes thus costs 16 bytes, whatever the number of steps.
#[derive(Clone, Debug, Default, PartialEq, Eq)]
pub struct DratProof {
    literals: Vec<i32>,
    offsets: Vec<u64>,
    lengths: Vec<u32>,
}

const DELETION: u64 = 1 << 63;

impl DratProof {
    /// The number of steps.
    pub fn len(&self) -> usize {
        self.offsets.len()
    }

    pub fn is_empty(&self) -> bool {
        self.offsets.is_empty()
    }

    /// The steps in order: kind, literals and byte offset.
    pub fn iter(&self) -> impl Iterator<Item = (StepKind, &[i32], u64)> + '_ {
        let mut start = 0;
        self.offsets.iter().zip(&self.lengths).map(move |(&offset, &length)| {
            let literals = &self.literals[start..start + length as usize];
            start += length as usize;
            let kind = if offset & DELETION != 0 { StepKind::Delete } else { StepKind::Add };
            (kind, literals, offset & !DELETION)
        })
    }

    /// Every literal of every step.
    pub fn all_literals(&self) -> &[i32] {
        &self.literals
    }

    /// Step `index` as an owned step (for messages).
    pub fn step(&self, index: usize) -> DratStep {
        let (kind, literals, offset) = self.iter().nth(index).expect("a step of the proof");
        DratStep { kind, literals: literals.to_vec(), offset }
    }

    /// The steps as owned values (for tests and tools that edit a proof).
    pub fn to_steps(&self) -> Vec<DratStep> {
        self.iter().map(|(kind, literals, offset)| DratStep { kind, literals: literals.to_vec(), offset }).collect()
    }

    /// A proof of the given steps.
    pub fn from_steps(steps: &[DratStep]) -> Self {
        let mut proof = DratProof::default();
        for step in steps {
            proof.literals.extend_from_slice(&step.literals);
            proof.close_step(step.kind, step.offset, step.literals.len()).expect("a step of fewer than 2^32 literals");
        }
        proof
    }

    /// Ends the step whose `length` literals were pushed last; fails past 2^32 − 1 steps or literals a step.
    fn close_step(&mut self, kind: StepKind, offset: u64, length: usize) -> Option<()> {
        let length = u32::try_from(length).ok()?;
        (self.offsets.len() < u32::MAX as usize).then_some(())?;
        self.offsets.push(offset | if kind == StepKind::Delete { DELETION } else { 0 });
        self.lengths.push(length);
        Some(())
    }

    fn finish(mut self) -> Self {
        self.literals.shrink_to_fit();
        self.offsets.shrink_to_fit();
        self.lengths.shrink_to_fit();
        self
    }
}

/// Whether the bytes look like binary DRAT.
pub fn is_binary(bytes: &[u8]) -> bool {
    bytes.first() == Some(&b'a')
        || bytes.iter().take(1024).any(|&b| !(0x20..=0x7e).contains(&b) && !b.is_ascii_whitespace())
}

/// Parses a DRAT proof in either form.
pub fn parse_drat(name: &str, bytes: &[u8]) -> Result<DratProof, InputError> {
    let proof = if is_binary(bytes) { parse_binary(name, bytes) } else { parse_text(name, bytes) };
    proof.map(DratProof::finish)
}

fn too_long(name: &str, at: u64) -> InputError {
    InputError::at_byte(name, at, "more than 2^32 - 1 steps, or a step of more than 2^32 - 1 literals: refused")
}

fn parse_text(name: &str, bytes: &[u8]) -> Result<DratProof, InputError> {
    let (mut proof, mut pos, mut current) = (DratProof::default(), 0usize, None::<(StepKind, u64, usize)>);
    while pos < bytes.len() {
        if bytes[pos].is_ascii_whitespace() {
            pos += 1;
            continue;
        }
        let start = pos;
        let until =
            |pos: usize, stop: fn(&u8) -> bool| bytes[pos..].iter().position(stop).map_or(bytes.len(), |k| pos + k);
        if bytes[pos] == b'c' && current.is_none() {
            pos = until(pos, |&b| b == b'\n'); // a comment runs to the end of the line
            continue;
        }
        pos = until(pos, u8::is_ascii_whitespace);
        let (token, at) = (&bytes[start..pos], start as u64);
        if token == b"d" {
            if current.is_some() {
                return Err(InputError::at_byte(name, at, "'d' inside a clause: expected a literal or 0"));
            }
            current = Some((StepKind::Delete, at, proof.literals.len()));
            continue;
        }
        let lit = std::str::from_utf8(token).ok().and_then(|t| t.parse::<i32>().ok()).filter(|&l| l != i32::MIN);
        let Some(lit) = lit else {
            let why = format!(
                "{:?} is not a literal: expected an integer within ±2147483647, or 'd'",
                String::from_utf8_lossy(token)
            );
            return Err(InputError::at_byte(name, at, why));
        };
        let (kind, offset, first) = *current.get_or_insert((StepKind::Add, at, proof.literals.len()));
        if lit == 0 {
            let length = proof.literals.len() - first;
            proof.close_step(kind, offset, length).ok_or_else(|| too_long(name, offset))?;
            current = None;
        } else {
            proof.literals.push(lit);
        }
    }
    match current {
        Some((_, offset, _)) => {
            Err(InputError::at_byte(name, offset, "the last step is not ended by 0 (truncated proof?)"))
        }
        None => Ok(proof),
    }
}

fn parse_binary(name: &str, bytes: &[u8]) -> Result<DratProof, InputError> {
    let (mut proof, mut pos) = (DratProof::default(), 0usize);
    while pos < bytes.len() {
        let start = pos as u64;
        let kind = match bytes[pos] {
            b'a' => StepKind::Add,
            b'd' => StepKind::Delete,
            other => {
                let why = format!("byte 0x{other:02x}: expected a binary DRAT step ('a' or 'd')");
                return Err(InputError::at_byte(name, start, why));
            }
        };
        pos += 1;
        let first = proof.literals.len();
        loop {
            let (lit_start, mut value, mut shift) = (pos as u64, 0u64, 0);
            loop {
                let Some(&byte) = bytes.get(pos) else {
                    return Err(InputError::at_byte(name, start, "the last step is cut off (truncated proof?)"));
                };
                if shift > 28 {
                    return Err(InputError::at_byte(name, lit_start, "literal too large for 32 bits"));
                }
                pos += 1;
                value |= ((byte & 0x7f) as u64) << shift;
                shift += 7;
                if byte & 0x80 == 0 {
                    break;
                }
            }
            if value == 0 {
                break;
            }
            let magnitude = value >> 1;
            if magnitude == 0 || magnitude > i32::MAX as u64 {
                let why = format!("encoded literal {value} is not a valid literal");
                return Err(InputError::at_byte(name, lit_start, why));
            }
            proof.literals.push(if value & 1 == 1 { -(magnitude as i32) } else { magnitude as i32 });
        }
        let length = proof.literals.len() - first;
        proof.close_step(kind, start, length).ok_or_else(|| too_long(name, start))?;
    }
    Ok(proof)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn binary_examples_from_the_format() {
        // 129 -> 82 02 and -8193 -> 83 80 01 (binary DRAT description; shared facts).
        let steps = parse_drat("p", &[b'a', 0x82, 0x02, 0x83, 0x80, 0x01, 0x00, b'd', 0x04, 0x00]).unwrap().to_steps();
        assert_eq!(steps[0], DratStep { kind: StepKind::Add, literals: vec![129, -8193], offset: 0 });
        assert_eq!(steps[1], DratStep { kind: StepKind::Delete, literals: vec![2], offset: 7 });
    }

    #[test]
    fn text_steps_with_offsets() {
        let steps = parse_drat("p", b"1 -2 0\nd 1 -2 0\n0\n").unwrap().to_steps();
        assert_eq!(steps.len(), 3);
        assert_eq!(steps[1].kind, StepKind::Delete);
        assert_eq!(steps[1].offset, 7);
        assert!(steps[2].literals.is_empty());
    }

    #[test]
    fn a_form_feed_is_white_space_in_text() {
        let steps = parse_drat("p", b"1 -2 0\x0c\n-1 0\n").unwrap().to_steps();
        assert_eq!(steps.len(), 2);
        assert_eq!(steps[1].literals, vec![-1]);
        assert_eq!(DratProof::from_steps(&steps).to_steps(), steps);
    }

    #[test]
    fn malformed_proofs_name_the_offset() {
        let err = |b: &[u8]| parse_drat("p", b).unwrap_err().to_string();
        assert!(err(b"1 2 0\n3 x 0\n").contains("byte 8"));
        assert!(err(b"1 2 0\n3 4").contains("byte 6: the last step is not ended"));
        assert!(err(b"1 d 0\n").contains("'d' inside"));
        assert!(err(b"-2147483648 0\n").contains("within"));
        assert!(err(b"2147483648 0\n").contains("within"));
        assert!(err(&[b'a', 0x82]).contains("cut off"));
        assert!(err(&[b'a', 0x02, 0x00, b'x']).contains("byte 3"));
        assert!(err(&[b'a', 0x01, 0x00]).contains("not a valid literal"));
        assert!(err(&[b'a', 0xff, 0xff, 0xff, 0xff, 0xff, 0x01, 0x00]).contains("too large"));
    }
}
