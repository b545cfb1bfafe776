//! The measurement core end to end on an invented cantilever, against closed forms.

mod support;

use approx::assert_relative_eq;
use gw_bridge::shunt::{nearest_e96, shunt_for_strain, simulated_strain};
use gw_bridge::signal_chain::johnson_noise_v;
use gw_bridge::temperature::thermal_sweep;
use gw_bridge::uncertainty::{COVERAGE_PROBABILITY, InputQuantity, gum, monte_carlo};
use gw_bridge::*;
use gw_mechanics::*;
use support::*;

/// The budget of the top/bottom bending pair at 1000 N on a converter of `adc_bits`, with the
/// channel it was formed for.
fn bending_pair_budget(
    adc_bits: u32,
) -> (
    bridge_uncertainty::BridgeUncertainty,
    signal_chain::ChannelFigures,
) {
    let member = cantilever();
    let gauges = top_bottom();
    let c = ArmElement::Completion(completion());
    let mut b = bridge(
        [grid(0, 0), grid(1, 0), c, c],
        LoadComponent::VerticalForce,
        2.0,
    );
    b.signal.adc_bits = adc_bits;
    let s = setup(&member, &gauges);
    let model = BridgeModel::new(&s, &b).unwrap();
    let channel = signal_chain::channel_figures(&model).unwrap();
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, 1000.0)]);
    let u = bridge_uncertainty::bridge_uncertainty(
        &member,
        &model,
        &loads,
        &channel,
        &Default::default(),
        s.quadrature,
    )
    .unwrap();
    (u, channel)
}

fn top_bottom() -> Vec<PlacedGauge> {
    vec![
        placed(
            spec(GaugePattern::SingleGrid),
            "G1",
            Face::Top,
            0.1,
            0.0,
            0.0,
        ),
        placed(
            spec(GaugePattern::SingleGrid),
            "G2",
            Face::Bottom,
            0.1,
            0.0,
            0.0,
        ),
    ]
}

#[test]
fn quarter_bridge_reading_shows_the_one_arm_nonlinearity() {
    // Dally & Riley, Experimental Stress Analysis, 3rd ed., Ch. 7 (from memory for the section):
    // Vo/Vex = (GF ε/4)/(1 + GF ε/2); an instrument converting linearly shows 4 (Vo/Vex)/GF.
    let member = cantilever();
    let gauges = top_bottom();
    let c = ArmElement::Completion(completion());
    let b = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
    let model = BridgeModel::new(&setup(&member, &gauges), &b).unwrap();
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, 2000.0)]);
    let r = model.reading(&loads).unwrap();
    // Strain at the grid centre, Roark 7th ed. Table 8.1 case 1a: σ = 6 P (L − x)/(b h²);
    // the 3 mm grid averages a linear field exactly.
    let eps = 6.0 * 2000.0 * 0.4 / (0.02 * 0.04f64.powi(2)) / 200e9;
    let d = 2.0 * eps;
    assert_relative_eq!(
        r.displayed_strain,
        4.0 * (d / 4.0) / (1.0 + d / 2.0) / 2.0,
        max_relative = 1e-9
    );
    assert_relative_eq!(r.target_strain, eps, max_relative = 1e-9);
    assert_relative_eq!(
        r.error.total(),
        r.displayed_strain - r.target_strain,
        epsilon = 1e-15
    );
    assert_relative_eq!(
        r.error.nonlinearity,
        r.displayed_strain - eps,
        max_relative = 1e-6
    );
}

