using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Unicode;

namespace VoxProf.Reports.Html;

/// <summary>Escaping for text that goes into VoxProf's HTML pages: scene and camera names come from user files.</summary>
public static class HtmlText
{
    // Every Unicode range allowed through as itself ("×", "≥" stay readable); the HTML-significant characters are
    // always escaped by the encoder whatever the ranges.
    private static readonly HtmlEncoder Encoder = HtmlEncoder.Create(UnicodeRanges.All);

    private static readonly JsonSerializerOptions Json = new(JsonSerializerDefaults.Web)
    {
        // The default encoder escapes '<', '>' and '&', so no "</script>" can end the data block early.
        Encoder = JavaScriptEncoder.Default,
        TypeInfoResolver = Model.DocumentJson.Default,
    };

    /// <summary>Text content or an attribute value (the encoder escapes quotes too).</summary>
    public static string Encode(string text) => Encoder.Encode(text);

    /// <summary>A value as JSON that is safe inside a &lt;script type="application/json"&gt; element.</summary>
    public static string JsonData<T>(T value) => JsonSerializer.Serialize(value, Json);
}
