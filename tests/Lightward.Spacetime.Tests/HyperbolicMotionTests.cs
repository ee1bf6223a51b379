namespace Lightward.Spacetime.Tests;

public class HyperbolicMotionTests
{
    private const double A = Units.G;

    private static void AssertRelative(double expected, double actual, double tolerance) =>
        Assert.True(Math.Abs(actual - expected) <= tolerance * Math.Abs(expected), $"expected {expected:R}, got {actual:R} (relative tolerance {tolerance})");

    [Theory]
    [InlineData(1e-6)]
    [InlineData(0.3)]
    [InlineData(1)]
    [InlineData(5)]
    [InlineData(12)]
    [InlineData(25)]
    public void Motion_from_rest_follows_the_textbook_closed_form(double rapidity)
    {
        var ship = new HyperbolicWorldline(new FourVector(0, 0, 0, 0), Velocity.Rest, A * Vec3.UnitZ);
        double tau = rapidity / A;
        FourVector e = ship.EventAtProperTime(tau);
        FourVector u = ship.FourVelocityAtProperTime(tau);
        // Rindler, Relativity: Special, General, and Cosmological (2006), ch. 3 (hyperbolic motion), with c = 1:
        // t = sinh(aτ)/a, x = (cosh(aτ) − 1)/a = 2 sinh²(aτ/2)/a, u = (cosh aτ, sinh aτ).
        AssertRelative(Math.Sinh(rapidity) / A, e.T, 1e-14);
        AssertRelative(2 * Math.Pow(Math.Sinh(rapidity / 2), 2) / A, e.Z, 1e-14);
        AssertRelative(Math.Cosh(rapidity), u.T, 1e-14);
        AssertRelative(Math.Sinh(rapidity), u.Z, 1e-14);
        AssertRelative(tau, ship.ProperTimeAtHomeTime(e.T), 1e-13);
        AssertRelative(rapidity, ship.RestFrameAtProperTime(tau).Velocity.Rapidity, 1e-14);
    }

    [Theory]
    // Usenet Physics FAQ, "The Relativistic Rocket" (P. Gibbs, J. Baez), table for a 1 g rocket (from memory): the
    // FAQ works in years and light-years with 1 g taken as 1.03 ly/yr²; its printed digits follow from that value.
    //          ship yr, home yr, distance ly, speed c,        γ
    [InlineData(1, 1.19, 0.56, 0.77, 1.58)]
    [InlineData(2, 3.75, 2.90, 0.97, 3.99)]
    [InlineData(5, 83.7, 82.7, 0.99993, 86.2)]
    [InlineData(8, 1840, 1839, 0.9999998, 1895)]
    [InlineData(12, 113243, 113242, 0.99999999996, 116641)]
    public void One_g_rows_of_the_relativistic_rocket_table(double shipYears, double homeYears, double distanceLy, double speed, double gamma)
    {
        double a = 1.03 / Units.JulianYear; // 1.03 ly/yr² in 1/s (c = 1)
        var ship = new HyperbolicWorldline(new FourVector(0, 0, 0, 0), Velocity.Rest, a * Vec3.UnitZ);
        double tau = shipYears * Units.JulianYear;
        FourVector e = ship.EventAtProperTime(tau);
        Velocity v = ship.RestFrameAtProperTime(tau).Velocity;
        AssertPrinted(homeYears, e.T / Units.JulianYear);
        AssertPrinted(distanceLy, e.Z / Units.LightYear);
        AssertPrinted(speed, v.Beta);
        AssertPrinted(gamma, v.Gamma);
    }

    [Fact]
    public void With_standard_gravity_the_table_shifts_by_the_small_difference_in_g()
    {
        // The FAQ's 1.03 ly/yr² versus 9.80665 m/s² = 1.0323 ly/yr² (CGPM 1901 standard gravity, IAU Julian year):
        // at τ = 1 yr the home time moves from 1.186 to 1.187 yr, still "1.19" as printed (FAQ, from memory).
        var ship = new HyperbolicWorldline(new FourVector(0, 0, 0, 0), Velocity.Rest, Units.G * Vec3.UnitZ);
        FourVector e = ship.EventAtProperTime(Units.JulianYear);
        AssertPrinted(1.19, e.T / Units.JulianYear);
        AssertPrinted(0.56, e.Z / Units.LightYear);
    }

