using System.Diagnostics;
using System.Text.Json;

namespace HandLine.Tests.Batch;

/// <summary>The `handline` executable, run as a user would.</summary>
public sealed class CommandLineTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-cli-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    internal static (int Code, string Out, string Err) Run(params string[] args)
    {
        var psi = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true };
        psi.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "handline.dll"));
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(120_000)) { p.Kill(true); throw new TimeoutException("handline did not finish"); }
        return (p.ExitCode, stdout.Result, stderr.Result);
    }

    [Fact]
    public void ScoreReturnsTheHandComputedCer()
    {
        // Truth "Pd 7/6" vs hypothesis "Pd 7/8": 1 substitution in 6 characters; truth "Recd £1" vs "Rccd £l":
        // 2 substitutions in 7; a third line missing from the run counts as 5 deletions ("hay 2").
        // CER = (1 + 2 + 5) / (6 + 7 + 5) = 8 / 18, hand-computed from the Levenshtein definition.
        File.WriteAllText(Path.Combine(_dir, "truth.tsv"), "a.png\tPd 7/6\nb.png\tRecd £1\nc.png\thay 2\n");
        var run = Path.Combine(_dir, "run");
        Directory.CreateDirectory(run);
        File.WriteAllLines(Path.Combine(run, "lines.jsonl"),
        [
            JsonSerializer.Serialize(new { source = "a.png", line = 0, text = "Pd 7/8" }),
            JsonSerializer.Serialize(new { source = "b.png", line = 0, text = "Rccd £l" }),
        ]);

        var (code, stdout, stderr) = Run("score", "--truth", Path.Combine(_dir, "truth.tsv"), "--run", run, "--json");

        Assert.True(code == 0, stderr);
        using var json = JsonDocument.Parse(stdout);
        Assert.Equal(8 / 18.0, json.RootElement.GetProperty("cer").GetDouble(), 6);
        Assert.Equal(3, json.RootElement.GetProperty("substitutions").GetInt32());
        Assert.Equal(5, json.RootElement.GetProperty("deletions").GetInt32());
        Assert.Equal(0, json.RootElement.GetProperty("insertions").GetInt32());
        Assert.Equal(3, json.RootElement.GetProperty("lines").GetInt32());
        Assert.Equal(18, json.RootElement.GetProperty("chars").GetInt32());
    }

    [Fact]
    public void BadArgumentsAndBadFilesGiveTheDocumentedExitCodes()
    {
        Assert.Equal(2, Run("transcribe").Code); // missing INPUT and --out
        Assert.Equal(2, Run("transcribe", _dir, "--out", Path.Combine(_dir, "o"), "--shard", "4/4").Code);
        Assert.Equal(2, Run("transcribe", _dir, "--out", Path.Combine(_dir, "o"), "--model", Path.Combine(_dir, "none.hlm")).Code);
        Assert.Equal(2, Run("merge", Path.Combine(_dir, "no-run"), "--out", Path.Combine(_dir, "m")).Code);
        var (code, _, err) = Run("score", "--truth", Path.Combine(_dir, "none.tsv"), "--run", _dir);
        Assert.Equal(2, code);
        Assert.Contains("none.tsv", err);
    }

    [Fact]
    public void ACleanRunExitsWithZero()
    {
        var scans = BatchTestSupport.DemoCopies(_dir, 2);
        var (code, _, err) = Run("transcribe", scans, "--out", Path.Combine(_dir, "out"), "--model", BatchTestSupport.SmallModel(_dir), "--threads", "1");
        Assert.True(code == 0, err);
        Assert.Contains("2 sources, 2 lines", err);
    }
}
