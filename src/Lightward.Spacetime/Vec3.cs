using System.Runtime.CompilerServices;

namespace Lightward.Spacetime;

/// <summary>A spatial 3-vector in double precision. Units are whatever the caller's frame uses (c = 1 inside the core).</summary>
public readonly record struct Vec3(double X, double Y, double Z)
{
    public static readonly Vec3 Zero = new(0, 0, 0);
    public static readonly Vec3 UnitX = new(1, 0, 0);
    public static readonly Vec3 UnitY = new(0, 1, 0);
    public static readonly Vec3 UnitZ = new(0, 0, 1);

    public double LengthSquared => X * X + Y * Y + Z * Z;
    public double Length => Math.Sqrt(LengthSquared);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 operator +(Vec3 a, Vec3 b) => new(a.X + b.X, a.Y + b.Y, a.Z + b.Z);
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 operator -(Vec3 a, Vec3 b) => new(a.X - b.X, a.Y - b.Y, a.Z - b.Z);
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 operator -(Vec3 a) => new(-a.X, -a.Y, -a.Z);
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 operator *(double s, Vec3 a) => new(s * a.X, s * a.Y, s * a.Z);
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 operator *(Vec3 a, double s) => new(s * a.X, s * a.Y, s * a.Z);
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 operator /(Vec3 a, double s) => new(a.X / s, a.Y / s, a.Z / s);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Dot(Vec3 a, Vec3 b) => a.X * b.X + a.Y * b.Y + a.Z * b.Z;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Vec3 Cross(Vec3 a, Vec3 b) =>
        new(a.Y * b.Z - a.Z * b.Y, a.Z * b.X - a.X * b.Z, a.X * b.Y - a.Y * b.X);

    /// <summary>The unit vector along this one, or <paramref name="fallback"/> when this one has no direction.</summary>
    public Vec3 NormalizedOr(Vec3 fallback)
    {
        double length = Length;
        return length > 0 && double.IsFinite(length) ? this / length : fallback;
    }

    public bool IsFinite => double.IsFinite(X) && double.IsFinite(Y) && double.IsFinite(Z);

    /// <summary>Angle between two vectors, accurate near 0 and π (atan2 of |a×b| and a·b).</summary>
    public static double AngleBetween(Vec3 a, Vec3 b) => Math.Atan2(Cross(a, b).Length, Dot(a, b));

    /// <summary>Any unit vector perpendicular to this (non-zero) vector.</summary>
    public Vec3 AnyPerpendicular()
    {
        Vec3 helper = Math.Abs(X) < 0.9 ? UnitX : UnitY;
        return Cross(this, helper).NormalizedOr(UnitZ);
    }

    public override string ToString() => FormattableString.Invariant($"({X:G9}, {Y:G9}, {Z:G9})");
}
