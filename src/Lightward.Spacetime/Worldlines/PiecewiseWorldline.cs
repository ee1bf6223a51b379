namespace Lightward.Spacetime;

/// <summary>
/// Worldline segments glued end to start: segment i holds from its <see cref="IWorldline.StartHomeTime"/> until the
/// next one starts; the first also covers earlier times (or none, if its own start is finite) and the last holds
/// for ever. Use <see cref="Builder"/> to glue accelerating and coasting legs exactly.
/// </summary>
public sealed class PiecewiseWorldline : IWorldline
{
    private readonly IWorldline[] _segments;
    private readonly double[] _startHomeTimes;
    private readonly double[] _startProperTimes;

    public PiecewiseWorldline(IReadOnlyList<IWorldline> segments)
    {
        if (segments.Count == 0) throw new ArgumentException("at least one segment is needed", nameof(segments));
        _segments = segments.ToArray();
        _startHomeTimes = new double[_segments.Length];
        _startProperTimes = new double[_segments.Length];
        for (int i = 0; i < _segments.Length; i++)
        {
            double start = _segments[i].StartHomeTime;
            if (i > 0 && !(double.IsFinite(start) && start > _startHomeTimes[i - 1]))
                throw new ArgumentException($"segment {i} must start at a finite home time after segment {i - 1}", nameof(segments));
            _startHomeTimes[i] = start;
            _startProperTimes[i] = double.IsFinite(start) ? _segments[i].ProperTimeAtHomeTime(start) : double.NegativeInfinity;
        }
    }

    public IReadOnlyList<IWorldline> Segments => _segments;

    public double StartHomeTime => _startHomeTimes[0];

    /// <summary>The segment that holds at home time <paramref name="t"/>.</summary>
    public IWorldline SegmentAtHomeTime(double t) => _segments[IndexOf(_startHomeTimes, t)];

    private IWorldline SegmentAtProperTime(double tau) => _segments[IndexOf(_startProperTimes, tau)];

    private static int IndexOf(double[] starts, double value)
    {
        int index = Array.BinarySearch(starts, value);
        if (index < 0) index = ~index - 1;
        return Math.Max(index, 0);
    }

    public FourVector EventAtHomeTime(double t) => SegmentAtHomeTime(t).EventAtHomeTime(t);
    public FourVector FourVelocityAtHomeTime(double t) => SegmentAtHomeTime(t).FourVelocityAtHomeTime(t);
    public double ProperTimeAtHomeTime(double t) => SegmentAtHomeTime(t).ProperTimeAtHomeTime(t);
    public double HomeTimeAtProperTime(double tau) => SegmentAtProperTime(tau).HomeTimeAtProperTime(tau);
    public LorentzFrame RestFrameAtHomeTime(double t) => SegmentAtHomeTime(t).RestFrameAtHomeTime(t);

    /// <summary>
    /// Builds a flight leg by leg from a start event, frame and clock reading. Each leg starts exactly where the
    /// previous one ends; after the last leg the body coasts for ever, unless that leg is open-ended (an infinite
    /// duration). Before the start it coasted with its start velocity, unless it was created at the start.
    /// </summary>
    public sealed class Builder
    {
        private readonly List<IWorldline> _legs = [];
        private FourVector _event;
        private LorentzFrame _frame;
        private double _properTime;
        private readonly bool _existedBefore;
        private bool _openEnded;

        public Builder(FourVector start, LorentzFrame frame, double properTime = 0, bool existedBeforeStart = true)
        {
            _event = start;
            _frame = frame;
            _properTime = properTime;
            _existedBefore = existedBeforeStart;
        }

        public FourVector CurrentEvent => _event;
        public LorentzFrame CurrentFrame => _frame;
        public double CurrentProperTime => _properTime;

        /// <summary>Pushes with <paramref name="properAcceleration"/> (body axes, 1/s) for <paramref name="properDuration"/>
        /// seconds of own time; <see cref="double.PositiveInfinity"/> makes this the open-ended last leg.</summary>
        public Builder Accelerate(Vec3 properAcceleration, double properDuration)
        {
            if (properAcceleration == Vec3.Zero) return Coast(properDuration);
            RequireDuration(properDuration);
            var leg = new HyperbolicWorldline(_event, _frame, properAcceleration, _properTime) { StartHomeTime = LegStart() };
            _legs.Add(leg);
            if (_openEnded) return this;
            _properTime += properDuration;
            _event = leg.EventAtProperTime(_properTime);
            _frame = leg.RestFrameAtProperTime(_properTime);
            return this;
        }

        /// <summary>Coasts for <paramref name="properDuration"/> seconds of own time.</summary>
        public Builder Coast(double properDuration)
        {
            RequireDuration(properDuration);
            var leg = new InertialWorldline(_event, _frame, _properTime) { StartHomeTime = LegStart() };
            _legs.Add(leg);
            if (_openEnded) return this;
            _properTime += properDuration;
            _event = leg.EventAtProperTime(_properTime);
            return this;
        }

        /// <summary>Turns the body's axes by <paramref name="turn"/> (in body axes) in an instant, e.g. a flip before braking.</summary>
        public Builder Turn(Rotation turn)
        {
            RequireOpen();
            _frame = new LorentzFrame(_frame.Velocity, (_frame.Orientation * turn).Normalized());
            return this;
        }

        public PiecewiseWorldline Build()
        {
            if (_openEnded) return new PiecewiseWorldline(_legs);
            double start = LegStart();
            return new PiecewiseWorldline([.. _legs, new InertialWorldline(_event, _frame, _properTime) { StartHomeTime = start }]);
        }

        private double LegStart()
        {
            if (_legs.Count > 0 || !_existedBefore) return _event.T;
            // The first leg also covers the past: give it a coasting prelude so earlier times are well defined.
            _legs.Add(new InertialWorldline(_event, _frame, _properTime));
            return _event.T;
        }

        private void RequireDuration(double properDuration)
        {
            RequireOpen();
            if (!(properDuration > 0) || double.IsNaN(properDuration))
                throw new ArgumentOutOfRangeException(nameof(properDuration), "leg duration must be positive");
            _openEnded = double.IsPositiveInfinity(properDuration);
        }

        private void RequireOpen()
        {
            if (_openEnded) throw new InvalidOperationException("an open-ended leg must be the last one");
        }
    }
}
