//! The `gaugewright` binary: the desktop app, and the command line for scripts.

use gw_app::panels::part_view::Preset;
use gw_app::panels::plots::PlotView;
use gw_app::units::Units;
use gw_app::{GaugewrightApp, app::Tab, screenshot, settings::AppPaths};

use std::io::Write;
use std::path::PathBuf;
use std::process::ExitCode;

use clap::builder::{PathBufValueParser, TypedValueParser};
use clap::error::ErrorKind;
use clap::parser::ValueSource;
use clap::{CommandFactory, FromArgMatches, Parser};

/// Plan strain-gauge installations: where gauges go, how bridges are wired, what they will read.
///
/// With no subcommand the desktop app starts, on FILE when one is given.
#[derive(Debug, Parser)]
#[command(
    name = "gaugewright",
    version,
    override_usage = "gaugewright [--view <VIEW>] [--part <N>] [--camera <FROM>] [--screenshot <PATH>] [FILE]\n       \
                      gaugewright <COMMAND>",
    after_help = "Exit status of the subcommands: 0 when nothing fails, 1 when a margin fails or \
                  something could not be computed, 2 when the project file is broken or an \
                  output cannot be written. When the reader of the output stops early (a \
                  closed pipe, as in `| head`), the rest is dropped quietly and the status is \
                  still the command's own."
)]
struct Cli {
    /// Project file (.ron) to open in the desktop app. If it cannot be read, the app starts on
    /// the last project (or the demo) and says why.
    #[arg(
        value_name = "FILE",
        value_parser = PathBufValueParser::new().try_map(project_file)
    )]
    file: Option<PathBuf>,
    /// Anything after FILE. Collected so that a mistyped subcommand (`chek x.ron`) is reported
    /// as such, not as an unexpected `x.ron`; refused once FILE is accepted.
    #[arg(hide = true)]
    more: Vec<std::ffi::OsString>,
    /// Render a few frames, save the window as a PNG at PATH and exit (for documentation and
    /// smoke tests).
    #[arg(long, value_name = "PATH")]
    screenshot: Option<PathBuf>,
    /// Which view to show first.
    #[arg(long, value_name = "VIEW", value_enum, default_value_t = View::Part)]
    view: View,
    /// The direction the part view looks from at first.
    #[arg(long, value_name = "FROM", value_enum, default_value_t = Camera::Isometric)]
    camera: Camera,
    /// Which part to show first, counted from 1 in the plan tree's order.
    #[arg(long, value_name = "N", value_parser = clap::value_parser!(u32).range(1..))]
    part: Option<u32>,
    /// Which results tab to show first (with --view results).
    #[arg(long, value_name = "TAB", value_enum, default_value_t = ResultsTab::Output)]
    results: ResultsTab,
    /// Display units for this run (the remembered choice otherwise).
    #[arg(long, value_name = "SYSTEM", value_enum)]
    units: Option<UnitsArg>,
    #[command(subcommand)]
    command: Option<Command>,
}

/// FILE for the desktop app. A bare word that names no file is taken for a mistyped
/// subcommand (`gaugewright chek x.ron`) and refused, instead of opening a window that can
/// only say the file is missing.
fn project_file(path: PathBuf) -> Result<PathBuf, String> {
    let bare_word = path.extension().is_none() && path.components().count() == 1;
    if bare_word && !path.exists() {
        let names: Vec<String> = Cli::command()
            .get_subcommands()
            .map(|c| c.get_name().to_owned())
            .collect();
        return Err(format!(
            "there is no subcommand or file of that name; the subcommands are {}",
            names.join(", ")
        ));
    }
    Ok(path)
}

/// The results tabs `--results` can open on.
#[derive(Clone, Copy, Debug, clap::ValueEnum)]
enum ResultsTab {
    /// Output against load, with the error against the required accuracy.
    Output,
    /// Apparent strain against the part temperature.
    Temperature,
    /// Utilisation of every limit.
    Margins,
    /// The uncertainty budget.
    Uncertainty,
    /// What cancels what.
    Cancellation,
    /// Check-out and test log against the plan.
    Measured,
}

impl ResultsTab {
    fn plot_view(self) -> PlotView {
        match self {
            ResultsTab::Output => PlotView::Output,
            ResultsTab::Temperature => PlotView::Temperature,
            ResultsTab::Margins => PlotView::Margins,
            ResultsTab::Uncertainty => PlotView::Uncertainty,
            ResultsTab::Cancellation => PlotView::Cancellation,
            ResultsTab::Measured => PlotView::Measured,
        }
    }
}

