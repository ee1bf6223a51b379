using System.Text.Json;
using Lightward.Audio;
using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Rendering;
using Lightward.Rendering.Instruments;
using Lightward.Spacetime;

namespace Lightward.Host;

/// <summary>Everything <c>lightward fly</c> was asked for, already validated; <c>Layers</c> are the scene's bodies and grid.</summary>
public sealed record FlightRunOptions(
    FlightSetup Setup,
    Scene Scene,
    InputBindings Bindings,
    int Width,
    int Height,
    RunLimits Limits,
    ViewMode View = ViewMode.Cockpit,
    double CockpitFieldOfView = 90 * Math.PI / 180,
    bool Instruments = true,
    bool InstrumentsOnDome = false,
    bool ForceHeadless = false,
    bool Fullscreen = false,
    int Monitor = 0,
    string? ScreenshotPath = null,
    string? StatePath = null,
    string? WavPath = null,
    IReadOnlyList<IFrameLayer>? Layers = null);

/// <summary>How a flight ended.</summary>
public sealed record FlightOutcome(bool Windowed, long Frames, ShipState Ship, double Throttle, double RapiditySpent, string TaskStatus, string? ScreenshotPath);

/// <summary>
/// Runs a flight: in a window when a display and GLFW are there, otherwise headless with a PNG of the last frame.
/// Wires the renderer, the instruments and the sound into the frame loop.
/// </summary>
public static class FlightRun
{
    /// <summary>Frames a headless fallback renders when no --frames or --seconds was given: one still.</summary>
    public const long DefaultHeadlessFrames = 1;
    public const double HeadlessFramesPerSecond = 60;
    public const string DefaultHeadlessPicture = "lightward-fly.png";

    /// <param name="say">Receives one-line notes for the user (fallbacks, files written).</param>
    public static FlightOutcome Execute(FlightRunOptions options, Action<string> say)
    {
        var session = new FlightSession(options.Setup, instrumentsOnDome: options.InstrumentsOnDome)
        {
            Mode = options.View,
            Instruments = options.Instruments,
        };
        WindowHost? window = null;
        if (!options.ForceHeadless && !WindowHost.TryOpen(new WindowOptions(options.Width, options.Height, $"Lightward — {options.Setup.Name}", options.Fullscreen, options.Monitor),
                options.Bindings, out window, out string? problem))
        {
            string picture = Path.GetFullPath(options.ScreenshotPath ?? DefaultHeadlessPicture);
            say($"no window: {problem}; to fly in a window run `{WindowHost.InstallHint}` on a machine with a display. Rendering headless to {picture} instead.");
            options = options with { ScreenshotPath = picture };
        }
        bool windowed = window is not null;
        IFrameHost host = (IFrameHost?)window ?? new HeadlessHost(options.Width, options.Height, HeadlessFramesPerSecond);
        RunLimits limits = windowed || options.Limits != RunLimits.Unlimited ? options.Limits : new RunLimits(Frames: DefaultHeadlessFrames);

        using var instruments = new InstrumentOverlay();
        var frameRenderer = new FrameRenderer();
        frameRenderer.Layers.AddRange(options.Layers ?? []);
        var renderer = new FrameComposer(new SkyRenderer(options.Scene, frameRenderer, options.CockpitFieldOfView), instruments);
        using WavSoundWriter? wav = options.WavPath is null ? null : WavSoundWriter.CreateStereoCapture(options.WavPath, "--wav");
        var scene = new SoundScene();
        LiveSoundOutput? live = windowed ? LiveSoundOutput.Start(scene, say, wav) : null;
        FrameLoop loop;
        try
        {
            using (host)
            {
                loop = new FrameLoop(host, session, renderer, new FlightSound(scene, windowed ? null : wav));
                loop.Run(limits);
            }
        }
        finally
        {
            live?.Dispose();
        }
        wav?.Commit();
        if (options.WavPath is not null) say($"sound written to {Path.GetFullPath(options.WavPath)}");
        if (options.ScreenshotPath is not null)
        {
            PngWriter.Write(loop.Frame, options.ScreenshotPath);
            say($"last frame written to {Path.GetFullPath(options.ScreenshotPath)}");
        }
        var outcome = new FlightOutcome(windowed, loop.FramesShown, session.Loop.Current, session.Pilot.Throttle, session.Loop.RapiditySpent,
            session.Setup.Task?.Status ?? "free flight", options.ScreenshotPath);
        if (options.StatePath is not null) WriteState(outcome, options.StatePath);
        return outcome;
    }

    /// <summary>The final state as JSON (c = 1 units: seconds and light-seconds), written to a temporary name first.</summary>
    public static void WriteState(FlightOutcome outcome, string path)
    {
        ShipState ship = outcome.Ship;
        Vec3 forward = ship.Forward, direction = ship.Velocity.Direction;
        var state = new
        {
            frames = outcome.Frames,
            windowed = outcome.Windowed,
            ship_time_s = ship.ShipTime,
            home_time_s = ship.HomeTime,
            position_ls = new[] { ship.Position.X, ship.Position.Y, ship.Position.Z },
            rapidity = ship.Velocity.Rapidity,
            beta = ship.Velocity.Beta,
            velocity_direction = new[] { direction.X, direction.Y, direction.Z },
            forward = new[] { forward.X, forward.Y, forward.Z },
            throttle = outcome.Throttle,
            rapidity_spent = outcome.RapiditySpent,
            task = outcome.TaskStatus,
        };
        string full = Path.GetFullPath(path);
        string temporary = Path.Combine(Path.GetDirectoryName(full)!, $".{Path.GetFileName(full)}.{Environment.ProcessId}.tmp");
        File.WriteAllText(temporary, JsonSerializer.Serialize(state, new JsonSerializerOptions { WriteIndented = true }));
        File.Move(temporary, full, overwrite: true);
    }
}
