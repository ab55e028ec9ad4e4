using System.Globalization;
using System.Numerics;
using System.Text.Json;

namespace VoxProf.Core.Scenes.Loading;

/// <summary>A JSON value with its path (<c>$.layers[2].radius</c>), so every complaint names the exact field.</summary>
internal readonly struct JsonValue(JsonElement element, string path, string file)
{
    /// <summary>Largest magnitude accepted for any coordinate or parameter; keeps float conversions finite.</summary>
    public const double MaxMagnitude = 1e9;

    public JsonElement Element => element;
    public string Path => path;
    public string File => file;

    public SceneFormatException Error(string problem) => new(file, path, problem);

    public SceneFormatException Expected(string what) => Error($"expected {what}, found {Found()}");

    public JsonObjectReader AsObject(string what)
    {
        if (element.ValueKind != JsonValueKind.Object)
            throw Expected(what);
        return new JsonObjectReader(this);
    }

    public JsonValue[] AsArray(string what, int exactLength = -1)
    {
        if (element.ValueKind != JsonValueKind.Array || (exactLength >= 0 && element.GetArrayLength() != exactLength))
            throw Expected(what);
        var items = new JsonValue[element.GetArrayLength()];
        int i = 0;
        foreach (JsonElement e in element.EnumerateArray())
        {
            items[i] = new JsonValue(e, $"{path}[{i}]", file);
            i++;
        }
        return items;
    }

    public string String(string what = "a string")
    {
        if (element.ValueKind != JsonValueKind.String)
            throw Expected(what);
        return element.GetString()!;
    }

    /// <summary>One of a fixed set of words; the message lists them all.</summary>
    public string Choice(params string[] choices)
    {
        string what = "one of: " + string.Join(", ", choices.Select(c => $"\"{c}\""));
        if (element.ValueKind != JsonValueKind.String || !choices.Contains(element.GetString()))
            throw Expected(what);
        return element.GetString()!;
    }

    /// <summary>A finite number within [min, max] (or (min, max] when <paramref name="exclusiveMin"/>).</summary>
    public double Number(string what, double min = -MaxMagnitude, double max = MaxMagnitude, bool exclusiveMin = false)
    {
        if (element.ValueKind != JsonValueKind.Number)
            throw Expected(what);
        // TryGetDouble refuses numbers that overflow to infinity (such as 1e999).
        if (!element.TryGetDouble(out double v) || Math.Abs(v) > MaxMagnitude)
            throw Error($"number out of range; expected {what} (finite, at most {MaxMagnitude:0e0} in size), found {Found()}");
        if (v < min || v > max || (exclusiveMin && v == min))
            throw Expected(what);
        return v;
    }

    public int Int(string what, int min, int max)
    {
        if (element.ValueKind != JsonValueKind.Number || !element.TryGetInt64(out long v) || v < min || v > max)
            throw Expected(what);
        return (int)v;
    }

    public ulong UInt64(string what)
    {
        if (element.ValueKind != JsonValueKind.Number || !element.TryGetUInt64(out ulong v))
            throw Expected(what);
        return v;
    }

    public Vector3 Vector(string what)
    {
        JsonValue[] items = AsArray(what, 3);
        return new Vector3((float)items[0].Number("a number"), (float)items[1].Number("a number"),
            (float)items[2].Number("a number"));
    }

    public double[] Numbers(string what, int count)
    {
        JsonValue[] items = AsArray(what, count);
        return items.Select(i => i.Number("a number")).ToArray();
    }

    public int[] Ints(string what, int count, int min, int max, string itemWhat)
    {
        JsonValue[] items = AsArray(what, count);
        return items.Select(i => i.Int(itemWhat, min, max)).ToArray();
    }

    private string Found() => element.ValueKind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => $"an array of {element.GetArrayLength().ToString(CultureInfo.InvariantCulture)}",
        JsonValueKind.String => Shorten(JsonSerializer.Serialize(element.GetString())),
        _ => Shorten(element.GetRawText()),
    };

    private static string Shorten(string s) => s.Length <= 40 ? s : s[..37] + "...";
}

/// <summary>The members of one JSON object, with duplicate and unknown keys rejected.</summary>
internal sealed class JsonObjectReader
{
    private readonly JsonValue _value;
    private readonly Dictionary<string, JsonElement> _members = new(StringComparer.Ordinal);

    public JsonObjectReader(JsonValue value)
    {
        _value = value;
        foreach (JsonProperty p in value.Element.EnumerateObject())
        {
            if (!_members.TryAdd(p.Name, p.Value))
                throw new SceneFormatException(value.File, Child(p.Name), "duplicate key; each key may appear once");
        }
    }

    public string Path => _value.Path;

    public SceneFormatException Error(string problem) => _value.Error(problem);

    /// <summary>Rejects any key outside <paramref name="valid"/>, listing the valid ones.</summary>
    public void AllowOnly(string context, params string[] valid)
    {
        foreach (string key in _members.Keys)
        {
            if (!valid.Contains(key))
                throw new SceneFormatException(_value.File, Child(key),
                    $"unknown key; valid keys {context}: {string.Join(", ", valid)}");
        }
    }

    public bool Has(string key) => _members.ContainsKey(key);

    public JsonValue Required(string key, string what)
    {
        if (!_members.TryGetValue(key, out JsonElement e))
            throw new SceneFormatException(_value.File, Child(key), $"missing; expected {what}");
        return new JsonValue(e, Child(key), _value.File);
    }

    public JsonValue? Optional(string key) =>
        _members.TryGetValue(key, out JsonElement e) ? new JsonValue(e, Child(key), _value.File) : null;

    public string Child(string key) => $"{_value.Path}.{key}";
}
