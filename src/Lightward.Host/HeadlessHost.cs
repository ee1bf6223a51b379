using Lightward.Host.Input;

namespace Lightward.Host;

/// <summary>
/// A host with no window and a fixed clock: frame n is shown at n / <see cref="FramesPerSecond"/> seconds, whatever
/// the wall clock says, so a run is exactly repeatable. Input comes from a script; the last frame is kept.
/// </summary>
public sealed class HeadlessHost : IFrameHost
{
    private readonly Action<long, PilotInput>? _script;
    private long _framesPresented;

    /// <param name="script">Called once per frame with the frame number to press or hold actions.</param>
    public HeadlessHost(int width, int height, double framesPerSecond = 60, Action<long, PilotInput>? script = null)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "frame size must be positive");
        if (!(framesPerSecond > 0)) throw new ArgumentOutOfRangeException(nameof(framesPerSecond), "frame rate must be positive");
        Width = width;
        Height = height;
        FramesPerSecond = framesPerSecond;
        _script = script;
        LastFrame = new byte[width * height * 4];
    }

    public int Width { get; }
    public int Height { get; }
    public double FramesPerSecond { get; }
    public bool CloseRequested => false;
    public double Seconds => _framesPresented / FramesPerSecond;
    /// <summary>A copy of the most recently presented frame (RGBA8, top row first).</summary>
    public byte[] LastFrame { get; }

    public void PollInput(PilotInput input) => _script?.Invoke(_framesPresented, input);

    public void Present(ReadOnlySpan<byte> rgba)
    {
        rgba[..LastFrame.Length].CopyTo(LastFrame);
        _framesPresented++;
    }

    public void Dispose() { }
}
