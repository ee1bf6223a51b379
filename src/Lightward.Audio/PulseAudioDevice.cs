using System.Runtime.InteropServices;

namespace Lightward.Audio;

/// <summary>
/// Live playback through PulseAudio's simple API (libpulse-simple.so.0), which PipeWire also serves. Float32
/// samples at 48 kHz with an explicit channel map, and a short target buffer (four blocks) so sound follows the
/// controls closely.
/// </summary>
internal sealed unsafe class PulseAudioDevice : ISoundDevice
{
    public const string LibraryName = "libpulse-simple.so.0";

    private const int PlaybackDirection = 1;     // PA_STREAM_PLAYBACK
    private const int Float32LittleEndian = 5;   // PA_SAMPLE_FLOAT32LE
    private const int BufferedBlocks = 4;

    // pa_channel_position_t values for our interleaving orders (pulse/channelmap.h).
    private static readonly int[] StereoPositions = [1, 2];                 // FRONT_LEFT, FRONT_RIGHT
    private static readonly int[] SurroundPositions = [1, 2, 3, 7, 5, 6];   // + FRONT_CENTER, LFE, REAR_LEFT, REAR_RIGHT

    [StructLayout(LayoutKind.Sequential)]
    private struct SampleSpec { public int Format; public uint Rate; public byte Channels; }

    [StructLayout(LayoutKind.Sequential)]
    private struct ChannelMap { public byte Channels; public fixed int Map[32]; }

    [StructLayout(LayoutKind.Sequential)]
    private struct BufferAttributes { public uint MaxLength, TargetLength, Prebuffer, MinimumRequest, FragmentSize; }

    private readonly IntPtr _library;
    private readonly IntPtr _stream;
    private readonly ulong _blockMicroseconds;
    private readonly delegate* unmanaged<IntPtr, void*, nuint, int*, int> _write;
    private readonly delegate* unmanaged<IntPtr, int*, int> _drain;
    private readonly delegate* unmanaged<IntPtr, void> _free;
    private readonly delegate* unmanaged<IntPtr, int*, ulong> _latency;
    private bool _primed;

    private PulseAudioDevice(IntPtr library, IntPtr stream, int sampleRate, int blockFrames)
    {
        _library = library;
        _stream = stream;
        _blockMicroseconds = (ulong)(1e6 * blockFrames / sampleRate);
        _write = (delegate* unmanaged<IntPtr, void*, nuint, int*, int>)NativeLibrary.GetExport(library, "pa_simple_write");
        _drain = (delegate* unmanaged<IntPtr, int*, int>)NativeLibrary.GetExport(library, "pa_simple_drain");
        _free = (delegate* unmanaged<IntPtr, void>)NativeLibrary.GetExport(library, "pa_simple_free");
        _latency = (delegate* unmanaged<IntPtr, int*, ulong>)NativeLibrary.GetExport(library, "pa_simple_get_latency");
    }

    public string Name => "pulseaudio";

    /// <summary>Connects to the default server, or returns null with the reason (library missing, no server…).</summary>
    public static PulseAudioDevice? TryOpen(int sampleRate, SpeakerLayout layout, int blockFrames, out string? whyNot,
        string libraryName = LibraryName)
    {
        whyNot = null;
        if (!NativeLibrary.TryLoad(libraryName, out IntPtr library))
        {
            whyNot = $"PulseAudio library {libraryName} not found";
            return null;
        }
        try
        {
            var open = (delegate* unmanaged<byte*, byte*, int, byte*, byte*, SampleSpec*, ChannelMap*, BufferAttributes*, int*, IntPtr>)
                NativeLibrary.GetExport(library, "pa_simple_new");
            int[] positions = layout == SpeakerLayout.Stereo ? StereoPositions : SurroundPositions;
            var spec = new SampleSpec { Format = Float32LittleEndian, Rate = (uint)sampleRate, Channels = (byte)positions.Length };
            var map = new ChannelMap { Channels = (byte)positions.Length };
            for (int i = 0; i < positions.Length; i++) map.Map[i] = positions[i];
            uint blockBytes = (uint)(blockFrames * positions.Length * sizeof(float));
            var attributes = new BufferAttributes
            {
                MaxLength = uint.MaxValue, TargetLength = BufferedBlocks * blockBytes, Prebuffer = uint.MaxValue,
                MinimumRequest = uint.MaxValue, FragmentSize = uint.MaxValue,
            };
            byte[] client = "lightward\0"u8.ToArray(), streamName = "ship sound\0"u8.ToArray();
            int error = 0;
            IntPtr stream;
            fixed (byte* clientName = client, description = streamName)
                stream = open(null, clientName, PlaybackDirection, null, description, &spec, &map, &attributes, &error);
            if (stream == IntPtr.Zero)
            {
                whyNot = $"PulseAudio: {ErrorText(library, error)}";
                NativeLibrary.Free(library);
                return null;
            }
            return new PulseAudioDevice(library, stream, sampleRate, blockFrames);
        }
        catch (EntryPointNotFoundException e)
        {
            whyNot = $"PulseAudio library {libraryName} is incomplete ({e.Message})";
            NativeLibrary.Free(library);
            return null;
        }
    }

    public bool Play(ReadOnlySpan<float> interleaved)
    {
        int error = 0;
        // Once the buffer has filled, a latency below one block before writing means it had (nearly) run out.
        ulong latency = _latency(_stream, &error);
        bool ranDry = _primed && latency < _blockMicroseconds;
        _primed |= latency >= 2 * _blockMicroseconds;
        fixed (float* samples = interleaved)
            if (_write(_stream, samples, (nuint)(interleaved.Length * sizeof(float)), &error) < 0)
                throw new IOException($"PulseAudio write failed: {ErrorText(_library, error)}");
        return ranDry;
    }

    public void Drain()
    {
        int error = 0;
        _drain(_stream, &error);
    }

    public void Dispose()
    {
        _free(_stream);
        NativeLibrary.Free(_library);
    }

    /// <summary>pa_strerror lives in libpulse.so.0, which libpulse-simple loads; fall back to the number.</summary>
    private static string ErrorText(IntPtr simpleLibrary, int error)
    {
        if (NativeLibrary.TryLoad("libpulse.so.0", out IntPtr pulse))
        {
            try
            {
                if (NativeLibrary.TryGetExport(pulse, "pa_strerror", out IntPtr function))
                    return Marshal.PtrToStringUTF8(((delegate* unmanaged<int, IntPtr>)function)(error)) ?? $"error {error}";
            }
            finally
            {
                NativeLibrary.Free(pulse);
            }
        }
        return $"error {error}";
    }
}
