using HandLine.Model;

namespace HandLine.Tests.Batch;

/// <summary><c>handline --version</c>: enough to trace a run to the install that made it (docs/install.md).</summary>
public sealed class VersionReportTests
{
    [Fact]
    public void VersionNamesTheCommitAndTheBundledModelId()
    {
        // The build copies models/*.hlm beside the executable; the id is the one every run records as model_id.
        using var bundled = ModelFile.Load(Path.Combine(TestPaths.RepoRoot, "models", "default.hlm"));
        using var cli = new CliProcess(["--version"]);
        var (code, output, error) = cli.WaitForExit();

        Assert.True(code == 0, error);
        var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        Assert.Equal(4, lines.Length);
        Assert.Matches(@"^handline \d+\.\d+\.\d+", lines[0]);
        // From .git at build time, or "unknown" for a tree built without it (build/SourceCommit.targets).
        Assert.Matches("^commit ([0-9a-f]{40}|unknown)$", lines[1]);
        Assert.Equal($"model {bundled.Id} (bundled default.hlm)", lines[2]);
        Assert.StartsWith("models ", lines[3]);
        foreach (var model in Directory.EnumerateFiles(Path.Combine(TestPaths.RepoRoot, "models"), "*.hlm"))
            Assert.Contains(Path.GetFileName(model), lines[3]);
    }
}
