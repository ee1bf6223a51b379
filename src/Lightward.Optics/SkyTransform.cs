using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// The per-frame star pass: aberration, Doppler shift and beaming of the catalogue stars into <see cref="ApparentStars"/>,
/// in single precision with <see cref="Vector{T}"/> on all cores. It evaluates the same trig-free formulas as
/// <see cref="Aberration"/>, <see cref="Doppler"/> and <see cref="Beaming"/> (see their derivations), and looks up the
/// shifted blackbody in <see cref="BlackbodyTable"/>, so the cost per star does not depend on the speed. Given a view
/// cone, it first drops the sky cells whose stars cannot appear in it, so a narrow view costs only the stars near it.
/// The kept stars are cut into pieces of at most <see cref="ChunkLength"/>; each piece writes only its own slice of
/// the output, so the result is the same whatever the thread scheduling. One instance serves one caller at a time and
/// allocates nothing per star.
/// </summary>
public sealed unsafe class SkyTransform
{
    /// <summary>
    /// Most stars per piece: small enough that the pieces, taken one at a time by whichever thread is free, keep both
    /// cores busy to the end of the pass (a narrow view keeps only a few thousand stars).
    /// </summary>
    public const int ChunkLength = 1024;

    /// <summary>
    /// Highest rapidity the single-precision pass handles (γ ≈ 1.2 × 10¹⁷): beyond it e^(−2φ) leaves the float range.
    /// Faster frames are evaluated at this rapidity; <see cref="Starlight"/> in double precision has no such limit.
    /// </summary>
    public const double MaxRapidity = 40;

    private readonly bool vectorized;
    private readonly Action<int> transformPiece, testCells;
    private readonly bool[] cellShown = new bool[StarCatalog.CellCount];
    private CellTest cellTest;
    private readonly List<Piece> pieces = [];
    private StarCatalog? trigCatalog;
    private (double[] Cos, double[] Sin) cellRadiusTrig;
    private Vec3[] edgeNormals = [];
    private readonly BlackbodyTable table = BlackbodyTable.Shared;
    private readonly float tableOrigin = (float)BlackbodyTable.LogTemperatureMin;
    private readonly float tableScale = (float)(1 / BlackbodyTable.LogStep);
    private StarCatalog? catalog;
    private ApparentStars? output;
    private FrameConstants frame;

    /// <param name="vectorized">false runs the plain scalar loop (the benchmark baseline); both give the same stars to float rounding.</param>
    public SkyTransform(bool vectorized = true)
    {
        this.vectorized = vectorized;
        transformPiece = TransformPiece;
        testCells = TestCells;
    }

    /// <summary>Fills <paramref name="output"/> with every star of <paramref name="catalog"/>, in catalogue order, as seen from <paramref name="shipFrame"/>.</summary>
    public void Apply(StarCatalog catalog, LorentzFrame shipFrame, ApparentStars output) =>
        Apply(catalog, shipFrame, output, ViewCone.WholeSky, DefaultParallel);

    private static readonly ParallelOptions DefaultParallel = new();

    /// <summary>
    /// Fills <paramref name="output"/> with the stars of every sky cell whose apparent image can reach
    /// <paramref name="view"/>, cell after cell in catalogue order; the cells left out cannot put a star in the view.
    /// </summary>
    public void Apply(StarCatalog catalog, LorentzFrame shipFrame, ApparentStars output, ViewCone view, ParallelOptions parallel)
    {
        frame = new FrameConstants(shipFrame);
        int count = PlanPieces(catalog, shipFrame, view, parallel);
        output.EnsureCapacity(count);
        output.Count = count;
        this.catalog = catalog;
        this.output = output;
        try
        {
            ParallelItems.For(0, pieces.Count, parallel, transformPiece);
        }
        finally
        {
            this.catalog = null;
            this.output = null;
        }
    }

