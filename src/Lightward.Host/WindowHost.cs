using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Text;
using Lightward.Host.Input;
using Lightward.Host.Window;
using Lightward.Spacetime;
using Silk.NET.OpenGL;

namespace Lightward.Host;

/// <summary>How the window opens: its frame size and title, and optionally full screen on a chosen monitor.</summary>
/// <param name="Monitor">0-based monitor number for full screen (a dome projector is often monitor 1).</param>
/// <param name="VerticalSync">Wait for the display's refresh when showing a frame. A second window (the show's
/// operator window) turns it off, or each window's wait would halve the other's frame rate.</param>
public sealed record WindowOptions(int Width, int Height, string Title, bool Fullscreen = false, int Monitor = 0, bool VerticalSync = true);

/// <summary>
/// A GLFW window: the loop clock is GLFW's timer, input comes from the keyboard, the mouse (drag to look) and the
/// first connected gamepad, and each frame is shown as an OpenGL texture. Several windows may be open at once, each
/// with its own OpenGL context (a live show's dome output and operator window); GLFW starts with the first and stops
/// with the last.
/// </summary>
public sealed unsafe class WindowHost : IFrameHost
{
    /// <summary>The one line printed when a window cannot open: what to install.</summary>
    public const string InstallHint = "apt-get install libglfw3 libgl1 libgl1-mesa-dri";

    /// <summary>The open windows by GLFW handle, so that key events reach the window they happened in.</summary>
    private static readonly Dictionary<nint, WindowHost> Open = [];
    private readonly nint _window;
    private readonly GL _gl;
    private readonly TexturePresenter _presenter;
    private readonly InputBindings _bindings;
    private readonly Queue<(int Key, bool Down)> _keyEvents = new();
    private readonly bool[] _keyHeld = new bool[Enum.GetValues<PilotAction>().Length];
    private readonly bool[] _buttonHeld = new bool[Enum.GetValues<PilotAction>().Length];
    private readonly byte[] _previousButtons = new byte[15];
    private double _cursorX, _cursorY;
    private bool _dragging;

    private WindowHost(nint window, int width, int height, InputBindings bindings)
    {
        _window = window;
        Width = width;
        Height = height;
        _bindings = bindings;
        _gl = GL.GetApi(Glfw.ProcAddress);
        _presenter = new TexturePresenter(_gl, width, height);
        Open[window] = this;
        Glfw.SetKeyCallback(window, (nint)(delegate* unmanaged[Cdecl]<nint, int, int, int, int, void>)&OnKey);
    }

    /// <summary>
    /// Opens a window, or returns false with one line saying why (no display, GLFW missing, no OpenGL 3.3) so the
    /// caller can fall back to a headless render. A monitor number the display does not have is a user error.
    /// </summary>
    public static bool TryOpen(WindowOptions options, InputBindings bindings, out WindowHost? host, out string? problem)
    {
        host = null;
        if (string.IsNullOrEmpty(Environment.GetEnvironmentVariable("DISPLAY")) && string.IsNullOrEmpty(Environment.GetEnvironmentVariable("WAYLAND_DISPLAY")))
        {
            problem = "no display (neither DISPLAY nor WAYLAND_DISPLAY is set)";
            return false;
        }
        if (!Glfw.TryLoad(out problem)) return false;
        if (Open.Count == 0 && Glfw.Init() != Glfw.True)
        {
            problem = "GLFW could not start: " + Glfw.LastError("unknown reason");
            return false;
        }
        Glfw.WindowHint(Glfw.ContextVersionMajor, 3);
        Glfw.WindowHint(Glfw.ContextVersionMinor, 3);
        Glfw.WindowHint(Glfw.OpenGlProfile, Glfw.OpenGlCoreProfile);
        Glfw.WindowHint(Glfw.Resizable, Glfw.True);

        nint monitor = 0;
        int width = options.Width, height = options.Height;
        if (options.Fullscreen)
        {
            int count;
            nint* monitors = Glfw.GetMonitors(&count);
            if (options.Monitor < 0 || options.Monitor >= count)
            {
                TerminateUnlessOpen();
                throw new UserInputException($"--monitor: there is no monitor {options.Monitor}; this display has {count}, numbered 0 to {count - 1}");
            }
            monitor = monitors[options.Monitor];
            Glfw.VideoMode* mode = Glfw.GetVideoMode(monitor);
            width = mode->Width;
            height = mode->Height;
        }
        byte[] title = Encoding.UTF8.GetBytes(options.Title + "\0");
        nint window;
        fixed (byte* titlePointer = title) window = Glfw.CreateWindow(width, height, titlePointer, monitor, 0);
        if (window == 0)
        {
            problem = "no OpenGL 3.3 window: " + Glfw.LastError("unknown reason");
            TerminateUnlessOpen();
            return false;
        }
        Glfw.MakeContextCurrent(window);
        Glfw.SwapInterval(options.VerticalSync ? 1 : 0);
        host = new WindowHost(window, width, height, bindings);
        return true;
    }

    public int Width { get; }
    public int Height { get; }
    public bool CloseRequested => Glfw.WindowShouldClose(_window) != 0;
    public double Seconds => Glfw.GetTime();

