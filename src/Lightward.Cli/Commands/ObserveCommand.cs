using System.ComponentModel;
using System.Globalization;
using System.Text.Json;
using Lightward.Optics;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Files;
using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>`lightward observe`: what the ship sees of each source — where it appears, its Doppler factor, brightness and colour.</summary>
public sealed class ObserveCommand : Command<ObserveCommand.Settings>
{
    public sealed class Settings : ViewSettings
    {
        [CommandOption("--limit <COUNT>")]
        [Description("How many sources to list, brightest as seen first: a whole number (default 20) or all.")]
        public string? Limit { get; init; }

        [CommandOption("--json")]
        [Description("Print JSON (a 'ship' object and a 'sources' array) instead of a table.")]
        public bool Json { get; init; }
    }

    /// <summary>One source as seen from the ship; directions are unit vectors.</summary>
    private sealed record Sighting(string Name, Vec3 RestDirection, double RestMagnitude, ApparentStar Seen);

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        int? limit = ParseLimit(settings.Limit);
        ViewState view = settings.Resolve();
        List<Sighting> sightings = Observe(view, limit);
        IReadOnlyList<BodyView> bodies = settings.ScenarioPath is null ? [] : ViewNearField.FromScenario(ScenarioFile.Load(settings.ScenarioPath)).Look(view.Ship, Rotation.Identity);
        if (settings.Json) WriteJson(view.Ship, sightings, bodies);
        else
        {
            WriteTable(view.Ship, sightings);
            if (bodies.Count > 0) WriteBodyTable(bodies);
        }
        return 0;
    }

    private static int? ParseLimit(string? text)
    {
        if (text is null) return 20;
        if (text.Trim().Equals("all", StringComparison.OrdinalIgnoreCase)) return null;
        if (int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int limit) && limit >= 1) return limit;
        throw new UserInputException($"--limit: '{text}' is not a whole number of at least 1 or 'all'");
    }

    /// <summary>Every star through the double-precision optics, brightest apparent magnitude first (catalogue order breaks ties).</summary>
    private static List<Sighting> Observe(ViewState view, int? limit)
    {
        StarCatalog sky = view.Sky;
        var seen = new ApparentStar[sky.Count];
        for (int i = 0; i < sky.Count; i++)
            seen[i] = Starlight.Observe(sky.Direction(i), sky.Magnitude[i], sky.Temperature[i], view.Ship.Frame);
        int[] order = Enumerable.Range(0, sky.Count).ToArray();
        Array.Sort(order, (a, b) => seen[a].ApparentMagnitude != seen[b].ApparentMagnitude
            ? seen[a].ApparentMagnitude.CompareTo(seen[b].ApparentMagnitude) : a.CompareTo(b));
        return order.Take(limit ?? sky.Count)
            .Select(i => new Sighting(NameOf(sky, i), sky.Direction(i), sky.Magnitude[i], seen[i]))
            .ToList();
    }

    private static string NameOf(StarCatalog sky, int index) =>
        sky.Names[index] ?? (sky.HipparcosNumber[index] > 0 ? $"HIP {sky.HipparcosNumber[index]}" : $"star {index}");

    /// <summary>Azimuth from the nose toward the right and elevation toward up, degrees; + 0.0 turns −0 into 0 for printing.</summary>
    private static (double Azimuth, double Elevation) ShipAngles(Vec3 direction) =>
        (Math.Atan2(direction.X, direction.Z) * 180 / Math.PI + 0.0, Math.Asin(Math.Clamp(direction.Y, -1, 1)) * 180 / Math.PI + 0.0);

    private static (double RightAscension, double Declination) SkyAngles(Vec3 direction)
    {
        double rightAscension = Math.Atan2(direction.Y, direction.X) * 180 / Math.PI;
        return (rightAscension < 0 ? rightAscension + 360 : rightAscension, Math.Asin(Math.Clamp(direction.Z, -1, 1)) * 180 / Math.PI);
    }

    private static Vec3 MotionInShipAxes(ShipState ship) => ship.Frame.Orientation.Inverse.Rotate(ship.Velocity.Direction);

    private static void WriteTable(ShipState ship, List<Sighting> sightings)
    {
        Velocity velocity = ship.Velocity;
        (double motionAzimuth, double motionElevation) = ShipAngles(MotionInShipAxes(ship));
        AnsiConsole.MarkupLine(Markup.Escape(FormattableString.Invariant(
            $"ship: β = {velocity.Beta:G10} (1 − β = {velocity.OneMinusBeta:G4}), γ = {velocity.Gamma:G6}, rapidity {velocity.Rapidity:G6}, moving toward azimuth {motionAzimuth:F1}°, elevation {motionElevation:F1}° (ship axes)")));
        var table = new Table().Border(TableBorder.Rounded);
        table.AddColumns("source", "RA, Dec at rest (°)", "azimuth, elevation seen (°)", "Doppler D", "flux ×", "magnitude rest → seen", "colour T (K)");
        foreach (Sighting s in sightings)
        {
            (double ra, double dec) = SkyAngles(s.RestDirection);
            (double azimuth, double elevation) = ShipAngles(s.Seen.Ship);
            table.AddRow(
                Markup.Escape(s.Name),
                FormattableString.Invariant($"{ra:F2}, {dec:+0.00;-0.00}"),
                FormattableString.Invariant($"{azimuth:F3}, {elevation:+0.000;-0.000}"),
                FormattableString.Invariant($"{s.Seen.DopplerFactor:G5}"),
                FormattableString.Invariant($"{s.Seen.FluxFactor:G4}"),
                FormattableString.Invariant($"{s.RestMagnitude:F2} → {FormatMagnitude(s.Seen.ApparentMagnitude)}"),
                FormattableString.Invariant($"{s.Seen.ApparentTemperature:F0}"));
        }
        AnsiConsole.Write(table);
    }

    private static string FormatMagnitude(double magnitude) =>
        double.IsFinite(magnitude) ? magnitude.ToString("F2", CultureInfo.InvariantCulture) : "invisible";

    /// <summary>Bodies as their light shows them now (see <see cref="BodyAppearance"/>); directions in ship axes.</summary>
    private static void WriteBodyTable(IReadOnlyList<BodyView> bodies)
    {
        var table = new Table().Border(TableBorder.Rounded);
        table.AddColumns("body", "azimuth, elevation seen (°)", "Doppler D", "distance (light path)", "angular size (°)", "turned by (°)", "clock shows");
        foreach (BodyView body in bodies)
        {
            if (body.Appearance is not { } seen)
            {
                table.AddRow(Markup.Escape(body.Body.Name), "no light has arrived yet", "", "", "", "", "");
                continue;
            }
            (double azimuth, double elevation) = ShipAngles(seen.Direction);
            table.AddRow(
                Markup.Escape(body.Body.Name),
                FormattableString.Invariant($"{azimuth:F3}, {elevation:+0.000;-0.000}"),
                FormattableString.Invariant($"{seen.Doppler:G5}"),
                Rendering.Instruments.Readout.Distance(seen.Distance),
                FormattableString.Invariant($"{seen.AngularDiameter * 180 / Math.PI:G4}"),
                FormattableString.Invariant($"{seen.ApparentRotation * 180 / Math.PI:F2}"),
                body.Body.CarriesClock ? Rendering.Instruments.Readout.Clock(seen.ClockReading) : "");
        }
        AnsiConsole.Write(table);
    }

    private static void WriteBodiesJson(Utf8JsonWriter json, IReadOnlyList<BodyView> bodies)
    {
        json.WriteStartArray("bodies");
        foreach (BodyView body in bodies)
        {
            json.WriteStartObject();
            json.WriteString("name", body.Body.Name);
            json.WriteString("kind", "body");
            json.WriteBoolean("seen", body.Appearance is not null);
            if (body.Appearance is { } seen)
            {
                (double azimuth, double elevation) = ShipAngles(seen.Direction);
                WriteVector(json, "apparent_dir", seen.Direction);
                json.WriteNumber("azimuth_deg", azimuth);
                json.WriteNumber("elevation_deg", elevation);
                json.WriteNumber("doppler", seen.Doppler);
                json.WriteNumber("light_path_ls", seen.Distance);
                json.WriteNumber("angular_diameter_deg", seen.AngularDiameter * 180 / Math.PI);
                json.WriteNumber("apparent_rotation_deg", seen.ApparentRotation * 180 / Math.PI);
                if (body.Body.CarriesClock) json.WriteNumber("clock_s", seen.ClockReading);
                else json.WriteNull("clock_s");
            }
            json.WriteEndObject();
        }
        json.WriteEndArray();
    }

    private static void WriteJson(ShipState ship, List<Sighting> sightings, IReadOnlyList<BodyView> bodies)
    {
        using Stream stdout = Console.OpenStandardOutput();
        using var json = new Utf8JsonWriter(stdout, new JsonWriterOptions { Indented = true });
        Velocity velocity = ship.Velocity;
        json.WriteStartObject();
        json.WriteStartObject("ship");
        json.WriteNumber("beta", velocity.Beta);
        json.WriteNumber("one_minus_beta", velocity.OneMinusBeta);
        json.WriteNumber("gamma", velocity.Gamma);
        json.WriteNumber("rapidity", velocity.Rapidity);
        WriteVector(json, "velocity_dir", MotionInShipAxes(ship));
        json.WriteNumber("ship_time_s", ship.ShipTime);
        json.WriteNumber("home_time_s", ship.HomeTime);
        json.WriteEndObject();
        json.WriteStartArray("sources");
        foreach (Sighting s in sightings)
        {
            (double ra, double dec) = SkyAngles(s.RestDirection);
            (double azimuth, double elevation) = ShipAngles(s.Seen.Ship);
            json.WriteStartObject();
            json.WriteString("name", s.Name);
            json.WriteString("kind", "star");
            WriteVector(json, "rest_dir", s.RestDirection);
            json.WriteNumber("rest_ra_deg", ra);
            json.WriteNumber("rest_dec_deg", dec);
            json.WriteNumber("rest_mag", s.RestMagnitude);
            WriteVector(json, "apparent_dir", s.Seen.Ship);
            json.WriteNumber("azimuth_deg", azimuth);
            json.WriteNumber("elevation_deg", elevation);
            json.WriteNumber("doppler", s.Seen.DopplerFactor);
            json.WriteNumber("flux_ratio", s.Seen.FluxFactor);
            // A star redshifted to black has magnitude +∞, which JSON cannot hold.
            if (double.IsFinite(s.Seen.ApparentMagnitude)) json.WriteNumber("apparent_mag", s.Seen.ApparentMagnitude);
            else json.WriteNull("apparent_mag");
            json.WriteNumber("color_temperature_k", s.Seen.ApparentTemperature);
            json.WriteEndObject();
        }
        json.WriteEndArray();
        WriteBodiesJson(json, bodies);
        json.WriteEndObject();
        json.Flush();
        stdout.Write("\n"u8);
    }

    private static void WriteVector(Utf8JsonWriter json, string name, Vec3 v)
    {
        json.WriteStartArray(name);
        json.WriteNumberValue(v.X);
        json.WriteNumberValue(v.Y);
        json.WriteNumberValue(v.Z);
        json.WriteEndArray();
    }
}
