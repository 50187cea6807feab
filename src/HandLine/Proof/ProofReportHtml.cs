using System.Globalization;
using System.Net;
using System.Text;
using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// The client's proof report: one self-contained HTML file (styles inline, plots as inline SVG, line images as data
/// URIs, no script, no font or file fetched) with the verdict and interval at the top, figures per group, the
/// confusion table, a histogram of per-line CER, confidence against error, and the worst lines beside their images.
/// Every figure carries its definition. Every text from a file (transcripts, machine text, file names, group
/// values) is HTML-escaped, so it is shown, never run.
/// </summary>
public static class ProofReportHtml
{
    /// <summary>Writes the page.</summary>
    /// <param name="lines">Image and confidence per line id; a line without an entry is shown without them.</param>
    /// <param name="worstRows">Worst lines shown with their images.</param>
    /// <param name="confusionRows">Rows of the confusion table.</param>
    public static string Write(ScoreReport report, ProofAnalysis analysis, string truthName, string runName,
        IReadOnlyDictionary<string, ReportLineSource> lines, int worstRows = 20, int confusionRows = 20)
    {
        ArgumentNullException.ThrowIfNull(report);
        ArgumentNullException.ThrowIfNull(analysis);
        ArgumentNullException.ThrowIfNull(truthName);
        ArgumentNullException.ThrowIfNull(runName);
        ArgumentNullException.ThrowIfNull(lines);
        ArgumentOutOfRangeException.ThrowIfNegative(worstRows);
        ArgumentOutOfRangeException.ThrowIfNegative(confusionRows);

        var html = new StringBuilder();
        html.Append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
            // No script may run, and nothing may be fetched: the page is read offline and holds others' text.
            .Append("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; style-src 'unsafe-inline'\">\n")
            .Append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
            .Append("<title>Proof report: ").Append(E(truthName)).Append("</title>\n<style>").Append(Style).Append("</style>\n</head>\n<body>\n");
        html.Append("<h1>Proof sample report</h1>\n");
        Verdict(html, report, analysis);
        Summary(html, report, analysis, truthName, runName);
        Definitions(html);
        Groups(html, report, analysis);
        Confusions(html, analysis, confusionRows);
        Plots(html, report, lines);
        Worst(html, report, lines, worstRows);
        html.Append("</body>\n</html>\n");
        return html.ToString();
    }

    private static void Verdict(StringBuilder html, ScoreReport report, ProofAnalysis analysis)
    {
        var ci = analysis.CerInterval;
        var (css, word, meaning) = analysis.Verdict switch
        {
            AcceptanceVerdict.Pass => ("pass", "✔ PASS", "The whole 95 % interval is at or below the contract's CER"),
            AcceptanceVerdict.Fail => ("fail", "✘ FAIL", "The whole 95 % interval is above the contract's CER"),
            AcceptanceVerdict.Inconclusive => ("inconclusive", "? INCONCLUSIVE",
                "The 95 % interval contains the contract's CER: this sample cannot tell; key more lines (score --plan says how many)"),
            _ => ("none", "NO THRESHOLD", "No contract CER was given (score --max-cer), so there is no verdict"),
        };
        html.Append("<section id=\"verdict\" class=\"verdict ").Append(css).Append("\">\n")
            .Append("<p class=\"verdict-word\">").Append(word).Append("</p>\n<p class=\"headline\">CER <strong>")
            .Append(P(report.Cer)).Append("</strong>, 95 % interval <strong>").Append(P(ci.Lower)).Append(" – ").Append(P(ci.Upper)).Append("</strong>");
        if (analysis.Options.MaxCer is { } max)
            html.Append("; contract: CER at most <strong>").Append(P(max)).Append("</strong>");
        html.Append(".</p>\n<p>").Append(E(meaning)).Append(". ")
            .Append(CultureInfo.InvariantCulture, $"Measured on {report.Lines} keyed line(s), {report.Chars} character(s).</p>\n</section>\n");
    }

