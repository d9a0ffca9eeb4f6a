//! The colour-swap scheme: colours with equal forbidden graphs are interchangeable,
//! so the anchor edge {0, n-1} may be required to take the first colour of each
//! such class whenever it takes any colour of the class.
//!
//! With lex-leader on and two colours, the anchor must have colour 1 (see the
//! justification in [`super::Scheme::ColourSwap`]). With lex-leader on and three or
//! more colours, colour 1 is left alone and only the rest of its class is ordered.
//!
//! Clauses: for a class {c1 < c2 < … < cm}, the unit "the anchor does not have
//! colour cj" for j = 2..m (two colours: the unit "the anchor has colour 1").

use crate::edges::edge_index;
use crate::spec::Instance;
use crate::variables::VariableMap;

/// Classes of colours (1-based) with equal forbidden graphs, each in increasing order.
pub fn equal_colour_classes(instance: &Instance) -> Vec<Vec<usize>> {
    let forbidden = instance.spec().forbidden();
    let mut classes: Vec<Vec<usize>> = Vec::new();
    for (index, graph) in forbidden.iter().enumerate() {
        match classes.iter_mut().find(|c| forbidden[c[0] - 1] == *graph) {
            Some(class) => class.push(index + 1),
            None => classes.push(vec![index + 1]),
        }
    }
    classes.retain(|c| c.len() > 1);
    classes
}

pub fn clauses(instance: &Instance, vars: &VariableMap, with_lex_leader: bool) -> Vec<Vec<i32>> {
    let n = instance.order();
    if n < 2 {
        return Vec::new();
    }
    let anchor = edge_index(0, n - 1);
    let mut out = Vec::new();
    for class in equal_colour_classes(instance) {
        let class: &[usize] = if with_lex_leader && class[0] == 1 && instance.colours() > 2 {
            &class[1..]
        } else {
            &class
        };
        if class.len() < 2 {
            continue;
        }
        if instance.colours() == 2 {
            out.push(vec![vars.colour_literal(anchor, class[0])]);
        } else {
            for &colour in &class[1..] {
                out.push(vec![-vars.colour_literal(anchor, colour)]);
            }
        }
    }
    out
}
