using System.Runtime.InteropServices;

namespace Lightward.Audio;

/// <summary>
/// Live playback through ALSA (libasound.so.2) on the "default" device, for machines without a PulseAudio server.
/// An underrun shows up as -EPIPE from snd_pcm_writei; it is counted, the device is recovered and the block replayed.
/// </summary>
internal sealed unsafe class AlsaDevice : ISoundDevice
{
    public const string LibraryName = "libasound.so.2";

    private const int PlaybackStream = 0;          // SND_PCM_STREAM_PLAYBACK
    private const int FloatLittleEndian = 14;      // SND_PCM_FORMAT_FLOAT_LE
    private const int InterleavedAccess = 3;       // SND_PCM_ACCESS_RW_INTERLEAVED
    private const int BrokenPipe = -32;            // -EPIPE: the device ran dry
    private const int BufferedBlocks = 4;

    private readonly IntPtr _library;
    private readonly IntPtr _pcm;
    private readonly int _channels;
    private readonly delegate* unmanaged<IntPtr, void*, nuint, nint> _write;
    private readonly delegate* unmanaged<IntPtr, int, int, int> _recover;
    private readonly delegate* unmanaged<IntPtr, int> _drain;
    private readonly delegate* unmanaged<IntPtr, int> _close;

    private AlsaDevice(IntPtr library, IntPtr pcm, int channels)
    {
        _library = library;
        _pcm = pcm;
        _channels = channels;
        _write = (delegate* unmanaged<IntPtr, void*, nuint, nint>)NativeLibrary.GetExport(library, "snd_pcm_writei");
        _recover = (delegate* unmanaged<IntPtr, int, int, int>)NativeLibrary.GetExport(library, "snd_pcm_recover");
        _drain = (delegate* unmanaged<IntPtr, int>)NativeLibrary.GetExport(library, "snd_pcm_drain");
        _close = (delegate* unmanaged<IntPtr, int>)NativeLibrary.GetExport(library, "snd_pcm_close");
    }

    public string Name => "alsa";

    /// <summary>Opens the default ALSA device, or returns null with the reason. Without any sound card it does not even try,
    /// because libasound would print its own errors to the terminal.</summary>
    public static AlsaDevice? TryOpen(int sampleRate, int channels, int blockFrames, out string? whyNot, string libraryName = LibraryName)
    {
        whyNot = null;
        if (!HasSoundCard())
        {
            whyNot = "no ALSA sound card";
            return null;
        }
        if (!NativeLibrary.TryLoad(libraryName, out IntPtr library))
        {
            whyNot = $"ALSA library {libraryName} not found";
            return null;
        }
        try
        {
            var open = (delegate* unmanaged<IntPtr*, byte*, int, int, int>)NativeLibrary.GetExport(library, "snd_pcm_open");
            var setParameters = (delegate* unmanaged<IntPtr, int, int, uint, uint, int, uint, int>)NativeLibrary.GetExport(library, "snd_pcm_set_params");
            IntPtr pcm;
            int result;
            fixed (byte* device = "default\0"u8)
                result = open(&pcm, device, PlaybackStream, 0);
            if (result < 0)
            {
                whyNot = $"ALSA: {ErrorText(library, result)}";
                NativeLibrary.Free(library);
                return null;
            }
            uint latencyMicroseconds = (uint)(1e6 * BufferedBlocks * blockFrames / sampleRate);
            result = setParameters(pcm, FloatLittleEndian, InterleavedAccess, (uint)channels, (uint)sampleRate, 1, latencyMicroseconds);
            if (result < 0)
            {
                whyNot = $"ALSA: {ErrorText(library, result)}";
                ((delegate* unmanaged<IntPtr, int>)NativeLibrary.GetExport(library, "snd_pcm_close"))(pcm);
                NativeLibrary.Free(library);
                return null;
            }
            return new AlsaDevice(library, pcm, channels);
        }
        catch (EntryPointNotFoundException e)
        {
            whyNot = $"ALSA library {libraryName} is incomplete ({e.Message})";
            NativeLibrary.Free(library);
            return null;
        }
    }

    private static bool HasSoundCard()
    {
        const string cards = "/proc/asound/cards";
        return File.Exists(cards) && !File.ReadAllText(cards).Contains("no soundcards", StringComparison.OrdinalIgnoreCase);
    }

    public bool Play(ReadOnlySpan<float> interleaved)
    {
        bool ranDry = false;
        int frames = interleaved.Length / _channels, done = 0;
        fixed (float* samples = interleaved)
        {
            while (done < frames)
            {
                nint written = _write(_pcm, samples + done * _channels, (nuint)(frames - done));
                if (written >= 0)
                {
                    done += (int)written;
                    continue;
                }
                if (written == BrokenPipe) ranDry = true;
                int recovered = _recover(_pcm, (int)written, 1);
                if (recovered < 0) throw new IOException($"ALSA write failed: {ErrorText(_library, recovered)}");
            }
        }
        return ranDry;
    }

    public void Drain() => _drain(_pcm);

    public void Dispose()
    {
        _close(_pcm);
        NativeLibrary.Free(_library);
    }

    private static string ErrorText(IntPtr library, int error) =>
        NativeLibrary.TryGetExport(library, "snd_strerror", out IntPtr function)
            ? Marshal.PtrToStringUTF8(((delegate* unmanaged<int, IntPtr>)function)(error)) ?? $"error {error}"
            : $"error {error}";
}