    /// <summary>Equal to the value as printed, within one unit of its last printed digit (the recalled speeds look
    /// truncated rather than rounded, e.g. 0.99999986 printed as 0.9999998).</summary>
    private static void AssertPrinted(double printed, double actual)
    {
        string text = printed.ToString("R", System.Globalization.CultureInfo.InvariantCulture);
        int significant = text.Replace(".", "").TrimStart('0').Length;
        double scale = Math.Pow(10, Math.Floor(Math.Log10(Math.Abs(printed))) - significant + 1);
        Assert.True(Math.Abs(actual - printed) <= scale + 1e-12 * Math.Abs(printed), $"printed {printed}, computed {actual:R}");
    }

    [Fact]
    public void Braking_from_rapidity_25_retraces_the_hyperbola_without_cancellation()
    {
        // Start at φ = 25 along +Z, push along −Z for φ/a: by time-reversal symmetry of hyperbolic motion (Rindler
        // 2006, ch. 3) the ship stops after Δt = sinh φ/a and Δz = (cosh φ − 1)/a.
        double phi = 25;
        var ship = new HyperbolicWorldline(new FourVector(0, 0, 0, 0), new Velocity(phi, Vec3.UnitZ), -A * Vec3.UnitZ);
        FourVector stop = ship.EventAtProperTime(phi / A);
        AssertRelative(Math.Sinh(phi) / A, stop.T, 1e-14);
        AssertRelative(2 * Math.Pow(Math.Sinh(phi / 2), 2) / A, stop.Z, 1e-14);
        FourVector u = ship.FourVelocityAtProperTime(phi / A);
        Assert.True(Math.Abs(u.Z) < 1e-9, $"u = {u}");
        Assert.True(ship.RestFrameAtProperTime(phi / A).Velocity.Rapidity < 1e-9);
    }

    [Theory]
    [InlineData(0.4, 0.9, 0.3)]
    [InlineData(3.0, 0.2, 1.7)]
    [InlineData(8.0, -0.7, 2.5)]
    public void Oblique_push_agrees_with_the_exact_flight_step(double rapidity, double pushAngle, double properTime)
    {
        // An independent method: FlightStep's matrix exponential of the constant Lorentz generator (exact for
        // constant controls) against the vertex form of HyperbolicWorldline.
        double a = 0.8;
        var frame = new LorentzFrame(new Velocity(rapidity, new Vec3(1, 0, 0)), Rotation.FromAxisAngle(new Vec3(0.2, 1, 0.4), 0.9));
        Vec3 push = a * new Vec3(Math.Cos(pushAngle), Math.Sin(pushAngle), 0.3);
        var worldline = new HyperbolicWorldline(new FourVector(1, 2, 3, 4), frame, push, startProperTime: 10);
        var integrator = new FlightIntegrator(properTime / 64);
        var ship = new ShipState(new CompensatedEvent(new FourVector(1, 2, 3, 4)), frame, 10);
        for (int i = 0; i < 64; i++) ship = integrator.Step(ship, new Controls(push, Vec3.Zero));

        FourVector expected = ship.Position, actual = worldline.EventAtProperTime(10 + properTime);
        double scale = Math.Cosh(rapidity + a * properTime) * properTime;
        Assert.True(Math.Abs(expected.T - actual.T) < 1e-12 * scale, $"{expected} vs {actual}");
        Assert.True((expected.Space - actual.Space).Length < 1e-12 * scale, $"{expected} vs {actual}");
        FourVector uExpected = ship.Velocity.FourVelocity, uActual = worldline.FourVelocityAtProperTime(10 + properTime);
        Assert.True((uExpected - uActual).Space.Length < 1e-12 * uExpected.T, $"{uExpected} vs {uActual}");
        double[,] m1 = ship.Frame.ToMatrix(), m2 = worldline.RestFrameAtProperTime(10 + properTime).ToMatrix();
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
                Assert.True(Math.Abs(m1[i, j] - m2[i, j]) < 1e-11 * uExpected.T, $"frame [{i},{j}] {m1[i, j]} vs {m2[i, j]}");
        Assert.Equal(10 + properTime, worldline.ProperTimeAtHomeTime(actual.T), 11);
    }

    [Fact]
    public void Proper_time_and_home_time_are_inverse_at_every_scale()
    {
        var ship = new HyperbolicWorldline(new FourVector(5, 0, 0, 0), new Velocity(20, Vec3.UnitX), A * new Vec3(-1, 0.1, 0));
        foreach (double tau in new[] { -3e8, -1, 0, 1e-3, 1, 1e5, 7e8, 1.5e9 })
        {
            double t = ship.HomeTimeAtProperTime(tau);
            Assert.True(Math.Abs(ship.ProperTimeAtHomeTime(t) - tau) <= 1e-12 * Math.Max(1, Math.Abs(tau)) + 1e-15 * Math.Abs(t), $"τ = {tau}");
        }
    }
}
