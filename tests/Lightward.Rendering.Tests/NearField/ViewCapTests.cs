using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

public class ViewCapTests
{
    [Fact]
    public void ConeMissesTheCapExactlyWhenItsAxisIsFartherThanBothHalfAnglesTogether()
    {
        var random = new Random(3);
        Vec3 RandomUnit() => new Vec3(random.NextDouble() - 0.5, random.NextDouble() - 0.5, random.NextDouble() - 0.5).NormalizedOr(Vec3.UnitZ);
        int misses = 0, checkedCount = 0;
        for (int trial = 0; trial < 20000; trial++)
        {
            var cap = new ViewCap(RandomUnit(), random.NextDouble() * Math.PI);
            Vec3 axis = RandomUnit();
            double halfAngle = random.NextDouble() * random.NextDouble() * Math.PI / 2;
            // Two cones on the sphere are disjoint exactly when the great-circle distance between their axes exceeds the
            // sum of their half-angles: the great-circle distance obeys the triangle inequality (Todhunter, Spherical
            // Trigonometry, 1886; reference from memory).
            double gap = Vec3.AngleBetween(cap.Centre, axis) - (cap.Radius + halfAngle);
            if (Math.Abs(gap) < 1e-9) continue;
            bool disjoint = gap > 0 && cap.Radius + halfAngle < Math.PI;
            // The cone is given by half its chord: a chord of the unit circle spanning θ is 2 sin(θ/2) (elementary geometry).
            Assert.Equal(disjoint, cap.Misses(axis, Math.Sin(halfAngle / 2)));
            misses += disjoint ? 1 : 0;
            checkedCount++;
        }
        Assert.InRange(misses, checkedCount / 10, checkedCount * 9 / 10);
    }
}
