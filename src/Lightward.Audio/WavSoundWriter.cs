using System.Buffers.Binary;
using Lightward.Spacetime;
using NAudio.Wave;

namespace Lightward.Audio;

/// <summary>Something that takes interleaved float sample frames, block after block.</summary>
public interface ISoundBlockSink
{
    void Write(ReadOnlySpan<float> interleaved);
}

/// <summary>
/// Writes integer PCM WAV at 48 kHz: 16-bit as plain PCM (format tag 1), 24-bit as WAVE_FORMAT_EXTENSIBLE with a
/// speaker mask, as the Microsoft multichannel WAVE note asks for more than 16 bits. Samples are clipped to full
/// scale and rounded. The file is written under a temporary name in the target folder and renamed into place by
/// <see cref="Commit"/>; disposing without committing deletes it, so no half-written file is ever left behind.
/// </summary>
public sealed class WavSoundWriter : ISoundBlockSink, IDisposable
{
    private readonly WaveFileWriter _writer;
    private readonly string _temporaryPath;
    private readonly int _bytesPerSample;
    private readonly int _channels;
    private byte[] _bytes = new byte[8192];
    private bool _committed;

    private WavSoundWriter(string path, WaveFormat format)
    {
        Path = path;
        _channels = format.Channels;
        _bytesPerSample = format.BitsPerSample / 8;
        _temporaryPath = System.IO.Path.Combine(System.IO.Path.GetDirectoryName(path)!, $".{System.IO.Path.GetFileName(path)}.{Guid.NewGuid():N}.tmp");
        _writer = new WaveFileWriter(_temporaryPath, format);
    }

    /// <summary>Where the file appears on <see cref="Commit"/>.</summary>
    public string Path { get; }
    public long FramesWritten { get; private set; }

    /// <summary>
    /// Starts a WAV file at <paramref name="path"/> with <paramref name="bitsPerSample"/> (16 or 24) and one channel per
    /// entry of <paramref name="speakers"/>. A path that cannot be written is a user error naming <paramref name="field"/>.
    /// </summary>
    public static WavSoundWriter Create(string path, int bitsPerSample, IReadOnlyList<Speakers> speakers, string field, int sampleRate = SoundFormat.SampleRate)
    {
        if (bitsPerSample is not (16 or 24)) throw new ArgumentOutOfRangeException(nameof(bitsPerSample), bitsPerSample, "16 or 24 bits");
        if (speakers.Count == 0) throw new ArgumentException("at least one channel", nameof(speakers));
        string fullPath = ValidatedPath(path, field);
        WaveFormat format = bitsPerSample == 16
            ? new WaveFormat(sampleRate, 16, speakers.Count)
            : new WaveFormatExtensible(sampleRate, 24, speakers.Count, useIeeeFloat: false, validBitsPerSample: 24,
                channelMask: (int)speakers.Aggregate(Speakers.None, (mask, speaker) => mask | speaker));
        try
        {
            return new WavSoundWriter(fullPath, format);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"{field}: cannot write '{path}': {e.Message}");
        }
    }

    /// <summary>A 16-bit stereo capture file, the format for recording a flight.</summary>
    public static WavSoundWriter CreateStereoCapture(string path, string field) =>
        Create(path, 16, SoundFormat.ChannelSpeakers(SpeakerLayout.Stereo), field);

    /// <summary>The absolute path of a .wav output whose folder exists, or a user error naming <paramref name="field"/>.</summary>
    public static string ValidatedPath(string path, string field)
    {
        if (string.IsNullOrWhiteSpace(path)) throw new UserInputException($"{field}: missing file name; expected a path ending in .wav");
        if (!path.EndsWith(".wav", StringComparison.OrdinalIgnoreCase))
            throw new UserInputException($"{field}: '{path}' does not end in .wav; sound is written as WAV files");
        string fullPath = System.IO.Path.GetFullPath(path);
        string folder = System.IO.Path.GetDirectoryName(fullPath)!;
        if (!Directory.Exists(folder)) throw new UserInputException($"{field}: folder '{folder}' does not exist; create it first or choose another path");
        if (Directory.Exists(fullPath)) throw new UserInputException($"{field}: '{path}' is a folder; expected a file name ending in .wav");
        return fullPath;
    }

    public void Write(ReadOnlySpan<float> interleaved)
    {
        if (interleaved.Length % _channels != 0) throw new ArgumentException($"whole sample frames of {_channels} channels", nameof(interleaved));
        int needed = interleaved.Length * _bytesPerSample;
        if (_bytes.Length < needed) _bytes = new byte[needed];
        Span<byte> bytes = _bytes.AsSpan(0, needed);
        if (_bytesPerSample == 2)
            for (int i = 0; i < interleaved.Length; i++)
                BinaryPrimitives.WriteInt16LittleEndian(bytes[(2 * i)..], (short)Quantise(interleaved[i], short.MaxValue));
        else
            for (int i = 0; i < interleaved.Length; i++)
            {
                int value = Quantise(interleaved[i], (1 << 23) - 1);
                bytes[3 * i] = (byte)value;
                bytes[3 * i + 1] = (byte)(value >> 8);
                bytes[3 * i + 2] = (byte)(value >> 16);
            }
        _writer.Write(bytes);
        FramesWritten += interleaved.Length / _channels;
    }

    /// <summary>Finishes the header and renames the file into place.</summary>
    public void Commit()
    {
        ObjectDisposedException.ThrowIf(_committed, this);
        _writer.Dispose();
        File.Move(_temporaryPath, Path, overwrite: true);
        _committed = true;
    }

    public void Dispose()
    {
        if (_committed) return;
        _writer.Dispose();
        File.Delete(_temporaryPath);
        _committed = true;
    }

    private static int Quantise(float sample, int fullScale) =>
        (int)Math.Round(Math.Clamp(float.IsNaN(sample) ? 0 : sample, -1f, 1f) * fullScale, MidpointRounding.AwayFromZero);
}
