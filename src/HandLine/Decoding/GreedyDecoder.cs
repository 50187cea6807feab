using System.Text;
using HandLine.Model;

namespace HandLine.Decoding;

/// <summary>
/// Best-path CTC decoding (Graves et al. 2006): take the most probable class at each frame, merge runs of the
/// same class, then drop blanks. Confidences:
/// <list type="bullet">
/// <item>a character's confidence is the highest posterior probability of that character over the run of
/// frames that emitted it;</item>
/// <item>the line confidence is the geometric mean, over all frames, of the best class's probability, i.e. the
/// best path's probability normalised per frame. Blank frames count, so a doubtful gap lowers it too.</item>
/// </list>
/// </summary>
public static class GreedyDecoder
{
    public static Hypothesis Decode(Posteriors posteriors, CharacterSet charset)
    {
        ArgumentNullException.ThrowIfNull(posteriors);
        ArgumentNullException.ThrowIfNull(charset);
        if (posteriors.Classes != charset.ClassCount)
            throw new ArgumentException(
                $"Posteriors have {posteriors.Classes} classes but the character set needs {charset.ClassCount}.");

        var chars = new List<CharConfidence>();
        var text = new StringBuilder();
        double sumLog = 0;
        var previous = 0;
        var runStart = 0;
        var runBest = float.NegativeInfinity;
        for (var t = 0; t < posteriors.Frames; t++)
        {
            var best = 0;
            var bestLog = posteriors[t, 0];
            for (var c = 1; c < posteriors.Classes; c++)
            {
                var v = posteriors[t, c];
                if (v > bestLog) { bestLog = v; best = c; }
            }
            sumLog += bestLog;

            if (best != previous)
            {
                Close(t - 1);
                runStart = t;
                runBest = bestLog;
            }
            else if (bestLog > runBest)
            {
                runBest = bestLog;
            }
            previous = best;
        }
        Close(posteriors.Frames - 1);

        var confidence = posteriors.Frames == 0 ? 0 : Math.Exp(sumLog / posteriors.Frames);
        return new Hypothesis(text.ToString(), chars, confidence);

        void Close(int lastFrame)
        {
            if (previous == 0 || lastFrame < runStart) return;
            var symbol = charset.SymbolOf(previous);
            text.Append(symbol);
            chars.Add(new CharConfidence(symbol, Math.Exp(runBest), runStart, lastFrame));
        }
    }
}
