using System.ComponentModel;
using System.Globalization;
using Lightward.Host;
using Lightward.Host.Input;
using Lightward.Host.Shows;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>
/// `lightward show`: runs a show live in two windows. The dome output window (full screen on a chosen monitor for the
/// projector) shows the show; the operator window shows the cue list with the current cue and the one standing by, the
/// show, ship and home clocks and a small preview of the dome, and takes the keys go, hold, back and manual control.
/// When the show ends, one line says where it stood.
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

        [CommandOption("--operator-screenshot <FILE>")]
        [Description("When the show ends, write the operator window as it was last shown to this PNG.")]
        public string? OperatorScreenshot { get; init; }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        ShowScript script = ShowScriptReader.Load(settings.Show);
        int size = ParseSize(settings.Size);
        Camera camera = ViewCamera.FromFlags("dome", $"{size}x{size}", null, settings.Tilt, null);
        string? screenshot = settings.OperatorScreenshot is null ? null : ViewOutput.CheckWritable(settings.OperatorScreenshot, "--operator-screenshot");
        const string offline = "render the show offline with 'lightward render-show'";
        if (!WindowHost.TryOpen(new WindowOptions(size, size, $"Lightward dome: {script.Title}", settings.Fullscreen, settings.Monitor), KeyFile.Defaults, out WindowHost? dome, out string? problem))
            throw new UserInputException($"show: cannot open the dome window: {problem}; {offline}");
        using (dome)
        {
            if (!OperatorWindow.TryOpen(script.Title, out OperatorWindow? operatorWindow, out problem))
                throw new UserInputException($"show: cannot open the operator window: {problem}; {offline}");
            using (operatorWindow)
            {
                operatorWindow!.CapturePresented = screenshot is not null;
                var live = new LiveShow(script, new Scene(StarCatalog.LoadHipparcos()), RenderShowCommand.SceneNearField(script),
                    new ShowRenderSettings(camera, Audio.FrameRate.Named["60"], false, false));
                live.Run(dome!, operatorWindow, cancellationToken);
                if (screenshot is not null && operatorWindow.PresentedScreen() is { } shown)
                    UserFiles.WriteAtomically(screenshot, stream => PngWriter.Encode(shown, stream));
                Console.WriteLine(WhereTheShowStood(live.Operator));
            }
        }
        return ErrorReporting.Success;
    }

    /// <summary>One line: the show clock, the current cue and the one standing by.</summary>
    private static string WhereTheShowStood(ShowOperator show)
    {
        IReadOnlyList<ShowCue> cues = show.Script.Cues;
        string Cue(int index) => $"cue {cues[index].Number} of {cues.Count} \"{cues[index].Label}\"";
        string current = show.CurrentCue >= 0 ? $"{Cue(show.CurrentCue)} current" : "before the first cue";
        string standby = show.StandbyCue >= 0 ? $"{Cue(show.StandbyCue)} standing by" : "no cue standing by";
        return $"show ended at {OperatorScreen.Clock(show.ShowTime)} of {OperatorScreen.Clock(show.Script.Length)}: {current}, {standby}";
    }

    private static int ParseSize(string? text)
    {
        if (text is null) return 768;
        if (int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int size) && size is >= 64 and <= 8192) return size;
        throw new UserInputException($"--size: '{text}' is not a whole number of pixels from 64 to 8192");
    }
}