/// The unit systems `--units` can show.
#[derive(Clone, Copy, Debug, Default, clap::ValueEnum)]
enum UnitsArg {
    /// mm, N, N·m, MPa, °C.
    #[default]
    Si,
    /// in, lbf, lbf·in, psi, °F.
    Us,
}

impl UnitsArg {
    fn units(self) -> Units {
        match self {
            UnitsArg::Si => Units::Si,
            UnitsArg::Us => Units::UsCustomary,
        }
    }
}

/// The views `--view` can open on. Each maps to one tab of the app.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
enum View {
    /// The whole part in 3-D with supports, loads, the colour map and the gauges.
    Part,
    /// One face to scale, where gauges are placed (also accepted as `layout`).
    #[value(alias = "layout")]
    Face,
    /// Bridges: schematic, arms, arrangements, suggestions.
    Bridges,
    /// Plots and tables.
    Results,
    /// Method, assumptions and cautions.
    Help,
}

impl View {
    fn tab(self) -> Tab {
        match self {
            View::Part => Tab::Part,
            View::Face => Tab::Face,
            View::Bridges => Tab::Bridges,
            View::Results => Tab::Results,
            View::Help => Tab::Help,
        }
    }
}

/// Where the part view looks from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
enum Camera {
    /// Front, above and the far end.
    Isometric,
    /// The front face (from −y).
    Front,
    /// From above (+z).
    Top,
    /// The x = L end (from +x).
    End,
}

impl Camera {
    fn preset(self) -> Preset {
        match self {
            Camera::Isometric => Preset::Isometric,
            Camera::Front => Preset::Front,
            Camera::Top => Preset::Top,
            Camera::End => Preset::End,
        }
    }
}

#[derive(Debug, clap::Subcommand)]
enum Command {
    /// Validate a project and print readings, margins and findings (exit status 1 if a margin
    /// fails, 2 if the file is broken).
    Check {
        /// Project file (.ron).
        file: PathBuf,
        /// Units of the printed figures: si (mm, N, N·m, MPa, °C) or us (in, lbf, lbf·in, psi
        /// and ksi, °F). Strain is µε in both.
        #[arg(long, value_name = "SYSTEM", value_enum, default_value_t = UnitsArg::Si)]
        units: UnitsArg,
    },
    /// Print every computed figure: a readable summary per bridge and load case (settings,
    /// mV/V, displayed µε, margins, rejection, noise, uncertainty), or everything as JSON with
    /// --json (exit status 1 if a margin fails, 2 if the file is broken).
    Eval {
        /// Project file (.ron).
        file: PathBuf,
        /// Print every figure as JSON instead of the summary.
        #[arg(long)]
        json: bool,
        /// Include the Monte Carlo uncertainty propagation (slower).
        #[arg(long)]
        monte_carlo: bool,
        /// Units of the summary: si (mm, N, N·m, MPa, °C) or us (in, lbf, lbf·in, psi and ksi,
        /// °F). The JSON of --json is always SI (m, N, N·m, Pa, °C, strain as a ratio).
        #[arg(long, value_name = "SYSTEM", value_enum, default_value_t = UnitsArg::Si)]
        units: UnitsArg,
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
        /// Replace an existing project at the output paths (never the project being read).
        #[arg(long)]
        force: bool,
        /// Units of the sheet and of the channel list's load per mV/V: si (mm, N, N·m, MPa,
        /// °C) or us (in, lbf, lbf·in, psi and ksi, °F). Strain is µε in both.
        #[arg(long, value_name = "SYSTEM", value_enum, default_value_t = UnitsArg::Si)]
        units: UnitsArg,
    },
    /// Reduce a logged test against the plan: zero, shunt span correction, bridge factor,
    /// loads, rosettes, recovered loads and in-place calibration. Writes one row per sample
    /// (or everything as JSON with --json) and prints a summary (exit status 1 if a
    /// calibration cannot be fitted, 2 if a file is broken).
    Reduce {
        /// Project file (.ron).
        plan: PathBuf,
        /// The logged test (CSV: a time column, then one column per channel, units in brackets).
        data: PathBuf,
        /// Result file to write.
        #[arg(short, long)]
        output: PathBuf,
        /// Write the result as JSON instead of CSV.
        #[arg(long)]
        json: bool,
        /// Check-out records (CSV) to use instead of those stored in the project.
        #[arg(long, value_name = "RECORDS")]
        records: Option<PathBuf>,
        /// Where each channel's zero comes from.
        #[arg(long, value_enum, default_value_t = ZeroChoice::Start)]
        zero: ZeroChoice,
        /// Also write the report (PDF): check-out verdicts, measured against predicted per
        /// channel, rosettes and calibration fits.
        #[arg(long, value_name = "PDF")]
        report: Option<PathBuf>,
    },
    /// Compare the technician's check-out records with the plan and print each channel's
    /// verdict with the likely cause of anything off (exit status 1 if a channel fails, 2 if a
    /// file is broken). With --template, write the records file to fill in instead.
    Checkout {
        /// Project file (.ron).
        plan: PathBuf,
        /// Filled-in records (CSV); without it, the records stored in the project.
        records: Option<PathBuf>,
        /// Write the records template (CSV, expected values filled in) to this file.
        #[arg(long, value_name = "OUT")]
        template: Option<PathBuf>,
    },
    /// Write the bundled demo project (or, with --gallery, one part of every model kind and
    /// beam section).
    Demo {
        /// Where to write it.
        out: PathBuf,
        /// Write the model gallery instead of the demo.
        #[arg(long)]
        gallery: bool,
        /// Replace an existing project at OUT (the old one is kept as its .bak).
        #[arg(long)]
        force: bool,
    },
}

