using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

/// <summary>Blends two consecutive physics states for display only (smooth motion between ticks).</summary>
public static class ShipInterpolation
{
    public static ShipState Between(in ShipState from, in ShipState to, double alpha)
    {
        if (alpha <= 0) return from;
        if (alpha >= 1) return to;
        FourVector step = to.Event.RelativeTo(from.Event.High) - from.Event.Low;
        CompensatedEvent position = from.Event.Add(alpha * step);
        // Blend proper velocities (not β) so a blend near c stays below c.
        Vec3 u = from.Velocity.ProperVelocity + alpha * (to.Velocity.ProperVelocity - from.Velocity.ProperVelocity);
        Rotation orientation = Slerp(from.Frame.Orientation, to.Frame.Orientation, alpha);
        double properTime = from.ShipTime + alpha * (to.ShipTime - from.ShipTime);
        return new ShipState(position, new LorentzFrame(Velocity.FromProperVelocity(u), orientation), properTime);
    }

    private static Rotation Slerp(Rotation a, Rotation b, double t)
    {
        double dot = a.W * b.W + a.X * b.X + a.Y * b.Y + a.Z * b.Z;
        if (dot < 0) { b = new Rotation(-b.W, -b.X, -b.Y, -b.Z); dot = -dot; }
        if (dot > 0.9995)
            return new Rotation(a.W + t * (b.W - a.W), a.X + t * (b.X - a.X), a.Y + t * (b.Y - a.Y), a.Z + t * (b.Z - a.Z)).Normalized();
        double angle = Math.Acos(dot), sin = Math.Sin(angle);
        double wa = Math.Sin((1 - t) * angle) / sin, wb = Math.Sin(t * angle) / sin;
        return new Rotation(wa * a.W + wb * b.W, wa * a.X + wb * b.X, wa * a.Y + wb * b.Y, wa * a.Z + wb * b.Z);
    }
}
