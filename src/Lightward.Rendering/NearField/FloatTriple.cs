using System.Numerics;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Three floats kept apart, for values a vector loop spreads over all its lanes: each is broadcast straight from
/// memory, where a <see cref="Vector3"/> field is first loaded whole and then split into its parts.
/// </summary>
internal readonly struct FloatTriple(Vector3 value)
{
    public readonly float X = value.X, Y = value.Y, Z = value.Z;
}
