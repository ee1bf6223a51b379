using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>`lightward plan`: times, speeds, propellant and light-signal timing of a straight trip under constant proper acceleration.</summary>
public sealed class PlanCommand : Command<PlanCommand.Settings>
{
    public sealed class Settings : CommandSettings
    {
        [CommandOption("--profile <PROFILE>")]
        [Description("flip (accelerate to the midpoint, turn, brake, arrive at rest), coast (accelerate to --cruise, coast, brake) or flyby (accelerate the whole way)")]
        public string? Profile { get; init; }

        [CommandOption("--distance <LENGTH>")]
        [Description("Trip length with a unit, e.g. '4.2 ly', '30 au', '1.3 pc'")]
        public string? Distance { get; init; }

        [CommandOption("--accel <ACCELERATION>")]
        [Description("Proper acceleration felt aboard, e.g. '1 g', '9.8 m/s^2'")]
        public string? Accel { get; init; }

        [CommandOption("--cruise <SPEED>")]
        [Description("coast profile: cruise as a speed ('0.8 c', '12 km/s'), a rapidity ('2.5 rapidity') or a Lorentz factor ('10 gamma')")]
        public string? Cruise { get; init; }

        [CommandOption("--exhaust <SPEED>")]
        [Description("Exhaust speed for the propellant mass ratio, e.g. '1 c' (photon rocket), '0.1 c'")]
        public string? Exhaust { get; init; }

        [CommandOption("--max-mass-ratio <RATIO>")]
        [Description("Largest affordable initial/final mass ratio (needs --exhaust); a trip needing more is refused")]
        public string? MaxMassRatio { get; init; }

        [CommandOption("--json")]
        [Description("Print the plan as JSON instead of tables")]
        public bool Json { get; init; }
    }

    private static readonly Dictionary<string, MissionProfile> Profiles = new()
    {
        ["flip"] = MissionProfile.Flip, ["coast"] = MissionProfile.Coast, ["flyby"] = MissionProfile.Flyby,
    };

    private static readonly Dictionary<MissionInput, string> Flags = new()
    {
        [MissionInput.Distance] = "--distance", [MissionInput.Acceleration] = "--accel", [MissionInput.Cruise] = "--cruise",
        [MissionInput.Exhaust] = "--exhaust", [MissionInput.MassRatioLimit] = "--max-mass-ratio",
    };

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        MissionPlan plan;
        try
        {
            plan = MissionPlanner.Plan(ReadRequest(settings));
        }
        catch (MissionPlanException problem)
        {
            throw new UserInputException($"{Flags[problem.Input]}: {problem.Message}");
        }
        if (settings.Json) Console.Out.WriteLine(PlanJson.Write(plan));
        else PlanTables.Write(plan, AnsiConsole.Console);
        return ErrorReporting.Success;
    }

    private static MissionRequest ReadRequest(Settings settings)
    {
        if (settings.Profile is null || !Profiles.TryGetValue(settings.Profile, out MissionProfile profile))
            throw new UserInputException($"--profile: {(settings.Profile is null ? "missing" : $"unknown profile '{settings.Profile}'")}; expected one of {string.Join(", ", Profiles.Keys)}");
        double distance = Quantity.Parse(Required(settings.Distance, "--distance"), Dimension.Length, "--distance");
        double accel = Quantity.Parse(Required(settings.Accel, "--accel"), Dimension.Acceleration, "--accel");
        double? cruise = settings.Cruise is null ? null : Quantity.ParseRapidity(settings.Cruise, "--cruise");
        if (profile == MissionProfile.Coast && cruise is null)
            throw new UserInputException("--cruise: missing; the coast profile needs a cruise such as '0.8 c', '2.5 rapidity' or '10 gamma'");
        double? exhaust = settings.Exhaust is null ? null : Quantity.Parse(settings.Exhaust, Dimension.Speed, "--exhaust");
        double? limit = null;
        if (settings.MaxMassRatio is not null)
        {
            if (!double.TryParse(settings.MaxMassRatio, NumberStyles.Float, CultureInfo.InvariantCulture, out double ratio))
                throw new UserInputException($"--max-mass-ratio: '{settings.MaxMassRatio}' is not a number; expected a plain number above 1, e.g. 20");
            limit = ratio;
        }
        return new MissionRequest(profile, distance, accel, cruise, exhaust, limit);
    }

    private static string Required(string? value, string flag) =>
        value ?? throw new UserInputException($"{flag}: missing; every plan needs --distance and --accel with units, e.g. --distance '4.2 ly' --accel '1 g'");
}

