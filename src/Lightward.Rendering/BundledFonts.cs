using SkiaSharp;

namespace Lightward.Rendering;

/// <summary>The fonts shipped in assets/fonts (DejaVu, copied next to the assemblies as fonts/), so text looks the same on a machine without system fonts.</summary>
public static class BundledFonts
{
    public const string SansFileName = "DejaVuSans.ttf";
    public const string MonoFileName = "DejaVuSansMono.ttf";

    public static string Directory => Path.Combine(AppContext.BaseDirectory, "fonts");

    /// <summary>Loads a bundled font file as a typeface; throws when the file is missing from the installation.</summary>
    public static SKTypeface Load(string fileName)
    {
        string path = Path.Combine(Directory, fileName);
        return SKTypeface.FromFile(path) ?? throw new FileNotFoundException($"bundled font missing or unreadable: {path}", path);
    }
}
