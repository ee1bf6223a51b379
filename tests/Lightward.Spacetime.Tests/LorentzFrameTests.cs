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
