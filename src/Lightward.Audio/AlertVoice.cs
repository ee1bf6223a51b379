namespace Lightward.Audio;

/// <summary>The task-limit alerts, each with its own tone pattern so a pilot can tell them apart without looking.</summary>
public enum AlertKind
{
    /// <summary>Three rising pips: the task's time limit is close.</summary>
    TimeShort,
    /// <summary>A falling two-tone call, twice: the rapidity budget (propellant) is running low.</summary>
    BudgetLow,
    /// <summary>Six fast high pulses: a task limit (speed, distance or time) has been broken.</summary>
    LimitBroken,
    /// <summary>A rising major triad: the task is complete.</summary>
    TaskDone,
}

/// <summary>
/// Plays alert patterns from their start to their end. Raising an alert that is still sounding does nothing, so the
/// host can raise it every frame while the condition lasts and hear it repeat once per pattern.
/// </summary>
internal sealed class AlertVoice
{
    private readonly record struct Note(double StartSeconds, double LengthSeconds, double PitchHz);

    private const float Loudness = 0.25f;
    private const double EdgeSeconds = 0.005;

    private static readonly Dictionary<AlertKind, Note[]> Patterns = new()
    {
        [AlertKind.TimeShort] = [new(0, 0.08, 660), new(0.14, 0.08, 880), new(0.28, 0.08, 1100)],
        [AlertKind.BudgetLow] = [new(0, 0.15, 520), new(0.15, 0.15, 390), new(0.4, 0.15, 520), new(0.55, 0.15, 390)],
        [AlertKind.LimitBroken] = Enumerable.Range(0, 6).Select(i => new Note(i * 0.1, 0.05, 1320)).ToArray(),
        [AlertKind.TaskDone] = [new(0, 0.2, 523.25), new(0.25, 0.2, 659.25), new(0.5, 0.4, 783.99)],
    };

    private readonly int _sampleRate;
    private readonly long[] _elapsedSamples = new long[Enum.GetValues<AlertKind>().Length];
    private readonly bool[] _sounding = new bool[Enum.GetValues<AlertKind>().Length];
    private readonly long[] _patternSamples;

    public AlertVoice(SpeakerLayout layout, int sampleRate)
    {
        _sampleRate = sampleRate;
        Gains = new ChannelGains(layout, sampleRate);
        _patternSamples = Enum.GetValues<AlertKind>()
            .Select(kind => (long)Math.Ceiling(Patterns[kind].Max(n => n.StartSeconds + n.LengthSeconds) * sampleRate))
            .ToArray();
    }

    public ChannelGains Gains { get; }

    /// <summary>How long the pattern of <paramref name="kind"/> lasts.</summary>
    public static double PatternSeconds(AlertKind kind) => Patterns[kind].Max(n => n.StartSeconds + n.LengthSeconds);

    public bool IsSounding => Array.IndexOf(_sounding, true) >= 0;

    public void Raise(AlertKind kind)
    {
        int index = (int)kind;
        if (_sounding[index]) return;
        _sounding[index] = true;
        _elapsedSamples[index] = 0;
    }

    public void RenderMono(Span<float> mono)
    {
        mono.Clear();
        for (int kind = 0; kind < _sounding.Length; kind++)
        {
            if (!_sounding[kind]) continue;
            long start = _elapsedSamples[kind];
            foreach (Note note in Patterns[(AlertKind)kind]) AddNote(note, start, mono);
            _elapsedSamples[kind] = start + mono.Length;
            if (_elapsedSamples[kind] >= _patternSamples[kind]) _sounding[kind] = false;
        }
    }

    private void AddNote(Note note, long blockStartSample, Span<float> mono)
    {
        long noteStart = (long)Math.Round(note.StartSeconds * _sampleRate);
        long noteLength = (long)Math.Round(note.LengthSeconds * _sampleRate);
        long edge = (long)Math.Round(EdgeSeconds * _sampleRate);
        long first = Math.Max(noteStart, blockStartSample), end = Math.Min(noteStart + noteLength, blockStartSample + mono.Length);
        for (long sample = first; sample < end; sample++)
        {
            long intoNote = sample - noteStart;
            // Raised-cosine edges: a tone that starts or stops at full level is heard as a click.
            long fromEdge = Math.Min(intoNote, noteLength - 1 - intoNote);
            double envelope = fromEdge >= edge ? 1 : 0.5 - 0.5 * Math.Cos(Math.PI * fromEdge / edge);
            double phase = 2 * Math.PI * note.PitchHz * intoNote / _sampleRate;
            mono[(int)(sample - blockStartSample)] += (float)(Loudness * envelope * Math.Sin(phase));
        }
    }
}
