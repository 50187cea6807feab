using HandLine.Scoring;

namespace HandLine.Tests.Scoring;

public sealed class RunReaderTests
{
    [Fact]
    public void Lines_of_a_source_are_joined_in_line_order()
    {
        using var run = new TempFolder();
        File.WriteAllText(run.File("lines.jsonl"),
            """
            {"source":"img/p001.png","line":2,"text":"at Michaelmas","confidence":0.8}
            {"source":"img/p002.png","line":0,"text":"Carriage of coals"}
            {"source":"img/p001.png","line":0,"text":"Received of the Widow Ashcombe"}

            {"source":"img/p001.png","line":1,"text":"for the Mill Close"}
            {"source":"img/p003.png","line":0,"text":"Tithe"}
            {"source":"img/p003.png","line":1,"text":""}
            {"source":"img/p003.png","line":2,"text":"paid"}
            """);

        var hypotheses = RunReader.ReadHypotheses(run.Path);

        Assert.Equal(3, hypotheses.Count);
        Assert.Equal("Received of the Widow Ashcombe for the Mill Close at Michaelmas", hypotheses["img/p001.png"]);
        Assert.Equal("Carriage of coals", hypotheses["img/p002.png"]);
        Assert.Equal("Tithe paid", hypotheses["img/p003.png"]); // an empty line adds no extra space
    }

    [Theory]
    [InlineData("{\"source\":\"a.png\",\"line\":0,\"text\":\"Tithe\"", "not valid JSON")]
    [InlineData("[1, 2]", "expected a JSON object")]
    [InlineData("{\"line\":0,\"text\":\"Tithe\"}", "'source'")]
    [InlineData("{\"source\":\"a.png\",\"text\":\"Tithe\"}", "'line'")]
    [InlineData("{\"source\":\"a.png\",\"line\":-1,\"text\":\"Tithe\"}", "'line'")]
    [InlineData("{\"source\":\"a.png\",\"line\":0.5,\"text\":\"Tithe\"}", "'line'")]
    [InlineData("{\"source\":\"a.png\",\"line\":1}", "'text'")]
    [InlineData("{\"source\":\"a.png\",\"line\":1,\"text\":null}", "'text'")]
    [InlineData("{\"source\":\"b.png\",\"line\":0,\"text\":\"again\"}", "line 0 twice")]
    public void A_bad_record_is_an_error_naming_file_and_line(string badLine, string reason)
    {
        using var run = new TempFolder();
        var file = run.File("lines.jsonl");
        File.WriteAllText(file, "{\"source\":\"b.png\",\"line\":0,\"text\":\"Tithe\"}\n" + badLine + "\n");

        var error = Assert.Throws<InputException>(() => RunReader.ReadHypotheses(run.Path));

        Assert.Equal("run", error.Stage);
        Assert.Equal(file, error.Path);
        Assert.StartsWith("line 2: ", error.Reason);
        Assert.Contains(reason, error.Reason);
    }

    [Fact]
    public void A_run_without_lines_file_is_an_error()
    {
        using var run = new TempFolder();

        var error = Assert.Throws<InputException>(() => RunReader.ReadHypotheses(run.Path));

        Assert.Equal("run", error.Stage);
        Assert.Contains("no lines.jsonl", error.Reason);
    }
}
