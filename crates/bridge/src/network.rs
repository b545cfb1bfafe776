//! Linear resistive networks solved exactly by modified nodal analysis (MNA).
//!
//! Node 0 is ground. Elements: resistors, independent voltage sources (optionally regulating
//! the voltage between two *other* nodes, as a supply with remote sense does), and independent
//! current sources.

use std::borrow::Cow;

use nalgebra::{DMatrix, DVector};
use thiserror::Error;

/// A node index; 0 is ground.
pub type Node = usize;

/// Why a network could not be solved.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum NetworkError {
    /// A resistance that is zero, negative or not finite.
    #[error("resistor {name} has resistance {ohm} Ω; a resistance must be positive and finite")]
    BadResistance { name: Cow<'static, str>, ohm: f64 },
    /// The equations have no unique solution (a floating node or a loop of sources).
    #[error("the circuit has no unique solution: {0}")]
    Singular(String),
}

/// A resistor between two nodes.
#[derive(Debug, Clone, PartialEq)]
pub struct Resistor {
    /// Name for messages and netlists.
    pub name: Cow<'static, str>,
    /// First node.
    pub a: Node,
    /// Second node.
    pub b: Node,
    /// Resistance, Ω.
    pub ohm: f64,
}

/// A voltage source driving `pos`–`neg`. With `regulate` set to `(p, n)`, its voltage adjusts
/// so that V(p) − V(n) equals `volts` (an ideal supply with sense leads); otherwise
/// V(pos) − V(neg) = `volts`.
#[derive(Debug, Clone, PartialEq)]
pub struct VoltageSource {
    /// Name.
    pub name: Cow<'static, str>,
    /// Positive terminal.
    pub pos: Node,
    /// Negative terminal.
    pub neg: Node,
    /// Set voltage, V.
    pub volts: f64,
    /// Nodes whose difference is held at `volts`, if not the terminals.
    pub regulate: Option<(Node, Node)>,
}

/// A current source pushing `amps` out of `from`, through itself, into `to`
/// (i.e. into node `to` of the external circuit).
#[derive(Debug, Clone, PartialEq)]
pub struct CurrentSource {
    /// Name.
    pub name: Cow<'static, str>,
    /// Node the current is drawn from.
    pub from: Node,
    /// Node the current is delivered to.
    pub to: Node,
    /// Current, A.
    pub amps: f64,
}

/// A resistive network.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Network {
    /// Number of nodes including ground.
    pub node_count: usize,
    /// Node names (index = node), for netlists and messages.
    pub node_names: Vec<Cow<'static, str>>,
    /// Resistors.
    pub resistors: Vec<Resistor>,
    /// Voltage sources.
    pub voltage_sources: Vec<VoltageSource>,
    /// Current sources.
    pub current_sources: Vec<CurrentSource>,
}

/// The solved network.
#[derive(Debug, Clone, PartialEq)]
pub struct Solution {
    /// Node voltages, V (index = node; ground is 0).
    pub node_volts: Vec<f64>,
    /// Current delivered by each voltage source out of its positive terminal, A.
    pub source_amps: Vec<f64>,
}

impl Solution {
    /// Voltage between two nodes, V(a) − V(b).
    pub fn between(&self, a: Node, b: Node) -> f64 {
        self.node_volts.get(a).copied().unwrap_or(0.0)
            - self.node_volts.get(b).copied().unwrap_or(0.0)
    }
}

impl Network {
    /// An empty network with only the ground node.
    pub fn new() -> Self {
        Self {
            node_count: 1,
            node_names: vec![Cow::Borrowed("0")],
            ..Self::default()
        }
    }

    /// Adds a node and returns it.
    pub fn node(&mut self, name: impl Into<Cow<'static, str>>) -> Node {
        self.node_names.push(name.into());
        self.node_count += 1;
        self.node_count - 1
    }

    /// Adds a resistor.
    pub fn resistor(&mut self, name: impl Into<Cow<'static, str>>, a: Node, b: Node, ohm: f64) {
        self.resistors.push(Resistor {
            name: name.into(),
            a,
            b,
            ohm,
        });
    }

    /// Current through the resistor at `index`, from `a` to `b`, A.
    pub fn resistor_amps(&self, solution: &Solution, index: usize) -> f64 {
        self.resistors
            .get(index)
            .map(|r| solution.between(r.a, r.b) / r.ohm)
            .unwrap_or(0.0)
    }