#[test]
fn bending_pair_cancels_axial_load_and_temperature() {
    // Dally & Riley 3rd ed., Ch. 7: grids on opposite faces in adjacent arms add bending and
    // cancel axial strain and (identical grids at one temperature) thermal output.
    let member = cantilever();
    let mut gauges = top_bottom();
    for g in &mut gauges {
        g.spec.thermal_output.matched_cte_per_c = 16e-6; // deliberately mismatched
    }
    let c = ArmElement::Completion(completion());
    let b = bridge(
        [grid(0, 0), grid(1, 0), c, c],
        LoadComponent::VerticalForce,
        2.0,
    );
    let model = BridgeModel::new(&setup(&member, &gauges), &b).unwrap();
    let bending = model.sensitivity(LoadComponent::VerticalForce).unwrap();
    let axial = model.sensitivity(LoadComponent::AxialForce).unwrap();
    let thermal = model.sensitivity(LoadComponent::TemperatureChange).unwrap();
    let per_newton = 6.0 * 0.4 / (0.02 * 0.04f64.powi(2)) / 200e9;
    assert_relative_eq!(bending, per_newton, max_relative = 1e-6);
    assert!(
        axial.abs() < 1e-9 * bending.abs() * 1e4,
        "axial leak {axial}"
    );
    assert!(thermal.abs() < 1e-12, "thermal {thermal}");
    // A quarter bridge with the same grids does show temperature: (αp − αg) ΔT per °C.
    let q = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
    let qm = BridgeModel::new(&setup(&member, &gauges), &q).unwrap();
    assert_relative_eq!(
        qm.sensitivity(LoadComponent::TemperatureChange).unwrap(),
        11e-6 - 16e-6,
        max_relative = 1e-3
    );
}

#[test]
fn thermal_sweep_of_the_quarter_bridge_is_the_mismatch_and_the_pair_cancels_it() {
    let member = cantilever();
    let mut gauges = top_bottom();
    for g in &mut gauges {
        g.spec.thermal_output.matched_cte_per_c = 16e-6;
    }
    let c = ArmElement::Completion(completion());
    let quarter = BridgeModel::new(
        &setup(&member, &gauges),
        &bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0),
    )
    .unwrap();
    let pair = BridgeModel::new(
        &setup(&member, &gauges),
        &bridge(
            [grid(0, 0), grid(1, 0), c, c],
            LoadComponent::VerticalForce,
            2.0,
        ),
    )
    .unwrap();
    let full = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, 1000.0)]);
    let q = thermal_sweep(&quarter, -20.0, 40.0, 6, &full).unwrap();
    let hot = q.last().unwrap();
    assert_relative_eq!(
        hot.expansion_mismatch,
        (11e-6 - 16e-6) * 40.0,
        max_relative = 1e-9
    );
    assert_relative_eq!(hot.total, hot.expansion_mismatch, max_relative = 1e-3);
    let p = thermal_sweep(&pair, -20.0, 40.0, 6, &full).unwrap();
    let hot = p.last().unwrap();
    assert!(hot.total.abs() < 1e-12);
    assert!(hot.uncompensated > 1e-4);
}

#[test]
fn shunt_resistor_for_one_thousand_microstrain() {
    // Dally & Riley 3rd ed., Ch. 7: Rs = R/(GF ε) − R; R = 350 Ω, GF = 2, 1000 µε → 174 650 Ω.
    assert_relative_eq!(
        shunt_for_strain(350.0, 2.0, 1000e-6),
        174_650.0,
        max_relative = 1e-12
    );
    // Nearest E96 value (IEC 60063) is 174 kΩ, which simulates 350/(2 × 174 350) = 1003.7 µε.
    let e96 = nearest_e96(174_650.0);
    assert_eq!(e96, 174_000.0);
    assert_relative_eq!(
        simulated_strain(350.0, 2.0, e96),
        -350.0 / (2.0 * 174_350.0),
        max_relative = 1e-12
    );
}

