using System.Net;
using System.Text;
using HandLine.Formats;
using HandLine.Scoring;

namespace HandLine.Proof;

/// <summary>
/// Truth and machine text as HTML with every difference marked by more than colour: a missed character is struck
/// through (&lt;del&gt;), a wrong one underlined with a wavy line, an extra one double-underlined (&lt;ins&gt;), and the
/// place of a missed character in the machine text shows a caret. Each mark has a title that says what it is.
/// All text is HTML-escaped.
/// </summary>
public static class DifferenceMarkup
{
    /// <summary>Marked truth and machine text of one line (the alignment CER counts).</summary>
    public static (string Truth, string Machine) Mark(string truth, string machine)
    {
        ArgumentNullException.ThrowIfNull(truth);
        ArgumentNullException.ThrowIfNull(machine);
        var t = TextUnits.CodePoints(truth);
        var m = TextUnits.CodePoints(machine);
        var alignment = EditDistance.Trace<int>(t, m);
        var pairedWith = Enumerable.Repeat(-1, t.Length).ToArray();
        for (var j = 0; j < m.Length; j++)
            if (alignment.TruthIndex[j] >= 0)
                pairedWith[alignment.TruthIndex[j]] = j;

        var truthHtml = new StringBuilder();
        for (var i = 0; i < t.Length; i++)
        {
            var c = Visible(t[i]);
            if (pairedWith[i] < 0)
                truthHtml.Append("<del title=\"missed by the machine\">").Append(c).Append("</del>");
            else if (!alignment.HypothesisHits[pairedWith[i]])
                truthHtml.Append("<span class=\"sub\" title=\"read as ").Append(Visible(m[pairedWith[i]])).Append("\">").Append(c).Append("</span>");
            else
                truthHtml.Append(WebUtility.HtmlEncode(new Rune(t[i]).ToString()));
        }

        var machineHtml = new StringBuilder();
        for (var j = 0; j <= m.Length; j++)
        {
            if (alignment.DeletionsBefore[j] > 0)
                machineHtml.Append("<span class=\"gap\" title=\"").Append(alignment.DeletionsBefore[j])
                    .Append(" character(s) missing here\">‸</span>");
            if (j == m.Length)
                break;
            var c = Visible(m[j]);
            if (alignment.TruthIndex[j] < 0)
                machineHtml.Append("<ins title=\"extra character\">").Append(c).Append("</ins>");
            else if (!alignment.HypothesisHits[j])
                machineHtml.Append("<span class=\"sub\" title=\"should be ").Append(Visible(t[alignment.TruthIndex[j]])).Append("\">").Append(c).Append("</span>");
            else
                machineHtml.Append(WebUtility.HtmlEncode(new Rune(m[j]).ToString()));
        }
        return (truthHtml.ToString(), machineHtml.ToString());
    }

    /// <summary>An error's character escaped, with a space shown as '␣' so that a marked space can be seen.</summary>
    private static string Visible(int codePoint) =>
        codePoint == ' ' ? "␣" : WebUtility.HtmlEncode(new Rune(codePoint).ToString());
}
