using System.Globalization;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Model;
using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>Reads and validates <c>.show.toml</c> files (schema in scenarios/README-shows.md), reporting every problem at once.</summary>
public static class ShowScriptReader
{
    public const string Extension = ".show.toml";

    private const double MaxTimeCompression = 1e12;
    private static readonly string[] FadeWords = ["in", "out"];

    /// <summary>Loads a show or throws <see cref="FileProblemsException"/> listing every problem.</summary>
    public static ShowScript Load(string path)
    {
        var problems = new List<FileProblem>();
        ShowScript? script = Read(path, problems);
        if (problems.Count > 0 || script is null) throw new FileProblemsException(problems);
        return script;
    }

    /// <summary>Every problem in the file; empty when it loads.</summary>
    public static IReadOnlyList<FileProblem> Check(string path)
    {
        var problems = new List<FileProblem>();
        Read(path, problems);
        return problems;
    }

    public static ShowScript? Read(string path, List<FileProblem> problems)
    {
        string text = UserFiles.DecodeUtf8(UserFiles.ReadBytes(path, "show"), path, problems);
        return problems.Count > 0 ? null : Parse(text, path, problems);
    }

    /// <summary>Parses show text; <paramref name="path"/> names it in messages and anchors the sound files it names.</summary>
    public static ShowScript? Parse(string text, string path, List<FileProblem> problems)
    {
        TomlMap? root = TomlTree.Parse(text, path, problems);
        if (root is null) return null;
        var top = new TableReader(root, problems);
        string directory = Path.GetDirectoryName(Path.GetFullPath(path)) ?? ".";

        string? title = top.String("title", required: true, allowed: "the show's title");
        double? length = top.Quantity("length", Dimension.Time, v => v > 0 && v <= 24 * 3600, "a show length from above 0 s to 24 h", required: true);
        Vec3 course = ReadCourse(top.Section("course")) ?? Vec3.UnitX;
        double gridSpacing = top.Quantity("grid_spacing", Dimension.Length, v => v > 0, "a positive length such as \"0.5 ly\"") ?? ShowScript.DefaultGridSpacing;
        Scenario? scene = ReadScene(top, directory, problems);
        ShowCautions cautions = ReadCautions(top.Section("cautions"));
        IReadOnlyList<TableReader> cueTables = top.Sections("cue", required: true);
        var cues = new List<ShowCue>();
        var plans = new Dictionary<string, BurnPlan?>(StringComparer.Ordinal);
        for (int i = 0; i < cueTables.Count; i++)
            if (ReadCue(cueTables[i], i + 1, directory, plans) is { } cue) cues.Add(cue);
        top.Finish();

        if (length is not null) CheckCueTimes(cueTables, cues, length.Value);
        CheckFlightCues(cueTables, cues);
        if (problems.Count > 0 || title is null || length is null) return null;
        return new ShowScript(Path.GetFullPath(path), title, length.Value, course, cautions, cues) { GridSpacing = gridSpacing, Scene = scene };
    }

    /// <summary>The scenario named by <c>scene</c>, relative to the show file; its own problems are reported at their place in it.</summary>
    private static Scenario? ReadScene(TableReader top, string directory, List<FileProblem> problems)
    {
        const string allowed = "a scenario file (.toml) relative to the show file, whose bodies and grid the show draws";
        string? file = top.String("scene", allowed: allowed);
        if (file is null) return null;
        string fullPath = Path.GetFullPath(Path.Combine(directory, file));
        if (file.EndsWith(Extension, StringComparison.OrdinalIgnoreCase) || file.EndsWith(".plan.toml", StringComparison.OrdinalIgnoreCase))
        {
            top.ReportHere("scene", $"\"{file}\" is a show or burn plan, not a scenario", allowed);
            return null;
        }
        if (!File.Exists(fullPath))
        {
            top.ReportHere("scene", $"no such file \"{file}\" (looked for {fullPath})", allowed);
            return null;
        }
        return ScenarioFile.Read(fullPath, problems);
    }

