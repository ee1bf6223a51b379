using System.Runtime.CompilerServices;

namespace Lightward.Spacetime;

/// <summary>
/// A proper rotation of 3-space as a unit quaternion (W, X, Y, Z) in double precision.
/// <see cref="Rotate"/> maps a vector v to q v q⁻¹ (active rotation).
/// </summary>
public readonly record struct Rotation(double W, double X, double Y, double Z)
{
    public static readonly Rotation Identity = new(1, 0, 0, 0);

    /// <summary>Rotation by <paramref name="angle"/> radians about <paramref name="axis"/> (right-hand rule).</summary>
    public static Rotation FromAxisAngle(Vec3 axis, double angle)
    {
        Vec3 n = axis.NormalizedOr(Vec3.UnitZ);
        double s = Math.Sin(angle / 2);
        return new Rotation(Math.Cos(angle / 2), n.X * s, n.Y * s, n.Z * s);
    }

    /// <summary>Rotation vector (axis × angle) → rotation, exact for any angle.</summary>
    public static Rotation FromRotationVector(Vec3 rotationVector)
    {
        double angle = rotationVector.Length;
        return angle == 0 ? Identity : FromAxisAngle(rotationVector / angle, angle);
    }

    /// <summary>The shortest rotation taking unit vector <paramref name="from"/> onto unit vector <paramref name="to"/>.</summary>
    public static Rotation Between(Vec3 from, Vec3 to)
    {
        double dot = Vec3.Dot(from, to);
        if (dot < -1 + 1e-15)
            return FromAxisAngle(from.AnyPerpendicular(), Math.PI);
        Vec3 c = Vec3.Cross(from, to);
        return new Rotation(1 + dot, c.X, c.Y, c.Z).Normalized();
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public Rotation Normalized()
    {
        double inverseNorm = 1 / Math.Sqrt(W * W + X * X + Y * Y + Z * Z);
        return new Rotation(W * inverseNorm, X * inverseNorm, Y * inverseNorm, Z * inverseNorm);
    }

    /// <summary>Exactly the identity (composing with it changes nothing, so it can be skipped).</summary>
    public bool IsIdentity
    {
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        get => W == 1 && X == 0 && Y == 0 && Z == 0;
    }

    public Rotation Inverse => new(W, -X, -Y, -Z);

    // Written out: the generated record printer would follow Inverse → Inverse → … without end.
    public override string ToString() => FormattableString.Invariant($"Rotation(w={W:G9}, x={X:G9}, y={Y:G9}, z={Z:G9})");

    /// <summary>Composition: (a * b).Rotate(v) == a.Rotate(b.Rotate(v)).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Rotation operator *(Rotation a, Rotation b) => new(
        a.W * b.W - a.X * b.X - a.Y * b.Y - a.Z * b.Z,
        a.W * b.X + a.X * b.W + a.Y * b.Z - a.Z * b.Y,
        a.W * b.Y - a.X * b.Z + a.Y * b.W + a.Z * b.X,
        a.W * b.Z + a.X * b.Y - a.Y * b.X + a.Z * b.W);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public Vec3 Rotate(Vec3 v)
    {
        // v' = v + 2w (q×v) + 2 q×(q×v), q the vector part.
        double tx = 2 * (Y * v.Z - Z * v.Y);
        double ty = 2 * (Z * v.X - X * v.Z);
        double tz = 2 * (X * v.Y - Y * v.X);
        return new Vec3(
            v.X + W * tx + (Y * tz - Z * ty),
            v.Y + W * ty + (Z * tx - X * tz),
            v.Z + W * tz + (X * ty - Y * tx));
    }

    /// <summary>Rotation angle in [0, π].</summary>
    public double Angle => 2 * Math.Atan2(Math.Sqrt(X * X + Y * Y + Z * Z), Math.Abs(W));

    /// <summary>Row-major 3×3 matrix of the rotation.</summary>
    public double[,] ToMatrix()
    {
        Vec3 c0 = Rotate(Vec3.UnitX), c1 = Rotate(Vec3.UnitY), c2 = Rotate(Vec3.UnitZ);
        return new[,] { { c0.X, c1.X, c2.X }, { c0.Y, c1.Y, c2.Y }, { c0.Z, c1.Z, c2.Z } };
    }

    /// <summary>The rotation whose matrix is <paramref name="m"/> (row-major, orthonormal), by Shepperd's method.</summary>
    public static Rotation FromMatrix(double[,] m)
    {
        double trace = m[0, 0] + m[1, 1] + m[2, 2];
        Rotation q;
        if (trace > 0)
        {
            double s = 2 * Math.Sqrt(1 + trace);
            q = new Rotation(s / 4, (m[2, 1] - m[1, 2]) / s, (m[0, 2] - m[2, 0]) / s, (m[1, 0] - m[0, 1]) / s);
        }
        else if (m[0, 0] > m[1, 1] && m[0, 0] > m[2, 2])
        {
            double s = 2 * Math.Sqrt(1 + m[0, 0] - m[1, 1] - m[2, 2]);
            q = new Rotation((m[2, 1] - m[1, 2]) / s, s / 4, (m[0, 1] + m[1, 0]) / s, (m[0, 2] + m[2, 0]) / s);
        }
        else if (m[1, 1] > m[2, 2])
        {
            double s = 2 * Math.Sqrt(1 + m[1, 1] - m[0, 0] - m[2, 2]);
            q = new Rotation((m[0, 2] - m[2, 0]) / s, (m[0, 1] + m[1, 0]) / s, s / 4, (m[1, 2] + m[2, 1]) / s);
        }
        else
        {
            double s = 2 * Math.Sqrt(1 + m[2, 2] - m[0, 0] - m[1, 1]);
            q = new Rotation((m[1, 0] - m[0, 1]) / s, (m[0, 2] + m[2, 0]) / s, (m[1, 2] + m[2, 1]) / s, s / 4);
        }
        return q.Normalized();
    }
}