    /// <summary>When set, <see cref="Present"/> also reads the shown picture back into <see cref="PresentedFrame"/>.</summary>
    public bool CapturePresented { get; set; }
    public byte[]? PresentedFrame { get; private set; }

    public void PollInput(PilotInput input)
    {
        Glfw.PollEvents();
        while (_keyEvents.TryDequeue(out var keyEvent))
        {
            if (_bindings.ActionForKey(keyEvent.Key) is not PilotAction action) continue;
            if (keyEvent.Down) input.AddPress(action);
            _keyHeld[(int)action] = keyEvent.Down;
        }
        ReadGamepad(input);
        foreach (PilotAction action in Enum.GetValues<PilotAction>()) input.SetHeld(action, _keyHeld[(int)action] || _buttonHeld[(int)action]);
        AddLookDrag(input);
    }

    private void ReadGamepad(PilotInput input)
    {
        Glfw.GamepadState state;
        int pad = -1;
        for (int joystick = 0; joystick <= Glfw.JoystickLast && pad < 0; joystick++)
            if (Glfw.JoystickIsGamepad(joystick) == Glfw.True && Glfw.GetGamepadState(joystick, &state) == Glfw.True) pad = joystick;
        Array.Clear(_buttonHeld);
        if (pad < 0) return;
        for (int button = 0; button < 15; button++)
        {
            bool down = state.Buttons[button] == Glfw.Press, wasDown = _previousButtons[button] == Glfw.Press;
            _previousButtons[button] = state.Buttons[button];
            if (_bindings.ActionForButton(button) is not PilotAction action) continue;
            if (down && !wasDown) input.AddPress(action);
            _buttonHeld[(int)action] |= down;
        }
        foreach (AxisBinding binding in _bindings.GamepadAxes)
        {
            double value = state.Axes[binding.GamepadAxis];
            if (binding.GamepadAxis >= PhysicalInputNames.FirstTriggerAxis) value = (value + 1) / 2;
            if (Math.Abs(value) < _bindings.DeadZone) continue;
            input.SetAxis(binding.Axis, input.Axis(binding.Axis) + binding.Sign * value);
        }
    }

    /// <summary>
    /// Adds the view drag with the look button held in this window since the last call: part of <see cref="PollInput"/>,
    /// and on its own for a window that drives only the view (the show's operator window in manual control).
    /// </summary>
    public void AddLookDrag(PilotInput input)
    {
        double x, y;
        Glfw.GetCursorPos(_window, &x, &y);
        bool dragging = Glfw.GetMouseButton(_window, _bindings.LookButton) == Glfw.Press;
        if (dragging && _dragging)
        {
            // The view follows the hand: drag right to look right, drag up to look up.
            input.LookYaw += (x - _cursorX) * _bindings.LookPerPixel;
            input.LookPitch -= (y - _cursorY) * _bindings.LookPerPixel;
        }
        _dragging = dragging;
        _cursorX = x;
        _cursorY = y;
    }

    /// <summary>
    /// Keys pressed in this window since the last call, as GLFW key codes, for a window that reads its keys itself
    /// instead of through <see cref="PollInput"/> (the show's operator window). Any window's poll brings them in.
    /// </summary>
    public IReadOnlyList<int> TakeKeyPresses()
    {
        var presses = new List<int>();
        while (_keyEvents.TryDequeue(out var keyEvent))
            if (keyEvent.Down) presses.Add(keyEvent.Key);
        return presses;
    }

    public void Present(ReadOnlySpan<byte> rgba)
    {
        Glfw.MakeContextCurrent(_window);
        int framebufferWidth, framebufferHeight;
        Glfw.GetFramebufferSize(_window, &framebufferWidth, &framebufferHeight);
        if (framebufferWidth <= 0 || framebufferHeight <= 0) return;
        _presenter.Draw(rgba, framebufferWidth, framebufferHeight);
        if (CapturePresented)
        {
            PresentedFrame = new byte[framebufferWidth * framebufferHeight * 4];
            PresentedFrameWidth = framebufferWidth;
            PresentedFrameHeight = framebufferHeight;
            _presenter.ReadBack(PresentedFrame, framebufferWidth, framebufferHeight);
        }
        Glfw.SwapBuffers(_window);
    }

    public int PresentedFrameWidth { get; private set; }
    public int PresentedFrameHeight { get; private set; }

    [UnmanagedCallersOnly(CallConvs = [typeof(CallConvCdecl)])]
    private static void OnKey(nint window, int key, int scancode, int action, int modifiers)
    {
        // Repeats (action 2) carry no news: the key is already held.
        if (Open.TryGetValue(window, out WindowHost? host) && action is Glfw.Press or Glfw.Release) host._keyEvents.Enqueue((key, action == Glfw.Press));
    }

    public void Dispose()
    {
        Glfw.MakeContextCurrent(_window);
        _presenter.Dispose();
        _gl.Dispose();
        Glfw.DestroyWindow(_window);
        Open.Remove(_window);
        TerminateUnlessOpen();
    }

    /// <summary>Stops GLFW once no window of ours is open (stopping it closes every window).</summary>
    private static void TerminateUnlessOpen()
    {
        if (Open.Count == 0) Glfw.Terminate();
    }
}
