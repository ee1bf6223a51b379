namespace Lightward.Spacetime.Tests;

public class MissionPlannerTests
{
    private static readonly double Year = Units.JulianYear;

    /// <summary>Flies the plan's phases with the flight integrator: exact for constant controls, an independent method.</summary>
    private static ShipState FlyWithIntegrator(MissionPlan plan, int stepsPerPhase)
    {
        var ship = ShipState.AtRest(new FourVector(0, 0, 0, 0));
        double a = plan.Request.Acceleration;
        foreach (MissionPhase phase in plan.Phases)
        {
            double duration = phase.End.ShipTime - phase.Start.ShipTime;
            if (duration <= 0) continue;
            Vec3 push = phase.End.Rapidity > phase.Start.Rapidity ? a * Vec3.UnitZ : phase.End.Rapidity < phase.Start.Rapidity ? -a * Vec3.UnitZ : Vec3.Zero;
            var integrator = new FlightIntegrator(duration / stepsPerPhase);
            for (int i = 0; i < stepsPerPhase; i++) ship = integrator.Step(ship, new Controls(push, Vec3.Zero));
        }
        return ship;
    }

    [Theory]
    [InlineData(MissionProfile.Flip, 4.2, null)]
    [InlineData(MissionProfile.Flip, 1e10, null)]
    [InlineData(MissionProfile.Coast, 12, 0.9)]
    [InlineData(MissionProfile.Coast, 2e6, 0.99999)]
    [InlineData(MissionProfile.Flyby, 0.01, null)]
    [InlineData(MissionProfile.Flyby, 3e10, null)]
    public void Closed_form_plan_agrees_with_flying_it_step_by_step(MissionProfile profile, double lightYears, double? cruiseBeta)
    {
        var plan = MissionPlanner.Plan(new MissionRequest(profile, lightYears * Units.LightYear, Units.G, cruiseBeta is double b ? Math.Atanh(b) : null));
        ShipState flown = FlyWithIntegrator(plan, 250);
        Assert.Equal(1, flown.HomeTime / plan.HomeTime, 12);
        Assert.Equal(1, flown.Position.Z / plan.Arrival.Distance, 12);
        Assert.Equal(1, flown.ShipTime / plan.ShipTime, 12);
        Assert.Equal(plan.Arrival.Rapidity, flown.Velocity.Rapidity, 9);
        Assert.True(plan.PeakRapidity < 26);
    }

    [Fact]
    public void Flip_over_4_2_light_years_at_1_g()
    {
        var plan = MissionPlanner.Plan(new MissionRequest(MissionProfile.Flip, 4.2 * Units.LightYear, Units.G));
        double a = Units.G, half = 2.1 * Units.LightYear;
        // Rindler (2006), ch. 3, hyperbolic motion: half the trip from rest takes aτ = acosh(1 + a·d/2) and
        // t = sinh(aτ)/a; the second half mirrors the first.
        double phi = Math.Acosh(1 + a * half);
        Assert.Equal(2 * phi / a / Year, plan.ShipTime / Year, 12);
        Assert.Equal(2 * Math.Sinh(phi) / a / Year, plan.HomeTime / Year, 12);
        Assert.Equal(phi, plan.PeakRapidity, 13);
        Assert.Equal(new[] { "departure", "turnover", "arrival" }, plan.Milestones.Select(m => m.Name));
        // Light from an event at (t, x) reaches home, at rest at the origin, at t + x (light travel at c).
        Assert.Equal(plan.HomeTime + 4.2 * Units.LightYear, plan.Arrival.SeenAtHome, 6);
        Assert.Equal(plan.HomeTime - 4.2 * Units.LightYear, plan.Arrival.LatestMessageFromHome, 6);
    }

    [Fact]
    public void Signal_timing_agrees_with_light_cones_on_the_ship_worldline()
    {
        var plan = MissionPlanner.Plan(new MissionRequest(MissionProfile.Coast, 20 * Units.LightYear, Units.G, Math.Atanh(0.95)));
        var home = InertialWorldline.AtRest(Vec3.Zero);
        foreach (MissionMilestone milestone in plan.Milestones)
        {
            FourVector at = plan.Worldline.HomeTimeAtProperTime(milestone.Moment.ShipTime) is double t ? plan.Worldline.EventAtHomeTime(t) : default;
            Assert.Equal(milestone.Moment.HomeTime, at.T, 5);
            Assert.Equal(milestone.Moment.Distance, at.Z, 5);
            Assert.Equal(milestone.Moment.SeenAtHome, LightCone.Arrival(at, home).Event.T, 5);
        }
        // The last message from home that reaches the ship by arrival arrives exactly then.
        LightConeEvent last = LightCone.Arrival(new FourVector(plan.Arrival.LatestMessageFromHome, 0, 0, 0), plan.Worldline);
        Assert.Equal(plan.HomeTime, last.Event.T, 4);
        // Messages to the ship mid-flight: the ship sees home's clock from its retarded event.
        double midway = plan.Phases[1].Start.HomeTime + 1e7;
        LightConeEvent heard = LightCone.Retarded(plan.Worldline.EventAtHomeTime(midway), home);
        Assert.Equal(midway - plan.Worldline.EventAtHomeTime(midway).Z, heard.Event.T, 5);
    }

