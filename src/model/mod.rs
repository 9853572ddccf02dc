//! Plain data shared by the layers: the tank and readings that `input` produces and
//! `calc` consumes, and the result model that `calc` produces and `report` renders.

pub mod fleet;
pub mod reading;
pub mod required;
pub mod result;
pub mod scan;
pub mod series;
pub mod tank;
pub mod warning;
