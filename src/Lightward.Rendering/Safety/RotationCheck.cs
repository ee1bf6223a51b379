using Lightward.Spacetime;

namespace Lightward.Rendering.Safety;

/// <summary>A stretch of show time in which the whole scene turns faster than the limit.</summary>
/// <param name="PeakRate">Fastest rotation in the stretch, rad/s.</param>
public sealed record RotationFinding(double Start, double End, double PeakRate);

/// <summary>
/// Flags whole-scene rotation likely to cause motion sickness in a dome: the camera's turn between consecutive frames,
/// as an angular rate, against a limit. Whole-field rotation is what drives vection, the illusion of self-motion
/// behind visually induced motion sickness, which a dome's wide field makes strong.
/// </summary>
public sealed class RotationCheck(double limit)
{
    private readonly List<RotationFinding> _findings = [];
    private (double Time, Rotation Orientation)? _previous;
    private RotationFinding? _open;

    public double Limit { get; } = limit;

    /// <summary>Adds the camera orientation (camera axes → a non-rotating frame) at the next frame's time.</summary>
    public void Add(double time, Rotation orientation)
    {
        if (_previous is { } previous && time > previous.Time)
        {
            double rate = (previous.Orientation.Inverse * orientation).Angle / (time - previous.Time);
            if (rate > Limit * (1 + 1e-9))
                _open = _open is null ? new RotationFinding(previous.Time, time, rate) : _open with { End = time, PeakRate = Math.Max(_open.PeakRate, rate) };
            else Close();
        }
        _previous = (time, orientation);
    }

    public IReadOnlyList<RotationFinding> Findings()
    {
        Close();
        return _findings;
    }

    private void Close()
    {
        if (_open is null) return;
        _findings.Add(_open);
        _open = null;
    }
}