    [Fact]
    public void Photon_rocket_mass_ratio_is_e_to_the_a_tau()
    {
        // Usenet Physics FAQ, "The Relativistic Rocket" (from memory): a photon rocket under constant proper
        // acceleration a for ship time T needs m₀/m₁ = e^(aT/c); Ackeret (1946) Δφ = (v_e/c) ln(m₀/m₁) with v_e = c.
        var plan = MissionPlanner.Plan(new MissionRequest(MissionProfile.Flip, 4.2 * Units.LightYear, Units.G, ExhaustSpeed: RocketEquation.PhotonExhaust));
        Assert.Equal(Math.Exp(Units.G * plan.ShipTime), plan.MassRatio!.Value, 10);
    }

    [Fact]
    public void Slow_exhaust_reduces_to_the_classical_rocket_equation()
    {
        // Tsiolkovsky (1903): Δv = v_e ln(m₀/m₁); relativistic Δφ = β_e ln R agrees while Δv ≪ c (tanh φ ≈ φ).
        double exhaust = 4.5 * Units.Kilometre, ratio = 3;
        double rapidity = RocketEquation.RapidityBudget(exhaust, ratio);
        Assert.Equal(1, Math.Tanh(rapidity) / (exhaust * Math.Log(ratio)), 9); // differs by φ²/3 ≈ 1e-10
        Assert.Equal(ratio, RocketEquation.MassRatio(rapidity, exhaust), 12);
    }

    [Fact]
    public void Impossible_requests_name_what_to_change()
    {
        double d = 4.2 * Units.LightYear;
        Assert.Equal(MissionInput.Acceleration, Assert.Throws<MissionPlanException>(() => MissionPlanner.Plan(new MissionRequest(MissionProfile.Flip, d, 0))).Input);
        Assert.Equal(MissionInput.Distance, Assert.Throws<MissionPlanException>(() => MissionPlanner.Plan(new MissionRequest(MissionProfile.Flip, -d, Units.G))).Input);
        var tooFast = Assert.Throws<MissionPlanException>(() => MissionPlanner.Plan(new MissionRequest(MissionProfile.Coast, d, Units.G, Math.Atanh(0.99))));
        Assert.Equal(MissionInput.Cruise, tooFast.Input);
        Assert.Contains("highest cruise", tooFast.Message);
        var poor = Assert.Throws<MissionPlanException>(() => MissionPlanner.Plan(new MissionRequest(MissionProfile.Flip, d, Units.G, null, 0.1, 100)));
        Assert.Equal(MissionInput.MassRatioLimit, poor.Input);
        Assert.Equal(MissionInput.MassRatioLimit, Assert.Throws<MissionPlanException>(() => MissionPlanner.Plan(new MissionRequest(MissionProfile.Flip, d, Units.G, null, null, 100))).Input);
    }

    [Theory]
    [InlineData("0.8 c", 1.0986122886681098)]       // atanh 0.8 = ln 3 (definition of rapidity)
    [InlineData("2.5 rapidity", 2.5)]
    [InlineData("10 gamma", 2.993222846126381)]     // acosh 10 = ln(10 + √99)
    [InlineData("1 gamma", 0.0)]
    public void Cruise_can_be_a_speed_a_rapidity_or_a_lorentz_factor(string text, double rapidity) =>
        Assert.Equal(rapidity, Quantity.ParseRapidity(text, "--cruise"), 14);

    [Theory]
    [InlineData("1 c")]
    [InlineData("1.2 c")]
    [InlineData("0.5 gamma")]
    [InlineData("-1 rapidity")]
    [InlineData("fast")]
    public void Unreadable_cruise_names_the_field(string text) =>
        Assert.StartsWith("--cruise: ", Assert.Throws<QuantityFormatException>(() => Quantity.ParseRapidity(text, "--cruise")).Message);
}
