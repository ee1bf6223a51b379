using Lightward.Spacetime;

namespace Lightward.Optics.Tests;

public class StarCatalogTests
{
    private static readonly Lazy<StarCatalog> Hipparcos = new(StarCatalog.LoadHipparcos);

    [Theory]
    // Hipparcos catalogue (ESA 1997, ESA SP-1200), fields H8/H9 (RA, Dec at J1991.25) and H5 (V).
    [InlineData("Sirius", 32349, 101.2872, -16.7161, -1.44)]
    [InlineData("Vega", 91262, 279.2347, 38.7837, 0.03)]
    [InlineData("Polaris", 11767, 37.9545, 89.2641, 1.97)]
    public void Named_stars_sit_where_the_Hipparcos_catalogue_puts_them(string name, int hip, double ra, double dec, double v)
    {
        StarCatalog catalog = Hipparcos.Value;
        Assert.Equal(118_216, catalog.Count);
        Assert.True(catalog.TryFind(name.ToUpperInvariant(), out int index));
        Assert.True(catalog.TryFind($"HIP {hip}", out int byNumber));
        Assert.Equal(index, byNumber);
        (double actualRa, double actualDec) = RightAscensionDeclination(catalog.Direction(index));
        Assert.Equal(ra, actualRa, 0.001);
        Assert.Equal(dec, actualDec, 0.001);
        Assert.Equal(v, catalog.Magnitude[index], 0.001);
        Assert.Equal(name, catalog.Names[index]);
    }

    [Fact]
    public void Stars_are_arranged_in_sky_cells()
    {
        StarCatalog catalog = Hipparcos.Value;
        Assert.Equal(0, catalog.CellStart[0]);
        Assert.Equal(catalog.Count, catalog.CellStart[StarCatalog.CellCount]);
        for (int cell = 0; cell < StarCatalog.CellCount; cell++)
            for (int i = catalog.CellStart[cell]; i < catalog.CellStart[cell + 1]; i++)
                Assert.Equal(cell, StarCatalog.CellOf(catalog.X[i], catalog.Y[i], catalog.Z[i]));
        // Neighbours in memory are neighbours on the sky: consecutive stars lie a few degrees apart on average
        // (a random order would average 90°). Rule of thumb for a 16 × 16 cube-face grid, no published source.
        double total = 0;
        for (int i = 1; i < catalog.Count; i++) total += Vec3.AngleBetween(catalog.Direction(i - 1), catalog.Direction(i));
        Assert.True(total / (catalog.Count - 1) < 5 * Math.PI / 180);
    }

    [Fact]
    public void Procedural_sky_is_reproducible_and_counts_like_Hipparcos()
    {
        StarCatalog a = StarCatalog.Procedural(118_216, seed: 3), b = StarCatalog.Procedural(118_216, seed: 3);
        Assert.Equal(a.X, b.X);
        Assert.Equal(a.Magnitude, b.Magnitude);
        Assert.NotEqual(a.X, StarCatalog.Procedural(118_216, seed: 4).X);

        // Open dataset: the Hipparcos catalogue (ESA 1997) counts of stars brighter than V = 4…7; a synthetic sky of
        // the same size should match them within 15 % (its law was fitted to them).
        StarCatalog real = Hipparcos.Value;
        for (int limit = 4; limit <= 7; limit++)
        {
            int synthetic = a.Magnitude.Count(m => m < limit), measured = real.Magnitude.Count(m => m < limit);
            Assert.InRange(synthetic / (double)measured, 0.85, 1.15);
        }
        double Median(float[] values) => values.Order().ElementAt(values.Length / 2);
        Assert.Equal(Median(real.Temperature), Median(a.Temperature), 0.03 * Median(real.Temperature));
    }

