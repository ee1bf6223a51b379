namespace Lightward.Spacetime;

/// <summary>Worldlines derived from other worldlines.</summary>
public static class Worldlines
{
    /// <summary>
    /// The worldline of a point fixed at <paramref name="offsetInBodyRestFrame"/> (body axes, light-seconds) on a
    /// rigid body, placed on the body's own simultaneity slice. Exact for inertial bodies; exact (Born-rigid, Rindler
    /// 2006, ch. 3) for hyperbolic motion and for glued inertial and hyperbolic legs, where a point at height h along
    /// the push feels a/(1 + a·h) and its clock runs (1 + a·h) times the body's. Any other body is approximated: the
    /// point shares the body's clock, four-velocity and axes, neglecting terms of order |a||ξ| and |ω||ξ|.
    /// </summary>
    public static IWorldline RigidlyAttached(IWorldline body, Vec3 offsetInBodyRestFrame)
    {
        if (!offsetInBodyRestFrame.IsFinite) throw new ArgumentException("offset must be finite", nameof(offsetInBodyRestFrame));
        if (offsetInBodyRestFrame == Vec3.Zero) return body;
        return body switch
        {
            InertialWorldline inertial => Attach(inertial, offsetInBodyRestFrame, inertial.StartProperTime),
            HyperbolicWorldline hyperbolic => Attach(hyperbolic, offsetInBodyRestFrame, hyperbolic.StartProperTime),
            PiecewiseWorldline piecewise when piecewise.Segments.All(s => s is InertialWorldline or HyperbolicWorldline) =>
                AttachLegs(piecewise, offsetInBodyRestFrame),
            _ => new ApproximatelyAttachedWorldline(body, offsetInBodyRestFrame),
        };
    }

    private static PiecewiseWorldline AttachLegs(PiecewiseWorldline body, Vec3 offset)
    {
        var legs = new List<IWorldline>(body.Segments.Count);
        foreach (IWorldline segment in body.Segments)
        {
            // The point's clock continues from where its previous leg left it, not from the body's clock.
            double properTime = legs.Count == 0
                ? ((segment as InertialWorldline)?.StartProperTime ?? ((HyperbolicWorldline)segment).StartProperTime)
                : legs[^1].ProperTimeAtHomeTime(OffsetStart(segment, offset).T);
            legs.Add(segment switch
            {
                InertialWorldline inertial => Attach(inertial, offset, properTime),
                _ => Attach((HyperbolicWorldline)segment, offset, properTime),
            });
        }
        return new PiecewiseWorldline(legs);
    }

    private static FourVector OffsetStart(IWorldline segment, Vec3 offset) => segment switch
    {
        InertialWorldline inertial => inertial.Start + inertial.Frame.ToHome(new FourVector(0, offset)),
        _ => ((HyperbolicWorldline)segment).Start + ((HyperbolicWorldline)segment).StartFrame.ToHome(new FourVector(0, offset)),
    };

    private static InertialWorldline Attach(InertialWorldline body, Vec3 offset, double properTime)
    {
        FourVector start = OffsetStart(body, offset);
        return new InertialWorldline(start, body.Frame, properTime) { StartHomeTime = ShiftedStart(body.StartHomeTime, start) };
    }

    private static HyperbolicWorldline Attach(HyperbolicWorldline body, Vec3 offset, double properTime)
    {
        double height = Vec3.Dot(body.ProperAcceleration, offset);
        if (!(1 + height > 0))
            throw new ArgumentOutOfRangeException(nameof(offset), "the point lies on or behind the body's horizon (1 + a·offset ≤ 0)");
        FourVector start = OffsetStart(body, offset);
        return new HyperbolicWorldline(start, body.StartFrame, body.ProperAcceleration / (1 + height), properTime)
        {
            StartHomeTime = ShiftedStart(body.StartHomeTime, start),
        };
    }

    private static double ShiftedStart(double bodyStart, FourVector pointStart) =>
        double.IsFinite(bodyStart) ? pointStart.T : bodyStart;

    /// <summary>A point on the body's simultaneity slice, sharing the body's clock, four-velocity and axes.</summary>
    private sealed class ApproximatelyAttachedWorldline(IWorldline body, Vec3 offset) : IWorldline
    {
        public double StartHomeTime => body.StartHomeTime;

        /// <summary>The body's home time whose simultaneity slice holds the point at home time <paramref name="t"/>.</summary>
        private double BodyTime(double t)
        {
            // Fixed point of t_b = t − [Λ(t_b) ξ].T; it contracts by about |a||ξ| + |ω||ξ| per round.
            double bodyTime = t;
            for (int round = 0; round < 64; round++)
            {
                double next = t - body.RestFrameAtHomeTime(bodyTime).ToHome(new FourVector(0, offset)).T;
                if (Math.Abs(next - bodyTime) <= 1e-15 * Math.Max(1, Math.Abs(t))) return next;
                bodyTime = next;
            }
            return bodyTime;
        }

        public FourVector EventAtHomeTime(double t)
        {
            double bodyTime = BodyTime(t);
            return body.EventAtHomeTime(bodyTime) + body.RestFrameAtHomeTime(bodyTime).ToHome(new FourVector(0, offset));
        }

        public FourVector FourVelocityAtHomeTime(double t) => body.FourVelocityAtHomeTime(BodyTime(t));
        public double ProperTimeAtHomeTime(double t) => body.ProperTimeAtHomeTime(BodyTime(t));
        public double HomeTimeAtProperTime(double tau)
        {
            double bodyTime = body.HomeTimeAtProperTime(tau);
            return bodyTime + body.RestFrameAtHomeTime(bodyTime).ToHome(new FourVector(0, offset)).T;
        }
        public LorentzFrame RestFrameAtHomeTime(double t) => body.RestFrameAtHomeTime(BodyTime(t));
    }
}
