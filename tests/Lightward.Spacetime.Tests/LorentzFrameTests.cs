using Lightward.Spacetime;

namespace Lightward.Spacetime.Tests;

public class LorentzFrameTests
{
    private static double[,] Multiply(double[,] a, double[,] b)
    {
        var c = new double[4, 4];
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
                for (int k = 0; k < 4; k++) c[i, j] += a[i, k] * b[k, j];
        return c;
    }

    [Fact]
    public void Composition_matches_the_matrix_product_of_the_two_transforms()
    {
        // Reference: plain 4×4 matrix multiplication at moderate rapidity, where the matrix form is well conditioned.
        var a = new LorentzFrame(Velocity.FromBeta(new Vec3(0.6, 0.1, 0)), Rotation.FromAxisAngle(new Vec3(1, 2, 3), 0.7));
        var b = new LorentzFrame(Velocity.FromBeta(new Vec3(0, 0.5, 0.3)), Rotation.FromAxisAngle(new Vec3(-1, 0, 1), 1.1));
        double[,] expected = Multiply(a.ToMatrix(), b.ToMatrix());
        double[,] actual = a.Compose(b).ToMatrix();
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
                Assert.Equal(expected[i, j], actual[i, j], 12);
    }

    [Fact]
    public void Inverse_undoes_the_transform()
    {
        var a = new LorentzFrame(Velocity.FromBeta(new Vec3(0.3, -0.7, 0.2)), Rotation.FromAxisAngle(new Vec3(0, 1, 1), -2.0));
        var identity = a.Compose(a.Inverse).ToMatrix();
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
                Assert.Equal(i == j ? 1.0 : 0.0, identity[i, j], 12);
    }
}

public class LorentzFrameInvariantTests
{
    [Fact]
    public void Frames_print_without_following_their_inverse()
    {
        // Regression: the generated record printer used to recurse through Inverse until the stack overflowed.
        var frame = new LorentzFrame(new Velocity(2, Vec3.UnitX), Rotation.FromAxisAngle(Vec3.UnitY, 0.5));
        Assert.Contains("LorentzFrame(", frame.ToString());
        Assert.Contains("Rotation(", frame.Orientation.ToString());
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(3)]
    [InlineData(25)]
    public void Interval_is_invariant_and_the_inverse_returns_the_event(double rapidity)
    {
        // The Minkowski interval −t² + |x|² is the same in every inertial frame (definition of a Lorentz transform).
        var frame = new LorentzFrame(new Velocity(rapidity, new Vec3(0.3, -0.4, 0.866).NormalizedOr(Vec3.UnitZ)), Rotation.FromAxisAngle(new Vec3(1, 1, 0), 2.1));
        var own = new FourVector(2, 0.5, -1.5, 0.7);
        FourVector home = frame.ToHome(own);
        double gamma2 = Math.Cosh(rapidity) * Math.Cosh(rapidity);
        Assert.True(Math.Abs(home.Interval - own.Interval) <= 1e-15 * gamma2 * 16, $"{home.Interval} vs {own.Interval}");
        FourVector back = frame.FromHome(home);
        Assert.True((back - own).Space.Length + Math.Abs(back.T - own.T) <= 1e-15 * gamma2 * 16, $"{back} vs {own}");
        FourVector viaInverse = frame.Inverse.ToHome(home);
        Assert.True((viaInverse - own).Space.Length + Math.Abs(viaInverse.T - own.T) <= 1e-15 * gamma2 * 16, $"{viaInverse} vs {own}");
    }

    [Fact]
    public void Velocity_keeps_gamma_and_one_minus_beta_exact_at_rapidity_25()
    {
        var v = new Velocity(25, Vec3.UnitZ);
        // γ = cosh φ and 1 − β = e^(−φ)/cosh φ (identities of tanh); β itself rounds to 1 here.
        Assert.Equal(1, v.Gamma / Math.Cosh(25), 15);
        Assert.Equal(1, v.OneMinusBeta / (2 / (Math.Exp(50) + 1)), 13);
        Assert.Equal(1, default(Velocity).Gamma);
        // γ − 1 near rest without cancellation: sinh²φ = 2e-8 + 1e-16 gives γ = 1 + 1e-8 exactly.
        Assert.Equal(1, new Velocity(Math.Asinh(Math.Sqrt(2e-8 + 1e-16)), Vec3.UnitZ).GammaMinusOne / 1e-8, 12);
    }
}
