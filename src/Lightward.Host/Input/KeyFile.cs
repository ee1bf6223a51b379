using Lightward.Spacetime;
using Tomlyn.Parsing;
using Tomlyn.Syntax;

namespace Lightward.Host.Input;

/// <summary>A key file with problems; the message lists every problem as file:line:column: key: what is wrong.</summary>
public sealed class KeyFileException(string message) : UserInputException(message);

/// <summary>
/// Reads key bindings from TOML. The defaults are themselves a key file (<see cref="DefaultText"/>, printed by
/// <c>lightward fly --keys</c>), so a user copies it, edits what they like, and passes it with <c>--keys-file</c>;
/// actions a user file leaves out keep their default binding.
/// </summary>
public static class KeyFile
{
    private const string KeyboardSection = "keyboard", GamepadSection = "gamepad", AxesSection = "gamepad-axes", MouseSection = "mouse";
    private const string DeadZoneKey = "dead-zone", LookButtonKey = "look-button", LookPerPixelKey = "look-per-pixel";

    public static string DefaultText { get; } = BuildDefaultText();

    public static InputBindings Defaults { get; } = Parse(DefaultText, "(built-in defaults)", baseline: null);

    public static InputBindings Load(string path)
    {
        string text;
        try { text = File.ReadAllText(path); }
        catch (Exception problem) when (problem is IOException or UnauthorizedAccessException)
        {
            throw new KeyFileException($"--keys-file: cannot read '{path}': {problem.Message}");
        }
        return Parse(text, path, Defaults);
    }

    /// <summary>Parses key-file text over <paramref name="baseline"/> (null: the text must bind from scratch).</summary>
    public static InputBindings Parse(string text, string fileName, InputBindings? baseline)
    {
        DocumentSyntax document = SyntaxParser.Parse(text, fileName);
        var problems = new List<string>();
        foreach (DiagnosticMessage diagnostic in document.Diagnostics)
            if (diagnostic.Kind == DiagnosticMessageKind.Error) problems.Add($"{At(fileName, diagnostic.Span)}: {diagnostic.Message}");
        if (problems.Count > 0) throw new KeyFileException(string.Join(Environment.NewLine, problems));

        var keys = Copy(baseline?.Keys);
        var buttons = Copy(baseline?.GamepadButtons);
        var axes = (baseline?.GamepadAxes ?? []).ToDictionary(binding => binding.Axis);
        double deadZone = baseline?.DeadZone ?? 0.15;
        int lookButton = baseline?.LookButton ?? 1;
        double lookPerPixel = baseline?.LookPerPixel ?? 0.002;
        var reader = new Reader(fileName, problems);

        foreach (KeyValueSyntax item in document.KeyValues)
            problems.Add($"{At(fileName, item.Span)}: {KeyText(item)}: settings belong in a section ([{KeyboardSection}], [{GamepadSection}], [{AxesSection}] or [{MouseSection}])");
        foreach (TableSyntaxBase table in document.Tables)
        {
            string section = table.Name?.ToString().Trim() ?? "";
            foreach (KeyValueSyntax item in table.Items)
            {
                string key = KeyText(item), path = $"{section}.{key}";
                switch (section)
                {
                    case KeyboardSection when PilotActionNames.TryParseAction(key, out PilotAction action):
                        keys[action] = reader.Names(item, path, PhysicalInputNames.Keys, "key");
                        break;
                    case GamepadSection when PilotActionNames.TryParseAction(key, out PilotAction action):
                        buttons[action] = reader.Names(item, path, PhysicalInputNames.GamepadButtons, "gamepad button");
                        break;
                    case AxesSection when key == DeadZoneKey:
                        deadZone = reader.Fraction(item, path, deadZone);
                        break;
                    case AxesSection when PilotActionNames.TryParseAxis(key, out PilotAxis axis):
                        if (reader.Axis(item, path, axis) is AxisBinding binding) axes[axis] = binding; else axes.Remove(axis);
                        break;
                    case MouseSection when key == LookButtonKey:
                        lookButton = reader.Names(item, path, PhysicalInputNames.MouseButtons, "mouse button").FirstOrDefault(lookButton);
                        break;
                    case MouseSection when key == LookPerPixelKey:
                        lookPerPixel = reader.Angle(item, path, lookPerPixel);
                        break;
                    case KeyboardSection or GamepadSection:
                        problems.Add($"{At(fileName, item.Span)}: {path}: unknown action (allowed: {string.Join(", ", PilotActionNames.AllActions.Select(a => a.Name()))})");
                        break;
                    case AxesSection:
                        problems.Add($"{At(fileName, item.Span)}: {path}: unknown setting (allowed: {string.Join(", ", PilotActionNames.AllAxes.Select(a => a.Name()))}, {DeadZoneKey})");
                        break;
                    case MouseSection:
                        problems.Add($"{At(fileName, item.Span)}: {path}: unknown setting (allowed: {LookButtonKey}, {LookPerPixelKey})");
                        break;
                    default:
                        problems.Add($"{At(fileName, table.Span)}: [{section}]: unknown section (allowed: [{KeyboardSection}], [{GamepadSection}], [{AxesSection}], [{MouseSection}])");
                        goto nextTable;
                }
            }
            nextTable:;
        }
        ReportSharedInputs(keys, PhysicalInputNames.Keys, KeyboardSection, "key", fileName, problems);
        ReportSharedInputs(buttons, PhysicalInputNames.GamepadButtons, GamepadSection, "gamepad button", fileName, problems);
        if (problems.Count > 0) throw new KeyFileException(string.Join(Environment.NewLine, problems));
        return new InputBindings
        {
            Keys = keys.ToDictionary(entry => entry.Key, entry => (IReadOnlyList<int>)entry.Value),
            GamepadButtons = buttons.ToDictionary(entry => entry.Key, entry => (IReadOnlyList<int>)entry.Value),
            GamepadAxes = axes.Values.OrderBy(binding => binding.Axis).ToArray(),
            DeadZone = deadZone,
            LookButton = lookButton,
            LookPerPixel = lookPerPixel,
        };
    }

