//! Renders an SVG file to PNG with resvg, using the system's fonts.
//!
//! Usage: `svg-to-png IN.svg OUT.png [ZOOM]` (zoom defaults to 2).

use std::process::ExitCode;

use resvg::{tiny_skia, usvg};

fn main() -> ExitCode {
    let args: Vec<String> = std::env::args().collect();
    if args.len() < 3 || args.len() > 4 {
        eprintln!("usage: svg-to-png IN.svg OUT.png [ZOOM]");
        return ExitCode::from(2);
    }
    match render(&args[1], &args[2], args.get(3).map(String::as_str)) {
        Ok(()) => ExitCode::SUCCESS,
        Err(message) => {
            eprintln!("svg-to-png: {message}");
            ExitCode::FAILURE
        }
    }
}

fn render(input: &str, output: &str, zoom: Option<&str>) -> Result<(), String> {
    let zoom: f32 = match zoom {
        Some(z) => z
            .parse()
            .map_err(|e| format!("zoom `{z}` is not a number: {e}"))?,
        None => 2.0,
    };
    let data = std::fs::read(input).map_err(|e| format!("{input}: {e}"))?;
    let mut options = usvg::Options::default();
    options.fontdb_mut().load_system_fonts();
    let tree = usvg::Tree::from_data(&data, &options).map_err(|e| format!("{input}: {e}"))?;
    let size = tree.size().to_int_size().scale_by(zoom).ok_or("empty picture")?;
    let mut pixmap =
        tiny_skia::Pixmap::new(size.width(), size.height()).ok_or("picture too large")?;
    pixmap.fill(tiny_skia::Color::WHITE);
    resvg::render(
        &tree,
        tiny_skia::Transform::from_scale(zoom, zoom),
        &mut pixmap.as_mut(),
    );
    pixmap.save_png(output).map_err(|e| format!("{output}: {e}"))
}
