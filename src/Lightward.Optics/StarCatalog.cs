using System.IO.Compression;
using System.Text;
using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// Stars at rest in the home frame as flat single-precision arrays (structure of arrays) for per-frame hot loops.
/// Directions are unit vectors toward each star in home ICRS axes (+X toward RA 0h Dec 0°, +Z toward the north
/// celestial pole). Stars are arranged in sky cells (the faces of a cube around the observer, each cut into
/// <see cref="CellsPerFaceEdge"/>² cells, brightest first within a cell), so neighbours on the sky are neighbours in
/// memory and a renderer that culls by cell touches contiguous runs.
/// </summary>
public sealed class StarCatalog
{
    public const string HipparcosAssetFileName = "hipparcos-stars.bin.gz";
    public const int CellsPerFaceEdge = 16;
    public const int CellCount = 6 * CellsPerFaceEdge * CellsPerFaceEdge;

    /// <summary>B−V given to stars whose colour the catalogue lacks: the Hipparcos median (our choice, see assets/catalog/README.md).</summary>
    public const double UnknownColorIndex = 0.61;

    /// <summary>
    /// Lowest star temperature accepted, kelvin: safely above the floor of <see cref="BlackbodyTable"/>, and already
    /// invisible (about e⁻⁸⁰ of the Sun's visual surface brightness); the coolest Hipparcos colour gives about 1500 K.
    /// </summary>
    public const float CoolestTemperature = 300;

    private const string AssetMagic = "LWSTAR01";

    /// <summary>Credit line for the shipped star data (full text and licence in assets/catalog/README.md).</summary>
    public const string Attribution =
        "Stars: Hipparcos catalogue (ESA 1997, ESA SP-1200), via d3-celestial data (c) 2015 Olaf Frohn, BSD 3-Clause licence.";

    public int Count { get; }
    public float[] X { get; }
    public float[] Y { get; }
    public float[] Z { get; }
    /// <summary>Visual magnitude V seen from rest.</summary>
    public float[] Magnitude { get; }
    /// <summary>Colour temperature in kelvin.</summary>
    public float[] Temperature { get; }
    /// <summary>Hipparcos catalogue number, 0 for synthetic stars.</summary>
    public int[] HipparcosNumber { get; }
    /// <summary>Proper name, or null for the many stars without one.</summary>
    public string?[] Names { get; }
    /// <summary>Sky cell of each star (non-decreasing along the arrays), and the first star of each cell (length <see cref="CellCount"/> + 1).</summary>
    public int[] CellStart { get; }
    /// <summary>Per sky cell: the unit axis and angular radius (radians) of a cap holding all its stars; radius −1 for an empty cell.</summary>
    public Vec3[] CellAxis { get; }
    public double[] CellRadius { get; }

    /// <summary>ln T and ln(10^(−0.4 V) / L_bb(T)), precomputed for <see cref="SkyTransform"/>.</summary>
    internal float[] LogTemperature { get; }
    internal float[] LogLuminanceScale { get; }

    private readonly Dictionary<string, int> indexByName = new(StringComparer.OrdinalIgnoreCase);
    private readonly Dictionary<int, int> indexByHipparcos = [];

    /// <summary>
    /// A catalogue from parallel arrays (copied and rearranged into sky cells). Directions must be unit vectors,
    /// magnitudes finite and temperatures at least <see cref="CoolestTemperature"/>.
    /// </summary>
    public StarCatalog(float[] x, float[] y, float[] z, float[] magnitude, float[] temperature,
        int[]? hipparcosNumber = null, string?[]? names = null)
    {
        int count = x.Length;
        if (y.Length != count || z.Length != count || magnitude.Length != count || temperature.Length != count
            || (hipparcosNumber is not null && hipparcosNumber.Length != count) || (names is not null && names.Length != count))
            throw new ArgumentException("all star arrays must have the same length");

        int[] cells = new int[count];
        for (int i = 0; i < count; i++) cells[i] = CellOf(x[i], y[i], z[i]);
        int[] order = Enumerable.Range(0, count).ToArray();
        Array.Sort(order, (a, b) =>
        {
            int byCell = cells[a].CompareTo(cells[b]);
            if (byCell != 0) return byCell;
            int byMagnitude = magnitude[a].CompareTo(magnitude[b]);
            return byMagnitude != 0 ? byMagnitude : a.CompareTo(b);
        });

        Count = count;
        X = Reorder(x, order); Y = Reorder(y, order); Z = Reorder(z, order);
        Magnitude = Reorder(magnitude, order); Temperature = Reorder(temperature, order);
        HipparcosNumber = hipparcosNumber is null ? new int[count] : Reorder(hipparcosNumber, order);
        Names = names is null ? new string?[count] : Reorder(names, order);

        CellStart = new int[CellCount + 1];
        foreach (int cell in cells) CellStart[cell + 1]++;
        for (int cell = 0; cell < CellCount; cell++) CellStart[cell + 1] += CellStart[cell];
        (CellAxis, CellRadius) = BoundCells(X, Y, Z, CellStart);

        LogTemperature = new float[count];
        LogLuminanceScale = new float[count];
        for (int i = 0; i < count; i++)
        {
            if (!(Temperature[i] >= CoolestTemperature) || !float.IsFinite(Magnitude[i]))
                throw new ArgumentException($"star {i}: temperature must be at least {CoolestTemperature} K and the magnitude finite");
            LogTemperature[i] = MathF.Log(Temperature[i]);
            // Divide by the same table the transform reads, so a ship at rest reproduces 10^(−0.4 V) exactly.
            float logLuminance = BlackbodyTable.Shared.Sample(LogTemperature[i], out _, out _, out _);
            LogLuminanceScale[i] = (float)(-0.4 * Math.Log(10) * Magnitude[i]) - logLuminance;
            if (Names[i] is { } name) indexByName.TryAdd(name, i);
            if (HipparcosNumber[i] > 0) indexByHipparcos.TryAdd(HipparcosNumber[i], i);
        }
    }

