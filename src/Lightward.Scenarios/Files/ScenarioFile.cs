using System.Globalization;
using System.Security.Cryptography;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>Reads and validates scenario files (schema in scenarios/README.md), reporting every problem at once.</summary>
public static partial class ScenarioFile
{
    private static readonly string[] ShapeNames = ["sphere", "box", "hull", "mesh"];

    /// <summary>Loads a scenario or throws <see cref="FileProblemsException"/> listing every problem.</summary>
    public static Scenario Load(string path)
    {
        var problems = new List<FileProblem>();
        Scenario? scenario = Read(path, problems);
        if (problems.Count > 0 || scenario is null) throw new FileProblemsException(problems);
        return scenario;
    }

    /// <summary>Every problem in the file; empty when it loads.</summary>
    public static IReadOnlyList<FileProblem> Check(string path)
    {
        var problems = new List<FileProblem>();
        Read(path, problems);
        return problems;
    }

    /// <summary>SHA-256 of the file's bytes, lowercase hex: what flight logs pin.</summary>
    public static string HashOf(byte[] content) => Convert.ToHexStringLower(SHA256.HashData(content));

    public static Scenario? Read(string path, List<FileProblem> problems)
    {
        byte[] content = UserFiles.ReadBytes(path, "scenario");
        string text = UserFiles.DecodeUtf8(content, path, problems);
        return Parse(text, path, HashOf(content), problems);
    }

    /// <summary>Parses scenario text; <paramref name="path"/> names it in messages and anchors relative file paths.</summary>
    public static Scenario? Parse(string text, string path, string contentHash, List<FileProblem> problems)
    {
        TomlMap? root = TomlTree.Parse(text, path, problems);
        if (root is null) return null;
        var top = new TableReader(root, problems);
        string directory = Path.GetDirectoryName(Path.GetFullPath(path)) ?? ".";

        string? title = top.String("title", required: true, allowed: "a short title");
        string? briefing = top.String("briefing", required: true, allowed: "the text shown before the flight");
        long seed = top.Integer("seed", 0, long.MaxValue) ?? 1;
        FlightSettings? flight = ReadFlight(top.Section("flight", required: true));
        ShipStart? ship = ReadShip(top.Section("ship", required: true));
        var bodies = new List<BodySpec>();
        // Names of every [[body]], valid or not, so one bad body does not make references to it look wrong too.
        var declared = new List<string>();
        foreach (TableReader body in top.Sections("body")) ReadBody(body, directory, bodies, declared);
        SkySettings sky = ReadSky(top.Section("sky"), (ulong)seed, directory);
        GridSettings grid = ReadGrid(top.Section("grid"), declared);
        TaskSpec? task = ReadTask(top.Section("task", required: true), bodies, declared, ship, flight);
        ScoringWeights scoring = ReadScoring(top.Section("scoring"));
        top.Finish();

        FileProblem.SortByPlace(problems);
        if (problems.Count > 0 || title is null || briefing is null || flight is null || ship is null || task is null) return null;
        return new Scenario(Path.GetFullPath(path), contentHash, title, briefing, (ulong)seed, flight, ship, bodies, sky, grid, task, scoring);
    }

    private static FlightSettings? ReadFlight(TableReader? table)
    {
        if (table is null) return null;
        double? step = table.Quantity("step", Dimension.Time, v => v > 0, "a positive time") ?? 1;
        double? shipLimit = table.Quantity("ship_time_limit", Dimension.Time, v => v > 0, "a positive time", required: true);
        double? homeLimit = table.Quantity("home_time_limit", Dimension.Time, v => v > 0, "a positive time", required: true);
        table.Finish();
        if (step is null || shipLimit is null || homeLimit is null) return null;
        if (shipLimit / step > 50_000_000)
            table.ReportHere("step", "too small for the time limit: more than 50 million steps", "a step at least ship_time_limit / 50000000");
        return new FlightSettings(step.Value, shipLimit.Value, homeLimit.Value);
    }

    private static ShipStart? ReadShip(TableReader? table)
    {
        if (table is null) return null;
        double startTime = table.Quantity("start_time", Dimension.Time, _ => true, "any time") ?? 0;
        Vec3 position = table.QuantityVector("position", Dimension.Length) ?? Vec3.Zero;
        Velocity? velocity = ReadVelocity(table);
        Rotation? attitude = ReadAttitude(table);
        double? acceleration = table.Quantity("max_acceleration", Dimension.Acceleration, v => v > 0, "a positive acceleration", required: true);
        double turnRate = table.Quantity("max_turn_rate", Dimension.AngularRate, v => v > 0, "a positive rate") ?? 10 * Math.PI / 180;
        double? exhaust = table.Quantity("exhaust_speed", Dimension.Speed, v => v > 0 && v <= 1, "a speed above 0 and at most 1 c", required: true);
        double? massRatio = table.Number("mass_ratio", v => v > 1, "a number above 1 (initial mass / final mass)", required: true);
        table.Finish();
        if (velocity is null || attitude is null || acceleration is null || exhaust is null || massRatio is null) return null;
        double budget = RocketEquation.RapidityBudget(exhaust.Value, massRatio.Value);
        return new ShipStart(new FourVector(startTime, position), velocity.Value, attitude.Value, acceleration.Value, turnRate, exhaust.Value, massRatio.Value, budget);
    }

    /// <summary>Keys speed | rapidity and direction; rest when neither is given.</summary>
    private static Velocity? ReadVelocity(TableReader table)
    {
        double? speed = table.Quantity("speed", Dimension.Speed, v => v >= 0 && v < 1, "a speed from 0 up to (not including) 1 c");
        double? rapidity = table.Number("rapidity", v => v >= 0 && v <= 40, "a rapidity from 0 to 40");
        Vec3? direction = table.Direction("direction");
        if (table.Has("speed") && table.Has("rapidity"))
        {
            table.ReportHere("rapidity", "given together with speed", "either speed or rapidity");
            return null;
        }
        if ((table.Has("speed") && speed is null) || (table.Has("rapidity") && rapidity is null) || (table.Has("direction") && direction is null)) return null;
        double phi = rapidity ?? Math.Atanh(speed ?? 0);
        if (phi > 0 && direction is null)
        {
            table.ReportHere("direction", "missing: a moving object needs a direction", "an array of three numbers such as [1, 0, 0]");
            return null;
        }
        return phi > 0 ? new Velocity(phi, direction!.Value) : Velocity.Rest;
    }

    /// <summary>Keys forward and up (home axes) → the rotation taking ship axes (+Z forward, +Y up) to home axes.</summary>
    private static Rotation? ReadAttitude(TableReader table)
    {
        Vec3? forwardRead = table.Direction("forward");
        Vec3? up = table.Direction("up");
        if (table.Has("forward") && forwardRead is null) return null;
        Vec3 forward = forwardRead ?? Vec3.UnitZ;
        Rotation pointing = Rotation.Between(Vec3.UnitZ, forward);
        if (up is null) return table.Has("up") ? null : pointing;
        Vec3 upAcross = up.Value - Vec3.Dot(up.Value, forward) * forward;
        if (upAcross.Length < 1e-6)
        {
            table.ReportHere("up", "parallel to forward", "a direction not parallel to forward");
            return null;
        }
        Vec3 currentUp = pointing.Rotate(Vec3.UnitY);
        double roll = Math.Atan2(Vec3.Dot(Vec3.Cross(currentUp, upAcross / upAcross.Length), forward), Vec3.Dot(currentUp, upAcross / upAcross.Length));
        return (Rotation.FromAxisAngle(forward, roll) * pointing).Normalized();
    }
}
