using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>Everything a show asks for at one moment of show time: where the ship is, where the camera looks, what is shown.</summary>
/// <param name="CueIndex">Index of the last cue that has started (−1 before the first).</param>
/// <param name="Look">Camera axes → ship axes.</param>
/// <param name="FieldOfView">Perspective field of view, radians.</param>
/// <param name="Fade">Picture level 0 (black) … 1 (full).</param>
public readonly record struct ShowMoment(
    double ShowTime, int CueIndex, ShipState Ship, double TimeCompression, Rotation Look, double FieldOfView, double Fade,
    double GridOpacity, double BodiesOpacity, double InstrumentsOpacity, string Caption, double CaptionOpacity)
{
    /// <summary>Camera axes → home-aligned comoving axes (ship orientation, then the look).</summary>
    public Rotation CameraOrientation => Ship.Frame.Orientation * Look;
}

/// <summary>
/// Evaluates a show script at any show time. Transitions ease (<see cref="Easing"/>); camera turns are slowed so that
/// they never exceed the show's rotation limit (<see cref="ShowCautions.MaxRotationRate"/>) at their fastest point.
/// </summary>
public sealed class ShowTimeline
{
    public static readonly double DefaultFieldOfView = 90 * Math.PI / 180;
    public const double DefaultTimeCompression = 1;

    private readonly EasedTrack<double> _rapidity = new(0, Lerp);
    private readonly EasedTrack<double> _logCompression = new(Math.Log(DefaultTimeCompression), Lerp);
    private readonly EasedTrack<Rotation> _look = new(Rotation.Identity, Slerp);
    private readonly EasedTrack<double> _fieldOfView = new(DefaultFieldOfView, Lerp);
    private readonly EasedTrack<double> _fade = new(1, Lerp);
    private readonly EasedTrack<double> _grid = new(0, Lerp);
    private readonly EasedTrack<double> _bodies = new(1, Lerp);
    private readonly EasedTrack<double> _instruments = new(0, Lerp);
    private readonly List<ShowCue> _captionCues = [];
    private readonly ShowFlight _flight;

    public ShowScript Script { get; }

    public ShowTimeline(ShowScript script)
    {
        Script = script;
        double maxRate = script.Cautions.MaxRotationRate;
        foreach (ShowCue cue in script.Cues)
        {
            double at = cue.At, transition = cue.Transition;
            Easing easing = cue.Easing;
            if (cue.Rapidity is { } rapidity) _rapidity.MoveTo(at, rapidity, easing, transition);
            if (cue.TimeCompression is { } compression) _logCompression.MoveTo(at, Math.Log(compression), easing, transition);
            if (cue.Look is { } look)
            {
                Rotation target = look.ToRotation();
                _look.MoveTo(at, target, easing, from => Math.Max(transition, easing.PeakRate() * (from.Inverse * target).Angle / maxRate));
            }
            if (cue.FieldOfView is { } fieldOfView) _fieldOfView.MoveTo(at, fieldOfView, easing, transition);
            if (cue.Fade is { } fade) _fade.MoveTo(at, fade, easing, transition);
            if (cue.Grid is { } grid) _grid.MoveTo(at, grid ? 1 : 0, easing, transition);
            if (cue.Bodies is { } bodies) _bodies.MoveTo(at, bodies ? 1 : 0, easing, transition);
            if (cue.Instruments is { } instruments) _instruments.MoveTo(at, instruments ? 1 : 0, easing, transition);
            if (cue.Caption is not null) _captionCues.Add(cue);
        }
        var start = new ShipState(new CompensatedEvent(default(FourVector)), new LorentzFrame(Velocity.Rest, ShowFlight.OrientationAlong(script.Course)), 0);
        ShowPlanCue[] plans = script.Cues.Where(cue => cue.BurnPlan is not null)
            .Select(cue => new ShowPlanCue(cue.At, cue.BurnPlan!, FastestCompressionFrom(cue.At))).ToArray();
        // The ship on a plan turns no faster than the dome may: at one ship second per show second that is the rotation limit.
        _flight = new ShowFlight(start, script.Length, _rapidity.ValueAt, TimeCompressionAt, plans, maxRate);
    }

