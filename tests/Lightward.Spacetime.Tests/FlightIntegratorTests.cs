using MathNet.Numerics.LinearAlgebra;

namespace Lightward.Spacetime.Tests;

public class FlightIntegratorTests
{
    private static readonly double[,] Minkowski = { { -1, 0, 0, 0 }, { 0, 1, 0, 0 }, { 0, 0, 1, 0 }, { 0, 0, 0, 1 } };

    /// <summary>Largest |ΛᵀηΛ − η| entry: zero for a Lorentz transform (definition of the Lorentz group).</summary>
    private static double LorentzDefect(LorentzFrame frame)
    {
        double[,] m = frame.ToMatrix();
        double worst = 0;
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
            {
                double sum = 0;
                for (int k = 0; k < 4; k++) sum += m[k, i] * Minkowski[k, k] * m[k, j];
                worst = Math.Max(worst, Math.Abs(sum - Minkowski[i, j]));
            }
        return worst;
    }

    [Fact]
    public void A_million_random_control_steps_keep_the_four_velocity_and_frame_exact()
    {
        var random = new Random(20261201);
        Vec3 RandomVector(double size) => size * new Vec3(random.NextDouble() * 2 - 1, random.NextDouble() * 2 - 1, random.NextDouble() * 2 - 1);
        // 32 random (controls, step) pairs and their reverses, drawn a million times so the rapidity walks without
        // drifting away: each draw applies a different exact exponential.
        FlightStep[] steps = Enumerable.Range(0, 32)
            .Select(_ => (Controls: new Controls(RandomVector(2.0), RandomVector(3.0)), Duration: 1e-3 * (0.5 + random.NextDouble())))
            .SelectMany(s => new[] { new FlightStep(s.Controls, s.Duration), new FlightStep(new Controls(-s.Controls.ProperAcceleration, -s.Controls.AttitudeRate), s.Duration) })
            .ToArray();
        var ship = ShipState.AtRest(new FourVector(0, 0, 0, 0));
        for (int i = 0; i < 1_000_000; i++) ship = FlightIntegrator.Advance(ship, steps[random.Next(steps.Length)]);

        FourVector u = ship.Frame.ToHome(new FourVector(1, 0, 0, 0));
        // Four-velocity normalisation u·u = −1 (definition of proper time), relative to γ².
        Assert.True(Math.Abs(FourVector.Dot(u, u) + 1) <= 1e-12 * u.T * u.T, $"u·u = {FourVector.Dot(u, u):R} at γ = {u.T}");
        Assert.True(ship.Velocity.Rapidity is > 0.05 and < 20, $"rapidity {ship.Velocity.Rapidity} (the walk should stay moderate)");
        Assert.True(LorentzDefect(ship.Frame) <= 1e-12 * u.T * u.T, $"|ΛᵀηΛ − η| = {LorentzDefect(ship.Frame):R}");
        Rotation q = ship.Frame.Orientation;
        Assert.Equal(1, q.W * q.W + q.X * q.X + q.Y * q.Y + q.Z * q.Z, 14);
        Assert.True(ship.Event.Value.IsFinite);
    }

    [Fact]
    public void Constant_controls_give_the_same_flight_whatever_the_step()
    {
        // Exactness for constant controls: exp(τG) = exp(τG/n)ⁿ (one-parameter subgroup property).
        var controls = new Controls(new Vec3(0.15, -0.1, 0.55), new Vec3(0.4, 0.1, -0.3));
        var start = new ShipState(new CompensatedEvent(new FourVector(3, 1, 2, 3)), new LorentzFrame(new Velocity(1.5, new Vec3(0, 0.6, 0.8)), Rotation.FromAxisAngle(Vec3.UnitX, 0.4)), 0);
        ShipState once = new FlightIntegrator(6).Step(start, controls);
        var fine = new FlightIntegrator(6.0 / 1000);
        ShipState many = start;
        for (int i = 0; i < 1000; i++) many = fine.Step(many, controls);

        double scale = once.Position.T;
        Assert.True(Math.Abs(once.Position.T - many.Position.T) <= 1e-12 * scale, $"{once.Position} vs {many.Position}");
        Assert.True((once.Position.Space - many.Position.Space).Length <= 1e-12 * scale, $"{once.Position} vs {many.Position}");
        Assert.Equal(once.Velocity.Rapidity, many.Velocity.Rapidity, 12);
        Assert.True((once.Frame.Orientation.Inverse * many.Frame.Orientation).Angle < 1e-12);
        Assert.Equal(6, many.ShipTime, 13);
    }

