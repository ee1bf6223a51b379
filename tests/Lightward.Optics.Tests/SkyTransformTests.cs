using Lightward.Spacetime;

namespace Lightward.Optics.Tests;

public class SkyTransformTests
{
    private static readonly StarCatalog Sky = StarCatalog.Procedural(20_000, seed: 7);

    public static TheoryData<double> Rapidities => [0, 0.5, 3, 10, 25];

    private static LorentzFrame Frame(double rapidity) => new(
        new Velocity(rapidity, new Vec3(0.3, -0.5, 0.8).NormalizedOr(Vec3.UnitZ)),
        Rotation.FromAxisAngle(new Vec3(1, 1, -0.4), 0.9));

    [Theory]
    [MemberData(nameof(Rapidities))]
    public void Vectorized_pass_agrees_with_the_double_precision_star_path(double rapidity)
    {
        LorentzFrame frame = Frame(rapidity);
        var output = new ApparentStars();
        new SkyTransform().Apply(Sky, frame, output);
        Assert.Equal(Sky.Count, output.Count);
        for (int i = 0; i < Sky.Count; i += 7)
        {
            // Reference: Starlight.Observe in double precision (its own checks cite Einstein 1905 and CIE 15).
            ApparentStar expected = Starlight.Observe(Sky.Direction(i), Sky.Magnitude[i], Sky.Temperature[i], frame);
            var actualDirection = new Vec3(output.X[i], output.Y[i], output.Z[i]);
            // Single precision: a few units in the last place of the off-axis angle, relative to it.
            double offAxis = Vec3.AngleBetween(expected.Ship, frame.Orientation.Inverse.Rotate(frame.Velocity.Direction));
            Assert.True(Vec3.AngleBetween(expected.Ship, actualDirection) <= 2e-6 * Math.Max(offAxis, 1e-3) + 1e-6,
                $"star {i}: direction {actualDirection} vs {expected.Ship}");
            AssertIrradiance(expected.Irradiance, output.R[i], output.G[i], output.B[i], $"star {i} at φ = {rapidity}");
        }
    }

    private static void AssertIrradiance(LinearSrgb expected, float r, float g, float b, string what)
    {
        double luminance = 0.2126 * r + 0.7152 * g + 0.0722 * b;
        Assert.True(float.IsFinite(r) && float.IsFinite(g) && float.IsFinite(b) && r >= 0 && g >= 0 && b >= 0, what);
        if (expected.Luminance < 1e-30)
        {
            Assert.True(luminance < 1e-28, $"{what}: {luminance} should be black");
            return;
        }
        Assert.True(Math.Abs(luminance / expected.Luminance - 1) < 2e-3, $"{what}: luminance {luminance} vs {expected.Luminance}");
        Assert.Equal(expected.R / expected.Luminance, r / luminance, 2e-3 * Math.Max(1, expected.R / expected.Luminance));
        Assert.Equal(expected.B / expected.Luminance, b / luminance, 2e-3 * Math.Max(1, expected.B / expected.Luminance));
    }

    [Fact]
    public void At_rest_each_star_keeps_its_direction_and_magnitude()
    {
        var output = new ApparentStars();
        new SkyTransform().Apply(Sky, LorentzFrame.Identity, output);
        for (int i = 0; i < Sky.Count; i++)
        {
            Assert.Equal(Sky.X[i], output.X[i], 1e-6);
            Assert.Equal(Sky.Z[i], output.Z[i], 1e-6);
            // The ApparentStars contract: luminance = 10^(−0.4 V) for a ship at rest (Pogson's magnitude scale).
            double luminance = 0.2126 * output.R[i] + 0.7152 * output.G[i] + 0.0722 * output.B[i];
            Assert.Equal(1, luminance / Math.Pow(10, -0.4 * Sky.Magnitude[i]), 1e-4);
        }
    }

    [Theory]
    [InlineData(3.0)]
    [InlineData(25.0)]
    public void Scalar_and_vectorized_passes_agree_and_repeat_bit_for_bit(double rapidity)
    {
        LorentzFrame frame = Frame(rapidity);
        ApparentStars scalar = new(), vectorized = new(), again = new();
        new SkyTransform(vectorized: false).Apply(Sky, frame, scalar);
        var transform = new SkyTransform();
        transform.Apply(Sky, frame, vectorized);
        transform.Apply(Sky, frame, again);
        Assert.Equal(vectorized.R, again.R);
        Assert.Equal(vectorized.X, again.X);
        for (int i = 0; i < Sky.Count; i++)
        {
            Assert.Equal(scalar.X[i], vectorized.X[i], 1e-6);
            Assert.Equal(scalar.Z[i], vectorized.Z[i], 1e-6);
            Assert.Equal(scalar.G[i], vectorized.G[i], 1e-4 * Math.Abs(scalar.G[i]) + 1e-37);
        }
    }

