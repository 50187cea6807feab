using System.Text.Json;

namespace HandLine.Tests.Batch;

/// <summary>`handline bench --json` prints one object whose figures are all there and positive (no timing limits).</summary>
public sealed class BenchCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-bench-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void JsonParsesAndEveryFigureIsPositive()
    {
        var model = BatchTestSupport.SmallModel(_dir);
        var (code, stdout, stderr) = CommandLineTests.Run("bench", "--model", model, "--lines", "8", "--threads", "1", "--json");
        Assert.True(code == 0, stderr);
        using var json = JsonDocument.Parse(stdout);
        var f = json.RootElement;
        foreach (var name in new[]
                 {
                     "end_to_end_lines_per_s", "model_lines_per_s", "imaging_lines_per_s", "decode_share", "matmul_gflops",
                     "model_ceiling_share", "greedy_lines_per_s", "beam_lines_per_s", "naive_lines_per_s",
                     "network_mflop_per_line", "peak_memory_mb", "speedup_over_naive", "imaging_cpu_ms_per_line", "model_cpu_ms_per_line",
                     "end_to_end_cpu_ms_per_line",
                 })
            Assert.True(f.GetProperty(name).GetDouble() > 0, $"{name} is {f.GetProperty(name)}");
        Assert.Equal(8, f.GetProperty("lines").GetInt32());
        foreach (var batch in new[] { "1", "8", "16", "32" })
            Assert.True(f.GetProperty("model_lines_per_s_by_batch").GetProperty(batch).GetDouble() > 0);
    }
}