    [Fact]
    public void Galactic_axes_point_at_the_Galactic_pole_and_centre()
    {
        // The Hipparcos and Tycho Catalogues (ESA 1997), Vol. 1, §1.5.3: in ICRS the north Galactic pole is at
        // RA 192.85948°, Dec +27.12825° and the Galactic centre (l = 0, b = 0) at RA 266.40500°, Dec −28.93617° (from memory).
        (double poleRa, double poleDec) = RightAscensionDeclination(StarCatalog.GalacticToIcrs(Vec3.UnitZ));
        Assert.Equal(192.85948, poleRa, 1e-4);
        Assert.Equal(27.12825, poleDec, 1e-4);
        (double centreRa, double centreDec) = RightAscensionDeclination(StarCatalog.GalacticToIcrs(Vec3.UnitX));
        Assert.Equal(266.40500, centreRa, 1e-4);
        Assert.Equal(-28.93617, centreDec, 1e-4);
        Assert.Equal(1, StarCatalog.GalacticToIcrs(new Vec3(0.3, -0.4, 0.5).NormalizedOr(Vec3.UnitZ)).Length, 9);
    }

    [Fact]
    public void Procedural_stars_crowd_toward_the_Milky_Way_like_Hipparcos()
    {
        // Open dataset: the Hipparcos catalogue (ESA 1997): 27 % of its V < 9 stars lie within |sin b| < 0.2 of the
        // Galactic plane, against 20 % for an even sky. Sine of Galactic latitude = the ICRS direction · the pole.
        Vec3 pole = StarCatalog.GalacticToIcrs(Vec3.UnitZ);
        double NearPlane(StarCatalog sky) =>
            Enumerable.Range(0, sky.Count).Where(i => sky.Magnitude[i] < 9)
                .Average(i => Math.Abs(Vec3.Dot(sky.Direction(i), pole)) < 0.2 ? 1.0 : 0.0);
        double measured = NearPlane(Hipparcos.Value), synthetic = NearPlane(StarCatalog.Procedural(118_216, seed: 5));
        Assert.InRange(measured, 0.26, 0.29);
        Assert.Equal(measured, synthetic, 0.015);
    }

    private static (double RightAscension, double Declination) RightAscensionDeclination(Vec3 d)
    {
        double ra = Math.Atan2(d.Y, d.X) * 180 / Math.PI;
        return (ra < 0 ? ra + 360 : ra, Math.Asin(d.Z) * 180 / Math.PI);
    }

    [Fact]
    public void A_missing_asset_is_a_user_error_naming_the_file()
    {
        string path = Path.Combine(Path.GetTempPath(), $"lightward-no-stars-{Guid.NewGuid():N}.bin.gz");
        var error = Assert.Throws<UserInputException>(() => StarCatalog.Load(path));
        Assert.Contains(path, error.Message);
    }

    [Theory]
    [InlineData("not gzip")]
    [InlineData("wrong header")]
    [InlineData("truncated")]
    public void A_corrupt_asset_is_a_user_error_naming_the_file(string damage)
    {
        string path = Path.Combine(Path.GetTempPath(), $"lightward-bad-stars-{Guid.NewGuid():N}.bin.gz");
        try
        {
            byte[] good = File.ReadAllBytes(StarCatalog.DefaultAssetPath);
            byte[] content = damage switch
            {
                "not gzip" => "hello, not a catalogue"u8.ToArray(),
                "wrong header" => Gzip("LWSTAR99"u8.ToArray()),
                _ => Gzip(Gunzip(good)[..5000]),
            };
            File.WriteAllBytes(path, content);
            var error = Assert.Throws<UserInputException>(() => StarCatalog.Load(path));
            Assert.StartsWith(path, error.Message);
        }
        finally
        {
            File.Delete(path);
        }
    }

    private static byte[] Gzip(byte[] raw)
    {
        using var buffer = new MemoryStream();
        using (var gzip = new System.IO.Compression.GZipStream(buffer, System.IO.Compression.CompressionLevel.Fastest)) gzip.Write(raw);
        return buffer.ToArray();
    }

    private static byte[] Gunzip(byte[] packed)
    {
        using var gzip = new System.IO.Compression.GZipStream(new MemoryStream(packed), System.IO.Compression.CompressionMode.Decompress);
        using var buffer = new MemoryStream();
        gzip.CopyTo(buffer);
        return buffer.ToArray();
    }
}