    /// <summary>One physical input driving two actions is ambiguous; name both actions.</summary>
    private static void ReportSharedInputs(Dictionary<PilotAction, int[]> bindings, IReadOnlyDictionary<string, int> names, string section,
        string kind, string fileName, List<string> problems)
    {
        foreach (var shared in bindings.SelectMany(entry => entry.Value.Select(code => (Code: code, Action: entry.Key))).GroupBy(pair => pair.Code).Where(group => group.Count() > 1))
        {
            string actions = string.Join(" and ", shared.Select(pair => $"{section}.{pair.Action.Name()}"));
            problems.Add($"{fileName}: {kind} '{PhysicalInputNames.NameOf(names, shared.Key)}' is bound to both {actions}; each {kind} may drive one action");
        }
    }

    private static Dictionary<PilotAction, int[]> Copy(IReadOnlyDictionary<PilotAction, IReadOnlyList<int>>? source) =>
        source?.ToDictionary(entry => entry.Key, entry => entry.Value.ToArray()) ?? [];

    private static string KeyText(KeyValueSyntax item) => item.Key?.ToString().Trim().Trim('"') ?? "";

    private static string At(string fileName, SourceSpan span) => $"{fileName}:{span.Start.Line + 1}:{span.Start.Column + 1}";

    /// <summary>Reads values, recording each problem with its position instead of stopping at the first.</summary>
    private sealed class Reader(string fileName, List<string> problems)
    {
        public int[] Names(KeyValueSyntax item, string path, IReadOnlyDictionary<string, int> table, string kind)
        {
            var values = new List<(string Text, SourceSpan Span)>();
            switch (item.Value)
            {
                case StringValueSyntax single:
                    values.Add((single.Value ?? "", single.Span));
                    break;
                case ArraySyntax array:
                    foreach (ArrayItemSyntax element in array.Items)
                    {
                        if (element.Value is StringValueSyntax text) values.Add((text.Value ?? "", text.Span));
                        else problems.Add($"{At(fileName, element.Span)}: {path}: each {kind} must be a quoted name");
                    }
                    break;
                default:
                    problems.Add($"{At(fileName, item.Value!.Span)}: {path}: expected a {kind} name or a list of them, e.g. [\"{table.Keys.First()}\"]");
                    return [];
            }
            var codes = new List<int>();
            foreach ((string text, SourceSpan span) in values)
            {
                if (table.TryGetValue(text, out int code)) codes.Add(code);
                else problems.Add($"{At(fileName, span)}: {path}: unknown {kind} '{text}' (allowed: {string.Join(", ", table.Keys)})");
            }
            return codes.ToArray();
        }

        public AxisBinding? Axis(KeyValueSyntax item, string path, PilotAxis axis)
        {
            if (item.Value is not StringValueSyntax { Value: { } text })
            {
                problems.Add($"{At(fileName, item.Value!.Span)}: {path}: expected a quoted stick axis such as \"LeftX\" or \"-LeftY\" (\"\" leaves it unbound)");
                return null;
            }
            if (text.Length == 0) return null;
            int sign = text.StartsWith('-') ? -1 : 1;
            string name = text.TrimStart('-', '+');
            if (PhysicalInputNames.GamepadAxes.TryGetValue(name, out int code)) return new AxisBinding(axis, code, sign);
            problems.Add($"{At(fileName, item.Value.Span)}: {path}: unknown stick axis '{text}' (allowed: {string.Join(", ", PhysicalInputNames.GamepadAxes.Keys)}, each optionally prefixed with '-' to invert)");
            return null;
        }

        public double Fraction(KeyValueSyntax item, string path, double fallback)
        {
            double? value = item.Value switch
            {
                FloatValueSyntax number => number.Value,
                IntegerValueSyntax number => number.Value,
                _ => null,
            };
            if (value is double fraction && fraction >= 0 && fraction < 1) return fraction;
            problems.Add($"{At(fileName, item.Value!.Span)}: {path}: expected a number from 0 up to (not including) 1");
            return fallback;
        }

