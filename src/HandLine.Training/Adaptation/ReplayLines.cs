using HandLine.Features;
using HandLine.Formats;
using HandLine.Model;
using HandLine.Synthesis;
using HandLine.Training;

namespace HandLine.Adaptation;

/// <summary>
/// General lines trained on beside an editor's corrections, so that a model adapted to one hand keeps reading the
/// others (replay against forgetting: the old task's data mixed into the new task's, common practice, no source).
/// They come from manifest TSVs (drawn at random, seeded) or are rendered now from fonts with the estate phrase
/// grammar and the default degradations; either way the same seed gives the same lines.
/// </summary>
public static class ReplayLines
{
    /// <summary>Up to <paramref name="count"/> prepared lines (fewer when the sources give fewer usable ones).</summary>
    /// <exception cref="InputException">A replay path is missing, or holds no font and is no manifest.</exception>
    public static IReadOnlyList<LineSample> Load(IReadOnlyList<string> paths, int count, int seed, FeatureConfig features, CharacterSet charset)
    {
        ArgumentNullException.ThrowIfNull(paths);
        ArgumentNullException.ThrowIfNull(features);
        ArgumentNullException.ThrowIfNull(charset);
        if (count <= 0 || paths.Count == 0)
            return [];
        var preparer = new LinePreparer(features);
        var manifests = paths.Where(p => File.Exists(p) && p.EndsWith(".tsv", StringComparison.OrdinalIgnoreCase)).ToArray();
        var fonts = paths.Except(manifests).ToArray();
        foreach (var p in fonts)
            if (!File.Exists(p) && !Directory.Exists(p))
                throw new InputException(p, "replay", "no such font file, folder or manifest (--replay)");

        var rng = new Random(seed);
        var lines = new List<LineSample>(count);
        if (manifests.Length > 0)
        {
            var entries = manifests.SelectMany(m => Manifest.Read(m).Entries).Where(e => charset.CanEncode(e.Text) && e.Text.Length > 0).ToArray();
            rng.Shuffle(entries);
            // From the manifests alone when there are no fonts, else half from each.
            var want = fonts.Length == 0 ? count : count / 2;
            foreach (var e in entries)
            {
                if (lines.Count >= want) break;
                var sample = Prepare(preparer, () => preparer.Load(e.FullPath), e.RelativePath, e.Text, features, charset);
                if (sample is not null) lines.Add(sample);
            }
        }
        if (fonts.Length > 0)
        {
            using var catalog = FontCatalog.Load(fonts);
            if (catalog.Fonts.Count == 0)
                throw new InputException(string.Join(", ", fonts), "replay", "no usable font found (--replay)");
            var phrases = new PhraseGenerator(rng.Next());
            var ranges = new DegradationRanges();
            // Some phrases may not be drawable in any font: give up after a generous number of tries.
            for (var tries = 0; lines.Count < count && tries < count * 4; tries++)
            {
                var text = phrases.Next();
                var rendered = LineSynthesiser.RenderOne(text, catalog, rng, ranges);
                if (rendered is null || !charset.CanEncode(rendered.Text)) continue;
                var sample = Prepare(preparer, () => rendered.Image, $"replay/{lines.Count:D5}", rendered.Text, features, charset);
                if (sample is not null) lines.Add(sample);
            }
        }
        return lines;
    }

    private static LineSample? Prepare(LinePreparer preparer, Func<Imaging.GrayImage> load, string id, string text, FeatureConfig features, CharacterSet charset)
    {
        try
        {
            var line = preparer.Normalise(load(), id);
            return line.HasInk ? new LineSample(id, text, line.Ink, features, charset.Encode(text)) : null;
        }
        catch (InputException)
        {
            // A replayed line that cannot be read is simply not replayed.
            return null;
        }
    }
}