#[test]
fn planned_shunt_reading_includes_the_bridge_nonlinearity_and_lead_effect() {
    let member = cantilever();
    let gauges = top_bottom();
    let c = ArmElement::Completion(completion());
    let mut b = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
    b.shunt = Some(ShuntPlan {
        arm: 0,
        target_strain: 1000e-6,
        location: ShuntLocation::InstrumentEnd,
    });
    b.lead = LeadWire {
        length_m: 20.0,
        ohm_per_m: 0.05,
        tcr_per_c: bridge::COPPER_TCR_PER_C,
    };
    let model = BridgeModel::new(&setup(&member, &gauges), &b).unwrap();
    let cal = shunt::shunt_calibration(&model).unwrap().unwrap();
    assert_eq!(cal.e96_ohm, 174_000.0);
    // At the gauge: the shunt changes the grid by ΔR = −R²/(R + Rs); with three wires the arm
    // also holds one 1 Ω lead (and so does its neighbour), so the one-arm formula applies to
    // δ = ΔR/(R + RL) (Dally & Riley 3rd ed., Ch. 7).
    let d = -350.0 * 350.0 / (350.0 + 174_000.0) / 351.0;
    assert_relative_eq!(
        cal.reading_at_gauge_strain,
        4.0 * (d / 4.0) / (1.0 + d / 2.0) / 2.0,
        max_relative = 1e-9
    );
    // At the instrument the shunt spans both current-carrying leads and the grid. Series–parallel
    // reduction (Ohm's law): Z = Rs ∥ (R + 2RL), V(P) = Vex Z/(R + Z), and the sense lead reads
    // the gauge end, V(P)(R + RL)/(R + 2RL); zero reading Vex/2.
    let (r, rl, rs) = (350.0, 1.0, 174_000.0);
    let z = rs * (r + 2.0 * rl) / (rs + r + 2.0 * rl);
    let v = z / (r + z) * (r + rl) / (r + 2.0 * rl) - 0.5;
    assert_relative_eq!(
        cal.expected_reading_strain,
        4.0 * v / 2.0,
        max_relative = 1e-9
    );
    assert!(
        (cal.expected_reading_strain - cal.reading_at_gauge_strain).abs()
            > 1e-3 * cal.reading_at_gauge_strain.abs()
    );
}

#[test]
fn johnson_noise_of_one_kilohm_is_about_four_nanovolts_per_root_hertz() {
    // Horowitz & Hill, The Art of Electronics, 3rd ed., §8.1.1: about 4 nV/√Hz for 1 kΩ at
    // room temperature.
    assert_relative_eq!(
        johnson_noise_v(1000.0, 298.15, 1.0),
        4.06e-9,
        max_relative = 0.005
    );
}

#[test]
fn gum_linear_propagation_of_a_sum() {
    // JCGM 100:2008, 5.1.2, eq. (10): y = x1 + 2 x2 → uc² = u1² + 4 u2²; a rectangular
    // ±a input has u = a/√3 (4.3.7).
    let inputs = [
        InputQuantity::normal("x1", "", 1.0, 0.3),
        InputQuantity::rectangular("x2", "", 2.0, 0.5),
    ];
    let b = gum(&inputs, &|x| x[0] + 2.0 * x[1], COVERAGE_PROBABILITY).unwrap();
    let u2 = 0.5 / 3f64.sqrt();
    assert_relative_eq!(
        b.combined,
        (0.09 + 4.0 * u2 * u2).sqrt(),
        max_relative = 1e-9
    );
    assert_relative_eq!(
        b.expanded,
        b.coverage_factor * b.combined,
        max_relative = 1e-15
    );
    assert_relative_eq!(b.value, 5.0, max_relative = 1e-15);
}

#[test]
fn monte_carlo_agrees_with_gum_for_a_linear_model() {
    // JCGM 101:2008, 9.2 (additive model): for a linear model the Monte Carlo standard
    // deviation equals the GUM combined uncertainty; with 200 000 trials within 1 %.
    let inputs = [
        InputQuantity::normal("x1", "", 0.0, 1.0),
        InputQuantity::rectangular("x2", "", 0.0, 2.0),
        InputQuantity::normal("x3", "", 0.0, 0.5),
    ];
    let f = |x: &[f64]| x[0] - 0.5 * x[1] + 3.0 * x[2];
    let g = gum(&inputs, &f, COVERAGE_PROBABILITY).unwrap();
    let mc = monte_carlo(&inputs, &f, 200_000, 7, 40);
    assert_relative_eq!(mc.standard_deviation, g.combined, max_relative = 0.01);
}

#[test]
fn monte_carlo_shows_what_first_order_gum_misses_in_a_quadratic_model() {
    // JCGM 101:2008, 9.4 (comparison loss): for δY = X1² + X2² with X ~ N(0, u) at the best
    // estimates 0, first-order GUM gives uc = 0 while the distribution has standard deviation
    // 2u² (a scaled χ² with 2 degrees of freedom).
    let u = 0.05;
    let inputs = [
        InputQuantity::normal("x1", "", 0.0, u),
        InputQuantity::normal("x2", "", 0.0, u),
    ];
    let f = |x: &[f64]| x[0] * x[0] + x[1] * x[1];
    let g = gum(&inputs, &f, COVERAGE_PROBABILITY).unwrap();
    assert!(g.combined < 1e-12);
    let mc = monte_carlo(&inputs, &f, 200_000, 11, 40);
    assert_relative_eq!(mc.standard_deviation, 2.0 * u * u, max_relative = 0.02);
}

