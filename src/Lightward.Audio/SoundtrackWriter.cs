using NAudio.Wave;

namespace Lightward.Audio;

/// <summary>
/// A show soundtrack in PCM (24-bit unless asked otherwise): stereo as one interleaved file, 5.1 as six mono files named by channel
/// (<c>name.L.wav</c>, <c>name.R.wav</c>, <c>name.C.wav</c>, <c>name.LFE.wav</c>, <c>name.Ls.wav</c>, <c>name.Rs.wav</c>),
/// the usual delivery to a dome's sound system. All files appear together on <see cref="Commit"/>.
/// </summary>
public sealed class SoundtrackWriter : ISoundBlockSink, IDisposable
{
    public const int DefaultBitsPerSample = 24;

    private readonly WavSoundWriter[] _files;
    private readonly int _channels;
    private float[] _channelSamples = new float[4096];

    private SoundtrackWriter(WavSoundWriter[] files, int channels)
    {
        _files = files;
        _channels = channels;
    }

    /// <summary>The files this soundtrack writes, in channel order.</summary>
    public IReadOnlyList<string> Paths => _files.Select(f => f.Path).ToArray();

    /// <summary>Opens the soundtrack for <paramref name="layout"/> at <paramref name="path"/>; bad paths are user errors naming <paramref name="field"/>.</summary>
    public static SoundtrackWriter Create(string path, SpeakerLayout layout, string field, int bitsPerSample = DefaultBitsPerSample)
    {
        string fullPath = WavSoundWriter.ValidatedPath(path, field);
        IReadOnlyList<Speakers> speakers = SoundFormat.ChannelSpeakers(layout);
        if (layout == SpeakerLayout.Stereo)
            return new SoundtrackWriter([WavSoundWriter.Create(fullPath, bitsPerSample, speakers, field)], speakers.Count);
        var files = new List<WavSoundWriter>();
        try
        {
            foreach ((string name, Speakers speaker) in SoundFormat.ChannelNames(layout).Zip(speakers))
                files.Add(WavSoundWriter.Create(ChannelPath(fullPath, name), bitsPerSample, [speaker], field));
        }
        catch
        {
            foreach (WavSoundWriter file in files) file.Dispose();
            throw;
        }
        return new SoundtrackWriter(files.ToArray(), speakers.Count);
    }

    /// <summary>The mono file of one channel: <c>show.wav</c> + "Ls" → <c>show.Ls.wav</c>.</summary>
    public static string ChannelPath(string path, string channelName) =>
        Path.Combine(Path.GetDirectoryName(path) ?? "", $"{Path.GetFileNameWithoutExtension(path)}.{channelName}{Path.GetExtension(path)}");

    public void Write(ReadOnlySpan<float> interleaved)
    {
        if (_files.Length == 1)
        {
            _files[0].Write(interleaved);
            return;
        }
        int frames = interleaved.Length / _channels;
        if (_channelSamples.Length < frames) _channelSamples = new float[frames];
        for (int channel = 0; channel < _channels; channel++)
        {
            for (int frame = 0; frame < frames; frame++) _channelSamples[frame] = interleaved[frame * _channels + channel];
            _files[channel].Write(_channelSamples.AsSpan(0, frames));
        }
    }

    public void Commit()
    {
        foreach (WavSoundWriter file in _files) file.Commit();
    }

    public void Dispose()
    {
        foreach (WavSoundWriter file in _files) file.Dispose();
    }
}