    /// <summary>The course as ICRS right ascension and declination.</summary>
    private static Vec3? ReadCourse(TableReader? table)
    {
        if (table is null) return null;
        double? ra = table.Quantity("ra", Dimension.Angle, v => v >= 0 && v < 2 * Math.PI, "a right ascension from 0 to below 360 deg", required: true);
        double? dec = table.Quantity("dec", Dimension.Angle, v => Math.Abs(v) <= Math.PI / 2, "a declination from -90 deg to 90 deg", required: true);
        table.Finish();
        if (ra is null || dec is null) return null;
        return new Vec3(Math.Cos(dec.Value) * Math.Cos(ra.Value), Math.Cos(dec.Value) * Math.Sin(ra.Value), Math.Sin(dec.Value));
    }

    private static ShowCautions ReadCautions(TableReader? table)
    {
        if (table is null) return ShowCautions.Default;
        double luminance = Luminance(table, "dome_peak_luminance") ?? ShowCautions.DefaultDomePeakLuminance;
        double rate = table.Quantity("max_rotation_rate", Dimension.AngularRate, v => v > 0 && v <= Math.PI, "a positive rate up to 180 deg/s")
                      ?? ShowCautions.DefaultMaxRotationRate;
        table.Finish();
        return new ShowCautions(luminance, rate);
    }

    /// <summary>A luminance such as "120 cd/m2" (the only luminance in the schema, so read here rather than as a core dimension).</summary>
    private static double? Luminance(TableReader table, string key)
    {
        const string allowed = "a luminance from 1 to 10000 cd/m2, e.g. \"120 cd/m2\" (also cd/m^2 or nit)";
        TomlNode? node = table.Node(key, allowed: allowed);
        if (node is null) return null;
        string? text = table.AsString(node, allowed);
        if (text is null) return null;
        string trimmed = text.Trim();
        string? unit = new[] { "cd/m2", "cd/m^2", "nit" }.FirstOrDefault(u => trimmed.EndsWith(u, StringComparison.Ordinal));
        if (unit is null || !double.TryParse(trimmed[..^unit.Length], NumberStyles.Float, CultureInfo.InvariantCulture, out double value))
        {
            table.Report(node, $"\"{text}\" is not a luminance", allowed);
            return null;
        }
        if (!(value >= 1 && value <= 10_000))
        {
            table.Report(node, $"\"{text}\" is out of range", allowed);
            return null;
        }
        return value;
    }

    private static ShowCue? ReadCue(TableReader table, int number, string directory, Dictionary<string, BurnPlan?> plans)
    {
        double? at = table.Quantity("at", Dimension.Time, v => v >= 0, "a show time from 0 s", required: true);
        string label = table.String("label", allowed: "a short name for the operator") ?? $"Cue {number}";
        double transition = table.Quantity("transition", Dimension.Time, v => v >= 0 && v <= 3600, "a time from 0 s to 1 h") ?? 0;
        Easing easing = table.Choice("easing", EasingCurves.ByName.Keys.ToArray()) is { } name ? EasingCurves.ByName[name] : Easing.Smooth;

        double? rapidity = ReadRapidity(table);
        BurnPlan? plan = ReadBurnPlan(table, directory, plans);
        double? compression = table.Number("time_compression", v => v > 0 && v <= MaxTimeCompression, $"ship seconds per show second, above 0 and up to {MaxTimeCompression:0e0}");
        TableReader? lookTable = table.Section("look");
        LookDirection? look = lookTable is null ? null : ReadDirection(lookTable);
        lookTable?.Finish();
        double? fieldOfView = table.Quantity("field_of_view", Dimension.Angle, v => v >= Math.PI / 180 && v <= 170 * Math.PI / 180, "an angle from 1 deg to 170 deg");
        double? fade = ReadFade(table);
        bool? grid = table.Boolean("grid"), bodies = table.Boolean("bodies"), instruments = table.Boolean("instruments");
        bool hold = table.Boolean("hold") ?? false;
        SoundCue? sound = ReadSound(table.Section("sound"), directory);
        string? caption = table.String("caption", allowed: "the caption text, or \"\" to take the caption away");
        table.Finish();

        if (at is null) return null;
        return new ShowCue(number, label, at.Value, transition, easing)
        {
            Rapidity = rapidity, BurnPlan = plan, TimeCompression = compression, Look = look, FieldOfView = fieldOfView, Fade = fade,
            Grid = grid, Bodies = bodies, Instruments = instruments, Hold = hold, Sound = sound, Caption = caption,
        };
    }

