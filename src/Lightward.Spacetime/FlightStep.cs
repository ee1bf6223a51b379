namespace Lightward.Spacetime;

/// <summary>
/// The exact motion over one proper-time step dτ under constant controls, in the ship's axes at the start of the
/// step: the exponential E = exp(dτ·G) of the constant Lorentz generator G (boost by the proper acceleration,
/// rotation by the attitude rate), split into its polar parts, and the displacement ∫₀^dτ exp(sG) e₀ ds.
/// Computed once per distinct (controls, dτ) and reused every step, so piecewise-constant controls are
/// integrated exactly whatever the step size.
/// </summary>
public sealed class FlightStep
{
    public Controls Controls { get; }
    public double Duration { get; }
    /// <summary>
    /// E in polar form, E = B(end velocity) · end rotation: the ship's frame at the end of the step relative to its
    /// frame at the start, with the velocity's sinh and cosh worked out here once rather than at every step.
    /// </summary>
    public LorentzFrame EndFrame { get; }
    /// <summary>Event at the end of the step relative to its start, in start-of-step ship coordinates.</summary>
    public FourVector Displacement { get; }

    public FlightStep(Controls controls, double duration)
    {
        if (!(duration > 0) || !double.IsFinite(duration)) throw new ArgumentOutOfRangeException(nameof(duration), "step must be positive and finite");
        if (!controls.ProperAcceleration.IsFinite || !controls.AttitudeRate.IsFinite) throw new ArgumentException("controls must be finite", nameof(controls));
        Controls = controls;
        Duration = duration;

        (EndFrame, Displacement) = controls.AttitudeRate == Vec3.Zero
            ? PureBoost(controls.ProperAcceleration, duration)
            : General(controls, duration);
    }

    /// <summary>
    /// Thrust without turning, the common case: hyperbolic motion in closed form, u = sinh(aτ) â,
    /// t = sinh(aτ)/a, x = 2 sinh²(aτ/2)/a (cosh − 1 without cancellation); no series, no allocation.
    /// </summary>
    private static (LorentzFrame, FourVector) PureBoost(Vec3 acceleration, double duration)
    {
        double magnitude = acceleration.Length;
        if (magnitude == 0) return (LorentzFrame.Identity, new FourVector(duration, 0, 0, 0));
        Vec3 along = acceleration / magnitude;
        var end = new Velocity(magnitude * duration, along);
        double halfSinh = Math.Sinh(end.Rapidity / 2);
        return (new LorentzFrame(end, Rotation.Identity), new FourVector(end.ProperSpeed / magnitude, along * (2 * halfSinh * halfSinh / magnitude)));
    }

    private static (LorentzFrame, FourVector) General(Controls controls, double duration)
    {
        double[] generator = Generator(controls, duration);
        (double[] exponential, double[] displacement) = ExponentialAndIntegral(generator, duration);

        Vec3 endU = new(exponential[4], exponential[8], exponential[12]);
        // R = B(u)⁻¹ E; its spatial block is the rotation.
        Velocity endVelocity = Velocity.FromProperVelocity(endU);
        var rotation = new double[3, 3];
        for (int column = 0; column < 3; column++)
        {
            FourVector image = new(exponential[column + 1], exponential[4 + column + 1], exponential[8 + column + 1], exponential[12 + column + 1]);
            FourVector unboosted = endVelocity.BoostFromHome(image);
            rotation[0, column] = unboosted.X; rotation[1, column] = unboosted.Y; rotation[2, column] = unboosted.Z;
        }
        return (new LorentzFrame(endVelocity, Rotation.FromMatrix(rotation)), new FourVector(displacement[0], displacement[1], displacement[2], displacement[3]));
    }

    /// <summary>dτ·G as a row-major 4×4 matrix: dΛ/dτ = Λ G with G = [[0, aᵀ], [a, [ω]×]].</summary>
    private static double[] Generator(Controls controls, double duration)
    {
        Vec3 a = controls.ProperAcceleration * duration, w = controls.AttitudeRate * duration;
        return
        [
            0, a.X, a.Y, a.Z,
            a.X, 0, -w.Z, w.Y,
            a.Y, w.Z, 0, -w.X,
            a.Z, -w.Y, w.X, 0,
        ];
    }

    /// <summary>
    /// exp(M) and ∫₀¹ exp(sM) e₀ ds · duration by scaling and squaring: Taylor series for M/2^k (norm ≤ 1/2, 20
    /// terms: truncation far below rounding), then k doublings with E₂ = E·E and D₂ = D + E·D.
    /// </summary>
    private static (double[] Exponential, double[] Displacement) ExponentialAndIntegral(double[] m, double duration)
    {
        double norm = 0;
        for (int row = 0; row < 4; row++)
            norm = Math.Max(norm, Math.Abs(m[row * 4]) + Math.Abs(m[row * 4 + 1]) + Math.Abs(m[row * 4 + 2]) + Math.Abs(m[row * 4 + 3]));
        int doublings = norm > 0.5 ? (int)Math.Ceiling(Math.Log2(norm / 0.5)) : 0;
        double scale = Math.Pow(2, -doublings);
        var x = new double[16];
        for (int i = 0; i < 16; i++) x[i] = m[i] * scale;

        // Taylor: E = Σ xᵏ/k!, P e₀ = Σ xᵏ e₀/(k+1)!.
        var exponential = Identity();
        var term = Identity();
        double[] termColumn = [1, 0, 0, 0];
        double[] integral = [1, 0, 0, 0];
        for (int k = 1; k <= 20; k++)
        {
            term = Multiply(term, x);
            for (int i = 0; i < 16; i++) term[i] /= k;
            for (int i = 0; i < 16; i++) exponential[i] += term[i];
            termColumn = Apply(x, termColumn);
            for (int i = 0; i < 4; i++) termColumn[i] /= k + 1;
            for (int i = 0; i < 4; i++) integral[i] += termColumn[i];
        }
        double subStep = duration * scale;
        var displacement = new double[4];
        for (int i = 0; i < 4; i++) displacement[i] = integral[i] * subStep;
        for (int d = 0; d < doublings; d++)
        {
            double[] moved = Apply(exponential, displacement);
            for (int i = 0; i < 4; i++) displacement[i] += moved[i];
            exponential = Multiply(exponential, exponential);
        }
        return (exponential, displacement);
    }

    private static double[] Identity() => [1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1];

    private static double[] Multiply(double[] a, double[] b)
    {
        var c = new double[16];
        for (int row = 0; row < 4; row++)
            for (int column = 0; column < 4; column++)
                c[row * 4 + column] = a[row * 4] * b[column] + a[row * 4 + 1] * b[4 + column] + a[row * 4 + 2] * b[8 + column] + a[row * 4 + 3] * b[12 + column];
        return c;
    }

    private static double[] Apply(double[] a, double[] v)
    {
        var r = new double[4];
        for (int row = 0; row < 4; row++)
            r[row] = a[row * 4] * v[0] + a[row * 4 + 1] * v[1] + a[row * 4 + 2] * v[2] + a[row * 4 + 3] * v[3];
        return r;
    }
}
