//! The report's four charts, drawn with plotters from the result model and the
//! chart series (`model::series`, computed in `calc::series`). Nothing here computes
//! an engineering value: this code maps values to positions and draws them.
//!
//! Each chart is drawn by the same code twice: as SVG (inline in index.html, scale 1,
//! 900 logical pixels wide, about 180 mm on an A4 page) and as PNG (beside it, scale
//! 2, with a 10 pixel/mm resolution chunk so that it pastes 180 mm wide). Text is
//! measured and drawn with the embedded DejaVu Sans (src/report/fonts/), never a
//! system font. Colours are the Okabe-Ito palette, and every series is also told
//! apart by its dash pattern or marker, so the charts read in grey print.

pub mod draw;
pub mod fill;
pub mod fleet;
pub mod history;
pub mod profile;
pub mod spread;

use plotters::coord::Shift;
use plotters::prelude::*;

use crate::model::result::Assessment;
use crate::model::series::ReportSeries;
use crate::report::view::View;
use draw::{DrawResult, Pen, register_font};

/// Logical width of every chart.
pub const WIDTH: u32 = 900;
/// Backend pixels per logical pixel of the PNG copies.
pub const PNG_SCALE: u32 = 2;
/// PNG resolution: 1800 pixels over 180 mm.
const PNG_PIXELS_PER_METRE: u32 = 10_000;

/// One rendered chart.
#[derive(Debug, Clone, PartialEq)]
pub struct Chart {
    /// Element id in index.html.
    pub id: &'static str,
    /// PNG file name in the report folder.
    pub file: &'static str,
    /// Title (also drawn in the image).
    pub title: &'static str,
    /// SVG text.
    pub svg: String,
    /// PNG bytes.
    pub png: Vec<u8>,
}

/// A chart could not be drawn.
#[derive(Debug, thiserror::Error)]
#[error("chart \"{chart}\": {message}")]
pub struct ChartError {
    /// Which chart.
    pub chart: &'static str,
    /// What failed.
    pub message: String,
}

/// What every chart shares.
#[derive(Debug, Clone, Copy)]
pub struct Inputs<'a> {
    /// The result model.
    pub a: &'a Assessment,
    /// The chart series.
    pub s: &'a ReportSeries,
    /// Display units.
    pub v: &'a View,
}

/// A chart: its size and how to draw it on any backend.
pub trait Figure {
    /// Element id and PNG file stem.
    const ID: &'static str;
    /// Title.
    const TITLE: &'static str;
    /// Logical size.
    fn size(&self) -> (u32, u32);
    /// Draws the whole chart.
    fn draw<DB: DrawingBackend>(&self, pen: &Pen<DB>) -> DrawResult<DB>;
}

/// Renders the four charts, in report order (each on its own thread: the PNG
/// encoding dominates, and the charts share nothing but the font table).
pub fn render_all(inputs: Inputs) -> Result<Vec<Chart>, ChartError> {
    register_font().map_err(|message| ChartError {
        chart: "font",
        message,
    })?;
    std::thread::scope(|scope| {
        let jobs = [
            scope.spawn(move || render(&history::History(inputs), "thickness-history.png")),
            scope.spawn(move || render(&profile::Profile(inputs), "shell-profile.png")),
            scope.spawn(move || render(&fill::FillOutlookChart(inputs), "fill-height-outlook.png")),
            scope.spawn(move || render(&spread::Spread(inputs), "reading-distribution.png")),
        ];
        jobs.into_iter()
            .map(|job| {
                job.join().unwrap_or_else(|_| {
                    Err(ChartError {
                        chart: "chart",
                        message: "drawing stopped unexpectedly".to_string(),
                    })
                })
            })
            .collect()
    })
}

fn render<F: Figure>(f: &F, file: &'static str) -> Result<Chart, ChartError> {
    let fail = |message: String| ChartError {
        chart: F::ID,
        message,
    };
    let (w, h) = f.size();
    let mut svg = String::new();
    {
        let root = SVGBackend::with_string(&mut svg, (w, h)).into_drawing_area();
        paint(f, &root, 1.0).map_err(|e| fail(e.to_string()))?;
    }
    let (pw, ph) = (w * PNG_SCALE, h * PNG_SCALE);
    let mut rgb = vec![255u8; pw as usize * ph as usize * 3];
    {
        let root = BitMapBackend::with_buffer(&mut rgb, (pw, ph)).into_drawing_area();
        paint(f, &root, f64::from(PNG_SCALE)).map_err(|e| fail(e.to_string()))?;
    }
    let png = encode_png(&rgb, pw, ph).map_err(|e| fail(e.to_string()))?;
    Ok(Chart {
        id: F::ID,
        file,
        title: F::TITLE,
        svg,
        png,
    })
}

fn paint<F: Figure, DB: DrawingBackend>(
    f: &F,
    root: &DrawingArea<DB, Shift>,
    k: f64,
) -> DrawResult<DB> {
    root.fill(&WHITE)?;
    f.draw(&Pen { root, k })?;
    root.present()
}

/// RGB pixels to PNG bytes (no time or text chunks, so the bytes depend on the
/// pixels only).
fn encode_png(rgb: &[u8], w: u32, h: u32) -> Result<Vec<u8>, png::EncodingError> {
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, w, h);
        enc.set_color(png::ColorType::Rgb);
        enc.set_depth(png::BitDepth::Eight);
        enc.set_deflate_compression(png::DeflateCompression::Level(1));
        enc.set_filter(png::Filter::Up);
        enc.set_pixel_dims(Some(png::PixelDimensions {
            xppu: PNG_PIXELS_PER_METRE,
            yppu: PNG_PIXELS_PER_METRE,
            unit: png::Unit::Meter,
        }));
        let mut writer = enc.write_header()?;
        writer.write_image_data(rgb)?;
        writer.finish()?;
    }
    Ok(out)
}
