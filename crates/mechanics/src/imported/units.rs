//! The units and conventions an imported field is stated in.
//!
//! A file's numbers mean nothing until its units are known: the length unit of the node
//! coordinates, the unit of the tensor (a strain ratio or a stress) and whether its shear
//! components are engineering shear strains γ or tensor components ε = γ/2. Conversion factors
//! are exact (NIST SP 811, Appendix B: 1 in = 0.0254 m, 1 lbf/in² = 6894.757 293 168 Pa).

use serde::{Deserialize, Serialize};

/// Unit of node coordinates.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum LengthUnit {
    /// Metre.
    Metre,
    /// Millimetre.
    Millimetre,
    /// Centimetre.
    Centimetre,
    /// Inch.
    Inch,
    /// Foot.
    Foot,
}

impl LengthUnit {
    /// Every length unit, in the order offered.
    pub const ALL: [LengthUnit; 5] = [
        LengthUnit::Millimetre,
        LengthUnit::Metre,
        LengthUnit::Centimetre,
        LengthUnit::Inch,
        LengthUnit::Foot,
    ];

    /// Metres per unit.
    pub fn to_si(self) -> f64 {
        match self {
            LengthUnit::Metre => 1.0,
            LengthUnit::Millimetre => 1e-3,
            LengthUnit::Centimetre => 1e-2,
            LengthUnit::Inch => 0.0254,
            LengthUnit::Foot => 0.3048,
        }
    }

    /// Symbol as written in files and shown on screen.
    pub fn symbol(self) -> &'static str {
        match self {
            LengthUnit::Metre => "m",
            LengthUnit::Millimetre => "mm",
            LengthUnit::Centimetre => "cm",
            LengthUnit::Inch => "in",
            LengthUnit::Foot => "ft",
        }
    }

    /// The unit of a symbol (case-sensitive where it matters: "m" and "mm").
    pub fn parse(text: &str) -> Option<Self> {
        let t = text.trim();
        Self::ALL.into_iter().find(|u| u.symbol() == t)
    }
}

/// What the tensor is.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum TensorQuantity {
    /// Strain (total strain of the unit load; no thermal part).
    Strain,
    /// Stress.
    Stress,
}

/// Unit of the tensor values.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum TensorUnit {
    /// Strain as a plain ratio, m/m.
    StrainRatio,
    /// Strain in mm/m (10⁻³).
    MilliStrain,
    /// Strain in µm/m, microstrain (10⁻⁶).
    MicroStrain,
    /// Strain in per cent (10⁻²).
    PercentStrain,
    /// Stress in pascals.
    Pascal,
    /// Stress in kilopascals.
    Kilopascal,
    /// Stress in megapascals (N/mm²).
    Megapascal,
    /// Stress in gigapascals.
    Gigapascal,
    /// Stress in pounds-force per square inch.
    Psi,
    /// Stress in thousands of pounds-force per square inch.
    Ksi,
}

impl TensorUnit {
    /// Every tensor unit, in the order offered.
    pub const ALL: [TensorUnit; 10] = [
        TensorUnit::MicroStrain,
        TensorUnit::MilliStrain,
        TensorUnit::StrainRatio,
        TensorUnit::PercentStrain,
        TensorUnit::Megapascal,
        TensorUnit::Pascal,
        TensorUnit::Kilopascal,
        TensorUnit::Gigapascal,
        TensorUnit::Psi,
        TensorUnit::Ksi,
    ];

    /// Strain or stress.
    pub fn quantity(self) -> TensorQuantity {
        match self {
            TensorUnit::StrainRatio
            | TensorUnit::MilliStrain
            | TensorUnit::MicroStrain
            | TensorUnit::PercentStrain => TensorQuantity::Strain,
            _ => TensorQuantity::Stress,
        }
    }

    /// SI value (m/m or Pa) per unit.
    pub fn to_si(self) -> f64 {
        match self {
            TensorUnit::StrainRatio | TensorUnit::Pascal => 1.0,
            TensorUnit::MilliStrain => 1e-3,
            TensorUnit::MicroStrain => 1e-6,
            TensorUnit::PercentStrain => 1e-2,
            TensorUnit::Kilopascal => 1e3,
            TensorUnit::Megapascal => 1e6,
            TensorUnit::Gigapascal => 1e9,
            TensorUnit::Psi => 6_894.757_293_168,
            TensorUnit::Ksi => 6_894_757.293_168,
        }
    }

