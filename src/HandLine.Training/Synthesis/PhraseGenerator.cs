using System.Globalization;
using System.Text;
using V = HandLine.Synthesis.ScenarioVocabulary;

namespace HandLine.Synthesis;

/// <summary>
/// Deterministic source of short ledger and register lines (about 15 to 45 characters) for the
/// invented Quillhaven estate and Foxmere parish. Templates that use rare symbols
/// (? ! ; : " ( ) * + = Q X Z q x z £ ¼ ½ ¾) are included so every symbol is learnt.
/// Not thread-safe: use one generator per thread.
/// </summary>
public sealed class PhraseGenerator
{
    private const int MinLength = 15;
    private const int MaxLength = 45;
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private readonly Random _rng;
    private readonly Func<string>[] _templates;

    public PhraseGenerator(int seed)
    {
        _rng = new Random(seed);
        _templates =
        [
            // Account book.
            () => $"{Date()} Recd of {Person()} {Money()}",
            () => $"{ShortDate()} Pd {Person()} {Money()}",
            () => $"Pd {Person()}, {Pick(V.Trades)}, {Money()}",
            () => $"{Quantity()} {Pick(["at", "per", "a"])} {Price()} {Money()}",
            () => $"{ShortDate()} {Quantity()} {Money()}",
            () => $"To {Pick(V.Services)} {Money()}",
            () => $"By cash of {Mister()} {Money()}",
            () => $"Rent of {Pick(V.Farms)} {Money()}",
            () => $"{Pick(["do.", "Do.", "\"", "ditto"])} {Pick(["do.", "\"", "for"])} {Pick(V.Services)} {Money()}",
            () => $"\" \" {Quantity()} {Money()}",
            () => $"Carried to fol. {Folio()} {Money()}",
            () => $"Brought fwd. from fol. {Folio()} {Money()}",
            () => $"{Money()} + {Money()} = {Money()}",
            () => $"Total = {Money()}",
            () => $"*see fol. {Folio()} for {Pick(V.Services)}",
            () => $"Xmas Quarter: {Pick(V.Farms)} {Money()}",
            () => $"{Mister()}'s acct. {Money()}; pd",
            () => $"Paid in full! {Person()}",
            () => $"Who pd for the {Good()}? {Money()}",
            () => $"{Person()} (dec'd) {Money()}",
            () => $"Quit rent {Pick(V.Farms)}: {Money()}",
            () => $"Tithe & taxes {Money()}; arrears {Money()}",
            () => $"Recd: {Quantity()} = {Money()}",
            () => $"fol. {Pick(V.Roman)} {Estate()} {ShortDate()}",
            () => $"{Estate()} Estate, {Year()}",
            () => $"Exors. of {Person()} {Money()}",
            () => $"Lent {Person()} {Money()} (to be repaid)",
            () => $"N.B. {Pick(V.Trades)}'s bill wrong!",
            () => $"{Fraction()} share of {Pick(V.Services)} {Money()}",
            // Parish register.
            () => $"Bapt. {Child()} of {Couple()}",
            () => $"{Date()} {Person()}, {Pick(V.Trades)}",
            () => $"Buried {Person()} aged {Age()}",
            () => $"Bur. {Person()}, {Age()} yrs.",
            () => $"Married {Man()} & {Woman()} {Pick(V.Surnames)}",
            () => $"{Person()}, abode {Pick(V.Places)}",
            () => $"Age {Age()}; abode {Pick(V.Places)}; {Pick(V.Trades)}",
            () => $"No. {_rng.Next(1, 900)} {Person()} bur. {ShortDate()}",
            () => $"Banns pub. {Date()}",
            () => $"Witness: {Person()}; {Person()}",
            () => $"{Person()} X his mark",
            () => $"aged {_rng.Next(50, 99)}? (illegible) {Pick(V.Places)}",
            () => $"{Woman()} {Pick(V.Surnames)} (widow) of {Pick(V.Places)}",
            () => $"called \"{Pick(["Old", "Young", "Quick", "Long"])} {Pick(V.Surnames)}\" by all",
            () => $"Parish of {V.Parish} {Year()} No. {_rng.Next(1, 400)}",
            () => $"s. of {Person()}, {Pick(V.Trades)}",
            () => $"{Man()} & {Woman()}, both of {Pick(V.Places)}",
        ];
    }

    /// <summary>The next line. The same seed always gives the same sequence.</summary>
    public string Next()
    {
        string line = "";
        // Retry until the line is a plausible single-line length; the last attempt stands otherwise.
        for (var attempt = 0; attempt < 20; attempt++)
        {
            line = _templates[_rng.Next(_templates.Length)]();
            if (line.Length is >= MinLength and <= MaxLength)
                break;
        }
        return line;
    }

    /// <summary>
    /// One entry of an account-book page: what the clerk wrote in the margin (a date or a number, often nothing), the
    /// description, and the sum for the money column (null when the row has none, as for a note or a heading).
    /// </summary>
    internal (string? Margin, string Description, string? Amount) LedgerEntry()
    {
        var margin = Chance(0.3) ? (Chance(0.6) ? ShortDate() : $"No. {_rng.Next(1, 300)}") : null;
        var description = _rng.Next(12) switch
        {
            0 => $"Recd of {Person()}",
            1 => $"Pd {Person()}, {Pick(V.Trades)}",
            2 => $"To {Pick(V.Services)}",
            3 => $"{Quantity()} {Pick(["at", "per", "a"])} {Price()}",
            4 => $"By cash of {Mister()}",
            5 => $"Rent of {Pick(V.Farms)}",
            6 => $"{Pick(["do.", "Do.", "ditto"])} {Pick(V.Services)}",
            7 => $"Carried to fol. {Folio()}",
            8 => $"Quit rent {Pick(V.Farms)}",
            9 => Pick(["Total", "Balance", "Arrears", "Sundries"]),
            10 => $"Exors. of {Person()}",
            _ => $"{Quantity()}",
        };
        return (margin, description, Chance(0.85) ? Money() : null);
    }

    /// <summary>One entry of a burial register page: number, name, abode and date of burial.</summary>
    internal (string Number, string Name, string Abode, string Date) RegisterEntry() =>
        (_rng.Next(1, 900).ToString(Inv), Person(), Pick(V.Places), Chance(0.5) ? ShortDate() : Date());

    /// <summary>How often each symbol (code point) occurs in the lines, in ordinal order.</summary>
    public static IReadOnlyDictionary<string, int> CountSymbols(IEnumerable<string> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        var counts = new SortedDictionary<string, int>(StringComparer.Ordinal);
        foreach (var line in lines)
        {
            ArgumentNullException.ThrowIfNull(line, nameof(lines));
            foreach (var rune in line.Normalize(NormalizationForm.FormC).EnumerateRunes())
            {
                var s = rune.ToString();
                counts[s] = counts.TryGetValue(s, out var n) ? n + 1 : 1;
            }
        }
        return counts;
    }

    private T Pick<T>(IReadOnlyList<T> items) => items[_rng.Next(items.Count)];

    private bool Chance(double p) => _rng.NextDouble() < p;

    private string Estate() => Chance(0.5) ? V.Estate : V.Parish;

    private string Year() => (1830 + _rng.Next(45)).ToString(Inv);

    private string Folio() => Chance(0.2) ? Pick(V.Roman) : _rng.Next(1, 240).ToString(Inv);

    private string Age() => Chance(0.15)
        ? $"{_rng.Next(1, 12)} mo."
        : Chance(0.1) ? $"{_rng.Next(1, 90)}{Fraction()}" : _rng.Next(1, 96).ToString(Inv);

    private string Fraction() => Pick(["¼", "½", "¾"]);

    private string Person() => Chance(0.3) ? $"{Woman()} {Pick(V.Surnames)}" : Man();

    private string Man()
    {
        var (full, abbreviated) = Pick(V.MenGiven);
        return $"{(Chance(0.5) ? abbreviated : full)} {Pick(V.Surnames)}";
    }

    private string Woman() => Pick(V.WomenGiven);

    private string Mister() => $"{Pick(["Mr.", "Mrs.", "Widow", "Exors. of"])} {Pick(V.Surnames)}";

    private string Child() =>
        Chance(0.5) ? $"{Pick(V.MenGiven).Full} s." : $"{Woman()} d.";

    private string Couple() =>
        $"{Pick(V.MenGiven).Short} & {Woman()} {Pick(V.Surnames)}";

    private string Good()
    {
        var (_, goods) = Pick(V.Measures);
        return Pick(goods);
    }

    private string Quantity()
    {
        var (unit, goods) = Pick(V.Measures);
        var n = Chance(0.2) ? Fraction() : _rng.Next(1, 40).ToString(Inv) + (Chance(0.15) ? Fraction() : "");
        return $"{n} {unit} {Pick(goods)}";
    }

    private string Price()
    {
        var s = _rng.Next(0, 20);
        var d = _rng.Next(1, 12);
        return Chance(0.5) ? $"{s}/{d}" : $"{d}{(Chance(0.3) ? Fraction() : "")}d";
    }

    /// <summary>Pounds, shillings and pence in the ways the books write them.</summary>
    private string Money()
    {
        var l = Chance(0.4) ? _rng.Next(1, 5) : _rng.Next(0, 120);
        var s = _rng.Next(0, 20);
        var d = _rng.Next(0, 12);
        var half = Chance(0.15) ? Fraction() : "";
        return _rng.Next(9) switch
        {
            0 => $"£{Math.Max(l, 1)} {s}s {d}{half}d",
            1 => $"£{Math.Max(l, 1)} {s}s. {d}d.",
            2 => $"{l} {s} {d}{half}",
            3 => $"£{Math.Max(l, 1)}.{s}.{d}",
            4 => $"{Math.Max(s, 1)}/{d}{half}",
            5 => $"{Math.Max(s, 1)}/-",
            6 => $"£{Math.Max(l, 1)}-{s}-{d}",
            7 => $"{d}{(half.Length > 0 ? half : "½")}d",
            _ => $"£{Math.Max(l, 1)} {s}s",
        };
    }

    private string Day()
    {
        var n = _rng.Next(1, 29);
        var suffix = (n % 10, n / 10) switch
        {
            (_, 1) => "th",
            (1, _) => "st",
            (2, _) => "nd",
            (3, _) => "rd",
            _ => "th",
        };
        return $"{n}{suffix}";
    }

    /// <summary>Dates in several clerks' styles.</summary>
    private string Date()
    {
        var m = _rng.Next(12);
        return _rng.Next(6) switch
        {
            0 => $"{Day()} {V.MonthsFull[m]} {Year()}",
            1 => $"{_rng.Next(1, 29)}/{m + 1}/{Year()}",
            2 => $"{Pick(V.MonthsShort[m])} {_rng.Next(1, 29)}",
            3 => $"{V.MonthsFull[m]} {Day()}",
            4 => $"{_rng.Next(1, 29)} {Pick(V.MonthsShort[m])} {Year()}",
            _ => $"{Year()} {Pick(V.MonthsShort[m])} {Day()}",
        };
    }

    private string ShortDate()
    {
        var m = _rng.Next(12);
        return Chance(0.5) ? $"{Pick(V.MonthsShort[m])} {_rng.Next(1, 29)}" : $"{_rng.Next(1, 29)}/{m + 1}";
    }
}