    /// <summary>The velocity profile's target: <c>speed = "0.9 c"</c> or, for speeds too close to c to write, <c>rapidity = 5.3</c>.</summary>
    private static double? ReadRapidity(TableReader table)
    {
        double? speed = table.Quantity("speed", Dimension.Speed, v => v >= 0 && v < 1, "a speed from 0 c to below 1 c (use rapidity for more nines)");
        double? rapidity = table.Number("rapidity", v => v >= 0 && v <= 50, "a rapidity from 0 to 50");
        if (speed is not null && rapidity is not null)
        {
            table.ReportHere("rapidity", "given together with speed", "either speed or rapidity in one cue");
            return null;
        }
        return rapidity ?? (speed is { } beta ? Math.Atanh(beta) : null);
    }

    /// <summary>
    /// The burn plan named by <c>burn_plan</c>, relative to the show file; its own problems are reported at their place
    /// in it, once however many cues name it. The show's ship has no engine or turn limits of a scenario, so the plan
    /// is read without a ship.
    /// </summary>
    private static BurnPlan? ReadBurnPlan(TableReader table, string directory, Dictionary<string, BurnPlan?> plans)
    {
        const string allowed = "a burn plan file (.plan.toml) relative to the show file";
        string? file = table.String("burn_plan", allowed: allowed);
        if (file is null) return null;
        string fullPath = Path.GetFullPath(Path.Combine(directory, file));
        if (file.EndsWith(Extension, StringComparison.OrdinalIgnoreCase))
        {
            table.ReportHere("burn_plan", $"\"{file}\" is a show, not a burn plan", allowed);
            return null;
        }
        if (!File.Exists(fullPath))
        {
            table.ReportHere("burn_plan", $"no such file \"{file}\" (looked for {fullPath})", allowed);
            return null;
        }
        if (plans.TryGetValue(fullPath, out BurnPlan? known)) return known;
        // The plan's problems are sorted by their place in the plan file, then listed after the show's.
        var planProblems = new List<FileProblem>();
        BurnPlan? plan = plans[fullPath] = PlanFile.Read(fullPath, null, planProblems);
        table.Problems.AddRange(planProblems);
        return plan;
    }

    /// <summary>
    /// From a <c>burn_plan</c> cue on the plan flies the ship, so the velocity profile (<c>speed</c>, <c>rapidity</c>)
    /// may only come before the first one.
    /// </summary>
    private static void CheckFlightCues(IReadOnlyList<TableReader> tables, List<ShowCue> cues)
    {
        ShowCue? plan = null;
        foreach (ShowCue cue in cues)
        {
            TableReader table = tables[cue.Number - 1];
            bool fliesPlan = table.Has("burn_plan");
            string? profileKey = table.Has("speed") ? "speed" : table.Has("rapidity") ? "rapidity" : null;
            if (profileKey is not null && fliesPlan)
                table.ReportHere(profileKey, "given together with burn_plan", "either a burn plan or a velocity profile in one cue");
            else if (profileKey is not null && plan is not null)
                table.ReportHere(profileKey, $"comes after the burn plan of cue {plan.Number} at {Seconds(plan.At)}, which flies the ship from then on",
                    "speed and rapidity cues before the first burn_plan cue");
            if (fliesPlan) plan ??= cue;
        }
    }

