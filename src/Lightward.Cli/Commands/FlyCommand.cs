using System.ComponentModel;
using System.Globalization;
using Lightward.Host;
using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

public sealed class FlySettings : CommandSettings
{
    [CommandArgument(0, "[scenario]")]
    [Description("Scenario file (TOML) to fly, e.g. scenarios/dock-tessaly.toml. Without one: free flight from home under the Hipparcos sky.")]
    public string? Scenario { get; init; }

    [CommandOption("--frames <N>")]
    [Description("End by itself after N frames.")]
    public string? Frames { get; init; }

    [CommandOption("--seconds <S>")]
    [Description("End by itself after S seconds of loop time (a number, or with a unit: 30 s, 2 min).")]
    public string? Seconds { get; init; }

    [CommandOption("--size <WxH>")]
    [Description("Frame size in pixels. Default 1280x720.")]
    public string? Size { get; init; }

    [CommandOption("--fullscreen")]
    [Description("Fill a monitor (its own resolution); see --monitor.")]
    public bool Fullscreen { get; init; }

    [CommandOption("--monitor <N>")]
    [Description("Monitor for --fullscreen, 0 = primary (a dome projector is often 1). Implies --fullscreen.")]
    public string? Monitor { get; init; }

    [CommandOption("--view <VIEW>")]
    [Description("Starting view: cockpit (default), dome (domemaster) or panorama (equirectangular).")]
    public string? View { get; init; }

    [CommandOption("--fov <ANGLE>")]
    [Description("Horizontal field of view of the cockpit view, 10 to 170 deg. Default 90 deg.")]
    public string? FieldOfView { get; init; }

    [CommandOption("--no-instruments")]
    [Description("Start with the instruments hidden.")]
    public bool NoInstruments { get; init; }

    [CommandOption("--dome-instruments")]
    [Description("Show the instruments on the dome view too (hidden there by default).")]
    public bool DomeInstruments { get; init; }

    [CommandOption("--headless")]
    [Description("Do not open a window: render with a fixed clock and write the last frame as a PNG.")]
    public bool Headless { get; init; }

    [CommandOption("--screenshot <FILE>")]
    [Description("Write the last frame to this PNG when the flight ends.")]
    public string? Screenshot { get; init; }

    [CommandOption("--state-out <FILE>")]
    [Description("Write the final ship state as JSON (seconds and light-seconds).")]
    public string? StateOut { get; init; }

    [CommandOption("--wav <FILE>")]
    [Description("Record the flight's sound to a 16-bit stereo WAV file.")]
    public string? Wav { get; init; }

    [CommandOption("--record <FILE>")]
    [Description("Flight log of a scenario flight, for `lightward replay` and `drill --logs` (default: <scenario>-<UTC time>.flightlog).")]
    public string? Record { get; init; }

    [CommandOption("--no-record")]
    [Description("Fly a scenario without writing a flight log.")]
    public bool NoRecord { get; init; }

    [CommandOption("--keys")]
    [Description("Print the default key bindings (a key file to copy and edit) and exit.")]
    public bool PrintKeys { get; init; }

    [CommandOption("--keys-file <FILE>")]
    [Description("Key bindings (TOML) to use over the defaults; see --keys.")]
    public string? KeysFile { get; init; }

    public const int MinimumSide = 64;
    public static readonly double MinimumFieldOfView = 10 * Math.PI / 180, MaximumFieldOfView = 170 * Math.PI / 180;

    public RunLimits Limits() => new(Frames is null ? null : ParseFrames(Frames), Seconds is null ? null : ParseSeconds(Seconds));

