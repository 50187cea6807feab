using System.Globalization;
using System.Net;
using System.Security.Cryptography;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using HandLine.Proof;

namespace HandLine.Review;

/// <summary>
/// The editor's review page: one self-contained HTML file (styles and script inline, line images as data URIs,
/// nothing fetched) listing a run's flagged lines, lowest confidence first, each with its image, the machine text
/// with its doubtful characters marked, the beam's alternatives and a text box. Everything taken from the run goes
/// into a JSON block whose '&lt;', '&gt;' and '&amp;' are \u-escaped, and the script puts it on the page as text,
/// so a transcript or file name is shown, never run. The Content-Security-Policy allows the page's own script (by
/// its hash), inline styles and data: images, and nothing else.
/// </summary>
public static class ReviewPage
{
    /// <summary>Builds the page for the run in <paramref name="runDir"/>.</summary>
    /// <exception cref="InputException">The run's lines.jsonl is missing or not valid, or the images folder does not exist.</exception>
    public static ReviewPageContent Build(string runDir, ReviewOptions options)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(runDir);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        if (!Directory.Exists(options.ImagesRoot))
            throw new InputException(options.ImagesRoot, "review", "no such images folder (--images)");

        var records = RunRecords.Read(runDir);
        var picked = options.Pick is { } pick
            ? LinePicker.Pick(LinePicker.ReadCandidates(runDir), pick, options.Seed).Select(c => (c.Source, c.Line)).ToHashSet()
            : null;
        var chosen = records.Where(r => picked?.Contains((r.Source, r.Line)) ?? (options.All || r.Flagged))
            .OrderBy(r => r.Confidence).ThenBy(r => r.Source, StringComparer.Ordinal).ThenBy(r => r.Line)
            .ToArray();

        // Pages are cut once each: walk the chosen lines in source order, then show them in confidence order.
        var images = new LineImages(options.ImagesRoot, records);
        var uris = new Dictionary<RunRecord, string?>(ReferenceEqualityComparer.Instance);
        var wholePages = new HashSet<RunRecord>(ReferenceEqualityComparer.Instance);
        foreach (var r in chosen.OrderBy(r => r.Source, StringComparer.Ordinal).ThenBy(r => r.Line))
        {
            var image = images.Find(r);
            uris[r] = image is null ? null : ReviewImages.DataUri(image);
            if (image?.WholePage == true)
                wholePages.Add(r);
        }

