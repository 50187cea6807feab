using System.Text.RegularExpressions;
using HandLine.Model;

namespace HandLine.Tests;

public sealed class LayeringTests
{
    [Fact]
    public void TheRuntimeLibraryDoesNotDependOnFontRenderingOrTraining()
    {
        // transcribe loads HandLine.Core only; synthesis (SkiaSharp) and the trainer live in HandLine.Training.
        var references = typeof(LineModel).Assembly.GetReferencedAssemblies().Select(a => a.Name).ToArray();
        Assert.DoesNotContain("SkiaSharp", references);
        Assert.DoesNotContain("HandLine.Training", references);
        Assert.DoesNotContain(typeof(LineModel).Assembly.GetTypes(), t => t.Namespace is "HandLine.Synthesis" or "HandLine.Training");
    }

    /// <summary>The library's folders in the order an image goes through them (DEVELOPERS.md, "Layout").</summary>
    private static readonly string[] StageOrder =
        ["Formats", "Imaging", "Layout", "Features", "Model", "Language", "Decoding", "Recognition", "Batch", "Scoring", "Calibration", "Proof", "Review"];

    [Fact]
    public void EachFolderOfTheLibraryUsesOnlyTheFoldersBeforeIt()
    {
        // So a newcomer can follow one image from file to report in one direction. Doc comments may point anywhere.
        var root = Path.Combine(TestPaths.RepoRoot, "src", "HandLine");
        var folders = Directory.GetDirectories(root).Select(Path.GetFileName).Where(f => f is not ("bin" or "obj")).ToArray();
        Assert.Equal(StageOrder.Order(StringComparer.Ordinal), folders.Order(StringComparer.Ordinal));
        var reference = new Regex(@"\bHandLine\.(?<folder>[A-Z][A-Za-z]*)\b");
        var problems = new List<string>();
        for (var i = 0; i < StageOrder.Length; i++)
            foreach (var file in Directory.EnumerateFiles(Path.Combine(root, StageOrder[i]), "*.cs", SearchOption.AllDirectories))
                foreach (var line in File.ReadLines(file).Where(l => !l.TrimStart().StartsWith("//", StringComparison.Ordinal)))
                    foreach (Match m in reference.Matches(line))
                        if (Array.IndexOf(StageOrder, m.Groups["folder"].Value) > i)
                            problems.Add($"{Path.GetRelativePath(root, file)}: {line.Trim()}");
        Assert.Empty(problems);
    }
}
