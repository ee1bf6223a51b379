using Lightward.Audio;
using Lightward.Host.Input;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Host.Shows;

/// <summary>What the operator can do; the operator console maps keys onto these.</summary>
public enum OperatorCommand { Go, Hold, Back, ManualControl, End }

/// <summary>
/// Runs a show live: the <see cref="ShowOperator"/> clock follows the host's clock, each loop renders the show at the
/// current show time onto the dome output host, and in manual control the view drag of the dome window (mouse or
/// stick, through the pilot's look input) turns the camera instead of the cues. The engine tone plays live through
/// the sound device, following the show's velocity profile as in the rendered soundtrack (cue sound files are in the
/// rendered soundtrack only).
/// </summary>
public sealed class LiveShow(ShowScript script, Scene scene, NearFieldLayer sceneNearField, ShowRenderSettings settings)
{
    private readonly ShowTimeline _timeline = new(script);

    public ShowOperator Operator { get; } = new(script);

    /// <summary>Where the live sound goes ("pulseaudio", "alsa" or "silent"), and why when silent; empty before the show runs.</summary>
    public string SoundStatus { get; private set; } = "";

    /// <param name="nextCommand">The operator's next command, or null when none is waiting.</param>
    /// <param name="showStatus">Called after each frame with the moment and the picture shown, for the operator console.</param>
    public void Run(IFrameHost dome, Func<OperatorCommand?> nextCommand, Action<ShowMoment, RgbaImage> showStatus, CancellationToken cancellationToken)
    {
        using var renderer = new ShowFrameRenderer(_timeline, scene, sceneNearField, settings);
        var image = new RgbaImage(dome.Width, dome.Height);
        var sound = new SoundScene();
        string? silenceReason = null;
        using LiveSoundOutput soundOutput = LiveSoundOutput.Start(sound, reason => silenceReason = reason);
        SoundStatus = silenceReason is null ? soundOutput.DeviceName : $"{soundOutput.DeviceName}: {silenceReason}";
        var input = new PilotInput();
        Rotation manualLook = Rotation.Identity;
        double last = dome.Seconds;
        while (!dome.CloseRequested && !cancellationToken.IsCancellationRequested)
        {
            input.BeginFrame();
            dome.PollInput(input);
            while (nextCommand() is { } command)
            {
                switch (command)
                {
                    case OperatorCommand.Go: Operator.Go(); break;
                    case OperatorCommand.Hold: Operator.ToggleHold(); break;
                    case OperatorCommand.Back: Operator.Back(); break;
                    case OperatorCommand.ManualControl:
                        Operator.ToggleManualControl();
                        manualLook = _timeline.At(Operator.ShowTime).Look;
                        break;
                    case OperatorCommand.End: return;
                }
            }
            double now = dome.Seconds;
            Operator.Advance(now - last);
            last = now;
            if (Operator.ManualControl)
                manualLook = (Rotation.FromAxisAngle(Vec3.UnitY, input.LookYaw) * manualLook * Rotation.FromAxisAngle(Vec3.UnitX, -input.LookPitch)).Normalized();
            sound.SetEngine(ShowSoundtrack.EngineLevel(_timeline, Operator.ShowTime));
            ShowMoment moment = renderer.RenderAt(Operator.ShowTime, image, Operator.ManualControl ? manualLook : null);
            dome.Present(image.Pixels);
            showStatus(moment, image);
        }
    }
}
