//! The bundled demo: an invented winch test stand with a reaction arm (beam), a drum drive
//! shaft and an accumulator shell (thin cylinder). Every name and number is invented.

use gw_bridge::bridge::COPPER_TCR_PER_C;
use gw_bridge::bridge_uncertainty::InstallationTolerances;
use gw_bridge::signal_chain::LowPassFilter;
use gw_bridge::{
    CompletionResistor, Excitation, GaugePattern, InstrumentTemperature, LeadWire, LeadWiring,
    ShuntLocation, ShuntPlan, SignalChain,
};
use gw_mechanics::{
    Beam, BeamSupport, Face, LoadComponent, LoadPoint, Member, Section, Shaft, SurfacePoint,
    ThinCylinder, VesselEnds, library_material,
};

use crate::document::{
    BridgePlan, FORMAT_VERSION, LeadColours, LoadCase, PaperSize, Part, PlanArm, PlanGauge,
    Project, RequiredAccuracy, StockGauge, default_gauge_spec, stock_base_name,
};

pub(crate) fn material(key: &str) -> gw_mechanics::Material {
    library_material(key)
        .map(|m| m.material())
        .unwrap_or_else(|| gw_mechanics::Material {
            name: "Carbon steel".into(),
            youngs_modulus_pa: 207e9,
            poisson_ratio: 0.292,
            cte_per_c: 11.7e-6,
            yield_strength_pa: 350e6,
        })
}

fn gauge(id: &str, pattern: GaugePattern, face: Face, x: f64, s: f64, angle_deg: f64) -> PlanGauge {
    PlanGauge {
        id: id.into(),
        stock: stock_base_name(&default_gauge_spec(pattern)),
        lot: None,
        position: SurfacePoint::new(face, x, s),
        angle_rad: angle_deg.to_radians(),
    }
}

/// The demo's gauge stock: the default type in each pattern the demo uses.
pub(crate) fn stock() -> Vec<StockGauge> {
    [
        GaugePattern::SingleGrid,
        GaugePattern::ShearPair,
        GaugePattern::TwoElement90,
        GaugePattern::RectangularRosette,
    ]
    .into_iter()
    .map(|pattern| {
        let spec = default_gauge_spec(pattern);
        StockGauge {
            name: stock_base_name(&spec),
            spec,
        }
    })
    .collect()
}

pub(crate) fn grid(gauge: &str, grid: usize) -> PlanArm {
    PlanArm::Grid {
        gauge: gauge.into(),
        grid,
    }
}

pub(crate) fn completion() -> PlanArm {
    PlanArm::Completion(CompletionResistor {
        ohm: 350.0,
        tolerance: 0.0005,
        tcr_per_c: 5e-6,
    })
}

fn signal(gain: f64) -> SignalChain {
    SignalChain {
        gain,
        input_range_v: 10.0,
        adc_bits: 24,
        amplifier_noise_v_per_rt_hz: 8e-9,
        bandwidth_hz: 100.0,
        filter: LowPassFilter::FirstOrderRc,
        excitation_accuracy: 0.0005,
        gain_accuracy: 0.001,
    }
}

#[allow(clippy::too_many_arguments)]
pub(crate) fn bridge(
    name: &str,
    arrangement: &str,
    arms: [PlanArm; 4],
    wanted: LoadComponent,
    wiring: LeadWiring,
    lead_m: f64,
    gain: f64,
    channel: u32,
    shunt: Option<ShuntPlan>,
) -> BridgePlan {
    BridgePlan {
        name: name.into(),
        arrangement: arrangement.into(),
        arms,
        wiring,
        // 0.14 mm² copper: about 0.13 Ω/m (from memory).
        lead: LeadWire {
            length_m: lead_m,
            ohm_per_m: 0.13,
            tcr_per_c: COPPER_TCR_PER_C,
        },
        excitation: Excitation::Voltage { volts: 3.0 },
        amplifier_input_ohm: Some(10e6),
        gauge_factor_setting: 2.05,
        bridge_factor_override: None,
        signal: signal(gain),
        wanted,
        instrument_temperature: InstrumentTemperature::Fixed,
        shunt,
        channel,
        required_accuracy: None,
        recovery: Default::default(),
        calibration: None,
    }
}

pub(crate) fn case(
    name: &str,
    loads: &[(LoadComponent, f64)],
    range: (f64, f64),
    cycled: bool,
    proof: bool,
) -> LoadCase {
    LoadCase {
        name: name.into(),
        loads: loads.to_vec(),
        ramp_steps: 10,
        temperature_range_c: range,
        cycled,
        proof_test: proof,
    }
}

pub(crate) fn shunt(arm: usize, microstrain: f64) -> Option<ShuntPlan> {
    Some(ShuntPlan {
        arm,
        target_strain: microstrain * 1e-6,
        location: ShuntLocation::InstrumentEnd,
    })
}

