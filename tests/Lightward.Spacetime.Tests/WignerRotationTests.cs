using MathNet.Numerics.LinearAlgebra;

namespace Lightward.Spacetime.Tests;

public class WignerRotationTests
{
    /// <summary>The standard pure-boost matrix [[γ, γβᵀ], [γβ, I + (γ − 1) ββᵀ/β²]] (any SR text, e.g. Jackson,
    /// Classical Electrodynamics, 3rd ed., eq. 11.98), built independently of the library's boost code.</summary>
    private static Matrix<double> BoostMatrix(Vec3 beta)
    {
        double b2 = beta.LengthSquared, gamma = 1 / Math.Sqrt(1 - b2);
        double[] v = [beta.X, beta.Y, beta.Z];
        var m = Matrix<double>.Build.Dense(4, 4);
        m[0, 0] = gamma;
        for (int i = 0; i < 3; i++)
        {
            m[0, i + 1] = m[i + 1, 0] = gamma * v[i];
            for (int j = 0; j < 3; j++) m[i + 1, j + 1] = (i == j ? 1 : 0) + (gamma - 1) * v[i] * v[j] / b2;
        }
        return m;
    }

    [Theory]
    [InlineData(0.1, 0.2)]
    [InlineData(0.6, 0.8)]
    [InlineData(0.9, 0.9)]
    [InlineData(0.99, 0.5)]
    public void Perpendicular_boosts_rotate_by_the_published_angle(double beta1, double beta2)
    {
        double g1 = 1 / Math.Sqrt(1 - beta1 * beta1), g2 = 1 / Math.Sqrt(1 - beta2 * beta2);
        (_, Rotation wigner) = Velocity.FromBeta(beta1 * Vec3.UnitX).Compose(g2 * beta2 * Vec3.UnitY);
        // Perpendicular boosts: cos ε = (γ₁ + γ₂)/(1 + γ₁γ₂) (Rhodes & Semon, Am. J. Phys. 72, 943 (2004), from
        // memory); it is the perpendicular case of the general cos ε = (1 + γ + γ₁ + γ₂)²/((1 + γ)(1 + γ₁)(1 + γ₂)) − 1
        // with γ = γ₁γ₂. (The form (γ₁ + γ₂)²/(1 + γ₁γ₂) − 1 exceeds 1 for γ₁ = γ₂ = 2, so it cannot be a cosine.)
        Assert.Equal((g1 + g2) / (1 + g1 * g2), Math.Cos(wigner.Angle), 13);
        double gamma = g1 * g2;
        Assert.Equal(Math.Pow(1 + gamma + g1 + g2, 2) / ((1 + gamma) * (1 + g1) * (1 + g2)) - 1, Math.Cos(wigner.Angle), 13);
    }

    [Theory]
    [InlineData(0.6, 0.0, 0.0, 0.0, 0.8, 0.0)]
    [InlineData(0.5, 0.3, 0.1, -0.2, 0.4, 0.6)]
    [InlineData(0.95, 0.0, 0.1, 0.3, -0.9, 0.2)]
    [InlineData(0.9, 0.0, 0.0, -0.3, 0.2, 0.0)] // slowing by less than half of the speed along the motion
    [InlineData(0.9, 0.0, 0.0, -0.8, 0.1, 0.0)] // braking hard: the rapidity-sum branch
    public void Composition_matches_the_polar_decomposition_of_the_matrix_product(double ax, double ay, double az, double bx, double by, double bz)
    {
        Vec3 first = new(ax, ay, az), second = new(bx, by, bz);
        // Independent route: multiply the boost matrices and split the product Λ = P·R by MathNet's SVD
        // (Λ = U Σ Vᵀ → R = U Vᵀ, P = U Σ Uᵀ). For a Lorentz transform P is the pure boost and R the rotation, since
        // a symmetric positive-definite boost times an orthogonal rotation is the unique Euclidean polar form.
        Matrix<double> product = BoostMatrix(first) * BoostMatrix(second);
        var svd = product.Svd(computeVectors: true);
        Matrix<double> rotation = svd.U * svd.VT;
        Matrix<double> boost = svd.U * Matrix<double>.Build.DenseOfDiagonalArray(svd.S.ToArray()) * svd.U.Transpose();

        Velocity v1 = Velocity.FromBeta(first), v2 = Velocity.FromBeta(second);
        (Velocity result, Rotation wigner) = v1.Compose(v2.ProperVelocity);
        double[,] w = wigner.ToMatrix();
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
                Assert.Equal(rotation[i + 1, j + 1], w[i, j], 12);
        // The SVD of a matrix with condition number γ² resolves its entries to about 1e-15·γ² relative.
        Matrix<double> expectedBoost = BoostMatrix(result.BetaVector);
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
                Assert.True(Math.Abs(boost[i, j] - expectedBoost[i, j]) <= 1e-12 * Math.Max(1, Math.Abs(expectedBoost[i, j])), $"boost [{i},{j}]: {boost[i, j]:R} vs {expectedBoost[i, j]:R}");
    }

