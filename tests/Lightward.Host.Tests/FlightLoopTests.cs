using System.Security.Cryptography;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Spacetime;

namespace Lightward.Host.Tests;

public class FlightLoopTests
{
    private sealed class ConstantControls(Controls controls) : IControlSource
    {
        public Controls ControlsFor(in ShipState ship, double properStep, double compression) => controls;
    }

    private static readonly Controls OneG = new(new Vec3(0, 0, Units.G), Vec3.Zero);

    [Fact]
    public void Same_inputs_give_the_same_state_hash_and_different_inputs_a_different_one()
    {
        static string Fly(int yawFrames)
        {
            var session = new FlightSession(FlightSetup.Demo);
            var input = new PilotInput();
            for (int frame = 0; frame < 240; frame++)
            {
                input.BeginFrame();
                if (frame == 0) input.AddPress(PilotAction.ThrottleFull);
                if (frame == 30) input.AddPress(PilotAction.TimeFaster);
                input.SetHeld(PilotAction.YawRight, frame < yawFrames);
                input.SetHeld(PilotAction.ShiftUp, frame is > 100 and < 150);
                session.Update(input, 1.0 / 60);
                _ = session.View(); // the display state is computed every frame but must not disturb the physics
            }
            return StateHash(session.Loop.Current);
        }

        Assert.Equal(Fly(40), Fly(40));
        Assert.NotEqual(Fly(40), Fly(41));
    }

    [Fact]
    public void Time_compression_does_not_change_the_physics_of_a_constant_thrust_interval()
    {
        const double properTime = 10;
        ShipState realTime = FlyFor(OneG, compressionLevel: 0, loopSeconds: properTime);
        ShipState compressed = FlyFor(OneG, compressionLevel: 2, loopSeconds: properTime / 100);

        double a = Units.G;
        // Rindler, Relativity: Special, General, and Cosmological (2006), eqs. (3.53)–(3.54): hyperbolic motion,
        // t = sinh(aτ)/a, x = (cosh(aτ) − 1)/a = 2 sinh²(aτ/2)/a, rapidity aτ (c = 1). The ship starts at rest
        // with its axes on the home axes, so the engine pushes along home +Z.
        double halfSinh = Math.Sinh(a * properTime / 2);
        foreach (ShipState ship in new[] { realTime, compressed })
        {
            Assert.Equal(properTime, ship.ShipTime, 1e-9);
            Assert.Equal(Math.Sinh(a * properTime) / a, ship.HomeTime, 1e-9);
            Assert.Equal(2 * halfSinh * halfSinh / a, ship.Position.Z, 1e-18);
            Assert.Equal(a * properTime, ship.Velocity.Rapidity, 1e-18);
        }
        Assert.Equal(realTime.Position.Z, compressed.Position.Z, 1e-18);
        Assert.Equal(realTime.HomeTime, compressed.HomeTime, 1e-9);
    }

    [Fact]
    public void Physics_ticks_do_not_depend_on_the_frame_rate()
    {
        static ShipState Fly(double framesPerSecond)
        {
            var loop = new FlightLoop(ShipState.AtRest(default));
            var controls = new ConstantControls(OneG);
            int frames = (int)Math.Round(2 * framesPerSecond);
            for (int i = 0; i < frames; i++) loop.Advance(1 / framesPerSecond, controls);
            return loop.Current;
        }

        Assert.Equal(StateHash(Fly(50)), StateHash(Fly(144)));
        Assert.Equal(2, Fly(50).ShipTime, 1e-12);
    }

    [Fact]
    public void Pause_stops_the_physics_and_step_advances_exactly_one_tick()
    {
        var session = new FlightSession(FlightSetup.Demo);
        var input = new PilotInput();
        input.AddPress(PilotAction.Pause);
        session.Update(input, 0.5);
        Assert.True(session.Loop.Paused);
        Assert.Equal(0, session.Loop.Ticks);

        input.BeginFrame();
        input.AddPress(PilotAction.Step);
        session.Update(input, 0.5);
        Assert.Equal(1, session.Loop.Ticks);
        Assert.Equal(1 / FlightLoop.DefaultTickRate, session.Loop.Current.ShipTime, 1e-15);
    }

