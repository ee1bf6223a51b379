using System.Numerics;
using System.Runtime.InteropServices;
using Lightward.Spacetime;

namespace Lightward.Rendering;

/// <summary>A rotation as a single-precision 3×3 matrix, applied to flat arrays of unit vectors in the per-star loops.</summary>
public readonly struct AxesTransform
{
    private readonly float _m00, _m01, _m02, _m10, _m11, _m12, _m20, _m21, _m22;

    public AxesTransform(Rotation rotation)
    {
        double[,] m = rotation.ToMatrix();
        (_m00, _m01, _m02) = ((float)m[0, 0], (float)m[0, 1], (float)m[0, 2]);
        (_m10, _m11, _m12) = ((float)m[1, 0], (float)m[1, 1], (float)m[1, 2]);
        (_m20, _m21, _m22) = ((float)m[2, 0], (float)m[2, 1], (float)m[2, 2]);
    }

    public Vec3 Apply(Vec3 v) => new(
        _m00 * v.X + _m01 * v.Y + _m02 * v.Z,
        _m10 * v.X + _m11 * v.Y + _m12 * v.Z,
        _m20 * v.X + _m21 * v.Y + _m22 * v.Z);

    /// <summary>out = M · in for each index of the flat arrays; the spans must have equal lengths.</summary>
    public void Apply(ReadOnlySpan<float> x, ReadOnlySpan<float> y, ReadOnlySpan<float> z, Span<float> outX, Span<float> outY, Span<float> outZ)
    {
        int vectorCount = x.Length / Vector<float>.Count;
        ReadOnlySpan<Vector<float>> vx = MemoryMarshal.Cast<float, Vector<float>>(x), vy = MemoryMarshal.Cast<float, Vector<float>>(y), vz = MemoryMarshal.Cast<float, Vector<float>>(z);
        Span<Vector<float>> rx = MemoryMarshal.Cast<float, Vector<float>>(outX), ry = MemoryMarshal.Cast<float, Vector<float>>(outY), rz = MemoryMarshal.Cast<float, Vector<float>>(outZ);
        for (int i = 0; i < vectorCount; i++)
        {
            Vector<float> a = vx[i], b = vy[i], c = vz[i];
            rx[i] = a * _m00 + b * _m01 + c * _m02;
            ry[i] = a * _m10 + b * _m11 + c * _m12;
            rz[i] = a * _m20 + b * _m21 + c * _m22;
        }
        for (int i = vectorCount * Vector<float>.Count; i < x.Length; i++)
        {
            float a = x[i], b = y[i], c = z[i];
            outX[i] = a * _m00 + b * _m01 + c * _m02;
            outY[i] = a * _m10 + b * _m11 + c * _m12;
            outZ[i] = a * _m20 + b * _m21 + c * _m22;
        }
    }
}