        public double Angle(KeyValueSyntax item, string path, double fallback)
        {
            if (item.Value is StringValueSyntax { Value: { } text } && Quantity.TryParse(text, Dimension.Angle, out double angle, out string? error))
            {
                if (angle > 0 && angle < Math.PI) return angle;
                error = "must be more than 0 and less than 180 deg";
            }
            else if (item.Value is not StringValueSyntax) error = "expected a quoted angle with a unit, e.g. \"0.1 deg\"";
            else Quantity.TryParse((item.Value as StringValueSyntax)!.Value, Dimension.Angle, out _, out error);
            problems.Add($"{At(fileName, item.Value!.Span)}: {path}: {error}");
            return fallback;
        }
    }

    private static string BuildDefaultText()
    {
        (PilotAction Action, string Keys, string Buttons)[] defaults =
        [
            (PilotAction.ThrottleUp, "LeftShift", "RightBumper"),
            (PilotAction.ThrottleDown, "LeftControl", "LeftBumper"),
            (PilotAction.ThrottleZero, "X", ""),
            (PilotAction.ThrottleFull, "Z", ""),
            (PilotAction.PitchUp, "S", ""),
            (PilotAction.PitchDown, "W", ""),
            (PilotAction.YawLeft, "A", ""),
            (PilotAction.YawRight, "D", ""),
            (PilotAction.RollLeft, "Q", "West"),
            (PilotAction.RollRight, "E", "East"),
            (PilotAction.ShiftLeft, "J", ""),
            (PilotAction.ShiftRight, "L", ""),
            (PilotAction.ShiftUp, "I", ""),
            (PilotAction.ShiftDown, "K", ""),
            (PilotAction.ShiftFore, "U", ""),
            (PilotAction.ShiftAft, "O", ""),
            (PilotAction.HoldPrograde, "1", "DpadUp"),
            (PilotAction.HoldRetrograde, "2", "DpadDown"),
            (PilotAction.HoldTarget, "3", "DpadRight"),
            (PilotAction.HoldOff, "4", "DpadLeft"),
            (PilotAction.TimeFaster, "Period", "North"),
            (PilotAction.TimeSlower, "Comma", "South"),
            (PilotAction.TimeNormal, "Slash", ""),
            (PilotAction.Pause, "P", "Start"),
            (PilotAction.Step, "N", ""),
            (PilotAction.ViewCockpit, "F1", ""),
            (PilotAction.ViewDome, "F2", ""),
            (PilotAction.ViewPanorama, "F3", ""),
            (PilotAction.ViewNext, "V", "Back"),
            (PilotAction.Instruments, "F4", "RightStick"),
            (PilotAction.LookReset, "C", "LeftStick"),
            (PilotAction.Quit, "Escape", ""),
        ];
        (PilotAxis Axis, string Source)[] axes =
        [
            (PilotAxis.Pitch, "LeftY"), (PilotAxis.Yaw, "LeftX"), (PilotAxis.Roll, ""),
            (PilotAxis.ShiftX, "RightX"), (PilotAxis.ShiftY, "-RightY"), (PilotAxis.ShiftZ, "RightTrigger"),
        ];
        static string List(string names) => names.Length == 0 ? "[]" : "[" + string.Join(", ", names.Split(' ').Select(n => $"\"{n}\"")) + "]";
        var text = new System.Text.StringBuilder();
        text.AppendLine("# Lightward controls. Copy this file, change what you like, and fly with --keys-file <file>.");
        text.AppendLine("# Actions you leave out keep these bindings. Each key or button may drive one action.");
        text.AppendLine();
        text.AppendLine($"[{KeyboardSection}]");
        foreach (var entry in defaults) text.AppendLine($"{entry.Action.Name(),-16} = {List(entry.Keys),-16} # {entry.Action.Meaning()}");
        text.AppendLine();
        text.AppendLine($"[{GamepadSection}]");
        foreach (var entry in defaults) text.AppendLine($"{entry.Action.Name(),-16} = {List(entry.Buttons)}");
        text.AppendLine();
        text.AppendLine($"[{AxesSection}]");
        text.AppendLine("# A stick axis per command; prefix '-' to invert, \"\" to leave unbound. Triggers read 0 (released) to 1.");
        foreach (var (axis, source) in axes) text.AppendLine($"{axis.Name(),-16} = \"{source}\"{new string(' ', Math.Max(1, 14 - source.Length))}# {axis.Meaning()}");
        text.AppendLine($"{DeadZoneKey,-16} = 0.15            # stick deflection (0 to 1) that still counts as centred");
        text.AppendLine();
        text.AppendLine($"[{MouseSection}]");
        text.AppendLine($"{LookButtonKey,-16} = \"Right\"         # hold and drag to look around without turning the ship");
        text.AppendLine($"{LookPerPixelKey,-16} = \"0.12 deg\"      # view turn per pixel of mouse motion");
        return text.ToString();
    }
}
