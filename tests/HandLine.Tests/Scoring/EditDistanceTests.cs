using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class EditDistanceTests
{
    private static (int S, int D, int I, int H) Counts(string truth, string hypothesis)
    {
        var c = EditDistance.AlignCharacters(truth, hypothesis);
        return (c.Substitutions, c.Deletions, c.Insertions, c.Hits);
    }

    [Fact]
    public void Kitten_to_sitting_is_two_substitutions_and_one_insertion()
    {
        // The standard worked example for Levenshtein (1966) distance, distance 3:
        // k→s, e→i, +g. Recalled from memory, not checked against the papers.
        Assert.Equal((2, 0, 1, 4), Counts("kitten", "sitting"));
        Assert.Equal(3, EditDistance.AlignCharacters("kitten", "sitting").Distance);
    }

    [Fact]
    public void Identical_strings_have_distance_zero()
    {
        Assert.Equal((0, 0, 0, 17), Counts("Carriage of coals", "Carriage of coals"));
    }

    [Fact]
    public void Empty_hypothesis_deletes_every_truth_character()
    {
        // d(x, "") = |x| is the first row/column of the Wagner & Fischer (1974) matrix.
        Assert.Equal((0, 3, 0, 0), Counts("abc", ""));
        Assert.Equal((0, 0, 3, 0), Counts("", "abc"));
        Assert.Equal((0, 0, 0, 0), Counts("", ""));
    }

    [Fact]
    public void Hand_computed_example_has_substitution_deletion_and_insertion()
    {
        // Hand computation: truth "mutton", hypothesis "bttons".
        //   m→b (S), u deleted (D), t t o n hits, s inserted (I): distance 3, hits 4.
        // No cheaper alignment: both have 6 letters, so D = I; distance 2 would need either
        // S = 2 with 4 positional hits (only t/t lines up) or D = I = 1 with a common
        // subsequence of 5 (the longest is "tton", 4). For distance 3 the only split with
        // enough hits is S = D = I = 1 (S = 3 would need 3 positional hits), so the counts are unique.
        Assert.Equal((1, 1, 1, 4), Counts("mutton", "bttons"));
    }

    [Fact]
    public void Ties_prefer_substitution()
    {
        // "ab" → "ba": two substitutions, or delete a + insert a around the hit b; both cost 2.
        // Documented tie-break: substitution first.
        Assert.Equal((2, 0, 0, 0), Counts("ab", "ba"));
    }

    [Fact]
    public void Swapping_truth_and_hypothesis_swaps_deletions_and_insertions()
    {
        // Exercises both matrix layouts (shorter sequence along rows or columns).
        var forward = EditDistance.AlignCharacters("Paid to J. Marlow", "Pd J Marlowe");
        var backward = EditDistance.AlignCharacters("Pd J Marlowe", "Paid to J. Marlow");
        Assert.Equal(forward.Distance, backward.Distance);
        Assert.Equal(forward.Substitutions, backward.Substitutions);
        Assert.Equal(forward.Deletions, backward.Insertions);
        Assert.Equal(forward.Insertions, backward.Deletions);
    }

    [Fact]
    public void Words_are_aligned_as_units()
    {
        // Hand computation: "paid Marlow for thatching barn" → "pd Marlow thatching barn roof":
        // paid→pd (S), for deleted (D), roof inserted (I); Marlow, thatching, barn hit.
        // Unique for the same reasons as "mutton"/"bttons": only one positional hit (Marlow),
        // and the longest common word subsequence is 3.
        var c = EditDistance.AlignWords("paid Marlow for thatching barn", "pd Marlow thatching barn roof");
        Assert.Equal((1, 1, 1, 3), (c.Substitutions, c.Deletions, c.Insertions, c.Hits));
    }

    [Fact]
    public void Counts_add_field_by_field()
    {
        var sum = new EditCounts(1, 2, 3, 4) + new EditCounts(10, 20, 30, 40);
        Assert.Equal(new EditCounts(11, 22, 33, 44), sum);
        Assert.Equal(66, sum.Distance);
        Assert.Equal(11 + 22 + 44, sum.TruthLength);
        Assert.Equal(11 + 33 + 44, sum.HypothesisLength);
    }

    [Fact]
    public void Counts_reject_negative_values()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new EditCounts(0, -1, 0, 0));
    }
}
