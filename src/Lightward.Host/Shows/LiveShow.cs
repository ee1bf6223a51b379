using Lightward.Audio;
using Lightward.Host.Input;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Host.Shows;

/// <summary>What the operator can do; the operator's console maps its keys onto these.</summary>
public enum OperatorCommand { Go, Hold, Back, ManualControl, End }

/// <summary>Where the operator runs the show from: commands and the manual-control view drag in, the show's state out.</summary>
public interface IOperatorConsole
{
    /// <summary>The operator's next command, or null when none is waiting (called until null after every poll of the dome).</summary>
    OperatorCommand? NextCommand();

    /// <summary>Adds the operator's view drag since the last call (turns the camera in manual control).</summary>
    void AddLookDrag(PilotInput input);

    /// <summary>Shows the operator the show's state after a frame: the moment on the dome and its picture.</summary>
    void Show(ShowOperator show, ShowMoment moment, RgbaImage dome, string soundStatus);
}

/// <summary>
/// Runs a show live: the <see cref="ShowOperator"/> clock follows the host's clock, each loop renders the show at the
/// current show time onto the dome output host and shows the state on the operator's console, and in manual control
/// the view drag (in the console or the dome window, or the stick) turns the camera instead of the cues. The engine
/// tone plays live through the sound device, following the ship's thrust (velocity profile or burn plan) as in the
/// rendered soundtrack (cue sound files are in the rendered soundtrack only).
/// </summary>
public sealed class LiveShow(ShowScript script, Scene scene, NearFieldLayer sceneNearField, ShowRenderSettings settings)
{
    private readonly ShowTimeline _timeline = new(script);

    public ShowOperator Operator { get; } = new(script);

    /// <summary>Where the live sound goes ("pulseaudio", "alsa" or "silent"), and why when silent; empty before the show runs.</summary>
    public string SoundStatus { get; private set; } = "";

    public void Run(IFrameHost dome, IOperatorConsole console, CancellationToken cancellationToken)
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
            console.AddLookDrag(input);
            while (console.NextCommand() is { } command)
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
            dome.Present(image.ReadOnlyPixels);
            console.Show(Operator, moment, image, SoundStatus);
        }
    }
}
