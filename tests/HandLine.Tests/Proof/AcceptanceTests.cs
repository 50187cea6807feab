using HandLine.Proof;

namespace HandLine.Tests.Proof;

public sealed class AcceptanceTests
{
    [Theory]
    [InlineData(0.01, 0.04, AcceptanceVerdict.Pass)]
    [InlineData(0.01, 0.05, AcceptanceVerdict.Pass)] // the upper end equal to the threshold still passes ("at most")
    [InlineData(0.051, 0.09, AcceptanceVerdict.Fail)]
    [InlineData(0.05, 0.09, AcceptanceVerdict.Inconclusive)] // the lower end equal to it: the interval contains it
    [InlineData(0.03, 0.07, AcceptanceVerdict.Inconclusive)]
    public void TheVerdictFollowsWhereTheIntervalLiesAgainstTheThreshold(double lower, double upper, AcceptanceVerdict expected) =>
        Assert.Equal(expected, Acceptance.Decide(new ConfidenceInterval(lower, upper, 0.95), 0.05));
}
