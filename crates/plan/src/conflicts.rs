//! Conflicts between bridges that no single bridge shows: two bridges on one acquisition
//! channel, one grid wired into two bridges. Each is a warning at the later bridge, naming the
//! earlier one and the way out.

use crate::document::{PlanArm, Project};
use crate::evaluate::{Finding, Severity, Target};

/// Every conflict between the project's bridges.
pub fn bridge_conflicts(project: &Project) -> Vec<Finding> {
    let mut out = Vec::new();
    let mut channels: Vec<(u32, usize, usize)> = Vec::new();
    for (pi, part) in project.parts.iter().enumerate() {
        let mut grids: Vec<(&str, usize, usize)> = Vec::new();
        for (bi, plan) in part.bridges.iter().enumerate() {
            let here = format!("part \"{}\", bridge \"{}\"", part.name, plan.name);
            let target = Target::Bridge {
                part: pi,
                bridge: bi,
            };
            if let Some(&(_, p0, b0)) = channels.iter().find(|(c, _, _)| *c == plan.channel) {
                let other = &project.parts[p0];
                out.push(Finding {
                    severity: Severity::Warn,
                    message: format!(
                        "{here}: channel {} is also the channel of bridge \"{}\" on part \"{}\"; \
                         give each bridge its own channel",
                        plan.channel, other.bridges[b0].name, other.name
                    ),
                    target,
                    marked: String::new(),
                });
            } else {
                channels.push((plan.channel, pi, bi));
            }
            for arm in &plan.arms {
                let PlanArm::Grid { gauge, grid } = arm else {
                    continue;
                };
                match grids.iter().find(|(g, n, _)| g == gauge && n == grid) {
                    Some(&(_, _, b0)) if b0 != bi => out.push(Finding {
                        severity: Severity::Warn,
                        message: format!(
                            "{here}: grid {grid} of gauge {gauge} is also wired into bridge \
                             \"{}\"; a grid can be in one circuit only, so give one of the \
                             bridges another grid",
                            part.bridges[b0].name
                        ),
                        target,
                        marked: String::new(),
                    }),
                    Some(_) => {}
                    None => grids.push((gauge.as_str(), *grid, bi)),
                }
            }
        }
    }
    out
}
