using System.Text.Json;

namespace Lightward.Cli.Tests;

public class PlanCommandTests
{
    [Fact]
    public void Flip_plan_as_json_has_the_promised_keys_and_values()
    {
        var result = CliRunner.Run("plan", "--profile", "flip", "--distance", "4.2 ly", "--accel", "1 g", "--exhaust", "1 c", "--json");
        Assert.Equal(0, result.ExitCode);
        using var json = JsonDocument.Parse(result.Stdout);
        JsonElement root = json.RootElement;
        foreach (string key in new[] { "profile", "distance_ly", "accel_g", "ship_time_yr", "home_time_yr", "peak_beta", "peak_gamma", "peak_rapidity", "mass_ratio", "phases", "signals" })
            Assert.True(root.TryGetProperty(key, out _), $"missing key {key}");
        Assert.Equal("flip", root.GetProperty("profile").GetString());
        // Half the trip from rest at a = 1 g: aτ = acosh(1 + a·2.1 ly) (Rindler 2006, ch. 3, hyperbolic motion);
        // 1 g = 9.80665 m/s² (CGPM 1901), ly = c × 365.25 d (IAU).
        double a = 9.80665 / 299_792_458.0 * 365.25 * 86_400, phi = Math.Acosh(1 + a * 2.1);
        Assert.Equal(2 * phi / a, root.GetProperty("ship_time_yr").GetDouble(), 10);
        Assert.Equal(2 * Math.Sinh(phi) / a, root.GetProperty("home_time_yr").GetDouble(), 10);
        Assert.Equal(Math.Cosh(phi), root.GetProperty("peak_gamma").GetDouble(), 10);
        // Photon rocket: m₀/m₁ = e^(Δφ) with Δφ = 2φ (Ackeret 1946 with v_e = c).
        Assert.Equal(1, root.GetProperty("mass_ratio").GetDouble() / Math.Exp(2 * phi), 10);
        Assert.Equal(2, root.GetProperty("phases").GetArrayLength());
        JsonElement signals = root.GetProperty("signals");
        // Light from arrival at (T, 4.2 ly) reaches home at T + 4.2 yr; the last message from home to arrive by then left at T − 4.2 yr.
        double home = 2 * Math.Sinh(phi) / a;
        Assert.Equal(home + 4.2, signals.GetProperty("home_sees_yr").GetProperty("arrival").GetDouble(), 9);
        Assert.Equal(home - 4.2, signals.GetProperty("last_message_before_arrival_yr").GetDouble(), 9);
        Assert.Equal(home / 2 + 2.1, signals.GetProperty("home_sees_yr").GetProperty("turnover").GetDouble(), 9);
    }

    [Fact]
    public void Coast_plan_prints_readable_tables()
    {
        var result = CliRunner.Run("plan", "--profile", "coast", "--distance", "12 ly", "--accel", "9.8 m/s^2", "--cruise", "2.5 rapidity");
        Assert.Equal(0, result.ExitCode);
        foreach (string text in new[] { "accelerate", "coast", "brake", "cruise reached", "braking begins", "arrival", "home sees it" })
            Assert.Contains(text, result.Stdout);
    }

    [Fact]
    public void Flyby_without_exhaust_reports_a_null_mass_ratio()
    {
        var result = CliRunner.Run("plan", "--profile", "flyby", "--distance", "1000 ly", "--accel", "2 g", "--json");
        Assert.Equal(0, result.ExitCode);
        using var json = JsonDocument.Parse(result.Stdout);
        Assert.Equal(JsonValueKind.Null, json.RootElement.GetProperty("mass_ratio").ValueKind);
        Assert.True(json.RootElement.GetProperty("peak_one_minus_beta").GetDouble() > 0);
    }

    [Theory]
    [InlineData("--accel", "--profile", "flip", "--distance", "4.2 ly", "--accel", "0 g")]
    [InlineData("--accel", "--profile", "flip", "--distance", "4.2 ly", "--accel", "-1 g")]
    [InlineData("--distance", "--profile", "flip", "--distance", "4.2 parsecs", "--accel", "1 g")]
    [InlineData("--distance", "--profile", "flip", "--accel", "1 g")]
    [InlineData("--profile", "--profile", "sprint", "--distance", "4.2 ly", "--accel", "1 g")]
    [InlineData("--cruise", "--profile", "coast", "--distance", "4.2 ly", "--accel", "1 g", "--cruise", "1 c")]
    [InlineData("--cruise", "--profile", "coast", "--distance", "4.2 ly", "--accel", "1 g", "--cruise", "0.99 c")]
    [InlineData("--cruise", "--profile", "coast", "--distance", "4.2 ly", "--accel", "1 g")]
    [InlineData("--cruise", "--profile", "flip", "--distance", "4.2 ly", "--accel", "1 g", "--cruise", "0.5 c")]
    [InlineData("--exhaust", "--profile", "flip", "--distance", "4.2 ly", "--accel", "1 g", "--exhaust", "2 c")]
    [InlineData("--max-mass-ratio", "--profile", "flip", "--distance", "4.2 ly", "--accel", "1 g", "--exhaust", "0.1 c", "--max-mass-ratio", "100")]
    [InlineData("--max-mass-ratio", "--profile", "flip", "--distance", "4.2 ly", "--accel", "1 g", "--max-mass-ratio", "100")]
    public void Impossible_requests_fail_with_one_line_naming_the_flag(string flag, params string[] arguments)
    {
        var result = CliRunner.Run(["plan", .. arguments]);
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"lightward: error: {flag}", result.Stderr);
        Assert.Single(result.Stderr.Trim().Split('\n'));
    }
}
