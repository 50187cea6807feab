using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using HandLine.Recognition;

namespace HandLine.Batch;

/// <summary>
/// The run's report files, streamed to temporary files as sources complete and renamed into place by
/// <see cref="Complete"/>; until then no report exists under its final name.
/// </summary>
internal sealed class RunReports : IDisposable
{
    public static readonly JsonSerializerOptions JsonLine = new()
    {
        // Keep transcripts readable (£, ½, accents) rather than \u-escaped.
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    /// <summary>lines.csv's first line.</summary>
    internal const string CsvHeader = "source,line,text,confidence,flagged,deskew_deg,slant_deg,rotation_deg";

    private readonly string _dir;
    private readonly (string Final, string Temp, StreamWriter Writer)[] _files;

    public RunReports(string dir)
    {
        _dir = dir;
        _files = new[] { "lines.jsonl", "lines.csv", "errors.jsonl" }.Select(name =>
        {
            var final = Path.Combine(dir, name);
            var temp = AtomicFile.TempPathFor(final);
            return (final, temp, new StreamWriter(temp, false, new UTF8Encoding(false)) { NewLine = "\n" });
        }).ToArray();
        Csv.WriteLine(CsvHeader);
    }

    private StreamWriter Jsonl => _files[0].Writer;
    private StreamWriter Csv => _files[1].Writer;
    private StreamWriter Errors => _files[2].Writer;

    public void Add(IReadOnlyList<LineResult> lines)
    {
        foreach (var r in lines)
        {
            var record = new Dictionary<string, object>
            {
                ["source"] = r.Source,
                ["line"] = r.Line,
                ["text"] = r.Text,
                ["confidence"] = Math.Round(r.Confidence, 4),
                ["flagged"] = r.Flagged,
                ["chars"] = r.Chars.Select(c => new Dictionary<string, object>
                {
                    ["char"] = c.Symbol,
                    ["confidence"] = Math.Round(c.Confidence, 4),
                }).ToArray(),
                ["deskew_deg"] = Math.Round(r.DeskewDegrees, 2),
                ["slant_deg"] = Math.Round(r.SlantDegrees, 2),
                ["rotation_deg"] = r.RotationDegrees,
            };
            if (r.Layout is not null) record["layout"] = r.Layout;
            if (r.Box is not null) record["box"] = r.Box;
            if (r.Column is not null) record["column"] = r.Column;
            if (r.Entry is not null) record["entry"] = r.Entry;
            if (r.Alternatives.Count > 0)
            {
                record["alternatives"] = r.Alternatives.Select(a => new Dictionary<string, object>
                {
                    ["text"] = a.Text,
                    ["score"] = Math.Round(a.Score, 4),
                    ["share"] = Math.Round(a.Share, 4),
                }).ToArray();
            }
            if (r.MachineText is not null)
            {
                // The fields, and their order, that 'correct' gives a checked line.
                record["machine_text"] = r.MachineText;
                record["corrected"] = true;
                record["illegible"] = r.Illegible ?? false;
            }
            Jsonl.WriteLine(JsonSerializer.Serialize(record, JsonLine));
            Csv.WriteLine(string.Join(',',
                CsvField(r.Source), r.Line.ToString(CultureInfo.InvariantCulture), CsvField(r.Text),
                Math.Round(r.Confidence, 4).ToString(CultureInfo.InvariantCulture), r.Flagged ? "true" : "false",
                Math.Round(r.DeskewDegrees, 2).ToString(CultureInfo.InvariantCulture),
                Math.Round(r.SlantDegrees, 2).ToString(CultureInfo.InvariantCulture),
                r.RotationDegrees.ToString(CultureInfo.InvariantCulture)));
        }
    }

    public void AddError(InputException e) =>
        Errors.WriteLine(JsonSerializer.Serialize(new Dictionary<string, string>
        {
            ["path"] = e.Path, ["stage"] = e.Stage, ["reason"] = e.Reason,
        }, JsonLine));

    /// <summary>Closes the streams and moves every report into place, the summary last.</summary>
    public void Complete(RunSummary summary)
    {
        foreach (var f in _files)
        {
            f.Writer.Dispose();
            File.Move(f.Temp, f.Final, overwrite: true);
        }
        AtomicFile.WriteAllText(Path.Combine(_dir, "summary.json"), summary.ToJson());
    }

    public void Dispose()
    {
        foreach (var f in _files)
        {
            f.Writer.Dispose();
            if (File.Exists(f.Temp)) File.Delete(f.Temp);
        }
    }

    /// <summary>RFC 4180 quoting; a leading formula character is defused so spreadsheets show text, not a formula.</summary>
    internal static string CsvField(string value)
    {
        if (value.Length > 0 && "=+-@".Contains(value[0]) && !double.TryParse(value, NumberStyles.Float, CultureInfo.InvariantCulture, out _))
            value = "'" + value;
        return value.IndexOfAny([',', '"', '\n', '\r']) >= 0 ? "\"" + value.Replace("\"", "\"\"") + "\"" : value;
    }
}