    private static void Summary(StringBuilder html, ScoreReport report, ProofAnalysis analysis, string truthName, string runName)
    {
        var o = analysis.Options;
        html.Append("<section id=\"summary\">\n<h2>Summary</h2>\n<table class=\"figures\">\n")
            .Append("<tr><th scope=\"row\">CER</th><td>").Append(P(report.Cer)).Append(" (95 % interval ")
            .Append(P(analysis.CerInterval.Lower)).Append(" – ").Append(P(analysis.CerInterval.Upper)).Append(")</td></tr>\n")
            .Append("<tr><th scope=\"row\">WER</th><td>").Append(P(report.Wer)).Append(" (95 % interval ")
            .Append(P(analysis.WerInterval.Lower)).Append(" – ").Append(P(analysis.WerInterval.Upper)).Append(")</td></tr>\n")
            .Append(CultureInfo.InvariantCulture, $"<tr><th scope=\"row\">Character errors</th><td>{report.CharCounts.Distance}: {report.Substitutions} substitutions, {report.Deletions} deletions, {report.Insertions} insertions</td></tr>\n")
            .Append(CultureInfo.InvariantCulture, $"<tr><th scope=\"row\">Lines</th><td>{report.Lines} ({report.MissingLines} missing from the run)</td></tr>\n")
            .Append(CultureInfo.InvariantCulture, $"<tr><th scope=\"row\">Reference characters / words</th><td>{report.Chars} / {report.Words}</td></tr>\n")
            .Append("<tr><th scope=\"row\">Design effect</th><td>").Append(analysis.DesignEffect.ToString("0.00", CultureInfo.InvariantCulture))
            .Append(" (how much errors clustering in lines widens the interval's variance, against independent characters)</td></tr>\n")
            .Append(CultureInfo.InvariantCulture, $"<tr><th scope=\"row\">Bootstrap</th><td>{o.Resamples} resamples of whole lines, seed {o.Seed}</td></tr>\n")
            .Append("<tr><th scope=\"row\">Truth file</th><td><code>").Append(E(truthName)).Append("</code></td></tr>\n")
            .Append("<tr><th scope=\"row\">Run</th><td><code>").Append(E(runName)).Append("</code></td></tr>\n")
            .Append("</table>\n</section>\n");
    }

    private static void Definitions(StringBuilder html) =>
        html.Append("<section id=\"definitions\">\n<h2>How the figures are computed</h2>\n<dl>\n")
            .Append("<dt>CER (character error rate)</dt><dd>The fewest single-character substitutions, deletions and insertions that turn the truth into the machine text (Levenshtein distance), summed over all lines, divided by the number of characters of the truth summed over all lines. Long lines weigh more than short ones. Characters are Unicode code points after NFC normalisation (a precomposed letter and its decomposed spelling are the same character); case, spaces and punctuation count like any other character; nothing else is normalised.</dd>\n")
            .Append("<dt>WER (word error rate)</dt><dd>The same over words: NFC text split at white space.</dd>\n")
            .Append("<dt>95 % interval</dt><dd>Percentile bootstrap (Efron 1979): the sample's lines are drawn again with replacement, as many as there are, and the pooled CER recomputed, many times; the interval runs from the 2.5th to the 97.5th percentile of those rates. Whole lines are resampled because errors cluster in lines. It says how far the true CER of the batch the sample was drawn from may lie from the sample's CER, if the sample was drawn at random.</dd>\n")
            .Append("<dt>Verdict</dt><dd>PASS when the interval's upper end is at or below the contract's CER, FAIL when its lower end is above it, INCONCLUSIVE when the interval contains it.</dd>\n")
            .Append("<dt>Line CER</dt><dd>A line's own errors over its own truth characters (errors count as extra characters when the truth is empty).</dd>\n")
            .Append("<dt>Confidence</dt><dd>The machine's own confidence for a line, between 0 and 1, as written in its run.</dd>\n")
            .Append("</dl>\n</section>\n");