/// Where `reduce` takes each channel's zero from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, clap::ValueEnum)]
enum ZeroChoice {
    /// The mean of the first second of the log (the part unloaded when logging starts).
    Start,
    /// The zero recorded at check-out.
    Records,
    /// No zero taken off.
    None,
}

impl ZeroChoice {
    fn zero_from(self) -> gw_reduce::reduction::ZeroFrom {
        use gw_reduce::reduction::ZeroFrom;
        match self {
            ZeroChoice::Start => ZeroFrom::default(),
            ZeroChoice::Records => ZeroFrom::Records,
            ZeroChoice::None => ZeroFrom::None,
        }
    }
}

/// What became of writing a command's output.
enum Delivery {
    /// Everything was written.
    Written,
    /// The reader went away (`| head`); the rest is dropped on purpose.
    ReaderClosed,
    /// Writing failed for another reason (a full disk, say).
    Failed(std::io::Error),
}

fn deliver(mut stream: impl Write, text: &str) -> Delivery {
    match stream
        .write_all(text.as_bytes())
        .and_then(|()| stream.flush())
    {
        Ok(()) => Delivery::Written,
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Delivery::ReaderClosed,
        Err(e) => Delivery::Failed(e),
    }
}

/// Prints a subcommand's output and returns its status. A closed pipe ends the output quietly
/// and keeps the command's own status (the result was computed; the reader chose to stop). Any
/// other write failure is reported on standard error and gives status 2.
fn finish(out: gw_plan::cli::CliOutput) -> ExitCode {
    let code = out.code.clamp(0, 255) as u8;
    if let Delivery::Failed(e) = deliver(std::io::stdout().lock(), &out.stdout) {
        let _ = writeln!(
            std::io::stderr().lock(),
            "error: could not write the output: {e}"
        );
        return ExitCode::from(2);
    }
    // Nowhere is left to report a failure to write the error stream itself.
    let _ = deliver(std::io::stderr().lock(), &out.stderr);
    ExitCode::from(code)
}