    public double TimeCompressionAt(double showTime) => Math.Exp(_logCompression.ValueAt(showTime));

    /// <summary>
    /// The most ship seconds per show second from <paramref name="showTime"/> on: the compression then, or a target of a
    /// move still running or still to come (an eased move never leaves the range between its ends).
    /// </summary>
    private double FastestCompressionFrom(double showTime) => Script.Cues
        .Where(cue => cue.TimeCompression is not null && cue.At + cue.Transition >= showTime)
        .Select(cue => cue.TimeCompression!.Value)
        .Append(TimeCompressionAt(showTime))
        .Max();

    /// <summary>What the engine and thrusters do at <paramref name="showTime"/> (ship axes): a plan's controls, or the velocity profile's thrust along the nose.</summary>
    public Controls ControlsAt(double showTime) => _flight.ControlsAt(showTime);

    /// <summary>Rapidity still to gain or shed from <paramref name="showTime"/>: what a plan still burns, or the way to the last speed target.</summary>
    public double RapidityToGo(double showTime) => _flight.RapidityToGo(showTime);

    /// <summary>The ship at every whole second of show time so far (for drawing the worldline behind it).</summary>
    public IEnumerable<ShipState> WorldlineUpTo(double showTime) => _flight.WholeSecondsUpTo(showTime);

    /// <summary>Index of the last cue whose time has come at <paramref name="showTime"/>, −1 before the first cue.</summary>
    public int CueIndexAt(double showTime)
    {
        int index = -1;
        for (int i = 0; i < Script.Cues.Count && Script.Cues[i].At <= showTime; i++) index = i;
        return index;
    }

    /// <summary>When the camera turn started by a cue actually ends, after slowing it to the rotation limit.</summary>
    public double LookSettledBy(ShowCue cue) => _look.SettledBy(cue.At);

    public ShowMoment At(double showTime)
    {
        (string caption, double captionOpacity) = CaptionAt(showTime);
        return new ShowMoment(
            showTime, CueIndexAt(showTime), _flight.At(showTime), TimeCompressionAt(showTime), _look.ValueAt(showTime),
            _fieldOfView.ValueAt(showTime), _fade.ValueAt(showTime), _grid.ValueAt(showTime), _bodies.ValueAt(showTime),
            _instruments.ValueAt(showTime), caption, captionOpacity);
    }

    /// <summary>A new caption fades in over its cue's transition; an empty caption fades the previous one out.</summary>
    private (string Text, double Opacity) CaptionAt(double showTime)
    {
        int index = _captionCues.FindLastIndex(cue => cue.At <= showTime);
        if (index < 0) return ("", 0);
        ShowCue cue = _captionCues[index];
        double progress = cue.Transition > 0 ? cue.Easing.Progress((showTime - cue.At) / cue.Transition) : 1;
        if (cue.Caption!.Length > 0) return (cue.Caption, progress);
        string previous = index > 0 ? _captionCues[index - 1].Caption! : "";
        return previous.Length > 0 && progress < 1 ? (previous, 1 - progress) : ("", 0);
    }

    private static double Lerp(double from, double to, double progress) => from + (to - from) * progress;

    /// <summary>Spherical linear interpolation along the shorter arc: constant angular rate for a linear progress.</summary>
    private static Rotation Slerp(Rotation from, Rotation to, double progress)
    {
        double dot = from.W * to.W + from.X * to.X + from.Y * to.Y + from.Z * to.Z;
        if (dot < 0) { to = new Rotation(-to.W, -to.X, -to.Y, -to.Z); dot = -dot; }
        double angle = Math.Acos(Math.Min(1, dot));
        if (angle < 1e-9) return to;
        double sin = Math.Sin(angle);
        double a = Math.Sin((1 - progress) * angle) / sin, b = Math.Sin(progress * angle) / sin;
        return new Rotation(a * from.W + b * to.W, a * from.X + b * to.X, a * from.Y + b * to.Y, a * from.Z + b * to.Z).Normalized();
    }
}
