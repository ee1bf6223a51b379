namespace Lightward.Scenarios.Shows;

/// <summary>
/// The live show's clock and cue list as the operator drives it, in stage terms: the next cue stands by; go fires it
/// now (or starts a stopped clock, or releases a hold); hold stops the clock and a second hold resumes it; back returns to the start of the
/// current cue (or the one before, when already there) and stops there. A cue marked <c>hold</c> stops the clock
/// when the show reaches it until the operator says go. Wall-clock time comes in through <see cref="Advance"/>, so
/// the operator is deterministic and testable.
/// </summary>
public sealed class ShowOperator(ShowScript script)
{
    private readonly HashSet<int> _released = [];

    public ShowScript Script { get; } = script;
    public double ShowTime { get; private set; }
    /// <summary>The operator has stopped the clock (hold, or after stepping back).</summary>
    public bool Held { get; private set; }
    /// <summary>The show has reached a hold cue and waits for go.</summary>
    public bool WaitingForGo => PendingHold(ShowTime, ShowTime) is not null;
    /// <summary>The operator flies the camera by hand; the cues' look moves are ignored until manual control ends.</summary>
    public bool ManualControl { get; private set; }
    public bool Finished => ShowTime >= Script.Length;

    /// <summary>Index of the cue in force (−1 before the first).</summary>
    public int CurrentCue => LastCueBy(ShowTime);
    /// <summary>Index of the cue standing by (the one go fires), or −1 after the last.</summary>
    public int StandbyCue => CurrentCue + 1 < Script.Cues.Count ? CurrentCue + 1 : -1;

    /// <summary>Moves the show clock on by <paramref name="seconds"/> of real time, stopping at an unreleased hold cue.</summary>
    public void Advance(double seconds)
    {
        if (Held || seconds <= 0 || Finished) return;
        double target = Math.Min(Script.Length, ShowTime + seconds);
        ShowCue? hold = PendingHold(ShowTime, target);
        ShowTime = hold?.At ?? target;
    }

    /// <summary>Go: start a stopped clock, release the hold the show waits at, or else fire the standing-by cue now.</summary>
    public void Go()
    {
        if (Held)
        {
            Held = false;
            return;
        }
        if (PendingHold(ShowTime, ShowTime) is { } waiting)
        {
            _released.Add(waiting.Number);
            return;
        }
        if (StandbyCue < 0) return;
        ShowCue next = Script.Cues[StandbyCue];
        ShowTime = next.At;
        _released.Add(next.Number);
    }

    /// <summary>Hold stops the clock; hold again resumes it.</summary>
    public void ToggleHold() => Held = !Held;

    /// <summary>Back to the start of the current cue, or of the previous one when within a second of the current start; the clock stops there.</summary>
    public void Back()
    {
        int current = CurrentCue;
        if (current < 0) return;
        int target = ShowTime - Script.Cues[current].At < 1 && current > 0 ? current - 1 : current;
        ShowTime = Script.Cues[target].At;
        _released.RemoveWhere(number => Script.Cues[number - 1].At > ShowTime);
        _released.Add(Script.Cues[target].Number);
        Held = true;
    }

    public void ToggleManualControl() => ManualControl = !ManualControl;

    private ShowCue? PendingHold(double from, double to) =>
        Script.Cues.FirstOrDefault(cue => cue.Hold && !_released.Contains(cue.Number) && cue.At >= from && cue.At <= to);

    private int LastCueBy(double time)
    {
        int index = -1;
        for (int i = 0; i < Script.Cues.Count && Script.Cues[i].At <= time; i++) index = i;
        return index;
    }
}
