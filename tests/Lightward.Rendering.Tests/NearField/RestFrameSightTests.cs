using Lightward.Optics;
using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

public class RestFrameSightTests
{
    [Theory]
    [InlineData(0.0)]
    [InlineData(0.4)]
    [InlineData(3.0)]
    [InlineData(12.0)]
    public void SightAgreesWithTheAberrationAndDopplerFormulas(double rapidity)
    {
        // Reference: the one-direction-at-a-time forms of Einstein (1905), §7 — tan(θ′/2) = e^(−φ) tan(θ/2) and
        // D = 1/(γ(1 − β cos θ′)) — as Optics implements and tests them; the sight works the same out with its
        // per-frame constants hoisted, so the two must agree to rounding at any rapidity, dead astern included.
        Rotation orientation = Rotation.FromAxisAngle(new Vec3(0.2, -0.7, 0.4), 0.9);
        var shipInFrame = new LorentzFrame(new Velocity(rapidity, new Vec3(0.6, 0.0, 0.8)), orientation);
        Rotation cameraToShip = Rotation.FromAxisAngle(new Vec3(1, 2, -1), 0.3);
        var camera = new FourVector(5, 0.5, -1.5, 2);
        var sight = new RestFrameSight(camera, shipInFrame, cameraToShip);
        var random = new Random(17);
        for (int k = 0; k < 500; k++)
        {
            Vec3 point = new(random.NextDouble() * 20 - 10, random.NextDouble() * 20 - 10, random.NextDouble() * 20 - 10);
            PointSight seen = sight.See(point);
            Vec3 toward = point - camera.Space;
            Vec3 apparentShip = Aberration.ApparentInShipAxes(toward.NormalizedOr(Vec3.UnitZ), shipInFrame);
            double doppler = Doppler.FactorFromShipAxes(apparentShip, shipInFrame);
            Assert.True(Vec3.AngleBetween(cameraToShip.Inverse.Rotate(apparentShip), seen.Direction) < 1e-12);
            // The reference takes D from the apparent direction, whose rounding D amplifies by up to e^φ near dead
            // ahead; the sight takes it from the source direction, where it is well conditioned.
            double dopplerTolerance = 1e-13 + 1e-15 * Math.Exp(rapidity);
            Assert.Equal(1, seen.Doppler / doppler, dopplerTolerance);
            // The light path is null: its time component scales with D between the two frames.
            Assert.Equal(1, seen.Distance / (doppler * toward.Length), dopplerTolerance);
            Assert.Equal(camera.T - toward.Length, seen.EmissionTime, 1e-12);
            // And the inverse map finds the direction the light came from.
            Assert.True(Vec3.AngleBetween(sight.SourceDirection(seen.Direction), toward.NormalizedOr(Vec3.UnitZ)) < 1e-9);
        }
    }
}
