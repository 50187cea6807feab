using HandLine.Decoding;
using HandLine.Formats;
using HandLine.Model;
using HandLine.Scoring;

namespace HandLine.Training;

/// <summary>Scores a model on validation lines as training does after every epoch.</summary>
public static class Validation
{
    /// <summary>
    /// Greedy-decodes every line and scores it against its transcript: the pooled CER is summed Levenshtein
    /// distances over summed reference code points (the same measure as <c>score</c>); lines with a family or
    /// group are also scored per value. A line without one counts under the empty value.
    /// </summary>
    public static ValidationResult Run(LineModel model, IReadOnlyList<LineSample> valid)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(valid);
        var scored = new List<(LineScore Line, LineSample Sample)>(valid.Count);
        foreach (var chunk in valid.Chunk(32))
        {
            var posteriors = model.Run(chunk.Select(s => s.Features).ToArray());
            for (var i = 0; i < chunk.Length; i++)
            {
                var s = chunk[i];
                var hyp = GreedyDecoder.Decode(posteriors[i], model.Charset).Text;
                var chars = EditDistance.Align<int>(TextUnits.CodePoints(s.Text), TextUnits.CodePoints(hyp));
                scored.Add((new LineScore(s.Id, s.Text, hyp, chars, EditDistance.AlignWords(s.Text, hyp), Missing: false), s));
            }
        }

        long errors = 0, total = 0;
        foreach (var (line, _) in scored)
        {
            errors += line.CharCounts.Distance;
            total += line.CharCounts.TruthLength;
        }
        var byGroup = scored.Any(x => x.Sample.Group is not null)
            ? ScoreBreakdown.Of(TrainingData.GroupColumn, scored.Select(x => (x.Line, x.Sample.Group ?? "")))
            : null;
        var byFamily = scored.Any(x => x.Sample.Family is not null)
            ? ScoreBreakdown.Of(TrainingData.FamilyColumn, scored.Select(x => (x.Line, x.Sample.Family ?? "")))
            : null;
        return new ValidationResult(errors / (double)Math.Max(1, total), byGroup, byFamily);
    }
}
