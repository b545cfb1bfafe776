//! Edits of the project's structure: add, duplicate, rename, delete and reorder the items of
//! the plan tree. Each works on a project in place and says why when it cannot apply; the app
//! runs them on a copy and keeps the copy only when they succeed.

use gw_bridge::signal_chain::LowPassFilter;
use gw_bridge::{
    CompletionResistor, Excitation, GaugePattern, InstrumentTemperature, LeadWire, LeadWiring,
    SignalChain, bridge::COPPER_TCR_PER_C,
};
use gw_mechanics::{LoadComponent, SurfacePoint};

use crate::blank::{ModelKind, default_material, first_load_case, new_part};
use crate::document::{
    BridgePlan, PlanArm, PlanGauge, Project, StockGauge, default_gauge_spec, stock_name_for,
};

/// One item of the plan tree.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Item {
    /// The project header (name, revision, people, paper, lead colours).
    Project,
    /// A gauge type of the project's stock.
    Stock(usize),
    /// A part.
    Part(usize),
    /// A load case of a part.
    LoadCase { part: usize, case: usize },
    /// A placed gauge of a part.
    Gauge { part: usize, gauge: usize },
    /// A bridge of a part.
    Bridge { part: usize, bridge: usize },
}

/// The kinds of item that can be added.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ItemKind {
    /// A gauge type in the stock.
    Stock,
    /// A part.
    Part,
    /// A load case.
    LoadCase,
    /// A gauge.
    Gauge,
    /// A bridge.
    Bridge,
}

impl Item {
    /// The part the item belongs to, if any.
    pub fn part(self) -> Option<usize> {
        match self {
            Item::Part(p)
            | Item::LoadCase { part: p, .. }
            | Item::Gauge { part: p, .. }
            | Item::Bridge { part: p, .. } => Some(p),
            Item::Project | Item::Stock(_) => None,
        }
    }

    /// Plain name of the kind, for messages ("gauge", "load case").
    pub fn kind_name(self) -> &'static str {
        match self {
            Item::Project => "project",
            Item::Stock(_) => "gauge type",
            Item::Part(_) => "part",
            Item::LoadCase { .. } => "load case",
            Item::Gauge { .. } => "gauge",
            Item::Bridge { .. } => "bridge",
        }
    }
}

/// The item's name (a gauge's id), or `None` when it does not exist.
pub fn item_name(p: &Project, item: Item) -> Option<String> {
    Some(match item {
        Item::Project => p.name.clone(),
        Item::Stock(k) => p.gauge_stock.get(k)?.name.clone(),
        Item::Part(i) => p.parts.get(i)?.name.clone(),
        Item::LoadCase { part, case } => p.parts.get(part)?.load_cases.get(case)?.name.clone(),
        Item::Gauge { part, gauge } => p.parts.get(part)?.gauges.get(gauge)?.id.clone(),
        Item::Bridge { part, bridge } => p.parts.get(part)?.bridges.get(bridge)?.name.clone(),
    })
}

fn no_part(part: usize) -> String {
    format!("there is no part number {}", part + 1)
}

fn unique(base: &str, taken: &[&str]) -> String {
    (1..)
        .map(|n| format!("{base} {n}"))
        .find(|n| !taken.contains(&n.as_str()))
        .unwrap_or_else(|| base.to_owned())
}

/// Adds a new item of `kind` (to part `part` where it belongs to a part) and returns it.
pub fn add(p: &mut Project, kind: ItemKind, part: usize) -> Result<Item, String> {
    match kind {
        ItemKind::Stock => {
            let spec = default_gauge_spec(GaugePattern::SingleGrid);
            let taken: Vec<&str> = p.gauge_stock.iter().map(|s| s.name.as_str()).collect();
            let name = unique("Gauge type", &taken);
            p.gauge_stock.push(StockGauge { name, spec });
            Ok(Item::Stock(p.gauge_stock.len() - 1))
        }
        ItemKind::Part => {
            let taken: Vec<&str> = p.parts.iter().map(|s| s.name.as_str()).collect();
            let name = unique("Part", &taken);
            let member = ModelKind::Beam.default_member(&default_material());
            let key = gw_mechanics::MATERIAL_LIBRARY
                .first()
                .map(|m| m.key.to_owned());
            p.parts.push(new_part(&name, member, key));
            Ok(Item::Part(p.parts.len() - 1))
        }
        ItemKind::LoadCase => {
            let pt = p.parts.get_mut(part).ok_or_else(|| no_part(part))?;
            let mut case = first_load_case(&pt.member);
            let taken: Vec<&str> = pt.load_cases.iter().map(|c| c.name.as_str()).collect();
            case.name = unique("Load case", &taken);
            pt.load_cases.push(case);
            Ok(Item::LoadCase {
                part,
                case: pt.load_cases.len() - 1,
            })
        }
        ItemKind::Gauge => add_gauge(p, part),
        ItemKind::Bridge => add_bridge(p, part),
    }
}

