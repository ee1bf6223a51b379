using System.Numerics;
using Lightward.Rendering.NearField;

namespace Lightward.Rendering.Tests.NearField;

public class LineDrawerTests
{
    private const int Width = 160, Height = 32;

    [Fact]
    public void ANearlyLevelLineIsDrawnAlongItsRowAndNowhereElse()
    {
        // A segment whose ends differ in height by a single float step near the top of the image: its slope is so small
        // that where its tent ends, measured along it from a neighbouring row, lies billions of pixels away. Each row's
        // span must still stay on the segment (an unclamped span once overflowed the integer conversion).
        float y = 1.5f, justBelow = BitConverter.Int32BitsToSingle(BitConverter.SingleToInt32Bits(y) + 1);
        DisplayOverlay overlay = Draw(new PixelSegment(10, y, 150, justBelow, new Vector3(4), new Vector3(4), 1, 1));
        for (int row = 0; row < Height; row++)
            for (int x = 0; x < Width; x++)
            {
                // Pixel centres in [10, 150) sit on the line's row (distance 0 → full coverage); the rows either side are a pixel off (coverage 0).
                byte expected = row == 1 && x >= 10 && x < 150 ? (byte)255 : (byte)0;
                Assert.Equal(expected, overlay.Coverage(x, row));
            }
    }

    [Fact]
    public void ALineIsLaidWithTheToneMapsCodeForItsColour()
    {
        // The drawer lays the code the tone map would give the segment's exposed colour (see LineDrawer), at full coverage on the line.
        DisplayOverlay overlay = Draw(new PixelSegment(20.5f, 3, 20.5f, 28, new Vector3(0.5f, 1, 2), new Vector3(0.5f, 1, 2), 1, 1));
        for (int row = 3; row < 28; row++)
        {
            Assert.Equal(255, overlay.Coverage(20, row));
            Assert.Equal(ToneMapper.Code(0.5f), overlay.Code(20, row, 0));
            Assert.Equal(ToneMapper.Code(1), overlay.Code(20, row, 1));
            Assert.Equal(ToneMapper.Code(2), overlay.Code(20, row, 2));
            Assert.Equal(0, overlay.Coverage(18, row));
            Assert.Equal(0, overlay.Coverage(22, row));
        }
    }

    private static DisplayOverlay Draw(PixelSegment segment)
    {
        var camera = new Camera(ProjectionKind.Perspective, Width, Height, Math.PI / 2, 0, Exposure.Manual(0));
        var surfaces = new SkyRasterizer(new ImageSky(camera.CreateProjection()));
        var drawer = new LineDrawer();
        drawer.SortIntoBands([segment], surfaces, new ParallelOptions());
        var overlay = new DisplayOverlay(Width, Height);
        var hdr = new HdrFrame(Width, Height);
        for (int top = 0; top < Height; top += StarSplatter.BandHeight)
            drawer.Draw(new HdrBand(hdr, 0, top, Math.Min(Height, top + StarSplatter.BandHeight), overlay, 0));
        return overlay;
    }
}
