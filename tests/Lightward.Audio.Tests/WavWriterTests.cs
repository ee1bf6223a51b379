using System.Buffers.Binary;
using System.Text;
using Lightward.Spacetime;
using NAudio.Wave;

namespace Lightward.Audio.Tests;

public sealed class WavWriterTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-audio-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private string PathOf(string name) => Path.Combine(_folder, name);

    /// <summary>The fields of the "fmt " chunk, read by hand from the bytes (Microsoft RIFF/WAVE format, WAVEFORMATEX).</summary>
    private static (int Tag, int Channels, int Rate, int ByteRate, int BlockAlign, int Bits, byte[] Chunk) ReadFormat(string path)
    {
        byte[] file = File.ReadAllBytes(path);
        Assert.Equal("RIFF", Encoding.ASCII.GetString(file, 0, 4));
        Assert.Equal(file.Length - 8, BinaryPrimitives.ReadInt32LittleEndian(file.AsSpan(4)));
        Assert.Equal("WAVE", Encoding.ASCII.GetString(file, 8, 4));
        int offset = 12;
        while (Encoding.ASCII.GetString(file, offset, 4) != "fmt ")
            offset += 8 + BinaryPrimitives.ReadInt32LittleEndian(file.AsSpan(offset + 4));
        int size = BinaryPrimitives.ReadInt32LittleEndian(file.AsSpan(offset + 4));
        ReadOnlySpan<byte> chunk = file.AsSpan(offset + 8, size);
        return (BinaryPrimitives.ReadUInt16LittleEndian(chunk), BinaryPrimitives.ReadUInt16LittleEndian(chunk[2..]),
            BinaryPrimitives.ReadInt32LittleEndian(chunk[4..]), BinaryPrimitives.ReadInt32LittleEndian(chunk[8..]),
            BinaryPrimitives.ReadUInt16LittleEndian(chunk[12..]), BinaryPrimitives.ReadUInt16LittleEndian(chunk[14..]), chunk.ToArray());
    }

    /// <summary>Every sample of a WAV file as read back by NAudio's WaveFileReader.</summary>
    private static float[] ReadSamples(string path)
    {
        using var reader = new WaveFileReader(path);
        var samples = new float[reader.SampleCount * reader.WaveFormat.Channels];
        Assert.Equal(samples.Length, reader.ToSampleProvider().Read(samples));
        return samples;
    }

    [Fact]
    public void Capture_is_16_bit_stereo_pcm_at_48_kHz()
    {
        string path = PathOf("flight.wav");
        using (var writer = WavSoundWriter.CreateStereoCapture(path, "--wav"))
        {
            writer.Write([0.5f, -0.5f, 1.5f, -2f]);
            writer.Commit();
        }
        // WAVE_FORMAT_PCM = 1; nAvgBytesPerSec = rate × block align; nBlockAlign = channels × bits / 8
        // (Microsoft, "Multimedia Programming Interface and Data Specifications 1.0", RIFF WAVE format).
        var format = ReadFormat(path);
        Assert.Equal((1, 2, 48_000, 48_000 * 4, 4, 16), (format.Tag, format.Channels, format.Rate, format.ByteRate, format.BlockAlign, format.Bits));

        float[] read = ReadSamples(path);
        Assert.Equal(4, read.Length);
        Assert.Equal(0.5f, read[0], 1e-4f);
        Assert.Equal(-0.5f, read[1], 1e-4f);
        Assert.Equal(32767 / 32768f, read[2], 1e-6f); // clipped to full scale, not wrapped around
        Assert.Equal(-32767 / 32768f, read[3], 1e-6f);
    }

    [Fact]
    public void Stereo_soundtrack_is_24_bit_extensible_and_reads_back()
    {
        string path = PathOf("show.wav");
        var samples = new float[2 * 480];
        for (int i = 0; i < samples.Length; i++) samples[i] = (float)Math.Sin(i * 0.01) * 0.9f;
        using (var writer = SoundtrackWriter.Create(path, SpeakerLayout.Stereo, "--soundtrack"))
        {
            writer.Write(samples);
            writer.Commit();
        }
        // More than 16 bits per sample calls for WAVE_FORMAT_EXTENSIBLE (0xFFFE) with cbSize 22, wValidBitsPerSample,
        // dwChannelMask (SPEAKER_FRONT_LEFT | SPEAKER_FRONT_RIGHT = 3) and the PCM SubFormat GUID
        // 00000001-0000-0010-8000-00aa00389b71 (Microsoft, "Multiple channel audio data and WAVE files").
        var format = ReadFormat(path);
        Assert.Equal((0xFFFE, 2, 48_000, 48_000 * 6, 6, 24), (format.Tag, format.Channels, format.Rate, format.ByteRate, format.BlockAlign, format.Bits));
        Assert.Equal(22, BinaryPrimitives.ReadUInt16LittleEndian(format.Chunk.AsSpan(16)));
        Assert.Equal(24, BinaryPrimitives.ReadUInt16LittleEndian(format.Chunk.AsSpan(18)));
        Assert.Equal(3, BinaryPrimitives.ReadInt32LittleEndian(format.Chunk.AsSpan(20)));
        Assert.Equal(new Guid("00000001-0000-0010-8000-00aa00389b71"), new Guid(format.Chunk.AsSpan(24, 16)));

        using var reader = new WaveFileReader(path);
        Assert.Equal((48_000, 24, 2), (reader.WaveFormat.SampleRate, reader.WaveFormat.BitsPerSample, reader.WaveFormat.Channels));
        Assert.Equal(480, reader.SampleCount);
        var bytes = new byte[samples.Length * 3];
        Assert.Equal(bytes.Length, reader.Read(bytes, 0, bytes.Length));
        for (int i = 0; i < samples.Length; i++)
        {
            int value = (bytes[3 * i] | bytes[3 * i + 1] << 8 | (sbyte)bytes[3 * i + 2] << 16);
            Assert.Equal(samples[i], value / 8388607f, 1.5e-7f);
        }
    }

    [Fact]
    public void Surround_soundtrack_is_six_mono_24_bit_files_named_by_channel()
    {
        string path = PathOf("dome.wav");
        var scene = new SoundScene(SpeakerLayout.Surround51);
        scene.SetEngine(1);
        scene.SetBeacon("ahead", 5, 600, 1, Vec3.UnitZ);
        using (var writer = SoundtrackWriter.Create(path, SpeakerLayout.Surround51, "--soundtrack"))
        {
            OfflineSoundRenderer.RenderFrames(scene, FrameRate.Parse("25", "--fps"), 25, _ => { }, writer);
            writer.Commit();
        }
        string[] names = ["L", "R", "C", "LFE", "Ls", "Rs"];
        // Speaker bits per channel: FRONT_LEFT 0x1, FRONT_RIGHT 0x2, FRONT_CENTER 0x4, LOW_FREQUENCY 0x8,
        // BACK_LEFT 0x10, BACK_RIGHT 0x20 (Microsoft, "Multiple channel audio data and WAVE files").
        int[] masks = [0x1, 0x2, 0x4, 0x8, 0x10, 0x20];
        var rms = new Dictionary<string, double>();
        for (int c = 0; c < names.Length; c++)
        {
            string channelPath = PathOf($"dome.{names[c]}.wav");
            var format = ReadFormat(channelPath);
            Assert.Equal((0xFFFE, 1, 48_000, 24), (format.Tag, format.Channels, format.Rate, format.Bits));
            Assert.Equal(masks[c], BinaryPrimitives.ReadInt32LittleEndian(format.Chunk.AsSpan(20)));
            float[] values = ReadSamples(channelPath);
            Assert.Equal(48_000, values.Length);
            rms[names[c]] = SignalMeasurements.Rms(values);
        }
        Assert.False(File.Exists(path));
        // The engine sits behind (surrounds) with its low end in the LFE; the beacon ahead plays from the centre.
        Assert.True(rms["LFE"] > 0.01 && rms["Ls"] > 0.01 && rms["Rs"] > 0.01 && rms["C"] > 0.01, string.Join(", ", rms));
        Assert.Equal(0, rms["L"], 1e-6);
        Assert.Equal(0, rms["R"], 1e-6);
    }

    [Fact]
    public void Nothing_appears_until_commit_and_an_abandoned_file_leaves_no_trace()
    {
        string path = PathOf("partial.wav");
        using (var writer = WavSoundWriter.CreateStereoCapture(path, "--wav"))
        {
            writer.Write(new float[960]);
            Assert.False(File.Exists(path));
        }
        Assert.Empty(Directory.GetFileSystemEntries(_folder));

        File.WriteAllText(path, "old");
        using (var writer = WavSoundWriter.CreateStereoCapture(path, "--wav"))
        {
            writer.Write(new float[960]);
            Assert.Equal("old", File.ReadAllText(path));
            writer.Commit();
        }
        Assert.Equal([path], Directory.GetFileSystemEntries(_folder));
        using var reader = new WaveFileReader(path);
        Assert.Equal(480, reader.SampleCount);
    }

    [Theory]
    [InlineData("no-such-folder/out.wav", "does not exist")]
    [InlineData("out.mp3", "does not end in .wav")]
    [InlineData("", "missing file name")]
    public void Bad_output_paths_are_user_errors_naming_the_flag(string name, string problem)
    {
        string path = name.Length == 0 ? "" : PathOf(name);
        var error = Assert.Throws<UserInputException>(() => WavSoundWriter.CreateStereoCapture(path, "--wav"));
        Assert.StartsWith("--wav:", error.Message);
        Assert.Contains(problem, error.Message);
    }
}
