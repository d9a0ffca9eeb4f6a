//! graph6 output (B. D. McKay's published format): N(n), then the upper triangle
//! column by column, six bits to a byte, each byte 63 plus its bits. The checker
//! has its own reader; this is the driver's one writer.

use ramsift_encoder::Colouring;

/// Encodes the graph on `order` vertices whose edges are those with `is_edge(i, j)` (i < j).
pub fn encode_graph6(order: usize, mut is_edge: impl FnMut(usize, usize) -> bool) -> String {
    let mut out: Vec<u8> = Vec::new();
    let n = order as u64;
    if n <= 62 {
        out.push(63 + n as u8);
    } else if n <= 258_047 {
        out.push(126);
        out.extend((0..3).rev().map(|k| 63 + ((n >> (6 * k)) & 63) as u8));
    } else {
        out.extend([126, 126]);
        out.extend((0..6).rev().map(|k| 63 + ((n >> (6 * k)) & 63) as u8));
    }
    let mut current = 0u8;
    let mut filled = 0;
    for j in 1..order {
        for i in 0..j {
            current = current << 1 | is_edge(i, j) as u8;
            filled += 1;
            if filled == 6 {
                out.push(63 + current);
                current = 0;
                filled = 0;
            }
        }
    }
    if filled > 0 {
        out.push(63 + (current << (6 - filled)));
    }
    String::from_utf8(out).expect("graph6 bytes are ASCII")
}

/// The graph of colour-1 edges in graph6.
pub fn colour_one_graph6(colouring: &Colouring) -> String {
    encode_graph6(colouring.order(), |i, j| colouring.colour(i, j) == 1)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn pentagon_is_dhc() {
        // C5 as 0-1-2-3-4-0 is "Dhc" (McKay's graph6 description).
        let g = encode_graph6(5, |i, j| j - i == 1 || (i, j) == (0, 4));
        assert_eq!(g, "Dhc");
    }

    #[test]
    fn long_form_order() {
        // n = 63 needs the 4-byte form: 126 then 18 bits of 63 = 0,0,63 -> 63,63,126.
        let g = encode_graph6(63, |_, _| false);
        assert_eq!(&g.as_bytes()[..4], &[126, 63, 63, 126]);
        assert_eq!(g.len(), 4 + (63 * 62 / 2usize).div_ceil(6));
    }
}
