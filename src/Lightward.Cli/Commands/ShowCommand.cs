using System.ComponentModel;
using System.Globalization;
using Lightward.Host;
using Lightward.Host.Input;
using Lightward.Host.Shows;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;
using Spectre.Console.Rendering;

namespace Lightward.Cli.Commands;

/// <summary>
/// `lightward show`: runs a show live. The dome output is a window (full screen on a chosen monitor for the projector);
/// the operator console runs in the terminal: a small preview of the dome, the cue list with the current cue and the one
/// standing by, the show, ship and home clocks, and the keys go, hold, back and manual control.
/// </summary>
public sealed class ShowCommand : Command<ShowCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<SHOW>")]
        [Description("The show script (.show.toml).")]
        public string Show { get; init; } = "";

        [CommandOption("--size <N>")]
        [Description("Dome output: a square dome master of N pixels (default 768; 64 to 8192). With --fullscreen the monitor's size is used.")]
        public string? Size { get; init; }

        [CommandOption("--tilt <ANGLE>")]
        [Description("Camera pitch for a tilted dome, degrees the zenith leans toward the front, 0 to 90 (default 0; 15 is the customary nominal for tilted domes).")]
        public string? Tilt { get; init; }

        [CommandOption("--fullscreen")]
        [Description("Show the dome output full screen (for the projector).")]
        public bool Fullscreen { get; init; }

        [CommandOption("--monitor <INDEX>")]
        [Description("With --fullscreen: which monitor, 0 (default) upward.")]
        public int Monitor { get; init; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        ShowScript script = ShowScriptReader.Load(settings.Show);
        int size = ParseSize(settings.Size);
        Camera camera = ViewCamera.FromFlags("dome", $"{size}x{size}", null, settings.Tilt, null);
        if (Console.IsInputRedirected)
            throw new UserInputException("show: the operator console needs a terminal for its keys (standard input is redirected); render the show offline with 'lightward render-show'");
        if (!WindowHost.TryOpen(new WindowOptions(size, size, $"Lightward dome: {script.Title}", settings.Fullscreen, settings.Monitor), KeyFile.Defaults, out WindowHost? dome, out string? problem))
            throw new UserInputException($"show: cannot open the dome window: {problem}; render the show offline with 'lightward render-show'");

        using (dome)
        {
            var live = new LiveShow(script, new Scene(StarCatalog.LoadHipparcos()), RenderShowCommand.SceneNearField(script), new ShowRenderSettings(camera, Audio.FrameRate.Named["60"], false, false));
            DateTime lastDrawn = DateTime.MinValue;
            AnsiConsole.Live(OperatorPanel(live, null, null)).Start(display => live.Run(dome!, ReadCommand, (moment, picture) =>
            {
                if ((DateTime.UtcNow - lastDrawn).TotalSeconds < 0.2) return;
                lastDrawn = DateTime.UtcNow;
                display.UpdateTarget(OperatorPanel(live, moment, picture));
            }, cancellationToken));
        }
        return ErrorReporting.Success;
    }

    /// <summary>Space or G: go. H: hold / resume. B or Backspace: back. M: manual control. Q or Escape: end the show.</summary>
    private static OperatorCommand? ReadCommand()
    {
        if (!Console.KeyAvailable) return null;
        return Console.ReadKey(intercept: true).Key switch
        {
            ConsoleKey.Spacebar or ConsoleKey.G => OperatorCommand.Go,
            ConsoleKey.H => OperatorCommand.Hold,
            ConsoleKey.B or ConsoleKey.Backspace => OperatorCommand.Back,
            ConsoleKey.M => OperatorCommand.ManualControl,
            ConsoleKey.Q or ConsoleKey.Escape => OperatorCommand.End,
            _ => ReadCommand(),
        };
    }

    private static IRenderable OperatorPanel(LiveShow live, ShowMoment? moment, RgbaImage? picture)
    {
        ShowOperator show = live.Operator;
        var cues = new Table().Border(TableBorder.Rounded).AddColumns("", "cue", "at", "label", "changes");
        int first = Math.Max(0, show.CurrentCue - 3);
        for (int i = first; i < Math.Min(show.Script.Cues.Count, first + 10); i++)
        {
            ShowCue cue = show.Script.Cues[i];
            string state = i == show.CurrentCue ? "[green]now[/]" : i == show.StandbyCue ? "[yellow]standby[/]" : "";
            cues.AddRow(state, cue.Number.ToString(CultureInfo.InvariantCulture), Clock(cue.At), Markup.Escape(cue.Label), Markup.Escape(Changes(cue)));
        }
        string mode = show.WaitingForGo ? "[yellow]waiting for go[/]" : show.Held ? "[red]hold[/]" : show.Finished ? "end of show" : "[green]running[/]";
        if (show.ManualControl) mode += " · [aqua]manual control[/] (drag in the dome window)";
        if (live.SoundStatus.Length > 0) mode += $" · sound {Markup.Escape(live.SoundStatus)}";
        string clocks = moment is { } m
            ? $"show {Clock(show.ShowTime)} / {Clock(show.Script.Length)}   ship {Span(m.Ship.ShipTime)}   home {Span(m.Ship.HomeTime)}   rapidity {m.Ship.Velocity.Rapidity:0.000}   x{m.TimeCompression:G3}"
            : $"show {Clock(show.ShowTime)} / {Clock(show.Script.Length)}";
        IRenderable cueList = picture is null ? cues : new Columns(Preview(picture), cues);
        return new Rows(
            new Markup($"[bold]{Markup.Escape(show.Script.Title)}[/]   {mode}"),
            new Text(clocks),
            cueList,
            new Markup("[grey]space/G go · H hold/resume · B back · M manual control · Q end[/]"));
    }

    /// <summary>The dome picture shrunk to a few dozen terminal cells (each cell the mean of its block of pixels).</summary>
    private static Canvas Preview(RgbaImage picture)
    {
        const int cells = 24;
        var canvas = new Canvas(cells, cells);
        for (int row = 0; row < cells; row++)
            for (int column = 0; column < cells; column++)
            {
                int x0 = column * picture.Width / cells, x1 = Math.Max(x0 + 1, (column + 1) * picture.Width / cells);
                int y0 = row * picture.Height / cells, y1 = Math.Max(y0 + 1, (row + 1) * picture.Height / cells);
                long r = 0, g = 0, b = 0;
                for (int y = y0; y < y1; y++)
                    for (int x = x0; x < x1; x++)
                    {
                        (byte pr, byte pg, byte pb) = picture[x, y];
                        r += pr; g += pg; b += pb;
                    }
                long count = (long)(x1 - x0) * (y1 - y0);
                canvas.SetPixel(column, row, new Color((byte)(r / count), (byte)(g / count), (byte)(b / count)));
            }
        return canvas;
    }

    private static string Changes(ShowCue cue) => string.Join(", ", new[]
    {
        cue.Hold ? "hold" : null, cue.Rapidity is not null ? "speed" : null, cue.TimeCompression is not null ? "time" : null,
        cue.Look is not null ? "look" : null, cue.FieldOfView is not null ? "field" : null, cue.Fade is not null ? "fade" : null,
        cue.Grid is not null ? "grid" : null, cue.Bodies is not null ? "bodies" : null, cue.Instruments is not null ? "instruments" : null,
        cue.Sound is not null ? "sound" : null, cue.Caption is not null ? "caption" : null,
    }.Where(c => c is not null));

    private static string Clock(double seconds) => string.Create(CultureInfo.InvariantCulture, $"{(int)(seconds / 60)}:{seconds % 60:00.0}");

    /// <summary>A long time in the unit that reads best.</summary>
    private static string Span(double seconds) => Math.Abs(seconds) switch
    {
        < 120 => string.Create(CultureInfo.InvariantCulture, $"{seconds:0.0} s"),
        < 2 * Units.Day => string.Create(CultureInfo.InvariantCulture, $"{seconds / 3600:0.00} h"),
        < 2 * Units.JulianYear => string.Create(CultureInfo.InvariantCulture, $"{seconds / Units.Day:0.00} d"),
        _ => string.Create(CultureInfo.InvariantCulture, $"{seconds / Units.JulianYear:0.000} yr"),
    };

    private static int ParseSize(string? text)
    {
        if (text is null) return 768;
        if (int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int size) && size is >= 64 and <= 8192) return size;
        throw new UserInputException($"--size: '{text}' is not a whole number of pixels from 64 to 8192");
    }
}
