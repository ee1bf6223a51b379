using Lightward.Spacetime;

namespace Lightward.Host.Tests;

public class BeaconTests
{
    [Fact]
    public void A_beacon_behind_a_receding_ship_is_heard_redshifted_by_exp_minus_rapidity_from_astern()
    {
        const double rapidity = 1.5;
        var beacon = InertialWorldline.AtRest(new Vec3(0, 0, 0));
        // The ship left the beacon long ago along +Z (nose forward) and is now 100 light-seconds out, receding.
        var velocity = new Velocity(rapidity, Vec3.UnitZ);
        double t = 100 / velocity.Beta;
        var ship = new ShipState(new CompensatedEvent(new FourVector(t, 0, 0, 100)), new LorentzFrame(velocity, Rotation.Identity), 0);

        var heard = FlightSound.Heard(beacon, ship);

        Assert.NotNull(heard);
        // Longitudinal relativistic Doppler factor for a receding source √((1−β)/(1+β)) = e^−φ: Einstein, Zur
        // Elektrodynamik bewegter Körper (1905), §7 (from memory).
        Assert.Equal(Math.Exp(-rapidity), heard.Value.Doppler, 1e-12);
        Vec3 direction = heard.Value.Direction.NormalizedOr(Vec3.Zero);
        Assert.Equal(-1, direction.Z, 1e-12);
    }
}
