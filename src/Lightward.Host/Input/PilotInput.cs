namespace Lightward.Host.Input;

/// <summary>
/// One frame of pilot input, already translated from physical keys and sticks: which actions are held, which were
/// pressed since the last frame (toggles act once per press even if the press was shorter than a frame), stick
/// values, and how far the view was dragged (radians).
/// </summary>
public sealed class PilotInput
{
    private readonly bool[] _held = new bool[Enum.GetValues<PilotAction>().Length];
    private readonly int[] _presses = new int[Enum.GetValues<PilotAction>().Length];
    private readonly double[] _axes = new double[Enum.GetValues<PilotAxis>().Length];

    public double LookYaw { get; set; }
    public double LookPitch { get; set; }

    public bool IsHeld(PilotAction action) => _held[(int)action];
    public int Presses(PilotAction action) => _presses[(int)action];
    public double Axis(PilotAxis axis) => _axes[(int)axis];

    public void SetHeld(PilotAction action, bool held) => _held[(int)action] = held;
    public void AddPress(PilotAction action) => _presses[(int)action]++;
    public void SetAxis(PilotAxis axis, double value) => _axes[(int)axis] = Math.Clamp(value, -1, 1);

    /// <summary>Forgets the presses, stick values and look drag of the last frame; held keys stay held.</summary>
    public void BeginFrame()
    {
        Array.Clear(_presses);
        Array.Clear(_axes);
        LookYaw = LookPitch = 0;
    }
}