    /// <summary>Azimuth and elevation keys of a table (a missing one is 0), placing a view or a sound on the dome.</summary>
    private static LookDirection ReadDirection(TableReader table)
    {
        double azimuth = table.Quantity("azimuth", Dimension.Angle, v => v >= -2 * Math.PI && v <= 2 * Math.PI, "an angle from -360 deg to 360 deg (0 = forward, 90 deg = right)") ?? 0;
        double elevation = table.Quantity("elevation", Dimension.Angle, v => Math.Abs(v) <= Math.PI / 2, "an angle from -90 deg to 90 deg (90 deg = straight up)") ?? 0;
        return new LookDirection(azimuth, elevation);
    }

    private static double? ReadFade(TableReader table)
    {
        const string allowed = "\"in\" (full picture), \"out\" (black) or a level from 0 to 1";
        TomlNode? node = table.Node("fade", allowed: allowed);
        return node switch
        {
            null => null,
            TomlScalar { Value: string word } when FadeWords.Contains(word) => word == "in" ? 1 : 0,
            TomlScalar { Value: string } => Fail(),
            _ => table.AsNumber(node, v => v >= 0 && v <= 1, allowed),
        };

        double? Fail()
        {
            table.Report(node, $"unknown fade \"{((TomlScalar)node).Value}\"", allowed);
            return null;
        }
    }

    private static SoundCue? ReadSound(TableReader? table, string directory)
    {
        if (table is null) return null;
        string? file = table.String("file", required: true, allowed: "a WAV file path, relative to the show file");
        double? gain = Decibels(table, "gain");
        LookDirection? direction = table.Has("azimuth") || table.Has("elevation") ? ReadDirection(table) : null;
        table.Finish();
        if (file is null) return null;
        string fullPath = Path.GetFullPath(Path.Combine(directory, file));
        if (!File.Exists(fullPath))
        {
            table.ReportHere("file", $"no such file \"{file}\" (looked for {fullPath})", "a WAV file path, relative to the show file");
            return null;
        }
        return new SoundCue(fullPath, gain ?? 0, direction);
    }

    private static double? Decibels(TableReader table, string key)
    {
        const string allowed = "a gain from -60 dB to 12 dB, e.g. \"-6 dB\"";
        TomlNode? node = table.Node(key, allowed: allowed);
        if (node is null) return null;
        string? text = table.AsString(node, allowed);
        if (text is null) return null;
        string trimmed = text.Trim();
        if (!trimmed.EndsWith("dB", StringComparison.Ordinal)
            || !double.TryParse(trimmed[..^2], NumberStyles.Float, CultureInfo.InvariantCulture, out double value)
            || !(value >= -60 && value <= 12))
        {
            table.Report(node, $"\"{text}\" is not a gain in range", allowed);
            return null;
        }
        return value;
    }

    /// <summary>Cues must run in time order and start within the show.</summary>
    private static void CheckCueTimes(IReadOnlyList<TableReader> tables, List<ShowCue> cues, double length)
    {
        ShowCue? previous = null;
        foreach (ShowCue cue in cues)
        {
            TableReader table = tables[cue.Number - 1];
            if (cue.At > length)
                table.ReportHere("at", $"cue starts at {Seconds(cue.At)}, after the show ends at {Seconds(length)}", $"a time from 0 s to {Seconds(length)}");
            if (previous is not null && cue.At < previous.At)
                table.ReportHere("at", $"cue starts at {Seconds(cue.At)}, before cue {previous.Number} at {Seconds(previous.At)}", "cues in time order");
            previous = cue;
        }
    }

    private static string Seconds(double seconds) => seconds.ToString("0.###", CultureInfo.InvariantCulture) + " s";
}
