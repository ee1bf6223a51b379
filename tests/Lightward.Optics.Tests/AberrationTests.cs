using CsCheck;
using Lightward.Spacetime;

namespace Lightward.Optics.Tests;

public class AberrationTests
{
    private static Vec3 FromAngle(double theta) => new(Math.Sin(theta), 0, Math.Cos(theta));

    [Theory]
    [InlineData(0.3)]
    [InlineData(1.2)]
    [InlineData(Math.PI / 2)]
    [InlineData(2.5)]
    [InlineData(3.1)]
    public void Apparent_angle_follows_Einsteins_aberration_formula(double theta)
    {
        const double beta = 0.6;
        Vec3 apparent = Aberration.Apparent(FromAngle(theta), Velocity.FromBeta(new Vec3(0, 0, beta)));
        // Einstein (1905), Zur Elektrodynamik bewegter Körper, §7: cos θ′ = (cos θ + β) / (1 + β cos θ).
        double expected = Math.Acos((Math.Cos(theta) + beta) / (1 + beta * Math.Cos(theta)));
        Assert.Equal(expected, Vec3.AngleBetween(apparent, Vec3.UnitZ), 12);
        Assert.Equal(0, apparent.Y, 15); // stays in the plane of motion and source
        Assert.True(apparent.X >= 0);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(1.0)]
    [InlineData(2.0)]
    [InlineData(Math.PI)]
    public void Doppler_factor_is_gamma_times_one_plus_beta_cos_theta(double theta)
    {
        const double beta = 0.6, gamma = 1.25;
        var velocity = Velocity.FromBeta(new Vec3(0, 0, beta));
        // Einstein (1905), §7: ν′ = ν γ (1 + β cos θ) for a source at home-frame angle θ from the direction of motion.
        double expected = gamma * (1 + beta * Math.Cos(theta));
        Assert.Equal(expected, Doppler.Factor(FromAngle(theta), velocity), 12);
        // Same factor from the apparent direction: D = 1 / (γ (1 − β cos θ′)) (any SR textbook, e.g. Rindler 2006).
        Vec3 apparent = Aberration.Apparent(FromAngle(theta), velocity);
        Assert.Equal(expected, Doppler.FactorFromApparent(apparent, velocity), 12);
    }

    [Fact]
    public void At_rapidity_25_the_extremes_are_exact_and_finite()
    {
        const double phi = 25;
        var velocity = new Velocity(phi, Vec3.UnitZ);
        // Relativistic Doppler (Einstein 1905, §7) with γ(1 ± β) = e^(±φ): dead ahead D = e^φ, dead astern D = e^(−φ).
        Assert.Equal(1, Doppler.Factor(Vec3.UnitZ, velocity) / Math.Exp(phi), 12);
        Assert.Equal(1, Doppler.Factor(-Vec3.UnitZ, velocity) / Math.Exp(-phi), 12);
        Assert.Equal(Vec3.UnitZ, Aberration.Apparent(Vec3.UnitZ, velocity));

        // Einstein's formula at θ = 90°: cos θ′ = β, so sin θ′ = 1/γ (not 0, which is what cancellation would give).
        Vec3 side = Aberration.Apparent(Vec3.UnitX, velocity);
        Assert.Equal(1, side.X * Math.Cosh(phi), 9);
        Assert.True(side.Z > 0 && side.Z <= 1);
        // D at θ = 90°: γ(1 + β·0) = γ = cosh φ.
        Assert.Equal(1, Doppler.Factor(Vec3.UnitX, velocity) / Math.Cosh(phi), 12);

        for (double theta = 0; theta <= Math.PI; theta += Math.PI / 64)
        {
            Vec3 apparent = Aberration.Apparent(FromAngle(theta), velocity);
            Assert.True(apparent.IsFinite && Math.Abs(apparent.Length - 1) < 1e-12);
            Assert.True(double.IsFinite(Doppler.Factor(FromAngle(theta), velocity)));
            Assert.True(double.IsFinite(Doppler.FactorFromApparent(apparent, velocity)));
        }
    }