    [Theory]
    [InlineData(40.0)]
    [InlineData(300.0)]
    public void Beyond_the_single_precision_range_nothing_is_NaN(double rapidity)
    {
        var output = new ApparentStars();
        new SkyTransform().Apply(Sky, Frame(rapidity), output);
        for (int i = 0; i < Sky.Count; i++)
            Assert.True(float.IsFinite(output.X[i] + output.Y[i] + output.Z[i] + output.R[i] + output.G[i] + output.B[i]), $"star {i}");
    }

    public static TheoryData<double, double> ViewCones => new()
    {
        { 0, 0.1 }, { 0, 0.85 }, { 3, 0.85 }, { 3, 0.01 }, { 10, 0.4 }, { 25, 1.6 }, { 8, 3.0 },
    };

    [Theory]
    [MemberData(nameof(ViewCones))]
    public void A_view_cone_keeps_every_star_that_appears_inside_it_with_the_same_values(double rapidity, double halfAngle)
    {
        // The culled pass must be a pure saving: every star the whole-sky pass puts inside the cone is kept, with the
        // same numbers (to single-precision rounding: a cell kept alone may go through the scalar formulas), and the
        // kept stars come in catalogue order. Views look ahead, aside and behind the motion.
        LorentzFrame frame = Frame(rapidity);
        foreach (Vec3 axis in ViewAxes(frame))
        {
            int kept = AssertKeepsEveryStarInside(frame, new ViewCone(axis, halfAngle), direction => Vec3.AngleBetween(direction, axis) <= halfAngle);
            if (halfAngle < 0.2 && rapidity == 0) Assert.True(kept < Sky.Count / 10, $"a narrow view kept {kept} of {Sky.Count} stars");
        }
    }

    [Theory]
    [MemberData(nameof(Rapidities))]
    public void Edge_planes_keep_every_star_that_appears_between_them_and_drop_most_of_the_rest_of_the_cone(double rapidity)
    {
        // A 16:9 screen's pyramid (half-widths tan 45° and tan 29.4°) inside its enclosing cone: the planes only ever
        // drop stars outside the pyramid, and at rest they drop a good share of the cone's.
        LorentzFrame frame = Frame(rapidity);
        foreach (Vec3 axis in ViewAxes(frame))
        {
            Rotation toShip = Rotation.FromAxisAngle(Vec3.Cross(Vec3.UnitZ, axis).NormalizedOr(Vec3.UnitX), Vec3.AngleBetween(Vec3.UnitZ, axis));
            double across = 1, down = 0.5625, halfAngle = Math.Atan(Math.Sqrt(across * across + down * down)) + 1e-4;
            Vec3[] planes = [.. new[] { new Vec3(1, 0, across), new Vec3(-1, 0, across), new Vec3(0, 1, down), new Vec3(0, -1, down) }
                .Select(n => toShip.Rotate(n.NormalizedOr(Vec3.UnitZ)))];
            int inPyramid = AssertKeepsEveryStarInside(frame, new ViewCone(axis, halfAngle, planes),
                direction => planes.All(n => Vec3.Dot(direction, n) >= 0));
            int inCone = AssertKeepsEveryStarInside(frame, new ViewCone(axis, halfAngle), direction => Vec3.AngleBetween(direction, axis) <= halfAngle);
            if (rapidity == 0) Assert.True(inPyramid < 0.85 * inCone, $"the planes kept {inPyramid} of the cone's {inCone} stars");
        }
    }

    private static Vec3[] ViewAxes(LorentzFrame frame) =>
        [Vec3.UnitZ, new Vec3(1, 0.2, 0).NormalizedOr(Vec3.UnitX), -Vec3.UnitZ, frame.Orientation.Inverse.Rotate(frame.Velocity.Direction)];

    /// <summary>Culls to <paramref name="view"/> and checks every star the whole-sky pass puts <paramref name="inside"/> it was kept with the same values, in order; returns how many were kept.</summary>
    private static int AssertKeepsEveryStarInside(LorentzFrame frame, ViewCone view, Func<Vec3, bool> inside)
    {
        var everything = new ApparentStars();
        var transform = new SkyTransform();
        transform.Apply(Sky, frame, everything);
        var kept = new ApparentStars();
        transform.Apply(Sky, frame, kept, view, new ParallelOptions());
        bool Same(int all, int cut) =>
            Math.Abs(everything.X[all] - kept.X[cut]) <= 1e-5f && Math.Abs(everything.Y[all] - kept.Y[cut]) <= 1e-5f
            && Math.Abs(everything.Z[all] - kept.Z[cut]) <= 1e-5f && Math.Abs(everything.G[all] - kept.G[cut]) <= 1e-4f * everything.G[all] + 1e-37f;
        int next = 0, insideCount = 0;
        for (int i = 0; i < everything.Count; i++)
        {
            bool isKept = next < kept.Count && Same(i, next);
            if (isKept) next++;
            if (!inside(new Vec3(everything.X[i], everything.Y[i], everything.Z[i]))) continue;
            insideCount++;
            Assert.True(isKept, $"star {i} appears inside the view around {view.Axis} but was dropped");
        }
        Assert.Equal(kept.Count, next);
        Assert.True(kept.Count >= insideCount);
        return kept.Count;
    }
}