fn add_gauge(p: &mut Project, part: usize) -> Result<Item, String> {
    let stock = match p.gauge_stock.first() {
        Some(s) => s.name.clone(),
        None => stock_name_for(
            &mut p.gauge_stock,
            &default_gauge_spec(GaugePattern::SingleGrid),
        ),
    };
    let pt = p.parts.get_mut(part).ok_or_else(|| no_part(part))?;
    let faces = pt.member.faces();
    let face = faces
        .first()
        .ok_or_else(|| format!("a {} has no face for gauges", pt.member.kind_name()))?;
    // Mid-way between the middle and the start of the face, on its centre line.
    let x = face.x_range_m.0 + 0.25 * (face.x_range_m.1 - face.x_range_m.0);
    let s = if face.hole_radius_m.is_some() {
        face.s_range_m.0 + 0.25 * (face.s_range_m.1 - face.s_range_m.0)
    } else {
        0.5 * (face.s_range_m.0 + face.s_range_m.1)
    };
    let id = crate::arrangements::next_gauge_id(pt);
    pt.gauges.push(PlanGauge {
        id,
        stock,
        lot: None,
        position: SurfacePoint::new(face.face, x, s),
        angle_rad: 0.0,
    });
    Ok(Item::Gauge {
        part,
        gauge: pt.gauges.len() - 1,
    })
}

/// A completion resistor matching `ohm` (0.05 %, 5 ppm/°C: common practice for bridge
/// completion resistors).
pub fn completion(ohm: f64) -> PlanArm {
    PlanArm::Completion(CompletionResistor {
        ohm,
        tolerance: 0.0005,
        tcr_per_c: 5e-6,
    })
}

fn add_bridge(p: &mut Project, part: usize) -> Result<Item, String> {
    let ohm = p
        .gauge_stock
        .first()
        .map(|s| s.spec.resistance_ohm)
        .unwrap_or(350.0);
    let gauge_factor = p
        .gauge_stock
        .first()
        .map(|s| s.spec.gauge_factor)
        .unwrap_or(2.0);
    let channel = p
        .parts
        .iter()
        .flat_map(|pt| &pt.bridges)
        .map(|b| b.channel)
        .max()
        .unwrap_or(0)
        + 1;
    let pt = p.parts.get_mut(part).ok_or_else(|| no_part(part))?;
    // The first mechanical load of the first case, else the first the part carries.
    let mechanical = |c: &LoadComponent| *c != LoadComponent::TemperatureChange;
    let wanted = pt
        .load_cases
        .first()
        .and_then(|c| c.loads.iter().map(|(c, _)| *c).find(mechanical))
        .or_else(|| pt.member.components().iter().copied().find(mechanical))
        .unwrap_or(LoadComponent::TemperatureChange);
    let taken: Vec<&str> = pt.bridges.iter().map(|b| b.name.as_str()).collect();
    let name = unique("Bridge", &taken);
    pt.bridges.push(BridgePlan {
        name,
        arrangement: String::new(),
        arms: std::array::from_fn(|_| completion(ohm)),
        wiring: LeadWiring::ThreeWire,
        // 0.14 mm² copper: about 0.13 Ω/m (from memory).
        lead: LeadWire {
            length_m: 10.0,
            ohm_per_m: 0.13,
            tcr_per_c: COPPER_TCR_PER_C,
        },
        // 3 V keeps a 350 Ω grid of a few millimetres within its self-heating limit on
        // steel (common practice).
        excitation: Excitation::Voltage { volts: 3.0 },
        amplifier_input_ohm: None,
        gauge_factor_setting: gauge_factor,
        bridge_factor_override: None,
        signal: SignalChain {
            gain: 500.0,
            input_range_v: 10.0,
            adc_bits: 24,
            amplifier_noise_v_per_rt_hz: 10e-9,
            bandwidth_hz: 100.0,
            filter: LowPassFilter::default(),
            excitation_accuracy: 0.001,
            gain_accuracy: 0.001,
        },
        wanted,
        instrument_temperature: InstrumentTemperature::Fixed,
        shunt: None,
        channel,
        required_accuracy: None,
        recovery: Default::default(),
        calibration: None,
    });
    Ok(Item::Bridge {
        part,
        bridge: pt.bridges.len() - 1,
    })
}