    [Fact]
    public void Annual_aberration_constant_matches_the_IAU_value()
    {
        // IAU (1976) System of Astronomical Constants: constant of aberration κ = 20.49552″, defined as
        // κ = 2π a / (c P √(1 − e²)) (Explanatory Supplement to the Astronomical Almanac; formula from memory) with
        // a = 1 au = 149 597 870.7 km (IAU 2012 Resolution B2), P = sidereal year 365.256363 d and e = 0.0167086
        // (orbital elements from memory). That speed is 29.7885 km/s; κ is the aberration at 90° from the motion.
        const double au = 149_597_870_700.0, siderealYear = 365.256363 * 86_400, eccentricity = 0.0167086;
        double speed = 2 * Math.PI * au / (siderealYear * Math.Sqrt(1 - eccentricity * eccentricity));
        var earth = Velocity.FromBeta(new Vec3(speed / Units.SpeedOfLight, 0, 0));
        Vec3 star = Vec3.UnitZ;
        double shiftArcseconds = Vec3.AngleBetween(star, Aberration.Apparent(star, earth)) * 180 / Math.PI * 3600;
        Assert.Equal(20.49552, shiftArcseconds, 3);
    }

    [Fact]
    public void Ship_axes_apply_the_frame_orientation_after_aberration()
    {
        var frame = new LorentzFrame(new Velocity(2, new Vec3(1, 2, 2) / 3), Rotation.FromAxisAngle(new Vec3(0.3, -1, 0.5), 1.1));
        Vec3 source = new Vec3(-0.2, 0.9, 0.1).NormalizedOr(Vec3.UnitZ);
        Vec3 ship = Aberration.ApparentInShipAxes(source, frame);
        // Reference: boost the photon's four-momentum with the frame's own 4×4 transform (well conditioned at φ = 2).
        // The photon travels from the source to us, so its momentum points along −source.
        FourVector photonInShipAxes = frame.FromHome(new FourVector(1, -source));
        Vec3 expected = -photonInShipAxes.Space / photonInShipAxes.T;
        Assert.True(Vec3.AngleBetween(expected, ship) < 1e-12);
        Assert.True(Vec3.AngleBetween(source, Aberration.SourceFromShipAxes(ship, frame)) < 1e-12);
        // The photon's energy ratio is the Doppler factor (Einstein 1905, §7).
        Assert.Equal(photonInShipAxes.T, Doppler.FactorFromShipAxes(ship, frame), 12);
    }

    [Fact]
    public void Random_velocities_up_to_rapidity_25_keep_the_half_angle_law()
    {
        Gen<Vec3> unitVectors = Gen.Select(Gen.Double[-1, 1], Gen.Double[0, 2 * Math.PI],
            (z, azimuth) => new Vec3(Math.Sqrt(1 - z * z) * Math.Cos(azimuth), Math.Sqrt(1 - z * z) * Math.Sin(azimuth), z));
        Gen.Select(Gen.Double[0, 25], unitVectors, unitVectors).Sample((phi, motion, source) =>
        {
            var velocity = new Velocity(phi, motion);
            Vec3 apparent = Aberration.Apparent(source, velocity);
            double doppler = Doppler.Factor(source, velocity);
            Assert.True(apparent.IsFinite && Math.Abs(apparent.Length - 1) < 1e-12 && double.IsFinite(doppler));
            // Half-angle aberration tan(θ′/2) = e^(−φ) tan(θ/2) (equivalent to Einstein 1905, §7), compared in logs.
            // A unit vector holds an angle θ′ only to about ±1e-16 absolute, hence the 1e-15/θ′ allowance.
            double theta = Vec3.AngleBetween(motion, source), thetaApparent = Vec3.AngleBetween(motion, apparent);
            if (theta > 1e-6 && Math.PI - theta > 1e-6 && thetaApparent > 1e-300)
                Assert.Equal(Math.Log(Math.Tan(theta / 2)) - phi, Math.Log(Math.Tan(thetaApparent / 2)), 1e-9 + 1e-15 / thetaApparent);
            // D lies between e^(−φ) and e^φ, and agrees from either side of the aberration (Einstein 1905, §7).
            Assert.InRange(Math.Log(doppler), -phi - 1e-9, phi + 1e-9);
            // A unit vector resolves a tiny apparent angle θ′ only to ~1e-16/θ′; at φ = 25 the forward sky is squeezed
            // to θ′ ~ 2e^(−φ) ≈ 3e-11, so D recovered from the apparent direction holds ~1e-5 relative there.
            if (Math.PI - theta > 1e-3)
                Assert.Equal(1, Doppler.FactorFromApparent(apparent, velocity) / doppler, 1e-5);
            if (theta < 3 && phi < 15)
                Assert.True(Vec3.AngleBetween(source, Aberration.Source(apparent, velocity)) < 1e-6);
        }, iter: 5000);
    }
}
