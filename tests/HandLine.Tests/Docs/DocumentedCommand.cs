using System.Text.RegularExpressions;

namespace HandLine.Tests.Docs;

/// <summary>One <c>handline ...</c> command line found in the documentation: where, as written, and its arguments.</summary>
internal sealed partial record DocumentedCommand(string File, int Line, string Text, IReadOnlyList<string> Arguments)
{
    public override string ToString() => $"{File}:{Line}: {Text}";

    /// <summary>
    /// Every command line in the file's code blocks (except blocks marked planned) and in its inline code spans
    /// that begin "handline " and a lower-case letter. Rules, also stated in DEVELOPERS.md: a line ending in
    /// "\" continues on the next; a line whose first word starts with "--" continues the line before (as in a
    /// folded YAML string); a command starts at the word "handline" (or a path ending "/handline", or
    /// "dotnet run --project src/HandLine.Cli --") followed by at least one word, and runs to the end of the
    /// line or a shell operator; a quoted word holding a whole command is read as one; "..." stands for
    /// arguments left out and is dropped.
    /// </summary>
    public static IEnumerable<DocumentedCommand> Find(MarkdownFile file)
    {
        ArgumentNullException.ThrowIfNull(file);
        foreach (var block in file.CodeBlocks.Where(b => !b.IsPlanned))
            foreach (var (line, text) in LogicalLines(block.Lines))
                foreach (var command in InLine(file.RelativePath, line, text))
                    yield return command;
        foreach (var line in file.Prose)
            foreach (Match span in InlineCommand().Matches(line.Text))
                foreach (var command in InLine(file.RelativePath, line.Number, span.Groups[1].Value))
                    yield return command;
    }

    private static IEnumerable<(int Line, string Text)> LogicalLines(IReadOnlyList<MarkdownLine> lines)
    {
        var result = new List<(int Line, string Text)>();
        var continues = false;
        foreach (var line in lines)
        {
            var text = line.Text.Trim();
            var joins = result.Count > 0 && (continues || text.StartsWith("--", StringComparison.Ordinal));
            continues = text.EndsWith('\\');
            if (continues) text = text[..^1];
            if (joins) result[^1] = (result[^1].Line, result[^1].Text + " " + text);
            else result.Add((line.Number, text));
        }
        return result;
    }

    private static IEnumerable<DocumentedCommand> InLine(string file, int line, string text)
    {
        var words = ShellWords.Split(text);
        for (var i = 0; i < words.Count; i++)
        {
            var w = words[i];
            if (w.IsOperator) continue;
            if (w.WasQuoted && HoldsCommand(w.Text))
            {
                foreach (var inner in InLine(file, line, w.Text)) yield return inner;
                continue;
            }
            var start = -1;
            if (w.Text == "handline" || w.Text.EndsWith("/handline", StringComparison.Ordinal)) start = i + 1;
            else if (w.Text == "dotnet" && Words(words, i + 1, 4) is ["run", "--project", var project, "--"]
                     && project.TrimEnd('/') == "src/HandLine.Cli") start = i + 5;
            if (start < 0) continue;
            var args = new List<string>();
            var end = start;
            for (; end < words.Count && !words[end].IsOperator; end++)
                if (words[end].Text is not ("..." or "…")) args.Add(words[end].Text);
            if (args.Count == 0) continue;
            yield return new DocumentedCommand(file, line, text, args);
            i = end - 1;
        }
    }

    /// <summary>A quoted word that is a whole command line: "handline merge ..." or "/opt/app/handline merge ...".</summary>
    private static bool HoldsCommand(string text)
    {
        var space = text.IndexOf(' ', StringComparison.Ordinal);
        if (space <= 0) return false;
        var first = text[..space];
        return first == "handline" || first.EndsWith("/handline", StringComparison.Ordinal);
    }

    private static string[] Words(IReadOnlyList<ShellWord> words, int from, int count) =>
        words.Skip(from).Take(count).Select(w => w.IsOperator ? "" : w.Text).ToArray();

    [GeneratedRegex(@"`(handline [a-z][^`]*)`")]
    private static partial Regex InlineCommand();
}
