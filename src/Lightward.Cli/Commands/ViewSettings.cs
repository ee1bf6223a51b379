using System.ComponentModel;
using System.Globalization;
using Lightward.Host.Simulation;
using Lightward.Optics;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>
/// The flags that say where the ship is, how it moves and which sky it sees; shared by every command that shows the
/// view from the ship. Values stay strings until <see cref="Resolve"/>, which checks them all and throws a
/// <see cref="UserInputException"/> naming the flag.
/// </summary>
public class ViewSettings : CommandSettings
{
    [CommandArgument(0, "[scenario]")]
    [Description("Scenario file (TOML) whose ship and sky to show; without one, a ship coasting from the home origin (see --heading, --beta).")]
    public string? ScenarioPath { get; init; }

    [CommandOption("--beta <SPEED>")]
    [Description("Speed along the heading as a fraction of c (0.9) or with a unit (0.9 c, 30000 km/s); negative flies tail first. Excludes --rapidity.")]
    public string? Beta { get; init; }

    [CommandOption("--rapidity <PHI>")]
    [Description("Speed along the heading as a rapidity φ (β = tanh φ), up to 40; negative flies tail first. Excludes --beta.")]
    public string? Rapidity { get; init; }

    [CommandOption("--heading <DIRECTION>")]
    [Description("Where the ship's nose points and it flies: 'RA,Dec' in degrees (279.2,38.8) or a catalogue star (Vega, HIP 91262). Default 0,0.")]
    public string? Heading { get; init; }

    [CommandOption("--at <SHIP_TIME>")]
    [Description("Ship clock reading of the view, with a unit (0 s, 3 d, 2 yr); the ship coasts from its start until then. Default 0 s.")]
    public string? At { get; init; }

    [CommandOption("--sky <SKY>")]
    [Description("Star sky: hipparcos (the bundled catalogue, default) or procedural (synthetic, see --stars and --seed).")]
    public string? Sky { get; init; }

    [CommandOption("--stars <COUNT>")]
    [Description("Number of stars of the procedural sky, 1 to 10000000. Default 100000.")]
    public string? Stars { get; init; }

    [CommandOption("--seed <SEED>")]
    [Description("Seed of the procedural sky (any integer). Default 1.")]
    public string? Seed { get; init; }

    public const int MaximumProceduralStars = 10_000_000;

    /// <summary>The sky, the ship's state and a short description of both, from the flags.</summary>
    public ViewState Resolve()
    {
        if (Beta is not null && Rapidity is not null)
            throw new UserInputException("--beta and --rapidity both give the speed; use one of them");
        double shipTime = At is null ? 0 : Quantity.Parse(At, Dimension.Time, "--at");
        if (shipTime < 0) throw new UserInputException($"--at: '{At}' is before the start; give a ship time of 0 s or later");
        if (ScenarioPath is not null) return FromScenario(shipTime);
        double rapidity = Rapidity is not null ? ParseRapidity(Rapidity) : Beta is not null ? ParseBeta(Beta) : 0;
        StarCatalog sky = LoadSky();
        Vec3 heading = ResolveHeading(Heading ?? "0,0", sky);
        return new ViewState(sky, ViewState.CoastingShip(heading, rapidity, shipTime));
    }

    /// <summary>The scenario's ship start and sky; the ship coasts (engine off) for <paramref name="shipTime"/>.</summary>
    private ViewState FromScenario(double shipTime)
    {
        string? conflicting = new[] { ("--beta", Beta), ("--rapidity", Rapidity), ("--heading", Heading), ("--sky", Sky), ("--stars", Stars), ("--seed", Seed) }
            .FirstOrDefault(flag => flag.Item2 is not null).Item1;
        if (conflicting is not null)
            throw new UserInputException($"{conflicting}: a scenario brings its own ship and sky; leave out {conflicting} or the scenario file");
        Scenario scenario = ScenarioFile.Load(ScenarioPath!);
        ShipState ship = scenario.Ship.State;
        // One exact coasting step: FlightStep integrates constant controls exactly whatever the duration.
        if (shipTime > 0) ship = new FlightIntegrator(shipTime).Step(ship, Controls.Coast);
        return new ViewState(ScenarioSetup.SceneOf(scenario).Sky, ship);
    }

    private StarCatalog LoadSky()
    {
        string kind = (Sky ?? "hipparcos").Trim().ToLowerInvariant();
        if (kind != "procedural" && (Stars is not null || Seed is not null))
            throw new UserInputException($"--stars and --seed shape the procedural sky only; add --sky procedural");
        return kind switch
        {
            "hipparcos" => StarCatalog.LoadHipparcos(),
            "procedural" => StarCatalog.Procedural(ParseStarCount(), ParseSeed()),
            _ => throw new UserInputException($"--sky: unknown sky '{Sky}'; expected hipparcos or procedural"),
        };
    }

    private int ParseStarCount()
    {
        if (Stars is null) return 100_000;
        if (int.TryParse(Stars, NumberStyles.None, CultureInfo.InvariantCulture, out int count) && count >= 1 && count <= MaximumProceduralStars) return count;
        throw new UserInputException($"--stars: '{Stars}' is not a whole number from 1 to {MaximumProceduralStars}");
    }

    private int ParseSeed()
    {
        if (Seed is null) return 1;
        if (int.TryParse(Seed, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int seed)) return seed;
        throw new UserInputException($"--seed: '{Seed}' is not a whole number from {int.MinValue} to {int.MaxValue}");
    }

