//! The report's charts, drawn with plotters from the result model and the chart
//! series (`model::series`, computed in `calc::series`): the four overview charts,
//! a heat map of every grid scan, the Gumbel plot of the extreme-value estimates and
//! the design check's required thickness. Nothing here computes an engineering
//! value: this code maps values to positions and colours and draws them.
//!
//! Each chart is drawn by the same code twice: as SVG (inline in index.html, scale 1,
//! 900 logical pixels wide, about 180 mm on an A4 page) and as PNG (beside it, scale
//! 2, with a 10 pixel/mm resolution chunk so that it pastes 180 mm wide). Text is
//! measured and drawn with the embedded DejaVu Sans (src/report/fonts/), never a
//! system font. Colours are the Okabe-Ito palette, and every series is also told
//! apart by its dash pattern or marker, so the charts read in grey print; the heat
//! maps colour thickness with viridis, whose lightness rises steadily (grey print,
//! colour-blind readers).

pub mod draw;
pub mod fill;
pub mod fleet;
pub mod gumbel;
pub mod heatmap;
pub mod history;
pub mod profile;
pub mod required;
pub mod spread;

use rayon::prelude::*;

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

/// Where a chart belongs in index.html.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Place {
    /// The charts section (the four overview charts).
    Overview,
    /// The local-thin-areas section: the heat map of `Assessment::areas[i]`.
    Area(usize),
    /// The extreme-value section: the Gumbel plot.
    ExtremeValues,
    /// The design-check section: required thickness by both methods.
    Design,
    /// The fleet page.
    Fleet,
}

/// One rendered chart.
#[derive(Debug, Clone, PartialEq)]
pub struct Chart {
    /// Element id in index.html.
    pub id: String,
    /// PNG file name in the report folder.
    pub file: String,
    /// Title (also drawn in the image).
    pub title: String,
    /// Where it goes in the page.
    pub place: Place,
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
    pub chart: String,
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

/// One chart to draw.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Job {
    History,
    Profile,
    Fill,
    Spread,
    HeatMap(usize),
    Gumbel,
    Design,
}

impl Job {
    fn render(self, inputs: Inputs) -> Result<Chart, ChartError> {
        let fixed = |id: &str, file: &str, title: &str| (id.into(), file.into(), title.into());
        match self {
            Job::History => {
                let f = history::History(inputs);
                render(
                    &f,
                    Place::Overview,
                    fixed(
                        history::History::ID,
                        "thickness-history.png",
                        history::History::TITLE,
                    ),
                )
            }
            Job::Profile => {
                let f = profile::Profile(inputs);
                render(
                    &f,
                    Place::Overview,
                    fixed(
                        profile::Profile::ID,
                        "shell-profile.png",
                        profile::Profile::TITLE,
                    ),
                )
            }
            Job::Fill => {
                let f = fill::FillOutlookChart(inputs);
                render(
                    &f,
                    Place::Overview,
                    fixed(
                        fill::FillOutlookChart::ID,
                        "fill-height-outlook.png",
                        fill::FillOutlookChart::TITLE,
                    ),
                )
            }
            Job::Spread => {
                let f = spread::Spread(inputs);
                render(
                    &f,
                    Place::Overview,
                    fixed(
                        spread::Spread::ID,
                        "reading-distribution.png",
                        spread::Spread::TITLE,
                    ),
                )
            }
            Job::HeatMap(i) => {
                let f = heatmap::HeatMap { inputs, area: i };
                let n = i + 1;
                render(
                    &f,
                    Place::Area(i),
                    (
                        format!("{}-{n}", heatmap::HeatMap::ID),
                        format!("scan-{n}-heat-map.png"),
                        format!("{} {n}", heatmap::HeatMap::TITLE),
                    ),
                )
            }
            Job::Gumbel => {
                let f = gumbel::GumbelPlot(inputs);
                render(
                    &f,
                    Place::ExtremeValues,
                    fixed(
                        gumbel::GumbelPlot::ID,
                        "gumbel-plot.png",
                        gumbel::GumbelPlot::TITLE,
                    ),
                )
            }
            Job::Design => {
                let f = required::RequiredChart(inputs);
                render(
                    &f,
                    Place::Design,
                    fixed(
                        required::RequiredChart::ID,
                        "required-thickness.png",
                        required::RequiredChart::TITLE,
                    ),
                )
            }
        }
    }
}

/// Renders every chart, in page order: the four overview charts, a heat map per grid
/// scan, the Gumbel plot (when a course has an extreme-value estimate) and the design
/// check. The charts share nothing but the font table and are drawn in parallel
/// (rayon): the PNG encoding dominates.
pub fn render_all(inputs: Inputs) -> Result<Vec<Chart>, ChartError> {
    register_font().map_err(|message| ChartError {
        chart: "font".to_string(),
        message,
    })?;
    let mut jobs = vec![Job::History, Job::Profile, Job::Fill, Job::Spread];
    jobs.extend((0..inputs.a.areas.len()).map(Job::HeatMap));
    if gumbel::GumbelPlot(inputs).has_panels() {
        jobs.push(Job::Gumbel);
    }
    jobs.push(Job::Design);
    jobs.into_par_iter().map(|j| j.render(inputs)).collect()
}

fn render<F: Figure>(
    f: &F,
    place: Place,
    (id, file, title): (String, String, String),
) -> Result<Chart, ChartError> {
    let fail = |message: String| ChartError {
        chart: id.clone(),
        message,
    };
    let (w, h) = f.size();
    let mut svg = String::new();
    {
        let root = SVGBackend::with_string(&mut svg, (w, h)).into_drawing_area();
        paint(f, &root, 1.0, true).map_err(|e| fail(e.to_string()))?;
    }
    let (pw, ph) = (w * PNG_SCALE, h * PNG_SCALE);
    let png = CANVAS.with(|canvas| {
        // A white canvas: the thread's buffer of the last chart, refilled (no fresh
        // pages to fault in for every chart; memory is that of the largest chart).
        let mut rgb = canvas.borrow_mut();
        rgb.clear();
        rgb.resize(pw as usize * ph as usize * 3, 255);
        {
            let root = BitMapBackend::with_buffer(&mut rgb, (pw, ph)).into_drawing_area();
            paint(f, &root, f64::from(PNG_SCALE), false).map_err(|e| fail(e.to_string()))?;
        }
        encode_png(&rgb, pw, ph).map_err(|e| fail(e.to_string()))
    })?;
    Ok(Chart {
        id,
        file,
        title,
        place,
        svg,
        png,
    })
}

thread_local! {
    /// The PNG canvas of the charts drawn on this thread.
    static CANVAS: std::cell::RefCell<Vec<u8>> = const { std::cell::RefCell::new(Vec::new()) };
}

/// Draws `f` on `root`; `fill` paints the white background first (the SVG needs it,
/// the PNG canvas starts white).
fn paint<F: Figure, DB: DrawingBackend>(
    f: &F,
    root: &DrawingArea<DB, Shift>,
    k: f64,
    fill: bool,
) -> DrawResult<DB> {
    if fill {
        root.fill(&WHITE)?;
    }
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
        // fdeflate's fast mode with the Paeth filter: a third less time than zlib
        // level 1 with the Up filter for the sample reports (the PNG encoding dominates
        // the report), files about 45 % larger (a few hundred kB per chart).
        enc.set_deflate_compression(png::DeflateCompression::FdeflateUltraFast);
        enc.set_filter(png::Filter::Paeth);
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
