using Lightward.Rendering.Safety;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.Safety;

public class RotationCheckTests
{
    private static IReadOnlyList<RotationFinding> Turn(double degreesPerSecond, double limitDegreesPerSecond)
    {
        var check = new RotationCheck(limitDegreesPerSecond * Math.PI / 180);
        for (int frame = 0; frame <= 60; frame++)
        {
            double time = frame / 30.0;
            check.Add(time, Rotation.FromAxisAngle(Vec3.UnitY, degreesPerSecond * Math.PI / 180 * time));
        }
        return check.Findings();
    }

    [Fact]
    public void A_turn_faster_than_the_limit_is_reported_with_its_rate()
    {
        // A steady yaw of 20°/s against a 10°/s limit (the documented default, common practice, no published source).
        var finding = Assert.Single(Turn(20, 10));
        Assert.Equal(20, finding.PeakRate * 180 / Math.PI, 6);
        Assert.Equal(0, finding.Start, 9);
        Assert.Equal(2, finding.End, 9);
    }

    [Fact]
    public void A_turn_within_the_limit_passes() => Assert.Empty(Turn(5, 10));
}
