using System.Globalization;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>The body, sky, grid, task and scoring sections of a scenario file.</summary>
public static partial class ScenarioFile
{
    private static void ReadBody(TableReader table, string directory, List<BodySpec> bodies, List<string> declared)
    {
        string? name = table.String("name", required: true, allowed: "a name unique in this scenario");
        if (name is not null && name.Trim().Length == 0)
        {
            table.ReportHere("name", "empty name", "a name unique in this scenario");
            name = null;
        }
        if (name is not null && declared.Contains(name))
        {
            table.ReportHere("name", $"a body named \"{name}\" is already defined", "a name unique in this scenario");
            name = null;
        }
        if (name is not null) declared.Add(name);
        ShapeSpec? shape = ReadShape(table, directory);
        EmissionSpec? emission = ReadEmission(table);
        double? beacon = table.Quantity("beacon_rate", Dimension.Frequency, v => v > 0 && v <= 1000, "a rate above 0 and at most 1 kHz");
        double? clock = table.Quantity("clock", Dimension.Time, _ => true, "any time");
        WorldlineSpec? worldline = ReadWorldline(table.Section("worldline", required: true));
        table.Finish();
        bool beaconBad = table.Has("beacon_rate") && beacon is null, clockBad = table.Has("clock") && clock is null;
        if (name is null || shape is null || emission is null || worldline is null || beaconBad || clockBad) return;
        bodies.Add(new BodySpec(name, shape, worldline, emission, beacon, clock));
    }

    private static ShapeSpec? ReadShape(TableReader table, string directory)
    {
        string? shape = table.Choice("shape", ShapeNames, required: true);
        const string positive = "a positive length";
        switch (shape)
        {
            case "sphere":
                double? radius = table.Quantity("radius", Dimension.Length, v => v > 0, positive, required: true);
                return radius is null ? null : new ShapeSpec(ShapeKind.Sphere, new Vec3(radius.Value, radius.Value, radius.Value), null);
            case "box":
                Vec3? size = table.QuantityVector("size", Dimension.Length, required: true);
                if (size is null) return null;
                if (!(size.Value.X > 0 && size.Value.Y > 0 && size.Value.Z > 0))
                {
                    table.ReportHere("size", "every edge must be positive", "three positive lengths");
                    return null;
                }
                return new ShapeSpec(ShapeKind.Box, size.Value, null);
            case "hull":
                double? length = table.Quantity("length", Dimension.Length, v => v > 0, positive, required: true);
                return length is null ? null : new ShapeSpec(ShapeKind.Hull, new Vec3(length.Value, 0, 0), null);
            case "mesh":
                string? file = table.String("mesh", required: true, allowed: "the path of a Wavefront OBJ file, relative to the scenario");
                double? unit = table.Quantity("mesh_unit", Dimension.Length, v => v > 0, "the length of one file unit") ?? Units.Metre;
                if (file is null || unit is null) return null;
                string meshPath = Path.GetFullPath(Path.Combine(directory, file));
                if (!File.Exists(meshPath))
                {
                    table.ReportHere("mesh", $"file not found: {meshPath}", "an existing Wavefront OBJ file");
                    return null;
                }
                try
                {
                    WavefrontObj.Load(meshPath, unit.Value);
                }
                catch (UserInputException exception)
                {
                    table.ReportHere("mesh", exception.Message, "a readable Wavefront OBJ file");
                    return null;
                }
                return new ShapeSpec(ShapeKind.Mesh, new Vec3(unit.Value, unit.Value, unit.Value), meshPath);
            default:
                return null;
        }
    }

    private static EmissionSpec? ReadEmission(TableReader table)
    {
        string? colour = table.String("colour", allowed: "an sRGB colour \"#rrggbb\"");
        double? temperature = table.Quantity("temperature", Dimension.Temperature, v => v >= 500 && v <= 100_000, "a temperature from 500 K to 100000 K");
        bool hasColour = table.Has("colour"), hasTemperature = table.Has("temperature");
        if (hasColour == hasTemperature)
        {
            table.ReportHere(hasColour ? "temperature" : "colour", hasColour ? "given together with colour" : "missing: a body needs a colour or a temperature",
                "exactly one of colour = \"#rrggbb\" or temperature = \"5800 K\"");
            return null;
        }
        if (hasTemperature) return temperature is null ? null : new EmissionSpec(null, temperature);
        if (colour is null) return null;
        if (colour.Length != 7 || colour[0] != '#' || !int.TryParse(colour.AsSpan(1), NumberStyles.HexNumber, CultureInfo.InvariantCulture, out int rgb))
        {
            table.ReportHere("colour", $"\"{colour}\" is not a colour", "an sRGB colour \"#rrggbb\" in hexadecimal");
            return null;
        }
        return new EmissionSpec(new Vec3(((rgb >> 16) & 255) / 255.0, ((rgb >> 8) & 255) / 255.0, (rgb & 255) / 255.0), null);
    }

    private static WorldlineSpec? ReadWorldline(TableReader? table)
    {
        if (table is null) return null;
        string? kindName = table.Choice("kind", WorldlineSpec.Names.Keys.ToArray(), required: true);
        WorldlineSpec? spec = kindName is null ? null : WorldlineSpec.Names[kindName] switch
        {
            WorldlineKind.AtRest => ReadAtRest(table),
            WorldlineKind.Inertial => ReadInertial(table),
            WorldlineKind.Accelerating => ReadAccelerating(table),
            _ => ReadOrbit(table),
        };
        table.Finish();
        return spec;
    }

