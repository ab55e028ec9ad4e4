using System.Globalization;
using System.Text;
using System.Text.Json.Nodes;

namespace VoxProf.Tests.Fuzz;

/// <summary>One mutated input: what was done to it (for a failure message) and its bytes.</summary>
internal sealed record Mutation(string Description, byte[] Bytes);

/// <summary>
/// Seeded mutations of a JSON input (a scene or a report), the kinds a careless edit, a broken download or a hostile
/// pull request produce: numbers made huge, negative, infinite or fractional; values of the wrong type; keys and
/// array items deleted or repeated; strings with control characters, invalid UTF-8 or lone surrogates; paths to
/// folders, devices and places outside the input's folder; bad literals; truncation; flipped bytes; a byte-order mark.
/// The same seed always gives the same mutation (System.Random with a seed is deterministic).
/// </summary>
internal static class InputMutator
{
    private static readonly string[] Numbers =
    [
        "0", "-1", "-0", "1e999", "-1e999", "65536", "65537", "1000000000", "2147483648", "1e300", "0.5", "1e-320",
        "99999999999999999999", "16", "1073741824", "4294967296", "3.5", "-65536", "1e15", "255", "256",
    ];

    private static readonly string[] Strings =
    [
        "", " ", "x", "line\nbreak", "tab\there", "nul\u0000char", "esc\u001b[31m", "\ud800", "../../../etc/passwd", "/dev/zero",
        "/proc/self/environ", ".", "..", "/", "ring-post.raw", "stonebrook-bridge.obj", "missing.raw", "a.nrrd",
        "box", "sphere", "terrain", "caves", "scatter", "raw", "mesh", "heightmap", "carve", "add", "grid", "dda",
        new string('x', 5000),
    ];

    private static readonly string[] Literals = ["tru", "nul", "fals", "NaN", "Infinity", "-Infinity", "undefined", "'single'", "0x10", "+1", ".5", "1.", "01"];

    public static Mutation Mutate(byte[] input, int seed)
    {
        var rng = new Random(seed);
        int kind = rng.Next(16);
        return kind switch
        {
            < 4 => Structural(input, rng, "number") ?? Text(input, rng),
            < 6 => Structural(input, rng, "type") ?? Text(input, rng),
            6 => Structural(input, rng, "delete") ?? Text(input, rng),
            7 => Structural(input, rng, "repeat") ?? Text(input, rng),
            < 10 => Structural(input, rng, "string") ?? Text(input, rng),
            10 => Structural(input, rng, "scale") ?? Text(input, rng),
            _ => Text(input, rng),
        };
    }

    /// <summary>Several mutations in a row, for inputs that survive one.</summary>
    public static Mutation MutateMany(byte[] input, int seed, int count)
    {
        var rng = new Random(seed);
        var steps = new List<string>();
        byte[] bytes = input;
        for (int i = 0; i < count; i++)
        {
            Mutation m = Mutate(bytes, rng.Next());
            steps.Add(m.Description);
            bytes = m.Bytes;
        }
        return new Mutation(string.Join("; then ", steps), bytes);
    }

    // A structural mutation needs JSON the node model can read; anything else (an earlier mutation's invalid
    // UTF-8 or lone surrogate) gets a text mutation instead.
    private static Mutation? Structural(byte[] input, Random rng, string what)
    {
        try
        {
            return StructuralOn(input, rng, what);
        }
        catch (Exception ex) when (ex is System.Text.Json.JsonException or InvalidOperationException or FormatException)
        {
            return null;
        }
    }

    private static Mutation? StructuralOn(byte[] input, Random rng, string what)
    {
        JsonNode? root = JsonNode.Parse(input, documentOptions: new() { CommentHandling = System.Text.Json.JsonCommentHandling.Skip });
        var all = new List<JsonNode>();
        Collect(root, all);
        if (all.Count < 2)
            return null;
        JsonNode target = all[1 + rng.Next(all.Count - 1)];
        string path = target.GetPath();
        string description;
        switch (what)
        {
            case "number":
                var numbers = all.Where(n => n is JsonValue v && v.GetValueKind() == System.Text.Json.JsonValueKind.Number).ToList();
                if (numbers.Count == 0)
                    return null;
                target = numbers[rng.Next(numbers.Count)];
                string number = Numbers[rng.Next(Numbers.Length)];
                path = target.GetPath();
                return Replace(root!, target, number, $"{path} = {number}");
            case "scale":
                var scalable = all.Where(n => n is JsonValue v && v.GetValueKind() == System.Text.Json.JsonValueKind.Number).ToList();
                if (scalable.Count == 0)
                    return null;
                target = scalable[rng.Next(scalable.Count)];
                double factor = new[] { 1000.0, 65536, -1, 0.001, 1e6 }[rng.Next(5)];
                if (!double.TryParse(target.ToJsonString(), NumberStyles.Float, CultureInfo.InvariantCulture, out double number0))
                    return null;
                double scaled = number0 * factor;
                string text = scaled.ToString("R", CultureInfo.InvariantCulture);
                return Replace(root!, target, text, $"{target.GetPath()} × {factor.ToString(CultureInfo.InvariantCulture)}");
            case "type":
                string value = new[] { "null", "\"x\"", "[]", "{}", "true", "[1,2,3]", "{\"a\":1}", "-5" }[rng.Next(8)];
                return Replace(root!, target, value, $"{path} = {value}");
            case "delete":
                if (target.Parent is JsonObject o)
                {
                    o.Remove(target.GetPropertyName());
                    description = $"{path} deleted";
                }
                else if (target.Parent is JsonArray a)
                {
                    a.RemoveAt(target.GetElementIndex());
                    description = $"{path} deleted";
                }
                else
                {
                    return null;
                }
                return new Mutation(description, Encoding.UTF8.GetBytes(root!.ToJsonString()));
            case "repeat":
                var arrays = all.OfType<JsonArray>().Where(x => x.Count > 0).ToList();
                if (arrays.Count == 0)
                    return null;
                JsonArray array = arrays[rng.Next(arrays.Count)];
                int times = new[] { 1, 2, 50, 400 }[rng.Next(4)];
                JsonNode item = array[rng.Next(array.Count)]!;
                for (int i = 0; i < times; i++)
                    array.Add(item.DeepClone());
                return new Mutation($"{array.GetPath()}: an item repeated {times} times", Encoding.UTF8.GetBytes(root!.ToJsonString()));
            default:
                var strings = all.Where(n => n is JsonValue v && v.GetValueKind() == System.Text.Json.JsonValueKind.String).ToList();
                if (strings.Count == 0)
                    return null;
                target = strings[rng.Next(strings.Count)];
                string s = Strings[rng.Next(Strings.Length)];
                return Replace(root!, target, Literal(s), $"{target.GetPath()} = \"{Show(s)}\"");
        }
    }

