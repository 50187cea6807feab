using HandLine.Features;
using HandLine.Formats;
using HandLine.Imaging;
using HandLine.Model;

namespace HandLine.Training;

/// <summary>
/// Loads manifest lines into prepared samples (normalised, encoded) in parallel, keeping the manifest order.
/// Unreadable images and transcripts with symbols outside the character set are reported and left out.
/// </summary>
public static class TrainingData
{
    /// <summary>Manifest column naming a line's style family (written by synthesis).</summary>
    public const string FamilyColumn = Synthesis.LineSynthesiser.FamilyColumn;

    /// <summary>Manifest column naming a line's style group (written by synthesis).</summary>
    public const string GroupColumn = Synthesis.LineSynthesiser.GroupColumn;

    /// <param name="keepPrepared">Keep each manifest's prepared lines in a file beside it and reuse them
    /// (see <see cref="PreparedInkFile"/>).</param>
    /// <param name="note">Where messages about kept prepared lines go.</param>
    /// <param name="cancel">Stops the preparation (it can take many minutes) with an
    /// <see cref="OperationCanceledException"/>; nothing is kept then.</param>
    public static (IReadOnlyList<LineSample> Samples, IReadOnlyList<InputException> Errors) Load(
        IEnumerable<string> manifests, FeatureConfig features, CharacterSet charset, InputLimits? limits = null, int threads = 0,
        bool keepPrepared = false, Action<string>? note = null, CancellationToken cancel = default)
    {
        var preparer = new LinePreparer(features, limits: limits);
        var errors = new List<InputException>();
        var samples = new List<LineSample>();
        foreach (var m in manifests)
        {
            var read = Manifest.Read(m);
            errors.AddRange(read.Errors);
            var lines = PreparedInkFile.Load(m, read.Entries, preparer, threads, keepPrepared, note, cancel);
            for (var i = 0; i < lines.Count; i++)
            {
                var e = read.Entries[i];
                if (!charset.CanEncode(e.Text))
                    errors.Add(new InputException(e.FullPath, "manifest",
                        $"transcript has characters outside the model's character set: {string.Concat(e.Text.EnumerateRunes().Select(r => r.ToString()).Where(s => !charset.Contains(s)).Distinct())}"));
                else if (lines[i].Failure is { } failure)
                    errors.Add(failure);
                else
                    samples.Add(new LineSample(e.RelativePath, e.Text, lines[i].Ink!, lines[i].Width, features, charset.Encode(e.Text))
                    {
                        // Validation reports CER per style when the manifest says which style each line is in.
                        Family = e.Column(FamilyColumn),
                        Group = e.Column(GroupColumn),
                    });
            }
        }
        return (samples, errors);
    }
}
