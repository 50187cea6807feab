using System.Globalization;
using System.Net;
using System.Text;

namespace HandLine.Proof;

/// <summary>
/// The report's plots as inline SVG written here: no plotting library, so no native drawing code and nothing to
/// load; the browser draws them. Every number is written with the invariant culture.
/// </summary>
internal static class SvgCharts
{
    private const int Width = 640, Height = 280, Left = 56, Right = 16, Top = 16, Bottom = 48;
    private const int PlotWidth = Width - Left - Right, PlotHeight = Height - Top - Bottom;

    /// <summary>Histogram of per-line CER in 5-point bins from 0 to 100 %; the last bin also holds rates above 100 %.</summary>
    public static string Histogram(IReadOnlyList<double> lineCers)
    {
        const int bins = 20;
        var counts = new int[bins];
        foreach (var cer in lineCers)
            counts[Math.Clamp((int)Math.Floor(cer * bins), 0, bins - 1)]++;
        var max = Math.Max(1, counts.Max());
        var svg = Open("histogram", "Histogram of per-line CER");
        AxisFrame(svg, "line CER (%)", "lines");
        for (var b = 0; b <= bins; b += 4)
            XTick(svg, Left + PlotWidth * b / (double)bins, F(b * 100.0 / bins, "0"));
        foreach (var y in Ticks(max))
            YTick(svg, Top + PlotHeight - PlotHeight * y / (double)max, y.ToString(CultureInfo.InvariantCulture));
        var barWidth = PlotWidth / (double)bins;
        for (var b = 0; b < bins; b++)
        {
            var h = PlotHeight * counts[b] / (double)max;
            var range = b == bins - 1 ? $"{b * 5} % or more" : $"{b * 5} % to under {(b + 1) * 5} %";
            svg.Append(CultureInfo.InvariantCulture, $"<rect class=\"bar\" x=\"{F(Left + b * barWidth + 1)}\" y=\"{F(Top + PlotHeight - h)}\" width=\"{F(barWidth - 2)}\" height=\"{F(h)}\">")
                .Append(CultureInfo.InvariantCulture, $"<title>{counts[b]} line(s) with CER {range}</title></rect>");
        }
        return svg.Append("</svg>").ToString();
    }

    /// <summary>One point per line: the machine's confidence across, the line's CER up (capped at 100 %, marked as a triangle).</summary>
    public static string ConfidenceScatter(IReadOnlyList<(double Confidence, double Cer, string Id)> points)
    {
        var svg = Open("confidence-plot", "Line confidence against line CER");
        AxisFrame(svg, "line confidence", "line CER (%)");
        for (var x = 0; x <= 10; x += 2)
            XTick(svg, Left + PlotWidth * x / 10.0, F(x / 10.0, "0.0"));
        for (var y = 0; y <= 100; y += 25)
            YTick(svg, Top + PlotHeight - PlotHeight * y / 100.0, y.ToString(CultureInfo.InvariantCulture));
        foreach (var (confidence, cer, id) in points)
        {
            var x = Left + PlotWidth * Math.Clamp(confidence, 0, 1);
            var y = Top + PlotHeight - PlotHeight * Math.Min(cer, 1);
            var title = $"<title>{WebUtility.HtmlEncode(id)}: confidence {F(confidence, "0.000")}, CER {F(cer * 100, "0.0")} %</title>";
            if (cer > 1)
                svg.Append(CultureInfo.InvariantCulture, $"<path class=\"point capped\" d=\"M{F(x - 4)},{F(y + 3)} L{F(x + 4)},{F(y + 3)} L{F(x)},{F(y - 4)} Z\">{title}</path>");
            else
                svg.Append(CultureInfo.InvariantCulture, $"<circle class=\"point\" cx=\"{F(x)}\" cy=\"{F(y)}\" r=\"3.5\">{title}</circle>");
        }
        return svg.Append("</svg>").ToString();
    }

    private static StringBuilder Open(string id, string label) =>
        new StringBuilder().Append(CultureInfo.InvariantCulture,
            $"<svg id=\"{id}\" xmlns=\"http://www.w3.org/2000/svg\" width=\"{Width}\" height=\"{Height}\" viewBox=\"0 0 {Width} {Height}\" role=\"img\" aria-label=\"{label}\">");

    private static void AxisFrame(StringBuilder svg, string xLabel, string yLabel)
    {
        svg.Append(CultureInfo.InvariantCulture, $"<line class=\"axis\" x1=\"{Left}\" y1=\"{Top + PlotHeight}\" x2=\"{Left + PlotWidth}\" y2=\"{Top + PlotHeight}\"/>")
            .Append(CultureInfo.InvariantCulture, $"<line class=\"axis\" x1=\"{Left}\" y1=\"{Top}\" x2=\"{Left}\" y2=\"{Top + PlotHeight}\"/>")
            .Append(CultureInfo.InvariantCulture, $"<text class=\"label\" x=\"{Left + PlotWidth / 2}\" y=\"{Height - 8}\" text-anchor=\"middle\">{xLabel}</text>")
            .Append(CultureInfo.InvariantCulture, $"<text class=\"label\" transform=\"translate(14 {Top + PlotHeight / 2}) rotate(-90)\" text-anchor=\"middle\">{yLabel}</text>");
    }

    private static void XTick(StringBuilder svg, double x, string label) =>
        svg.Append(CultureInfo.InvariantCulture, $"<line class=\"tick\" x1=\"{F(x)}\" y1=\"{Top + PlotHeight}\" x2=\"{F(x)}\" y2=\"{Top + PlotHeight + 5}\"/>")
            .Append(CultureInfo.InvariantCulture, $"<text class=\"tick-label\" x=\"{F(x)}\" y=\"{Top + PlotHeight + 18}\" text-anchor=\"middle\">{label}</text>");

    private static void YTick(StringBuilder svg, double y, string label) =>
        svg.Append(CultureInfo.InvariantCulture, $"<line class=\"grid\" x1=\"{Left}\" y1=\"{F(y)}\" x2=\"{Left + PlotWidth}\" y2=\"{F(y)}\"/>")
            .Append(CultureInfo.InvariantCulture, $"<text class=\"tick-label\" x=\"{Left - 6}\" y=\"{F(y + 4)}\" text-anchor=\"end\">{label}</text>");

    /// <summary>Up to about five whole-number ticks from 0 to <paramref name="max"/>.</summary>
    private static IEnumerable<int> Ticks(int max)
    {
        var step = Math.Max(1, (int)Math.Ceiling(max / 5.0));
        for (var y = 0; y <= max; y += step)
            yield return y;
    }

    private static string F(double value, string format = "0.##") => value.ToString(format, CultureInfo.InvariantCulture);
}
