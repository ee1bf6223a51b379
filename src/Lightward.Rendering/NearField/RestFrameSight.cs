using Lightward.Optics;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>What the camera sees of one point: where, how shifted, how far its light came, and when it left.</summary>
/// <param name="Direction">Unit direction in camera axes toward where the point appears.</param>
/// <param name="Doppler">D = ν received / ν emitted.</param>
/// <param name="Distance">Length of the light path in the ship's frame (its emission-time distance), light-seconds.</param>
/// <param name="EmissionTime">Time coordinate of the emission event in the point's own rest frame, seconds.</param>
public readonly record struct PointSight(Vec3 Direction, double Doppler, double Distance, double EmissionTime);

/// <summary>
/// How the camera sees points at rest in one inertial frame (a body's rest frame, or the home frame for a grid).
/// In that frame each point is static, so the past light cone of the camera event meets it in closed form: the
/// light left the point at rest-frame time t′ − |p − x′|, where (t′, x′) is the camera event in that frame. The
/// direction toward the point in the frame is then aberrated into camera axes by the velocity of the ship relative
/// to the frame, and the Doppler factor comes from the same relative velocity. A null path's time component scales
/// with D between frames, so the ship-frame light path is D times the rest-frame one.
/// <para>
/// The formulas are those of <see cref="Aberration"/> and <see cref="Doppler"/> (half-angle aberration without
/// cancellation; D = e^(−φ) + sinh φ (1 + cos θ)), with everything that depends only on the relative velocity —
/// e^(−φ), e^(−2φ), sinh φ and the axes rotation — worked out once per frame instead of once per point: the near
/// field sees tens of thousands of points a frame, and those calls were most of the cost of each.
/// </para>
/// </summary>
public readonly struct RestFrameSight
{
    private readonly FourVector _camera;
    private readonly LorentzFrame _shipInFrame;
    private readonly Rotation _cameraToFrameComoving;
    /// <summary>Frame-aligned comoving axes → camera axes.</summary>
    private readonly Rotation _comovingToCamera;
    private readonly Vec3 _motion;
    private readonly double _expMinusRapidity, _expMinusTwiceRapidity, _sinhRapidity;

    /// <param name="cameraEvent">The camera event in the frame's own coordinates (axes and origin of the frame).</param>
    /// <param name="shipInFrame">The ship's axes → the frame's coordinates (a Lorentz transform in polar form).</param>
    /// <param name="cameraToShip">Camera axes → ship axes.</param>
    public RestFrameSight(FourVector cameraEvent, LorentzFrame shipInFrame, Rotation cameraToShip)
    {
        _camera = cameraEvent;
        _shipInFrame = shipInFrame;
        _cameraToFrameComoving = (shipInFrame.Orientation * cameraToShip).Normalized();
        _comovingToCamera = _cameraToFrameComoving.Inverse;
        double rapidity = shipInFrame.Velocity.Rapidity;
        _motion = shipInFrame.Velocity.Direction.NormalizedOr(Vec3.UnitZ);
        _expMinusRapidity = Math.Exp(-rapidity);
        _expMinusTwiceRapidity = Math.Exp(-2 * rapidity);
        _sinhRapidity = Math.Sinh(rapidity);
    }

    /// <summary>
    /// Sight of a frame whose origin event is <paramref name="frameOrigin"/> (home coordinates) and whose axes map to
    /// home by <paramref name="frame"/>, from <paramref name="ship"/>.
    /// </summary>
    public static RestFrameSight Of(FourVector frameOrigin, LorentzFrame frame, ShipState ship, Rotation cameraToShip) =>
        new(frame.FromHome(ship.Event.RelativeTo(frameOrigin)), frame.Inverse.Compose(ship.Frame), cameraToShip);

    /// <summary>The camera event in the frame's coordinates.</summary>
    public FourVector CameraEvent => _camera;

    /// <summary>The ship's velocity relative to the frame, along the frame's axes.</summary>
    public Velocity ShipVelocityInFrame => _shipInFrame.Velocity;

    /// <summary>Sees the point <paramref name="point"/> (frame coordinates).</summary>
    public PointSight See(Vec3 point)
    {
        Vec3 toward = point - _camera.Space;
        double distance = toward.Length;
        Vec3 source = distance > 0 ? toward / distance : _motion;
        Vec3 n = _motion;
        // 1 ± cos θ as half squared chords, each free of cancellation (see Aberration).
        double onePlusCos = (source + n).LengthSquared / 2;
        double oneMinusCos = (source - n).LengthSquared / 2;
        double denominator = onePlusCos + _expMinusTwiceRapidity * oneMinusCos;
        double apparentCos = (onePlusCos - _expMinusTwiceRapidity * oneMinusCos) / denominator;
        double acrossScale = 2 * _expMinusRapidity / denominator;
        Vec3 apparent = (apparentCos * n + acrossScale * (source - Vec3.Dot(source, n) * n)).NormalizedOr(n);
        double doppler = _expMinusRapidity + _sinhRapidity * onePlusCos;
        return new PointSight(_comovingToCamera.Rotate(apparent), doppler, doppler * distance, _camera.T - distance);
    }

    /// <summary>The direction (frame axes) from which light arrives that the camera sees along unit <paramref name="cameraDirection"/>.</summary>
    public Vec3 SourceDirection(Vec3 cameraDirection) =>
        Aberration.Source(_cameraToFrameComoving.Rotate(cameraDirection), _shipInFrame.Velocity);
}
