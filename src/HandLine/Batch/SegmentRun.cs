using System.Diagnostics;
using System.Globalization;
using System.Text.Json;
using HandLine.Imaging;
using HandLine.Layout;

namespace HandLine.Batch;

/// <summary>What <see cref="SegmentRun.Run"/> did: pages and lines written, errors, and the seconds the page stage took.</summary>
public sealed record SegmentSummary(int Pages, int Lines, IReadOnlyList<InputException> Errors, double SegmentSeconds);

/// <summary>
/// The page stage alone (<c>handline segment</c>): each page's lines as JSON (<c>OUT/NAME.json</c>: size, deskew,
/// column dividers, and per line its box, column and entry in reading order), and with <c>saveLines</c> each
/// line's crop as <c>OUT/NAME/line-NNN.png</c>, so segmentation can be checked and corrected on its own.
/// </summary>
public static class SegmentRun
{
    public static SegmentSummary Run(IEnumerable<string> inputs, string outDir, bool saveLines, PageAnalyser analyser,
        InputLimits? limits = null, TextWriter? log = null)
    {
        ArgumentNullException.ThrowIfNull(inputs);
        ArgumentException.ThrowIfNullOrWhiteSpace(outDir);
        ArgumentNullException.ThrowIfNull(analyser);
        limits ??= InputLimits.Default;
        var (sources, errors) = InputSet.Expand(inputs);
        var allErrors = errors.ToList();
        Directory.CreateDirectory(outDir);
        int pages = 0, lines = 0;
        var clock = new Stopwatch();
        foreach (var source in sources)
        {
            try
            {
                var image = ImageLoader.Load(source.FullPath, limits);
                clock.Start();
                var layout = analyser.Analyse(image);
                clock.Stop();
                var stem = Path.ChangeExtension(source.Source, null);
                var target = Path.Combine(outDir, stem.Replace('/', Path.DirectorySeparatorChar));
                Directory.CreateDirectory(Path.GetDirectoryName(target)!);
                var records = new List<Dictionary<string, object>>();
                for (var i = 0; i < layout.Lines.Count; i++)
                {
                    var l = layout.Lines[i];
                    var record = new Dictionary<string, object>
                    {
                        ["line"] = i, ["box"] = l.Box.ToArray(), ["column"] = l.Column, ["entry"] = l.Entry,
                    };
                    if (saveLines)
                    {
                        var crop = string.Create(CultureInfo.InvariantCulture, $"{Path.GetFileName(stem)}/line-{i:D3}.png");
                        Directory.CreateDirectory(target);
                        AtomicFile.WriteAllBytes(Path.Combine(target, Path.GetFileName(crop)), PngEncoder.Encode(l.Image));
                        record["crop"] = crop;
                    }
                    records.Add(record);
                }
                var json = new Dictionary<string, object>
                {
                    ["source"] = source.Source, ["width"] = layout.Width, ["height"] = layout.Height,
                    ["deskew_deg"] = Math.Round(layout.DeskewDegrees, 2),
                    ["column_dividers"] = layout.ColumnDividers.Select(d => Math.Round(d, 1)).ToArray(),
                    ["lines"] = records,
                };
                AtomicFile.WriteAllText(target + ".json", JsonSerializer.Serialize(json, RunReports.JsonLine) + "\n");
                pages++;
                lines += layout.Lines.Count;
                log?.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"{source.Source}: {layout.Lines.Count} lines, deskew {layout.DeskewDegrees:F2} deg"));
            }
            catch (InputException e)
            {
                allErrors.Add(e);
                log?.WriteLine($"{e.Path}: {e.Stage}: {e.Reason}");
            }
        }
        return new SegmentSummary(pages, lines, allErrors, clock.Elapsed.TotalSeconds);
    }
}
