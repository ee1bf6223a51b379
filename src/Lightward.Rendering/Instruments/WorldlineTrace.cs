using Lightward.Spacetime;

namespace Lightward.Rendering.Instruments;

/// <summary>
/// The ship's worldline so far as home-frame events, for the spacetime diagram. Bounded memory: when full, every
/// other sample is dropped and the sampling interval doubles, so the whole flight stays drawn at even density.
/// </summary>
public sealed class WorldlineTrace(int capacity = 1024)
{
    private readonly List<FourVector> _events = new(capacity);
    private double _interval;

    public IReadOnlyList<FourVector> Events => _events;

    public void Record(FourVector homeEvent)
    {
        if (_events.Count > 0)
        {
            double sinceLast = homeEvent.T - _events[^1].T;
            if (sinceLast <= 0 || sinceLast < _interval) return;
            if (_interval == 0) _interval = sinceLast;
        }
        _events.Add(homeEvent);
        if (_events.Count < capacity) return;
        for (int read = 2, write = 1; read < _events.Count; read += 2, write++) _events[write] = _events[read];
        _events.RemoveRange((_events.Count + 1) / 2, _events.Count - (_events.Count + 1) / 2);
        _interval *= 2;
    }
}
