namespace Lightward.Rendering.Tests;

public class SrgbTransferTests
{
    [Theory]
    // IEC 61966-2-1:1999 §5.2: V = 12.92 L below L = 0.0031308, the break point where both pieces give V = 0.04045.
    [InlineData(0.0, 0.0)]
    [InlineData(0.0031308, 0.0404500)]
    [InlineData(0.001, 0.01292)]
    // IEC 61966-2-1:1999 §5.2: V = 1.055 L^(1/2.4) − 0.055, evaluated independently with a calculator
    // (0.5^(1/2.4) = 0.7491535, 0.18^(1/2.4) = 0.4894371).
    [InlineData(0.18, 0.461356)]
    [InlineData(0.5, 0.735357)]
    [InlineData(1.0, 1.0)]
    public void Encode_matches_the_IEC_61966_2_1_transfer_function(double linear, double encoded)
    {
        Assert.Equal(encoded, SrgbTransfer.Encode(linear), 5);
        // IEC 61966-2-1:1999 §5.3: the inverse uses the break point 0.04045.
        Assert.Equal(linear, SrgbTransfer.Decode(encoded), 5);
    }

    [Fact]
    public void The_8_bit_code_for_mid_grey_is_the_published_one()
    {
        // 8-bit sRGB code 188 ↔ linear 0.5 (the widely tabulated sRGB mid-point; from memory): 255 × 0.735357 = 187.5 → 188.
        Assert.Equal(188, (int)Math.Round(255 * SrgbTransfer.Encode(0.5), MidpointRounding.AwayFromZero));
    }

    [Fact]
    public void The_tone_mapper_writes_black_for_nothing_and_white_from_the_white_point_on()
    {
        // Reinhard et al. 2002, eq. 4 gives 0 at 0 and 1 at the white point; IEC 61966-2-1 encodes those as 0 and 255.
        Assert.Equal(0, ToneMapper.Code(0f));
        Assert.Equal(0, ToneMapper.Code(-1f));
        Assert.Equal(0, ToneMapper.Code(float.NaN));
        Assert.Equal(255, ToneMapper.Code(ToneMapper.White));
        Assert.Equal(255, ToneMapper.Code(float.PositiveInfinity));
    }

    [Fact]
    public void The_tone_mappers_table_stays_within_one_code_of_the_exact_curve_and_encoding()
    {
        // Exact: Reinhard et al. 2002 eq. 4, then IEC 61966-2-1 §5.2, in double precision; the table (256 steps per
        // octave of exposed value) may differ by at most one 8-bit step anywhere, from far below visibility to past white.
        for (int i = 0; i <= 200_000; i++)
        {
            float exposed = (float)Math.Pow(2, -20 + 25.0 * i / 200_000);
            double x = Math.Min(exposed, ToneMapper.White);
            double exact = 255 * SrgbTransfer.Encode(Math.Min(1, x * (1 + x / (ToneMapper.White * ToneMapper.White)) / (1 + x)));
            Assert.InRange(ToneMapper.Code(exposed), exact - 1, exact + 1);
        }
    }

