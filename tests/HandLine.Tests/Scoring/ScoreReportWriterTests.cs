using System.Text.Json;
using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class ScoreReportWriterTests
{
    [Fact]
    public void Json_has_the_required_keys_and_values()
    {
        var json = ScoreReportWriter.ToJson(Scorer.Score(LedgerSample.Items));
        using var doc = JsonDocument.Parse(json);
        var root = doc.RootElement;

        Assert.Equal(20.0 / 73, root.GetProperty("cer").GetDouble(), 12);
        Assert.Equal(6.0 / 16, root.GetProperty("wer").GetDouble(), 12);
        Assert.Equal(3, root.GetProperty("lines").GetInt32());
        Assert.Equal(73, root.GetProperty("chars").GetInt32());
        Assert.Equal(16, root.GetProperty("words").GetInt32());
        Assert.Equal(1, root.GetProperty("substitutions").GetInt32());
        Assert.Equal(18, root.GetProperty("deletions").GetInt32());
        Assert.Equal(1, root.GetProperty("insertions").GetInt32());
        Assert.Equal(1, root.GetProperty("missing_lines").GetInt32());

        var perLine = root.GetProperty("per_line").EnumerateArray().ToArray();
        Assert.Equal(3, perLine.Length);
        Assert.Equal("p1-l2", perLine[1].GetProperty("id").GetString());
        Assert.Equal(2.0 / 25, perLine[1].GetProperty("cer").GetDouble(), 12);
        Assert.Equal(2, perLine[1].GetProperty("distance").GetInt32());
        Assert.Equal("Rent of Low Meadow 2 10 0", perLine[1].GetProperty("truth").GetString());
        Assert.Equal("Rent of Lcw Meadows 2 10 0", perLine[1].GetProperty("hypothesis").GetString());
        Assert.False(perLine[1].GetProperty("missing").GetBoolean());
        Assert.Equal(JsonValueKind.Null, perLine[2].GetProperty("hypothesis").ValueKind);
        Assert.True(perLine[2].GetProperty("missing").GetBoolean());
    }

    [Fact]
    public void Json_keeps_ledger_symbols_readable()
    {
        var json = ScoreReportWriter.ToJson(Scorer.Score([new ScoreItem("a", "£3 ½d", "£3 ½d")]));
        Assert.Contains("£3 ½d", json);
    }

    [Fact]
    public void Text_has_summary_then_worst_lines_first()
    {
        var output = WriteText(Scorer.Score(LedgerSample.Items));
        var lines = output.Split('\n');

        Assert.Contains("27.40 %", lines[0]); // 20 / 73 = 0.27397
        Assert.StartsWith("CER", lines[0]);
        Assert.Contains("37.50 %", lines[1]);
        Assert.StartsWith("WER", lines[1]);
        Assert.Contains("3", lines[2]);
        Assert.Contains("1 missing", lines[2]);

        // Worst first: p1-l3 (CER 100 %), p1-l2 (8 %), p1-l1 (3.2 %).
        var order = new[] { "p1-l3", "p1-l2", "p1-l1" }.Select(id => output.IndexOf(id, StringComparison.Ordinal)).ToArray();
        Assert.All(order, index => Assert.True(index > 0));
        Assert.True(order[0] < order[1] && order[1] < order[2], output);
        Assert.Contains("(missing)", output);
    }

    [Fact]
    public void Text_ties_break_by_distance_then_id()
    {
        // Same CER (100 %): the longer miss (distance 5) first; equal lines then by id.
        var output = WriteText(Scorer.Score(
        [
            new ScoreItem("b", "ab", null),
            new ScoreItem("a", "ab", null),
            new ScoreItem("c", "abcde", null),
        ]));
        var rows = output.Split('\n').Where(l => l.Contains("(missing)")).ToArray();
        Assert.Equal(3, rows.Length);
        Assert.Contains("  c ", rows[0]);
        Assert.Contains("  a ", rows[1]);
        Assert.Contains("  b ", rows[2]);
    }

    [Fact]
    public void Text_truncates_long_columns_and_rows()
    {
        var longTruth = "Received of the Widow Ashcombe for half a year's rent of the Mill Close due at Lady Day";
        var output = WriteText(Scorer.Score(
        [
            new ScoreItem("long", longTruth, "Received\tof the Widow"),
            new ScoreItem("ok", "Tithe", "Tithe"),
        ]), maxRows: 1);

        Assert.DoesNotContain(longTruth, output);
        Assert.Contains("Received of the Widow Ashcombe…", output);
        Assert.DoesNotContain("\t", output);
        Assert.DoesNotContain("Tithe", output);
        Assert.Contains("1 more line(s) not shown", output);
    }

    [Fact]
    public void Negative_row_limit_is_rejected()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() =>
            ScoreReportWriter.WriteText(TextWriter.Null, Scorer.Score([]), maxRows: -1));
    }

    private static string WriteText(ScoreReport report, int maxRows = 50)
    {
        using var writer = new StringWriter { NewLine = "\n" };
        ScoreReportWriter.WriteText(writer, report, maxRows);
        return writer.ToString();
    }
}
