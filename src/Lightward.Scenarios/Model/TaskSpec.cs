using Lightward.Spacetime;

namespace Lightward.Scenarios.Model;

public enum TaskKind { Free, Rendezvous, Stop, ArriveBy, ReturnHome, Flyby }

/// <summary>What the trainee must do, with its tolerances. Only the fields of its kind are meaningful.</summary>
/// <param name="Target">Body to meet, pass or reach, or null when the task names a point.</param>
/// <param name="Point">Place in home coordinates (stop, arrive by, return home).</param>
/// <param name="Distance">How close counts, light-seconds: separation, radius or flyby distance.</param>
/// <param name="RelativeSpeed">Largest relative speed that counts as matched or at rest, as β.</param>
/// <param name="HomeTime">Deadline (arrive by) or target date (return home): a home-clock reading, s.</param>
/// <param name="DateTolerance">Return home: how far from the target date still counts, s.</param>
/// <param name="ViewAngle">Flyby: largest angle between the forward axis and the body's apparent direction, rad.</param>
public sealed record TaskSpec(
    TaskKind Kind, string? Target, Vec3 Point, double Distance, double RelativeSpeed, double HomeTime, double DateTolerance, double ViewAngle)
{
    public static readonly IReadOnlyDictionary<string, TaskKind> Names = new Dictionary<string, TaskKind>
    {
        ["free"] = TaskKind.Free,
        ["rendezvous"] = TaskKind.Rendezvous,
        ["stop"] = TaskKind.Stop,
        ["arrive_by"] = TaskKind.ArriveBy,
        ["return_home"] = TaskKind.ReturnHome,
        ["flyby"] = TaskKind.Flyby,
    };

    public string KindName => Names.First(pair => pair.Value == Kind).Key;
}
