//! Gauges, Wheatstone bridges, temperature effects, signal chain and uncertainty, on top of the
//! mechanics engine. No GUI.
//!
//! # Conventions
//! SI units inside (Ω, V, A, m, °C, strain as m/m), as in `gw-mechanics`.
