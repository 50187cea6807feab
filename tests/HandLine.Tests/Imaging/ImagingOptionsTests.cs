using HandLine.Imaging;
using Xunit;

namespace HandLine.Tests.Imaging;

public sealed class ImagingOptionsTests
{
    [Fact]
    public void Defaults_are_valid()
    {
        var o = new ImagingOptions();
        o.Validate();
        Assert.Equal(64L * 1024 * 1024, o.MaxFileBytes);
        Assert.Equal(40_000_000, o.MaxPixels);
        Assert.Equal(40, o.LineHeight);
        Assert.Equal(2, o.Margin);
        Assert.Equal(BinarisationMethod.None, o.Binarisation);
    }

    public static TheoryData<ImagingOptions> Nonsense() =>
    [
        new ImagingOptions { MaxFileBytes = 0 },
        new ImagingOptions { MaxPixels = -1 },
        new ImagingOptions { LineHeight = 3 },
        new ImagingOptions { Margin = 19 },
        new ImagingOptions { Margin = -1 },
        new ImagingOptions { MaxDeskewDegrees = double.NaN },
        new ImagingOptions { MaxSlantDegrees = 90 },
        new ImagingOptions { SauvolaWindow = 10 },
        new ImagingOptions { SauvolaK = 0 },
        new ImagingOptions { InkPercentile = 0.4 },
        new ImagingOptions { Binarisation = (BinarisationMethod)42 },
    ];

    [Theory]
    [MemberData(nameof(Nonsense))]
    public void Nonsense_is_rejected(ImagingOptions options)
    {
        Assert.ThrowsAny<ArgumentException>(options.Validate);
    }
}