    /// <summary>
    /// Cuts the visible cells into pieces of at most <see cref="ChunkLength"/> stars (a split that depends only on the
    /// view, never on the thread count) and returns the number of stars kept.
    /// <para>
    /// The visibility test is conservative: aberration maps the celestial sphere conformally, magnifying lengths near
    /// a home direction by 1/D (solid angles by 1/D², from the invariance of I_ν/ν³; see <see cref="Beaming"/>). A
    /// cell's cap of radius r around axis c therefore appears inside a cap of radius r / D_min around the apparent
    /// axis c′, D_min being the Doppler factor at the cap's point farthest from the motion (the geodesic to any star
    /// stays in the cap, and its image is at most 1/D_min times as long). The angles are compared through bounds
    /// on their cosines and sines that never drop a cell the exact test keeps, without a trigonometric call per cell.
    /// </para>
    /// </summary>
    private int PlanPieces(StarCatalog catalog, LorentzFrame shipFrame, ViewCone view, ParallelOptions parallel)
    {
        pieces.Clear();
        if (view.HalfAngle >= Math.PI)
        {
            AddPieces(0, catalog.Count, 0);
            return catalog.Count;
        }
        double rapidity = Math.Min(shipFrame.Velocity.Rapidity, MaxRapidity);
        Vec3 motion = shipFrame.Velocity.Direction.NormalizedOr(Vec3.UnitZ);
        TurnEdgesComoving(view.EdgePlanes.Span, shipFrame.Orientation);
        cellTest = new CellTest(catalog, new MovingObserver(motion, rapidity), motion, shipFrame.Orientation.Rotate(view.Axis), view.HalfAngle,
            Math.Cos(view.HalfAngle), Math.Sin(view.HalfAngle), Math.Exp(-rapidity), Math.Sinh(rapidity), CellRadiusTrig(catalog), view.EdgePlanes.Length);
        try
        {
            ParallelItems.For(0, CellBlocks, parallel, testCells);
        }
        finally
        {
            cellTest = default; // holds the catalogue only while its cells are tested, as the fields above do while transforming
        }
        int kept = 0, runStart = 0, runLength = 0;
        for (int cell = 0; cell < StarCatalog.CellCount; cell++)
        {
            if (!cellShown[cell]) continue;
            int first = catalog.CellStart[cell], length = catalog.CellStart[cell + 1] - first;
            if (runLength > 0 && runStart + runLength == first) runLength += length;
            else
            {
                AddPieces(runStart, runLength, kept - runLength);
                runStart = first;
                runLength = length;
            }
            kept += length;
        }
        AddPieces(runStart, runLength, kept - runLength);
        return kept;
    }

    /// <summary>Blocks of cells tested side by side; each block writes only its own cells' entries.</summary>
    private const int CellBlocks = 8;

    /// <summary>What a frame's cell test needs: the view in the comoving axes cells are tested in, and the motion.</summary>
    private readonly record struct CellTest(StarCatalog Catalog, MovingObserver Observer, Vec3 Motion, Vec3 ViewAxis, double HalfAngle,
        double CosHalfAngle, double SinHalfAngle, double ExpMinus, double Sinh, (double[] Cos, double[] Sin) RadiusTrig, int EdgeCount);

    /// <summary>Notes, for each non-empty cell of a block, whether its stars can appear in the view.</summary>
    private void TestCells(int block)
    {
        ref readonly CellTest test = ref cellTest;
        StarCatalog catalog = test.Catalog;
        ReadOnlySpan<Vec3> edges = edgeNormals.AsSpan(0, test.EdgeCount);
        int blockLength = (StarCatalog.CellCount + CellBlocks - 1) / CellBlocks;
        for (int cell = block * blockLength; cell < Math.Min(StarCatalog.CellCount, (block + 1) * blockLength); cell++)
        {
            cellShown[cell] = false;
            if (catalog.CellStart[cell + 1] == catalog.CellStart[cell]) continue;
            Vec3 axis = catalog.CellAxis[cell];
            double cosRadius = test.RadiusTrig.Cos[cell], sinRadius = test.RadiusTrig.Sin[cell];
            // cos of the cap's farthest angle from the motion, θ_c + r (capped at π), without inverse trigonometry.
            double cosCentre = Math.Clamp(Vec3.Dot(axis, test.Motion), -1, 1), sinCentre = Math.Sqrt(1 - cosCentre * cosCentre);
            double cosFarthest = cosCentre <= -cosRadius ? -1 : cosCentre * cosRadius - sinCentre * sinRadius;
            double dopplerMin = test.ExpMinus + test.Sinh * (1 + cosFarthest);
            double imageRadius = catalog.CellRadius[cell] / dopplerMin;
            Vec3 apparentAxis = test.Observer.ApparentOfUnit(axis, out _);
            // Outside the view cone: farther from its axis than the half angle plus the image radius ir, i.e. the dot
            // below cos(h + ir) = cos h cos ir − sin h sin ir, bounded from below with cos ir ≥ 1 − ir²/2 and sin ir ≤ ir.
            double cosReachAtLeast = (test.CosHalfAngle >= 0 ? test.CosHalfAngle * (1 - imageRadius * imageRadius / 2) : test.CosHalfAngle)
                - test.SinHalfAngle * imageRadius;
            if (test.HalfAngle + imageRadius < Math.PI && Vec3.Dot(apparentAxis, test.ViewAxis) < cosReachAtLeast) continue;
            cellShown[cell] = !BeyondAnEdge(apparentAxis, imageRadius, edges);
        }
    }

