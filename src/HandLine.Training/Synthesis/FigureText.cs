using System.Globalization;

namespace HandLine.Synthesis;

/// <summary>
/// Dates, sums of money and quantities written in many styles (see <see cref="DateStyle"/>,
/// <see cref="MoneyStyle"/>, <see cref="NumberStyle"/>), so the model meets figures in shapes that the
/// phrase templates never produce. Only symbols of the default character set are used.
/// </summary>
public static class FigureText
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private static readonly string[] MonthNames =
    [
        "January", "February", "March", "April", "May", "June", "July", "August", "September", "October",
        "November", "December",
    ];

    // The short forms clerks used; short months are not shortened.
    private static readonly string[] MonthShort =
    [
        "Jan.", "Feb.", "Mar.", "Apr.", "May", "June", "July", "Aug.", "Sept.", "Oct.", "Nov.", "Dec.",
    ];

    private static readonly string[] RomanMonths =
    [
        "i", "ii", "iii", "iv", "v", "vi", "vii", "viii", "ix", "x", "xi", "xii",
    ];

    private static readonly string[] Quarters = ["", "¼", "½", "¾"];

    public static string FormatDate(DateOnly date, DateStyle style)
    {
        var (d, m, y) = (date.Day, date.Month, date.Year);
        return style switch
        {
            DateStyle.DaySlashMonthYear => string.Create(Inv, $"{d}/{m}/{y}"),
            DateStyle.DayRomanMonthShortYear => string.Create(Inv, $"{d}.{RomanMonths[m - 1]}.{y % 100:D2}"),
            DateStyle.OrdinalDayMonthYear => string.Create(Inv, $"{Ordinal(d)} {MonthNames[m - 1]} {y}"),
            DateStyle.Iso => date.ToString("yyyy-MM-dd", Inv),
            DateStyle.MonthDayCommaYear => string.Create(Inv, $"{MonthNames[m - 1]} {d}, {y}"),
            DateStyle.DayShortMonthYear => string.Create(Inv, $"{d} {MonthShort[m - 1]} {y}"),
            DateStyle.DayDotMonthShortYear => string.Create(Inv, $"{d}.{m}.{y % 100:D2}"),
            DateStyle.OrdinalOfMonthYear => string.Create(Inv, $"{Ordinal(d)} of {MonthNames[m - 1]}, {y}"),
            _ => throw new ArgumentOutOfRangeException(nameof(style), style, "Unknown date style."),
        };
    }

    /// <summary>Throws when the style cannot show the amount (4/6 has no pounds, £12 no shillings or pence).</summary>
    public static string FormatMoney(Money money, MoneyStyle style)
    {
        ArgumentNullException.ThrowIfNull(money);
        var (l, s, d, q) = (money.Pounds, money.Shillings, money.Pence, Quarters[money.QuarterPence]);
        switch (style)
        {
            case MoneyStyle.ShillingsSlashPence or MoneyStyle.ShillingsPence when l > 0:
                throw new ArgumentException($"{style} has no place for pounds.", nameof(money));
            case MoneyStyle.Pence when l > 0 || s > 0:
                throw new ArgumentException("Pence alone has no place for pounds or shillings.", nameof(money));
            case MoneyStyle.WholePounds when s > 0 || d > 0 || q.Length > 0:
                throw new ArgumentException("Whole pounds have no shillings or pence.", nameof(money));
            case MoneyStyle.PoundsDotted or MoneyStyle.PoundsDashed or MoneyStyle.ShillingsSlashPence when q.Length > 0 && d == 0:
                // "£3.4.½" or "4/½" is not a way anyone writes a sum.
                throw new ArgumentException($"{style} writes a fraction of a penny only after whole pence.", nameof(money));
        }
        return style switch
        {
            MoneyStyle.PoundsShillingsPence => string.Create(Inv, $"£{l} {s}s {d}{q}d"),
            MoneyStyle.PoundsDotted => string.Create(Inv, $"£{l}.{s}.{d}{q}"),
            MoneyStyle.PoundsDashed => string.Create(Inv, $"£{l}-{s}-{d}{q}"),
            MoneyStyle.ShillingsSlashPence => d == 0 && q.Length == 0
                ? string.Create(Inv, $"{s}/-")
                : string.Create(Inv, $"{s}/{d}{q}"),
            MoneyStyle.ShillingsPence => string.Create(Inv, $"{s}s {d}{q}d"),
            MoneyStyle.Pence => string.Create(Inv, $"{d}{q}d"),
            MoneyStyle.WholePounds => "£" + l.ToString("#,0", Inv),
            _ => throw new ArgumentOutOfRangeException(nameof(style), style, "Unknown money style."),
        };
    }

    /// <summary>Throws when the style cannot show the value exactly (a fraction other than quarters, a negative value).</summary>
    public static string FormatNumber(decimal value, NumberStyle style)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(value);
        var whole = decimal.Truncate(value);
        var part = value - whole;
        return style switch
        {
            NumberStyle.Grouped when part != 0 => throw new ArgumentException("Grouped numbers are whole.", nameof(value)),
            NumberStyle.Grouped => whole.ToString("#,0", Inv),
            NumberStyle.Fraction when part * 4 != decimal.Truncate(part * 4) =>
                throw new ArgumentException("Fractions are quarters, halves or three quarters.", nameof(value)),
            // "½" rather than "0½".
            NumberStyle.Fraction => (whole == 0 && part != 0 ? "" : whole.ToString("0", Inv)) + Quarters[(int)(part * 4)],
            NumberStyle.Decimal when part * 100 != decimal.Truncate(part * 100) =>
                throw new ArgumentException("Decimal numbers have two places.", nameof(value)),
            NumberStyle.Decimal => value.ToString("0.00", Inv),
            _ => throw new ArgumentOutOfRangeException(nameof(style), style, "Unknown number style."),
        };
    }

    /// <summary>One date, sum or quantity in a style drawn at random; years from 1700 to 1999.</summary>
    public static string Next(Random rng)
    {
        ArgumentNullException.ThrowIfNull(rng);
        return rng.Next(3) switch
        {
            0 => FormatDate(NextDate(rng), Pick<DateStyle>(rng)),
            1 => NextMoney(rng),
            _ => NextNumber(rng),
        };
    }

    /// <summary>1st, 2nd, 3rd, 4th ... 11th, 12th, 13th ... 21st.</summary>
    public static string Ordinal(int n)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(n);
        var suffix = (n % 100) is >= 11 and <= 13 ? "th" : (n % 10) switch
        {
            1 => "st",
            2 => "nd",
            3 => "rd",
            _ => "th",
        };
        return n.ToString(Inv) + suffix;
    }

    private static DateOnly NextDate(Random rng)
    {
        var first = new DateOnly(1700, 1, 1).DayNumber;
        var last = new DateOnly(1999, 12, 31).DayNumber;
        return DateOnly.FromDayNumber(rng.Next(first, last + 1));
    }

    private static string NextMoney(Random rng)
    {
        var style = Pick<MoneyStyle>(rng);
        // Mostly small sums, now and then a large one, as in an account book.
        var pounds = style switch
        {
            MoneyStyle.ShillingsSlashPence or MoneyStyle.ShillingsPence or MoneyStyle.Pence => 0,
            MoneyStyle.WholePounds => rng.Next(4) == 0 ? rng.Next(1000, 20000) : rng.Next(1, 1000),
            _ => rng.Next(3) == 0 ? rng.Next(100, 5000) : rng.Next(1, 100),
        };
        if (style == MoneyStyle.WholePounds)
            return FormatMoney(new Money(pounds, 0, 0), style);
        var shillings = style == MoneyStyle.Pence ? 0 : rng.Next(style == MoneyStyle.PoundsShillingsPence ? 0 : 1, 20);
        var pence = rng.Next(style == MoneyStyle.Pence ? 1 : 0, 12);
        var quarters = pence > 0 && rng.Next(6) == 0 ? rng.Next(1, 4) : 0;
        return FormatMoney(new Money(pounds, shillings, pence, quarters), style);
    }

    private static string NextNumber(Random rng)
    {
        var style = Pick<NumberStyle>(rng);
        return style switch
        {
            NumberStyle.Grouped => FormatNumber(rng.Next(2) == 0 ? rng.Next(1000, 100000) : rng.Next(1, 1000), style),
            NumberStyle.Fraction => FormatNumber(rng.Next(0, 100) + rng.Next(1, 4) / 4m, style),
            _ => FormatNumber(rng.Next(0, 10000) / 100m, style),
        };
    }

    private static T Pick<T>(Random rng) where T : struct, Enum
    {
        var values = Enum.GetValues<T>();
        return values[rng.Next(values.Length)];
    }
}
