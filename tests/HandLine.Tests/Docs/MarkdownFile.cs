using System.Text;
using System.Text.RegularExpressions;

namespace HandLine.Tests.Docs;

/// <summary>A line of a Markdown file with its 1-based number.</summary>
internal sealed record MarkdownLine(int Number, string Text);

/// <summary>A fenced code block: its info string and its lines (fences excluded).</summary>
internal sealed record CodeBlock(string Info, IReadOnlyList<MarkdownLine> Lines)
{
    /// <summary>
    /// The documented marker for a block of commands that do not exist yet: its first line is a comment
    /// starting "# planned:", which a reader sees too. Such blocks are not checked.
    /// </summary>
    public bool IsPlanned => Lines.Count > 0 && Lines[0].Text.TrimStart().StartsWith("# planned:", StringComparison.Ordinal);
}

/// <summary>
/// The parts of a Markdown file the documentation tests look at: fenced code blocks, the prose outside them
/// (for links and inline code) and the anchors its headings get.
/// </summary>
internal sealed partial class MarkdownFile
{
    public string Path { get; }
    public string RelativePath { get; }
    public IReadOnlyList<CodeBlock> CodeBlocks { get; }
    public IReadOnlyList<MarkdownLine> Prose { get; }
    public IReadOnlySet<string> Anchors { get; }

    public MarkdownFile(string path, string root)
    {
        Path = path;
        RelativePath = System.IO.Path.GetRelativePath(root, path).Replace('\\', '/');
        var lines = File.ReadAllLines(path);
        var blocks = new List<CodeBlock>();
        var prose = new List<MarkdownLine>();
        var anchors = new HashSet<string>(StringComparer.Ordinal);
        var headingCounts = new Dictionary<string, int>(StringComparer.Ordinal);
        List<MarkdownLine>? block = null;
        var info = "";
        var fence = "";
        for (var i = 0; i < lines.Length; i++)
        {
            var trimmed = lines[i].TrimStart();
            if (block is null && Fence().Match(trimmed) is { Success: true } open)
            {
                block = [];
                fence = open.Groups[1].Value;
                info = trimmed[fence.Length..].Trim();
                continue;
            }
            if (block is not null)
            {
                if (trimmed.StartsWith(fence, StringComparison.Ordinal) && trimmed.Trim().Trim(fence[0]).Length == 0)
                {
                    blocks.Add(new CodeBlock(info, block));
                    block = null;
                }
                else block.Add(new MarkdownLine(i + 1, lines[i]));
                continue;
            }
            prose.Add(new MarkdownLine(i + 1, lines[i]));
            if (Heading().Match(lines[i]) is { Success: true } heading)
            {
                var slug = Slug(heading.Groups[1].Value);
                var seen = headingCounts.GetValueOrDefault(slug);
                headingCounts[slug] = seen + 1;
                anchors.Add(seen == 0 ? slug : $"{slug}-{seen}");
            }
        }
        if (block is not null) throw new InvalidOperationException($"{RelativePath}: a code block is never closed");
        CodeBlocks = blocks;
        Prose = prose;
        Anchors = anchors;
    }

    /// <summary>
    /// The anchor a heading gets on GitHub: lower case, punctuation dropped (hyphens and underscores kept),
    /// spaces turned into hyphens; a repeated heading gets -1, -2... (GitHub's rule, recalled from memory).
    /// </summary>
    public static string Slug(string heading)
    {
        var sb = new StringBuilder();
        foreach (var c in heading.Trim().ToLowerInvariant())
        {
            if (char.IsLetterOrDigit(c) || c is '-' or '_') sb.Append(c);
            else if (c == ' ') sb.Append('-');
        }
        return sb.ToString();
    }

    [GeneratedRegex(@"^(`{3,}|~{3,})")]
    private static partial Regex Fence();

    [GeneratedRegex(@"^#{1,6}\s+(.*?)\s*#*\s*$")]
    private static partial Regex Heading();
}
