using System.Numerics;
using Lightward.Spacetime;

namespace Lightward.Audio.Tests;

public class FrameAlignmentTests
{
    /// <summary>round(frames × 48000 × den / num), halves up, computed independently in big integers.</summary>
    private static long ExpectedSamples(long frames, long numerator, long denominator)
    {
        BigInteger scaled = new BigInteger(frames) * 48_000 * denominator;
        return (long)BigInteger.Divide(2 * scaled + numerator, 2 * new BigInteger(numerator));
    }

    [Theory]
    [InlineData("24", 24, 1)]
    [InlineData("25", 25, 1)]
    [InlineData("29.97", 30_000, 1001)]
    [InlineData("30", 30, 1)]
    [InlineData("48", 48, 1)]
    [InlineData("59.94", 60_000, 1001)]
    [InlineData("60", 60, 1)]
    public void An_hour_of_frames_has_exactly_the_rounded_sample_count_with_no_drift(string name, long numerator, long denominator)
    {
        // NTSC-family rates are exactly 30000/1001 and 60000/1001 frames per second (SMPTE ST 12-1).
        FrameRate rate = FrameRate.Parse(name, "--fps");
        Assert.Equal((numerator, denominator), (rate.Numerator, rate.Denominator));
        long frames = rate.FramesIn(3600);
        long sum = 0;
        for (long frame = 0; frame < frames; frame++) sum += rate.SamplesInFrame(frame);
        Assert.Equal(ExpectedSamples(frames, numerator, denominator), sum);
        Assert.Equal(sum, rate.SampleBoundary(frames));
    }

    [Fact]
    public void An_hour_at_29_97_fps_is_107892_frames_and_172799827_samples()
    {
        // 3600 s × 30000/1001 = 107892.1 frames; 107892 × 48000 × 1001/30000 = 172 799 827.2 samples (hand arithmetic).
        FrameRate rate = FrameRate.Parse("29.97", "--fps");
        Assert.Equal(107_892, rate.FramesIn(3600));
        Assert.Equal(172_799_827, rate.SampleBoundary(107_892));
    }

    [Fact]
    public void At_29_97_fps_frames_follow_the_five_frame_1602_1601_sequence()
    {
        // 48 kHz audio at 29.97 fps repeats every 5 frames = 8008 samples as 1602, 1601, 1602, 1601, 1602
        // (the NTSC audio frame sequence of SMPTE ST 272 / AES; from memory).
        FrameRate rate = FrameRate.Parse("30000/1001", "--fps");
        Assert.Equal([1602, 1601, 1602, 1601, 1602, 1602, 1601], Enumerable.Range(0, 7).Select(f => rate.SamplesInFrame(f)));
        Assert.Equal(8008, rate.SampleBoundary(5));
    }

    [Theory]
    [InlineData("")]
    [InlineData("thirty")]
    [InlineData("0/1")]
    [InlineData("30/0")]
    [InlineData("-30")]
    public void Bad_frame_rates_are_user_errors_naming_the_flag(string text)
    {
        var error = Assert.Throws<UserInputException>(() => FrameRate.Parse(text, "--fps"));
        Assert.StartsWith("--fps:", error.Message);
        Assert.Contains("29.97", error.Message);
    }

    [Fact]
    public void Offline_rendering_writes_exactly_the_samples_of_the_frames()
    {
        FrameRate rate = FrameRate.Parse("29.97", "--fps");
        var scene = new SoundScene();
        var counter = new CountingSink();
        var framesSeen = new List<long>();
        long written = OfflineSoundRenderer.RenderFrames(scene, rate, 301, frame =>
        {
            framesSeen.Add(frame);
            scene.SetEngine(frame / 300.0);
        }, counter);
        Assert.Equal(ExpectedSamples(301, 30_000, 1001), written);
        Assert.Equal(written * 2, counter.Samples);
        Assert.Equal(Enumerable.Range(0, 301).Select(f => (long)f), framesSeen);
    }

    private sealed class CountingSink : ISoundBlockSink
    {
        public long Samples;
        public void Write(ReadOnlySpan<float> interleaved) => Samples += interleaved.Length;
    }
}