    // Replaces a node by raw JSON text through a unique marker, so text such as 1e999 or a lone surrogate escape
    // (which JsonNode would not hold) reaches the file as written.
    private static Mutation Replace(JsonNode root, JsonNode target, string raw, string description)
    {
        const string Marker = "\"@@voxprof-fuzz@@\"";
        JsonNode placeholder = JsonValue.Create("@@voxprof-fuzz@@");
        if (target.Parent is JsonObject o)
            o[target.GetPropertyName()] = placeholder;
        else if (target.Parent is JsonArray a)
            a[target.GetElementIndex()] = placeholder;
        string text = root.ToJsonString().Replace(Marker, raw, StringComparison.Ordinal);
        return new Mutation(description, Encoding.UTF8.GetBytes(text));
    }

    private static Mutation Text(byte[] input, Random rng)
    {
        var bytes = input.ToList();
        int at = bytes.Count == 0 ? 0 : rng.Next(bytes.Count);
        switch (rng.Next(7))
        {
            case 0:
                return new Mutation($"truncated at byte {at}", [.. bytes.Take(at)]);
            case 1:
                byte flip = (byte)(1 << rng.Next(8));
                if (bytes.Count > 0)
                    bytes[at] ^= flip;
                return new Mutation($"byte {at} xor 0x{flip:X2}", [.. bytes]);
            case 2:
                byte[] bad = new[] { new byte[] { 0xFF }, [0xC0, 0x80], [0xED, 0xA0, 0x80], [0xE2, 0x82], [0x00], [0x0A], [0x1B] }[rng.Next(7)];
                bytes.InsertRange(at, bad);
                return new Mutation($"bytes {Convert.ToHexString(bad)} inserted at {at}", [.. bytes]);
            case 3:
                return new Mutation("byte-order mark added", [0xEF, 0xBB, 0xBF, .. bytes]);
            case 4:
                string literal = Literals[rng.Next(Literals.Length)];
                int digit = bytes.FindIndex(at, b => b is (byte)'t' or (byte)'n' or (byte)'f' or (>= (byte)'0' and <= (byte)'9'));
                if (digit < 0)
                    digit = at;
                bytes.InsertRange(digit, Encoding.UTF8.GetBytes(literal));
                return new Mutation($"literal {literal} inserted at {digit}", [.. bytes]);
            case 5:
                int from = rng.Next(Math.Max(1, bytes.Count)), length = rng.Next(1, 64);
                var chunk = bytes.Skip(from).Take(length).ToArray();
                bytes.InsertRange(at, chunk);
                return new Mutation($"{chunk.Length} bytes from {from} copied to {at}", [.. bytes]);
            default:
                int cut = Math.Min(bytes.Count - at, rng.Next(1, 32));
                bytes.RemoveRange(at, cut);
                return new Mutation($"{cut} bytes removed at {at}", [.. bytes]);
        }
    }

    private static void Collect(JsonNode? node, List<JsonNode> into)
    {
        if (node is null)
            return;
        into.Add(node);
        switch (node)
        {
            case JsonObject o:
                foreach (var (_, v) in o)
                    Collect(v, into);
                break;
            case JsonArray a:
                foreach (JsonNode? v in a)
                    Collect(v, into);
                break;
        }
    }

    // A JSON string literal written by hand: the serializer refuses a lone surrogate, which is the point here.
    private static string Literal(string s)
    {
        var sb = new StringBuilder("\"");
        foreach (char c in s)
        {
            if (c is '"' or '\\')
                sb.Append('\\').Append(c);
            else if (c < ' ' || char.IsSurrogate(c))
                sb.Append("\\u").Append(((int)c).ToString("x4", CultureInfo.InvariantCulture));
            else
                sb.Append(c);
        }
        return sb.Append('"').ToString();
    }

    private static string Show(string s) => s.Length > 24 ? s[..24] + "…" : s.Replace("\n", "\\n", StringComparison.Ordinal).Replace("\0", "\\0", StringComparison.Ordinal);
}