    /// <summary>Slack (radians) on each edge plane for the single-precision rounding of star directions.</summary>
    private const double EdgeSlack = 1e-4;

    /// <summary>Turns the view's edge planes' normals from ship axes into the comoving axes the cells are tested in (into <see cref="edgeNormals"/>).</summary>
    private void TurnEdgesComoving(ReadOnlySpan<Vec3> edgePlanes, Rotation shipToComoving)
    {
        if (edgeNormals.Length < edgePlanes.Length) edgeNormals = new Vec3[edgePlanes.Length];
        for (int i = 0; i < edgePlanes.Length; i++) edgeNormals[i] = shipToComoving.Rotate(edgePlanes[i]);
    }

    /// <summary>
    /// True when a cap of <paramref name="radius"/> around <paramref name="axis"/> lies wholly on the outer side of an
    /// edge plane: its axis is farther than the radius below the plane, dot(axis, n) &lt; −sin(radius), tested as
    /// dot(axis, n) &lt; −radius (since radius ≥ sin(radius), a cap this keeps out the exact test keeps out too).
    /// </summary>
    private static bool BeyondAnEdge(Vec3 axis, double radius, ReadOnlySpan<Vec3> edges)
    {
        if (edges.IsEmpty) return false;
        double below = -(radius + EdgeSlack);
        foreach (Vec3 inward in edges)
            if (Vec3.Dot(axis, inward) < below) return true;
        return false;
    }

    /// <summary>cos and sin of each cell's radius, computed once per catalogue.</summary>
    private (double[] Cos, double[] Sin) CellRadiusTrig(StarCatalog catalog)
    {
        if (trigCatalog != catalog)
        {
            cellRadiusTrig = (catalog.CellRadius.Select(Math.Cos).ToArray(), catalog.CellRadius.Select(Math.Sin).ToArray());
            trigCatalog = catalog;
        }
        return cellRadiusTrig;
    }

    private void AddPieces(int catalogStart, int length, int outputStart)
    {
        for (int offset = 0; offset < length; offset += ChunkLength)
            pieces.Add(new Piece(catalogStart + offset, Math.Min(ChunkLength, length - offset), outputStart + offset));
    }

    /// <summary>
    /// One piece: whole vectors, then — when the piece holds at least one vector — the last few stars as one more
    /// vector overlapping the previous one (those stars get the same values twice), so each star's numbers do not
    /// depend on where a piece boundary falls. Pieces shorter than a vector go through the scalar formulas, equal to
    /// the vector ones to single-precision rounding.
    /// </summary>
    private void TransformPiece(int index)
    {
        Piece piece = pieces[index];
        int shift = piece.OutputStart - piece.CatalogStart;
        int start = piece.CatalogStart, end = start + piece.Count;
        if (!vectorized || piece.Count < Vector<float>.Count)
        {
            for (int i = start; i < end; i++) TransformStar(i, i + shift);
            return;
        }
        int next = TransformVectors(start, end, shift);
        if (next < end) TransformVectors(end - Vector<float>.Count, end, shift);
    }

