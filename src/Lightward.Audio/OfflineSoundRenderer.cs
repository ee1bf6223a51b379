namespace Lightward.Audio;

/// <summary>
/// Renders a sound scene against a video timeline: before each frame the caller sets the scene's state for that
/// frame, then exactly the samples belonging to that frame are rendered, with frame → sample boundaries from
/// <see cref="FrameRate.SampleBoundary"/>. So a soundtrack of N frames has exactly SampleBoundary(N) samples and
/// every frame's sound starts on the sample its picture does, with no drift at 29.97 or 59.94 fps.
/// </summary>
public static class OfflineSoundRenderer
{
    /// <summary>
    /// Renders <paramref name="frameCount"/> frames at <paramref name="frameRate"/> into <paramref name="sink"/>, calling
    /// <paramref name="setFrameState"/> with each frame number first. Returns the number of sample frames written.
    /// </summary>
    public static long RenderFrames(SoundScene scene, FrameRate frameRate, long frameCount, Action<long> setFrameState, ISoundBlockSink sink,
        CancellationToken cancellationToken = default)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(frameCount);
        int largestFrame = (int)(frameRate.SampleBoundary(1, scene.SampleRate) + 1);
        float[] buffer = new float[largestFrame * scene.Channels];
        long written = 0;
        for (long frame = 0; frame < frameCount; frame++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            setFrameState(frame);
            Span<float> block = buffer.AsSpan(0, frameRate.SamplesInFrame(frame, scene.SampleRate) * scene.Channels);
            scene.Render(block);
            sink.Write(block);
            written += block.Length / scene.Channels;
        }
        return written;
    }
}
