//! Outputs: each module renders bytes from the one result model; nothing here
//! computes an engineering value. [`write`](mod@write) decides stdout versus file.

pub mod caution;
pub mod chart;
pub mod check;
pub mod csv_out;
pub mod fill;
pub mod fleet;
pub mod fleet_html;
pub mod fleet_out;
pub mod folder;
pub mod html;
pub mod json;
pub mod required;
pub mod sections;
pub mod text;
pub mod verdict;
pub mod view;
pub mod write;
