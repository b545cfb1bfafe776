//! Named load components and load vectors.
//!
//! Every member exposes its loads as components; a load case is a vector of component values
//! and every surface quantity is linear in it, so each quantity can be asked "per unit of each
//! component" and a load case is the sum of its components.

use std::ops::{Index, IndexMut};

use serde::{Deserialize, Serialize};

/// One kind of load a member can carry. Sign conventions are given per variant.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub enum LoadComponent {
    /// Axial force along the member axis, N, positive in tension.
    AxialForce,
    /// Vertical transverse force on a beam, N, positive downward (−z): the end load of a
    /// cantilever or the point load of a simply supported beam.
    VerticalForce,
    /// Horizontal transverse force on a beam, N, positive towards +y, at the same place.
    LateralForce,
    /// Uniformly distributed vertical load on a beam, N/m, positive downward.
    UniformLoad,
    /// Bending moment about the horizontal y axis, N·m, right-handed about +y on the +x end
    /// face: positive stretches the top (+z) fibre. Constant along the member.
    BendingMomentY,
    /// Bending moment about the vertical z axis, N·m, right-handed about +z on the +x end
    /// face: positive compresses the +y side. Constant along the member.
    BendingMomentZ,
    /// Torque about the member axis, N·m, right-handed about +x.
    Torque,
    /// Internal (gauge) pressure, Pa.
    InternalPressure,
    /// External pressure, Pa.
    ExternalPressure,
    /// Remote normal stress along the plate's x axis, Pa, positive in tension.
    RemoteStressX,
    /// Remote normal stress along the plate's y axis, Pa, positive in tension.
    RemoteStressY,
    /// Remote in-plane shear stress of the plate, Pa.
    RemoteShearXY,
    /// Multiple of a surface state given by the user (1 = the state as entered).
    GivenStateFactor,
    /// Uniform temperature change of the part from the reference temperature, °C.
    TemperatureChange,
}

impl LoadComponent {
    /// Number of components.
    pub const COUNT: usize = 14;

    /// Every component, in a fixed order (the order of [`LoadVector`]).
    pub const ALL: [LoadComponent; Self::COUNT] = [
        LoadComponent::AxialForce,
        LoadComponent::VerticalForce,
        LoadComponent::LateralForce,
        LoadComponent::UniformLoad,
        LoadComponent::BendingMomentY,
        LoadComponent::BendingMomentZ,
        LoadComponent::Torque,
        LoadComponent::InternalPressure,
        LoadComponent::ExternalPressure,
        LoadComponent::RemoteStressX,
        LoadComponent::RemoteStressY,
        LoadComponent::RemoteShearXY,
        LoadComponent::GivenStateFactor,
        LoadComponent::TemperatureChange,
    ];

    /// Position in [`LoadComponent::ALL`].
    pub fn index(self) -> usize {
        self as usize
    }

    /// Plain name for display.
    pub fn name(self) -> &'static str {
        match self {
            LoadComponent::AxialForce => "axial force",
            LoadComponent::VerticalForce => "vertical force",
            LoadComponent::LateralForce => "lateral force",
            LoadComponent::UniformLoad => "uniform load",
            LoadComponent::BendingMomentY => "bending moment (vertical plane)",
            LoadComponent::BendingMomentZ => "bending moment (horizontal plane)",
            LoadComponent::Torque => "torque",
            LoadComponent::InternalPressure => "internal pressure",
            LoadComponent::ExternalPressure => "external pressure",
            LoadComponent::RemoteStressX => "remote stress along x",
            LoadComponent::RemoteStressY => "remote stress along y",
            LoadComponent::RemoteShearXY => "remote shear stress",
            LoadComponent::GivenStateFactor => "given state factor",
            LoadComponent::TemperatureChange => "temperature change",
        }
    }

    /// SI unit of the component's value.
    pub fn unit(self) -> &'static str {
        match self {
            LoadComponent::AxialForce
            | LoadComponent::VerticalForce
            | LoadComponent::LateralForce => "N",
            LoadComponent::UniformLoad => "N/m",
            LoadComponent::BendingMomentY
            | LoadComponent::BendingMomentZ
            | LoadComponent::Torque => "N·m",
            LoadComponent::InternalPressure
            | LoadComponent::ExternalPressure
            | LoadComponent::RemoteStressX
            | LoadComponent::RemoteStressY
            | LoadComponent::RemoteShearXY => "Pa",
            LoadComponent::GivenStateFactor => "",
            LoadComponent::TemperatureChange => "°C",
        }
    }
}

/// A value for every load component, SI units as given on [`LoadComponent`].
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct LoadVector(pub [f64; LoadComponent::COUNT]);

impl LoadVector {
    /// All components zero.
    pub const ZERO: LoadVector = LoadVector([0.0; LoadComponent::COUNT]);

    /// One unit of one component, zero elsewhere.
    pub fn unit(component: LoadComponent) -> Self {
        let mut v = Self::ZERO;
        v[component] = 1.0;
        v
    }

    /// A vector from (component, value) pairs; later pairs add to earlier ones.
    pub fn from_pairs(pairs: &[(LoadComponent, f64)]) -> Self {
        let mut v = Self::ZERO;
        for &(c, x) in pairs {
            v[c] += x;
        }
        v
    }

    /// Components with a non-zero value.
    pub fn nonzero(&self) -> impl Iterator<Item = (LoadComponent, f64)> + '_ {
        LoadComponent::ALL
            .iter()
            .map(|&c| (c, self[c]))
            .filter(|(_, x)| *x != 0.0)
    }

    /// The vector scaled by `k` (a point on a load ramp).
    pub fn scaled(&self, k: f64) -> Self {
        let mut v = *self;
        v.0.iter_mut().for_each(|x| *x *= k);
        v
    }

    /// The first non-finite component, if any.
    pub fn first_non_finite(&self) -> Option<(LoadComponent, f64)> {
        LoadComponent::ALL
            .iter()
            .map(|&c| (c, self[c]))
            .find(|(_, x)| !x.is_finite())
    }
}

impl Index<LoadComponent> for LoadVector {
    type Output = f64;
    fn index(&self, c: LoadComponent) -> &f64 {
        &self.0[c.index()]
    }
}

impl IndexMut<LoadComponent> for LoadVector {
    fn index_mut(&mut self, c: LoadComponent) -> &mut f64 {
        &mut self.0[c.index()]
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn all_is_in_index_order() {
        for (i, c) in LoadComponent::ALL.iter().enumerate() {
            assert_eq!(c.index(), i);
        }
    }
}
