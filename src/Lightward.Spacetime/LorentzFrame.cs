using System.Runtime.CompilerServices;

namespace Lightward.Spacetime;

/// <summary>
/// A proper orthochronous Lorentz transform kept in polar form Λ = B(velocity) · R(orientation): it maps
/// coordinates in a frame's own axes (the ship's axes) to home coordinates. The polar form keeps every
/// number of order one or of order γ, never a difference of two large numbers, so it stays a Lorentz
/// transform to rounding at any rapidity.
/// </summary>
public readonly record struct LorentzFrame(Velocity Velocity, Rotation Orientation)
{
    public static readonly LorentzFrame Identity = new(Velocity.Rest, Rotation.Identity);

    /// <summary>Own-axes coordinates → home coordinates.</summary>
    public FourVector ToHome(FourVector own) => Velocity.BoostToHome(new FourVector(own.T, Orientation.Rotate(own.Space)));

    /// <summary>Home coordinates → own-axes coordinates.</summary>
    public FourVector FromHome(FourVector home)
    {
        FourVector comoving = Velocity.BoostFromHome(home);
        return new FourVector(comoving.T, Orientation.Inverse.Rotate(comoving.Space));
    }

    /// <summary>A direction fixed in the frame's own axes, expressed in home-aligned comoving axes.</summary>
    public Vec3 AxisInComoving(Vec3 ownAxis) => Orientation.Rotate(ownAxis);

    /// <summary>this ∘ other: first <paramref name="other"/>, then this.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public LorentzFrame Compose(in LorentzFrame other)
    {
        Velocity velocity = Velocity;
        Rotation orientation = Orientation;
        bool turned = false;
        Velocity boost = other.Velocity;
        if (boost.ProperSpeed != 0)
        {
            Rotation wigner;
            (velocity, wigner) = Velocity.Compose(orientation.Rotate(boost.ProperVelocity), boost.GammaMinusOne);
            if (!wigner.IsIdentity) (orientation, turned) = (wigner * orientation, true);
        }
        if (!other.Orientation.IsIdentity) (orientation, turned) = (orientation * other.Orientation, true);
        // Renormalise what was multiplied, or rounding would walk the orientation off the unit sphere.
        return new LorentzFrame(velocity, turned ? orientation.Normalized() : orientation);
    }

    public LorentzFrame Inverse
    {
        get
        {
            // (B(u) R)⁻¹ = R⁻¹ B(−u) = B(−R⁻¹u) R⁻¹.
            Rotation inverseRotation = Orientation.Inverse;
            return new LorentzFrame(new Velocity(Velocity.Rapidity, -inverseRotation.Rotate(Velocity.Direction)), inverseRotation);
        }
    }

    // Written out: the generated record printer would follow Inverse → Inverse → … without end.
    public override string ToString() => $"LorentzFrame({Velocity}, {Orientation})";

    /// <summary>Row-major 4×4 matrix (t, x, y, z); for tests and diagnostics at moderate rapidity.</summary>
    public double[,] ToMatrix()
    {
        var m = new double[4, 4];
        for (int column = 0; column < 4; column++)
        {
            FourVector basis = new(column == 0 ? 1 : 0, column == 1 ? 1 : 0, column == 2 ? 1 : 0, column == 3 ? 1 : 0);
            FourVector image = ToHome(basis);
            m[0, column] = image.T; m[1, column] = image.X; m[2, column] = image.Y; m[3, column] = image.Z;
        }
        return m;
    }
}
