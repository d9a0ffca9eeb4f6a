//! `ramsift draw FILE --out fig.svg|fig.tex`: a figure of a colouring for a paper.

use std::path::PathBuf;

use anyhow::{Context, Result};
use clap::{Args, ValueEnum};

use ramsift_driver::draw::{svg, tikz, Figure, Layout};
use ramsift_driver::exit_codes;
use ramsift_driver::output::records::DrawRecord;
use ramsift_encoder::atomic_file::write_atomically;

#[derive(Args, Debug)]
pub struct DrawArgs {
    /// A colouring file (ramsift's format; of a stream of them, the first) or a
    /// graph6 file (first line; edges are colour 1, non-edges colour 2); - reads
    /// standard input.
    #[arg(value_name = "FILE")]
    pub file: PathBuf,
    /// The figure: .svg for SVG, .tex for a TikZ picture; - writes SVG to standard output.
    #[arg(long, value_name = "FILE")]
    pub out: PathBuf,
    /// circle (vertices on a circle, edges in their colour's style) or matrix
    /// (adjacency matrix, cells in their colour's fill).
    #[arg(long, value_enum, default_value_t = LayoutChoice::Circle)]
    pub layout: LayoutChoice,
    /// Colours drawn in the circle layout, comma separated (default: all).
    #[arg(long, value_name = "LIST")]
    pub colours: Option<String>,
    /// Width of the drawing: pixels for SVG, centimetres for TikZ.
    #[arg(long)]
    pub size: Option<f64>,
    /// Print the result as one JSON record on stdout.
    #[arg(long)]
    pub json: bool,
}

/// The layouts of `--layout`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum LayoutChoice {
    Circle,
    Matrix,
}

/// The figure of the first colouring in the file, with its title.
fn figure_of(args: &DrawArgs) -> Result<Figure> {
    let read = super::input::read_first_colouring(&args.file)?;
    let matrix = read.matrix;
    let n = matrix.order();
    let (colours, title) = match &read.claim {
        Some(claim) => {
            let mut title = format!("a ({claim};{n}) colouring");
            if read.in_file > 1 {
                // A stream (enumerate's output with three or more colours): the first one.
                title.push_str(&format!(", the first of {} in the file", read.in_file));
            }
            (claim.colours(), title)
        }
        None => (
            2,
            format!("a 2-colouring of K_{n} (graph6: edges colour 1)"),
        ),
    };
    let mut cells = vec![0u8; n * n];
    for i in 0..n {
        for j in (0..n).filter(|&j| j != i) {
            cells[i * n + j] = matrix.colour(i, j);
        }
    }
    let shown: Vec<u8> = match &args.colours {
        None => (1..=colours as u8).collect(),
        Some(list) => list
            .split(',')
            .map(|t| {
                t.trim()
                    .parse::<u8>()
                    .ok()
                    .filter(|&c| c >= 1 && c as usize <= colours)
                    .ok_or_else(|| {
                        anyhow::anyhow!(
                            "--colours {list}: expected colours 1 to {colours}, comma separated"
                        )
                    })
            })
            .collect::<Result<_>>()?,
    };
    Ok(Figure {
        order: n,
        colours,
        cells,
        shown,
        title: Some(title),
    })
}

/// The figure as SVG or TikZ, by the name of `--out` (`-`: SVG).
fn render(args: &DrawArgs, figure: &Figure) -> Result<String> {
    let layout = match args.layout {
        LayoutChoice::Matrix => Layout::Matrix,
        LayoutChoice::Circle => Layout::Circle,
    };
    let extension = args
        .out
        .extension()
        .and_then(|e| e.to_str())
        .unwrap_or("")
        .to_ascii_lowercase();
    let to_stdout = args.out.as_os_str() == "-";
    match extension.as_str() {
        _ if to_stdout && args.json => {
            anyhow::bail!("--out - and --json both want standard output; give --out a file")
        }
        "svg" | "" if to_stdout || extension == "svg" => {
            let size = args.size.unwrap_or(480.0);
            anyhow::ensure!(
                (50.0..=20_000.0).contains(&size),
                "--size {size}: expected 50 to 20000 pixels"
            );
            Ok(svg::render(figure, layout, size))
        }
        "tex" => {
            let size = args.size.unwrap_or(8.0);
            anyhow::ensure!(
                (1.0..=100.0).contains(&size),
                "--size {size}: expected 1 to 100 centimetres"
            );
            Ok(tikz::render(figure, layout, size))
        }
        _ => anyhow::bail!(
            "--out {}: expected a name ending in .svg (SVG) or .tex (TikZ)",
            args.out.display()
        ),
    }
}

pub fn run(args: &DrawArgs) -> Result<u8> {
    let figure = figure_of(args)?;
    let text = render(args, &figure)?;
    if args.out.as_os_str() == "-" {
        print!("{text}");
        return Ok(exit_codes::SUCCESS);
    }
    write_atomically(&args.out, |w| w.write_all(text.as_bytes()))
        .with_context(|| format!("writing {}", args.out.display()))?;
    if args.json {
        let record = DrawRecord {
            figure: args.out.clone(),
            order: figure.order,
            colours: figure.colours,
            title: figure.title.unwrap_or_default(),
        };
        super::record::print_record(record, "written", exit_codes::SUCCESS)?;
    } else {
        println!("wrote {}", args.out.display());
    }
    Ok(exit_codes::SUCCESS)
}
