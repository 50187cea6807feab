namespace HandLine.Synthesis;

/// <summary>Ways a clerk may write a date; each example is 12 March 1851.</summary>
public enum DateStyle
{
    /// <summary>12/3/1851</summary>
    DaySlashMonthYear,

    /// <summary>12.iii.51 (month in lower-case Roman numerals, two-digit year)</summary>
    DayRomanMonthShortYear,

    /// <summary>12th March 1851</summary>
    OrdinalDayMonthYear,

    /// <summary>1851-03-12 (ISO 8601 calendar date)</summary>
    Iso,

    /// <summary>March 12, 1851</summary>
    MonthDayCommaYear,

    /// <summary>12 Mar. 1851 (May, June and July are written in full; September as Sept.)</summary>
    DayShortMonthYear,

    /// <summary>12.3.51</summary>
    DayDotMonthShortYear,

    /// <summary>12th of March, 1851</summary>
    OrdinalOfMonthYear,
}
