//! What the face view reports under the cursor: what each grid of a gauge pattern would read
//! if it were placed there (averaged over its area), and the principal directions of the
//! strain for the short-stroke overlay.

use gw_bridge::{GaugePattern, GaugeSpec, PlacedGauge};
use gw_mechanics::{
    LoadVector, Member, Principal, QuadratureOrder, StrainBasis, SurfacePoint, grid_average_state,
};

use crate::document::{Project, default_gauge_spec};

/// The gauge type a probe of `pattern` stands for: the project's first stock type of that
/// pattern (what "Add gauge" would place), else the default type of the pattern.
pub fn probe_spec(project: &Project, pattern: GaugePattern) -> GaugeSpec {
    project
        .gauge_stock
        .iter()
        .find(|s| s.spec.pattern == pattern)
        .map(|s| s.spec.clone())
        .unwrap_or_else(|| default_gauge_spec(pattern))
}

/// One grid's reading of a probe: the grid's direction and what it reads.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ProbeReading {
    /// Direction of the grid, degrees from the member axis.
    pub angle_deg: f64,
    /// Strain the grid reads, averaged over its area, m/m (on `basis`).
    pub strain: f64,
}

/// What each grid of a gauge of `spec` centred at `point` with its reference direction at
/// `angle_rad` would read under `loads`, averaged over the grid area, on the strain `basis`
/// (no transverse sensitivity). `None` when part of a grid would lie off the face or a value
/// is not finite.
pub fn probe_readings(
    member: &Member,
    loads: &LoadVector,
    spec: &GaugeSpec,
    point: SurfacePoint,
    angle_rad: f64,
    basis: StrainBasis,
) -> Option<Vec<ProbeReading>> {
    let gauge = PlacedGauge {
        id: String::new(),
        spec: spec.clone(),
        position: point,
        angle_rad,
    };
    (0..gauge.element_count())
        .map(|e| {
            let grid = gauge.footprint(e);
            let state =
                grid_average_state(member, &grid, loads, QuadratureOrder::default()).ok()?;
            let strain = match basis {
                StrainBasis::Mechanical => state.mechanical_strain(),
                StrainBasis::WithFreeThermal => state.strain,
            }
            .along(grid.angle_rad);
            strain.is_finite().then_some(ProbeReading {
                angle_deg: grid.angle_rad.to_degrees(),
                strain,
            })
        })
        .collect()
}

/// The principal strains at `point` on the strain `basis`, or `None` off the part.
pub fn principal_strain_at(
    member: &Member,
    loads: &LoadVector,
    point: &SurfacePoint,
    basis: StrainBasis,
) -> Option<Principal> {
    let state = member.state(point, loads).ok()?;
    let strain = match basis {
        StrainBasis::Mechanical => state.mechanical_strain(),
        StrainBasis::WithFreeThermal => state.strain,
    };
    let p = strain.principal();
    (p.max.is_finite() && p.min.is_finite() && p.angle_rad.is_finite()).then_some(p)
}

#[cfg(test)]
mod tests {
    use super::*;
    use gw_mechanics::{Face, LoadComponent};

    /// The demo's drive shaft (60 mm outside, 30 mm bore, torque only): a ±45° pair at the top
    /// line reads ±γ/2 with γ = T r / (G J). The reference figure is worked out here from the
    /// shaft's own dimensions and material, by the torsion formula (Gere & Goodno, *Mechanics
    /// of Materials*, 7th ed., §3.3), not by the code under test.
    #[test]
    fn a_shear_pair_on_a_twisted_shaft_reads_plus_and_minus_half_gamma() {
        let project = crate::demo::demo_project();
        let part = &project.parts[1];
        let Member::Shaft(shaft) = &part.member else {
            panic!("the demo's second part is the shaft");
        };
        let mut loads = LoadVector::default();
        loads[LoadComponent::Torque] = 1000.0;
        let (ro, ri) = (shaft.outer_diameter_m / 2.0, shaft.inner_diameter_m / 2.0);
        let j = std::f64::consts::PI / 2.0 * (ro.powi(4) - ri.powi(4));
        let e = shaft.material.youngs_modulus_pa;
        let g = e / (2.0 * (1.0 + shaft.material.poisson_ratio));
        let gamma = 1000.0 * ro / (g * j);
        let spec = probe_spec(&project, GaugePattern::ShearPair);
        let r = probe_readings(
            &part.member,
            &loads,
            &spec,
            SurfacePoint::new(Face::Round, 0.3, 0.0),
            0.0,
            StrainBasis::Mechanical,
        )
        .expect("the pair fits on the shaft");
        assert_eq!(r.len(), 2);
        assert!((r[0].angle_deg - 45.0).abs() < 1e-9);
        // Uniform shear along the shaft; the grid's 3 mm across a 188 mm circumference curves
        // a little, so allow 0.1 %.
        assert!(
            (r[0].strain.abs() - gamma / 2.0).abs() < 1e-3 * gamma,
            "{r:?} vs {gamma}"
        );
        assert!((r[0].strain + r[1].strain).abs() < 1e-3 * gamma);
        // The principal direction of pure shear lies at ±45°.
        let p = principal_strain_at(
            &part.member,
            &loads,
            &SurfacePoint::new(Face::Round, 0.3, 0.0),
            StrainBasis::Mechanical,
        )
        .expect("on the part");
        assert!((p.angle_rad.abs().to_degrees() - 45.0).abs() < 1e-6);
    }

    #[test]
    fn a_probe_off_the_face_reads_nothing() {
        let project = crate::demo::demo_project();
        let part = &project.parts[0];
        let spec = probe_spec(&project, GaugePattern::SingleGrid);
        // The beam's top face is 30 mm wide; a grid centred on its edge runs off it.
        let r = probe_readings(
            &part.member,
            &LoadVector::default(),
            &spec,
            SurfacePoint::new(Face::Top, 0.2, 0.0155),
            0.0,
            StrainBasis::Mechanical,
        );
        assert!(r.is_none());
    }
}
