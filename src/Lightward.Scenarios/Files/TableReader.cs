using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>
/// Reads the keys of one TOML table against our schema and collects every problem instead of stopping at the first:
/// wrong types, bad units, out-of-range values, missing keys, and (on <see cref="Finish"/>) unknown keys.
/// A method returns null when its value is absent or wrong, so callers carry on and report everything at once.
/// </summary>
public sealed class TableReader
{
    private readonly HashSet<string> _known = [];

    public TableReader(TomlMap table, List<FileProblem> problems)
    {
        Table = table;
        Problems = problems;
    }

    public TomlMap Table { get; }
    public List<FileProblem> Problems { get; }
    public string Path => Table.Path;
    public SourceLocation Location => Table.Location;

    public void Report(TomlNode node, string what, string allowed) => Problems.Add(new FileProblem(node.Location, node.Path, what, allowed));

    public void ReportHere(string key, string what, string allowed) =>
        Problems.Add(new FileProblem(Table.Find(key)?.Location ?? Table.Location, TomlTree.Join(Path, key), what, allowed));

    /// <summary>The raw node under <paramref name="key"/>, marking the key as known.</summary>
    public TomlNode? Node(string key, bool required = false, string allowed = "")
    {
        _known.Add(key);
        TomlNode? node = Table.Find(key);
        if (node is null && required)
            Problems.Add(new FileProblem(Table.Location, TomlTree.Join(Path, key), "missing required key", allowed));
        return node;
    }

    public bool Has(string key) => Table.Find(key) is not null;

    public string? String(string key, bool required = false, string allowed = "text")
    {
        TomlNode? node = Node(key, required, allowed);
        return node is null ? null : AsString(node, allowed);
    }

    public string? Choice(string key, IReadOnlyList<string> choices, bool required = false)
    {
        string allowed = "one of " + string.Join(", ", choices.Select(c => $"\"{c}\""));
        string? text = String(key, required, allowed);
        if (text is null) return null;
        if (choices.Contains(text)) return text;
        Report(Table.Find(key)!, $"unknown value \"{text}\"", allowed);
        return null;
    }

    public bool? Boolean(string key)
    {
        TomlNode? node = Node(key);
        if (node is null) return null;
        if (node is TomlScalar { Value: bool b }) return b;
        Report(node, $"expected true or false, found {node.TypeName}", "true or false");
        return null;
    }

    public long? Integer(string key, long min, long max, bool required = false)
    {
        string allowed = $"an integer from {min} to {max}";
        TomlNode? node = Node(key, required, allowed);
        if (node is null) return null;
        if (node is not TomlScalar { Value: long value })
        {
            Report(node, $"expected an integer, found {node.TypeName}", allowed);
            return null;
        }
        if (value < min || value > max)
        {
            Report(node, $"{value} is out of range", allowed);
            return null;
        }
        return value;
    }

    /// <summary>A plain number (integer or float) inside the open or closed range the predicate describes.</summary>
    public double? Number(string key, Func<double, bool> inRange, string allowed, bool required = false)
    {
        TomlNode? node = Node(key, required, allowed);
        return node is null ? null : AsNumber(node, inRange, allowed);
    }

    /// <summary>A quantity string with a unit, e.g. "4.2 ly", checked by <paramref name="inRange"/> in internal units.</summary>
    public double? Quantity(string key, Dimension dimension, Func<double, bool> inRange, string allowed, bool required = false)
    {
        TomlNode? node = Node(key, required, $"{allowed}, written with a unit ({string.Join(", ", Spacetime.Quantity.UnitsOf(dimension))})");
        return node is null ? null : AsQuantity(node, dimension, inRange, allowed);
    }

    /// <summary>Three quantities with units, e.g. ["1 ly", "0 ly", "-2 ly"].</summary>
    public Vec3? QuantityVector(string key, Dimension dimension, bool required = false)
    {
        string allowed = $"an array of three quantities such as [\"1 {Spacetime.Quantity.UnitsOf(dimension)[0]}\", \"0 {Spacetime.Quantity.UnitsOf(dimension)[0]}\", \"0 {Spacetime.Quantity.UnitsOf(dimension)[0]}\"]";
        TomlNode? node = Node(key, required, allowed);
        if (node is null) return null;
        IReadOnlyList<TomlNode>? items = Triple(node, allowed);
        if (items is null) return null;
        double? x = AsQuantity(items[0], dimension, _ => true, "any value"), y = AsQuantity(items[1], dimension, _ => true, "any value"), z = AsQuantity(items[2], dimension, _ => true, "any value");
        return x is null || y is null || z is null ? null : new Vec3(x.Value, y.Value, z.Value);
    }