    [Fact]
    public void Rotation_turns_from_the_second_boost_toward_the_first()
    {
        // Sign check against the explicit matrix product: for B(x̂)·B(ŷ) the rotation axis is along ŷ × x̂ = −ẑ.
        (_, Rotation wigner) = Velocity.FromBeta(0.8 * Vec3.UnitX).Compose(2 * Vec3.UnitY);
        Assert.True(wigner.Z * wigner.W < 0, $"expected a rotation about −z, got {wigner}");
        Assert.Equal(0, wigner.X, 15);
        Assert.Equal(0, wigner.Y, 15);
    }

    [Fact]
    public void Composition_stays_finite_and_unit_at_rapidity_25()
    {
        (Velocity result, Rotation wigner) = new Velocity(25, Vec3.UnitX).Compose(Math.Sinh(25) * Vec3.UnitY);
        Assert.True(double.IsFinite(result.Rapidity) && result.Direction.IsFinite);
        Assert.Equal(1, wigner.W * wigner.W + wigner.X * wigner.X + wigner.Y * wigner.Y + wigner.Z * wigner.Z, 14);
        // Perpendicular rapidities φ₁ = φ₂ = 25: γ = γ₁γ₂, so cosh φ = cosh² 25 (composition of perpendicular boosts).
        Assert.Equal(Math.Log(2 * Math.Cosh(25) * Math.Cosh(25)), result.Rapidity, 10);
        // cos ε = 2γ₁/(1 + γ₁²) → ε → π/2 as γ₁ → ∞ (Rhodes & Semon 2004 form, from memory).
        Assert.Equal(Math.PI / 2, wigner.Angle, 9);
    }

    [Theory]
    [InlineData(0.3, 0.2)]
    [InlineData(3.0, 1e-5)]
    [InlineData(3.0, -1e-5)] // slowing gently
    [InlineData(3.0, -2.5)] // braking hard, through rest
    [InlineData(25.0, 1e-4)]
    [InlineData(25.0, -1e-4)]
    public void Collinear_boosts_add_rapidities_with_no_rotation(double rapidity, double added)
    {
        // Along an axis, so that v is parallel to the motion exactly and not merely to rounding.
        Vec3 n = Vec3.UnitY;
        (Velocity result, Rotation wigner) = new Velocity(rapidity, n).Compose(Math.Sinh(added) * n);
        // Collinear boosts form a one-parameter group, so rapidities add and no Thomas–Wigner rotation arises
        // (Jackson, Classical Electrodynamics, 3rd ed., §11.3 and §11.8).
        Assert.Equal(Rotation.Identity, wigner);
        Assert.True(Math.Abs(result.Rapidity - Math.Abs(rapidity + added)) <= 1e-15 * rapidity, $"rapidity {result.Rapidity:R}");
        // The general, non-collinear path reached by a sideways part far below rounding agrees to rounding.
        Vec3 aside = 1e-150 * n.AnyPerpendicular();
        (Velocity general, Rotation generalWigner) = new Velocity(rapidity, n).Compose(Math.Sinh(added) * n + aside);
        Assert.True(Math.Abs(general.Rapidity - result.Rapidity) <= 1e-14 * result.Rapidity, $"{general.Rapidity:R} vs {result.Rapidity:R}");
        Assert.True((general.Direction - result.Direction).Length <= 1e-14, $"{general.Direction} vs {result.Direction}");
        Assert.True(generalWigner.Angle <= 1e-14, $"angle {generalWigner.Angle:R}");
    }

    [Theory]
    [InlineData(0)]
    [InlineData(60)]
    [InlineData(90)]
    [InlineData(135)]
    [InlineData(180)]
    public void A_small_boost_at_rapidity_25_keeps_the_rapidity_exact(double degrees)
    {
        // γ of a composed velocity: γ = γ₁γ₂(1 + β₁·β₂) = cosh φ₁ cosh φ₂ + sinh φ₁ sinh φ₂ cos θ (Jackson, Classical
        // Electrodynamics, 3rd ed., §11.4, from memory), evaluated here where no term cancels; acosh is well
        // conditioned at γ ≈ 3.6e10. This is the short-series path of an ordinary integrator step.
        double phi = 25, step = 1e-4, cos = Math.Cos(degrees * Math.PI / 180), sin = Math.Sin(degrees * Math.PI / 180);
        (Velocity result, _) = new Velocity(phi, Vec3.UnitX).Compose(Math.Sinh(step) * new Vec3(cos, sin, 0));
        double gamma = Math.Cosh(phi) * Math.Cosh(step) + Math.Sinh(phi) * Math.Sinh(step) * cos;
        Assert.True(Math.Abs(result.Rapidity - Math.Acosh(gamma)) <= 1e-14, $"rapidity {result.Rapidity:R}, expected {Math.Acosh(gamma):R}");
        Assert.Equal(1, result.Gamma / gamma, 14);
        Assert.Equal(1, Math.Sinh(result.Rapidity) / result.ProperSpeed, 14);
    }
}