        var data = new JsonObject
        {
            ["key"] = "handline-review:" + StorageKey(records),
            ["lines"] = new JsonArray(chosen.Select(r => (JsonNode)Line(r, uris[r], wholePages.Contains(r), options.DoubtBelow)).ToArray()),
        };
        var runName = Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(runDir)));
        var html = Html(runName, chosen.Length, records.Count, options.All ? "all lines" : picked is not null ? "the lines worth correcting first" : "the flagged lines", Island(data.ToJsonString(DataJson)));
        return new ReviewPageContent(html, chosen.Length, records.Count, chosen.Count(r => uris[r] is null));
    }

    // Relaxed, so that base64 and non-ASCII text stay short; '<', '>' and '&' are \u-escaped after (see Island).
    private static readonly JsonSerializerOptions DataJson = new() { Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping };

    /// <summary>
    /// JSON that cannot end or disturb the script block holding it: these three characters occur only inside JSON
    /// strings, where their \u escapes mean the same.
    /// </summary>
    private static string Island(string json) =>
        json.Replace("<", "\\u003C", StringComparison.Ordinal).Replace(">", "\\u003E", StringComparison.Ordinal).Replace("&", "\\u0026", StringComparison.Ordinal);

    private static JsonObject Line(RunRecord r, string? image, bool wholePage, double doubtBelow)
    {
        var alternatives = (r.Fields["alternatives"] as JsonArray ?? [])
            .Select(a => a is JsonObject o && o["text"] is JsonValue v && v.TryGetValue<string>(out var t) ? t : null)
            .Where(t => t is not null && t != r.Text)
            .Distinct(StringComparer.Ordinal)
            .Take(ReviewOptions.MaxAlternatives)
            .Select(t => (JsonNode)JsonValue.Create(t)!)
            .ToArray();
        return new JsonObject
        {
            ["s"] = r.Source,
            ["l"] = r.Line,
            ["t"] = r.Text,
            ["m"] = r.MachineText,
            ["c"] = Math.Round(r.Confidence, 4),
            ["d"] = Doubts(r, doubtBelow),
            ["a"] = new JsonArray(alternatives),
            ["img"] = image,
            ["w"] = wholePage,
            ["x"] = r.Corrected,
        };
    }

    /// <summary>
    /// The text's characters, each with whether it is doubtful, or null when the per-character confidences do not
    /// spell the current text (a corrected line): then the text is shown unmarked.
    /// </summary>
    private static JsonArray? Doubts(RunRecord r, double doubtBelow)
    {
        if (r.Fields["chars"] is not JsonArray chars)
            return null;
        var symbols = new List<(string Symbol, bool Doubtful)>();
        foreach (var c in chars)
        {
            if (c is not JsonObject o || o["char"] is not JsonValue s || !s.TryGetValue<string>(out var symbol)
                || o["confidence"] is not JsonValue v || !v.TryGetValue<double>(out var confidence))
                return null;
            symbols.Add((symbol, confidence < doubtBelow));
        }
        if (!string.Concat(symbols.Select(s => s.Symbol)).Equals(r.Text, StringComparison.Ordinal))
            return null;
        return new JsonArray(symbols.Select(s => (JsonNode)new JsonArray(JsonValue.Create(s.Symbol), JsonValue.Create(s.Doubtful ? 1 : 0))).ToArray());
    }

    /// <summary>
    /// Names the page's saved work in the browser: the same run (its lines and machine texts) gives the same key,
    /// so a page written again, or with --all, finds the work already done.
    /// </summary>
    private static string StorageKey(IReadOnlyList<RunRecord> records)
    {
        var text = new StringBuilder();
        foreach (var r in records)
            text.Append(r.Source).Append('\0').Append(r.Line.ToString(CultureInfo.InvariantCulture)).Append('\0').Append(r.MachineText).Append('\n');
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16];
    }

    private static string Html(string runName, int shown, int runLines, string which, string json)
    {
        var html = new StringBuilder();
        html.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            // Only the page's own script runs (by its hash) and nothing is fetched: the page holds others' text.
            .Append("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'; script-src ")
            .Append(ReviewScript.CspHash).Append("\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<title>Review: ").Append(E(runName)).Append("</title>\n<style>").Append(Style).Append("</style>\n</head>\n<body>\n")
            .Append("<header>\n<h1>Review: <span id=\"run-name\">").Append(E(runName)).Append("</span></h1>\n")
            .Append(CultureInfo.InvariantCulture, $"<p>{shown} of the run's {runLines} lines ({which}), lowest confidence first. Your work is kept in this browser as you go; <strong>Export corrections</strong> saves it as a file for <code>handline correct</code>.</p>\n")
            .Append("<div class=\"bar\"><span id=\"progress\" role=\"status\" aria-live=\"polite\"></span> <button type=\"button\" id=\"export\">Export corrections <kbd>d</kbd></button></div>\n")
            .Append("<details id=\"keys\" open>\n<summary>Keys</summary>\n<dl>\n")
            .Append("<dt><kbd>j</kbd> or <kbd>↓</kbd></dt><dd>next line</dd>\n")
            .Append("<dt><kbd>k</kbd> or <kbd>↑</kbd></dt><dd>previous line</dd>\n")
            .Append("<dt><kbd>a</kbd></dt><dd>accept the text as it is, go on</dd>\n")
            .Append("<dt><kbd>1</kbd> <kbd>2</kbd> <kbd>3</kbd></dt><dd>take alternative 1, 2 or 3, go on</dd>\n")
            .Append("<dt><kbd>e</kbd> or <kbd>Enter</kbd></dt><dd>edit the text; in the box <kbd>Enter</kbd> keeps it and goes on, <kbd>Esc</kbd> leaves the box</dd>\n")
            .Append("<dt><kbd>x</kbd></dt><dd>mark the line illegible, go on</dd>\n")
            .Append("<dt><kbd>u</kbd></dt><dd>undo: the line is unchecked again</dd>\n")
            .Append("<dt><kbd>d</kbd></dt><dd>export the corrections (a TSV file)</dd>\n")
            .Append("</dl>\n</details>\n")
            .Append("<p class=\"legend\">Doubtful characters (the machine's confidence below the threshold) are <mark class=\"doubt\">underlined and boxed</mark>; a doubtful space shows as ␣.</p>\n")
            .Append("</header>\n<main id=\"lines\" aria-label=\"Lines to check\"></main>\n")
            .Append("<script type=\"application/json\" id=\"review-data\">").Append(json).Append("</script>\n")
            .Append("<script>").Append(ReviewScript.Text).Append("</script>\n</body>\n</html>\n");
        return html.ToString();
    }

    private static string E(string text) => WebUtility.HtmlEncode(text);

    private const string Style = """
        body{font-family:system-ui,sans-serif;max-width:1100px;margin:1em auto;padding:0 1em;color:#111;line-height:1.4}
        h1{font-size:1.4em;margin:.2em 0}header{border-bottom:1px solid #ccc;padding-bottom:.5em}
        .bar{position:sticky;top:0;background:#fff;padding:.3em 0;z-index:1}#progress{font-weight:bold}
        kbd{border:1px solid #888;border-radius:3px;padding:0 .3em;font-family:monospace;background:#f6f6f6}
        dl{display:grid;grid-template-columns:max-content 1fr;gap:.1em 1em;margin:.3em 0}dd{margin:0}dt{text-align:right}
        .line{border:2px solid #ddd;border-radius:6px;padding:.5em .8em;margin:.8em 0}
        .line.current{border-color:#1f5fbf;box-shadow:0 0 0 3px #c7dbff}
        .line[data-status=accepted],.line[data-status=picked],.line[data-status=corrected]{border-left:8px solid #1a7f37}
        .line[data-status=illegible]{border-left:8px dashed #9a6700}
        .meta{font-size:.9em;color:#333}.source{word-break:break-all}.status{font-weight:bold;margin-left:.5em}
        .line-image{max-width:100%;height:auto;min-height:1.5em;border:1px solid #ddd;display:block;margin:.3em 0}
        .machine{font-family:monospace;font-size:1.15em;white-space:pre-wrap;margin:.3em 0}
        .who{display:inline-block;width:5.5em;color:#555;font-family:system-ui,sans-serif;font-size:.85em}
        mark.doubt{background:#ffe9a8;color:inherit;text-decoration:underline;text-decoration-thickness:3px;text-underline-offset:3px;outline:1px solid #9a6700}
        .alts{margin:.2em 0;padding-left:0;list-style:none;display:flex;flex-wrap:wrap;gap:.3em 1em}
        .alt{font-family:monospace;font-size:1em;white-space:pre-wrap}
        .edit-label{display:flex;gap:.5em;align-items:center;color:#555;font-size:.85em}
        .edit{flex:1;font-family:monospace;font-size:1.15em;resize:vertical}
        .note,.noimage{color:#9a6700;font-size:.9em}
        """;
}