    public (int Width, int Height) FrameSize()
    {
        if (Size is null) return (1280, 720);
        string[] parts = Size.Trim().ToLowerInvariant().Split('x');
        if (parts.Length == 2 && int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out int width)
            && int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out int height)
            && width is >= MinimumSide and <= Camera.MaximumSide && height is >= MinimumSide and <= Camera.MaximumSide)
            return (width, height);
        throw new UserInputException($"--size: '{Size}' is not WIDTHxHEIGHT in pixels with each side from {MinimumSide} to {Camera.MaximumSide} (e.g. 1280x720)");
    }

    public ViewMode StartView() => (View ?? "cockpit").Trim().ToLowerInvariant() switch
    {
        "cockpit" => ViewMode.Cockpit,
        "dome" => ViewMode.Dome,
        "panorama" => ViewMode.Panorama,
        _ => throw new UserInputException($"--view: unknown view '{View}'; expected cockpit, dome or panorama"),
    };

    public double CockpitFieldOfView()
    {
        if (FieldOfView is null) return 90 * Math.PI / 180;
        double angle = Quantity.Parse(FieldOfView, Dimension.Angle, "--fov");
        if (angle < MinimumFieldOfView || angle > MaximumFieldOfView) throw new UserInputException($"--fov: '{FieldOfView}' is outside 10 to 170 deg");
        return angle;
    }

    public int MonitorNumber()
    {
        if (Monitor is null) return 0;
        if (int.TryParse(Monitor, NumberStyles.None, CultureInfo.InvariantCulture, out int monitor) && monitor <= 64) return monitor;
        throw new UserInputException($"--monitor: '{Monitor}' is not a monitor number (0 for the primary monitor, 1 for the next, …)");
    }

    /// <summary>An output file's full path, after checking that its folder exists and its name ends as expected.</summary>
    public static string? OutputPath(string? path, string flag, string extension)
    {
        if (path is null) return null;
        if (path.Trim().Length == 0) throw new UserInputException($"{flag}: empty file name; give a path ending in {extension}");
        if (!path.EndsWith(extension, StringComparison.OrdinalIgnoreCase)) throw new UserInputException($"{flag}: '{path}' must end in {extension}");
        string full = Path.GetFullPath(path);
        if (!Directory.Exists(Path.GetDirectoryName(full))) throw new UserInputException($"{flag}: folder '{Path.GetDirectoryName(full)}' does not exist");
        return full;
    }

    private static long ParseFrames(string text)
    {
        if (long.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out long frames) && frames >= 1) return frames;
        throw new UserInputException($"--frames: '{text}' is not a whole number of frames, 1 or more");
    }

    private static double ParseSeconds(string text)
    {
        double seconds = double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double plain)
            ? plain
            : Quantity.Parse(text, Dimension.Time, "--seconds");
        if (seconds > 0 && double.IsFinite(seconds)) return seconds;
        throw new UserInputException($"--seconds: '{text}' is not a positive duration (e.g. 5 or 2 min)");
    }
}

/// <summary>`lightward fly`: fly the ship in a window, or render headless when there is no display.</summary>
public sealed class FlyCommand : Command<FlySettings>
{
    public override int Execute(CommandContext context, FlySettings settings, CancellationToken cancellationToken)
    {
        if (settings.PrintKeys)
        {
            Console.Write(KeyFile.DefaultText);
            return ErrorReporting.Success;
        }
        // Check every flag and file before the slow work (loading the sky) starts.
        (int width, int height) = settings.FrameSize();
        Scenario? scenario = settings.Scenario is null ? null : ScenarioFile.Load(settings.Scenario);
        if (settings.Record is not null && (settings.NoRecord || scenario is null))
            throw new UserInputException("--record: only for a scenario flight, and not with --no-record");
        InputBindings bindings = settings.KeysFile is null ? KeyFile.Defaults : KeyFile.Load(settings.KeysFile);
        RunLimits limits = settings.Limits();
        ViewMode view = settings.StartView();
        double fieldOfView = settings.CockpitFieldOfView();
        int monitor = settings.MonitorNumber();
        string? screenshot = FlySettings.OutputPath(settings.Screenshot, "--screenshot", ".png");
        string? stateOut = FlySettings.OutputPath(settings.StateOut, "--state-out", ".json");
        string? wav = FlySettings.OutputPath(settings.Wav, "--wav", ".wav");
        Scene scene = scenario is null ? new Scene(StarCatalog.LoadHipparcos()) : ScenarioSetup.SceneOf(scenario);
        // Every scenario flight is logged, as drills are, so an instructor can replay it.
        string? logPath = scenario is null || settings.NoRecord ? null : settings.Record ?? FlightRecorder.DefaultPath(scenario);
        using FlightRecorder? recorder = logPath is null ? null : FlightRecorder.Create(logPath, scenario!, "live");
        FlightSetup setup = scenario is null ? FlightSetup.Demo : ScenarioSetup.From(scenario, recorder);

        var options = new FlightRunOptions(setup, scene, bindings, width, height, limits, view, fieldOfView,
            Instruments: !settings.NoInstruments, InstrumentsOnDome: settings.DomeInstruments, ForceHeadless: settings.Headless,
            Fullscreen: settings.Fullscreen || settings.Monitor is not null, Monitor: monitor,
            ScreenshotPath: screenshot, StatePath: stateOut, WavPath: wav,
            Layers: scenario is null ? [] : [ViewNearField.FromScenario(scenario)]);
        FlightOutcome outcome = FlightRun.Execute(options, note => Console.Error.WriteLine($"lightward: {note}"));
        ShipState ship = outcome.Ship;
        if (recorder is not null && setup.Flight is { } flight)
        {
            recorder.Finish(flight.StateHash(), flight.Verdict?.Success ?? false);
            Console.Error.WriteLine($"lightward: flight log written to {logPath} (replay with `lightward replay {logPath}`)");
        }
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"flew {outcome.Frames} frame{(outcome.Frames == 1 ? "" : "s")} ({(outcome.Windowed ? "window" : "headless")}): ship clock {ship.ShipTime:0.###} s, home clock {ship.HomeTime:0.###} s, rapidity {ship.Velocity.Rapidity:G6}, beta {ship.Velocity.Beta:G6}, task: {outcome.TaskStatus}"));
        return ErrorReporting.Success;
    }
}