/// Adds a copy of the item beside the original and returns the copy.
pub fn duplicate(p: &mut Project, item: Item) -> Result<Item, String> {
    let missing = || format!("the {} to copy does not exist", item.kind_name());
    match item {
        Item::Project => Err("the project itself cannot be copied here; use File → Save as".into()),
        Item::Stock(k) => {
            let mut copy = p.gauge_stock.get(k).ok_or_else(missing)?.clone();
            let taken: Vec<&str> = p.gauge_stock.iter().map(|s| s.name.as_str()).collect();
            copy.name = unique(&format!("{} copy", copy.name), &taken);
            p.gauge_stock.insert(k + 1, copy);
            Ok(Item::Stock(k + 1))
        }
        Item::Part(i) => {
            let mut copy = p.parts.get(i).ok_or_else(missing)?.clone();
            let taken: Vec<&str> = p.parts.iter().map(|s| s.name.as_str()).collect();
            copy.name = unique(&format!("{} copy", copy.name), &taken);
            let top = p
                .parts
                .iter()
                .flat_map(|pt| &pt.bridges)
                .map(|b| b.channel)
                .max();
            for (k, b) in copy.bridges.iter_mut().enumerate() {
                b.channel = top.unwrap_or(0) + 1 + k as u32;
            }
            p.parts.insert(i + 1, copy);
            Ok(Item::Part(i + 1))
        }
        Item::LoadCase { part, case } => {
            let pt = p.parts.get_mut(part).ok_or_else(missing)?;
            let mut copy = pt.load_cases.get(case).ok_or_else(missing)?.clone();
            let taken: Vec<&str> = pt.load_cases.iter().map(|c| c.name.as_str()).collect();
            copy.name = unique(&format!("{} copy", copy.name), &taken);
            pt.load_cases.insert(case + 1, copy);
            Ok(Item::LoadCase {
                part,
                case: case + 1,
            })
        }
        Item::Gauge { part, gauge } => {
            let pt = p.parts.get_mut(part).ok_or_else(missing)?;
            let mut copy = pt.gauges.get(gauge).ok_or_else(missing)?.clone();
            copy.id = crate::arrangements::next_gauge_id(pt);
            // Beside the original along the member axis, where the face allows.
            let mut moved = copy.position;
            moved.x_m += 0.01;
            if pt.member.locate(&moved).is_ok() {
                copy.position = moved;
            }
            pt.gauges.insert(gauge + 1, copy);
            Ok(Item::Gauge {
                part,
                gauge: gauge + 1,
            })
        }
        Item::Bridge { part, bridge } => {
            let channel = p
                .parts
                .iter()
                .flat_map(|pt| &pt.bridges)
                .map(|b| b.channel)
                .max();
            let pt = p.parts.get_mut(part).ok_or_else(missing)?;
            let mut copy = pt.bridges.get(bridge).ok_or_else(missing)?.clone();
            let taken: Vec<&str> = pt.bridges.iter().map(|b| b.name.as_str()).collect();
            copy.name = unique(&format!("{} copy", copy.name), &taken);
            copy.channel = channel.unwrap_or(0) + 1;
            pt.bridges.insert(bridge + 1, copy);
            Ok(Item::Bridge {
                part,
                bridge: bridge + 1,
            })
        }
    }
}

