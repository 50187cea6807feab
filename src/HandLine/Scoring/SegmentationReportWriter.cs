using System.Globalization;
using System.Text.Encodings.Web;
using System.Text.Json;

namespace HandLine.Scoring;

/// <summary>Prints a line-detection score (and, when given, the page CER beside it) as a table or as one JSON object.</summary>
public static class SegmentationReportWriter
{
    public static void Write(TextWriter output, SegmentationScore score, bool json, ScoreReport? pageText)
    {
        ArgumentNullException.ThrowIfNull(output);
        ArgumentNullException.ThrowIfNull(score);
        var inv = CultureInfo.InvariantCulture;
        if (json)
        {
            var node = new Dictionary<string, object?>
            {
                ["iou_threshold"] = score.Threshold,
                ["pages"] = score.Pages.Count,
                ["truth_lines"] = score.Truth,
                ["found_lines"] = score.Found,
                ["matched"] = score.Matched,
                ["precision"] = Math.Round(score.Precision, 4),
                ["recall"] = Math.Round(score.Recall, 4),
                ["f1"] = Math.Round(score.F1, 4),
                ["page_cer"] = pageText is null ? null : Math.Round(pageText.Cer, 4),
                ["page_wer"] = pageText is null ? null : Math.Round(pageText.Wer, 4),
                ["per_page"] = score.Pages.Select(p => new Dictionary<string, object>
                {
                    ["page"] = p.Page, ["truth"] = p.Truth, ["found"] = p.Found, ["matched"] = p.Matched,
                    ["mean_iou"] = Math.Round(p.MeanIoU, 4), ["missing"] = p.Missing,
                }).ToArray(),
            };
            output.WriteLine(JsonSerializer.Serialize(node, new JsonSerializerOptions { WriteIndented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping }));
            return;
        }
        output.WriteLine(string.Create(inv,
            $"line detection at IoU >= {score.Threshold:0.##}: {score.Pages.Count} pages, {score.Truth} truth lines, {score.Found} found, {score.Matched} matched"));
        output.WriteLine(string.Create(inv,
            $"precision {100 * score.Precision:F2} %, recall {100 * score.Recall:F2} %, F1 {100 * score.F1:F2} %"));
        if (pageText is not null)
            output.WriteLine(string.Create(inv, $"page text: CER {100 * pageText.Cer:F2} %, WER {100 * pageText.Wer:F2} % over {pageText.Lines} pages"));
        output.WriteLine();
        output.WriteLine("page\ttruth\tfound\tmatched\tmean IoU");
        foreach (var p in score.Pages)
            output.WriteLine(string.Create(inv, $"{p.Page}\t{p.Truth}\t{p.Found}\t{p.Matched}\t{(p.Missing ? "not in run" : p.MeanIoU.ToString("F3", inv))}"));
    }
}
