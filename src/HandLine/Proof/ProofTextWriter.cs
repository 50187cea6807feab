using System.Globalization;
using System.Text.Json.Nodes;

namespace HandLine.Proof;

/// <summary>The proof figures as text lines after <c>score</c>'s table, and as a JSON object.</summary>
public static class ProofTextWriter
{
    public static void Write(TextWriter writer, ProofAnalysis analysis, int confusionRows)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(analysis);
        ArgumentOutOfRangeException.ThrowIfNegative(confusionRows);
        var inv = CultureInfo.InvariantCulture;
        writer.WriteLine();
        writer.WriteLine(string.Format(inv, "95 % interval (bootstrap over lines, {0} resamples, seed {1}): CER {2:0.00} – {3:0.00} %, WER {4:0.00} – {5:0.00} %",
            analysis.Options.Resamples, analysis.Options.Seed, analysis.CerInterval.Lower * 100, analysis.CerInterval.Upper * 100,
            analysis.WerInterval.Lower * 100, analysis.WerInterval.Upper * 100));
        writer.WriteLine(string.Format(inv, "Design effect {0:0.00} (errors clustered in lines; 1 = independent characters)", analysis.DesignEffect));
        if (confusionRows > 0 && analysis.Confusions.Count > 0)
        {
            writer.WriteLine();
            writer.WriteLine("Most frequent character errors (truth -> machine)");
            foreach (var c in analysis.Confusions.Take(confusionRows))
                writer.WriteLine(string.Format(inv, "{0,6}  {1,-12}  {2} -> {3}", c.Count, c.Kind.ToString().ToLowerInvariant(), Show(c.Truth), Show(c.Machine)));
        }
        if (analysis.Verdict is { } verdict)
        {
            writer.WriteLine();
            writer.WriteLine(string.Format(inv, "Verdict: {0} (contract CER at most {1:0.00} %; 95 % interval {2:0.00} – {3:0.00} %)",
                verdict.ToString().ToUpperInvariant(), analysis.Options.MaxCer!.Value * 100, analysis.CerInterval.Lower * 100, analysis.CerInterval.Upper * 100));
        }
    }

    /// <summary>The figures as a JSON object (the "proof" member of <c>score --json</c>).</summary>
    public static JsonObject ToJson(ProofAnalysis analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        var proof = new JsonObject
        {
            ["level"] = analysis.CerInterval.Level,
            ["resamples"] = analysis.Options.Resamples,
            ["seed"] = analysis.Options.Seed,
            ["cer_lower"] = analysis.CerInterval.Lower,
            ["cer_upper"] = analysis.CerInterval.Upper,
            ["wer_lower"] = analysis.WerInterval.Lower,
            ["wer_upper"] = analysis.WerInterval.Upper,
            ["design_effect"] = analysis.DesignEffect,
            ["max_cer"] = analysis.Options.MaxCer,
            ["verdict"] = analysis.Verdict?.ToString().ToLowerInvariant(),
        };
        var confusions = new JsonArray();
        foreach (var c in analysis.Confusions)
            confusions.Add(new JsonObject
            {
                ["kind"] = c.Kind.ToString().ToLowerInvariant(),
                ["truth"] = c.Truth,
                ["machine"] = c.Machine,
                ["count"] = c.Count,
            });
        proof["confusions"] = confusions;
        var groups = new JsonArray();
        foreach (var ((key, value), ci) in analysis.GroupCerIntervals.OrderBy(p => p.Key.Key, StringComparer.Ordinal).ThenBy(p => p.Key.Value, StringComparer.Ordinal))
            groups.Add(new JsonObject { ["key"] = key, ["value"] = value, ["cer_lower"] = ci.Lower, ["cer_upper"] = ci.Upper });
        proof["groups"] = groups;
        return proof;
    }

    public static void WritePlan(TextWriter writer, SamplePlan plan, string designEffectSource, string lineCharsSource)
    {
        ArgumentNullException.ThrowIfNull(writer);
        ArgumentNullException.ThrowIfNull(plan);
        var inv = CultureInfo.InvariantCulture;
        writer.WriteLine(string.Format(inv, "Plan for a {0:0} % interval of ±{1:0.00} points at an expected CER of {2:0.00} %:",
            plan.Level * 100, plan.HalfWidth * 100, plan.ExpectedCer * 100));
        writer.WriteLine(string.Format(inv, "  characters  n = z² p (1 − p) / e² = {0:0.0000}² × {1:0.####} × {2:0.####} / {3:0.######}² = {4:0.00} -> {5}",
            plan.Z, plan.ExpectedCer, 1 - plan.ExpectedCer, plan.HalfWidth, plan.ExactChars, plan.Chars));
        writer.WriteLine(string.Format(inv, "  design effect {0:0.00} ({1}), characters per line {2:0.0} ({3})",
            plan.DesignEffect, designEffectSource, plan.CharsPerLine, lineCharsSource));
        writer.WriteLine(string.Format(inv, "  lines  n × design effect / characters per line = {0:0.00} × {1:0.00} / {2:0.0} -> {3}",
            plan.ExactChars, plan.DesignEffect, plan.CharsPerLine, plan.Lines));
    }

    private static string Show(string c) => c.Length == 0 ? "(none)" : c == " " ? "(space)" : $"'{c}'";
}
