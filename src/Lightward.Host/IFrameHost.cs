using Lightward.Host.Input;

namespace Lightward.Host;

/// <summary>
/// Where the frame loop runs: supplies the loop clock and the pilot's input, and shows each finished frame.
/// <see cref="WindowHost"/> is a real window; <see cref="HeadlessHost"/> has a fixed clock and no window.
/// </summary>
public interface IFrameHost : IDisposable
{
    int Width { get; }
    int Height { get; }
    /// <summary>True once the user closed the window (or the host has nothing more to show).</summary>
    bool CloseRequested { get; }
    /// <summary>Loop time in seconds since the host started.</summary>
    double Seconds { get; }
    /// <summary>Adds this frame's input (presses since the last call, held keys, sticks, look drag) to <paramref name="input"/>.</summary>
    void PollInput(PilotInput input);
    /// <summary>Shows a tightly packed RGBA8 frame of <see cref="Width"/> × <see cref="Height"/>, top row first.</summary>
    void Present(ReadOnlySpan<byte> rgba);
}