#[test]
fn bridge_uncertainty_gum_and_monte_carlo_agree_for_a_near_linear_bridge() {
    // JCGM 101:2008, 8 (validation of the GUM framework): for a near-linear model the GUM
    // uncertainty and the Monte Carlo standard deviation agree; here within 5 % with 20 000
    // trials.
    let (u, _) = bending_pair_budget(24);
    assert_relative_eq!(u.gum.value, 1000.0, max_relative = 1e-3);
    assert_relative_eq!(
        u.monte_carlo.standard_deviation,
        u.gum.combined,
        max_relative = 0.05
    );
    assert!(u.gum.rows[0].contribution >= u.gum.rows.last().unwrap().contribution);
}

#[test]
fn multi_axis_separates_torque_and_bending_on_a_shaft() {
    let member = Member::Shaft(Shaft::new(0.04, 0.0, 0.3, steel()).unwrap());
    let half = std::f64::consts::PI * 0.02;
    let gauges = vec![
        placed(
            spec(GaugePattern::ShearPair),
            "T1",
            Face::Round,
            0.15,
            0.0,
            0.0,
        ),
        placed(
            spec(GaugePattern::ShearPair),
            "T2",
            Face::Round,
            0.15,
            half,
            0.0,
        ),
        placed(
            spec(GaugePattern::SingleGrid),
            "B1",
            Face::Round,
            0.1,
            0.0,
            0.0,
        ),
        placed(
            spec(GaugePattern::SingleGrid),
            "B2",
            Face::Round,
            0.1,
            half,
            0.0,
        ),
    ];
    let c = ArmElement::Completion(completion());
    let torque = bridge(
        [grid(0, 0), grid(0, 1), grid(1, 0), grid(1, 1)],
        LoadComponent::Torque,
        4.0,
    );
    let bending = bridge(
        [grid(2, 0), grid(3, 0), c, c],
        LoadComponent::BendingMomentY,
        2.0,
    );
    let s = setup(&member, &gauges);
    let models = vec![
        BridgeModel::new(&s, &torque).unwrap(),
        BridgeModel::new(&s, &bending).unwrap(),
    ];
    let m = multi_axis::multi_axis(&models, &member.components())
        .unwrap()
        .unwrap();
    assert!(m.condition_number < 1.01, "{}", m.condition_number);
    // Recovering torque from the torque reading: 1 / sensitivity (Gere & Goodno §3.3: γ/2 at
    // ±45° with γ = 16T/(πd³G)).
    let g = 200e9 / 2.6;
    let per_nm = 16.0 / (std::f64::consts::PI * 0.04f64.powi(3)) / g / 2.0;
    assert_relative_eq!(m.sensitivity[0][0].abs(), per_nm, max_relative = 1e-3);
    for (_, row) in &m.cross_talk {
        assert!(row.iter().all(|v| v.abs() < 1e-6), "{row:?}");
    }
}

#[test]
fn a_thermal_output_curve_recorded_at_its_gauge_factor_reads_back_as_recorded() {
    // Data-sheet convention (from memory): the lot's thermal-output curve is the strain
    // indicated with the instrument set to the stated gauge factor. A quarter bridge of a grid
    // whose gauge factor differs (2.10), on the matched material, read with the instrument at
    // the curve's factor (2.00), shows the curve itself; read at 2.10 it shows the curve
    // × 2.00 / 2.10.
    let member = cantilever();
    let mut gauges = top_bottom();
    let poly = |t: f64| -40e-6 + 2.5e-6 * t - 0.03e-6 * t * t;
    for g in &mut gauges {
        g.spec.gauge_factor = 2.10;
        g.spec.thermal_output.lot_polynomial = vec![-40e-6, 2.5e-6, -0.03e-6];
        g.spec.thermal_output.reference_gauge_factor = Some(2.00);
    }
    let c = ArmElement::Completion(CompletionResistor {
        ohm: 350.0,
        tolerance: 0.0,
        tcr_per_c: 0.0,
    });
    let reading_at = |gf_set: f64, dt: f64| {
        let mut b = bridge([grid(0, 0), c, c, c], LoadComponent::VerticalForce, 1.0);
        b.instrument.gauge_factor = gf_set;
        let model = BridgeModel::new(&setup(&member, &gauges), &b).unwrap();
        let mut l = LoadVector::ZERO;
        l[LoadComponent::TemperatureChange] = dt;
        model.displayed(&l).unwrap()
    };
    let (t_ref, dt) = (20.0, 40.0);
    let recorded = poly(t_ref + dt) - poly(t_ref);
    // The exact circuit adds the one-arm nonlinearity (≈ GF ε / 2 ≈ 1e-4 relative here).
    assert_relative_eq!(reading_at(2.00, dt), recorded, max_relative = 2e-4);
    assert_relative_eq!(
        reading_at(2.10, dt),
        recorded * 2.00 / 2.10,
        max_relative = 2e-4
    );
}

