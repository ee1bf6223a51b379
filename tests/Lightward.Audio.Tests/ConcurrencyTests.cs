using Lightward.Spacetime;

namespace Lightward.Audio.Tests;

public class ConcurrencyTests
{
    [Fact]
    public void The_frame_loop_can_change_the_scene_while_another_thread_renders()
    {
        var scene = new SoundScene(SpeakerLayout.Surround51);
        using var stop = new CancellationTokenSource(TimeSpan.FromMilliseconds(300));
        var renderer = Task.Run(() =>
        {
            var block = new float[480 * scene.Channels];
            long blocks = 0;
            while (!stop.IsCancellationRequested)
            {
                scene.Render(block);
                Assert.All(block, sample => Assert.True(float.IsFinite(sample)));
                blocks++;
            }
            return blocks;
        });
        var random = new Random(7);
        long updates = 0;
        while (!stop.IsCancellationRequested)
        {
            string id = $"beacon {random.Next(12)}";
            if (random.Next(4) == 0) scene.RemoveBeacon(id);
            else scene.SetBeacon(id, 1 + random.NextDouble() * 5, 200 + random.NextDouble() * 800, Math.Exp(random.NextDouble() * 4 - 2),
                new Vec3(random.NextDouble() - 0.5, random.NextDouble() - 0.5, random.NextDouble() - 0.5));
            scene.SetEngine(random.NextDouble());
            if (random.Next(50) == 0) scene.RaiseAlert((AlertKind)random.Next(4));
            updates++;
        }
        Assert.True(renderer.Result > 10 && updates > 10, $"{renderer.Result} blocks, {updates} updates");
    }
}
