using Lightward.Rendering;

namespace Lightward.Host.Frames;

/// <summary>
/// The sky through the renderer's frame pipeline, laid out per view: the cockpit view fills the frame; the dome
/// master (square) and the panorama (2:1) are drawn at the largest size that fits and centred on black.
/// </summary>
public sealed class SkyRenderer(Scene scene, FrameRenderer renderer, double cockpitFieldOfView, double domeTilt = 0) : IFrameRenderer
{
    /// <summary>The dome master's aperture: a full hemisphere.</summary>
    public const double DomeAperture = Math.PI;

    private Camera? _camera;
    private RgbaImage? _inset;

    public void Render(CockpitView view, RgbaImage frame)
    {
        Camera camera = CameraFor(view.Mode, frame.Width, frame.Height);
        var observer = new Observer(view.Ship, view.Look);
        if (camera.Width == frame.Width && camera.Height == frame.Height)
        {
            renderer.Render(scene, observer, camera, frame);
            return;
        }
        if (_inset is null || _inset.Width != camera.Width || _inset.Height != camera.Height) _inset = new RgbaImage(camera.Width, camera.Height);
        renderer.Render(scene, observer, camera, _inset);
        CopyCentred(_inset, frame);
    }

    private Camera CameraFor(ViewMode mode, int width, int height)
    {
        (ProjectionKind kind, int w, int h, double fieldOfView) = mode switch
        {
            ViewMode.Dome => (ProjectionKind.Domemaster, Math.Min(width, height), Math.Min(width, height), DomeAperture),
            ViewMode.Panorama => (ProjectionKind.Equirectangular, Math.Min(width, 2 * height) / 2 * 2, Math.Min(width, 2 * height) / 2, 2 * Math.PI),
            _ => (ProjectionKind.Perspective, width, height, cockpitFieldOfView),
        };
        if (_camera is not { } camera || camera.Kind != kind || camera.Width != w || camera.Height != h)
            _camera = new Camera(kind, w, h, fieldOfView, domeTilt, Exposure.Auto);
        return _camera;
    }

    private static void CopyCentred(RgbaImage inset, RgbaImage frame)
    {
        Span<byte> pixels = frame.Pixels;
        pixels.Clear();
        // Opaque black around the inset.
        for (int i = 3; i < pixels.Length; i += 4) pixels[i] = 255;
        int left = (frame.Width - inset.Width) / 2, top = (frame.Height - inset.Height) / 2, row = inset.Width * 4;
        for (int y = 0; y < inset.Height; y++)
            inset.ReadOnlyPixels.Slice(y * row, row).CopyTo(pixels.Slice(((top + y) * frame.Width + left) * 4, row));
    }
}
