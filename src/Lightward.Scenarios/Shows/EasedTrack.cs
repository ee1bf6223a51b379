namespace Lightward.Scenarios.Shows;

/// <summary>
/// One show property over show time: a start value and a list of eased moves. A move that starts before the
/// previous one has finished starts from wherever the property is at that moment, so the value never jumps
/// unless a move has zero duration.
/// </summary>
public sealed class EasedTrack<T>
{
    private readonly record struct Move(double Start, double Duration, T From, T To, Easing Easing);

    private readonly List<Move> _moves = [];
    private readonly T _initial;
    private readonly Func<T, T, double, T> _interpolate;

    public EasedTrack(T initial, Func<T, T, double, T> interpolate)
    {
        _initial = initial;
        _interpolate = interpolate;
    }

    /// <summary>Adds a move starting at <paramref name="start"/>; moves must be added in time order.</summary>
    /// <param name="duration">Chooses the move's duration from its start value (rate limits depend on how far it goes).</param>
    public void MoveTo(double start, T target, Easing easing, Func<T, double> duration)
    {
        if (_moves.Count > 0 && start < _moves[^1].Start) throw new ArgumentException("moves must be added in time order", nameof(start));
        T from = ValueAt(start);
        _moves.Add(new Move(start, Math.Max(0, duration(from)), from, target, easing));
    }

    public void MoveTo(double start, T target, Easing easing, double duration) => MoveTo(start, target, easing, _ => duration);

    public T ValueAt(double time)
    {
        int index = LastMoveStartingBy(time);
        if (index < 0) return _initial;
        Move move = _moves[index];
        double elapsed = time - move.Start;
        if (elapsed >= move.Duration) return move.To;
        return _interpolate(move.From, move.To, move.Easing.Progress(elapsed / move.Duration));
    }

    /// <summary>When the move in force at <paramref name="time"/> ends (or <paramref name="time"/> if none is running).</summary>
    public double SettledBy(double time)
    {
        int index = LastMoveStartingBy(time);
        return index < 0 ? time : Math.Max(time, _moves[index].Start + _moves[index].Duration);
    }

    private int LastMoveStartingBy(double time)
    {
        int low = 0, high = _moves.Count - 1, found = -1;
        while (low <= high)
        {
            int middle = (low + high) / 2;
            if (_moves[middle].Start <= time) { found = middle; low = middle + 1; }
            else high = middle - 1;
        }
        return found;
    }
}