/// The reaction arm's gauges: four bending grids near the clamp, a shear pair on each side at
/// mid-span, and a rosette between the neutral axis and the top edge.
fn reaction_arm_gauges() -> Vec<PlanGauge> {
    vec![
        gauge(
            "A1",
            GaugePattern::SingleGrid,
            Face::Top,
            0.05,
            -0.0075,
            0.0,
        ),
        gauge(
            "A2",
            GaugePattern::SingleGrid,
            Face::Bottom,
            0.05,
            -0.0075,
            0.0,
        ),
        gauge("A3", GaugePattern::SingleGrid, Face::Top, 0.05, 0.0075, 0.0),
        gauge(
            "A4",
            GaugePattern::SingleGrid,
            Face::Bottom,
            0.05,
            0.0075,
            0.0,
        ),
        gauge("S1", GaugePattern::ShearPair, Face::Front, 0.25, 0.0, 0.0),
        gauge("S2", GaugePattern::ShearPair, Face::Back, 0.25, 0.0, 0.0),
        // Between the neutral axis and the top edge, where bending and shear both act:
        // the principal directions lean away from the arm's axis.
        gauge(
            "R1",
            GaugePattern::RectangularRosette,
            Face::Front,
            0.15,
            0.006,
            0.0,
        ),
    ]
}

/// The reaction arm: a cantilevered rectangular bar with bending and shear bridges.
fn reaction_arm() -> Part {
    use LoadComponent::*;
    let steel = material("carbon_steel");
    Part {
        name: "Reaction arm".into(),
        member: Member::Beam(Beam {
            section: Section::Rectangle {
                width_m: 0.03,
                height_m: 0.06,
            },
            material: steel.clone(),
            length_m: 0.45,
            support: BeamSupport::Cantilever,
            load_points: vec![LoadPoint::whole(0.45)],
        }),
        material_key: Some("carbon_steel".into()),
        load_cases: vec![
            case(
                "Rated pull",
                &[(VerticalForce, 6000.0), (AxialForce, 1500.0)],
                (-10.0, 40.0),
                true,
                false,
            ),
            case(
                "Proof pull",
                &[
                    (VerticalForce, 9000.0),
                    (AxialForce, 2200.0),
                    (TemperatureChange, 15.0),
                ],
                (-10.0, 40.0),
                false,
                true,
            ),
        ],
        gauges: reaction_arm_gauges(),
        bridges: vec![
            bridge(
                "Arm bending",
                "Bending, four grids on top and bottom",
                [grid("A1", 1), grid("A2", 1), grid("A3", 1), grid("A4", 1)],
                VerticalForce,
                LeadWiring::RemoteSense,
                12.0,
                400.0,
                1,
                shunt(0, 500.0),
            ),
            bridge(
                "Arm shear web",
                "Shear-web pairs, both sides",
                [grid("S1", 2), grid("S1", 1), grid("S2", 1), grid("S2", 2)],
                VerticalForce,
                LeadWiring::ThreeWire,
                12.0,
                1000.0,
                2,
                shunt(0, 100.0),
            ),
            rosette_channel(1, 7),
            rosette_channel(2, 8),
            rosette_channel(3, 9),
        ],
        required_resolution_strain: 1e-6,
        tolerances: InstallationTolerances::default(),
        datum_m: (0.0, 0.0),
    }
}

/// One grid of the arm's rosette R1 in a three-wire quarter bridge of its own, as rosettes are
/// usually read. It reports the grid's strain and stays out of the load recovery.
fn rosette_channel(grid_number: usize, channel: u32) -> BridgePlan {
    let mut b = bridge(
        &format!("Rosette R1, grid {grid_number}"),
        "One rosette grid, three-wire",
        [
            grid("R1", grid_number),
            completion(),
            completion(),
            completion(),
        ],
        LoadComponent::VerticalForce,
        LeadWiring::ThreeWire,
        12.0,
        1000.0,
        channel,
        shunt(0, 500.0),
    );
    b.recovery = crate::document::LoadRecovery::LeftOut;
    b
}

