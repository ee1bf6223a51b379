using Lightward.Scenarios.Model;
using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>A dome show: a cue list over show time, read from a <c>.show.toml</c> file by <see cref="ShowScriptReader"/>.</summary>
/// <param name="SourcePath">The show file, for messages and for resolving the paths it names.</param>
/// <param name="Length">Show time from the first frame to the last, seconds.</param>
/// <param name="Course">Unit direction (home ICRS axes) the ship points and flies along.</param>
public sealed record ShowScript(string SourcePath, string Title, double Length, Vec3 Course, ShowCautions Cautions, IReadOnlyList<ShowCue> Cues)
{
    /// <summary>Spacing of the grid of space (at rest in the home frame), light-seconds.</summary>
    public double GridSpacing { get; init; } = DefaultGridSpacing;

    /// <summary>Half a light-year: a few lines pass each second of a typical burn at γ ≈ 10 and 10⁶ ship seconds per show second.</summary>
    public const double DefaultGridSpacing = 0.5 * Units.LightYear;

    /// <summary>The scenario whose bodies (and grid, when it has one) the show draws, or null for open space.</summary>
    public Scenario? Scene { get; init; }

    /// <summary>A name safe for file names (frame files, soundtrack files): the show file's name without <c>.show.toml</c>.</summary>
    public string DeliveryName
    {
        get
        {
            string file = Path.GetFileName(SourcePath);
            return file.EndsWith(ShowScriptReader.Extension, StringComparison.OrdinalIgnoreCase) ? file[..^ShowScriptReader.Extension.Length] : Path.GetFileNameWithoutExtension(file);
        }
    }

    /// <summary>Whether any sound cue is placed on the dome, which calls for a 5.1 soundtrack instead of stereo.</summary>
    public bool UsesPositionalSound => Cues.Any(cue => cue.Sound?.Direction is not null);
}

/// <summary>Limits that keep a dome show comfortable and safe; see scenarios/README-shows.md for the defaults' basis.</summary>
/// <param name="DomePeakLuminance">Luminance of full white on the dome, cd/m², used to turn pixel values into luminance for the flash check.</param>
/// <param name="MaxRotationRate">Fastest whole-scene rotation allowed, rad/s: camera moves are slowed to it and faster rotation is reported.</param>
public sealed record ShowCautions(double DomePeakLuminance, double MaxRotationRate)
{
    /// <summary>
    /// 200 cd/m²: deliberately above the 100 cd/m² reference white of studio displays (ITU-R BT.2035, from memory), so
    /// an unmeasured dome is checked as if it were bright; most projected domes are far dimmer. Set the measured value.
    /// </summary>
    public const double DefaultDomePeakLuminance = 200;

    /// <summary>10°/s: common practice for fulldome camera turns, no published source.</summary>
    public static readonly double DefaultMaxRotationRate = 10 * Math.PI / 180;

    public static readonly ShowCautions Default = new(DefaultDomePeakLuminance, DefaultMaxRotationRate);
}

/// <summary>
/// One cue: at show time <see cref="At"/> its changes begin and ease over <see cref="Transition"/>. Every change is
/// optional; a cue that changes nothing still marks a point the operator can go to.
/// </summary>
public sealed record ShowCue(int Number, string Label, double At, double Transition, Easing Easing)
{
    /// <summary>Target rapidity of the ship along its course (the velocity profile).</summary>
    public double? Rapidity { get; init; }
    /// <summary>
    /// A burn plan the ship flies from this cue on (thrust and turns in ship axes, segment by segment over ship time),
    /// instead of the velocity profile.
    /// </summary>
    public BurnPlan? BurnPlan { get; init; }
    /// <summary>Ship proper seconds per second of show time.</summary>
    public double? TimeCompression { get; init; }
    public LookDirection? Look { get; init; }
    /// <summary>Field of view of the perspective projection, radians.</summary>
    public double? FieldOfView { get; init; }
    /// <summary>Picture level 0 (black) … 1 (full).</summary>
    public double? Fade { get; init; }
    public bool? Grid { get; init; }
    /// <summary>The scene's bodies shown or hidden (shown unless a cue hides them).</summary>
    public bool? Bodies { get; init; }
    public bool? Instruments { get; init; }
    /// <summary>In a live show the clock stops at this cue until the operator says go.</summary>
    public bool Hold { get; init; }
    public SoundCue? Sound { get; init; }
    /// <summary>Caption text; an empty string takes the current caption away.</summary>
    public string? Caption { get; init; }
}

/// <summary>Where the camera looks in ship axes: azimuth from forward toward the right, elevation up from the ship's horizontal plane.</summary>
public readonly record struct LookDirection(double Azimuth, double Elevation)
{
    public static readonly LookDirection Forward = new(0, 0);

    /// <summary>Camera axes → ship axes: turn right by the azimuth (about +Y), then up by the elevation (about the turned +X).</summary>
    public Rotation ToRotation() =>
        Rotation.FromAxisAngle(Vec3.UnitY, Azimuth) * Rotation.FromAxisAngle(Vec3.UnitX, -Elevation);
}

/// <summary>A sound file played from a cue.</summary>
/// <param name="Direction">Where on the dome the sound comes from (ship axes); null plays it centred in stereo.</param>
public sealed record SoundCue(string File, double GainDecibels, LookDirection? Direction);
