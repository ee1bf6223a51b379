using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>The [task] section: its kind decides which keys belong, and targets and times are checked against the rest.</summary>
public static partial class ScenarioFile
{
    private static TaskSpec? ReadTask(TableReader? table, List<BodySpec> bodies, List<string> declared, ShipStart? ship, FlightSettings? flight)
    {
        if (table is null) return null;
        string? kindName = table.Choice("kind", TaskSpec.Names.Keys.ToArray(), required: true);
        if (kindName is null)
        {
            // Without a kind we cannot tell which keys belong; mark them all known to avoid a cascade of messages.
            foreach (var entry in table.Table.Entries) table.Node(entry.Key);
            return null;
        }
        TaskKind kind = TaskSpec.Names[kindName];
        double startTime = ship?.Start.T ?? 0;
        const string positiveLength = "a positive length", speedBelowC = "a speed above 0 and below 1 c";

        string? target = null;
        Vec3 point = Vec3.Zero;
        double distance = 0, relativeSpeed = 0, homeTime = 0, dateTolerance = 0, viewAngle = 0;
        bool valid = true;
        T Need<T>(T? value) where T : struct
        {
            valid &= value is not null;
            return value ?? default;
        }

        switch (kind)
        {
            case TaskKind.Rendezvous:
                target = ReadTarget(table, bodies, declared, required: true);
                distance = Need(table.Quantity("distance", Dimension.Length, v => v > 0, positiveLength, required: true));
                relativeSpeed = Need(table.Quantity("relative_speed", Dimension.Speed, v => v > 0 && v < 1, speedBelowC, required: true));
                valid &= target is not null;
                break;
            case TaskKind.Stop:
            case TaskKind.ArriveBy:
                (target, point, valid) = ReadPlace(table, bodies, declared);
                distance = Need(table.Quantity("distance", Dimension.Length, v => v > 0, positiveLength, required: true));
                if (kind == TaskKind.Stop)
                    relativeSpeed = Need(table.Quantity("relative_speed", Dimension.Speed, v => v > 0 && v < 1, speedBelowC, required: true));
                else
                    homeTime = Need(ReadHomeTime(table, "deadline", startTime, flight));
                break;
            case TaskKind.ReturnHome:
                point = ship?.Start.Space ?? Vec3.Zero;
                distance = Need(table.Quantity("distance", Dimension.Length, v => v > 0, positiveLength, required: true));
                relativeSpeed = Need(table.Quantity("relative_speed", Dimension.Speed, v => v > 0 && v < 1, speedBelowC, required: true));
                homeTime = Need(ReadHomeTime(table, "date", startTime, flight));
                dateTolerance = Need(table.Quantity("date_tolerance", Dimension.Time, v => v > 0, "a positive time", required: true));
                break;
            case TaskKind.Flyby:
                target = ReadTarget(table, bodies, declared, required: true);
                distance = Need(table.Quantity("distance", Dimension.Length, v => v > 0, positiveLength, required: true));
                viewAngle = Need(table.Quantity("view_angle", Dimension.Angle, v => v > 0 && v <= Math.PI, "an angle above 0 and at most 180 deg", required: true));
                valid &= target is not null;
                break;
        }
        table.Finish();
        return valid ? new TaskSpec(kind, target, point, distance, relativeSpeed, homeTime, dateTolerance, viewAngle) : null;
    }

    /// <summary>A body's name; null when absent, unknown (reported) or naming a body that is itself invalid (reported there).</summary>
    private static string? ReadTarget(TableReader table, List<BodySpec> bodies, List<string> declared, bool required)
    {
        string? target = table.String("target", required, "the name of a body in this scenario");
        if (target is null || bodies.Any(b => b.Name == target)) return target;
        if (!declared.Contains(target))
            table.ReportHere("target", $"no body named \"{target}\"",
                declared.Count == 0 ? "add a [[body]] with that name" : "one of: " + string.Join(", ", declared.Select(b => $"\"{b}\"")));
        return null;
    }

    /// <summary>Either <c>target</c> (a body at rest, whose place is used) or <c>point</c>, not both.</summary>
    private static (string? Target, Vec3 Point, bool Valid) ReadPlace(TableReader table, List<BodySpec> bodies, List<string> declared)
    {
        const string allowed = "either target = \"<body at rest>\" or point = [\"x\", \"y\", \"z\"] with length units";
        bool hasTarget = table.Has("target"), hasPoint = table.Has("point");
        string? target = ReadTarget(table, bodies, declared, required: false);
        Vec3? point = table.QuantityVector("point", Dimension.Length);
        if (hasTarget == hasPoint)
        {
            table.ReportHere(hasTarget ? "point" : "target", hasTarget ? "given together with target" : "missing: the task needs a place", allowed);
            return (null, Vec3.Zero, false);
        }
        if (hasPoint) return (null, point ?? Vec3.Zero, point is not null);
        BodySpec? body = bodies.FirstOrDefault(b => b.Name == target);
        if (body is null) return (null, Vec3.Zero, false);
        if (body.Worldline.Kind != WorldlineKind.AtRest)
        {
            table.ReportHere("target", $"\"{target}\" moves, so it has no fixed place", "a body whose worldline kind is \"at_rest\", or a point");
            return (null, Vec3.Zero, false);
        }
        return (target, body.Worldline.Position, true);
    }

    /// <summary>A home-clock reading after the start that the flight can live to see.</summary>
    private static double? ReadHomeTime(TableReader table, string key, double startTime, FlightSettings? flight)
    {
        double? value = table.Quantity(key, Dimension.Time, v => v > startTime, "a home-clock reading after ship.start_time", required: true);
        if (value is not null && flight is not null && value.Value > startTime + flight.HomeTimeLimit)
        {
            table.ReportHere(key, "later than the flight's home time limit allows", "at most ship.start_time + flight.home_time_limit");
            return null;
        }
        return value;
    }
}