/// Parses the command line. A subcommand name always wins over FILE (`gaugewright check x`
/// checks x); the app's own arguments given with a subcommand are refused rather than
/// ignored, with the reason.
fn parse() -> Cli {
    let matches = Cli::command().get_matches();
    let cli = Cli::from_arg_matches(&matches).unwrap_or_else(|e| e.exit());
    if let Some(extra) = cli.more.first() {
        Cli::command()
            .error(
                ErrorKind::UnknownArgument,
                format!(
                    "unexpected argument '{}': the app opens one FILE at a time",
                    extra.to_string_lossy()
                ),
            )
            .exit();
    }
    if let Some(subcommand) = matches.subcommand_name() {
        for (id, shown) in [
            ("file", "a project FILE"),
            ("view", "--view"),
            ("part", "--part"),
            ("camera", "--camera"),
            ("screenshot", "--screenshot"),
            (
                "units",
                "--units before the subcommand (give it after the subcommand's FILE)",
            ),
        ] {
            if matches.value_source(id) == Some(ValueSource::CommandLine) {
                // check, eval and sheet take their own --units, after the subcommand.
                let own = id == "units" && ["check", "eval", "sheet"].contains(&subcommand);
                let message = if own {
                    format!(
                        "--units goes after the subcommand: `gaugewright {subcommand} FILE --units us`"
                    )
                } else {
                    format!("{shown} is for the desktop app and cannot be used with `{subcommand}`")
                };
                Cli::command()
                    .error(ErrorKind::ArgumentConflict, message)
                    .exit();
            }
        }
    }
    cli
}

/// Runs a subcommand and returns its exit status.
fn run_subcommand(command: Command) -> ExitCode {
    match command {
        Command::Check { file, units } => finish(gw_plan::cli::check_in(&file, units.units())),
        Command::Eval {
            file,
            json,
            monte_carlo,
            units,
        } => finish(if json {
            gw_plan::cli::eval_json(&file, monte_carlo)
        } else {
            gw_plan::cli::eval_summary_in(&file, monte_carlo, units.units())
        }),
        Command::Demo {
            out,
            gallery,
            force,
        } => finish(if gallery {
            gw_plan::cli::write_gallery(&out, force)
        } else {
            gw_plan::cli::write_demo(&out, force)
        }),
        Command::Sheet {
            file,
            output,
            csv,
            force,
            units,
        } => finish(gw_plan::cli::sheet_in(
            &file,
            &output,
            csv.as_deref(),
            force,
            units.units(),
        )),
        Command::Reduce {
            plan,
            data,
            output,
            json,
            records,
            zero,
            report,
        } => {
            let format = if json {
                gw_reduce::cli::ReduceFormat::Json
            } else {
                gw_reduce::cli::ReduceFormat::Csv
            };
            let options = gw_reduce::reduction::ReduceOptions {
                zero: zero.zero_from(),
            };
            finish(gw_reduce::cli::reduce_command(
                &gw_reduce::cli::ReduceFiles {
                    plan: &plan,
                    data: &data,
                    out: &output,
                    records: records.as_deref(),
                    report: report.as_deref(),
                },
                format,
                &options,
            ))
        }
        Command::Checkout {
            plan,
            records,
            template,
        } => finish(gw_reduce::cli::checkout(
            &plan,
            records.as_deref(),
            template.as_deref(),
        )),
    }
}

fn main() -> ExitCode {
    let cli = parse();
    if let Some(command) = cli.command {
        return run_subcommand(command);
    }
    let options = eframe::NativeOptions {
        viewport: egui::ViewportBuilder::default()
            .with_title("Gaugewright")
            .with_inner_size([1280.0, 800.0])
            .with_min_inner_size([800.0, 500.0]),
        ..Default::default()
    };
    let tab = cli.view.tab();
    let part = cli.part.map(|n| n as usize - 1);
    let preset = cli.camera.preset();
    let results = cli.results.plot_view();
    let units = cli.units.map(UnitsArg::units);
    let file = cli.file;
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
            if let Some(path) = &file {
                app.open_path(path);
            }
            app.tab = tab;
            app.show_results(results);
            if let Some(u) = units {
                app.show_units(u);
            }
            app.look_from(preset);
            if let Some(part) = part {
                app.show_part(part);
            }
            Ok(Box::new(app))
        }),
    );
    if let Err(e) = result {
        eprintln!("error: could not open the Gaugewright window: {e}");
        return ExitCode::from(1);
    }
    if let Some(o) = &outcome {
        let over = o.view_overflow();
        if over > 2.0 {
            eprintln!(
                "layout: the view's content runs {over:.0} points past an edge of its panel; \
                 the screenshot shows it cut off"
            );
        }
    }
    match outcome.map(|o| o.take()) {
        Some(Some(Err(message))) => {
            eprintln!("error: {message}");
            ExitCode::from(1)
        }
        Some(None) => {
            eprintln!("error: the window closed before the screenshot was taken");
            ExitCode::from(1)
        }
        _ => ExitCode::SUCCESS,
    }
}