    internal static double ParseRapidity(string text)
    {
        double rapidity = ViewParsing.Number(text, "--rapidity", "a rapidity such as 3 or -0.5");
        if (Math.Abs(rapidity) > SkyTransform.MaxRapidity)
            throw new UserInputException($"--rapidity: {text} is beyond the supported ±{SkyTransform.MaxRapidity}");
        return rapidity;
    }

    internal static double ParseBeta(string text)
    {
        string trimmed = text.Trim();
        double beta = double.TryParse(trimmed, NumberStyles.Float, CultureInfo.InvariantCulture, out double plain)
            ? plain
            : Quantity.Parse(trimmed, Dimension.Speed, "--beta");
        if (!double.IsFinite(beta)) throw new UserInputException($"--beta: '{text}' is not a finite number");
        if (!(Math.Abs(beta) < 1))
            throw new UserInputException($"--beta: |β| = {Math.Abs(beta).ToString("G6", CultureInfo.InvariantCulture)} is not below 1 (the speed of light); give a speed below c, or use --rapidity for extreme speeds");
        return Math.Atanh(beta);
    }

    /// <summary>'RA,Dec' in degrees, or a star found in the catalogue by name or Hipparcos number.</summary>
    private static Vec3 ResolveHeading(string text, StarCatalog sky)
    {
        if (ViewParsing.TryAnglePair(text, "--heading", out double rightAscension, out double declination))
        {
            if (Math.Abs(declination) > 90) throw new UserInputException($"--heading: declination {declination.ToString(CultureInfo.InvariantCulture)}° is outside -90…90");
            return ViewParsing.UnitFromAngles(rightAscension, declination);
        }
        if (sky.TryFind(text, out int star)) return sky.Direction(star);
        throw new UserInputException($"--heading: '{text}' is neither 'RA,Dec' in degrees (e.g. 279.2,38.8) nor a star of this sky (e.g. Vega or HIP 91262)");
    }
}

/// <summary>What <see cref="ViewSettings.Resolve"/> produces: the sky and the ship.</summary>
public sealed record ViewState(StarCatalog Sky, ShipState Ship)
{
    /// <summary>
    /// A ship that left the home origin at ship time 0 and coasts with rapidity <paramref name="rapidity"/> along
    /// <paramref name="heading"/> (negative: backward), nose along the heading and its up axis toward the north
    /// celestial pole (toward RA 90° when heading at a pole).
    /// </summary>
    public static ShipState CoastingShip(Vec3 heading, double rapidity, double shipTime)
    {
        Vec3 forward = heading.NormalizedOr(Vec3.UnitX);
        Vec3 north = Math.Abs(forward.Z) > 0.999999 ? Vec3.UnitY : Vec3.UnitZ;
        Vec3 up = (north - Vec3.Dot(north, forward) * forward).NormalizedOr(Vec3.UnitY);
        Vec3 right = Vec3.Cross(up, forward);
        var orientation = Rotation.FromMatrix(new[,] { { right.X, up.X, forward.X }, { right.Y, up.Y, forward.Y }, { right.Z, up.Z, forward.Z } });
        var velocity = new Velocity(Math.Abs(rapidity), rapidity < 0 ? -forward : forward);
        var worldlineEvent = new FourVector(velocity.Gamma * shipTime, velocity.ProperVelocity * shipTime);
        return new ShipState(new CompensatedEvent(worldlineEvent), new LorentzFrame(velocity, orientation), shipTime);
    }
}

/// <summary>Number and angle parsing shared by the view commands; every failure names its flag.</summary>
public static class ViewParsing
{
    /// <summary>A finite plain number.</summary>
    public static double Number(string text, string flag, string expected)
    {
        if (double.TryParse(text.Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double value) && double.IsFinite(value)) return value;
        throw new UserInputException($"{flag}: '{text}' is not a finite number; expected {expected}");
    }

    /// <summary>An angle in degrees, plain ("90") or with an angle unit ("90 deg", "1.2 rad").</summary>
    public static double Degrees(string text, string flag)
    {
        string trimmed = text.Trim();
        if (double.TryParse(trimmed, NumberStyles.Float, CultureInfo.InvariantCulture, out double plain))
        {
            if (!double.IsFinite(plain)) throw new UserInputException($"{flag}: '{text}' is not a finite angle");
            return plain;
        }
        return Quantity.Parse(trimmed, Dimension.Angle, flag) * 180 / Math.PI;
    }

    /// <summary>Two comma-separated finite numbers (degrees); false when the text is not of that shape.</summary>
    public static bool TryAnglePair(string text, string flag, out double first, out double second)
    {
        first = second = 0;
        string[] parts = text.Split(',');
        if (parts.Length != 2) return false;
        bool firstParsed = double.TryParse(parts[0].Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out first);
        bool secondParsed = double.TryParse(parts[1].Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out second);
        if (!firstParsed || !secondParsed) return false;
        if (!double.IsFinite(first) || !double.IsFinite(second)) throw new UserInputException($"{flag}: '{text}' holds a non-finite angle");
        return true;
    }

    /// <summary>The unit vector at longitude-like angle <paramref name="around"/> and latitude-like <paramref name="up"/> (degrees) in ICRS axes.</summary>
    public static Vec3 UnitFromAngles(double around, double up)
    {
        double a = around * Math.PI / 180, b = up * Math.PI / 180;
        return new Vec3(Math.Cos(b) * Math.Cos(a), Math.Cos(b) * Math.Sin(a), Math.Sin(b));
    }
}