    [Theory]
    [InlineData(203, false)]
    [InlineData(203, true)]
    [InlineData(208, false)]
    [InlineData(208, true)]
    public unsafe void Every_path_of_the_image_tone_map_writes_the_tables_code_for_each_pixel(int width, bool everyPixelRead)
    {
        // Groups of eight pixels with 0, 1, 2, 3 or 8 lit pixels (looked up one by one or gathered), odd values (NaN,
        // negative, past white), a partial group at the right edge of 203 px, whole cache lines at 208 px: each
        // written pixel must be the scalar table's code for its channels (the table is checked against the published
        // curve and encoding above), alpha 255. Every third group also carries a display overlay (premultiplied codes
        // and coverage), lit or not under it: there the pixel must be the overlay laid over that code by Porter &
        // Duff's "over" (Compositing Digital Images, SIGGRAPH 1984: C = C_over + (1 − α_over) C_under), to within the
        // rounding of one code.
        const int Height = 12;
        const float Scale = 0.75f;
        var hdr = new HdrFrame(width, Height);
        var random = new Random(5);
        float[] odd = [float.NaN, -2, 1e9f, ToneMapper.White, 1e-7f];
        for (int row = 0; row < Height; row++)
            for (int group = 0; group * HdrFrame.GroupWidth < width; group++)
            {
                int lit = new[] { 0, 1, 2, 3, 8 }[(row + group) % 5];
                for (int k = 0; k < lit; k++)
                {
                    int x = group * HdrFrame.GroupWidth + random.Next(HdrFrame.GroupWidth), i = row * width + x;
                    if (x >= width) continue;
                    float Value() => random.Next(10) == 0 ? odd[random.Next(odd.Length)] : (float)Math.Pow(10, random.NextDouble() * 6 - 4);
                    (hdr.Red[i], hdr.Green[i], hdr.Blue[i]) = (Value(), Value(), Value());
                }
                hdr.MarkTouched(row, group * HdrFrame.GroupWidth, Math.Min(width, (group + 1) * HdrFrame.GroupWidth));
            }
        hdr.WhollyTouched = everyPixelRead;
        var overlay = new DisplayOverlay(width, Height);
        for (int row = 0; row < Height; row++)
            for (int group = row % 3; group * HdrFrame.GroupWidth < width; group += 3)
            {
                for (int x = group * HdrFrame.GroupWidth; x < Math.Min(width, (group + 1) * HdrFrame.GroupWidth); x++)
                {
                    uint coverage = (uint)random.Next(256);
                    uint Code() => (uint)random.Next((int)coverage + 1);
                    overlay.Pixels[row * width + x] = Code() | Code() << 8 | Code() << 16 | coverage << 24;
                }
                overlay.Marks[row * overlay.GroupsPerRow + group] = 1;
            }
        float[] red = [.. hdr.Red], green = [.. hdr.Green], blue = [.. hdr.Blue];
        uint[] laid = [.. overlay.Pixels];
        var image = new RgbaImage(width, Height);
        fixed (byte* pixels = image.Pixels)
            ToneMapper.MapAndClearRows(hdr, Scale, (uint*)pixels, null, false, 0, Height, overlay);
        for (int i = 0; i < width * Height; i++)
        {
            (byte r, byte g, byte b) = image[i % width, i / width];
            byte[] under = [ToneMapper.Code(red[i] * Scale), ToneMapper.Code(green[i] * Scale), ToneMapper.Code(blue[i] * Scale)];
            bool overlaid = (i / width) % 3 == (i % width / HdrFrame.GroupWidth) % 3;
            if (!overlaid) Assert.Equal((under[0], under[1], under[2]), (r, g, b));
            else
            {
                double keep = (255 - (laid[i] >> 24)) / 255.0;
                byte[] written = [r, g, b];
                for (int channel = 0; channel < 3; channel++)
                    Assert.InRange(written[channel], (laid[i] >> (8 * channel) & 0xFF) + keep * under[channel] - 1, (laid[i] >> (8 * channel) & 0xFF) + keep * under[channel] + 1);
            }
            Assert.Equal(255, image.ReadOnlyPixels[4 * i + 3]);
        }
        // The overlay is left empty and unmarked for the next band.
        Assert.All(overlay.Pixels, pixel => Assert.Equal(0u, pixel));
        Assert.All(overlay.Marks, mark => Assert.Equal(0, mark));
    }

    [Fact]
    public void The_tone_curve_is_monotonic_reaches_white_at_the_white_point_and_never_leaves_0_to_1()
    {
        // Reinhard et al. 2002, eq. 4: L_d = L (1 + L/L_white²) / (1 + L) equals 1 at L = L_white.
        Assert.Equal(1f, ToneMapper.Curve(ToneMapper.White), 6);
        Assert.Equal(0f, ToneMapper.Curve(float.NaN));
        Assert.Equal(1f, ToneMapper.Curve(float.PositiveInfinity));
        double previous = 0;
        for (float x = 0; x < 100; x += 0.01f)
        {
            double t = ToneMapper.Curve(x);
            Assert.InRange(t, previous, 1);
            previous = t;
        }
    }
}
