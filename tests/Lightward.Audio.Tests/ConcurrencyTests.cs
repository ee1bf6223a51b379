using Lightward.Spacetime;

namespace Lightward.Audio.Tests;

public class ConcurrencyTests
{
    [Fact]
    public void The_frame_loop_can_change_the_scene_while_another_thread_renders()
    {
        var scene = new SoundScene(SpeakerLayout.Surround51);
        long blocks = 0;
        bool stop = false, allFinite = true;
        // A thread of its own (not the pool, which other tests may keep busy), as the live sound output uses.
        var renderer = new Thread(() =>
        {
            var block = new float[480 * scene.Channels];
            while (!Volatile.Read(ref stop))
            {
                scene.Render(block);
                foreach (float sample in block) allFinite &= float.IsFinite(sample);
                Interlocked.Increment(ref blocks);
            }
        });
        renderer.Start();
        var random = new Random(7);
        long updates = 0;
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(30);
        while ((Interlocked.Read(ref blocks) < 50 || updates < 1000) && DateTime.UtcNow < deadline)
        {
            string id = $"beacon {random.Next(12)}";
            if (random.Next(4) == 0) scene.RemoveBeacon(id);
            else scene.SetBeacon(id, 1 + random.NextDouble() * 5, 200 + random.NextDouble() * 800, Math.Exp(random.NextDouble() * 4 - 2),
                new Vec3(random.NextDouble() - 0.5, random.NextDouble() - 0.5, random.NextDouble() - 0.5));
            scene.SetEngine(random.NextDouble());
            if (random.Next(50) == 0) scene.RaiseAlert((AlertKind)random.Next(4));
            updates++;
        }
        Volatile.Write(ref stop, true);
        renderer.Join();
        Assert.True(blocks >= 50 && updates >= 1000, $"{blocks} blocks, {updates} updates");
        Assert.True(allFinite, "a rendered sample was not finite");
    }
}