/// The drum drive shaft: torque and bending bridges on a round shaft.
fn drum_drive_shaft() -> Part {
    use LoadComponent::*;
    let alloy = material("alloy_steel_qt");
    let half_turn = std::f64::consts::PI * 0.03;
    Part {
        name: "Drum drive shaft".into(),
        member: Member::Shaft(Shaft {
            outer_diameter_m: 0.06,
            inner_diameter_m: 0.03,
            length_m: 0.6,
            material: alloy,
        }),
        material_key: Some("alloy_steel_qt".into()),
        load_cases: vec![
            case(
                "Rated torque",
                &[
                    (Torque, 1500.0),
                    (BendingMomentY, 250.0),
                    (TemperatureChange, 5.0),
                ],
                (-10.0, 50.0),
                true,
                false,
            ),
            case(
                "Peak torque",
                &[
                    (Torque, 2600.0),
                    (BendingMomentY, 400.0),
                    (TemperatureChange, 25.0),
                ],
                (-10.0, 50.0),
                false,
                false,
            ),
        ],
        gauges: vec![
            gauge("T1", GaugePattern::ShearPair, Face::Round, 0.3, 0.0, 0.0),
            gauge(
                "T2",
                GaugePattern::ShearPair,
                Face::Round,
                0.3,
                half_turn,
                0.0,
            ),
            gauge("B1", GaugePattern::SingleGrid, Face::Round, 0.15, 0.0, 0.0),
            gauge(
                "B2",
                GaugePattern::SingleGrid,
                Face::Round,
                0.15,
                half_turn,
                0.0,
            ),
        ],
        bridges: vec![
            bridge(
                "Drive torque",
                "Torque, four grids at ±45° on opposite sides",
                [grid("T1", 2), grid("T1", 1), grid("T2", 2), grid("T2", 1)],
                Torque,
                LeadWiring::RemoteSense,
                15.0,
                500.0,
                3,
                shunt(0, 400.0),
            ),
            bridge(
                "Shaft bending",
                "Bending pair on opposite sides",
                [grid("B1", 1), grid("B2", 1), completion(), completion()],
                BendingMomentY,
                LeadWiring::ThreeWire,
                15.0,
                1000.0,
                4,
                shunt(0, 100.0),
            ),
        ],
        required_resolution_strain: 1e-6,
        tolerances: InstallationTolerances::default(),
        datum_m: (0.0, 0.0),
    }
}

/// The accumulator shell: a thin-walled cylinder with pressure bridges.
fn accumulator_shell() -> Part {
    use LoadComponent::*;
    let steel = material("carbon_steel");
    let shell_half_turn = std::f64::consts::PI * 0.11;
    Part {
        name: "Accumulator shell".into(),
        member: Member::ThinCylinder(ThinCylinder {
            outer_diameter_m: 0.22,
            wall_m: 0.009,
            length_m: 0.8,
            ends: VesselEnds::Closed,
            material: steel,
        }),
        material_key: Some("carbon_steel".into()),
        load_cases: vec![
            case(
                "Working pressure",
                &[(InternalPressure, 14e6), (TemperatureChange, 10.0)],
                (-10.0, 60.0),
                true,
                false,
            ),
            case(
                "Proof pressure",
                &[(InternalPressure, 21e6)],
                (-10.0, 60.0),
                false,
                true,
            ),
        ],
        gauges: vec![
            gauge(
                "P1",
                GaugePattern::TwoElement90,
                Face::Round,
                0.4,
                0.0,
                90.0,
            ),
            gauge(
                "P2",
                GaugePattern::SingleGrid,
                Face::Round,
                0.4,
                shell_half_turn,
                90.0,
            ),
        ],
        bridges: vec![
            bridge(
                "Shell pressure",
                "Hoop and axial pair",
                [grid("P1", 1), grid("P1", 2), completion(), completion()],
                InternalPressure,
                LeadWiring::ThreeWire,
                25.0,
                500.0,
                5,
                shunt(0, 500.0),
            ),
            bridge(
                "Shell hoop, single grid",
                "One hoop grid",
                [grid("P2", 1), completion(), completion(), completion()],
                InternalPressure,
                LeadWiring::TwoWire,
                5.0,
                500.0,
                6,
                None,
            ),
        ],
        required_resolution_strain: 1e-6,
        tolerances: InstallationTolerances::default(),
        datum_m: (0.0, 0.0),
    }
}

/// The demo project.
pub fn demo_project() -> Project {
    let reference = 20.0;
    let arm = reaction_arm();
    let shaft = drum_drive_shaft();
    let shell = accumulator_shell();
    let mut parts = vec![arm, shaft, shell];
    // What this invented job asks of its main bridges; the single hoop grid is the comparison
    // and states none.
    for (part, bridge, percent) in [(0, 0, 2.0), (1, 0, 3.0), (2, 0, 4.0)] {
        if let Some(b) = parts
            .get_mut(part)
            .and_then(|p: &mut Part| p.bridges.get_mut(bridge))
        {
            b.required_accuracy = Some(RequiredAccuracy::PercentOfReading(percent));
        }
    }
    Project {
        format_version: FORMAT_VERSION,
        name: "Winch test stand (demo)".into(),
        revision: "A".into(),
        date: "2026-12-01".into(),
        prepared_by: "Demo engineer".into(),
        checked_by: String::new(),
        paper: PaperSize::A4,
        reference_temperature_c: reference,
        warn_utilisation: gw_bridge::margins::DEFAULT_WARN_UTILISATION,
        zero_band_fraction: gw_bridge::zero_band::DEFAULT_ZERO_BAND_FRACTION,
        marking_templates: true,
        lead_colours: LeadColours::default(),
        gauge_stock: stock(),
        parts,
        notes: "Invented demo: a winch test stand with a reaction arm, a drum drive shaft and an \
                hydraulic accumulator."
            .into(),
        records: Default::default(),
    }
}
