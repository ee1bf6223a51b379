using NAudio.Wave;

namespace Lightward.Audio;

/// <summary>How many loudspeaker channels a sound scene renders, and in which order they are interleaved.</summary>
public enum SpeakerLayout
{
    /// <summary>Two channels: left, right.</summary>
    Stereo,
    /// <summary>Six channels in the film/broadcast order L, R, C, LFE, Ls, Rs (ITU-R BS.775 loudspeaker layout).</summary>
    Surround51,
}

/// <summary>Sample rate, channel names and WAVE speaker masks shared by the mixer, the sinks and the writers.</summary>
public static class SoundFormat
{
    /// <summary>Every Lightward sound runs at 48 kHz, the video/broadcast rate, so soundtracks align with frames.</summary>
    public const int SampleRate = 48_000;

    private static readonly string[] StereoNames = ["L", "R"];
    private static readonly string[] SurroundNames = ["L", "R", "C", "LFE", "Ls", "Rs"];

    // Microsoft WAVE_FORMAT_EXTENSIBLE dwChannelMask bits, one per channel in our interleaving order.
    private static readonly Speakers[] StereoSpeakers = [Speakers.FrontLeft, Speakers.FrontRight];
    private static readonly Speakers[] SurroundSpeakers =
        [Speakers.FrontLeft, Speakers.FrontRight, Speakers.FrontCenter, Speakers.LowFrequency, Speakers.BackLeft, Speakers.BackRight];

    public static int ChannelCount(SpeakerLayout layout) => ChannelNames(layout).Count;

    /// <summary>Short channel names in interleaving order; the 5.1 soundtrack writer names its six mono files by them.</summary>
    public static IReadOnlyList<string> ChannelNames(SpeakerLayout layout) => layout switch
    {
        SpeakerLayout.Stereo => StereoNames,
        SpeakerLayout.Surround51 => SurroundNames,
        _ => throw new ArgumentOutOfRangeException(nameof(layout), layout, null),
    };

    /// <summary>The WAVE speaker position of each channel, in interleaving order.</summary>
    public static IReadOnlyList<Speakers> ChannelSpeakers(SpeakerLayout layout) => layout switch
    {
        SpeakerLayout.Stereo => StereoSpeakers,
        SpeakerLayout.Surround51 => SurroundSpeakers,
        _ => throw new ArgumentOutOfRangeException(nameof(layout), layout, null),
    };
}
