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
        byte[] first = twoThreads.Render(scene, observer, camera).ReadOnlyPixels.ToArray();
        byte[] again = twoThreads.Render(scene, observer, camera).ReadOnlyPixels.ToArray();
        byte[] oneThread = new FrameRenderer(1).Render(scene, observer, camera).ReadOnlyPixels.ToArray();
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
        byte[] fresh = new FrameRenderer(2).Render(scene, resting, wide).ReadOnlyPixels.ToArray();
        var image = new RgbaImage(160, 100);
        renderer.Render(scene, glowing, camera, image);
        renderer.Render(scene, resting, wide, image);
        Assert.Equal(fresh, image.ReadOnlyPixels.ToArray());
    }

    [Fact]
    public void Pixels_where_no_light_fell_are_written_black_whatever_the_image_held()
    {
        // The tone map skips untouched pixel groups but must still overwrite them: hosts draw instruments on the image.
        var camera = new Camera(ProjectionKind.Perspective, 320, 200, Math.PI / 2, 0, Exposure.Auto);
        var scene = new Scene(Sky);
        Observer observer = new(ShipState.AtRest(default), Rotation.Identity);
        byte[] fresh = new FrameRenderer(2).Render(scene, observer, camera).ReadOnlyPixels.ToArray();
        var image = new RgbaImage(320, 200);
        image.Pixels.Fill(0x7F);
        new FrameRenderer(2).Render(scene, observer, camera, image);
        Assert.Equal(fresh, image.ReadOnlyPixels.ToArray());
    }

    public static TheoryData<bool, bool, int> FrameSequences => new()
    {
        // with a layer (band-by-band composite path), with someone drawing on the image between frames, image width:
        // 203 px rows do not start on cache lines (groups written one by one), 256 px rows do (whole lines, and a star
        // tile's rows noted four at a time)
        { false, false, 203 }, { false, true, 203 }, { true, false, 203 }, { true, true, 203 },
        { false, false, 256 }, { false, true, 256 }, { true, false, 256 }, { true, true, 256 },
    };

    [Theory]
    [MemberData(nameof(FrameSequences))]
    public void A_turning_view_rendered_frame_after_frame_into_one_image_matches_each_frame_rendered_afresh(bool withLayer, bool drawnOnBetween, int width)
    {
        // The renderer writes black only over the groups it left lit in the frame before, unless the image was handed
        // out to be written (instruments drawn on it): each frame must still be exactly what a fresh image gets.
        var camera = new Camera(ProjectionKind.Perspective, width, 120, Math.PI / 2, 0, Exposure.Manual(2));
        var scene = new Scene(Sky);
        FrameRenderer NewRenderer(int threads)
        {
            var renderer = new FrameRenderer(threads);
            if (withLayer) renderer.Layers.Add(new EmptyLayer());
            return renderer;
        }
        FrameRenderer renderer = NewRenderer(2);
        var image = new RgbaImage(width, 120);
        for (int frame = 0; frame < 6; frame++)
        {
            // Turning 0.3° a frame, and at frame 3 fast enough for the CMB to fill the view (every pixel written).
            double rapidity = frame == 3 ? 12 : 0;
            Observer observer = new(ShipState.AtRest(default) with { Frame = new LorentzFrame(new Velocity(rapidity, Vec3.UnitZ), Rotation.Identity) },
                Rotation.FromAxisAngle(Vec3.UnitY, frame * 0.3 * Math.PI / 180));
            var fresh = new RgbaImage(width, 120);
            NewRenderer(1).Render(scene, observer, camera, fresh);
            renderer.Render(scene, observer, camera, image);
            Assert.True(fresh.ReadOnlyPixels.SequenceEqual(image.ReadOnlyPixels), $"frame {frame} differs from a fresh render");
            if (drawnOnBetween) image.Pixels.Slice(4 * width * 50, 4 * width * 3).Fill(0xC8);
        }
    }

    /// <summary>The same 60 random stars, from faint to far past white, splatted into each of <paramref name="frames"/>.</summary>
    private static void SplatRandomStars(params HdrFrame[] frames)
    {
        var splatter = new StarSplatter();
        var random = new Random(3);
        int width = frames[0].Width, height = frames[0].Height;
        for (int star = 0; star < 60; star++)
        {
            float x = (float)(random.NextDouble() * width), y = (float)(random.NextDouble() * height), flux = (float)Math.Pow(10, random.NextDouble() * 5 - 2);
            foreach (HdrFrame frame in frames)
                splatter.SplatOne(frame, x, y, flux, 0.7f * flux, 0.4f * flux, splatter.FootprintFor(flux), 0, height, 0, width);
        }
    }

    /// <summary>The same random guides (premultiplied display codes and coverage) in every third group of each of <paramref name="overlays"/>.</summary>
    private static void DrawRandomGuides(params DisplayOverlay[] overlays)
    {
        var random = new Random(4);
        DisplayOverlay first = overlays[0];
        for (int row = 0; row < first.Height; row++)
            for (int group = row % 3; group < first.GroupsPerRow; group += 3)
                for (int x = group * HdrFrame.GroupWidth; x < Math.Min(first.Width, (group + 1) * HdrFrame.GroupWidth); x++)
                {
                    uint coverage = (uint)random.Next(256), code = (uint)random.Next((int)coverage + 1);
                    foreach (DisplayOverlay overlay in overlays)
                    {
                        overlay.Pixels[row * first.Width + x] = code | code / 2 << 8 | code / 3 << 16 | coverage << 24;
                        overlay.Marks[row * first.GroupsPerRow + group] = 1;
                    }
                }
    }

    [Fact]
    public unsafe void The_sparse_tone_map_gives_the_same_bytes_as_reading_every_pixel()
    {
        var marked = new HdrFrame(203, 70);
        var whole = new HdrFrame(203, 70);
        SplatRandomStars(marked, whole);
        whole.WhollyTouched = true;
        var markedGuides = new DisplayOverlay(203, 70);
        var wholeGuides = new DisplayOverlay(203, 70);
        DrawRandomGuides(markedGuides, wholeGuides);
        var sparseImage = new RgbaImage(203, 70);
        var fullImage = new RgbaImage(203, 70);
        fixed (byte* sparse = sparseImage.Pixels, full = fullImage.Pixels)
        {
            ToneMapper.MapAndClearRows(marked, 0.5f, (uint*)sparse, null, false, 0, 70, markedGuides);
            ToneMapper.MapAndClearRows(whole, 0.5f, (uint*)full, null, false, 0, 70, wholeGuides);
        }
        Assert.Equal(fullImage.ReadOnlyPixels.ToArray(), sparseImage.ReadOnlyPixels.ToArray());
        Assert.Contains(sparseImage.ReadOnlyPixels.ToArray(), b => b is > 0 and < 255);
        // Both leave the HDR frame zeroed and unmarked for the next frame.
        Assert.All(marked.Red, v => Assert.Equal(0f, v));
        Assert.All(marked.Touched, t => Assert.Equal(0, t));
    }

    [Theory]
    [InlineData(false, true)]
    [InlineData(true, true)]
    [InlineData(false, false)]
    public unsafe void Writing_whole_cache_lines_gives_the_same_bytes_as_writing_group_by_group(bool everyPixelRead, bool withGuides)
    {
        // 208 px: each row is whole 64-byte lines, so an image (whose pixels start on a line) is written a line at a
        // time; the same rows written one pixel past a line's start are written group by group.
        const int Width = 208, Height = 40;
        var lineByLine = new HdrFrame(Width, Height);
        var groupByGroup = new HdrFrame(Width, Height);
        SplatRandomStars(lineByLine, groupByGroup);
        lineByLine.WhollyTouched = groupByGroup.WhollyTouched = everyPixelRead;
        DisplayOverlay? lineGuides = withGuides ? new DisplayOverlay(Width, Height) : null;
        DisplayOverlay? groupGuides = withGuides ? new DisplayOverlay(Width, Height) : null;
        if (withGuides) DrawRandomGuides(lineGuides!, groupGuides!);
        var image = new RgbaImage(Width, Height);
        var offLine = new uint[Width * Height + 32];
        fixed (byte* lines = image.Pixels)
        fixed (uint* memory = offLine)
        {
            uint* groups = (uint*)(((nint)memory + 63) & ~(nint)63) + 1;
            ToneMapper.MapAndClearRows(lineByLine, 0.5f, (uint*)lines, null, false, 0, Height, lineGuides);
            ToneMapper.MapAndClearRows(groupByGroup, 0.5f, groups, null, false, 0, Height, groupGuides);
            Assert.True(new ReadOnlySpan<uint>(lines, Width * Height).SequenceEqual(new ReadOnlySpan<uint>(groups, Width * Height)));
        }
        Assert.Contains(image.ReadOnlyPixels.ToArray(), b => b is > 0 and < 255);
    }

    /// <summary>A layer that draws nothing: it sends the frame down the layered path (stars splatted band by band into band buffers).</summary>
    private sealed class EmptyLayer : IFrameLayer
    {
        public void Rasterize(FrameContext frame) { }
        public void Composite(FrameContext frame, HdrBand band) { }
    }

    [Theory]
    [InlineData(0.0, 90.0)]
    [InlineData(3.0, 60.0)]
    public void Stars_alone_give_the_same_bytes_splatted_in_cache_as_through_the_HDR_frame(double rapidity, double fieldOfView)
    {
        // A frame of stars alone is splatted tile by tile and tone-mapped from cache; with any layer present it goes
        // through a band buffer per row band. Same sums in the same order, so the same bytes. 203 px wide: a partial
        // tile and a partial pixel group at the right edge.
        var camera = new Camera(ProjectionKind.Perspective, 203, 150, fieldOfView * Math.PI / 180, 0, Exposure.Auto);
        var scene = new Scene(Sky);
        var observer = new Observer(ShipState.AtRest(default) with
        {
            Frame = new LorentzFrame(new Velocity(rapidity, new Vec3(0.2, 0.1, 1).NormalizedOr(Vec3.UnitZ)), Rotation.Identity),
        }, Rotation.Identity);
        byte[] inCache = new FrameRenderer(2).Render(scene, observer, camera).ReadOnlyPixels.ToArray();
        var throughHdr = new FrameRenderer(2);
        throughHdr.Layers.Add(new EmptyLayer());
        Assert.Equal(throughHdr.Render(scene, observer, camera).ReadOnlyPixels.ToArray(), inCache);
        Assert.Contains(inCache, b => b > 40);
    }
}