    private void TransformStar(int i, int o)
    {
        StarCatalog stars = catalog!;
        ApparentStars result = output!;
        ref readonly FrameConstants f = ref frame;
        float sx = stars.X[i], sy = stars.Y[i], sz = stars.Z[i];
        float px = sx + f.Nx, py = sy + f.Ny, pz = sz + f.Nz;
        float mx = sx - f.Nx, my = sy - f.Ny, mz = sz - f.Nz;
        float onePlusCos = 0.5f * (px * px + py * py + pz * pz);
        float oneMinusCos = 0.5f * (mx * mx + my * my + mz * mz);
        float cosine = sx * f.Nx + sy * f.Ny + sz * f.Nz;
        float inverse = 1 / (onePlusCos + f.Epsilon * oneMinusCos);
        float across = f.TwoExpMinus * inverse;
        float alongMotion = (onePlusCos - f.Epsilon * oneMinusCos) * inverse - across * cosine;
        result.X[o] = alongMotion * f.ShipNx + across * (f.M00 * sx + f.M01 * sy + f.M02 * sz);
        result.Y[o] = alongMotion * f.ShipNy + across * (f.M10 * sx + f.M11 * sy + f.M12 * sz);
        result.Z[o] = alongMotion * f.ShipNz + across * (f.M20 * sx + f.M21 * sy + f.M22 * sz);

        float logDoppler = MathF.Log(f.ExpMinus + f.Sinh * onePlusCos);
        float logLuminance = table.Sample(stars.LogTemperature[i] + logDoppler, out float r, out float g, out float b);
        float irradiance = MathF.Exp(stars.LogLuminanceScale[i] + logLuminance - 2 * logDoppler);
        result.R[o] = irradiance * r;
        result.G[o] = irradiance * g;
        result.B[o] = irradiance * b;
    }

