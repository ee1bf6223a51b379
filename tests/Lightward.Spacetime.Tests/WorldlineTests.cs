namespace Lightward.Spacetime.Tests;

public class WorldlineTests
{
    [Fact]
    public void Circular_orbit_keeps_its_radius_speed_and_time_dilation()
    {
        var orbit = CircularWorldline.FromSpeed(new Vec3(1, 2, 3), 10, 0.6, new Vec3(0, 0, 1), phase: 0.3);
        foreach (double t in new[] { -5.0, 0, 7.7, 1e3 })
        {
            FourVector e = orbit.EventAtHomeTime(t);
            Assert.Equal(10, (e.Space - new Vec3(1, 2, 3)).Length, 12);
            Assert.Equal(3, e.Z, 12);
            FourVector u = orbit.FourVelocityAtHomeTime(t);
            Assert.Equal(1.25, u.T, 14); // γ = 1/√(1 − 0.6²) = 1.25 (Lorentz factor definition)
            Assert.Equal(-1, FourVector.Dot(u, u), 14);
            Assert.Equal(t / 1.25, orbit.ProperTimeAtHomeTime(t), 12);
            Assert.Equal(0.6, orbit.RestFrameAtHomeTime(t).Velocity.Beta, 14);
        }
        // Right-handed about +Z, starting from home +X: at phase 0 the body moves along +Y.
        var simple = CircularWorldline.FromPeriod(Vec3.Zero, 1, 100, Vec3.UnitZ);
        Assert.Equal(1, simple.EventAtHomeTime(0).X, 15);
        Assert.True(simple.FourVelocityAtHomeTime(0).Y > 0);
        Assert.Throws<ArgumentOutOfRangeException>(() => CircularWorldline.FromPeriod(Vec3.Zero, 1, 6, Vec3.UnitZ));
    }

    [Fact]
    public void Glued_legs_are_continuous_and_keep_one_clock()
    {
        PiecewiseWorldline flight = new PiecewiseWorldline.Builder(new FourVector(10, 0, 0, 0), LorentzFrame.Identity)
            .Accelerate(new Vec3(0, 0, 0.5), 4)
            .Coast(3)
            .Turn(Rotation.FromAxisAngle(Vec3.UnitY, Math.PI))
            .Accelerate(new Vec3(0, 0, 0.5), 4)
            .Build();
        foreach (IWorldline leg in flight.Segments.Skip(1))
        {
            double t = leg.StartHomeTime;
            FourVector before = flight.SegmentAtHomeTime(Math.BitDecrement(t)).EventAtHomeTime(t), after = leg.EventAtHomeTime(t);
            Assert.True((before - after).Space.Length < 1e-12 * Math.Max(1, t), $"jump at {t}");
            Assert.Equal(flight.SegmentAtHomeTime(Math.BitDecrement(t)).ProperTimeAtHomeTime(t), leg.ProperTimeAtHomeTime(t), 12);
        }
        Assert.Equal(10, flight.HomeTimeAtProperTime(0), 12);
        double end = flight.HomeTimeAtProperTime(11);
        Assert.Equal(11, flight.ProperTimeAtHomeTime(end), 12);
        Assert.True(flight.FourVelocityAtHomeTime(end + 1).Space.Length < 1e-12, "the ship ends at rest");
        Assert.Equal(new FourVector(5, 0, 0, 0), flight.EventAtHomeTime(5)); // it waited at the start before leaving
    }

    [Fact]
    public void Point_on_a_hyperbolic_body_follows_born_rigid_motion()
    {
        // Rindler (2006), ch. 3, hyperbolic motion (rigid motion): points of a rigidly accelerated rod share the
        // centre x² − t² = X² about a common event, so a point h ahead of a body accelerating at a has proper
        // acceleration 1/(1/a + h) and the rod keeps proper length h in each instantaneous rest frame.
        double a = 0.2, h = 3;
        var body = new HyperbolicWorldline(new FourVector(0, 1 / a, 0, 0), Velocity.Rest, a * Vec3.UnitX);
        var nose = (HyperbolicWorldline)Worldlines.RigidlyAttached(body, h * Vec3.UnitX);
        Assert.Equal(1 / (1 / a + h), nose.Acceleration, 14);
        foreach (double t in new[] { 1.0, 10, 40 })
        {
            FourVector e = nose.EventAtHomeTime(t);
            Assert.Equal((1 / a + h) * (1 / a + h), e.X * e.X - e.T * e.T, 9);
            // Same rest frame at the same Rindler time: the nose is at distance h along the body's x axis.
            double tau = body.ProperTimeAtHomeTime(t);
            FourVector offset = body.RestFrameAtProperTime(tau).FromHome(nose.EventAtProperTime(nose.StartProperTime + (1 + a * h) * tau) - body.EventAtProperTime(tau));
            Assert.Equal(0, offset.T, 10);
            Assert.Equal(h, offset.X, 10);
        }
    }

    [Fact]
    public void Point_on_an_inertial_body_is_offset_in_the_body_rest_frame()
    {
        var body = new InertialWorldline(new FourVector(0, 0, 0, 0), new LorentzFrame(new Velocity(1, Vec3.UnitX), Rotation.FromAxisAngle(Vec3.UnitZ, Math.PI / 2)));
        IWorldline tip = Worldlines.RigidlyAttached(body, 2 * Vec3.UnitX);
        // Body +X is home +Y after the quarter turn: a transverse offset, not contracted (Lorentz contraction acts along the motion only).
        FourVector e = tip.EventAtHomeTime(0);
        Assert.Equal(2, e.Y, 14);
        Assert.Equal(0, e.X, 14);
        var piecewise = new PiecewiseWorldline.Builder(new FourVector(0, 0, 0, 0), LorentzFrame.Identity).Accelerate(0.1 * Vec3.UnitZ, 5).Build();
        Assert.IsType<PiecewiseWorldline>(Worldlines.RigidlyAttached(piecewise, new Vec3(0, 1, 0)));
    }
}

public class OpenEndedAndApproximateWorldlineTests
{
    [Fact]
    public void Body_waiting_then_accelerating_for_ever_follows_one_hyperbola()
    {
        PiecewiseWorldline body = new PiecewiseWorldline.Builder(new FourVector(100, 5, 0, 0), LorentzFrame.Identity)
            .Accelerate(0.01 * Vec3.UnitX, double.PositiveInfinity)
            .Build();
        Assert.Equal(new FourVector(50, 5, 0, 0), body.EventAtHomeTime(50));
        // Rindler (2006), ch. 3, hyperbolic motion: x − x₀ = (√(1 + a²Δt²) − 1)/a from rest.
        Assert.Equal((Math.Sqrt(1 + 0.01 * 0.01 * 1e6) - 1) / 0.01, body.EventAtHomeTime(1100).X - 5, 9);
    }

    [Fact]
    public void Point_on_an_orbiting_body_stays_at_its_offset_in_the_body_rest_frame()
    {
        var orbit = CircularWorldline.FromSpeed(Vec3.Zero, 1000, 0.1, Vec3.UnitZ);
        IWorldline antenna = Worldlines.RigidlyAttached(orbit, new Vec3(0, 0, 2));
        foreach (double t in new[] { 0.0, 300, 2000 })
        {
            FourVector e = antenna.EventAtHomeTime(t);
            Assert.Equal(t, e.T, 9);
            Assert.Equal(2, e.Z, 9); // the offset is along the orbit axis, across the motion: not contracted
            Assert.Equal(1000, new Vec3(e.X, e.Y, 0).Length, 9);
        }
    }
}
