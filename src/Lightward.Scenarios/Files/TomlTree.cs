using Tomlyn.Parsing;
using Tomlyn.Syntax;

namespace Lightward.Scenarios.Files;

/// <summary>Where something sits in a user's file, 1-based line and column.</summary>
public readonly record struct SourceLocation(string File, int Line, int Column)
{
    public override string ToString() => $"{File}:{Line}:{Column}";
}

/// <summary>A TOML value with the place it was written and its dotted key path, for located messages.</summary>
public abstract class TomlNode(SourceLocation location, string path)
{
    public SourceLocation Location { get; } = location;
    public string Path { get; } = path;
    /// <summary>The TOML type name used in messages ("string", "table", …).</summary>
    public abstract string TypeName { get; }
}

public sealed class TomlScalar(SourceLocation location, string path, object value, string typeName) : TomlNode(location, path)
{
    public object Value { get; } = value;
    public override string TypeName { get; } = typeName;
}

public sealed class TomlList(SourceLocation location, string path, IReadOnlyList<TomlNode> items) : TomlNode(location, path)
{
    public IReadOnlyList<TomlNode> Items { get; } = items;
    public override string TypeName => "array";
}

public sealed class TomlMap(SourceLocation location, string path) : TomlNode(location, path)
{
    /// <summary>Entries in file order: the key's own location and its value.</summary>
    public List<(string Key, SourceLocation KeyLocation, TomlNode Value)> Entries { get; } = [];
    public override string TypeName => "table";

    public TomlNode? Find(string key)
    {
        foreach (var entry in Entries) if (entry.Key == key) return entry.Value;
        return null;
    }
}

/// <summary>
/// Parses TOML text with Tomlyn's syntax tree into located nodes. Syntax errors and redefined keys become
/// <see cref="FileProblem"/>s; the tree is returned only when there are none.
/// </summary>
public static class TomlTree
{
    public static TomlMap? Parse(string text, string file, List<FileProblem> problems)
    {
        DocumentSyntax document;
        try
        {
            document = SyntaxParser.Parse(text, file, validate: true);
        }
        catch (Exception exception) when (exception is not OutOfMemoryException)
        {
            // The parser reports problems as diagnostics; anything it throws is still a malformed file, not our bug.
            problems.Add(new FileProblem(new SourceLocation(file, 1, 1), "", $"cannot read TOML: {exception.Message}", "a TOML 1.1 document"));
            return null;
        }
        if (document.HasErrors)
        {
            foreach (DiagnosticMessage diagnostic in document.Diagnostics)
                if (diagnostic.Kind == DiagnosticMessageKind.Error)
                    problems.Add(new FileProblem(At(file, diagnostic.Span.Start), "", diagnostic.Message, "TOML 1.1 syntax"));
            return null;
        }
        var builder = new Builder(file, problems);
        var root = new TomlMap(new SourceLocation(file, 1, 1), "");
        foreach (KeyValueSyntax keyValue in document.KeyValues) builder.Insert(root, keyValue);
        foreach (TableSyntaxBase table in document.Tables) builder.AddTable(root, table);
        return problems.Count == 0 ? root : null;
    }

    private static SourceLocation At(string file, TextPosition position) => new(file, position.Line + 1, position.Column + 1);

    private sealed class Builder(string file, List<FileProblem> problems)
    {
        private readonly HashSet<TomlMap> _explicitTables = [];
        private readonly HashSet<TomlMap> _inlineTables = [];

        public void AddTable(TomlMap root, TableSyntaxBase table)
        {
            if (table.Name is null) return;
            List<(string Name, SourceLocation Location)> parts = KeyParts(table.Name);
            TomlMap? parent = Descend(root, parts.Take(parts.Count - 1));
            if (parent is null) return;
            (string last, SourceLocation lastLocation) = parts[^1];
            string path = Join(parent.Path, last);
            TomlMap target;
            if (table is TableArraySyntax)
            {
                TomlNode? existing = parent.Find(last);
                List<TomlNode> items;
                if (existing is null)
                {
                    items = [];
                    parent.Entries.Add((last, lastLocation, new TomlList(lastLocation, path, items)));
                }
                else if (existing is TomlList { Items: List<TomlNode> list } && list.All(i => i is TomlMap m && !_inlineTables.Contains(m)))
                    items = list;
                else
                {
                    Redefined(path, lastLocation, existing);
                    return;
                }
                target = new TomlMap(lastLocation, $"{path}[{items.Count}]");
                items.Add(target);
            }
            else
            {
                TomlNode? existing = parent.Find(last);
                if (existing is TomlMap map && !_explicitTables.Contains(map) && !_inlineTables.Contains(map))
                    target = map;
                else if (existing is not null)
                {
                    Redefined(path, lastLocation, existing);
                    return;
                }
                else
                {
                    target = new TomlMap(lastLocation, path);
                    parent.Entries.Add((last, lastLocation, target));
                }
                _explicitTables.Add(target);
            }
            foreach (SyntaxNode item in table.Items!)
                if (item is KeyValueSyntax keyValue) Insert(target, keyValue);
        }

