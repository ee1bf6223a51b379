using Lightward.Spacetime;

namespace Lightward.Scenarios.Model;

/// <summary>
/// A parsed, validated scenario as plain data: what the renderer, the host and the drill all start from, so none of
/// them re-reads the file. All quantities are in internal units (c = 1, seconds, light-seconds).
/// </summary>
public sealed record Scenario(
    string SourcePath,
    string ContentHash,
    string Title,
    string Briefing,
    ulong Seed,
    FlightSettings Flight,
    ShipStart Ship,
    IReadOnlyList<BodySpec> Bodies,
    SkySettings Sky,
    GridSettings Grid,
    TaskSpec Task,
    ScoringWeights Scoring)
{
    /// <summary>The scenario's short name: its file name without extension.</summary>
    public string Name => Path.GetFileNameWithoutExtension(SourcePath);

    public BodySpec? FindBody(string name) => Bodies.FirstOrDefault(b => b.Name == name);
}

/// <param name="Step">Fixed proper-time step of headless flights, s.</param>
/// <param name="ShipTimeLimit">The flight fails when the ship clock has run this long, s.</param>
/// <param name="HomeTimeLimit">The flight fails when the home clock has run this long since the start, s.</param>
public sealed record FlightSettings(double Step, double ShipTimeLimit, double HomeTimeLimit);

/// <param name="Start">Start event in home coordinates.</param>
/// <param name="MaxAcceleration">Largest proper acceleration the engine gives, 1/s.</param>
/// <param name="MaxTurnRate">Largest attitude rate, rad/s.</param>
/// <param name="ExhaustSpeed">Exhaust speed relative to the ship, as β.</param>
/// <param name="MassRatio">Initial over final mass.</param>
/// <param name="RapidityBudget">The rapidity the propellant can buy: ∫|a| dτ over the whole flight.</param>
public sealed record ShipStart(
    FourVector Start, Velocity Velocity, Rotation Attitude,
    double MaxAcceleration, double MaxTurnRate, double ExhaustSpeed, double MassRatio, double RapidityBudget)
{
    public ShipState State => new(new CompensatedEvent(Start), new LorentzFrame(Velocity, Attitude), 0);
}

public enum ShapeKind { Sphere, Box, Hull, Mesh }

/// <summary>A body's shape in its own axes. Only the fields of its kind are meaningful.</summary>
/// <param name="Size">Sphere: radius in X; box: edge lengths; hull: length in X; mesh: lengths per file unit in X.</param>
/// <param name="MeshPath">Absolute path of a Wavefront OBJ file for <see cref="ShapeKind.Mesh"/>.</param>
public sealed record ShapeSpec(ShapeKind Kind, Vec3 Size, string? MeshPath);

/// <summary>What the body gives off: a fixed sRGB colour (0–1 per channel) or a blackbody temperature, K.</summary>
public sealed record EmissionSpec(Vec3? Colour, double? Temperature);

/// <param name="BeaconRate">Beacon flash rate in the body's own time, Hz, or null for none.</param>
/// <param name="ClockOffset">Reading of the body's clock at home time zero when shown, s; null hides the clock.</param>
public sealed record BodySpec(string Name, ShapeSpec Shape, WorldlineSpec Worldline, EmissionSpec Emission, double? BeaconRate, double? ClockOffset)
{
    public IWorldline Path { get; } = Worldline.Build();
}

public enum SkySource { Catalogue, Procedural }

/// <param name="CataloguePath">Absolute path of a star catalogue file, or null for the one shipped in assets/.</param>
/// <param name="StarCount">Stars generated for the procedural sky.</param>
public sealed record SkySettings(SkySource Source, string? CataloguePath, ulong Seed, int StarCount);

/// <param name="Spacing">Distance between grid lines in the grid's frame, light-seconds; 0 hides the grid.</param>
/// <param name="Extent">Half-width of the grid, light-seconds.</param>
/// <param name="Frame">"home" or the name of the body whose rest frame holds the grid.</param>
public sealed record GridSettings(double Spacing, double Extent, string Frame);

/// <summary>Points per unit of each penalty: a measure equal to its tolerance or limit costs this many points.</summary>
public sealed record ScoringWeights(double MissDistance, double RelativeSpeed, double ShipTime, double HomeTime, double Rapidity)
{
    public static readonly ScoringWeights Default = new(200, 200, 100, 100, 200);
}