    [Fact]
    public void Display_state_lies_between_the_last_two_ticks()
    {
        var loop = new FlightLoop(ShipState.AtRest(default));
        var controls = new ConstantControls(OneG);
        loop.Advance(1.5 / FlightLoop.DefaultTickRate, controls);
        Assert.Equal(0.5, loop.Alpha, 1e-9);
        double expected = (loop.Previous.ShipTime + loop.Current.ShipTime) / 2;
        Assert.Equal(expected, loop.Display.ShipTime, 1e-15);
    }

    [Fact]
    public void Prograde_hold_turns_the_nose_onto_the_direction_of_motion()
    {
        var drifting = new ShipState(new CompensatedEvent(default), new LorentzFrame(new Velocity(0.5, Vec3.UnitX), Rotation.Identity), 0);
        var setup = FlightSetup.Demo with { Start = drifting };
        var session = new FlightSession(setup);
        var input = new PilotInput();
        input.AddPress(PilotAction.HoldPrograde);
        for (int frame = 0; frame < 300; frame++)
        {
            session.Update(input, 1.0 / 60);
            input.BeginFrame();
        }
        Assert.Equal(AttitudeHold.Prograde, session.Pilot.Hold);
        Assert.True(Vec3.AngleBetween(session.Loop.Current.Forward, Vec3.UnitX) < 1e-6);
    }

    [Fact]
    public void Looking_around_turns_the_view_but_not_the_ship()
    {
        var session = new FlightSession(FlightSetup.Demo);
        Rotation attitude = session.Loop.Current.Frame.Orientation;
        var input = new PilotInput { LookYaw = Math.PI / 2, LookPitch = 0.2 };
        session.Update(input, 1.0 / 60);

        Assert.Equal(attitude, session.Loop.Current.Frame.Orientation);
        // Yaw +90° about the ship's +Y takes the look direction from the nose (+Z) to the right wing (+X).
        Vec3 look = session.Look.Rotate(Vec3.UnitZ);
        Assert.True(look.X > 0.9, look.ToString());
        Assert.True(look.Y > 0.15, look.ToString());

        input.BeginFrame();
        input.AddPress(PilotAction.LookReset);
        session.Update(input, 1.0 / 60);
        Assert.Equal(Rotation.Identity, session.Look);
    }

    private static ShipState FlyFor(Controls controls, int compressionLevel, double loopSeconds)
    {
        var loop = new FlightLoop(ShipState.AtRest(default));
        loop.ChangeCompression(compressionLevel);
        var source = new ConstantControls(controls);
        long ticks = (long)Math.Round(loopSeconds * loop.TickRate);
        for (long i = 0; i < ticks; i++) loop.SingleStep(source);
        return loop.Current;
    }

    internal static string StateHash(in ShipState ship)
    {
        double[] values =
        [
            ship.Event.High.T, ship.Event.High.X, ship.Event.High.Y, ship.Event.High.Z,
            ship.Event.Low.T, ship.Event.Low.X, ship.Event.Low.Y, ship.Event.Low.Z,
            ship.Frame.Velocity.Rapidity, ship.Frame.Velocity.Direction.X, ship.Frame.Velocity.Direction.Y, ship.Frame.Velocity.Direction.Z,
            ship.Frame.Orientation.W, ship.Frame.Orientation.X, ship.Frame.Orientation.Y, ship.Frame.Orientation.Z,
            ship.ProperTime, ship.ProperTimeLow,
        ];
        byte[] bytes = new byte[values.Length * sizeof(double)];
        Buffer.BlockCopy(values, 0, bytes, 0, bytes.Length);
        return Convert.ToHexString(SHA256.HashData(bytes));
    }
}
