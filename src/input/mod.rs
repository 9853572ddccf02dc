//! The only place that opens files: tank folders, tank files and survey files become
//! typed, validated values with their file and line attached.

pub mod error;
pub mod fleet;
pub mod limits;
mod records;
pub mod scan_csv;
pub mod survey_csv;
pub mod tank_dir;
pub mod tank_file;