    /// <summary>Three plain numbers giving a direction; must not be all zero.</summary>
    public Vec3? Direction(string key, bool required = false)
    {
        const string allowed = "an array of three numbers, not all zero, such as [1, 0, 0]";
        TomlNode? node = Node(key, required, allowed);
        if (node is null) return null;
        IReadOnlyList<TomlNode>? items = Triple(node, allowed);
        if (items is null) return null;
        double? x = AsNumber(items[0], _ => true, allowed), y = AsNumber(items[1], _ => true, allowed), z = AsNumber(items[2], _ => true, allowed);
        if (x is null || y is null || z is null) return null;
        var direction = new Vec3(x.Value, y.Value, z.Value);
        if (!(direction.Length > 0) || !double.IsFinite(direction.Length))
        {
            Report(node, "direction has no length", allowed);
            return null;
        }
        return direction / direction.Length;
    }

    /// <summary>A sub-table (header [a.b] or inline { … }).</summary>
    public TableReader? Section(string key, bool required = false)
    {
        TomlNode? node = Node(key, required, "a table");
        if (node is null) return null;
        if (node is TomlMap map) return new TableReader(map, Problems);
        Report(node, $"expected a table, found {node.TypeName}", $"a table [{TomlTree.Join(Path, key)}]");
        return null;
    }

    /// <summary>An array of tables ([[a]] headers), empty when absent.</summary>
    public IReadOnlyList<TableReader> Sections(string key, bool required = false)
    {
        TomlNode? node = Node(key, required, $"one or more [[{TomlTree.Join(Path, key)}]] tables");
        if (node is null) return [];
        if (node is TomlList list && list.Items.All(i => i is TomlMap))
            return list.Items.Select(i => new TableReader((TomlMap)i, Problems)).ToArray();
        Report(node, $"expected an array of tables, found {node.TypeName}", $"[[{TomlTree.Join(Path, key)}]] tables");
        return [];
    }

    /// <summary>Reports every key of this table that no reader method asked for.</summary>
    public void Finish()
    {
        foreach ((string key, SourceLocation location, _) in Table.Entries)
            if (!_known.Contains(key))
                Problems.Add(new FileProblem(location, TomlTree.Join(Path, key), "unknown key",
                    _known.Count == 0 ? "no keys here" : "known keys: " + string.Join(", ", _known.Order(StringComparer.Ordinal))));
    }

    public string? AsString(TomlNode node, string allowed)
    {
        if (node is TomlScalar { Value: string text }) return text;
        Report(node, $"expected a string, found {node.TypeName}", allowed);
        return null;
    }

    public double? AsNumber(TomlNode node, Func<double, bool> inRange, string allowed)
    {
        double? value = node is TomlScalar scalar ? scalar.Value switch { long l => l, double d => d, _ => null } : null;
        if (value is null)
        {
            Report(node, $"expected a number, found {node.TypeName}", allowed);
            return null;
        }
        if (!double.IsFinite(value.Value) || !inRange(value.Value))
        {
            Report(node, $"{value.Value.ToString("R", System.Globalization.CultureInfo.InvariantCulture)} is out of range", allowed);
            return null;
        }
        return value;
    }

    public double? AsQuantity(TomlNode node, Dimension dimension, Func<double, bool> inRange, string allowed)
    {
        string units = string.Join(", ", Spacetime.Quantity.UnitsOf(dimension));
        if (node is not TomlScalar { Value: string text })
        {
            Report(node, $"expected a quoted quantity with a unit, found {node.TypeName}", $"e.g. \"1 {Spacetime.Quantity.UnitsOf(dimension)[0]}\"; units {units}");
            return null;
        }
        if (!Spacetime.Quantity.TryParse(text, dimension, out double value, out string? error))
        {
            // The parser's message already says what is allowed; keep the located form.
            Report(node, error!.Split("; expected")[0], $"{Describe(dimension)} in {units}");
            return null;
        }
        if (!double.IsFinite(value) || !inRange(value))
        {
            Report(node, $"\"{text}\" is out of range", allowed);
            return null;
        }
        return value;
    }

    private static string Describe(Dimension dimension) => dimension switch
    {
        Dimension.Acceleration => "an acceleration",
        Dimension.Angle => "an angle",
        Dimension.AngularRate => "an angular rate",
        _ => "a " + dimension.ToString().ToLowerInvariant(),
    };

    private IReadOnlyList<TomlNode>? Triple(TomlNode node, string allowed)
    {
        if (node is TomlList { Items.Count: 3 } list) return list.Items;
        Report(node, node is TomlList l ? $"expected 3 items, found {l.Items.Count}" : $"expected an array, found {node.TypeName}", allowed);
        return null;
    }
}