/// <summary>Readable tables of a plan: phases, then when each milestone is seen.</summary>
internal static class PlanTables
{
    public static void Write(MissionPlan plan, IAnsiConsole console)
    {
        MissionRequest request = plan.Request;
        console.MarkupLine(Markup.Escape(Invariant(
            $"{request.Profile.ToString().ToLowerInvariant()} trip over {PlanFormat.Length(request.Distance)} at {request.Acceleration / Units.G:G4} g: ship clock {PlanFormat.Duration(plan.ShipTime)}, home clock {PlanFormat.Duration(plan.HomeTime)}")));
        console.MarkupLine(Markup.Escape(Invariant(
            $"peak speed {PlanFormat.Speed(plan.PeakRapidity)}, γ {PlanFormat.Gamma(plan.PeakRapidity)}, rapidity {plan.PeakRapidity:G6}; rapidity change {plan.RapidityBudget:G6}{MassText(plan)}")));

        var phases = new Table().Title("phases");
        foreach (string column in new[] { "phase", "ship clock", "home clock", "distance from home", "speed", "γ" })
            phases.AddColumn(column);
        foreach (MissionPhase phase in plan.Phases)
        {
            phases.AddRow(
                phase.Name,
                $"{PlanFormat.Duration(phase.Start.ShipTime)} → {PlanFormat.Duration(phase.End.ShipTime)}",
                $"{PlanFormat.Duration(phase.Start.HomeTime)} → {PlanFormat.Duration(phase.End.HomeTime)}",
                $"{PlanFormat.Length(phase.Start.Distance)} → {PlanFormat.Length(phase.End.Distance)}",
                $"{PlanFormat.Speed(phase.Start.Rapidity)} → {PlanFormat.Speed(phase.End.Rapidity)}",
                $"{PlanFormat.Gamma(phase.Start.Rapidity)} → {PlanFormat.Gamma(phase.End.Rapidity)}");
        }
        console.Write(phases);

        var signals = new Table().Title("light signals (home clock)");
        foreach (string column in new[] { "milestone", "happens at", "home sees it", "last message from home that reaches the ship by then" })
            signals.AddColumn(column);
        foreach (MissionMilestone milestone in plan.Milestones)
        {
            signals.AddRow(
                milestone.Name,
                PlanFormat.Duration(milestone.Moment.HomeTime),
                PlanFormat.Duration(milestone.Moment.SeenAtHome),
                milestone.Moment.LatestMessageFromHome < 0 ? "sent before departure" : PlanFormat.Duration(milestone.Moment.LatestMessageFromHome));
        }
        console.Write(signals);
        console.MarkupLine(Markup.Escape($"the destination sees the departure at home time {PlanFormat.Duration(plan.DestinationSeesDeparture)}"));
    }

    private static string MassText(MissionPlan plan) => plan.LogMassRatio is double log
        ? Invariant($"; mass ratio {PlanFormat.MassRatio(log)} with exhaust {plan.Request.ExhaustSpeed:G6} c")
        : "";

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}

/// <summary>Numbers with units chosen for reading: durations from seconds to years, lengths from km to ly.</summary>
internal static class PlanFormat
{
    public static string Duration(double seconds)
    {
        double size = Math.Abs(seconds);
        return size switch
        {
            < 3600 => Text($"{seconds:G4} s"),
            < 2 * Units.Day => Text($"{seconds / 3600:G4} h"),
            < Units.JulianYear => Text($"{seconds / Units.Day:G4} d"),
            _ => $"{Readable(seconds / Units.JulianYear)} yr",
        };
    }

    public static string Length(double lightSeconds)
    {
        const double au = Units.AstronomicalUnitMetres / Units.SpeedOfLight;
        return Math.Abs(lightSeconds) switch
        {
            0 => "0",
            < 0.01 * au => Text($"{lightSeconds / Units.Kilometre:G4} km"),
            < 0.01 * Units.LightYear => Text($"{lightSeconds / au:G4} au"),
            _ => $"{Readable(lightSeconds / Units.LightYear)} ly",
        };
    }

    /// <summary>β for ordinary speeds; "1 − ε" once β would print as a string of nines.</summary>
    public static string Speed(double rapidity)
    {
        double oneMinusBeta = Math.Exp(-rapidity) / Math.Cosh(rapidity);
        return oneMinusBeta < 1e-4 ? Text($"(1 − {oneMinusBeta:0.##e+0}) c") : Text($"{Math.Tanh(rapidity):G5} c");
    }

