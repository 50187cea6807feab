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
    /// One JSON object with snake_case keys: totals (cer, wer, lines, chars, words, character and word
    /// S/D/I, missing_lines) and a per_line array in input order. A missing hypothesis is null.
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
