//! Isotropic, linear-elastic materials and a small library of common engineering alloys.

use serde::{Deserialize, Serialize};

use crate::error::{MechanicsError, Result, at_most, finite, positive};

/// An isotropic, linear-elastic material.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Material {
    /// Display name, e.g. "Carbon steel".
    pub name: String,
    /// Young's modulus E, Pa.
    pub youngs_modulus_pa: f64,
    /// Poisson's ratio ν, dimensionless, 0 ≤ ν < 0.5.
    pub poisson_ratio: f64,
    /// Coefficient of thermal expansion α, 1/°C.
    pub cte_per_c: f64,
    /// 0.2 % offset yield strength, Pa.
    pub yield_strength_pa: f64,
}

impl Material {
    /// Builds a material, checking every property.
    pub fn new(
        name: impl Into<String>,
        youngs_modulus_pa: f64,
        poisson_ratio: f64,
        cte_per_c: f64,
        yield_strength_pa: f64,
    ) -> Result<Self> {
        let material = Self {
            name: name.into(),
            youngs_modulus_pa,
            poisson_ratio,
            cte_per_c,
            yield_strength_pa,
        };
        material.validate()?;
        Ok(material)
    }

    /// Checks every property: E and yield positive, ν in [0, 0.5), α finite.
    pub fn validate(&self) -> Result<()> {
        positive("Young's modulus", self.youngs_modulus_pa)?;
        // Diamond is about 1.2 TPa; a stiffer entry is a typo.
        at_most("Young's modulus", self.youngs_modulus_pa, 2e12, "Pa")?;
        finite("Poisson's ratio", self.poisson_ratio)?;
        if !(0.0..0.5).contains(&self.poisson_ratio) {
            return Err(MechanicsError::PoissonOutOfRange {
                value: self.poisson_ratio,
            });
        }
        finite("thermal expansion coefficient", self.cte_per_c)?;
        at_most("thermal expansion coefficient", self.cte_per_c, 1e-3, "/°C")?;
        positive("yield strength", self.yield_strength_pa)?;
        at_most("yield strength", self.yield_strength_pa, 1e11, "Pa")?;
        Ok(())
    }

    /// Shear modulus G = E / (2(1 + ν)), Pa.
    ///
    /// Source: Timoshenko & Goodier, *Theory of Elasticity*, 3rd ed., §5, eq. (6).
    /// ```
    /// # use gw_mechanics::Material;
    /// let steel = Material::new("steel", 200e9, 0.25, 12e-6, 250e6).unwrap();
    /// assert!((steel.shear_modulus_pa() - 80e9).abs() < 1.0);
    /// ```
    pub fn shear_modulus_pa(&self) -> f64 {
        self.youngs_modulus_pa / (2.0 * (1.0 + self.poisson_ratio))
    }
}

/// One entry of the built-in material library.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LibraryMaterial {
    /// Short stable key used in project files.
    pub key: &'static str,
    /// Display name.
    pub name: &'static str,
    /// Young's modulus, Pa.
    pub youngs_modulus_pa: f64,
    /// Poisson's ratio.
    pub poisson_ratio: f64,
    /// Thermal expansion, 1/°C.
    pub cte_per_c: f64,
    /// Yield strength, Pa.
    pub yield_strength_pa: f64,
    /// Where each value comes from.
    pub source: &'static str,
}

impl LibraryMaterial {
    /// The library entry as a [`Material`].
    pub fn material(&self) -> Material {
        Material {
            name: self.name.to_owned(),
            youngs_modulus_pa: self.youngs_modulus_pa,
            poisson_ratio: self.poisson_ratio,
            cte_per_c: self.cte_per_c,
            yield_strength_pa: self.yield_strength_pa,
        }
    }
}

const ELASTIC_SOURCE: &str = "E and ν: Budynas & Nisbett, Shigley's Mechanical Engineering Design, 10th ed., \
     Table A-5 (from memory); thermal expansion and yield strength: typical values, from memory";

/// Typical properties of common engineering alloys. Real parts vary by grade, temper and
/// product form: use the certificate values of the actual material where they matter.
pub const MATERIAL_LIBRARY: &[LibraryMaterial] = &[
    LibraryMaterial {
        key: "carbon_steel",
        name: "Carbon steel, normalised",
        youngs_modulus_pa: 207e9,
        poisson_ratio: 0.292,
        cte_per_c: 11.7e-6,
        yield_strength_pa: 350e6,
        source: ELASTIC_SOURCE,
    },
    LibraryMaterial {
        key: "alloy_steel_qt",
        name: "Alloy steel, quenched and tempered",
        youngs_modulus_pa: 207e9,
        poisson_ratio: 0.292,
        cte_per_c: 12.3e-6,
        yield_strength_pa: 650e6,
        source: ELASTIC_SOURCE,
    },
    LibraryMaterial {
        key: "stainless_austenitic",
        name: "Austenitic stainless steel",
        youngs_modulus_pa: 190e9,
        poisson_ratio: 0.305,
        cte_per_c: 17.3e-6,
        yield_strength_pa: 215e6,
        source: ELASTIC_SOURCE,
    },
    LibraryMaterial {
        key: "aluminium_wrought",
        name: "Aluminium alloy, wrought, heat treated",
        youngs_modulus_pa: 71.7e9,
        poisson_ratio: 0.333,
        cte_per_c: 23.4e-6,
        yield_strength_pa: 275e6,
        source: ELASTIC_SOURCE,
    },
    LibraryMaterial {
        key: "titanium_alloy",
        name: "Titanium alloy, alpha-beta",
        youngs_modulus_pa: 114e9,
        poisson_ratio: 0.34,
        cte_per_c: 8.6e-6,
        yield_strength_pa: 880e6,
        source: ELASTIC_SOURCE,
    },
    LibraryMaterial {
        key: "brass",
        name: "Brass",
        youngs_modulus_pa: 106e9,
        poisson_ratio: 0.324,
        cte_per_c: 19.0e-6,
        yield_strength_pa: 200e6,
        source: ELASTIC_SOURCE,
    },
    LibraryMaterial {
        key: "grey_cast_iron",
        name: "Grey cast iron",
        youngs_modulus_pa: 100e9,
        poisson_ratio: 0.211,
        cte_per_c: 10.8e-6,
        // Grey iron has no marked yield; a conservative proof stress is used as the limit.
        yield_strength_pa: 150e6,
        source: ELASTIC_SOURCE,
    },
];

/// Looks a library material up by its key.
pub fn library_material(key: &str) -> Option<&'static LibraryMaterial> {
    MATERIAL_LIBRARY.iter().find(|m| m.key == key)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_library_material_is_valid_and_has_a_source() {
        for entry in MATERIAL_LIBRARY {
            entry.material().validate().unwrap();
            assert!(!entry.source.is_empty());
        }
    }

    #[test]
    fn poisson_ratio_of_one_half_is_rejected() {
        let e = Material::new("rubber", 1e6, 0.5, 1e-4, 1e6).unwrap_err();
        assert!(matches!(e, MechanicsError::PoissonOutOfRange { .. }));
        assert!(e.to_string().contains("0.5"));
    }
}