    /// <summary>The same formulas as <see cref="TransformStar"/>, a vector of stars at a time (catalogue index i, output i + <paramref name="shift"/>); returns where the whole vectors end.</summary>
    private int TransformVectors(int start, int end, int shift)
    {
        StarCatalog stars = catalog!;
        ApparentStars result = output!;
        ref readonly FrameConstants f = ref frame;
        Vector<float> nx = new(f.Nx), ny = new(f.Ny), nz = new(f.Nz), half = new(0.5f), epsilon = new(f.Epsilon);
        Vector<float> twoExpMinus = new(f.TwoExpMinus), expMinus = new(f.ExpMinus), sinh = new(f.Sinh), two = new(2);
        Vector<float> shipNx = new(f.ShipNx), shipNy = new(f.ShipNy), shipNz = new(f.ShipNz);
        Vector<float> m00 = new(f.M00), m01 = new(f.M01), m02 = new(f.M02), m10 = new(f.M10), m11 = new(f.M11);
        Vector<float> m12 = new(f.M12), m20 = new(f.M20), m21 = new(f.M21), m22 = new(f.M22);
        Vector<float> origin = new(tableOrigin), scale = new(tableScale), lastEntry = new(BlackbodyTable.Length - 1);
        int i = start;
        for (; i <= end - Vector<float>.Count; i += Vector<float>.Count)
        {
            var sx = Load(stars.X, i); var sy = Load(stars.Y, i); var sz = Load(stars.Z, i);
            var px = sx + nx; var py = sy + ny; var pz = sz + nz;
            var mx = sx - nx; var my = sy - ny; var mz = sz - nz;
            var onePlusCos = half * (px * px + py * py + pz * pz);
            var oneMinusCos = half * (mx * mx + my * my + mz * mz);
            var cosine = sx * nx + sy * ny + sz * nz;
            var inverse = Vector<float>.One / (onePlusCos + epsilon * oneMinusCos);
            var across = twoExpMinus * inverse;
            var alongMotion = (onePlusCos - epsilon * oneMinusCos) * inverse - across * cosine;
            Store(result.X, i + shift, alongMotion * shipNx + across * (m00 * sx + m01 * sy + m02 * sz));
            Store(result.Y, i + shift, alongMotion * shipNy + across * (m10 * sx + m11 * sy + m12 * sz));
            Store(result.Z, i + shift, alongMotion * shipNz + across * (m20 * sx + m21 * sy + m22 * sz));

            var logDoppler = Vector.Log(expMinus + sinh * onePlusCos);
            var position = (Load(stars.LogTemperature, i) + logDoppler - origin) * scale;
            // Same lookup as BlackbodyTable.Sample: below the table is black; past its end ln L extrapolates, colour holds.
            var belowTable = Vector.LessThan(position, Vector<float>.Zero);
            // The processor's own max, min and conversion, whose NaN handling the saturating forms' extra checks (3 % of
            // a star frame) only restate: a NaN position still comes out as entry 0 (x86's max returns its second
            // operand, zero; Arm's conversion turns NaN into 0).
            var index = Vector.ConvertToInt32Native(Vector.MinNative(Vector.MaxNative(position, Vector<float>.Zero), lastEntry));
            var fraction = position - Vector.ConvertToSingle(index);
            var colorFraction = Vector.Min(fraction, Vector<float>.One);
            TableEntries entries = LoadEntries(index);
            var logLuminance = entries.LogLuminance + fraction * entries.LogLuminanceSlope;
            var irradiance = Vector.Exp(Load(stars.LogLuminanceScale, i) + logLuminance - two * logDoppler);
            irradiance = Vector.ConditionalSelect(belowTable, Vector<float>.Zero, irradiance);
            Store(result.R, i + shift, irradiance * (entries.R + colorFraction * entries.RSlope));
            Store(result.G, i + shift, irradiance * (entries.G + colorFraction * entries.GSlope));
            Store(result.B, i + shift, irradiance * (entries.B + colorFraction * entries.BSlope));
        }
        return i;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector<float> Load(float[] array, int i) =>
        Vector.LoadUnsafe(ref MemoryMarshal.GetArrayDataReference(array), (nuint)i);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Store(float[] array, int i, Vector<float> value) =>
        value.StoreUnsafe(ref MemoryMarshal.GetArrayDataReference(array), (nuint)i);

    /// <summary>Each field of the blackbody table's entries for a vector of stars, lane by lane.</summary>
    private readonly record struct TableEntries(Vector<float> LogLuminance, Vector<float> LogLuminanceSlope,
        Vector<float> R, Vector<float> RSlope, Vector<float> G, Vector<float> GSlope, Vector<float> B, Vector<float> BSlope);

    /// <summary>
    /// The table entries at <paramref name="index"/> (one per lane). With AVX2 each lane's entry is one 32-byte load
    /// and the eight rows are transposed into the eight fields, 8 loads and 24 shuffles where a gather per field would
    /// issue 64 loads; the table is pinned, so it is read in place.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private TableEntries LoadEntries(Vector<int> index)
    {
        float* entries = (float*)Unsafe.AsPointer(ref MemoryMarshal.GetArrayDataReference(table.Entries));
        if (Avx.IsSupported && Vector<float>.Count == Vector256<float>.Count && BlackbodyTable.EntryLength == Vector256<float>.Count)
        {
            Vector256<int> at = index.AsVector256() * BlackbodyTable.EntryLength;
            Vector256<float> e0 = Avx.LoadVector256(entries + at.GetElement(0)), e1 = Avx.LoadVector256(entries + at.GetElement(1));
            Vector256<float> e2 = Avx.LoadVector256(entries + at.GetElement(2)), e3 = Avx.LoadVector256(entries + at.GetElement(3));
            Vector256<float> e4 = Avx.LoadVector256(entries + at.GetElement(4)), e5 = Avx.LoadVector256(entries + at.GetElement(5));
            Vector256<float> e6 = Avx.LoadVector256(entries + at.GetElement(6)), e7 = Avx.LoadVector256(entries + at.GetElement(7));
            // Pairs of rows interleaved, then pairs of pairs, then the 128-bit halves: column j of the rows is field j.
            Vector256<float> a0 = Avx.UnpackLow(e0, e1), a1 = Avx.UnpackHigh(e0, e1), a2 = Avx.UnpackLow(e2, e3), a3 = Avx.UnpackHigh(e2, e3);
            Vector256<float> a4 = Avx.UnpackLow(e4, e5), a5 = Avx.UnpackHigh(e4, e5), a6 = Avx.UnpackLow(e6, e7), a7 = Avx.UnpackHigh(e6, e7);
            Vector256<float> b0 = Avx.Shuffle(a0, a2, 0x44), b1 = Avx.Shuffle(a0, a2, 0xEE), b2 = Avx.Shuffle(a1, a3, 0x44), b3 = Avx.Shuffle(a1, a3, 0xEE);
            Vector256<float> b4 = Avx.Shuffle(a4, a6, 0x44), b5 = Avx.Shuffle(a4, a6, 0xEE), b6 = Avx.Shuffle(a5, a7, 0x44), b7 = Avx.Shuffle(a5, a7, 0xEE);
            return new TableEntries(
                Avx.Permute2x128(b0, b4, 0x20).AsVector(), Avx.Permute2x128(b1, b5, 0x20).AsVector(),
                Avx.Permute2x128(b2, b6, 0x20).AsVector(), Avx.Permute2x128(b3, b7, 0x20).AsVector(),
                Avx.Permute2x128(b0, b4, 0x31).AsVector(), Avx.Permute2x128(b1, b5, 0x31).AsVector(),
                Avx.Permute2x128(b2, b6, 0x31).AsVector(), Avx.Permute2x128(b3, b7, 0x31).AsVector());
        }
        return new TableEntries(Field(entries, index, BlackbodyTable.LogLuminanceField), Field(entries, index, BlackbodyTable.LogLuminanceSlopeField),
            Field(entries, index, BlackbodyTable.RField), Field(entries, index, BlackbodyTable.RSlopeField),
            Field(entries, index, BlackbodyTable.GField), Field(entries, index, BlackbodyTable.GSlopeField),
            Field(entries, index, BlackbodyTable.BField), Field(entries, index, BlackbodyTable.BSlopeField));
    }

    /// <summary>One field of the entries at <paramref name="index"/>, lane by lane (the path without AVX).</summary>
    private static Vector<float> Field(float* entries, Vector<int> index, int field)
    {
        Span<float> lanes = stackalloc float[Vector<float>.Count];
        for (int lane = 0; lane < lanes.Length; lane++) lanes[lane] = entries[index[lane] * BlackbodyTable.EntryLength + field];
        return new Vector<float>(lanes);
    }

    /// <summary>A run of catalogue stars and where it goes in the output.</summary>
    private readonly record struct Piece(int CatalogStart, int Count, int OutputStart);

    /// <summary>Everything about the ship's frame that the per-star formulas need, in single precision.</summary>
    private readonly struct FrameConstants
    {
        public readonly float Nx, Ny, Nz;             // direction of motion, home axes
        public readonly float ShipNx, ShipNy, ShipNz; // the same in ship axes
        public readonly float M00, M01, M02, M10, M11, M12, M20, M21, M22; // home-aligned comoving axes → ship axes
        public readonly float ExpMinus, TwoExpMinus, Epsilon, Sinh;

        public FrameConstants(LorentzFrame shipFrame)
        {
            double rapidity = Math.Min(shipFrame.Velocity.Rapidity, MaxRapidity);
            Vec3 n = shipFrame.Velocity.Direction.NormalizedOr(Vec3.UnitZ);
            Rotation toShip = shipFrame.Orientation.Inverse;
            Vec3 column0 = toShip.Rotate(Vec3.UnitX), column1 = toShip.Rotate(Vec3.UnitY), column2 = toShip.Rotate(Vec3.UnitZ);
            Vec3 shipN = toShip.Rotate(n);
            Nx = (float)n.X; Ny = (float)n.Y; Nz = (float)n.Z;
            ShipNx = (float)shipN.X; ShipNy = (float)shipN.Y; ShipNz = (float)shipN.Z;
            M00 = (float)column0.X; M01 = (float)column1.X; M02 = (float)column2.X;
            M10 = (float)column0.Y; M11 = (float)column1.Y; M12 = (float)column2.Y;
            M20 = (float)column0.Z; M21 = (float)column1.Z; M22 = (float)column2.Z;
            ExpMinus = (float)Math.Exp(-rapidity);
            TwoExpMinus = 2 * ExpMinus;
            Epsilon = (float)Math.Exp(-2 * rapidity);
            Sinh = (float)Math.Sinh(rapidity);
        }
    }
}
