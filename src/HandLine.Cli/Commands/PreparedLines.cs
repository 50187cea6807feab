using HandLine.Batch;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Cli.Commands;

/// <summary>Reads sources and runs the model once, so several decoders can be measured on the same posteriors.</summary>
internal static class PreparedLines
{
    /// <summary>Loads and prepares up to <paramref name="count"/> sources (untimed), then runs the model on each as 'transcribe' does.</summary>
    public static (IReadOnlyList<PreparedSource> Sources, double ModelSeconds) Run(LineModel model, IEnumerable<string> inputs, int count)
    {
        var imaging = LinePreparation.ImagingFor(model.Features, new ImagingOptions());
        var (sources, errors) = InputSet.Expand(inputs);
        foreach (var e in errors.Take(5)) Console.Error.WriteLine($"skipped: {e.Message}");

        var pages = new List<(SourceImage Source, FeatureSequence[] Lines)>();
        foreach (var source in sources.Take(count))
        {
            try
            {
                var page = ImageLoader.Load(source.FullPath, imaging);
                var lines = LineFinder.Split(page, imaging).Select(r => LinePreparation.Prepare(r.Image, model.Features, imaging))
                    .Where(p => p.Line.HasInk).Select(p => p.Features).ToArray();
                if (lines.Length > 0) pages.Add((source, lines));
                else Console.Error.WriteLine($"skipped: {source.FullPath}: no ink");
            }
            catch (InputException e)
            {
                Console.Error.WriteLine($"skipped: {e.Message}");
            }
        }
        if (pages.Count == 0) throw new ArgumentException("no usable lines in the input");

        model.Run(pages[0].Lines); // warm-up: first-call costs are not model time
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var result = pages.Select(p => new PreparedSource(p.Source, model.Run(p.Lines))).ToArray();
        return (result, clock.Elapsed.TotalSeconds);
    }
}
