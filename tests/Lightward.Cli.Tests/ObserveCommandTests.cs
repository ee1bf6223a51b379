using System.Text.Json;

namespace Lightward.Cli.Tests;

public class ObserveCommandTests
{
    [Fact]
    public void Json_lists_the_brightest_stars_with_ship_state_and_the_promised_fields()
    {
        var result = CliRunner.Run("observe", "--heading", "Vega", "--beta", "0.6", "--limit", "5", "--json");
        Assert.True(result.ExitCode == 0, result.Stderr);
        using JsonDocument document = JsonDocument.Parse(result.Stdout);
        JsonElement ship = document.RootElement.GetProperty("ship");
        Assert.Equal(0.6, ship.GetProperty("beta").GetDouble(), 12);
        // γ = 1/√(1 − β²) = 1.25 for β = 0.6 (Einstein 1905, §4).
        Assert.Equal(1.25, ship.GetProperty("gamma").GetDouble(), 12);
        Assert.Equal(Math.Atanh(0.6), ship.GetProperty("rapidity").GetDouble(), 12);
        // The ship flies nose first, so its velocity points along ship +Z.
        Assert.Equal([0.0, 0.0, 1.0], ship.GetProperty("velocity_dir").EnumerateArray().Select(v => Math.Round(v.GetDouble(), 12)).ToArray());

        JsonElement[] sources = document.RootElement.GetProperty("sources").EnumerateArray().ToArray();
        Assert.Equal(5, sources.Length);
        double previous = double.NegativeInfinity;
        foreach (JsonElement source in sources)
        {
            foreach (string field in new[] { "name", "kind", "rest_dir", "apparent_dir", "doppler", "flux_ratio", "apparent_mag", "color_temperature_k" })
                Assert.True(source.TryGetProperty(field, out _), $"missing {field}");
            double magnitude = source.GetProperty("apparent_mag").GetDouble();
            Assert.True(magnitude >= previous, "sources must be sorted brightest first");
            previous = magnitude;
            // Bolometric flux of a star at rest in the home frame scales as D² (Rybicki & Lightman 1979, §4.8).
            double doppler = source.GetProperty("doppler").GetDouble();
            Assert.Equal(doppler * doppler, source.GetProperty("flux_ratio").GetDouble(), 9);
        }
    }

    [Fact]
    public void Dead_ahead_the_Doppler_factor_is_e_to_the_rapidity()
    {
        // D = e^φ straight ahead (any SR text; e.g. Rindler, Relativity: Special, General, and Cosmological, 2006, §4.3).
        var result = CliRunner.Run("observe", "--heading", "Sirius", "--rapidity", "2", "--limit", "all", "--json");
        Assert.True(result.ExitCode == 0, result.Stderr);
        using JsonDocument document = JsonDocument.Parse(result.Stdout);
        JsonElement sirius = document.RootElement.GetProperty("sources").EnumerateArray().First(s => s.GetProperty("name").GetString() == "Sirius");
        Assert.Equal(Math.Exp(2), sirius.GetProperty("doppler").GetDouble(), 6);
        Assert.Equal(1.0, sirius.GetProperty("apparent_dir")[2].GetDouble(), 6);
    }

    [Fact]
    public void The_table_names_the_stars_and_the_ship_speed()
    {
        var result = CliRunner.Run("observe", "--limit", "3");
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.Contains("Sirius", result.Stdout);
        Assert.Contains("β = 0", result.Stdout);
    }

    [Theory]
    [InlineData("--limit", "0")]
    [InlineData("--limit", "some")]
    [InlineData("--stars", "5")]
    public void Bad_input_names_the_flag(string flag, string value)
    {
        var result = CliRunner.Run("observe", flag, value);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains(flag, result.Stderr);
    }
}
