using System.ComponentModel;
using System.Globalization;
using Lightward.Audio;
using Lightward.Optics;
using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>
/// `lightward listen`: hear beacons at rest in the home frame as a coasting ship hears them — pulse rate and pitch
/// times the Doppler factor of where each appears — with the engine and alerts; played live or written as WAV.
/// </summary>
public sealed class ListenCommand : Command<ListenCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--beta <SPEED>")]
        [Description("Ship speed along its nose as a fraction of c (0.9) or with a unit (0.9 c, 30000 km/s); negative flies tail first. Excludes --rapidity.")]
        public string? Beta { get; init; }

        [CommandOption("--rapidity <PHI>")]
        [Description("Ship speed along its nose as a rapidity φ (β = tanh φ); negative flies tail first. Excludes --beta.")]
        public string? Rapidity { get; init; }

        [CommandOption("--beacon <BEARING>")]
        [Description("A beacon at rest in the home frame, at this bearing from the nose as measured at home (degrees or '90 deg'; 0 ahead, 180 astern, positive to the right). Repeat for more, up to 16. Default: one ahead and one astern.")]
        public string[]? Beacons { get; init; }

        [CommandOption("--beacon-rate <RATE>")]
        [Description("Pulse rate of every beacon in its own frame, e.g. '2 Hz', '30 /min'. Default 2 Hz.")]
        public string? BeaconRate { get; init; }

        [CommandOption("--beacon-pitch <PITCH>")]
        [Description("Tone of every beacon in its own frame, e.g. '440 Hz', '1.2 kHz'. Default 440 Hz.")]
        public string? BeaconPitch { get; init; }

        [CommandOption("--thrust <FRACTION>")]
        [Description("Main engine level from 0 (off, default) to 1 (full).")]
        public string? Thrust { get; init; }

        [CommandOption("--alert <KIND>")]
        [Description("Sound an alert at the start: time-short, budget-low, limit-broken or task-done. Repeatable.")]
        public string[]? Alerts { get; init; }

        [CommandOption("--length <TIME>")]
        [Description("How long to listen, with a unit ('10 s', '2 min'), up to 3 h. Default 10 s.")]
        public string? Length { get; init; }

        [CommandOption("--fps <RATE>")]
        [Description("Video frame rate the written sound lines up with: 23.976, 24, 25, 29.97, 30 (default), 48, 50, 59.94, 60 or a fraction like 30000/1001. The length is a whole number of frames.")]
        public string? FramesPerSecond { get; init; }

        [CommandOption("--layout <LAYOUT>")]
        [Description("stereo (default) or 5.1 (L R C LFE Ls Rs; written as six mono files name.L.wav … name.Rs.wav).")]
        public string? Layout { get; init; }

        [CommandOption("--bits <BITS>")]
        [Description("Bits per sample of the written WAV: 16 or 24 (default).")]
        public string? Bits { get; init; }

        [CommandOption("--wav <FILE>")]
        [Description("Write 48 kHz WAV to this file instead of playing (written to a temporary name, then renamed).")]
        public string? Wav { get; init; }
    }

    private const int MaximumBeacons = 16;
    private const double MaximumLengthSeconds = 3 * 3600;

    /// <summary>One beacon as the ship hears it.</summary>
    private sealed record Heard(string Name, double HomeBearingDegrees, Vec3 SeenInShipAxes, double Doppler, double RateHz, double PitchHz);

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        if (settings.Wav is not null) WavSoundWriter.ValidatedPath(settings.Wav, "--wav");
        double rapidity = ReadRapidity(settings);
        double properRate = PositiveQuantity(settings.BeaconRate ?? "2 Hz", Dimension.Frequency, "--beacon-rate");
        double properPitch = PositiveQuantity(settings.BeaconPitch ?? "440 Hz", Dimension.Frequency, "--beacon-pitch");
        double thrust = ReadThrust(settings.Thrust);
        AlertKind[] alerts = (settings.Alerts ?? []).Select(ParseAlert).ToArray();
        double seconds = PositiveQuantity(settings.Length ?? "10 s", Dimension.Time, "--length");
        if (seconds > MaximumLengthSeconds) throw new UserInputException($"--length: '{settings.Length}' is longer than the 3 h allowed");
        FrameRate frameRate = FrameRate.Parse(settings.FramesPerSecond ?? "30", "--fps");
        SpeakerLayout layout = ParseLayout(settings.Layout);
        int bits = ParseBits(settings.Bits);
        if (settings.Wav is null && settings.Bits is not null) throw new UserInputException("--bits applies to written files only; add --wav FILE");
        string[] bearings = settings.Beacons is { Length: > 0 } given ? given : ["0", "180"];
        if (bearings.Length > MaximumBeacons) throw new UserInputException($"--beacon: {bearings.Length} beacons given; at most {MaximumBeacons} are allowed");

        List<Heard> heard = Hear(bearings, rapidity, properRate, properPitch);
        var scene = new SoundScene(layout);
        scene.SetEngine(thrust);
        foreach (Heard beacon in heard) scene.SetBeacon(beacon.Name, properRate, properPitch, beacon.Doppler, beacon.SeenInShipAxes);
        foreach (AlertKind alert in alerts) scene.RaiseAlert(alert);
        WriteTable(rapidity, heard);

        if (settings.Wav is not null) WriteFiles(scene, settings.Wav, layout, bits, frameRate, frameRate.FramesIn(seconds), cancellationToken);
        else Play(scene, seconds, cancellationToken);
        return 0;
    }

    private static double ReadRapidity(Settings settings)
    {
        if (settings.Beta is not null && settings.Rapidity is not null)
            throw new UserInputException("--beta and --rapidity both give the speed; use one of them");
        return settings.Rapidity is not null ? ViewSettings.ParseRapidity(settings.Rapidity)
            : settings.Beta is not null ? ViewSettings.ParseBeta(settings.Beta) : 0;
    }

    /// <summary>Each beacon's apparent direction (aberration) and Doppler factor for a ship coasting along its nose (+Z).</summary>
    private static List<Heard> Hear(string[] bearings, double rapidity, double properRate, double properPitch)
    {
        var velocity = new Velocity(Math.Abs(rapidity), rapidity < 0 ? -Vec3.UnitZ : Vec3.UnitZ);
        var heard = new List<Heard>();
        for (int i = 0; i < bearings.Length; i++)
        {
            double bearing = ViewParsing.Degrees(bearings[i], "--beacon");
            double radians = bearing * Math.PI / 180;
            // The ship's axes are the home axes here: it coasts along its nose without turning.
            var home = new Vec3(Math.Sin(radians), 0, Math.Cos(radians));
            double doppler = Doppler.Factor(home, velocity);
            heard.Add(new Heard($"beacon {i + 1}", bearing, Aberration.Apparent(home, velocity), doppler, properRate * doppler, properPitch * doppler));
        }
        return heard;
    }

    private static void WriteTable(double rapidity, List<Heard> heard)
    {
        AnsiConsole.MarkupLine(Invariant($"Ship coasting along its nose at rapidity {rapidity:0.####} (β = {Math.Tanh(rapidity):0.########})"));
        var table = new Table().AddColumns("beacon", "bearing at home", "seen at", "Doppler D", "heard rate", "heard pitch");
        foreach (Heard beacon in heard)
        {
            double seen = Math.Atan2(beacon.SeenInShipAxes.X, beacon.SeenInShipAxes.Z) * 180 / Math.PI;
            string pitch = Invariant($"{beacon.PitchHz:G4} Hz");
            if (Hearing.Weight(beacon.PitchHz) == 0) pitch += beacon.PitchHz < Hearing.LowFadeEndHz ? " (below hearing)" : " (above hearing)";
            table.AddRow(beacon.Name, Invariant($"{beacon.HomeBearingDegrees:0.#}°"), Invariant($"{seen:0.#}°"),
                Invariant($"{beacon.Doppler:G5}"), Invariant($"{beacon.RateHz:G4} Hz"), Markup.Escape(pitch));
        }
        AnsiConsole.Write(table);
    }

    private static void WriteFiles(SoundScene scene, string path, SpeakerLayout layout, int bits, FrameRate frameRate, long frames,
        CancellationToken cancellationToken)
    {
        using var writer = SoundtrackWriter.Create(path, layout, "--wav", bits);
        long samples = OfflineSoundRenderer.RenderFrames(scene, frameRate, frames, _ => { }, writer, cancellationToken);
        writer.Commit();
        string layoutName = layout == SpeakerLayout.Stereo ? "stereo" : "5.1";
        Console.WriteLine(Invariant($"wrote {string.Join(", ", writer.Paths)}: {frames} frames at {frameRate} fps = {samples} samples at 48 kHz, {bits}-bit {layoutName}"));
    }

    private static void Play(SoundScene scene, double seconds, CancellationToken cancellationToken)
    {
        string? fallback = null;
        using var output = LiveSoundOutput.Start(scene, line => fallback = line);
        if (output.IsSilent)
        {
            Console.Error.WriteLine($"lightward: {fallback}; write the sound to a file with --wav FILE instead");
            return;
        }
        Console.WriteLine(Invariant($"playing {seconds:0.###} s through {output.DeviceName}…"));
        cancellationToken.WaitHandle.WaitOne(TimeSpan.FromSeconds(seconds));
        if (output.Underruns > 0) Console.WriteLine(Invariant($"{output.Underruns} underruns (the sound device ran dry)"));
    }

    private static double PositiveQuantity(string text, Dimension dimension, string flag)
    {
        double value = Quantity.Parse(text, dimension, flag);
        if (!(value > 0)) throw new UserInputException($"{flag}: '{text}' must be greater than zero");
        return value;
    }

    private static double ReadThrust(string? text)
    {
        if (text is null) return 0;
        double thrust = ViewParsing.Number(text, "--thrust", "a number from 0 to 1");
        if (thrust is < 0 or > 1) throw new UserInputException($"--thrust: {text} is outside 0…1 (0 = engine off, 1 = full thrust)");
        return thrust;
    }

    private static readonly Dictionary<string, AlertKind> AlertNames = Enum.GetValues<AlertKind>()
        .ToDictionary(kind => string.Concat(kind.ToString().Select((c, i) => char.IsUpper(c) && i > 0 ? $"-{char.ToLowerInvariant(c)}" : $"{char.ToLowerInvariant(c)}")));

    private static AlertKind ParseAlert(string text) =>
        AlertNames.TryGetValue(text.Trim().ToLowerInvariant(), out AlertKind kind)
            ? kind
            : throw new UserInputException($"--alert: unknown alert '{text}'; expected one of {string.Join(", ", AlertNames.Keys)}");

    private static SpeakerLayout ParseLayout(string? text) => (text ?? "stereo").Trim().ToLowerInvariant() switch
    {
        "stereo" => SpeakerLayout.Stereo,
        "5.1" => SpeakerLayout.Surround51,
        _ => throw new UserInputException($"--layout: unknown layout '{text}'; expected stereo or 5.1"),
    };

    private static int ParseBits(string? text) => (text ?? "24").Trim() switch
    {
        "16" => 16,
        "24" => 24,
        _ => throw new UserInputException($"--bits: '{text}' is not supported; expected 16 or 24"),
    };

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
