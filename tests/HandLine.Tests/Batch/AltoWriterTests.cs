using System.Globalization;
using System.Xml.Linq;
using HandLine.Batch;

namespace HandLine.Tests.Batch;

public sealed class AltoWriterTests
{
    private static readonly XNamespace Alto = AltoWriter.Namespace;

    private static readonly AltoLine[] Lines =
    [
        new(0, 1, 120, 200, 400, 40, "Recd of Josiah Pelling", Chars("Recd of Josiah Pelling", 0.9)),
        new(0, 2, 700, 205, 120, 38, "£1 4s 6d", Chars("£1 4s 6d", 0.5)),
        new(1, 1, 150, 260, 300, 42, "Rent of Nether Farm", []),
    ];

    private static (string, double)[] Chars(string text, double confidence) =>
        text.EnumerateRunes().Select(r => (r.ToString(), confidence)).ToArray();

    /// <summary>
    /// The rules of ALTO XML schema v4 (Library of Congress) that this file relies on, as we state them (recalled
    /// from memory of the standard, not copied from the schema): the root is alto in the namespace
    /// http://www.loc.gov/standards/alto/ns-v4#; Description (with MeasurementUnit) comes before Layout; Layout holds
    /// Page, Page holds PrintSpace, PrintSpace holds TextBlock, TextBlock holds TextLine, TextLine holds String and
    /// SP only; Page needs ID and PHYSICAL_IMG_NR; TextBlock, TextLine and String carry ID; String needs CONTENT;
    /// IDs are unique in the file (xsd:ID); HPOS, VPOS, WIDTH and HEIGHT are numbers (here whole pixels, the
    /// MeasurementUnit) and lie inside the page; WC, the word confidence, lies in [0, 1].
    /// </summary>
    [Fact]
    public void APageFollowsTheAltoV4RulesAndParsesBackToTheBoxesAndText()
    {
        const int width = 1000, height = 1400;
        var doc = XDocument.Parse(AltoWriter.Write("page-0001.png", width, height, Lines, "abc123"));
        var root = doc.Root!;
        Assert.Equal(Alto + "alto", root.Name);
        Assert.Equal([Alto + "Description", Alto + "Layout"], root.Elements().Select(e => e.Name));
        Assert.Equal("pixel", root.Element(Alto + "Description")!.Element(Alto + "MeasurementUnit")!.Value);

        var page = Assert.Single(root.Element(Alto + "Layout")!.Elements());
        Assert.Equal(Alto + "Page", page.Name);
        Assert.NotNull(page.Attribute("ID"));
        Assert.NotNull(page.Attribute("PHYSICAL_IMG_NR"));
        Assert.Equal(width, Int(page, "WIDTH"));
        Assert.Equal(height, Int(page, "HEIGHT"));
        var printSpace = Assert.Single(page.Elements());
        Assert.Equal(Alto + "PrintSpace", printSpace.Name);

        var blocks = printSpace.Elements().ToArray();
        Assert.All(blocks, b => Assert.Equal(Alto + "TextBlock", b.Name));
        Assert.Equal(2, blocks.Length); // one per entry
        var lines = blocks.SelectMany(b => b.Elements()).ToArray();
        Assert.All(lines, l => Assert.Equal(Alto + "TextLine", l.Name));
        Assert.All(lines.SelectMany(l => l.Elements()), e => Assert.Contains(e.Name.LocalName, new[] { "String", "SP" }));

        var ids = doc.Descendants().Select(e => e.Attribute("ID")?.Value).Where(v => v is not null).ToArray();
        Assert.Equal(ids.Length, ids.Distinct().Count());
        foreach (var e in blocks.Concat(lines).Concat(lines.SelectMany(l => l.Elements(Alto + "String"))))
        {
            Assert.NotNull(e.Attribute("ID"));
            int x = Int(e, "HPOS"), y = Int(e, "VPOS"), w = Int(e, "WIDTH"), h = Int(e, "HEIGHT");
            Assert.True(x >= 0 && y >= 0 && w >= 1 && h >= 1 && x + w <= width && y + h <= height, $"{e.Name.LocalName} {x},{y},{w},{h} outside the page");
        }
        foreach (var s in lines.SelectMany(l => l.Elements(Alto + "String")))
        {
            Assert.False(string.IsNullOrEmpty(s.Attribute("CONTENT")?.Value));
            var wc = double.Parse(s.Attribute("WC")!.Value, CultureInfo.InvariantCulture);
            Assert.InRange(wc, 0, 1);
        }

        // Back to the run's boxes and text, in reading order.
        Assert.Equal(Lines.Select(l => (l.X, l.Y, l.Width, l.Height)),
            lines.Select(l => (Int(l, "HPOS"), Int(l, "VPOS"), Int(l, "WIDTH"), Int(l, "HEIGHT"))));
        Assert.Equal(Lines.Select(l => l.Text),
            lines.Select(l => string.Join(" ", l.Elements(Alto + "String").Select(s => s.Attribute("CONTENT")!.Value))));
        // A word's confidence is its characters' mean.
        Assert.Equal("0.5", lines[1].Elements(Alto + "String").First().Attribute("WC")!.Value);
    }

    private static int Int(XElement e, string name) =>
        int.Parse(e.Attribute(name)?.Value ?? throw new InvalidOperationException($"{e.Name.LocalName} has no {name}"), NumberStyles.None, CultureInfo.InvariantCulture);
}
