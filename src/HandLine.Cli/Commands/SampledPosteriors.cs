using HandLine.Batch;
using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Recognition;

namespace HandLine.Cli.Commands;

/// <summary>
/// Runs the model once on a sample of sources through the recogniser's stages, so several decoders can be
/// measured on the same posteriors (bench-decode, tune-decode).
/// </summary>
internal static class SampledPosteriors
{
    /// <summary>
    /// Prepares up to <paramref name="count"/> sources (untimed), then runs the model on each as 'transcribe'
    /// does, timing that alone.
    /// </summary>
    public static (IReadOnlyList<SampledSource> Sources, double ModelSeconds) Run(LineModel model, IEnumerable<string> inputs, int count)
    {
        var recogniser = new Recogniser(model);
        var (sources, errors) = InputSet.Expand(inputs);
        foreach (var e in errors.Take(5)) Console.Error.WriteLine($"skipped: {e.Message}");

        var pages = new List<(SourceImage Source, IReadOnlyList<PreparedLine> Lines)>();
        foreach (var source in sources.Take(count))
        {
            try
            {
                var bytes = ImageLoader.ReadFile(source.FullPath, recogniser.Limits);
                pages.Add((source, recogniser.Lines.PreparePage(bytes, source.FullPath)));
            }
            catch (InputException e)
            {
                Console.Error.WriteLine($"skipped: {e.Message}");
            }
        }
        if (pages.Count == 0) throw new ArgumentException("no usable lines in the input");

        recogniser.Run(pages[0].Lines); // warm-up: first-call costs are not model time
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var result = pages.Select(p => new SampledSource(p.Source, recogniser.Run(p.Lines))).ToArray();
        return (result, clock.Elapsed.TotalSeconds);
    }
}
