using System.Globalization;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Reads the geometry of a Wavefront OBJ file (the open, plain-text mesh format): vertices (<c>v</c>), texture
/// coordinates (<c>vt</c>) and normals (<c>vn</c>) and faces (<c>f</c>) with 1-based or negative (relative) indices in
/// the forms <c>v</c>, <c>v/vt</c>, <c>v//vn</c> and <c>v/vt/vn</c>. Polygons are split into a fan of triangles, which
/// is exact for the convex planar polygons exporters write. Texture coordinates and normals are checked but not
/// used: bodies are shaded per triangle from their geometry. Grouping and material statements are skipped.
/// </summary>
public static class WavefrontObj
{
    private static readonly string[] SkippedStatements = ["o", "g", "s", "mtllib", "usemtl", "l", "p"];

    /// <summary>Reads <paramref name="path"/>; every vertex is multiplied by <paramref name="lengthPerUnit"/> (light-seconds per file unit).</summary>
    public static TriangleMesh Load(string path, double lengthPerUnit)
    {
        string text;
        try { text = File.ReadAllText(path); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"{path}: cannot read the mesh file: {e.Message}");
        }
        return Parse(text, path, lengthPerUnit);
    }

    /// <summary>Parses OBJ text; <paramref name="fileName"/> is used in messages only.</summary>
    public static TriangleMesh Parse(string text, string fileName, double lengthPerUnit)
    {
        var positions = new List<Vec3>();
        int textureCount = 0, normalCount = 0;
        var corners = new List<int>();
        string[] lines = text.Split('\n');
        for (int lineIndex = 0; lineIndex < lines.Length; lineIndex++)
        {
            var line = new LineReader(lines[lineIndex].TrimEnd('\r'), fileName, lineIndex + 1);
            string? keyword = line.NextToken();
            if (keyword is null || keyword.StartsWith('#')) continue;
            switch (keyword)
            {
                case "v":
                    positions.Add(lengthPerUnit * new Vec3(line.Number("x"), line.Number("y"), line.Number("z")));
                    line.OptionalNumber("w");
                    line.ExpectEnd("a vertex takes x y z and an optional w");
                    break;
                case "vt":
                    line.Number("u");
                    line.OptionalNumber("v");
                    line.OptionalNumber("w");
                    line.ExpectEnd("a texture coordinate takes u and optional v, w");
                    textureCount++;
                    break;
                case "vn":
                    line.Number("x"); line.Number("y"); line.Number("z");
                    line.ExpectEnd("a normal takes x y z");
                    normalCount++;
                    break;
                case "f":
                    ReadFace(ref line, positions.Count, textureCount, normalCount, corners);
                    break;
                default:
                    if (Array.IndexOf(SkippedStatements, keyword) < 0)
                        throw line.Error(1, $"unknown statement '{keyword}' (allowed: v, vt, vn, f, #, {string.Join(", ", SkippedStatements)})");
                    break;
            }
        }
        if (corners.Count == 0) throw new UserInputException($"{fileName}: no faces found (a mesh needs at least one 'f' line)");
        return new TriangleMesh(positions.ToArray(), corners.ToArray(), Enumerable.Repeat(SurfaceTint.Neutral, corners.Count / 3).ToArray());
    }

    private static void ReadFace(ref LineReader line, int positionCount, int textureCount, int normalCount, List<int> corners)
    {
        var polygon = new List<int>();
        while (line.NextToken() is { } token)
        {
            int column = line.TokenColumn;
            string[] parts = token.Split('/');
            if (parts.Length > 3 || parts[0].Length == 0)
                throw line.Error(column, $"face corner '{token}' is not one of v, v/vt, v//vn, v/vt/vn");
            polygon.Add(ResolveIndex(line, column, parts[0], positionCount, "vertex"));
            if (parts.Length > 1 && parts[1].Length > 0) ResolveIndex(line, column, parts[1], textureCount, "texture coordinate");
            if (parts.Length > 2 && parts[2].Length > 0) ResolveIndex(line, column, parts[2], normalCount, "normal");
        }
        if (polygon.Count < 3) throw line.Error(1, $"a face needs at least 3 corners, found {polygon.Count}");
        for (int i = 1; i + 1 < polygon.Count; i++) corners.AddRange([polygon[0], polygon[i], polygon[i + 1]]);
    }

    private static int ResolveIndex(LineReader line, int column, string text, int definedSoFar, string what)
    {
        if (!int.TryParse(text, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int index) || index == 0)
            throw line.Error(column, $"'{text}' is not a {what} index (a non-zero integer: 1-based, or negative to count back)");
        int resolved = index > 0 ? index - 1 : definedSoFar + index;
        if (resolved < 0 || resolved >= definedSoFar)
            throw line.Error(column, $"{what} index {index} refers to none of the {definedSoFar} {what}s defined above this line (allowed: 1..{definedSoFar} or -{definedSoFar}..-1)");
        return resolved;
    }

    /// <summary>Whitespace-separated tokens of one line, remembering the column of each for messages.</summary>
    private struct LineReader(string text, string fileName, int lineNumber)
    {
        private int _position;
        public int TokenColumn { get; private set; }

        public string? NextToken()
        {
            while (_position < text.Length && char.IsWhiteSpace(text[_position])) _position++;
            if (_position >= text.Length) return null;
            int start = _position;
            while (_position < text.Length && !char.IsWhiteSpace(text[_position])) _position++;
            TokenColumn = start + 1;
            return text[start.._position];
        }

        public double Number(string name) =>
            OptionalNumber(name) ?? throw Error(text.Length + 1, $"missing {name} (a finite decimal number)");

        public double? OptionalNumber(string name)
        {
            if (NextToken() is not { } token) return null;
            if (!double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out double value) || !double.IsFinite(value))
                throw Error(TokenColumn, $"{name} '{token}' is not a finite decimal number");
            return value;
        }

        public void ExpectEnd(string usage)
        {
            if (NextToken() is { } extra) throw Error(TokenColumn, $"unexpected '{extra}' ({usage})");
        }

        public readonly UserInputException Error(int column, string message) => new($"{fileName}:{lineNumber}:{column}: {message}");
    }
}