    [Fact]
    public void Closed_form_thrust_step_agrees_with_the_series_exponential()
    {
        // Hyperbolic motion (Rindler 2006, ch. 3): u = sinh(aτ), t = sinh(aτ)/a, x = (cosh(aτ) − 1)/a. The closed form
        // used for thrust without turning must match the general series path, reached here by a turn rate far below rounding.
        var acceleration = new Vec3(0.3, -0.2, 0.9);
        var closedForm = new FlightStep(new Controls(acceleration, Vec3.Zero), 1.7);
        var series = new FlightStep(new Controls(acceleration, new Vec3(0, 0, 1e-300)), 1.7);
        Vec3 closedFormU = closedForm.EndFrame.Velocity.ProperVelocity, seriesU = series.EndFrame.Velocity.ProperVelocity;
        Assert.True((closedFormU - seriesU).Length <= 1e-14 * closedFormU.Length);
        Assert.True(Math.Abs(closedForm.Displacement.T - series.Displacement.T) <= 1e-14 * closedForm.Displacement.T);
        Assert.True((closedForm.Displacement.Space - series.Displacement.Space).Length <= 1e-14 * closedForm.Displacement.T);
        Assert.True(series.EndFrame.Orientation.Angle < 1e-14);
    }

    [Fact]
    public void Round_trip_to_rapidity_25_returns_to_rest()
    {
        // Collinear rapidities add (Einstein 1905, §5, addition of velocities: tanh(φ₁ + φ₂) = (β₁ + β₂)/(1 + β₁β₂)): +25 then −25 is rest.
        var integrator = new FlightIntegrator(0.025);
        var ship = ShipState.AtRest(new FourVector(0, 0, 0, 0));
        for (int i = 0; i < 1000; i++) ship = integrator.Step(ship, new Controls(Vec3.UnitZ, Vec3.Zero));
        Assert.Equal(25, ship.Velocity.Rapidity, 10);
        Assert.True(double.IsFinite(ship.Velocity.Gamma) && ship.Velocity.Gamma > 3.6e10);
        for (int i = 0; i < 1000; i++) ship = integrator.Step(ship, new Controls(-Vec3.UnitZ, Vec3.Zero));
        Assert.True(Math.Abs(ship.Velocity.Beta) < 1e-9, $"β = {ship.Velocity.Beta:R}");
        // Time symmetry of the round trip: Δt = 2 sinh 25, Δz = 4 sinh²(12.5) with a = 1 (Rindler 2006, ch. 3, hyperbolic motion).
        Assert.Equal(1, ship.Position.T / (2 * Math.Sinh(25)), 12);
        Assert.Equal(1, ship.Position.Z / (4 * Math.Pow(Math.Sinh(12.5), 2)), 12);
    }

    [Fact]
    public void Position_keeps_metre_precision_a_thousand_light_years_out()
    {
        // Knuth, TAOCP vol. 2, §4.2.2 (TwoSum is error-free): the compensated sum of many identical steps must
        // equal n·d, which we form exactly as a double-double with a fused multiply-add (IEEE 754-2008 fma).
        FourVector start = new(0, 1000 * Units.LightYear, -3 * Units.LightYear, 0.5);
        var ship = new ShipState(new CompensatedEvent(start), new LorentzFrame(new Velocity(0.7, new Vec3(0.3, 0.4, 0.866)), Rotation.Identity), 0);
        var integrator = new FlightIntegrator(1.2345678);
        const int steps = 200_000;
        for (int i = 0; i < steps; i++) ship = integrator.Step(ship, Controls.Coast);

        FourVector d = new FlightIntegrator(1.2345678).Step(new ShipState(new CompensatedEvent(default), ship.Frame, 0), Controls.Coast).Position;
        FourVector travelled = ship.Event.RelativeTo(start);
        double n = steps;
        foreach ((double actual, double step) in new[] { (travelled.T, d.T), (travelled.X, d.X), (travelled.Y, d.Y), (travelled.Z, d.Z) })
        {
            double high = n * step, low = Math.FusedMultiplyAdd(n, step, -high);
            Assert.True(Math.Abs(actual - high - low) < Units.Metre, $"off by {(actual - high - low) / Units.Metre:G3} m");
        }
    }

