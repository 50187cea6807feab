using System.CommandLine;
using System.Text.RegularExpressions;
using HandLine.Cli.Commands;

namespace HandLine.Tests.Docs;

/// <summary>
/// Docs that cannot rot: every documented command line parses with the CLI's own command tree, every command
/// and option of that tree is in the command reference, and every relative link leads to a file (and heading).
/// </summary>
public sealed partial class DocumentationTests
{
    private static readonly Lazy<IReadOnlyList<MarkdownFile>> Files = new(() =>
    {
        var root = TestPaths.RepoRoot;
        var docs = Path.Combine(root, "docs");
        return new[] { Path.Combine(root, "README.md") }
            .Concat(Directory.EnumerateFiles(docs, "*.md", SearchOption.AllDirectories).Order(StringComparer.Ordinal))
            .Select(p => new MarkdownFile(p, root))
            .ToList();
    });

    [Fact]
    public void EveryDocumentedCommandAndOptionExists()
    {
        var commands = Files.Value.SelectMany(DocumentedCommand.Find).ToList();
        // A parser that found nothing would pass trivially; the docs hold dozens of command lines.
        Assert.True(commands.Count >= 40, $"only {commands.Count} documented command lines found");
        var problems = commands.Select(c => (Command: c, Problem: Problem(c.Arguments)))
            .Where(p => p.Problem is not null)
            .Select(p => $"{p.Command}\n    -> {p.Problem}")
            .ToList();
        Assert.True(problems.Count == 0, "documented commands that the CLI does not accept:\n" + string.Join("\n", problems));
    }

    [Fact]
    public void EveryCommandIsShownInUseSomewhere()
    {
        var used = Files.Value.SelectMany(DocumentedCommand.Find).Select(c => c.Arguments[0]).ToHashSet(StringComparer.Ordinal);
        var missing = CommandTree.Build().Subcommands.Select(c => c.Name).Where(n => !used.Contains(n)).ToList();
        Assert.True(missing.Count == 0, "commands never shown in a documented command line: " + string.Join(", ", missing));
    }

    [Fact]
    public void TheCommandReferenceListsEveryCommandAndOption()
    {
        var reference = Files.Value.Single(f => f.RelativePath == "docs/commands.md");
        var sections = Sections(reference);
        var missing = new List<string>();
        foreach (var command in CommandTree.Build().Subcommands)
        {
            if (!sections.TryGetValue(command.Name, out var text))
            {
                missing.Add($"no section '## {command.Name}'");
                continue;
            }
            missing.AddRange(command.Options
                .Where(o => o.Name != "--help")
                .Where(o => !text.Contains($"`{o.Name}", StringComparison.Ordinal))
                .Select(o => $"{command.Name} {o.Name}"));
        }
        Assert.True(missing.Count == 0, "docs/commands.md lacks: " + string.Join(", ", missing));
    }

    [Fact]
    public void EveryRelativeLinkLeadsToAFileAndHeading()
    {
        var byPath = Files.Value.ToDictionary(f => Path.GetFullPath(f.Path), StringComparer.Ordinal);
        var problems = new List<string>();
        var links = 0;
        foreach (var file in Files.Value)
            foreach (var line in file.Prose)
                foreach (Match m in Link().Matches(InlineCode().Replace(line.Text, "")))
                {
                    var target = m.Groups[1].Value;
                    if (Scheme().IsMatch(target)) continue;
                    links++;
                    var hash = target.IndexOf('#');
                    var path = hash < 0 ? target : target[..hash];
                    var anchor = hash < 0 ? "" : target[(hash + 1)..];
                    var full = path.Length == 0 ? Path.GetFullPath(file.Path) : Path.GetFullPath(Path.Combine(Path.GetDirectoryName(file.Path)!, Uri.UnescapeDataString(path)));
                    if (!File.Exists(full) && !Directory.Exists(full))
                        problems.Add($"{file.RelativePath}:{line.Number}: '{target}' leads to no file");
                    else if (anchor.Length > 0)
                    {
                        var linked = byPath.GetValueOrDefault(full) ?? (full.EndsWith(".md", StringComparison.Ordinal) ? new MarkdownFile(full, TestPaths.RepoRoot) : null);
                        if (linked is not null && !linked.Anchors.Contains(anchor))
                            problems.Add($"{file.RelativePath}:{line.Number}: '{target}' names no heading of {linked.RelativePath}");
                    }
                }
        Assert.True(links >= 20, $"only {links} relative links found");
        Assert.True(problems.Count == 0, string.Join("\n", problems));
    }

