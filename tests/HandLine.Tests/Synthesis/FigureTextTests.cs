using System.Globalization;
using System.Text.RegularExpressions;
using HandLine.Model;
using HandLine.Synthesis;

namespace HandLine.Tests.Synthesis;

public sealed class FigureTextTests
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    [Theory]
    [InlineData(DateStyle.DaySlashMonthYear, "12/3/1851")]
    [InlineData(DateStyle.DayRomanMonthShortYear, "12.iii.51")]
    [InlineData(DateStyle.OrdinalDayMonthYear, "12th March 1851")]
    [InlineData(DateStyle.Iso, "1851-03-12")]
    [InlineData(DateStyle.MonthDayCommaYear, "March 12, 1851")]
    [InlineData(DateStyle.DayShortMonthYear, "12 Mar. 1851")]
    [InlineData(DateStyle.DayDotMonthShortYear, "12.3.51")]
    [InlineData(DateStyle.OrdinalOfMonthYear, "12th of March, 1851")]
    public void Dates_are_written_as_each_style_claims(DateStyle style, string expected) =>
        Assert.Equal(expected, FigureText.FormatDate(new DateOnly(1851, 3, 12), style));

    [Fact]
    public void Ordinals_follow_English_suffixes()
    {
        // English ordinal suffixes (general knowledge, recalled from memory): 11th-13th take "th".
        Assert.Equal(["1st", "2nd", "3rd", "4th", "11th", "12th", "13th", "21st", "22nd", "23rd", "31st", "101st", "111th"],
            new[] { 1, 2, 3, 4, 11, 12, 13, 21, 22, 23, 31, 101, 111 }.Select(FigureText.Ordinal));
        Assert.Equal("3rd March 1851", FigureText.FormatDate(new DateOnly(1851, 3, 3), DateStyle.OrdinalDayMonthYear));
    }

    [Fact]
    public void Random_dates_parse_back_to_the_same_day()
    {
        var rng = new Random(5);
        for (var i = 0; i < 300; i++)
        {
            var date = DateOnly.FromDayNumber(rng.Next(new DateOnly(1700, 1, 1).DayNumber, new DateOnly(1999, 12, 31).DayNumber + 1));
            // Independent readings: .NET's exact parser for the numeric and full-month styles.
            Assert.Equal(date, DateOnly.ParseExact(FigureText.FormatDate(date, DateStyle.DaySlashMonthYear), "d/M/yyyy", Inv));
            Assert.Equal(date, DateOnly.ParseExact(FigureText.FormatDate(date, DateStyle.Iso), "yyyy-MM-dd", Inv));
            Assert.Equal(date, DateOnly.ParseExact(FigureText.FormatDate(date, DateStyle.MonthDayCommaYear), "MMMM d, yyyy", Inv));
            var shortYear = DateOnly.ParseExact(FigureText.FormatDate(date, DateStyle.DayDotMonthShortYear), "d.M.yy", Inv);
            Assert.Equal((date.Day, date.Month, date.Year % 100), (shortYear.Day, shortYear.Month, shortYear.Year % 100));

            var roman = Regex.Match(FigureText.FormatDate(date, DateStyle.DayRomanMonthShortYear), @"^(\d{1,2})\.([ivx]+)\.(\d\d)$");
            Assert.True(roman.Success);
            string[] numerals = ["i", "ii", "iii", "iv", "v", "vi", "vii", "viii", "ix", "x", "xi", "xii"];
            Assert.Equal((date.Day, date.Month, date.Year % 100),
                (int.Parse(roman.Groups[1].Value, Inv), Array.IndexOf(numerals, roman.Groups[2].Value) + 1, int.Parse(roman.Groups[3].Value, Inv)));

            var ordinal = FigureText.FormatDate(date, DateStyle.OrdinalOfMonthYear);
            var m = Regex.Match(ordinal, @"^(\d{1,2})(st|nd|rd|th) of ([A-Z][a-z]+), (\d{4})$");
            Assert.True(m.Success, ordinal);
            Assert.Equal(date, DateOnly.ParseExact($"{m.Groups[1].Value} {m.Groups[3].Value} {m.Groups[4].Value}", "d MMMM yyyy", Inv));

            var abbreviated = FigureText.FormatDate(date, DateStyle.DayShortMonthYear);
            Assert.Matches(@"^\d{1,2} (Jan\.|Feb\.|Mar\.|Apr\.|May|June|July|Aug\.|Sept\.|Oct\.|Nov\.|Dec\.) \d{4}$", abbreviated);
        }
    }

    [Theory]
    [InlineData(3, 4, 6, 0, MoneyStyle.PoundsShillingsPence, "£3 4s 6d")]
    [InlineData(3, 4, 6, 2, MoneyStyle.PoundsShillingsPence, "£3 4s 6½d")]
    [InlineData(12, 10, 0, 0, MoneyStyle.PoundsDotted, "£12.10.0")]
    [InlineData(12, 10, 0, 0, MoneyStyle.PoundsDashed, "£12-10-0")]
    [InlineData(0, 4, 6, 0, MoneyStyle.ShillingsSlashPence, "4/6")]
    [InlineData(0, 4, 0, 0, MoneyStyle.ShillingsSlashPence, "4/-")]
    [InlineData(0, 2, 6, 0, MoneyStyle.ShillingsPence, "2s 6d")]
    [InlineData(0, 0, 9, 3, MoneyStyle.Pence, "9¾d")]
    [InlineData(1250, 0, 0, 0, MoneyStyle.WholePounds, "£1,250")]
    public void Money_is_written_as_each_style_claims(int l, int s, int d, int q, MoneyStyle style, string expected) =>
        Assert.Equal(expected, FigureText.FormatMoney(new Money(l, s, d, q), style));

    [Fact]
    public void Money_styles_refuse_what_they_cannot_show()
    {
        Assert.Throws<ArgumentException>(() => FigureText.FormatMoney(new Money(1, 4, 6), MoneyStyle.ShillingsSlashPence));
        Assert.Throws<ArgumentException>(() => FigureText.FormatMoney(new Money(0, 1, 6), MoneyStyle.Pence));
        Assert.Throws<ArgumentException>(() => FigureText.FormatMoney(new Money(3, 0, 1), MoneyStyle.WholePounds));
        Assert.Throws<ArgumentOutOfRangeException>(() => new Money(1, 20, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => new Money(1, 0, 12));
    }

    [Theory]
    [InlineData("1250", NumberStyle.Grouped, "1,250")]
    [InlineData("1250000", NumberStyle.Grouped, "1,250,000")]
    [InlineData("3.5", NumberStyle.Fraction, "3½")]
    [InlineData("0.75", NumberStyle.Fraction, "¾")]
    [InlineData("12.75", NumberStyle.Decimal, "12.75")]
    [InlineData("4", NumberStyle.Decimal, "4.00")]
    public void Numbers_are_written_as_each_style_claims(string value, NumberStyle style, string expected) =>
        Assert.Equal(expected, FigureText.FormatNumber(decimal.Parse(value, Inv), style));

    [Fact]
    public void Random_figures_fit_the_character_set_and_sums_keep_shillings_and_pence_in_range()
    {
        var rng = new Random(8);
        var figures = Enumerable.Range(0, 2000).Select(_ => FigureText.Next(rng)).ToList();
        Assert.All(figures, f => Assert.True(CharacterSet.Default.CanEncode(f), f));
        // "£L Ss Dd" and "S/D": shillings below 20, pence below 12 (12 pence to the shilling, 20 shillings to the pound).
        foreach (var f in figures)
        {
            var lsd = Regex.Match(f, @"^£([\d,]+) (\d+)s (\d+)[¼½¾]?d$");
            if (lsd.Success)
                Assert.True(int.Parse(lsd.Groups[2].Value, Inv) < 20 && int.Parse(lsd.Groups[3].Value, Inv) < 12, f);
            var slash = Regex.Match(f, @"^(\d+)/(\d+)[¼½¾]?$");
            if (slash.Success)
                Assert.True(int.Parse(slash.Groups[1].Value, Inv) < 20 && int.Parse(slash.Groups[2].Value, Inv) < 12, f);
        }
        // Every kind turns up: numeric dates, sums in £ s d, grouped thousands and fractions.
        Assert.Contains(figures, f => Regex.IsMatch(f, @"^\d{4}-\d\d-\d\d$"));
        Assert.Contains(figures, f => Regex.IsMatch(f, @"^£\d+ \d+s \d+[¼½¾]?d$"));
        Assert.Contains(figures, f => Regex.IsMatch(f, @"^\d{1,3}(,\d{3})+$"));
        Assert.Contains(figures, f => Regex.IsMatch(f, @"^\d*[¼½¾]$"));
    }
}
