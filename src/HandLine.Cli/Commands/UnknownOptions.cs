using System.CommandLine;
using System.CommandLine.Parsing;
using System.Globalization;
using HandLine.Scoring;

namespace HandLine.Cli.Commands;

/// <summary>
/// Refuses a token that looks like an option but is none of the command's, before any work starts. The parser
/// would otherwise take <c>--layot</c> for an input path of a command that reads many inputs, and a batch of
/// thousands of scans would run with settings nobody asked for. A file whose name really begins with '-' goes
/// after <c>--</c>, where every token is an input.
/// </summary>
internal static class UnknownOptions
{
    /// <summary>The message for the first unknown option, or null when there is none.</summary>
    public static string? Check(ParseResult parse)
    {
        ArgumentNullException.ThrowIfNull(parse);
        foreach (var token in parse.Tokens)
        {
            if (token.Type == TokenType.DoubleDash) break;
            if (token.Type != TokenType.Argument || !LooksLikeOption(token.Value)) continue;
            var command = parse.CommandResult.Command;
            var name = command is RootCommand ? "handline" : $"handline {command.Name}";
            var suggestion = Nearest(token.Value.Split('=')[0], command);
            return $"unknown option '{token.Value}' for '{name}'"
                   + (suggestion is null ? "" : $" (did you mean '{suggestion}'?)")
                   + $"; see '{name} --help'. A file whose name begins with '-' can be given after '--'.";
        }
        return null;
    }

    // "-" alone is a common name for standard input, and a negative number is a value, not an option.
    private static bool LooksLikeOption(string value) =>
        value.Length > 1 && value[0] == '-'
        && !double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out _);

    /// <summary>The command's option name closest to <paramref name="typed"/>, if it is close enough to be a slip.</summary>
    private static string? Nearest(string typed, Command command)
    {
        var names = command.Options.SelectMany(o => o.Aliases.Prepend(o.Name)).Distinct(StringComparer.Ordinal);
        // At most a third of the typed name's letters wrong, and never more than 3 (common practice, no source).
        var allowed = Math.Min(3, Math.Max(1, typed.TrimStart('-').Length / 3));
        return names
            .Select(n => (Name: n, Distance: EditDistance.AlignCharacters(typed, n).Distance))
            .Where(c => c.Distance <= allowed)
            .OrderBy(c => c.Distance).ThenBy(c => c.Name, StringComparer.Ordinal)
            .Select(c => c.Name)
            .FirstOrDefault();
    }
}