/// Renames an item. A gauge's new id is carried into every bridge arm that uses it; a gauge
/// type's new name into every gauge of that type.
pub fn rename(p: &mut Project, item: Item, name: &str) -> Result<(), String> {
    let name = name.trim();
    if name.is_empty() {
        return Err(format!("a {} needs a name", item.kind_name()));
    }
    let missing = || format!("the {} to rename does not exist", item.kind_name());
    match item {
        Item::Project => p.name = name.to_owned(),
        Item::Stock(k) => {
            let old = p.gauge_stock.get(k).ok_or_else(missing)?.name.clone();
            if p.gauge_stock
                .iter()
                .enumerate()
                .any(|(j, s)| j != k && s.name == name)
            {
                return Err(format!("the stock already has a type named \"{name}\""));
            }
            p.gauge_stock[k].name = name.to_owned();
            for g in p.parts.iter_mut().flat_map(|pt| pt.gauges.iter_mut()) {
                if g.stock == old {
                    g.stock = name.to_owned();
                }
            }
        }
        Item::Part(i) => p.parts.get_mut(i).ok_or_else(missing)?.name = name.to_owned(),
        Item::LoadCase { part, case } => {
            let c = p
                .parts
                .get_mut(part)
                .and_then(|pt| pt.load_cases.get_mut(case))
                .ok_or_else(missing)?;
            c.name = name.to_owned();
        }
        Item::Gauge { part, gauge } => rename_gauge(p, part, gauge, name)?,
        Item::Bridge { part, bridge } => {
            let b = p
                .parts
                .get_mut(part)
                .and_then(|pt| pt.bridges.get_mut(bridge))
                .ok_or_else(missing)?;
            b.name = name.to_owned();
        }
    }
    Ok(())
}

fn rename_gauge(p: &mut Project, part: usize, gauge: usize, id: &str) -> Result<(), String> {
    let pt = p.parts.get_mut(part).ok_or_else(|| no_part(part))?;
    let old = pt
        .gauges
        .get(gauge)
        .ok_or("the gauge to rename does not exist")?
        .id
        .clone();
    if pt
        .gauges
        .iter()
        .enumerate()
        .any(|(j, g)| j != gauge && g.id == id)
    {
        return Err(format!("part \"{}\" already has a gauge \"{id}\"", pt.name));
    }
    pt.gauges[gauge].id = id.to_owned();
    for arm in pt.bridges.iter_mut().flat_map(|b| b.arms.iter_mut()) {
        if let PlanArm::Grid { gauge, .. } | PlanArm::Dummy { gauge, .. } = arm
            && *gauge == old
        {
            *gauge = id.to_owned();
        }
    }
    Ok(())
}

/// Deletes an item. A deleted gauge's arms get a completion resistor of its resistance; a
/// gauge type still in use and a part's last load case are kept, with the reason.
pub fn delete(p: &mut Project, item: Item) -> Result<(), String> {
    let missing = || format!("the {} to delete does not exist", item.kind_name());
    match item {
        Item::Project => return Err("the project itself cannot be deleted".into()),
        Item::Stock(k) => {
            let name = &p.gauge_stock.get(k).ok_or_else(missing)?.name;
            let users: Vec<String> = p
                .parts
                .iter()
                .flat_map(|pt| pt.gauges.iter().filter(|g| &g.stock == name))
                .map(|g| g.id.clone())
                .collect();
            if !users.is_empty() {
                return Err(format!(
                    "gauges {} use \"{name}\"; give them another type first",
                    users.join(", ")
                ));
            }
            p.gauge_stock.remove(k);
        }
        Item::Part(i) => {
            if i >= p.parts.len() {
                return Err(missing());
            }
            p.parts.remove(i);
        }
        Item::LoadCase { part, case } => {
            let pt = p.parts.get_mut(part).ok_or_else(missing)?;
            if case >= pt.load_cases.len() {
                return Err(missing());
            }
            if pt.load_cases.len() == 1 {
                return Err("a part keeps at least one load case; add another first".into());
            }
            pt.load_cases.remove(case);
        }
        Item::Gauge { part, gauge } => {
            let ohm = p
                .parts
                .get(part)
                .and_then(|pt| pt.gauges.get(gauge))
                .and_then(|g| g.resolve(&p.gauge_stock))
                .map(|g| g.spec.resistance_ohm)
                .unwrap_or(350.0);
            let pt = p.parts.get_mut(part).ok_or_else(missing)?;
            if gauge >= pt.gauges.len() {
                return Err(missing());
            }
            let id = pt.gauges.remove(gauge).id;
            for arm in pt.bridges.iter_mut().flat_map(|b| b.arms.iter_mut()) {
                if matches!(arm, PlanArm::Grid { gauge, .. } | PlanArm::Dummy { gauge, .. } if *gauge == id)
                {
                    *arm = completion(ohm);
                }
            }
        }
        Item::Bridge { part, bridge } => {
            let pt = p.parts.get_mut(part).ok_or_else(missing)?;
            if bridge >= pt.bridges.len() {
                return Err(missing());
            }
            pt.bridges.remove(bridge);
        }
    }
    Ok(())
}

