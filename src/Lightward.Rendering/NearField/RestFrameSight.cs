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
/// Everything that depends only on the relative velocity (a <see cref="MovingObserver"/> and the axes rotation) is
/// worked out once per frame instead of once per point: the near field sees tens of thousands of points a frame.
/// </summary>
public readonly struct RestFrameSight
{
    private readonly FourVector _camera;
    private readonly LorentzFrame _shipInFrame;
    private readonly Rotation _cameraToFrameComoving;
    /// <summary>Frame-aligned comoving axes → camera axes.</summary>
    private readonly Rotation _comovingToCamera;
    private readonly MovingObserver _observer;

    /// <param name="cameraEvent">The camera event in the frame's own coordinates (axes and origin of the frame).</param>
    /// <param name="shipInFrame">The ship's axes → the frame's coordinates (a Lorentz transform in polar form).</param>
    /// <param name="cameraToShip">Camera axes → ship axes.</param>
    public RestFrameSight(FourVector cameraEvent, LorentzFrame shipInFrame, Rotation cameraToShip)
    {
        _camera = cameraEvent;
        _shipInFrame = shipInFrame;
        _cameraToFrameComoving = (shipInFrame.Orientation * cameraToShip).Normalized();
        _comovingToCamera = _cameraToFrameComoving.Inverse;
        _observer = new MovingObserver(shipInFrame.Velocity);
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
        Vec3 apparent = _observer.ApparentOfUnit(distance > 0 ? toward / distance : _observer.Motion, out double doppler);
        return new PointSight(_comovingToCamera.Rotate(apparent), doppler, doppler * distance, _camera.T - distance);
    }

    /// <summary>The direction (frame axes) from which light arrives that the camera sees along unit <paramref name="cameraDirection"/>.</summary>
    public Vec3 SourceDirection(Vec3 cameraDirection) =>
        Aberration.Source(_cameraToFrameComoving.Rotate(cameraDirection), _shipInFrame.Velocity);
}
