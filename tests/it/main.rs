//! Integration tests: the real binary on real files. One test binary, one file per
//! topic; `support` holds the small builder used everywhere.

mod assess;
mod browser;
mod check;
mod corpus;
mod errors;
mod fill_height;
mod fleet;
mod io_safety;
mod properties;
mod reference;
mod report;
mod required;
mod samples;
mod scans;
mod support;
