using System.Text.Json;
using System.Text.Json.Nodes;
using HandLine.Batch;

namespace HandLine.Tests.Batch;

public sealed class RunSummaryTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("hl-summary-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static RunSummary Sample(string? shard = "1/2", int lines = 3, int? beam = 8, double peak = 300.5) => RunSummary.Of(
        new BatchCounts(Sources: 4, Done: 3, Reused: 0, Lines: lines, Flagged: 1, Errors: 1, Cancelled: false),
        new RunSettings(0.64, "91a852143421", "/models/default.hlm", beam is null ? "greedy" : "beam", beam, null, null, null, null, null, beam is null ? null : 0),
        new DateTime(2026, 3, 1, 9, 30, 0, DateTimeKind.Utc), 2.5, shard, "562b69e1463a10f7", "0861e894a5ae959e", peak);

    [Fact]
    public void The_file_keeps_the_fields_and_order_it_had_as_a_dictionary_and_reads_back_to_the_same_record()
    {
        var summary = Sample();
        var path = Path.Combine(_dir, "summary.json");
        File.WriteAllText(path, summary.ToJson());

        var keys = JsonNode.Parse(File.ReadAllText(path))!.AsObject().Select(p => p.Key);
        Assert.Equal(
            ["sources", "sources_done", "lines", "flagged", "errors", "flag_below", "model_id", "model_path", "decoder", "beam",
             "lexicon", "lexicon_mode", "lexicon_weight", "lm", "lm_weight", "char_bonus", "started_utc", "elapsed_seconds",
             "lines_per_second", "cancelled", "shard", "options_hash", "inputs_hash", "peak_memory_mb"], keys);
        Assert.Contains("\"lines_per_second\": 1.2,", File.ReadAllText(path));
        Assert.Equal(summary, RunSummary.Read(path));
    }

    [Fact]
    public void A_summary_missing_a_field_is_refused_naming_the_file()
    {
        var node = Sample().ToJsonObject();
        node.Remove("inputs_hash");
        Assert.Throws<JsonException>(() => RunSummary.FromJson(node));
        var path = Path.Combine(_dir, "old.json");
        File.WriteAllText(path, node.ToJsonString());
        var e = Assert.Throws<InputException>(() => RunSummary.Read(path));
        Assert.Equal(path, e.Path);
    }

    [Fact]
    public void Merging_sums_counts_combines_measurements_and_names_each_field_that_differs()
    {
        var conflicts = new List<string>();
        var merged = SummaryMerge.Combine([("a", Sample("0/2", lines: 3, peak: 300)), ("b", Sample("1/2", lines: 5, peak: 410))], conflicts);
        Assert.Empty(conflicts);
        Assert.Equal((8, 8, 5.0, null), (merged.Sources, merged.Lines, merged.ElapsedSeconds, merged.Shard));
        Assert.Equal(410, merged.PeakMemoryMb);
        Assert.Equal(1.6, merged.LinesPerSecond);

        SummaryMerge.Combine([("a", Sample("0/2")), ("b", Sample("1/2", beam: null))], conflicts);
        Assert.Contains("b: summary field 'beam' is null, but 8 in a", conflicts);
        Assert.Contains("b: summary field 'decoder' is \"greedy\", but \"beam\" in a", conflicts);
    }
}