#[test]
fn a_bridge_read_in_mv_per_v_is_the_same_under_current_or_voltage_excitation() {
    // A bridge's output ratio Vo/Vb depends only on its arms (it is a ratiometric divider), so
    // feeding the same half bridge from a current source instead of a voltage source leaves the
    // reading in mV/V unchanged when it is normalised by the voltage across the bridge. With
    // completion resistors of 1000 Ω beside 350 Ω grids that voltage is
    // I (R1 + R2)(R3 + R4)/ΣR = 5 mA × 518.5 Ω, not I times the mean arm (675 Ω).
    let member = cantilever();
    let gauges = top_bottom();
    let c = ArmElement::Completion(CompletionResistor {
        ohm: 1000.0,
        ..completion()
    });
    let by_voltage = bridge(
        [grid(0, 0), grid(1, 0), c, c],
        LoadComponent::VerticalForce,
        2.0,
    );
    let mut by_current = by_voltage.clone();
    by_current.excitation = Excitation::Current { amps: 0.005 };
    let loads = LoadVector::from_pairs(&[(LoadComponent::VerticalForce, 2000.0)]);
    let read = |b: &Bridge| {
        BridgeModel::new(&setup(&member, &gauges), b)
            .unwrap()
            .reading(&loads)
            .unwrap()
    };
    let (v, i) = (read(&by_voltage), read(&by_current));
    assert_relative_eq!(i.mv_per_v, v.mv_per_v, max_relative = 1e-9);
    assert_relative_eq!(i.displayed_strain, v.displayed_strain, max_relative = 1e-9);
    let model = BridgeModel::new(&setup(&member, &gauges), &by_current).unwrap();
    let series = |a: f64, b: f64| a + b;
    let vb = 0.005 * series(350.0, 350.0) * series(1000.0, 1000.0) / 2700.0;
    assert_relative_eq!(model.nominal_excitation_v(), vb, max_relative = 1e-9);
}

#[test]
fn quantization_is_counted_once_in_the_uncertainty_budget() {
    // JCGM 100:2008, 5.1.2: each input quantity enters the combined uncertainty once. The
    // channel's total noise is Johnson, amplifier and quantization noise in quadrature; the
    // budget lists quantization (a rectangular distribution of one count, u = q/√12) and the
    // noise as two rows, so together they must make exactly the total, not more.
    // A coarse converter, so quantization is a visible share of the noise.
    let (u, channel) = bending_pair_budget(12);
    let row = |start: &str| {
        u.gum
            .rows
            .iter()
            .find(|r| r.name.starts_with(start))
            .unwrap_or_else(|| panic!("no row {start}"))
            .standard_uncertainty
    };
    let (noise, quantization) = (row("noise"), row("quantization"));
    assert!(quantization > 0.1 * noise, "{quantization} vs {noise}");
    assert_relative_eq!(
        noise.hypot(quantization),
        channel.noise_strain_rms,
        max_relative = 1e-9
    );
}