    /// <summary>Finds a star by proper name ("Vega") or Hipparcos number ("HIP 91262" or "91262"), ignoring case.</summary>
    public bool TryFind(string query, out int index)
    {
        string trimmed = query.Trim();
        if (indexByName.TryGetValue(trimmed, out index)) return true;
        string digits = trimmed.StartsWith("HIP", StringComparison.OrdinalIgnoreCase) ? trimmed[3..].Trim() : trimmed;
        if (int.TryParse(digits, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out int hip)
            && indexByHipparcos.TryGetValue(hip, out index)) return true;
        index = -1;
        return false;
    }

    /// <summary>The home-frame unit direction toward star <paramref name="index"/>, in double precision.</summary>
    public Vec3 Direction(int index) => new Vec3(X[index], Y[index], Z[index]).NormalizedOr(Vec3.UnitZ);

    /// <summary>The smallest-ish cap around each cell's stars: axis along their mean direction, radius to the farthest (plus rounding).</summary>
    private static (Vec3[] Axis, double[] Radius) BoundCells(float[] x, float[] y, float[] z, int[] cellStart)
    {
        var axis = new Vec3[CellCount];
        var radius = new double[CellCount];
        for (int cell = 0; cell < CellCount; cell++)
        {
            Vec3 sum = Vec3.Zero;
            for (int i = cellStart[cell]; i < cellStart[cell + 1]; i++) sum += new Vec3(x[i], y[i], z[i]);
            axis[cell] = sum.NormalizedOr(Vec3.UnitZ);
            radius[cell] = -1;
            for (int i = cellStart[cell]; i < cellStart[cell + 1]; i++)
                radius[cell] = Math.Max(radius[cell], Vec3.AngleBetween(axis[cell], new Vec3(x[i], y[i], z[i])));
            // Directions are stored in single precision: pad by far more than their rounding.
            if (radius[cell] >= 0) radius[cell] += 1e-5;
        }
        return (axis, radius);
    }

    /// <summary>The sky cell of a direction: cube face by dominant axis, then a square grid on that face.</summary>
    public static int CellOf(float x, float y, float z)
    {
        float ax = MathF.Abs(x), ay = MathF.Abs(y), az = MathF.Abs(z);
        (int face, float major, float u, float v) =
            ax >= ay && ax >= az ? (x >= 0 ? 0 : 1, ax, y, z)
            : ay >= az ? (y >= 0 ? 2 : 3, ay, x, z)
            : (z >= 0 ? 4 : 5, az, x, y);
        int Column(float coordinate) =>
            Math.Clamp((int)((coordinate / major + 1) * 0.5f * CellsPerFaceEdge), 0, CellsPerFaceEdge - 1);
        return (face * CellsPerFaceEdge + Column(u)) * CellsPerFaceEdge + Column(v);
    }

    /// <summary>The Hipparcos catalogue shipped next to the program (catalog/hipparcos-stars.bin.gz).</summary>
    public static StarCatalog LoadHipparcos() => Load(DefaultAssetPath);

    /// <summary>Where <see cref="LoadHipparcos"/> looks: the catalog folder beside this assembly.</summary>
    public static string DefaultAssetPath
    {
        get
        {
            string folder = Path.GetDirectoryName(typeof(StarCatalog).Assembly.Location) is { Length: > 0 } located
                ? located : AppContext.BaseDirectory;
            return Path.Combine(folder, "catalog", HipparcosAssetFileName);
        }
    }

