using HandLine.Features;
using HandLine.Imaging;
using HandLine.Model;
using HandLine.Scoring;

namespace HandLine.Training;

/// <summary>
/// Loads manifest lines into prepared samples (normalised, featurised, encoded) in parallel, keeping the
/// manifest order. Unreadable images and transcripts with symbols outside the character set are reported
/// and left out.
/// </summary>
public static class TrainingData
{
    public static (IReadOnlyList<LineSample> Samples, IReadOnlyList<InputException> Errors) Load(
        IEnumerable<string> manifests, FeatureConfig features, CharacterSet charset, ImagingOptions limits, int threads = 0)
    {
        var imaging = LinePreparation.ImagingFor(features, limits);
        var errors = new List<InputException>();
        var entries = new List<ManifestEntry>();
        foreach (var m in manifests)
        {
            var read = Manifest.Read(m);
            errors.AddRange(read.Errors);
            entries.AddRange(read.Entries);
        }

        var samples = new LineSample?[entries.Count];
        var failures = new InputException?[entries.Count];
        var parallel = new ParallelOptions { MaxDegreeOfParallelism = threads > 0 ? threads : Environment.ProcessorCount };
        Parallel.For(0, entries.Count, parallel, i =>
        {
            var e = entries[i];
            try
            {
                if (!charset.CanEncode(e.Text))
                    throw new InputException(e.FullPath, "manifest",
                        $"transcript has characters outside the model's character set: {string.Concat(e.Text.EnumerateRunes().Select(r => r.ToString()).Where(s => !charset.Contains(s)).Distinct())}");
                var line = LineNormaliser.Normalise(ImageLoader.Load(e.FullPath, imaging), imaging, e.FullPath);
                if (!line.HasInk)
                    throw new InputException(e.FullPath, "normalise", "no ink found: the image looks blank");
                samples[i] = new LineSample(e.RelativePath, e.Text, line.Ink, features, charset.Encode(e.Text));
            }
            catch (InputException ex)
            {
                failures[i] = ex;
            }
        });
        errors.AddRange(failures.OfType<InputException>());
        return (samples.OfType<LineSample>().ToArray(), errors);
    }
}
