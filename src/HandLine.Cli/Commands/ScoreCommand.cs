using System.CommandLine;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using HandLine.Proof;
using HandLine.Scoring;

namespace HandLine.Cli.Commands;

internal static class ScoreCommand
{
    public static Command Create()
    {
        var truth = new Option<string>("--truth") { Description = "Manifest TSV with the correct transcripts (required unless --plan)" };
        var run = new Option<string>("--run") { Description = "Folder written by 'transcribe', or a sample's 'machine' folder (required unless --plan)" };
        var json = new Option<bool>("--json") { Description = "Print one JSON object instead of tables" };
        var rows = new Option<int>("--rows") { Description = "Per-line rows to show, worst first (also the worst lines in --html)", DefaultValueFactory = _ => 20 };
        var by = new Option<string[]>("--by")
        {
            Description = "Also score per value of this extra manifest column (#columns header), or per image folder with 'folder'; repeatable",
            AllowMultipleArgumentsPerToken = false,
        };
        var maxCer = new Option<double?>("--max-cer") { Description = "Contract's highest CER as a rate (0.05 for 5 %): verdict pass (exit 0), fail (3) or inconclusive (4)" };
        var resamples = new Option<int>("--resamples") { Description = "Bootstrap resamples for the 95 % intervals", DefaultValueFactory = _ => new ProofOptions().Resamples };
        var seed = new Option<int>("--seed") { Description = "Seed of the bootstrap (same seed, same interval)", DefaultValueFactory = _ => new ProofOptions().Seed };
        var confusions = new Option<int>("--confusions") { Description = "Rows of the table of most frequent character errors", DefaultValueFactory = _ => 10 };
        var html = new Option<string?>("--html") { Description = "Also write the client's report as one self-contained HTML file" };
        var plan = new Option<bool>("--plan") { Description = "Print how many lines a proof sample needs (with --half-width and --expected-cer) instead of scoring" };
        var halfWidth = new Option<double?>("--half-width") { Description = "--plan: wanted half-width of the 95 % interval as a rate (0.01 for ±1 point)" };
        var expected = new Option<double?>("--expected-cer") { Description = "--plan: the CER expected, as a rate (the contract's threshold is a safe choice)" };
        var lineChars = new Option<double?>("--line-chars") { Description = "--plan: characters per line (default: measured on --truth/--run)" };
        var designEffect = new Option<double?>("--design-effect") { Description = "--plan: design effect for errors clustered in lines (default: measured on --truth/--run, else 1)" };
        var boxes = new Option<string?>("--boxes")
        {
            Description = "Folder of truth line boxes, one TSV per page (x, y, w, h per line): score line detection (precision, recall, F1 at IoU >= 0.5) of a transcribe or segment folder; with --truth, also the page CER",
        };
        var command = new Command("score", "Character and word error rates of a run against a truth manifest, with intervals, a verdict and a report")
        {
            truth, run, boxes, json, rows, by, maxCer, resamples, seed, confusions, html, plan, halfWidth, expected, lineChars, designEffect,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var truthPath = parse.GetValue(truth);
            var runPath = parse.GetValue(run);
            if (parse.GetValue(plan))
                return Plan(truthPath, runPath, parse.GetValue(halfWidth), parse.GetValue(expected), parse.GetValue(lineChars), parse.GetValue(designEffect));
            var boxesPath = parse.GetValue(boxes);
            if (boxesPath is not null)
            {
                if (string.IsNullOrWhiteSpace(runPath)) throw new ArgumentException("score --boxes needs --run.");
                var segmentation = SegmentationScore.ScoreRun(boxesPath, runPath);
                if (string.IsNullOrWhiteSpace(truthPath))
                {
                    SegmentationReportWriter.Write(Console.Out, segmentation, parse.GetValue(json), null);
                    return ExitCodes.Ok;
                }
                SegmentationReportWriter.Write(Console.Out, segmentation, parse.GetValue(json), Scorer.ScoreRun(truthPath, runPath));
                return ExitCodes.Ok;
            }
            if (string.IsNullOrWhiteSpace(truthPath) || string.IsNullOrWhiteSpace(runPath))
                throw new ArgumentException("score needs --truth and --run (or --plan).");
            var options = new ProofOptions { Resamples = parse.GetValue(resamples), Seed = parse.GetValue(seed), MaxCer = parse.GetValue(maxCer) };
            options.Validate();
            var htmlPath = parse.GetValue(html);
            var keys = (parse.GetValue(by) ?? []).ToList();
            // The client's report always shows the figures per folder (per volume).
            if (htmlPath is not null && !keys.Contains(ScoreBreakdown.FolderKey))
                keys.Add(ScoreBreakdown.FolderKey);

            var report = Scorer.ScoreRun(truthPath, runPath, keys);
            var analysis = ProofAnalysis.Of(report, options, report.GroupValues);
            var emptyTruths = report.PerLine.Count(l => l.Truth.Length == 0);
            if (emptyTruths > 0)
                Console.Error.WriteLine($"warning: {emptyTruths} of {report.Lines} truth line(s) are empty: not keyed yet? They count as lines with no text.");

            if (parse.GetValue(json))
            {
                var node = JsonNode.Parse(ScoreReportWriter.ToJson(report))!.AsObject();
                node["proof"] = ProofTextWriter.ToJson(analysis);
                Console.WriteLine(node.ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping }));
            }
            else
            {
                ScoreReportWriter.WriteText(Console.Out, report, parse.GetValue(rows));
                ProofTextWriter.Write(Console.Out, analysis, Math.Max(0, parse.GetValue(confusions)));
            }
            if (htmlPath is not null)
            {
                var page = ProofReportHtml.Write(report, analysis, truthPath, runPath, ReportLineSource.Read(truthPath, runPath),
                    Math.Max(0, parse.GetValue(rows)), Math.Max(0, parse.GetValue(confusions)));
                AtomicFile.WriteAllText(htmlPath, page);
                if (!parse.GetValue(json))
                    Console.WriteLine($"Report written to {htmlPath}");
            }
            return analysis.Verdict switch
            {
                AcceptanceVerdict.Fail => ExitCodes.ProofFailed,
                AcceptanceVerdict.Inconclusive => ExitCodes.ProofInconclusive,
                _ => ExitCodes.Ok,
            };
        }));
        return command;
    }

    /// <summary>Sample size for an interval half-width; chars per line and design effect come from a scored run when one is given.</summary>
    private static int Plan(string? truthPath, string? runPath, double? halfWidth, double? expected, double? lineChars, double? designEffect)
    {
        if (halfWidth is null || expected is null)
            throw new ArgumentException("--plan needs --half-width and --expected-cer (rates: 0.01 and 0.05 for ±1 point at 5 %).");
        string deffSource = designEffect is null ? "assumed: errors independent" : "given", charsSource = "given";
        if (!string.IsNullOrWhiteSpace(truthPath) && !string.IsNullOrWhiteSpace(runPath))
        {
            var report = Scorer.ScoreRun(truthPath, runPath);
            var counts = report.PerLine.Select(l => l.CharCounts).ToArray();
            if (designEffect is null)
            {
                designEffect = DesignEffect.Estimate(counts);
                deffSource = $"measured on {report.Lines} line(s)";
            }
            if (lineChars is null && report.Lines > 0)
            {
                lineChars = Math.Max(1, (double)report.Chars / report.Lines);
                charsSource = $"measured on {report.Lines} line(s)";
            }
        }
        if (lineChars is null)
            throw new ArgumentException("--plan needs --line-chars, or --truth and --run to measure it.");
        var result = SamplePlanner.Plan(expected.Value, halfWidth.Value, lineChars.Value, designEffect ?? 1);
        ProofTextWriter.WritePlan(Console.Out, result, deffSource, charsSource);
        return ExitCodes.Ok;
    }
}