#[test]
fn position_across_the_face_enters_the_budget_beside_a_hole() {
    // Beside a hole across the load (θ = 90°, Kirsch) the strain falls steeply with the
    // distance from the hole edge, which is across the face (s), while along x it is
    // stationary by symmetry: the budget must carry the across row. Its contribution is checked
    // by an independent route: moving the whole gauge across and reading the bridge again.
    let member = Member::PlateWithHole(PlateWithHole::new(0.01, 0.2, 0.2, 0.005, steel()).unwrap());
    let at = |s: f64| {
        vec![placed(
            spec(GaugePattern::SingleGrid),
            "H1",
            Face::Plate,
            0.0,
            s,
            0.0,
        )]
    };
    let c = ArmElement::Completion(completion());
    let b = bridge([grid(0, 0), c, c, c], LoadComponent::RemoteStressX, 1.0);
    let loads = LoadVector::from_pairs(&[(LoadComponent::RemoteStressX, 100e6)]);
    let s0 = 0.0075;
    let gauges = at(s0);
    let model = BridgeModel::new(&setup(&member, &gauges), &b).unwrap();
    let s_w = model.sensitivity(LoadComponent::RemoteStressX).unwrap();
    let channel = signal_chain::channel_figures(&model).unwrap();
    let tol = bridge_uncertainty::InstallationTolerances::default();
    let u = bridge_uncertainty::bridge_uncertainty(
        &member,
        &model,
        &loads,
        &channel,
        &tol,
        QuadratureOrder::default(),
    )
    .unwrap();
    let row = |name: &str| {
        u.gum
            .rows
            .iter()
            .find(|r| r.name == name)
            .unwrap_or_else(|| panic!("no row {name}"))
            .contribution
    };
    let across = row("position of the gauge in arm 1 across the face");
    let along = row("position of the gauge in arm 1 along the part");
    // Moving the gauge by ±0.1 mm and reading again, in the measured unit (Pa of σx).
    let h = 1e-4;
    let reading = |s: f64| {
        let g = at(s);
        BridgeModel::new(&setup(&member, &g), &b)
            .unwrap()
            .displayed(&loads)
            .unwrap()
            / s_w
    };
    let slope = (reading(s0 + h) - reading(s0 - h)) / (2.0 * h);
    assert_relative_eq!(across, (slope * tol.position_m).abs(), max_relative = 0.05);
    assert!(across > 10.0 * along, "{across} vs {along}");
}

#[test]
fn grids_on_one_carrier_turn_together_in_the_budget() {
    // A ±45° pair in adjacent arms on a shaft carrying torque and an axial load: when the carrier
    // turns by δ both grids turn, and the axial part of their readings moves them apart by
    // 2(εx − εy)·δ; drawn as two independent turns the budget would give only √2 times the
    // single-grid term. Checked by an independent route: turning the whole gauge and reading
    // the bridge again.
    let member = Member::Shaft(Shaft::new(0.04, 0.0, 0.3, steel()).unwrap());
    let pair = |angle_deg: f64| {
        vec![placed(
            spec(GaugePattern::ShearPair),
            "T1",
            Face::Round,
            0.15,
            0.0,
            angle_deg,
        )]
    };
    let c = ArmElement::Completion(completion());
    let b = bridge([grid(0, 0), grid(0, 1), c, c], LoadComponent::Torque, 2.0);
    let loads = LoadVector::from_pairs(&[
        (LoadComponent::Torque, 300.0),
        (LoadComponent::AxialForce, 60e3),
    ]);
    let gauges = pair(0.0);
    let model = BridgeModel::new(&setup(&member, &gauges), &b).unwrap();
    let s_w = model.sensitivity(LoadComponent::Torque).unwrap();
    let channel = signal_chain::channel_figures(&model).unwrap();
    let tol = bridge_uncertainty::InstallationTolerances::default();
    let u = bridge_uncertainty::bridge_uncertainty(
        &member,
        &model,
        &loads,
        &channel,
        &tol,
        QuadratureOrder::default(),
    )
    .unwrap();
    let turn = u
        .gum
        .rows
        .iter()
        .find(|r| r.name == "direction of the gauge carrying arms 1 and 2")
        .expect("one direction row for the pair")
        .contribution;
    let h = 0.05;
    let reading = |deg: f64| {
        let g = pair(deg);
        BridgeModel::new(&setup(&member, &g), &b)
            .unwrap()
            .displayed(&loads)
            .unwrap()
            / s_w
    };
    let slope = (reading(h) - reading(-h)) / (2.0 * h.to_radians());
    assert_relative_eq!(
        turn,
        (slope * tol.misalignment_rad).abs(),
        max_relative = 0.02
    );
    assert!(turn > 0.0);
}
