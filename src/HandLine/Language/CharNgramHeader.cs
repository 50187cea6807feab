using System.Text.Json.Serialization;

namespace HandLine.Language;

/// <summary>The descriptive header of a character model file.</summary>
public sealed record CharNgramHeader(
    [property: JsonPropertyName("format_version")] int FormatVersion,
    [property: JsonPropertyName("order")] int Order,
    [property: JsonPropertyName("symbols")] string Symbols,
    [property: JsonPropertyName("discounts")] double[] Discounts,
    [property: JsonPropertyName("lines")] long Lines,
    [property: JsonPropertyName("sources")] string[] Sources,
    [property: JsonPropertyName("created_utc")] string CreatedUtc);