    private static void Groups(StringBuilder html, ScoreReport report, ProofAnalysis analysis)
    {
        if (report.Breakdowns.Count == 0)
            return;
        html.Append("<section id=\"groups\">\n<h2>Figures per group</h2>\n");
        foreach (var b in report.Breakdowns)
        {
            html.Append("<table class=\"groups\">\n<caption>By ").Append(E(b.Key))
                .Append(". CER of a group: its character errors over its own truth characters; interval: bootstrap over the group's lines.</caption>\n")
                .Append("<thead><tr><th scope=\"col\">").Append(E(b.Key)).Append("</th><th scope=\"col\">Lines</th><th scope=\"col\">Characters</th><th scope=\"col\">Errors</th><th scope=\"col\">CER</th><th scope=\"col\">95 % interval</th><th scope=\"col\">WER</th></tr></thead>\n<tbody>\n");
            foreach (var g in b.Groups)
            {
                var ci = analysis.GroupCerIntervals.GetValueOrDefault((b.Key, g.Value));
                html.Append("<tr><td>").Append(E(g.Value.Length == 0 ? "(empty)" : g.Value)).Append("</td>")
                    .Append(CultureInfo.InvariantCulture, $"<td>{g.Lines}</td><td>{g.CharCounts.TruthLength}</td><td>{g.CharCounts.Distance}</td><td>")
                    .Append(P(g.Cer)).Append("</td><td>").Append(ci is null ? "" : g.Lines < 2 ? "one line: no interval" : P(ci.Lower) + " – " + P(ci.Upper))
                    .Append("</td><td>").Append(P(g.Wer)).Append("</td></tr>\n");
            }
            html.Append(CultureInfo.InvariantCulture, $"<tr class=\"pooled\"><td>Pooled</td><td>{b.Lines}</td><td>{b.CharCounts.TruthLength}</td><td>{b.CharCounts.Distance}</td><td>")
                .Append(P(b.Cer)).Append("</td><td></td><td>").Append(P(b.Wer)).Append("</td></tr>\n</tbody>\n</table>\n");
            if (b.Worst is { } worst)
                html.Append("<p>Worst ").Append(E(b.Key)).Append(": <strong>").Append(E(worst.Value)).Append("</strong> (CER ").Append(P(worst.Cer)).Append(").</p>\n");
        }
        html.Append("</section>\n");
    }

