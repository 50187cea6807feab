using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;

namespace HandLine.Scoring;

/// <summary>Writes a <see cref="ScoreReport"/> as a plain-text summary and table, or as JSON.</summary>
public static class ScoreReportWriter
{
    private const int MaxIdWidth = 24;
    private const int TextWidth = 32;
    private const string MissingMark = "(missing)";

    /// <summary>
    /// Summary (CER, WER, counts), then up to <paramref name="maxRows"/> lines, worst first: highest CER,
    /// then largest distance, then id, so equal reports always print the same.
    /// </summary>
    public static void WriteText(TextWriter writer, ScoreReport report, int maxRows = 50)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(report);
        ArgumentOutOfRangeException.ThrowIfNegative(maxRows);
        var inv = CultureInfo.InvariantCulture;

        writer.WriteLine(string.Format(inv, "CER   {0,7:0.00} %  ({1} errors: {2} substitutions, {3} deletions, {4} insertions; {5} characters)",
            report.Cer * 100, report.CharCounts.Distance, report.Substitutions, report.Deletions, report.Insertions, report.Chars));
        writer.WriteLine(string.Format(inv, "WER   {0,7:0.00} %  ({1} errors: {2} substitutions, {3} deletions, {4} insertions; {5} words)",
            report.Wer * 100, report.WordCounts.Distance, report.WordSubstitutions, report.WordDeletions, report.WordInsertions, report.Words));
        writer.WriteLine(string.Format(inv, "Lines {0} ({1} missing)", report.Lines, report.MissingLines));
        foreach (var breakdown in report.Breakdowns)
            WriteBreakdown(writer, breakdown);
        if (maxRows == 0 || report.Lines == 0)
            return;

