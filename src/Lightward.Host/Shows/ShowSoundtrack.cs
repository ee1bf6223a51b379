using Lightward.Audio;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using NAudio.Wave;

namespace Lightward.Host.Shows;

/// <summary>
/// The show's soundtrack, sample-aligned to its frames: the ship's engine (its thrust on the velocity profile or a burn
/// plan) and every cue's sound file, each starting on the first sample of the frame its cue falls on. Stereo, or 5.1 as
/// six mono files when any cue places a sound on the dome.
/// </summary>
public static class ShowSoundtrack
{
    public static SpeakerLayout LayoutFor(ShowScript script) => script.UsesPositionalSound ? SpeakerLayout.Surround51 : SpeakerLayout.Stereo;

    /// <summary>Writes the soundtrack of <paramref name="frameCount"/> frames to <paramref name="path"/> (atomically, all files together).</summary>
    public static IReadOnlyList<string> Write(ShowTimeline timeline, FrameRate frameRate, long frameCount, string path)
    {
        SpeakerLayout layout = LayoutFor(timeline.Script);
        var scene = new SoundScene(layout);
        List<PlacedSound> sounds = timeline.Script.Cues.Where(cue => cue.Sound is not null)
            .Select(cue => PlacedSound.Load(cue, layout, frameRate.SampleBoundary(frameRate.FramesIn(cue.At))))
            .ToList();
        using SoundtrackWriter writer = SoundtrackWriter.Create(path, layout, "soundtrack");
        var mixer = new CueMixer(sounds, scene.Channels, writer);
        double secondsPerFrame = (double)frameRate.Denominator / frameRate.Numerator;
        OfflineSoundRenderer.RenderFrames(scene, frameRate, frameCount,
            frame => scene.SetEngine(EngineLevel(timeline, frame * secondsPerFrame)), mixer);
        writer.Commit();
        return writer.Paths;
    }

    /// <summary>The engine tone's level at a show time: the proper acceleration felt aboard, in g (full at 1 g and above).</summary>
    public static double EngineLevel(ShowTimeline timeline, double showTime) => timeline.ControlsAt(showTime).ProperAcceleration.Length / Units.G;

    /// <summary>A cue's sound, decoded and spread over the channels once, waiting for its first sample.</summary>
    private sealed record PlacedSound(long StartSample, float[] Interleaved)
    {
        public static PlacedSound Load(ShowCue cue, SpeakerLayout layout, long startSample)
        {
            SoundCue sound = cue.Sound!;
            (float[] samples, int channels) = Decode(sound.File, cue);
            int outputs = SoundFormat.ChannelCount(layout);
            long frames = samples.Length / channels;
            var interleaved = new float[frames * outputs];
            float gain = (float)Math.Pow(10, sound.GainDecibels / 20);
            Span<float> pan = stackalloc float[outputs];
            if (sound.Direction is { } direction)
                SpeakerPanner.Gains(layout, direction.ToRotation().Rotate(Vec3.UnitZ), pan);
            for (long frame = 0; frame < frames; frame++)
            {
                if (sound.Direction is not null || channels == 1)
                {
                    // Placed sounds are panned as mono; an unplaced mono sound plays equally left and right (−3 dB each).
                    float mono = 0;
                    for (int c = 0; c < channels; c++) mono += samples[frame * channels + c];
                    mono *= gain / channels;
                    if (sound.Direction is not null)
                        for (int o = 0; o < outputs; o++) interleaved[frame * outputs + o] = mono * pan[o];
                    else
                        interleaved[frame * outputs] = interleaved[frame * outputs + 1] = mono * MathF.Sqrt(0.5f);
                }
                else
                {
                    // An unplaced stereo sound keeps its own left and right (the first two channels in both layouts).
                    interleaved[frame * outputs] = samples[frame * channels] * gain;
                    interleaved[frame * outputs + 1] = samples[frame * channels + 1] * gain;
                }
            }
            return new PlacedSound(startSample, interleaved);
        }

        private static (float[] Samples, int Channels) Decode(string file, ShowCue cue)
        {
            string where = $"cue {cue.Number} ({cue.Label}): sound file {file}";
            try
            {
                using var reader = new WaveFileReader(file);
                WaveFormat format = reader.WaveFormat;
                if (format.SampleRate != SoundFormat.SampleRate)
                    throw new UserInputException($"{where}: sampled at {format.SampleRate} Hz; soundtracks run at {SoundFormat.SampleRate} Hz, so convert it to 48 kHz first");
                if (format.Channels is < 1 or > 2)
                    throw new UserInputException($"{where}: has {format.Channels} channels; use a mono or stereo file");
                ISampleProvider provider = reader.ToSampleProvider();
                var samples = new List<float>();
                var buffer = new float[format.Channels * 4096];
                int read;
                while ((read = provider.Read(buffer.AsSpan())) > 0) samples.AddRange(buffer.AsSpan(0, read));
                return (samples.ToArray(), format.Channels);
            }
            catch (Exception e) when (e is FormatException or InvalidDataException or EndOfStreamException or ArgumentException)
            {
                throw new UserInputException($"{where}: not a readable WAV file ({e.Message}); use 16- or 24-bit PCM or 32-bit float WAV at 48 kHz");
            }
        }
    }

    /// <summary>Adds the cue sounds sounding in each block, then passes the block on.</summary>
    private sealed class CueMixer(List<PlacedSound> sounds, int channels, ISoundBlockSink next) : ISoundBlockSink
    {
        private long _position;
        private float[] _block = [];

        public void Write(ReadOnlySpan<float> interleaved)
        {
            if (_block.Length < interleaved.Length) _block = new float[interleaved.Length];
            Span<float> block = _block.AsSpan(0, interleaved.Length);
            interleaved.CopyTo(block);
            long frames = interleaved.Length / channels, end = _position + frames;
            foreach (PlacedSound sound in sounds)
            {
                long soundFrames = sound.Interleaved.Length / channels;
                long from = Math.Max(_position, sound.StartSample), to = Math.Min(end, sound.StartSample + soundFrames);
                for (long frame = from; frame < to; frame++)
                    for (int c = 0; c < channels; c++)
                        block[(int)((frame - _position) * channels + c)] += sound.Interleaved[(frame - sound.StartSample) * channels + c];
            }
            _position = end;
            next.Write(block);
        }
    }
}