    /// <summary>The boost of rapidity φ along unit n, [[cosh φ, sinh φ nᵀ], [sinh φ n, I + (cosh φ − 1) n nᵀ]]
    /// (Jackson, Classical Electrodynamics, 3rd ed., eq. 11.98 with γ = cosh φ, γβ = sinh φ n).</summary>
    private static Matrix<double> BoostMatrix(double rapidity, Vec3 n)
    {
        double[] d = [n.X, n.Y, n.Z];
        var m = Matrix<double>.Build.Dense(4, 4);
        m[0, 0] = Math.Cosh(rapidity);
        for (int i = 0; i < 3; i++)
        {
            m[0, i + 1] = m[i + 1, 0] = Math.Sinh(rapidity) * d[i];
            for (int j = 0; j < 3; j++) m[i + 1, j + 1] = (i == j ? 1 : 0) + (Math.Cosh(rapidity) - 1) * d[i] * d[j];
        }
        return m;
    }

    /// <summary>Rotation by <paramref name="angle"/> about unit k by Rodrigues' formula, I + sin θ K + (1 − cos θ) K².</summary>
    private static Matrix<double> RotationMatrix(Vec3 k, double angle)
    {
        var cross = Matrix<double>.Build.DenseOfArray(new[,] { { 0, -k.Z, k.Y }, { k.Z, 0, -k.X }, { -k.Y, k.X, 0 } });
        Matrix<double> r = Matrix<double>.Build.DenseIdentity(3) + Math.Sin(angle) * cross + (1 - Math.Cos(angle)) * cross * cross;
        Matrix<double> m = Matrix<double>.Build.DenseIdentity(4);
        m.SetSubMatrix(1, 1, r);
        return m;
    }

    [Theory]
    [InlineData(0, 0, 1)] // thrust ahead, about 14° off the motion
    [InlineData(1, 0, 0)] // across the motion
    [InlineData(0, 0, -1)] // braking
    public void Many_small_thrust_steps_land_on_the_boost_matrix_product(double x, double y, double z)
    {
        // Constant thrust for τ in ship axes is one boost of rapidity aτ (one-parameter subgroup, and hyperbolic motion,
        // Rindler 2006, ch. 3), so after 1000 steps the four-velocity is B(u₀) R (cosh aτ, sinh aτ â), multiplied out
        // here with plain matrices at rapidity 3 where they are well conditioned.
        Vec3 motion = new(0.6, 0, 0.8), axis = new Vec3(1, 2, 3).NormalizedOr(Vec3.UnitZ), push = new(x, y, z);
        var start = new ShipState(new CompensatedEvent(default), new LorentzFrame(new Velocity(3, motion), Rotation.FromAxisAngle(axis, 0.7)), 0);
        var integrator = new FlightIntegrator(1e-3);
        ShipState ship = start;
        for (int i = 0; i < 1000; i++) ship = integrator.Step(ship, new Controls(0.5 * push, Vec3.Zero));

        Vector<double> expected = BoostMatrix(3, motion) * RotationMatrix(axis, 0.7) * BoostMatrix(0.5, push) * Vector<double>.Build.Dense([1.0, 0, 0, 0]);
        double expectedRapidity = Math.Acosh(expected[0]);
        Assert.True(Math.Abs(ship.Velocity.Rapidity - expectedRapidity) <= 1e-14 * expectedRapidity, $"rapidity {ship.Velocity.Rapidity:R}, expected {expectedRapidity:R}");
        Vec3 expectedU = new(expected[1], expected[2], expected[3]);
        Assert.True((ship.Velocity.ProperVelocity - expectedU).Length <= 1e-14 * expected[0], $"u {ship.Velocity.ProperVelocity} vs {expectedU}");
    }
}