    public static string Gamma(double rapidity) => Readable(Math.Cosh(rapidity));

    /// <summary>Five significant digits; large values with thousands separators rather than an exponent.</summary>
    private static string Readable(double value) =>
        Math.Abs(value) is >= 1e5 and < 1e15 ? Text($"{value:N0}") : Text($"{value:G5}").Replace("E+", "e+").Replace("E-", "e-");

    public static string MassRatio(double logMassRatio)
    {
        double ratio = Math.Exp(logMassRatio);
        return double.IsFinite(ratio) ? Readable(ratio) : $"10^{Readable(logMassRatio / Math.Log(10))}";
    }

    private static string Text(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}

/// <summary>The plan as JSON: years and light-years, with 1 − β alongside β so nothing rounds to 1.</summary>
internal static class PlanJson
{
    public static string Write(MissionPlan plan)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true }))
        {
            MissionRequest request = plan.Request;
            json.WriteStartObject();
            json.WriteString("profile", request.Profile.ToString().ToLowerInvariant());
            json.WriteNumber("distance_ly", Years(request.Distance));
            json.WriteNumber("accel_g", request.Acceleration / Units.G);
            WriteNullable(json, "cruise_rapidity", request.CruiseRapidity);
            json.WriteNumber("ship_time_yr", Years(plan.ShipTime));
            json.WriteNumber("home_time_yr", Years(plan.HomeTime));
            json.WriteNumber("peak_beta", Math.Tanh(plan.PeakRapidity));
            json.WriteNumber("peak_one_minus_beta", Math.Exp(-plan.PeakRapidity) / Math.Cosh(plan.PeakRapidity));
            json.WriteNumber("peak_gamma", Math.Cosh(plan.PeakRapidity));
            json.WriteNumber("peak_rapidity", plan.PeakRapidity);
            json.WriteNumber("rapidity_change", plan.RapidityBudget);
            WriteNullable(json, "exhaust_c", request.ExhaustSpeed);
            double? massRatio = plan.MassRatio is double ratio && double.IsFinite(ratio) ? ratio : null;
            WriteNullable(json, "mass_ratio", massRatio);
            WriteNullable(json, "log10_mass_ratio", plan.LogMassRatio / Math.Log(10));

            json.WriteStartArray("phases");
            foreach (MissionPhase phase in plan.Phases)
            {
                json.WriteStartObject();
                json.WriteString("name", phase.Name);
                WriteMoment(json, "start", phase.Start);
                WriteMoment(json, "end", phase.End);
                json.WriteEndObject();
            }
            json.WriteEndArray();

            json.WriteStartObject("signals");
            json.WriteStartObject("home_sees_yr");
            foreach (MissionMilestone milestone in plan.Milestones) json.WriteNumber(milestone.Name, Years(milestone.Moment.SeenAtHome));
            json.WriteEndObject();
            json.WriteStartObject("last_message_from_home_yr");
            foreach (MissionMilestone milestone in plan.Milestones) json.WriteNumber(milestone.Name, Years(milestone.Moment.LatestMessageFromHome));
            json.WriteEndObject();
            json.WriteNumber("last_message_before_arrival_yr", Years(plan.Arrival.LatestMessageFromHome));
            json.WriteNumber("destination_sees_departure_yr", Years(plan.DestinationSeesDeparture));
            json.WriteEndObject();
            json.WriteEndObject();
        }
        return System.Text.Encoding.UTF8.GetString(buffer.ToArray());
    }

    private static void WriteMoment(Utf8JsonWriter json, string prefix, MissionMoment moment)
    {
        json.WriteNumber($"ship_time_{prefix}_yr", Years(moment.ShipTime));
        json.WriteNumber($"home_time_{prefix}_yr", Years(moment.HomeTime));
        json.WriteNumber($"distance_{prefix}_ly", Years(moment.Distance));
        json.WriteNumber($"beta_{prefix}", moment.Beta);
        json.WriteNumber($"one_minus_beta_{prefix}", moment.OneMinusBeta);
        json.WriteNumber($"gamma_{prefix}", moment.Gamma);
        json.WriteNumber($"rapidity_{prefix}", moment.Rapidity);
    }

    private static void WriteNullable(Utf8JsonWriter json, string name, double? value)
    {
        if (value is double number) json.WriteNumber(name, number);
        else json.WriteNull(name);
    }

    /// <summary>Seconds → Julian years, and light-seconds → light-years (the same factor, c = 1).</summary>
    private static double Years(double internalValue) => internalValue / Units.JulianYear;
}
