//! The engineering: pure functions of typed values, no I/O, no printing.
//!
//! Each module opens with the method it implements, its published source and clause,
//! and the symbols with their units. Constants live in [`constants`], each with its
//! origin; the built-in material table in [`materials`].

pub mod area;
pub mod assess;
pub mod constants;
pub mod design;
pub mod extreme;
pub mod fill_height;
pub mod fleet;
pub mod hydrotest;
pub mod life;
pub mod local;
pub mod materials;
pub mod points;
pub mod projection;
pub mod rates;
pub mod required;
pub mod screen;
pub mod series;
pub mod shell;
pub mod spread;
pub mod stress;
pub mod survey;
pub mod tally;
pub mod units;
pub mod vdp;
