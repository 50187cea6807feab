using System.Text.Json;

namespace HandLine.Synthesis;

/// <summary>One line of a <see cref="TextMixture"/> and the source it came from.</summary>
public sealed record MixedText(string Text, TextSource Source)
{
    /// <summary>The source as written in degradations.jsonl: "phrase", "words", "capitals" ...</summary>
    public string SourceName => NameOf(Source);

    public static string NameOf(TextSource source) => JsonNamingPolicy.CamelCase.ConvertName(source.ToString());
}
