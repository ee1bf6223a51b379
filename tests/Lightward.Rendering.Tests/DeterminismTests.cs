using Lightward.Optics;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests;

/// <summary>The same inputs give the same bytes: twice in a row, and with one thread or two (each thread owns its rows).</summary>
public class DeterminismTests
{
    private static readonly StarCatalog Sky = StarCatalog.Procedural(30_000, seed: 7);

    public static TheoryData<ProjectionKind, double, double> Views => new()
    {
        // projection, rapidity, field of view (degrees): the last is a narrow view of the forward CMB glow at φ = 12.
        { ProjectionKind.Perspective, 0, 90 },
        { ProjectionKind.Perspective, 3, 60 },
        { ProjectionKind.Domemaster, 1, 180 },
        { ProjectionKind.Equirectangular, 2, 360 },
        { ProjectionKind.Perspective, 12, 0.03 },
    };

    [Theory]
    [MemberData(nameof(Views))]
    public void Frames_are_byte_identical_across_runs_and_thread_counts(ProjectionKind kind, double rapidity, double fieldOfView)
    {
        (int width, int height) = kind switch
        {
            ProjectionKind.Domemaster => (256, 256),
            ProjectionKind.Equirectangular => (512, 256),
            _ => (320, 200),
        };
        var camera = new Camera(kind, width, height, fieldOfView * Math.PI / 180, 0, Exposure.Auto);
        var ship = ShipState.AtRest(default) with
        {
            Frame = new LorentzFrame(new Velocity(rapidity, new Vec3(0.2, 0.1, 1).NormalizedOr(Vec3.UnitZ)), Rotation.FromAxisAngle(new Vec3(0.3, 1, 0.1), 0.4)),
        };
        var scene = new Scene(Sky);
        var observer = new Observer(ship, Rotation.FromAxisAngle(Vec3.UnitY, 0.1));
        var twoThreads = new FrameRenderer(2);
        byte[] first = twoThreads.Render(scene, observer, camera).Pixels;
        byte[] again = twoThreads.Render(scene, observer, camera).Pixels;
        byte[] oneThread = new FrameRenderer(1).Render(scene, observer, camera).Pixels;
        Assert.Equal(first, again);
        Assert.Equal(first, oneThread);
        Assert.Contains(first, b => b > 40);
    }

    [Fact]
    public void A_frame_does_not_depend_on_the_frame_rendered_before_it()
    {
        // The renderer reuses its HDR buffer (zeroed by each tone map); a frame full of background glow must leave no trace.
        var camera = new Camera(ProjectionKind.Perspective, 160, 100, 0.03 * Math.PI / 180, 0, Exposure.Auto);
        var wide = camera with { FieldOfView = Math.PI / 2 };
        var scene = new Scene(Sky);
        Observer glowing = new(ShipState.AtRest(default) with { Frame = new LorentzFrame(new Velocity(12, Vec3.UnitZ), Rotation.Identity) }, Rotation.Identity);
        Observer resting = new(ShipState.AtRest(default), Rotation.Identity);
        var renderer = new FrameRenderer(2);
        byte[] fresh = new FrameRenderer(2).Render(scene, resting, wide).Pixels;
        var image = new RgbaImage(160, 100);
        renderer.Render(scene, glowing, camera, image);
        renderer.Render(scene, resting, wide, image);
        Assert.Equal(fresh, image.Pixels);
    }
}
