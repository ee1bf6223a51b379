using Lightward.Scenarios.Model;
using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>Reads and validates burn plans (schema in scenarios/README.md); with a scenario, also checks them against its ship.</summary>
public static class PlanFile
{
    private static readonly (string Key, SegmentEnd End)[] Ends =
        [("duration", SegmentEnd.Duration), ("until_speed", SegmentEnd.Speed), ("until_distance", SegmentEnd.Distance), ("until_home_time", SegmentEnd.HomeTime)];

    public static BurnPlan Load(string path, ShipStart? ship)
    {
        var problems = new List<FileProblem>();
        BurnPlan? plan = Read(path, ship, problems);
        if (problems.Count > 0 || plan is null) throw new FileProblemsException(problems);
        return plan;
    }

    public static IReadOnlyList<FileProblem> Check(string path)
    {
        var problems = new List<FileProblem>();
        Read(path, null, problems);
        return problems;
    }

    public static BurnPlan? Read(string path, ShipStart? ship, List<FileProblem> problems)
    {
        byte[] content = UserFiles.ReadBytes(path, "burn plan");
        string text = UserFiles.DecodeUtf8(content, path, problems);
        return Parse(text, path, ScenarioFile.HashOf(content), ship, problems);
    }

    public static BurnPlan? Parse(string text, string path, string contentHash, ShipStart? ship, List<FileProblem> problems)
    {
        TomlMap? root = TomlTree.Parse(text, path, problems);
        if (root is null) return null;
        var top = new TableReader(root, problems);
        top.String("title", allowed: "a short description of the plan");
        IReadOnlyList<TableReader> tables = top.Sections("segment", required: true);
        top.Finish();
        if (tables.Count == 0 && top.Has("segment"))
            top.ReportHere("segment", "the plan has no segments", "one or more [[segment]] tables");
        var segments = new List<PlanSegment>();
        foreach (TableReader table in tables)
        {
            PlanSegment? segment = ReadSegment(table, ship, segments.Count);
            if (segment is not null) segments.Add(segment);
        }
        FileProblem.SortByPlace(problems);
        return problems.Count == 0 ? new BurnPlan(Path.GetFullPath(path), contentHash, segments) : null;
    }

    private static PlanSegment? ReadSegment(TableReader table, ShipStart? ship, int index)
    {
        string name = table.String("name", allowed: "a label for the segment") ?? $"segment {index + 1}";
        Vec3 thrust = table.QuantityVector("thrust", Dimension.Acceleration) ?? Vec3.Zero;
        Vec3 rate = table.QuantityVector("attitude_rate", Dimension.AngularRate) ?? Vec3.Zero;
        Vec3? face = table.Direction("face");
        var ends = new List<(SegmentEnd End, double? Value, string Key)>();
        foreach ((string key, SegmentEnd end) in Ends)
        {
            if (!table.Has(key))
            {
                table.Node(key);
                continue;
            }
            double? value = end switch
            {
                SegmentEnd.Duration => table.Quantity(key, Dimension.Time, v => v > 0, "a positive ship time"),
                SegmentEnd.Speed => table.Quantity(key, Dimension.Speed, v => v >= 0 && v < 1, "a speed from 0 up to (not including) 1 c"),
                SegmentEnd.Distance => table.Quantity(key, Dimension.Length, v => v >= 0, "a distance ≥ 0 from the start position"),
                _ => table.Quantity(key, Dimension.Time, _ => true, "a home-clock reading"),
            };
            ends.Add((end, value, key));
        }
        table.Finish();
        if (ship is not null)
        {
            if (thrust.Length > ship.MaxAcceleration * (1 + 1e-9))
                table.ReportHere("thrust", $"{Quantity.In(thrust.Length, Dimension.Acceleration, "g"):G6} g is more than the ship's engine gives",
                    $"at most ship.max_acceleration = {Quantity.In(ship.MaxAcceleration, Dimension.Acceleration, "g"):G6} g");
            if (rate.Length > ship.MaxTurnRate * (1 + 1e-9))
                table.ReportHere("attitude_rate", $"{Quantity.In(rate.Length, Dimension.AngularRate, "deg/s"):G6} deg/s is faster than the ship turns",
                    $"at most ship.max_turn_rate = {Quantity.In(ship.MaxTurnRate, Dimension.AngularRate, "deg/s"):G6} deg/s");
        }
        const string oneEnd = "exactly one of duration, until_speed, until_distance, until_home_time";
        if (ends.Count != 1)
        {
            table.Problems.Add(new FileProblem(ends.Count == 0 ? table.Location : table.Table.Find(ends[1].Key)!.Location,
                table.Path, ends.Count == 0 ? "the segment has no end condition" : "more than one end condition", oneEnd));
            return null;
        }
        if (table.Has("face") && table.Has("attitude_rate"))
        {
            table.ReportHere("face", "given together with attitude_rate", "either face (hold a direction) or attitude_rate (turn at a rate)");
            return null;
        }
        if (ends[0].Value is null) return null;
        return new PlanSegment(name, thrust, rate, face, ends[0].End, ends[0].Value!.Value, table.Location);
    }
}
