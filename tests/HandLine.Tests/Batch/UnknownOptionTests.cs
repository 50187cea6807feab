using System.Diagnostics;

namespace HandLine.Tests.Batch;

/// <summary>A mistyped option must stop a command before it starts work, not be taken for an input.</summary>
public sealed class UnknownOptionTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-unknown-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    public static TheoryData<string> Commands() =>
        ["transcribe", "score", "synth", "train", "merge", "bench", "bench-batch", "lm", "words", "calibrate", "bench-decode", "tune-decode", "sample", "review", "correct"];

    [Theory]
    [MemberData(nameof(Commands))]
    public void EveryCommandRefusesAnUnknownOptionAndWritesNothing(string command)
    {
        var outDir = Path.Combine(_dir, "out");
        var (code, _, stderr) = CommandLineTests.Run(command, Path.Combine(TestPaths.Fixtures, "demo", "lines.tsv"), "--no-such-option", "--out", outDir);
        Assert.Equal(2, code);
        Assert.Contains("unknown option '--no-such-option'", stderr);
        Assert.Contains($"handline {command} --help", stderr);
        Assert.False(Path.Exists(outDir), "the command started work");
    }

    [Fact]
    public void AMisspeltOptionGetsTheNearestRealOne()
    {
        var outDir = Path.Combine(_dir, "out");
        var (code, _, stderr) = CommandLineTests.Run("transcribe", Path.Combine(TestPaths.Fixtures, "demo", "lines.tsv"), "--flag-belw", "0.5", "--out", outDir);
        Assert.Equal(2, code);
        Assert.Contains("did you mean '--flag-below'?", stderr);
        Assert.False(Path.Exists(outDir));
    }

    [Fact]
    public async Task AFileWhoseNameBeginsWithADashIsReadAfterTheSeparator()
    {
        File.Copy(Path.Combine(TestPaths.Fixtures, "demo", "ledger-01.png"), Path.Combine(_dir, "-odd.png"));
        var psi = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, WorkingDirectory = _dir };
        foreach (var a in new[] { Path.Combine(AppContext.BaseDirectory, "handline.dll"), "transcribe", "--out", "out", "--quiet", "--", "-odd.png" })
            psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        var stderr = p.StandardError.ReadToEndAsync();
        await p.StandardOutput.ReadToEndAsync();
        await p.WaitForExitAsync(new CancellationTokenSource(TimeSpan.FromMinutes(2)).Token);
        Assert.True(p.ExitCode == 0, await stderr);
        Assert.True(File.Exists(Path.Combine(_dir, "out", "-odd.txt")));
        Assert.Contains("\"source\":\"-odd.png\"", File.ReadAllText(Path.Combine(_dir, "out", "lines.jsonl")));
    }
}
