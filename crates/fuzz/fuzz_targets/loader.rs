//! Any bytes given to the project loader give a project or an error — never a panic — and a
//! project that loads evaluates without panicking.
#![no_main]

use gw_plan::evaluate::{EvalOptions, UncertaintyDepth, evaluate};
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else {
        return;
    };
    if let Ok(project) = gw_plan::project_from_str(text) {
        let options = EvalOptions {
            uncertainty: UncertaintyDepth::Off,
            peak_samples: 4,
            temperature_steps: 2,
            ..EvalOptions::default()
        };
        let _ = evaluate(&project, &options);
    }
});