    [Theory]
    [InlineData("handline transcribe scans/ --out out --flag-belw 0.5", "transcribe", "--flag-belw")]
    [InlineData("dotnet run --project src/HandLine.Cli -- score --truth t.tsv --run r --jsn && handline merge a b --out c", "score", "--jsn")]
    [InlineData("handline transcribe a \\\n  --out b \\\n  --sard 0/2", "transcribe", "--sard")]
    [InlineData("sbatch --wrap 'handline merge runs/shard-* --out m --qiet'", "merge", "--qiet")]
    [InlineData("sbatch --wrap '/shared/apps/handline/handline merge runs/shard-* --out m --qiet'", "merge", "--qiet")]
    [InlineData("handline transcrib scans/ --out out", "transcrib", null)]
    public void AMisspeltCommandOrOptionIsCaught(string block, string command, string? option)
    {
        var dir = Directory.CreateTempSubdirectory("hl-docs-").FullName;
        try
        {
            var path = Path.Combine(dir, "page.md");
            File.WriteAllText(path, $"Text.\n\n```sh\n{block}\n```\n\nPlanned:\n\n```sh\n# planned: not yet a command\nhandline no-such-command --out x\n```\n");
            var found = DocumentedCommand.Find(new MarkdownFile(path, dir)).ToList();
            var bad = found.Select(c => Problem(c.Arguments)).Where(p => p is not null).ToList();
            var problem = Assert.Single(bad);
            Assert.Contains(option ?? command, problem);
            Assert.DoesNotContain(found, c => c.Arguments[0] == "no-such-command");
        }
        finally { Directory.Delete(dir, recursive: true); }
    }

    [Fact]
    public void ContinuedAndFoldedLinesAreReadAsOneCommand()
    {
        var dir = Directory.CreateTempSubdirectory("hl-docs-").FullName;
        try
        {
            var path = Path.Combine(dir, "page.md");
            File.WriteAllText(path, "```yaml\nargs:\n  - >-\n    handline transcribe /data/scans\n    --out /data/runs/shard-$I\n    --shard $I/8 --threads 1\n```\n"
                                    + "Inline: `handline score --truth t.tsv --run r --json`, not `handline COMMAND --help`.\n");
            var found = DocumentedCommand.Find(new MarkdownFile(path, dir)).ToList();
            Assert.Equal(2, found.Count);
            Assert.Equal(["transcribe", "/data/scans", "--out", "/data/runs/shard-$I", "--shard", "$I/8", "--threads", "1"], found[0].Arguments);
            Assert.Equal(["score", "--truth", "t.tsv", "--run", "r", "--json"], found[1].Arguments);
            Assert.All(found, c => Assert.Null(Problem(c.Arguments)));
        }
        finally { Directory.Delete(dir, recursive: true); }
    }

    /// <summary>Why the CLI would refuse these arguments as a command line (unknown command or option), or null.</summary>
    private static string? Problem(IReadOnlyList<string> arguments)
    {
        // The parse only: missing files and missing required options are not the docs' concern here.
        var parse = CommandTree.Build().Parse(arguments);
        if (parse.CommandResult.Command is RootCommand && !arguments.Any(a => a is "--help" or "-h" or "-?" or "--version"))
            return $"no command '{arguments[0]}'";
        if (UnknownOptions.Check(parse) is { } unknown) return unknown;
        return parse.UnmatchedTokens.Count > 0 ? "not accepted: " + string.Join(" ", parse.UnmatchedTokens) : null;
    }

    /// <summary>The text under each "## name" heading of a page, up to the next heading of that level.</summary>
    private static Dictionary<string, string> Sections(MarkdownFile file)
    {
        var text = File.ReadAllText(file.Path);
        return SectionHeading().Matches(text).ToDictionary(
            m => m.Groups[1].Value,
            m => text[m.Index..(m.NextMatch().Success ? m.NextMatch().Index : text.Length)],
            StringComparer.Ordinal);
    }

    [GeneratedRegex(@"^## `?([a-z-]+)`?\s*$", RegexOptions.Multiline)]
    private static partial Regex SectionHeading();

    [GeneratedRegex(@"!?\[[^\]]*\]\(\s*<?([^)\s>]+)>?(?:\s+""[^""]*"")?\s*\)")]
    private static partial Regex Link();

    [GeneratedRegex(@"`[^`]*`")]
    private static partial Regex InlineCode();

    [GeneratedRegex(@"^[a-zA-Z][a-zA-Z0-9+.-]*:")]
    private static partial Regex Scheme();
}
