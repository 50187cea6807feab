using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class TraceTests
{
    /// <summary>
    /// The traced alignment must be one of the optimal alignments the counts API reports: same S/D/I/H
    /// (Levenshtein definition, Wagner and Fischer 1974), hits that really pair equal units, and deletions that add up.
    /// </summary>
    [Fact]
    public void TraceAgreesWithTheCountsAndPairsEqualUnits()
    {
        var rng = new Random(7);
        for (var trial = 0; trial < 300; trial++)
        {
            var truth = RandomText(rng);
            var hyp = RandomText(rng);
            var trace = EditDistance.TraceCharacters(truth, hyp);
            Assert.Equal(EditDistance.AlignCharacters(truth, hyp), trace.Counts);
            Assert.Equal(trace.Counts.Hits, trace.HypothesisHits.Count(h => h));
            Assert.Equal(trace.Counts.Deletions, trace.DeletionsBefore.Sum());

            // Walk the alignment: hits pair equal units, substitutions unequal
            // ones, and the truth units skipped before each hypothesis unit are exactly its recorded deletions.
            var nonHits = 0;
            for (var j = 0; j < hyp.Length; j++)
            {
                var i = trace.TruthIndex[j];
                if (!trace.HypothesisHits[j]) nonHits++;
                if (i < 0) { Assert.False(trace.HypothesisHits[j]); continue; }
                Assert.Equal(trace.HypothesisHits[j], truth[i] == hyp[j]);
                // Truth units used up before this one: the deletions so far plus the earlier paired units.
                Assert.Equal(trace.DeletionsBefore.Take(j + 1).Sum() + trace.TruthIndex.Take(j).Count(x => x >= 0), i);
            }
            Assert.Equal(trace.Counts.Insertions, trace.TruthIndex.Count(x => x < 0));
            Assert.Equal(trace.Counts.Substitutions + trace.Counts.Insertions, nonHits);
        }
    }

    [Fact]
    public void AWorkedExample()
    {
        // "barley" against "barlcy": one substitution at index 4, everything else a hit.
        var t = EditDistance.TraceCharacters("barley", "barlcy");
        Assert.Equal([true, true, true, true, false, true], t.HypothesisHits);
        // "Recd of" against "Recd": three truth characters deleted at the end.
        Assert.Equal([0, 0, 0, 0, 3], EditDistance.TraceCharacters("Recd of", "Recd").DeletionsBefore);
    }

    private static string RandomText(Random rng) =>
        new(Enumerable.Range(0, rng.Next(0, 9)).Select(_ => "abc "[rng.Next(4)]).ToArray());
}
