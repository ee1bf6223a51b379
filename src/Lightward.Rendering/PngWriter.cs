using SkiaSharp;

namespace Lightward.Rendering;

/// <summary>Writes images as PNG through SkiaSharp's encoder, atomically: a temporary file in the same folder, then a rename.</summary>
public static class PngWriter
{
    public static void Write(RgbaImage image, string path)
    {
        string fullPath = Path.GetFullPath(path);
        string temporary = Path.Combine(Path.GetDirectoryName(fullPath)!, $".{Path.GetFileName(fullPath)}.{Environment.ProcessId}.tmp");
        try
        {
            using (FileStream stream = File.Create(temporary))
                Encode(image, stream);
            File.Move(temporary, fullPath, overwrite: true);
        }
        finally
        {
            if (File.Exists(temporary)) File.Delete(temporary);
        }
    }

    public static void Encode(RgbaImage image, Stream output)
    {
        var info = new SKImageInfo(image.Width, image.Height, SKColorType.Rgba8888, SKAlphaType.Opaque);
        using var pixmap = new SKPixmap();
        unsafe
        {
            fixed (byte* pixels = image.ReadOnlyPixels)
            {
                pixmap.Reset(info, (IntPtr)pixels, info.RowBytes);
                using SKData data = pixmap.Encode(SKPngEncoderOptions.Default) ?? throw new InvalidOperationException("PNG encoding failed");
                data.SaveTo(output);
            }
        }
    }

    /// <summary>Reads a PNG back into RGBA (for tests and tools that compare frames).</summary>
    public static RgbaImage Read(string path)
    {
        using SKImage decoded = SKImage.FromEncodedData(path) ?? throw new InvalidDataException($"{path}: not a readable image");
        var info = new SKImageInfo(decoded.Width, decoded.Height, SKColorType.Rgba8888, SKAlphaType.Unpremul);
        var image = new RgbaImage(decoded.Width, decoded.Height);
        unsafe
        {
            fixed (byte* pixels = image.Pixels)
                if (!decoded.ReadPixels(info, (IntPtr)pixels, info.RowBytes, 0, 0)) throw new InvalidDataException($"{path}: cannot convert to RGBA");
        }
        return image;
    }
}