/// Moves an item to position `to` among its siblings and returns it at its new place.
pub fn move_to(p: &mut Project, item: Item, to: usize) -> Result<Item, String> {
    fn shift<T>(list: &mut Vec<T>, from: usize, to: usize) -> Result<usize, String> {
        if from >= list.len() {
            return Err("the item to move does not exist".into());
        }
        let to = to.min(list.len() - 1);
        let x = list.remove(from);
        list.insert(to, x);
        Ok(to)
    }
    fn part_mut(p: &mut Project, i: usize) -> Result<&mut crate::document::Part, String> {
        p.parts.get_mut(i).ok_or_else(|| no_part(i))
    }
    Ok(match item {
        Item::Project => return Err("the project has no place to move to".into()),
        Item::Stock(k) => Item::Stock(shift(&mut p.gauge_stock, k, to)?),
        Item::Part(i) => Item::Part(shift(&mut p.parts, i, to)?),
        Item::LoadCase { part, case } => Item::LoadCase {
            part,
            case: shift(&mut part_mut(p, part)?.load_cases, case, to)?,
        },
        Item::Gauge { part, gauge } => Item::Gauge {
            part,
            gauge: shift(&mut part_mut(p, part)?.gauges, gauge, to)?,
        },
        Item::Bridge { part, bridge } => Item::Bridge {
            part,
            bridge: shift(&mut part_mut(p, part)?.bridges, bridge, to)?,
        },
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::demo::demo_project;
    use crate::validate::validate_project;

    #[test]
    fn renaming_a_gauge_follows_it_into_the_bridges() {
        let mut p = demo_project();
        rename(&mut p, Item::Gauge { part: 0, gauge: 0 }, "TOP1").unwrap();
        assert!(
            matches!(&p.parts[0].bridges[0].arms[0], PlanArm::Grid { gauge, .. } if gauge == "TOP1")
        );
        validate_project(&p).unwrap();
        let e = rename(&mut p, Item::Gauge { part: 0, gauge: 1 }, "TOP1").unwrap_err();
        assert!(e.contains("already has a gauge"), "{e}");
    }

    #[test]
    fn a_stock_type_in_use_is_kept_and_a_renamed_one_is_followed() {
        let mut p = demo_project();
        let e = delete(&mut p, Item::Stock(0)).unwrap_err();
        assert!(e.contains("give them another type first"), "{e}");
        rename(&mut p, Item::Stock(0), "Foil 3 mm").unwrap();
        assert_eq!(p.parts[0].gauges[0].stock, "Foil 3 mm");
        validate_project(&p).unwrap();
    }

    #[test]
    fn every_added_and_duplicated_item_leaves_a_valid_project() {
        let mut p = demo_project();
        for kind in [
            ItemKind::Stock,
            ItemKind::Part,
            ItemKind::LoadCase,
            ItemKind::Gauge,
            ItemKind::Bridge,
        ] {
            let item = add(&mut p, kind, 1).unwrap();
            validate_project(&p).unwrap_or_else(|e| panic!("{kind:?}: {e}"));
            duplicate(&mut p, item).unwrap();
            validate_project(&p).unwrap_or_else(|e| panic!("copy of {kind:?}: {e}"));
        }
    }

    #[test]
    fn deleting_a_gauge_puts_a_completion_resistor_in_its_arms_and_moving_keeps_order() {
        let mut p = demo_project();
        delete(&mut p, Item::Gauge { part: 0, gauge: 0 }).unwrap();
        assert!(matches!(
            p.parts[0].bridges[0].arms[0],
            PlanArm::Completion(_)
        ));
        validate_project(&p).unwrap();
        let moved = move_to(&mut p, Item::Part(2), 0).unwrap();
        assert_eq!(moved, Item::Part(0));
        assert_eq!(p.parts[0].name, "Accumulator shell");
        let e = delete(&mut p, Item::LoadCase { part: 0, case: 0 })
            .and_then(|()| delete(&mut p, Item::LoadCase { part: 0, case: 0 }))
            .unwrap_err();
        assert!(e.contains("at least one load case"), "{e}");
    }
}
