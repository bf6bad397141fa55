//! The Plenum design model: files and `use`, name resolution, units, and the
//! typed [`Design`] the coil engine computes from.

pub mod design;

pub use design::*;