    /// <summary>Reads a star asset written by assets/catalog/convert_hipparcos.py; any problem is a <see cref="UserInputException"/> naming the file.</summary>
    public static StarCatalog Load(string path)
    {
        if (!File.Exists(path))
            throw new UserInputException($"{path}: star catalogue not found (it ships next to the program as catalog/{HipparcosAssetFileName}; rebuild or reinstall)");
        byte[] bytes;
        try
        {
            using var gzip = new GZipStream(File.OpenRead(path), CompressionMode.Decompress);
            using var buffer = new MemoryStream();
            gzip.CopyTo(buffer);
            bytes = buffer.ToArray();
        }
        catch (Exception exception) when (exception is InvalidDataException or IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"{path}: cannot read the star catalogue ({exception.Message}); expected a gzip file written by convert_hipparcos.py");
        }
        return Parse(path, bytes);
    }

    private static StarCatalog Parse(string path, byte[] bytes)
    {
        var reader = new BinaryReader(new MemoryStream(bytes), Encoding.UTF8);
        string Where() => $"{path}: byte {reader.BaseStream.Position}";
        try
        {
            if (Encoding.ASCII.GetString(reader.ReadBytes(AssetMagic.Length)) != AssetMagic)
                throw new UserInputException($"{path}: byte 0: not a star catalogue (expected the '{AssetMagic}' header of convert_hipparcos.py)");
            int count = reader.ReadInt32(), nameCount = reader.ReadInt32();
            if (count <= 0 || nameCount < 0 || nameCount > count || (long)count * 24 > bytes.Length)
                throw new UserInputException($"{Where()}: header gives {count} stars and {nameCount} names, which does not fit a file of {bytes.Length} bytes");

            var x = new float[count]; var y = new float[count]; var z = new float[count];
            var magnitude = new float[count]; var temperature = new float[count];
            var hip = new int[count];
            var rowOfHip = new Dictionary<int, int>(count);
            for (int i = 0; i < count; i++)
            {
                hip[i] = reader.ReadInt32();
                x[i] = reader.ReadSingle(); y[i] = reader.ReadSingle(); z[i] = reader.ReadSingle();
                magnitude[i] = reader.ReadSingle();
                float colorIndex = reader.ReadSingle();
                float length = MathF.Sqrt(x[i] * x[i] + y[i] * y[i] + z[i] * z[i]);
                if (!(MathF.Abs(length - 1) < 1e-4f))
                    throw new UserInputException($"{Where()}: star {i} (HIP {hip[i]}): direction has length {length}, expected a unit vector");
                if (!(magnitude[i] is > -30 and < 30))
                    throw new UserInputException($"{Where()}: star {i} (HIP {hip[i]}): magnitude {magnitude[i]} is outside −30…30");
                if (!float.IsNaN(colorIndex) && !(colorIndex is > -1 and < 10))
                    throw new UserInputException($"{Where()}: star {i} (HIP {hip[i]}): B−V {colorIndex} is outside −1…10 (NaN for unknown)");
                temperature[i] = (float)BlackbodyColor.TemperatureFromColorIndex(float.IsNaN(colorIndex) ? UnknownColorIndex : colorIndex);
                rowOfHip.TryAdd(hip[i], i);
            }

            var names = new string?[count];
            for (int n = 0; n < nameCount; n++)
            {
                int namedHip = reader.ReadInt32();
                string name = Encoding.UTF8.GetString(reader.ReadBytes(reader.ReadByte()));
                if (!rowOfHip.TryGetValue(namedHip, out int row))
                    throw new UserInputException($"{Where()}: name '{name}' refers to HIP {namedHip}, which is not in the catalogue");
                names[row] = name;
            }
            if (reader.BaseStream.Position != bytes.Length)
                throw new UserInputException($"{Where()}: {bytes.Length - reader.BaseStream.Position} unexpected bytes after the last name");
            return new StarCatalog(x, y, z, magnitude, temperature, hip, names);
        }
        catch (EndOfStreamException)
        {
            throw new UserInputException($"{Where()}: star catalogue ends early (truncated file)");
        }
    }

    /// <summary>
    /// A reproducible synthetic sky of <paramref name="count"/> stars. Every law below was fitted by us to the Hipparcos
    /// catalogue (ESA 1997, ESA SP-1200; the shipped asset): magnitudes follow log₁₀ N(&lt;V) = log₁₀ 5044 + 0.5 (V − 6)
    /// (Hipparcos has N(&lt;6) = 5044 and gains 10^0.49…10^0.50 per magnitude from V = 1 to 8); colours follow the
    /// catalogue's B−V quantiles; and stars crowd toward the Milky Way with density per unit |sin b| (b the Galactic
    /// latitude) ∝ 0.72 + 0.78 e^(−|sin b|/0.35), as the V &lt; 9 stars do (1.4× the mean in the plane, 0.8× at the poles).
    /// </summary>
    public static StarCatalog Procedural(int count, int seed)
    {
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(count);
        var random = new Random(seed);
        double faintest = 6 + 2 * (Math.Log10(count) - Math.Log10(5044));
        var x = new float[count]; var y = new float[count]; var z = new float[count];
        var magnitude = new float[count]; var temperature = new float[count];
        for (int i = 0; i < count; i++)
        {
            Vec3 direction = GalacticToIcrs(RandomGalacticDirection(random));
            x[i] = (float)direction.X;
            y[i] = (float)direction.Y;
            z[i] = (float)direction.Z;
            // Inverse of the cumulative count: N(<V)/N = 10^(0.5 (V − faintest)).
            magnitude[i] = (float)(faintest + 2 * Math.Log10(1 - random.NextDouble()));
            temperature[i] = (float)BlackbodyColor.TemperatureFromColorIndex(ColorIndexQuantile(random.NextDouble()));
        }
        return new StarCatalog(x, y, z, magnitude, temperature);
    }

    private const double DiscWeight = 0.78, HaloWeight = 0.72, DiscScale = 0.35;

    /// <summary>A unit vector in Galactic axes drawn from the latitude law of <see cref="Procedural"/>, longitude uniform.</summary>
    private static Vec3 RandomGalacticDirection(Random random)
    {
        // The density is a mixture: a uniform part (weight 0.72) and an exponential in |sin b| truncated to [0, 1].
        double discTruncation = 1 - Math.Exp(-1 / DiscScale);
        double discMass = DiscWeight * DiscScale * discTruncation;
        double sinLatitude = random.NextDouble() * (HaloWeight + discMass) < HaloWeight
            ? random.NextDouble()
            : -DiscScale * Math.Log(1 - random.NextDouble() * discTruncation);
        if (random.NextDouble() < 0.5) sinLatitude = -sinLatitude;
        double longitude = 2 * Math.PI * random.NextDouble();
        double cosLatitude = Math.Sqrt(1 - sinLatitude * sinLatitude);
        return new Vec3(cosLatitude * Math.Cos(longitude), cosLatitude * Math.Sin(longitude), sinLatitude);
    }

    /// <summary>
    /// Galactic → ICRS axes: the transpose of the ICRS → Galactic matrix of The Hipparcos and Tycho Catalogues
    /// (ESA 1997), Vol. 1, §1.5.3 (digits from memory; its rows are the Galactic centre, l = 90° and the north Galactic
    /// pole at RA 192.85948°, Dec 27.12825°, which the tests check).
    /// </summary>
    public static Vec3 GalacticToIcrs(Vec3 galactic) => new(
        -0.0548755604 * galactic.X + 0.4941094279 * galactic.Y - 0.8676661490 * galactic.Z,
        -0.8734370902 * galactic.X - 0.4448296300 * galactic.Y - 0.1980763734 * galactic.Z,
        -0.4838350155 * galactic.X + 0.7469822445 * galactic.Y + 0.4559837762 * galactic.Z);

    // B−V at cumulative fractions 0, 1, 5, 10, 25, 50, 75, 90, 95, 99, 100 % of the Hipparcos catalogue (our fit, see Procedural).
    private static ReadOnlySpan<double> ColorQuantileFractions => [0, 0.01, 0.05, 0.10, 0.25, 0.50, 0.75, 0.90, 0.95, 0.99, 1];
    private static ReadOnlySpan<double> ColorQuantileValues => [-0.40, -0.117, -0.016, 0.067, 0.347, 0.612, 1.078, 1.400, 1.554, 1.727, 2.0];

    private static double ColorIndexQuantile(double fraction)
    {
        ReadOnlySpan<double> fractions = ColorQuantileFractions, values = ColorQuantileValues;
        int upper = 1;
        while (upper < fractions.Length - 1 && fractions[upper] < fraction) upper++;
        double t = (fraction - fractions[upper - 1]) / (fractions[upper] - fractions[upper - 1]);
        return values[upper - 1] + t * (values[upper] - values[upper - 1]);
    }

    private static T[] Reorder<T>(T[] source, int[] order)
    {
        var result = new T[order.Length];
        for (int i = 0; i < order.Length; i++) result[i] = source[order[i]];
        return result;
    }
}
