//! strake: in-service assessment of above-ground storage tank shells from ultrasonic
//! thickness surveys.

pub mod calc;
pub mod model;