    /// Solves by modified nodal analysis: conductance stamps for resistors, one extra unknown
    /// (its current) and one constraint row per voltage source.
    ///
    /// Source: Ho, Ruehli & Brennan, "The modified nodal approach to network analysis",
    /// IEEE Trans. Circuits and Systems 22(6), 1975.
    pub fn solve(&self) -> Result<Solution, NetworkError> {
        for r in &self.resistors {
            if !(r.ohm.is_finite() && r.ohm > 0.0) {
                return Err(NetworkError::BadResistance {
                    name: r.name.clone(),
                    ohm: r.ohm,
                });
            }
        }
        let n = self.node_count.saturating_sub(1);
        let m = self.voltage_sources.len();
        let size = n + m;
        let mut a = DMatrix::<f64>::zeros(size, size);
        let mut z = DVector::<f64>::zeros(size);
        // Node k > 0 is row k − 1.
        let idx = |node: Node| node.checked_sub(1);
        for r in &self.resistors {
            let g = 1.0 / r.ohm;
            if let Some(i) = idx(r.a) {
                a[(i, i)] += g;
            }
            if let Some(j) = idx(r.b) {
                a[(j, j)] += g;
            }
            if let (Some(i), Some(j)) = (idx(r.a), idx(r.b)) {
                a[(i, j)] -= g;
                a[(j, i)] -= g;
            }
        }
        for s in &self.current_sources {
            if let Some(i) = idx(s.from) {
                z[i] -= s.amps;
            }
            if let Some(j) = idx(s.to) {
                z[j] += s.amps;
            }
        }
        for (k, s) in self.voltage_sources.iter().enumerate() {
            let row = n + k;
            // The source current leaves `pos` into the circuit and returns at `neg`.
            if let Some(i) = idx(s.pos) {
                a[(i, row)] -= 1.0;
            }
            if let Some(j) = idx(s.neg) {
                a[(j, row)] += 1.0;
            }
            let (p, q) = s.regulate.unwrap_or((s.pos, s.neg));
            if let Some(i) = idx(p) {
                a[(row, i)] += 1.0;
            }
            if let Some(j) = idx(q) {
                a[(row, j)] -= 1.0;
            }
            z[row] = s.volts;
        }
        let lu = a.lu();
        let x = lu.solve(&z).ok_or_else(|| {
            NetworkError::Singular("a node is floating or sources form a loop".to_owned())
        })?;
        if x.iter().any(|v| !v.is_finite()) {
            return Err(NetworkError::Singular(
                "the solution is not finite; check for floating parts of the circuit".to_owned(),
            ));
        }
        let mut node_volts = vec![0.0; self.node_count];
        for k in 1..self.node_count {
            node_volts[k] = x[k - 1];
        }
        // MNA's unknown is the current into `pos` from the circuit side; report delivered current.
        let source_amps = (0..m).map(|k| x[n + k]).collect();
        Ok(Solution {
            node_volts,
            source_amps,
        })
    }

    /// A SPICE netlist of the network for an operating-point analysis that prints the named
    /// node voltages with 15 digits. Regulated sources are written as plain sources at their
    /// terminals; the caller rescales (the network is linear).
    pub fn to_spice(&self, title: &str, print: &[(String, Node, Node)]) -> String {
        use std::fmt::Write;
        let name = |n: Node| -> String {
            if n == 0 {
                "0".to_owned()
            } else {
                format!("n{n}")
            }
        };
        let mut out = format!("* {title}\n");
        for (i, r) in self.resistors.iter().enumerate() {
            let _ = writeln!(out, "R{i} {} {} {:.17e}", name(r.a), name(r.b), r.ohm);
        }
        for (i, s) in self.voltage_sources.iter().enumerate() {
            let _ = writeln!(
                out,
                "V{i} {} {} DC {:.17e}",
                name(s.pos),
                name(s.neg),
                s.volts
            );
        }
        for (i, s) in self.current_sources.iter().enumerate() {
            // SPICE: current flows from n+ through the source to n−.
            let _ = writeln!(
                out,
                "I{i} {} {} DC {:.17e}",
                name(s.from),
                name(s.to),
                s.amps
            );
        }
        out.push_str(".control\nset numdgt=15\nop\n");
        for (label, a, b) in print {
            let va = if *a == 0 {
                "0".to_owned()
            } else {
                format!("v({})", name(*a))
            };
            let vb = if *b == 0 {
                "0".to_owned()
            } else {
                format!("v({})", name(*b))
            };
            let _ = writeln!(out, "let {label} = {va} - {vb}");
            let _ = writeln!(out, "print {label}");
        }
        out.push_str(".endc\n.end\n");
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn divider_splits_the_voltage() {
        let mut net = Network::new();
        let top = net.node("top");
        let mid = net.node("mid");
        net.resistor("R1", top, mid, 1000.0);
        net.resistor("R2", mid, 0, 3000.0);
        net.voltage_sources.push(VoltageSource {
            name: "V".into(),
            pos: top,
            neg: 0,
            volts: 4.0,
            regulate: None,
        });
        let s = net.solve().unwrap();
        assert_relative_eq!(s.node_volts[mid], 3.0, max_relative = 1e-14);
        assert_relative_eq!(s.source_amps[0].abs(), 1e-3, max_relative = 1e-14);
    }

    #[test]
    fn floating_node_is_reported_not_panicked() {
        let mut net = Network::new();
        let a = net.node("a");
        let b = net.node("b");
        net.resistor("R1", a, b, 100.0);
        assert!(matches!(net.solve(), Err(NetworkError::Singular(_))));
    }
}
