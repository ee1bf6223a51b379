using Lightward.Rendering.Instruments;
using Lightward.Spacetime;

namespace Lightward.Host.Tests;

public class InstrumentTests
{
    [Fact]
    public void Distance_to_a_target_at_rest_is_length_contracted_in_the_ship_frame()
    {
        const double rapidity = 2, homeDistance = 1000;
        var target = new TargetTrack("marker", InertialWorldline.AtRest(new Vec3(homeDistance, 0, 0)));
        var ship = new ShipState(new CompensatedEvent(default), new LorentzFrame(new Velocity(rapidity, Vec3.UnitX), Rotation.Identity), 0);

        TargetSighting sighting = target.SeenFrom(ship);

        // Length contraction L = L₀/γ: Einstein, Zur Elektrodynamik bewegter Körper (1905), §4 (from memory); γ = cosh φ.
        Assert.Equal(homeDistance / Math.Cosh(rapidity), sighting.Distance, 1e-9);
        // A body at rest at home moves at the ship's own rapidity relative to the ship.
        Assert.Equal(rapidity, sighting.RelativeRapidity, 1e-12);
        Assert.Equal(1, sighting.DirectionComoving.X, 1e-12);
    }

    [Fact]
    public void Bearing_is_measured_in_ship_axes()
    {
        var target = new TargetTrack("marker", InertialWorldline.AtRest(new Vec3(0, 0, 10)));
        // A turn of +90° about +Y takes the nose (+Z) onto home +X and the right wing (+X) onto home −Z,
        // so a target on home +Z lies square to the left.
        var turned = Rotation.FromAxisAngle(Vec3.UnitY, Math.PI / 2);
        var ship = new ShipState(new CompensatedEvent(default), new LorentzFrame(Velocity.Rest, turned), 0);

        TargetSighting sighting = target.SeenFrom(ship);

        Assert.Equal(0, sighting.Elevation, 1e-12);
        Assert.Equal(0, sighting.Distance - 10, 1e-12);
        Assert.Equal(-Math.PI / 2, sighting.Azimuth, 1e-12);
    }

    [Fact]
    public void Doppler_factors_ahead_and_behind_are_exp_of_plus_and_minus_rapidity()
    {
        var ship = new ShipState(new CompensatedEvent(default), new LorentzFrame(new Velocity(3, Vec3.UnitZ), Rotation.Identity), 0);
        var readings = FlightReadings.Of(ship, null, 0, Controls.Coast, 1, "x1", false, "manual", "free flight");
        double beta = Math.Tanh(3);
        // Longitudinal relativistic Doppler factor √((1+β)/(1−β)): Einstein, Zur Elektrodynamik bewegter Körper (1905), §7 (from memory).
        Assert.Equal(Math.Sqrt((1 + beta) / (1 - beta)), readings.DopplerAhead, 1e-9);
        Assert.Equal(Math.Sqrt((1 - beta) / (1 + beta)), readings.DopplerBehind, 1e-12);
    }

    [Fact]
    public void The_trace_keeps_a_bounded_even_record_of_a_long_flight()
    {
        var trace = new WorldlineTrace(capacity: 64);
        for (int i = 0; i <= 10_000; i++) trace.Record(new FourVector(i, 0, 0, 0.5 * i));
        Assert.True(trace.Events.Count < 64);
        Assert.Equal(0, trace.Events[0].T);
        Assert.True(trace.Events[^1].T > 9000);
    }
}
