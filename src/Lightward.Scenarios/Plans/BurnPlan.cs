using Lightward.Scenarios.Files;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Plans;

public enum SegmentEnd { Duration, Speed, Distance, HomeTime }

/// <summary>One stretch of a burn plan: constant thrust (ship axes) and attitude, until its end condition.</summary>
/// <param name="Thrust">Proper acceleration in ship axes, 1/s.</param>
/// <param name="AttitudeRate">Turn rate in ship axes, rad/s (ignored when <paramref name="Face"/> is set).</param>
/// <param name="Face">Home direction to turn the forward axis to (at the ship's turn rate) and then hold.</param>
/// <param name="Value">Ship time (duration, s), speed (β), distance from the start (light-seconds) or home-clock reading (s).</param>
public sealed record PlanSegment(string Name, Vec3 Thrust, Vec3 AttitudeRate, Vec3? Face, SegmentEnd End, double Value, SourceLocation Location);

public sealed record BurnPlan(string SourcePath, string ContentHash, IReadOnlyList<PlanSegment> Segments);