    /// Symbol as shown on screen.
    pub fn symbol(self) -> &'static str {
        match self {
            TensorUnit::StrainRatio => "m/m",
            TensorUnit::MilliStrain => "mm/m",
            TensorUnit::MicroStrain => "µm/m",
            TensorUnit::PercentStrain => "%",
            TensorUnit::Pascal => "Pa",
            TensorUnit::Kilopascal => "kPa",
            TensorUnit::Megapascal => "MPa",
            TensorUnit::Gigapascal => "GPa",
            TensorUnit::Psi => "psi",
            TensorUnit::Ksi => "ksi",
        }
    }

    /// The unit of a symbol as written in a file header or an array name: the symbols above,
    /// and the plain-text spellings "um/m", "ue", "µε", "microstrain", "in/in", "N/mm2", "N/mm²".
    pub fn parse(text: &str) -> Option<Self> {
        let t = text.trim();
        let alias = match t {
            "um/m" | "ue" | "µε" | "microstrain" | "µin/in" | "uin/in" => {
                Some(Self::MicroStrain)
            }
            "in/in" | "mm/mm" | "-" | "1" => Some(Self::StrainRatio),
            "N/mm2" | "N/mm²" | "N/mm^2" => Some(Self::Megapascal),
            "N/m2" | "N/m²" | "N/m^2" => Some(Self::Pascal),
            _ => None,
        };
        alias.or_else(|| Self::ALL.into_iter().find(|u| u.symbol() == t))
    }
}

/// How the shear components of a strain tensor are given.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
pub enum ShearConvention {
    /// Engineering shear strain γ = 2 ε (what most solvers write as "shear strain").
    Engineering,
    /// Tensor component ε = γ / 2.
    Tensor,
}

impl ShearConvention {
    /// Plain name.
    pub fn name(self) -> &'static str {
        match self {
            ShearConvention::Engineering => "engineering shear (γ = 2ε)",
            ShearConvention::Tensor => "tensor shear (ε = γ/2)",
        }
    }
}

/// The units a data file is stated in.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct FieldUnits {
    /// Unit of the node coordinates.
    pub length: LengthUnit,
    /// Unit of the tensor values (strain or stress).
    pub tensor: TensorUnit,
    /// Shear convention of a strain tensor (a stress tensor's shear is always τ).
    pub shear: ShearConvention,
}

impl FieldUnits {
    /// Values in SI with tensor shear, from values in these units (order xx, yy, zz, xy, yz,
    /// zx).
    pub fn to_si(&self, v: [f64; 6]) -> [f64; 6] {
        let k = self.tensor.to_si();
        let shear = match (self.tensor.quantity(), self.shear) {
            (TensorQuantity::Strain, ShearConvention::Engineering) => 0.5,
            _ => 1.0,
        };
        [
            v[0] * k,
            v[1] * k,
            v[2] * k,
            v[3] * k * shear,
            v[4] * k * shear,
            v[5] * k * shear,
        ]
    }

    /// In words, e.g. "coordinates in mm, strain in µm/m, engineering shear (γ = 2ε)".
    pub fn describe(&self) -> String {
        let q = match self.tensor.quantity() {
            TensorQuantity::Strain => {
                format!("strain in {}, {}", self.tensor.symbol(), self.shear.name())
            }
            TensorQuantity::Stress => format!("stress in {}", self.tensor.symbol()),
        };
        format!("coordinates in {}, {q}", self.length.symbol())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn engineering_shear_is_halved_and_stress_shear_is_not() {
        let e = FieldUnits {
            length: LengthUnit::Millimetre,
            tensor: TensorUnit::MicroStrain,
            shear: ShearConvention::Engineering,
        };
        let v = e.to_si([100.0, 0.0, 0.0, 200.0, 0.0, 0.0]);
        assert!((v[0] - 100e-6).abs() < 1e-18 && (v[3] - 100e-6).abs() < 1e-18);
        let s = FieldUnits {
            tensor: TensorUnit::Ksi,
            ..e
        };
        // 1 ksi = 6.894 757 MPa (NIST SP 811, Appendix B).
        assert!((s.to_si([0.0, 0.0, 0.0, 1.0, 0.0, 0.0])[3] - 6.894_757_293_168e6).abs() < 1e-3);
    }

    #[test]
    fn symbols_read_back() {
        for u in TensorUnit::ALL {
            assert_eq!(TensorUnit::parse(u.symbol()), Some(u));
        }
        for u in LengthUnit::ALL {
            assert_eq!(LengthUnit::parse(u.symbol()), Some(u));
        }
        assert_eq!(TensorUnit::parse("um/m"), Some(TensorUnit::MicroStrain));
        assert_eq!(TensorUnit::parse("furlong"), None);
    }
}
