using System.ComponentModel;
using System.Globalization;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Files;
using Lightward.Spacetime;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>`lightward render`: one frame of the view from the ship, written as a PNG without opening a window.</summary>
public sealed class RenderCommand : Command<RenderCommand.Settings>
{
    public sealed class Settings : ViewSettings
    {
        [CommandOption("--projection <KIND>")]
        [Description("Image shape: perspective (default), dome (square fulldome master, front at the bottom) or equirect (full sphere, 2:1).")]
        public string? Projection { get; init; }

        [CommandOption("--size <WxH>")]
        [Description("Image size in pixels, each side 1 to 16384. Defaults: 1920x1080, dome 2048x2048, equirect 4096x2048.")]
        public string? Size { get; init; }

        [CommandOption("--look <DIRECTION>")]
        [Description("Where the camera looks in ship axes: forward (default), aft, left, right, up, down, or 'azimuth,elevation' in degrees (azimuth from the nose toward the right).")]
        public string? Look { get; init; }

        [CommandOption("--fov <ANGLE>")]
        [Description("Perspective: horizontal field of view, degrees (default 90, below 180). Dome: aperture of the disc (default 180, up to 360).")]
        public string? FieldOfView { get; init; }

        [CommandOption("--tilt <ANGLE>")]
        [Description("Dome only: how far the dome's zenith leans from the ship's up toward the front, 0 to 90 degrees (default 0).")]
        public string? Tilt { get; init; }

        [CommandOption("--exposure <EXPOSURE>")]
        [Description("auto (metered, default), auto+N / auto-N (metered plus N stops), or a fixed exposure in stops (e.g. 7): display = HDR × 2^stops, where a V = 0 star sums to 1.")]
        public string? Exposure { get; init; }

        [CommandOption("--no-background")]
        [Description("Leave out the cosmic microwave background glow.")]
        public bool NoBackground { get; init; }

        [CommandOption("--threads <COUNT>")]
        [Description("Threads to render with (the image is the same for any count). Default: all cores.")]
        public string? Threads { get; init; }

        [CommandOption("--grid <SPACING>")]
        [Description("Without a scenario: draw the grid of space at rest in the home frame, lines this far apart (e.g. 2 ls), out to ten spacings. A scenario brings its own grid.")]
        public string? Grid { get; init; }

        [CommandOption("--out <FILE>")]
        [Description("PNG file to write (written to a temporary name, then renamed). Default frame.png.")]
        public string? Out { get; init; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        Camera camera = ViewCamera.FromFlags(settings.Projection, settings.Size, settings.FieldOfView, settings.Tilt, settings.Exposure);
        int threads = settings.Threads is null ? -1 : ParseThreads(settings.Threads);
        string output = ViewOutput.CheckWritable(settings.Out ?? "frame.png", "--out");
        ViewState view = settings.Resolve();
        NearFieldLayer? nearField = NearFieldOf(settings);
        Rotation look = nearField?.LookAt(settings.Look, view.Ship) ?? ViewCamera.ParseLook(settings.Look);

        var renderer = new FrameRenderer(threads);
        if (nearField is not null)
        {
            renderer.Layers.Add(nearField);
            renderer.Overlays.Add(new ClockMarkers(nearField));
        }
        RgbaImage image = renderer.Render(new Scene(view.Sky, !settings.NoBackground), new Observer(view.Ship, look), camera);
        PngWriter.Write(image, output);
        Console.WriteLine(FormattableString.Invariant(
            $"wrote {output} ({camera.Width}x{camera.Height} {camera.Kind.ToString().ToLowerInvariant()}, rapidity {view.Ship.Velocity.Rapidity:G6}, exposure {renderer.LastExposureStops:F2} stops)"));
        return 0;
    }

    /// <summary>The scenario's bodies and grid, or a home-frame grid from --grid, or nothing.</summary>
    private static NearFieldLayer? NearFieldOf(Settings settings)
    {
        if (settings.ScenarioPath is not null)
        {
            if (settings.Grid is not null) throw new UserInputException("--grid: a scenario brings its own grid (its [grid] section); leave out --grid");
            return ViewNearField.FromScenario(ScenarioFile.Load(settings.ScenarioPath));
        }
        if (settings.Grid is null) return null;
        double spacing = Quantity.Parse(settings.Grid, Dimension.Length, "--grid");
        if (!(spacing > 0)) throw new UserInputException($"--grid: '{settings.Grid}' must be a positive length (e.g. 2 ls or 500000 km)");
        return ViewNearField.HomeGrid(spacing);
    }

    private static int ParseThreads(string text)
    {
        if (int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int threads) && threads >= 1 && threads <= 1024) return threads;
        throw new UserInputException($"--threads: '{text}' is not a whole number from 1 to 1024");
    }
}
