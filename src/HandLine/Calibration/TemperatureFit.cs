using HandLine.Decoding;
using HandLine.Model;

namespace HandLine.Calibration;

/// <summary>
/// Fits one temperature for a model's outputs on lines with known text, so that its character confidences say
/// how often characters are right on hands like those lines (temperature scaling, Guo et al. 2017, "On
/// Calibration of Modern Neural Networks", section 4.2). CTC gives no label per frame, so the fit scores what the
/// user sees: each decoded character's confidence against whether the alignment to the truth made it a hit, by
/// the mean negative log-likelihood of those outcomes (a proper scoring rule; the paper fits T by the NLL too).
/// Each temperature is tried by decoding the same posteriors again, so the network runs once.
/// </summary>
public static class TemperatureFit
{
    /// <summary>Confidences are kept this far from 0 and 1, so one sure mistake cannot make the NLL infinite.</summary>
    private const double Clamp = 1e-6;

    /// <summary>A source with known text and the posteriors of its lines (top to bottom).</summary>
    public sealed record Source(string Id, string Truth, IReadOnlyList<Posteriors> Lines);

    /// <summary>One tried temperature (relative to the posteriors given) and how calibrated it left the characters.</summary>
    public sealed record Point(double Temperature, double CharNll, double CharEce, int Characters);

    /// <summary>The tried points in order of temperature, the one at 1 (as given) and the best.</summary>
    public sealed record Result(IReadOnlyList<Point> Tried, Point AsGiven, Point Best);

    /// <summary>
    /// Tries temperatures on a log-spaced grid from <paramref name="low"/> to <paramref name="high"/>, then a finer
    /// grid between the best point's neighbours, and keeps the lowest NLL. The result is relative to the posteriors
    /// given: tempering composes (T1 then T2 is T1·T2), so a model that already has a temperature multiplies it.
    /// </summary>
    public static Result Fit(IReadOnlyList<Source> sources, LineDecoder decoder, double low = 0.5, double high = 4, int steps = 13)
    {
        ArgumentNullException.ThrowIfNull(sources);
        ArgumentNullException.ThrowIfNull(decoder);
        if (!(low > 0) || !(high > low)) throw new ArgumentOutOfRangeException(nameof(low), "need 0 < low < high");
        ArgumentOutOfRangeException.ThrowIfLessThan(steps, 3);
        if (sources.Count == 0) throw new ArgumentException("no lines to fit on", nameof(sources));

        var tried = new Dictionary<double, Point>();
        Point Try(double t) => tried.TryGetValue(t, out var p) ? p : tried[t] = Evaluate(sources, decoder, t);
        var ratio = Math.Pow(high / low, 1.0 / (steps - 1));
        var coarse = Enumerable.Range(0, steps).Select(i => Math.Round(low * Math.Pow(ratio, i), 4)).ToArray();
        var best = coarse.Select(Try).MinBy(p => p.CharNll)!;
        // Between the coarse neighbours of the best point, eight log-spaced steps more.
        var fineRatio = Math.Pow(ratio, 2.0 / 8);
        for (var t = best.Temperature / ratio; t <= best.Temperature * ratio * (1 + 1e-9); t *= fineRatio) Try(Math.Round(t, 4));
        var asGiven = Try(1.0);
        var ordered = tried.Values.OrderBy(p => p.Temperature).ToArray();
        return new Result(ordered, asGiven, ordered.MinBy(p => p.CharNll)!);
    }

    /// <summary>Decodes every line at <paramref name="temperature"/> and scores its characters.</summary>
    public static Point Evaluate(IReadOnlyList<Source> sources, LineDecoder decoder, double temperature)
    {
        var outcomes = Lines(sources, decoder, temperature).SelectMany(l => l.CharConfidences.Zip(l.CharCorrect)).ToArray();
        return new Point(temperature, Nll(outcomes), ReliabilityTable.Build(outcomes, Calibrator.DefaultBins).Ece, outcomes.Length);
    }

    /// <summary>Every line decoded at <paramref name="temperature"/>, aligned to its source's truth.</summary>
    public static IReadOnlyList<CalibrationLine> Lines(IReadOnlyList<Source> sources, LineDecoder decoder, double temperature)
    {
        ArgumentNullException.ThrowIfNull(sources);
        ArgumentNullException.ThrowIfNull(decoder);
        var lines = new List<CalibrationLine>();
        foreach (var source in sources)
            lines.AddRange(CalibrationInput.ForSource(source.Id, source.Truth,
                source.Lines.Select(p => decoder.Decode(p.Tempered(temperature))).ToArray()));
        return lines;
    }

    /// <summary>Mean of −ln p(outcome) with p = confidence for a hit and 1 − confidence for a miss.</summary>
    public static double Nll(IReadOnlyCollection<(double Confidence, bool Correct)> outcomes)
    {
        ArgumentNullException.ThrowIfNull(outcomes);
        if (outcomes.Count == 0) return 0;
        return outcomes.Average(o =>
        {
            var c = Math.Clamp(o.Confidence, Clamp, 1 - Clamp);
            return -Math.Log(o.Correct ? c : 1 - c);
        });
    }
}
