//! Reader for graph6, B. D. McKay's published format for simple graphs.
//!
//! A graph6 string is N(n) followed by R(x): N(n) is one byte n+63 for n <= 62, or
//! byte 126 and then 18 bits (three bytes), or bytes 126 126 and 36 bits (six bytes);
//! R(x) lists the upper triangle column by column (x(0,1), x(0,2), x(1,2), x(0,3), …)
//! as bits, six to a byte, each byte holding 63 plus its six bits, padded with zeros.
//! An optional `>>graph6<<` header may precede the first graph.
//!
//! The graph becomes a two-colour matrix: edges colour 1, non-edges colour 2.

use crate::input_error::InputError;
use crate::matrix::ColourMatrix;

/// Largest order accepted (the matrix is held in memory).
pub const MAX_ORDER: usize = 10_000;

/// Decodes one graph6 string; `offset` is its byte offset in the file (for errors).
pub fn decode_graph6(name: &str, offset: u64, bytes: &[u8]) -> Result<ColourMatrix, InputError> {
    let at = |pos: usize, message: String| InputError::at_byte(name, offset + pos as u64, message);
    for (pos, &b) in bytes.iter().enumerate() {
        if !(63..=126).contains(&b) {
            return Err(at(pos, format!("byte 0x{b:02x} is not a graph6 character (expected 0x3f to 0x7e)")));
        }
    }
    let (order, header_len) = match bytes {
        [] => return Err(at(0, "empty graph6 string".to_string())),
        [126, 126, rest @ ..] => (read_bits(rest, 6).ok_or_else(|| at(2, "truncated 36-bit order".to_string()))?, 8),
        [126, rest @ ..] => (read_bits(rest, 3).ok_or_else(|| at(1, "truncated 18-bit order".to_string()))?, 4),
        [first, ..] => ((*first - 63) as u64, 1),
    };
    if order as usize > MAX_ORDER {
        return Err(at(0, format!("order {order} is above the limit of {MAX_ORDER}")));
    }
    let (order, body) = (order as usize, &bytes[header_len..]);
    let expected = (order * order.saturating_sub(1) / 2).div_ceil(6);
    if body.len() != expected {
        return Err(at(
            header_len,
            format!("order {order} needs {expected} bytes after the order, found {}", body.len()),
        ));
    }
    let (mut matrix, mut bit) = (ColourMatrix::filled(order, 2), 0usize);
    for j in 1..order {
        for i in 0..j {
            if (body[bit / 6] - 63) >> (5 - bit % 6) & 1 == 1 {
                matrix.set(i, j, 1);
            }
            bit += 1;
        }
    }
    if bit % 6 != 0 && (body[bit / 6] - 63) & ((1 << (6 - bit % 6)) - 1) != 0 {
        return Err(at(header_len + bit / 6, "padding bits at the end are not zero".to_string()));
    }
    Ok(matrix)
}

fn read_bits(bytes: &[u8], count: usize) -> Option<u64> {
    let chunk = bytes.get(..count)?;
    Some(chunk.iter().fold(0u64, |acc, &b| acc << 6 | (b - 63) as u64))
}

/// Decodes every graph in a graph6 file (one per line).
pub fn decode_graph6_file(name: &str, content: &[u8]) -> Result<Vec<ColourMatrix>, InputError> {
    let mut graphs = Vec::new();
    let mut offset = 0u64;
    for raw_line in content.split_inclusive(|&b| b == b'\n') {
        let line = raw_line.strip_suffix(b"\n").unwrap_or(raw_line);
        let line = line.strip_suffix(b"\r").unwrap_or(line);
        let start = if graphs.is_empty() && line.starts_with(b">>graph6<<") { 10 } else { 0 };
        if line.len() > start {
            graphs.push(decode_graph6(name, offset + start as u64, &line[start..])?);
        }
        offset += raw_line.len() as u64;
    }
    if graphs.is_empty() {
        return Err(InputError::whole(name, "no graph6 string in the file"));
    }
    Ok(graphs)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pentagon_from_the_format_description() {
        // C5 as 0-1-2-3-4-0 is "Dhc" (McKay's graph6 description; see shared facts).
        let m = decode_graph6("t", 0, b"Dhc").unwrap();
        assert_eq!(m.order(), 5);
        let edges: Vec<(usize, usize)> =
            (0..5).flat_map(|j| (0..j).map(move |i| (i, j))).filter(|&(i, j)| m.colour(i, j) == 1).collect();
        assert_eq!(edges, vec![(0, 1), (1, 2), (2, 3), (0, 4), (3, 4)]);
    }

    #[test]
    fn malformed_strings_are_rejected_with_offsets() {
        assert!(decode_graph6("t", 0, b"").is_err());
        assert!(decode_graph6("t", 0, b"Dh").unwrap_err().to_string().contains("needs 2 bytes"));
        assert!(decode_graph6("t", 0, b"Dhcc").is_err());
        assert!(decode_graph6("t", 0, b"Dhd").unwrap_err().to_string().contains("padding"));
        assert!(decode_graph6("t", 5, b"D h").unwrap_err().to_string().contains("byte 6"));
        assert!(decode_graph6("t", 0, b"~?").unwrap_err().to_string().contains("truncated"));
        assert!(decode_graph6_file("t", b"\n\n").is_err());
    }

    #[test]
    fn file_with_header_and_two_graphs() {
        let graphs = decode_graph6_file("t", b">>graph6<<Dhc\r\nA_\n").unwrap();
        assert_eq!(graphs.len(), 2);
        assert_eq!(graphs[1].colour(0, 1), 1);
    }
}