    private static void Confusions(StringBuilder html, ProofAnalysis analysis, int rows)
    {
        html.Append("<section id=\"confusions\">\n<h2>Most frequent character errors</h2>\n<table class=\"confusions\">\n")
            .Append("<caption>Each substitution (truth character read as another), deletion (truth character missed) and insertion (extra character), counted over one optimal alignment per line, the one CER counts. A space is shown as ␣. Lines missing from the run are left out.</caption>\n")
            .Append("<thead><tr><th scope=\"col\">Kind</th><th scope=\"col\">Truth</th><th scope=\"col\">Machine</th><th scope=\"col\">Count</th></tr></thead>\n<tbody>\n");
        foreach (var c in analysis.Confusions.Take(rows))
            html.Append("<tr><td>").Append(c.Kind.ToString().ToLowerInvariant()).Append("</td><td class=\"char\">").Append(Char(c.Truth))
                .Append("</td><td class=\"char\">").Append(Char(c.Machine)).Append(CultureInfo.InvariantCulture, $"</td><td>{c.Count}</td></tr>\n");
        if (analysis.Confusions.Count == 0)
            html.Append("<tr><td colspan=\"4\">No character errors.</td></tr>\n");
        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private static void Plots(StringBuilder html, ScoreReport report, IReadOnlyDictionary<string, ReportLineSource> lines)
    {
        html.Append("<section id=\"plots\">\n<h2>Plots</h2>\n<figure>\n")
            .Append(SvgCharts.Histogram(report.PerLine.Select(l => l.Cer).ToArray()))
            .Append("\n<figcaption>Histogram of line CER: how many lines have each rate, in steps of 5 percentage points (line CER: the line's character errors over its truth characters; the last bar also holds lines above 100 %, where the machine added more than the truth has).</figcaption>\n</figure>\n");
        var points = report.PerLine
            .Where(l => lines.GetValueOrDefault(l.Id)?.Confidence is not null)
            .Select(l => (lines[l.Id].Confidence!.Value, l.Cer, l.Id)).ToArray();
        html.Append("<figure>\n").Append(SvgCharts.ConfidenceScatter(points))
            .Append(CultureInfo.InvariantCulture, $"\n<figcaption>Confidence against error: one point per line ({points.Length} of {report.Lines} lines have a confidence in the run), the machine's confidence across, the line's CER up; a triangle at the top is a line above 100 %. If confidence is a good guide, the points fall from top left to bottom right and a review of low-confidence lines catches most errors.</figcaption>\n</figure>\n</section>\n");
    }

    private static void Worst(StringBuilder html, ScoreReport report, IReadOnlyDictionary<string, ReportLineSource> lines, int rows)
    {
        var worst = report.PerLine.Where(l => l.CharCounts.Distance > 0)
            .OrderByDescending(l => l.Cer).ThenByDescending(l => l.CharCounts.Distance).ThenBy(l => l.Id, StringComparer.Ordinal)
            .Take(rows).ToArray();
        html.Append("<section id=\"worst\">\n<h2>Worst lines</h2>\n")
            .Append("<p class=\"legend\">Marks: in the truth, <del>struck through</del> = missed by the machine, <span class=\"sub\">wavy underline</span> = read as another character; in the machine text, <span class=\"sub\">wavy underline</span> = wrong character, <ins>double underline</ins> = extra character, <span class=\"gap\">‸</span> = characters missing here. Hover a mark for what it stands for.</p>\n")
            .Append("<table class=\"lines\">\n<thead><tr><th scope=\"col\">Line</th><th scope=\"col\">CER</th><th scope=\"col\">Image, truth and machine text</th></tr></thead>\n<tbody>\n");
        foreach (var l in worst)
        {
            var source = lines.GetValueOrDefault(l.Id);
            html.Append("<tr><td class=\"id\"><code>").Append(E(l.Id)).Append("</code></td><td>").Append(P(l.Cer))
                .Append(CultureInfo.InvariantCulture, $"<br><small>{l.CharCounts.Distance} error(s)</small></td><td>");
            var uri = source?.ImagePath is { } path ? ReportImages.DataUri(path) : null;
            html.Append(uri is null
                ? "<p class=\"noimage\">(image not available)</p>"
                : $"<img class=\"line-image\" src=\"{uri}\" alt=\"image of {E(l.Id)}\">");
            var (truth, machine) = DifferenceMarkup.Mark(l.Truth, l.Hypothesis ?? "");
            html.Append("<div class=\"text\"><span class=\"who\">Truth</span> <span class=\"t\">").Append(truth).Append("</span></div>")
                .Append("<div class=\"text\"><span class=\"who\">Machine</span> <span class=\"t\">")
                .Append(l.Missing ? "<em>(no output for this line)</em>" : machine).Append("</span></div></td></tr>\n");
        }
        if (worst.Length == 0)
            html.Append("<tr><td colspan=\"3\">Every line is read without error.</td></tr>\n");
        html.Append("</tbody>\n</table>\n</section>\n");
    }

    private static string E(string text) => WebUtility.HtmlEncode(text);

    private static string Char(string c) => c.Length == 0 ? "—" : c == " " ? "␣" : E(c);

    private static string P(double rate) => (rate * 100).ToString("0.00", CultureInfo.InvariantCulture) + " %";

    private const string Style = """
        body{font-family:system-ui,sans-serif;max-width:1100px;margin:1.5em auto;padding:0 1em;color:#111;line-height:1.4}
        h1{font-size:1.6em}h2{font-size:1.25em;margin-top:1.6em;border-bottom:1px solid #ccc}
        .verdict{border:3px solid;padding:.6em 1em;border-radius:6px}
        .verdict-word{font-size:2em;font-weight:bold;margin:.1em 0}
        .pass{border-color:#1a7f37;background:#e8f5ec}.fail{border-color:#b42318;background:#fdecea}
        .inconclusive{border-color:#9a6700;background:#fff5d6}.none{border-color:#777;background:#f3f3f3}
        table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #ccc;padding:.25em .5em;text-align:left;vertical-align:top}
        caption{caption-side:top;text-align:left;font-size:.9em;color:#333;padding:.3em 0}
        .pooled td{font-weight:bold}.char{font-family:monospace;font-size:1.1em}
        figure{margin:1em 0}figcaption{font-size:.9em;color:#333;max-width:640px}
        svg .bar{fill:#4a6fa5}svg .point{fill:#4a6fa5;fill-opacity:.7}svg .capped{fill:#b42318}
        svg .axis{stroke:#333}svg .tick{stroke:#333}svg .grid{stroke:#ddd}svg text{font-size:11px;fill:#333}
        .line-image{max-width:100%;height:auto;border:1px solid #ddd;display:block;margin-bottom:.3em}
        .text{font-family:monospace;white-space:pre-wrap;margin:.15em 0}.who{display:inline-block;width:5.5em;color:#555;font-family:system-ui,sans-serif}
        del{text-decoration:line-through;text-decoration-thickness:2px;background:#fdd}
        ins{text-decoration:underline double;background:#dfd}
        .sub{text-decoration:underline wavy;font-weight:bold;background:#ffe9a8}
        .gap{color:#b42318;font-weight:bold}
        .id code{word-break:break-all}
        """;
}