    private static WorldlineSpec Simple(WorldlineKind kind, Vec3 position, Velocity velocity) =>
        new(kind, position, velocity, Vec3.UnitZ, 0, 0, 0, 0, 0);

    private static WorldlineSpec? ReadAtRest(TableReader table)
    {
        Vec3? position = table.QuantityVector("position", Dimension.Length, required: true);
        return position is null ? null : Simple(WorldlineKind.AtRest, position.Value, Velocity.Rest);
    }

    private static WorldlineSpec? ReadInertial(TableReader table)
    {
        Vec3? position = table.QuantityVector("position", Dimension.Length, required: true);
        Velocity? velocity = ReadVelocity(table);
        return position is null || velocity is null ? null : Simple(WorldlineKind.Inertial, position.Value, velocity.Value);
    }

    private static WorldlineSpec? ReadAccelerating(TableReader table)
    {
        Vec3? position = table.QuantityVector("position", Dimension.Length, required: true);
        double? acceleration = table.Quantity("acceleration", Dimension.Acceleration, v => v > 0, "a positive proper acceleration", required: true);
        Vec3? direction = table.Direction("direction", required: true);
        double startTime = table.Quantity("start_time", Dimension.Time, _ => true, "any time") ?? 0;
        if (position is null || acceleration is null || direction is null) return null;
        return new WorldlineSpec(WorldlineKind.Accelerating, position.Value, Velocity.Rest, direction.Value, acceleration.Value, startTime, 0, 0, 0);
    }

    private static WorldlineSpec? ReadOrbit(TableReader table)
    {
        Vec3? centre = table.QuantityVector("centre", Dimension.Length, required: true);
        double? radius = table.Quantity("radius", Dimension.Length, v => v > 0, "a positive length", required: true);
        double? period = table.Quantity("period", Dimension.Time, v => v > 0, "a positive time", required: true);
        Vec3 axis = table.Direction("axis") ?? Vec3.UnitZ;
        double phase = table.Quantity("phase", Dimension.Angle, _ => true, "any angle") ?? 0;
        if (centre is null || radius is null || period is null) return null;
        if (2 * Math.PI * radius.Value / period.Value >= 1)
        {
            table.ReportHere("period", "too short for the radius: the orbital speed 2πr/T would reach c", $"a period above {Quantity.In(2 * Math.PI * radius.Value, Dimension.Time, "s"):G6} s");
            return null;
        }
        return new WorldlineSpec(WorldlineKind.Orbit, centre.Value, Velocity.Rest, axis, 0, 0, radius.Value, period.Value, phase);
    }

    private static SkySettings ReadSky(TableReader? table, ulong scenarioSeed, string directory)
    {
        if (table is null) return new SkySettings(SkySource.Procedural, null, scenarioSeed, 5000);
        string source = table.Choice("source", ["catalogue", "procedural"]) ?? "procedural";
        string? catalogue = null;
        if (source == "catalogue")
        {
            string? file = table.String("catalogue", allowed: "the path of a star catalogue, relative to the scenario; omit for the shipped one");
            if (file is not null)
            {
                catalogue = Path.GetFullPath(Path.Combine(directory, file));
                if (!File.Exists(catalogue)) table.ReportHere("catalogue", $"file not found: {catalogue}", "an existing star catalogue file");
            }
        }
        long seed = table.Integer("seed", 0, long.MaxValue) ?? (long)scenarioSeed;
        long stars = table.Integer("stars", 0, 2_000_000) ?? 5000;
        table.Finish();
        return new SkySettings(source == "catalogue" ? SkySource.Catalogue : SkySource.Procedural, catalogue, (ulong)seed, (int)stars);
    }

    private static GridSettings ReadGrid(TableReader? table, List<string> declared)
    {
        if (table is null) return new GridSettings(0, 0, "home");
        double spacing = table.Quantity("spacing", Dimension.Length, v => v >= 0, "a length ≥ 0 (0 hides the grid)") ?? 0;
        double extent = table.Quantity("extent", Dimension.Length, v => v > 0, "a positive length") ?? 10 * spacing;
        string frame = table.String("frame", allowed: "\"home\" or the name of a body") ?? "home";
        if (frame != "home" && !declared.Contains(frame))
            table.ReportHere("frame", $"no body named \"{frame}\"", "\"home\" or one of: " + string.Join(", ", declared.Select(b => $"\"{b}\"")));
        if (spacing > 0 && extent / spacing > 1000)
            table.ReportHere("extent", "more than 1000 grid lines across", "extent at most 1000 × spacing");
        table.Finish();
        return new GridSettings(spacing, extent, frame);
    }

    private static ScoringWeights ReadScoring(TableReader? table)
    {
        if (table is null) return ScoringWeights.Default;
        const string allowed = "points ≥ 0 charged when the measure equals its tolerance or limit";
        ScoringWeights d = ScoringWeights.Default;
        var weights = new ScoringWeights(
            table.Number("miss_distance", v => v >= 0, allowed) ?? d.MissDistance,
            table.Number("relative_speed", v => v >= 0, allowed) ?? d.RelativeSpeed,
            table.Number("ship_time", v => v >= 0, allowed) ?? d.ShipTime,
            table.Number("home_time", v => v >= 0, allowed) ?? d.HomeTime,
            table.Number("rapidity", v => v >= 0, allowed) ?? d.Rapidity);
        table.Finish();
        return weights;
    }
}
