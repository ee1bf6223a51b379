namespace Lightward.Host.Input;

/// <summary>Names of keyboard keys, gamepad buttons and sticks as written in a key file, with their GLFW codes.</summary>
public static class PhysicalInputNames
{
    public static readonly IReadOnlyDictionary<string, int> Keys = BuildKeys();

    /// <summary>Buttons by position (South = bottom face button), as GLFW's gamepad mapping numbers them.</summary>
    public static readonly IReadOnlyDictionary<string, int> GamepadButtons = new Dictionary<string, int>
    {
        ["South"] = 0, ["East"] = 1, ["West"] = 2, ["North"] = 3, ["LeftBumper"] = 4, ["RightBumper"] = 5,
        ["Back"] = 6, ["Start"] = 7, ["Guide"] = 8, ["LeftStick"] = 9, ["RightStick"] = 10,
        ["DpadUp"] = 11, ["DpadRight"] = 12, ["DpadDown"] = 13, ["DpadLeft"] = 14,
    };

    /// <summary>Stick axes run −1…1 (Y down positive, as GLFW reports); triggers are read as 0 released … 1 pressed.</summary>
    public static readonly IReadOnlyDictionary<string, int> GamepadAxes = new Dictionary<string, int>
    {
        ["LeftX"] = 0, ["LeftY"] = 1, ["RightX"] = 2, ["RightY"] = 3, ["LeftTrigger"] = 4, ["RightTrigger"] = 5,
    };

    public const int FirstTriggerAxis = 4;

    public static readonly IReadOnlyDictionary<string, int> MouseButtons = new Dictionary<string, int>
    {
        ["Left"] = 0, ["Right"] = 1, ["Middle"] = 2,
    };

    public static string NameOf(IReadOnlyDictionary<string, int> table, int code) => table.First(entry => entry.Value == code).Key;

    private static Dictionary<string, int> BuildKeys()
    {
        var keys = new Dictionary<string, int>();
        for (char letter = 'A'; letter <= 'Z'; letter++) keys[letter.ToString()] = letter;
        for (int digit = 0; digit <= 9; digit++)
        {
            keys[digit.ToString()] = '0' + digit;
            keys[$"Keypad{digit}"] = 320 + digit;
        }
        for (int f = 1; f <= 12; f++) keys[$"F{f}"] = 289 + f;
        (string Name, int Code)[] named =
        [
            ("Space", 32), ("Apostrophe", 39), ("Comma", 44), ("Minus", 45), ("Period", 46), ("Slash", 47),
            ("Semicolon", 59), ("Equal", 61), ("LeftBracket", 91), ("Backslash", 92), ("RightBracket", 93), ("Backquote", 96),
            ("Escape", 256), ("Enter", 257), ("Tab", 258), ("Backspace", 259), ("Insert", 260), ("Delete", 261),
            ("Right", 262), ("Left", 263), ("Down", 264), ("Up", 265), ("PageUp", 266), ("PageDown", 267),
            ("Home", 268), ("End", 269), ("KeypadDecimal", 330), ("KeypadDivide", 331), ("KeypadMultiply", 332),
            ("KeypadSubtract", 333), ("KeypadAdd", 334), ("KeypadEnter", 335),
            ("LeftShift", 340), ("LeftControl", 341), ("LeftAlt", 342), ("RightShift", 344), ("RightControl", 345), ("RightAlt", 346),
        ];
        foreach ((string name, int code) in named) keys[name] = code;
        return keys;
    }
}
