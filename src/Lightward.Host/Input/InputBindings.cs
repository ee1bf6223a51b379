namespace Lightward.Host.Input;

/// <summary>A gamepad axis driving a pilot axis; <see cref="Sign"/> −1 inverts it.</summary>
public readonly record struct AxisBinding(PilotAxis Axis, int GamepadAxis, int Sign);

/// <summary>Which physical inputs drive which pilot actions. Built from the defaults, then a user's key file on top.</summary>
public sealed class InputBindings
{
    public required IReadOnlyDictionary<PilotAction, IReadOnlyList<int>> Keys { get; init; }
    public required IReadOnlyDictionary<PilotAction, IReadOnlyList<int>> GamepadButtons { get; init; }
    public required IReadOnlyList<AxisBinding> GamepadAxes { get; init; }
    /// <summary>Stick deflection below this counts as centred.</summary>
    public required double DeadZone { get; init; }
    /// <summary>Mouse button that, held, drags the view around without turning the ship.</summary>
    public required int LookButton { get; init; }
    /// <summary>View turn per pixel of mouse motion, radians.</summary>
    public required double LookPerPixel { get; init; }

    /// <summary>The action a key drives, or null.</summary>
    public PilotAction? ActionForKey(int key) => Find(Keys, key);

    public PilotAction? ActionForButton(int button) => Find(GamepadButtons, button);

    private static PilotAction? Find(IReadOnlyDictionary<PilotAction, IReadOnlyList<int>> table, int code)
    {
        foreach ((PilotAction action, IReadOnlyList<int> codes) in table)
            if (codes.Contains(code)) return action;
        return null;
    }
}