        public void Insert(TomlMap table, KeyValueSyntax keyValue)
        {
            if (keyValue.Key is null || keyValue.Value is null) return;
            List<(string Name, SourceLocation Location)> parts = KeyParts(keyValue.Key);
            TomlMap? parent = Descend(table, parts.Take(parts.Count - 1));
            if (parent is null) return;
            (string last, SourceLocation location) = parts[^1];
            string path = Join(parent.Path, last);
            TomlNode? existing = parent.Find(last);
            if (existing is not null)
            {
                Redefined(path, location, existing);
                return;
            }
            parent.Entries.Add((last, location, Convert(keyValue.Value, path)));
        }

        private TomlNode Convert(ValueSyntax value, string path)
        {
            SourceLocation location = At(file, value.Span.Start);
            switch (value)
            {
                case StringValueSyntax s: return new TomlScalar(location, path, s.Value ?? "", "string");
                case IntegerValueSyntax i: return new TomlScalar(location, path, i.Value, "integer");
                case FloatValueSyntax f: return new TomlScalar(location, path, f.Value, "float");
                case BooleanValueSyntax b: return new TomlScalar(location, path, b.Value, "boolean");
                case ArraySyntax array:
                {
                    var items = new List<TomlNode>();
                    foreach (ArrayItemSyntax item in array.Items)
                        if (item.Value is not null) items.Add(Convert(item.Value, $"{path}[{items.Count}]"));
                    return new TomlList(location, path, items);
                }
                case InlineTableSyntax inline:
                {
                    var map = new TomlMap(location, path);
                    _inlineTables.Add(map);
                    foreach (InlineTableItemSyntax item in inline.Items)
                        if (item.KeyValue is not null) Insert(map, item.KeyValue);
                    return map;
                }
                default:
                    return new TomlScalar(location, path, value.ToString() ?? "", "date-time");
            }
        }

        /// <summary>Walks (creating as needed) the tables named by dotted key parts.</summary>
        private TomlMap? Descend(TomlMap table, IEnumerable<(string Name, SourceLocation Location)> parts)
        {
            foreach ((string name, SourceLocation location) in parts)
            {
                TomlNode? next = table.Find(name);
                switch (next)
                {
                    case null:
                        var created = new TomlMap(location, Join(table.Path, name));
                        table.Entries.Add((name, location, created));
                        table = created;
                        break;
                    case TomlMap map when !_inlineTables.Contains(map):
                        table = map;
                        break;
                    case TomlList { Items.Count: > 0 } list when list.Items[^1] is TomlMap last && !_inlineTables.Contains(last):
                        table = last;
                        break;
                    default:
                        Redefined(Join(table.Path, name), location, next);
                        return null;
                }
            }
            return table;
        }

        private void Redefined(string path, SourceLocation location, TomlNode existing) =>
            problems.Add(new FileProblem(location, path, $"defined again (first defined at line {existing.Location.Line})", "each key once per table"));

        private List<(string, SourceLocation)> KeyParts(KeySyntax key)
        {
            var parts = new List<(string, SourceLocation)> { (KeyText(key.Key), At(file, key.Span.Start)) };
            foreach (DottedKeyItemSyntax dotted in key.DotKeys)
                parts.Add((KeyText(dotted.Key), At(file, dotted.Span.Start)));
            return parts;
        }

        private static string KeyText(BareKeyOrStringValueSyntax? key) => key switch
        {
            BareKeySyntax bare => bare.Key?.Text ?? "",
            StringValueSyntax quoted => quoted.Value ?? "",
            _ => "",
        };
    }

    internal static string Join(string parent, string key) => parent.Length == 0 ? key : $"{parent}.{key}";
}