        var rows = WorstFirst(report).Take(maxRows).ToList();
        var idWidth = Math.Clamp(rows.Max(r => r.Id.Length), 2, MaxIdWidth);
        writer.WriteLine();
        writer.WriteLine(string.Format(inv, "{0,7}  {1,5}  {2}  {3}  {4}",
            "CER %", "Dist", "Id".PadRight(idWidth), "Truth".PadRight(TextWidth), "Hypothesis"));
        foreach (var line in rows)
        {
            writer.WriteLine(string.Format(inv, "{0,7:0.00}  {1,5}  {2}  {3}  {4}",
                line.Cer * 100,
                line.CharCounts.Distance,
                Cell(line.Id, idWidth).PadRight(idWidth),
                Cell(line.Truth, TextWidth).PadRight(TextWidth),
                line.Hypothesis is null ? MissingMark : Cell(line.Hypothesis, TextWidth)).TrimEnd());
        }
        if (report.Lines > rows.Count)
            writer.WriteLine(string.Format(inv, "... {0} more line(s) not shown", report.Lines - rows.Count));
    }

    /// <summary>
    /// One table per breakdown: each group's lines, reference characters, character errors, CER, words, word
    /// errors and WER; then the pooled row (the ungrouped totals), the plain mean of the groups' rates, and
    /// the worst group by CER.
    /// </summary>
    private static void WriteBreakdown(TextWriter writer, ScoreBreakdown breakdown)
    {
        var inv = CultureInfo.InvariantCulture;
        const string pooled = "Pooled";
        const string mean = "Mean of groups";
        var width = Math.Clamp(breakdown.Groups.Select(g => GroupLabel(g.Value).Length).Append(mean.Length).Max(), 5, MaxIdWidth);
        const string row = "{0}  {1,6}  {2,8}  {3,8}  {4,7:0.00}  {5,7}  {6,8}  {7,7:0.00}";
        writer.WriteLine();
        writer.WriteLine(string.Format(inv, "By {0} ({1} group(s))", breakdown.Key, breakdown.Groups.Count));
        writer.WriteLine(string.Format(inv, "{0}  {1,6}  {2,8}  {3,8}  {4,7}  {5,7}  {6,8}  {7,7}",
            "Group".PadRight(width), "Lines", "Chars", "Char err", "CER %", "Words", "Word err", "WER %"));
        foreach (var g in breakdown.Groups)
            writer.WriteLine(string.Format(inv, row, Cell(GroupLabel(g.Value), width).PadRight(width), g.Lines,
                g.CharCounts.TruthLength, g.CharCounts.Distance, g.Cer * 100, g.WordCounts.TruthLength, g.WordCounts.Distance, g.Wer * 100));
        writer.WriteLine(string.Format(inv, row, pooled.PadRight(width), breakdown.Lines,
            breakdown.CharCounts.TruthLength, breakdown.CharCounts.Distance, breakdown.Cer * 100,
            breakdown.WordCounts.TruthLength, breakdown.WordCounts.Distance, breakdown.Wer * 100));
        writer.WriteLine(string.Format(inv, "{0}  {1,6}  {2,8}  {3,8}  {4,7:0.00}  {5,7}  {6,8}  {7,7:0.00}",
            mean.PadRight(width), "", "", "", breakdown.MeanCer * 100, "", "", breakdown.MeanWer * 100));
        if (breakdown.Worst is { } worst)
            writer.WriteLine(string.Format(inv, "Worst {0}: {1} (CER {2:0.00} %, WER {3:0.00} %)",
                breakdown.Key, Cell(GroupLabel(worst.Value), MaxIdWidth), worst.Cer * 100, worst.Wer * 100));
    }

    private static string GroupLabel(string value) => value.Length == 0 ? "(empty)" : value;

    /// <summary>
    /// One JSON object with snake_case keys: totals (cer, wer, lines, chars, words, character and word
    /// S/D/I, missing_lines) and a per_line array in input order. A missing hypothesis is null. A report
    /// with breakdowns also has a "by" array: per key its groups, pooled counts, mean_cer, mean_wer and worst.
    /// </summary>
    public static string ToJson(ScoreReport report)
    {
        ArgumentNullException.ThrowIfNull(report);
        var options = new JsonWriterOptions
        {
            Indented = true,
            // The JSON goes to a file, never into HTML, so ledger text such as "£" and "é" stays readable.
            Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        };
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, options))
        {
            json.WriteStartObject();
            json.WriteNumber("cer", report.Cer);
            json.WriteNumber("wer", report.Wer);
            json.WriteNumber("lines", report.Lines);
            json.WriteNumber("chars", report.Chars);
            json.WriteNumber("words", report.Words);
            json.WriteNumber("substitutions", report.Substitutions);
            json.WriteNumber("deletions", report.Deletions);
            json.WriteNumber("insertions", report.Insertions);
            json.WriteNumber("word_substitutions", report.WordSubstitutions);
            json.WriteNumber("word_deletions", report.WordDeletions);
            json.WriteNumber("word_insertions", report.WordInsertions);
            json.WriteNumber("missing_lines", report.MissingLines);
            if (report.Breakdowns.Count > 0)
            {
                json.WriteStartArray("by");
                foreach (var breakdown in report.Breakdowns)
                    WriteBreakdown(json, breakdown);
                json.WriteEndArray();
            }
            json.WriteStartArray("per_line");
            foreach (var line in report.PerLine)
            {
                json.WriteStartObject();
                json.WriteString("id", line.Id);
                json.WriteNumber("cer", line.Cer);
                json.WriteNumber("wer", line.Wer);
                json.WriteNumber("distance", line.CharCounts.Distance);
                json.WriteNumber("substitutions", line.CharCounts.Substitutions);
                json.WriteNumber("deletions", line.CharCounts.Deletions);
                json.WriteNumber("insertions", line.CharCounts.Insertions);
                json.WriteNumber("chars", line.CharCounts.TruthLength);
                json.WriteNumber("word_distance", line.WordCounts.Distance);
                json.WriteNumber("words", line.WordCounts.TruthLength);
                json.WriteString("truth", line.Truth);
                json.WriteString("hypothesis", line.Hypothesis);
                json.WriteBoolean("missing", line.Missing);
                json.WriteEndObject();
            }
            json.WriteEndArray();
            json.WriteEndObject();
        }
        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    private static void WriteBreakdown(Utf8JsonWriter json, ScoreBreakdown breakdown)
    {
        json.WriteStartObject();
        json.WriteString("key", breakdown.Key);
        json.WriteStartArray("groups");
        foreach (var g in breakdown.Groups)
        {
            json.WriteStartObject();
            json.WriteString("value", g.Value);
            WriteCounts(json, g.Lines, g.CharCounts, g.WordCounts);
            json.WriteNumber("missing_lines", g.MissingLines);
            json.WriteEndObject();
        }
        json.WriteEndArray();
        json.WriteStartObject("pooled");
        WriteCounts(json, breakdown.Lines, breakdown.CharCounts, breakdown.WordCounts);
        json.WriteEndObject();
        json.WriteNumber("mean_cer", breakdown.MeanCer);
        json.WriteNumber("mean_wer", breakdown.MeanWer);
        if (breakdown.Worst is { } worst)
        {
            json.WriteStartObject("worst");
            json.WriteString("value", worst.Value);
            json.WriteNumber("cer", worst.Cer);
            json.WriteNumber("wer", worst.Wer);
            json.WriteEndObject();
        }
        else
        {
            json.WriteNull("worst");
        }
        json.WriteEndObject();
    }

    private static void WriteCounts(Utf8JsonWriter json, int lines, EditCounts chars, EditCounts words)
    {
        json.WriteNumber("lines", lines);
        json.WriteNumber("chars", chars.TruthLength);
        json.WriteNumber("char_errors", chars.Distance);
        json.WriteNumber("cer", ErrorRate.Of(chars));
        json.WriteNumber("words", words.TruthLength);
        json.WriteNumber("word_errors", words.Distance);
        json.WriteNumber("wer", ErrorRate.Of(words));
    }

    private static IEnumerable<LineScore> WorstFirst(ScoreReport report) =>
        report.PerLine
            .OrderByDescending(line => line.Cer)
            .ThenByDescending(line => line.CharCounts.Distance)
            .ThenBy(line => line.Id, StringComparer.Ordinal);

    /// <summary>
    /// Fits text into a column: control characters become spaces (a tab or newline would break the
    /// table) and long text is cut at a whole user-perceived character, ending in "…".
    /// </summary>
    private static string Cell(string text, int width)
    {
        var clean = new StringBuilder(text.Length);
        foreach (var c in text)
            clean.Append(char.IsControl(c) ? ' ' : c);
        var info = new StringInfo(clean.ToString());
        return info.LengthInTextElements <= width
            ? info.String
            : info.SubstringByTextElements(0, width - 1).TrimEnd() + "…";
    }
}
