//! The `gaugewright` binary: the desktop app.

use gw_app::{GaugewrightApp, screenshot, settings::AppPaths};

use std::path::PathBuf;

use clap::Parser;

/// Plan strain-gauge installations: where gauges go, how bridges are wired, what they will read.
#[derive(Debug, Parser)]
#[command(name = "gaugewright", version)]
struct Cli {
    /// Render a few frames, save the window as a PNG at PATH and exit (for documentation and
    /// smoke tests).
    #[arg(long, value_name = "PATH")]
    screenshot: Option<PathBuf>,
    /// Which view to show first: layout, bridges, results or help.
    #[arg(long, value_name = "VIEW", default_value = "layout")]
    view: String,
    /// With no subcommand the desktop app starts.
    #[command(subcommand)]
    command: Option<Command>,
}

#[derive(Debug, clap::Subcommand)]
enum Command {
    /// Validate a project and print margins and warnings (exit status 1 if a margin fails,
    /// 2 if the file is broken).
    Check {
        /// Project file (.ron).
        file: PathBuf,
    },
    /// Print every computed figure.
    Eval {
        /// Project file (.ron).
        file: PathBuf,
        /// Print JSON (the only format so far).
        #[arg(long)]
        json: bool,
        /// Include the Monte Carlo uncertainty propagation (slower).
        #[arg(long)]
        monte_carlo: bool,
    },
    /// Write the build sheet (PDF) and optionally the acquisition channel list (CSV).
    Sheet {
        /// Project file (.ron).
        file: PathBuf,
        /// PDF to write.
        #[arg(short, long)]
        output: PathBuf,
        /// CSV channel list to write.
        #[arg(long)]
        csv: Option<PathBuf>,
    },
    /// Write the bundled demo project.
    Demo {
        /// Where to write it.
        out: PathBuf,
    },
}

fn finish(out: gw_plan::cli::CliOutput) -> std::process::ExitCode {
    print!("{}", out.stdout);
    eprint!("{}", out.stderr);
    std::process::ExitCode::from(out.code.clamp(0, 255) as u8)
}

fn main() -> std::process::ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Some(Command::Check { file }) => return finish(gw_plan::cli::check(&file)),
        Some(Command::Eval {
            file,
            json: _,
            monte_carlo,
        }) => {
            return finish(gw_plan::cli::eval_json(&file, monte_carlo));
        }
        Some(Command::Demo { out }) => return finish(gw_plan::cli::write_demo(&out)),
        Some(Command::Sheet { file, output, csv }) => {
            return finish(gw_plan::cli::sheet(&file, &output, csv.as_deref()));
        }
        None => {}
    }
    let options = eframe::NativeOptions {
        viewport: egui::ViewportBuilder::default()
            .with_title("Gaugewright")
            .with_inner_size([1280.0, 800.0])
            .with_min_inner_size([800.0, 500.0]),
        ..Default::default()
    };
    let view = cli.view.clone();
    let screenshot = cli.screenshot.map(screenshot::ScreenshotRequest::new);
    let outcome = screenshot.as_ref().map(|r| r.outcome());
    let result = eframe::run_native(
        "Gaugewright",
        options,
        Box::new(move |_cc| {
            let paths = if screenshot.is_some() {
                AppPaths::default()
            } else {
                AppPaths::user()
            };
            let mut app = GaugewrightApp::new(paths, screenshot);
            app.tab = match view.as_str() {
                "bridges" => gw_app::app::Tab::Bridges,
                "results" => gw_app::app::Tab::Results,
                "help" => gw_app::app::Tab::Help,
                _ => gw_app::app::Tab::Layout,
            };
            Ok(Box::new(app))
        }),
    );
    if let Err(e) = result {
        eprintln!("error: could not open the Gaugewright window: {e}");
        return std::process::ExitCode::from(1);
    }
    match outcome.map(|o| o.take()) {
        Some(Some(Err(message))) => {
            eprintln!("error: {message}");
            std::process::ExitCode::from(1)
        }
        Some(None) => {
            eprintln!("error: the window closed before the screenshot was taken");
            std::process::ExitCode::from(1)
        }
        _ => std::process::ExitCode::SUCCESS,
    }
}
