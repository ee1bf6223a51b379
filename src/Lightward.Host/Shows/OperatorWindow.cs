using Lightward.Host.Input;
using Lightward.Rendering;
using Lightward.Scenarios.Shows;

namespace Lightward.Host.Shows;

/// <summary>
/// The live show's operator window: the <see cref="OperatorScreen"/> in a window of its own, apart from the dome
/// output window. Its keys are the operator's commands: Space or G go, H hold / resume, B or Backspace back, M manual
/// control, Q or Escape end; in manual control a drag with the look button (right by default) turns the camera.
/// Closing the window ends the show too.
/// </summary>
public sealed class OperatorWindow : IOperatorConsole, IDisposable
{
    private static readonly IReadOnlyDictionary<int, OperatorCommand> Keys = new Dictionary<string, OperatorCommand>
    {
        ["Space"] = OperatorCommand.Go, ["G"] = OperatorCommand.Go,
        ["H"] = OperatorCommand.Hold,
        ["B"] = OperatorCommand.Back, ["Backspace"] = OperatorCommand.Back,
        ["M"] = OperatorCommand.ManualControl,
        ["Q"] = OperatorCommand.End, ["Escape"] = OperatorCommand.End,
    }.ToDictionary(pair => PhysicalInputNames.Keys[pair.Key], pair => pair.Value);

    private readonly WindowHost _window;
    private readonly OperatorScreen _screen = new();
    private readonly Queue<OperatorCommand> _commands = new();

    private OperatorWindow(WindowHost window) => _window = window;

    /// <summary>Opens the operator window, or returns false with one line saying why.</summary>
    public static bool TryOpen(string showTitle, out OperatorWindow? operatorWindow, out string? problem)
    {
        operatorWindow = null;
        var options = new WindowOptions(OperatorScreen.Width, OperatorScreen.Height, $"Lightward operator: {showTitle}", VerticalSync: false);
        if (!WindowHost.TryOpen(options, KeyFile.Defaults, out WindowHost? window, out problem)) return false;
        operatorWindow = new OperatorWindow(window!);
        return true;
    }

    /// <summary>When set, every shown screen is read back from the window, for <see cref="PresentedScreen"/>.</summary>
    public bool CapturePresented
    {
        get => _window.CapturePresented;
        set => _window.CapturePresented = value;
    }

    /// <summary>The last screen as the window showed it (read back from OpenGL), or null when nothing was captured.</summary>
    public RgbaImage? PresentedScreen()
    {
        if (_window.PresentedFrame is not { } pixels) return null;
        var image = new RgbaImage(_window.PresentedFrameWidth, _window.PresentedFrameHeight);
        pixels.CopyTo(image.Pixels);
        return image;
    }

    /// <summary>The operator's next command from this window's keys, or null when none is waiting. The events come in when the dome window polls.</summary>
    public OperatorCommand? NextCommand()
    {
        if (_commands.Count == 0)
            foreach (int key in _window.TakeKeyPresses())
                if (Keys.TryGetValue(key, out OperatorCommand command)) _commands.Enqueue(command);
        if (_commands.Count > 0) return _commands.Dequeue();
        return _window.CloseRequested ? OperatorCommand.End : null;
    }

    public void AddLookDrag(PilotInput input) => _window.AddLookDrag(input);

    /// <summary>Draws the operator screen for the moment on the dome and shows it.</summary>
    public void Show(ShowOperator show, ShowMoment moment, RgbaImage dome, string soundStatus)
    {
        _screen.Draw(show, moment, dome, soundStatus);
        _window.Present(_screen.Image.ReadOnlyPixels);
    }

    public void Dispose()
    {
        _screen.Dispose();
        _window.Dispose();
    }
}
