using HandLine.Features;
using HandLine.Imaging;
using static HandLine.Tests.Imaging.ImagingTestSupport;

namespace HandLine.Tests.Imaging;

public sealed class ImagingOptionsTests
{
    [Fact]
    public void Defaults_are_valid()
    {
        var o = new ImagingOptions();
        o.Validate();
        Assert.Equal(64L * 1024 * 1024, InputLimits.Default.MaxFileBytes);
        Assert.Equal(40_000_000, InputLimits.Default.MaxPixels);
        Assert.Equal(20_000, InputLimits.Default.MaxLineWidth);
        Assert.Equal(40, new FeatureConfig().LineHeight);
        Assert.Equal(2, o.Margin);
        Assert.Equal(BinarisationMethod.None, new FeatureConfig().Binarisation);
        _ = NormaliserFor(new FeatureConfig(), o, InputLimits.Default);
    }

    public static TheoryData<ImagingOptions> Nonsense() =>
    [
        new ImagingOptions { Margin = -1 },
        new ImagingOptions { MaxDeskewDegrees = double.NaN },
        new ImagingOptions { MaxSlantDegrees = 90 },
        new ImagingOptions { SauvolaWindow = 10 },
        new ImagingOptions { SauvolaK = 0 },
        new ImagingOptions { InkPercentile = 0.4 },
    ];

    [Theory]
    [MemberData(nameof(Nonsense))]
    public void Nonsense_is_rejected(ImagingOptions options)
    {
        Assert.ThrowsAny<ArgumentException>(options.Validate);
        // ... and by every stage made from it, once, when it is made.
        Assert.ThrowsAny<ArgumentException>(() => new LineFinder(options));
        Assert.ThrowsAny<ArgumentException>(() => NormaliserFor(new FeatureConfig(), options));
        Assert.ThrowsAny<ArgumentException>(() => new LinePreparer(new FeatureConfig(), options));
    }

    [Fact]
    public void Limits_are_checked_when_they_are_made()
    {
        Assert.ThrowsAny<ArgumentException>(() => new InputLimits { MaxFileBytes = 0 });
        Assert.ThrowsAny<ArgumentException>(() => new InputLimits { MaxPixels = -1 });
        Assert.ThrowsAny<ArgumentException>(() => new InputLimits { MaxLineWidth = 0 });
        Assert.ThrowsAny<ArgumentException>(() => InputLimits.Default with { MaxFileBytes = -5 });
    }

    [Fact]
    public void Line_settings_that_do_not_fit_together_are_rejected_when_the_stage_is_made()
    {
        // The model's line settings: FeatureConfig alone.
        Assert.ThrowsAny<ArgumentException>(() => NormaliserFor(new FeatureConfig(LineHeight: 3)));
        Assert.ThrowsAny<ArgumentException>(() => NormaliserFor(new FeatureConfig(Binarisation: (BinarisationMethod)42)));
        Assert.ThrowsAny<ArgumentException>(() => new LinePreparer(new FeatureConfig(LineHeight: 3)));
        Assert.ThrowsAny<ArgumentException>(() => new LinePreparer(new FeatureConfig(Binarisation: (BinarisationMethod)42)));
        // A margin leaving too few rows of ink in the model's line height, and a width limit below the height.
        Assert.ThrowsAny<ArgumentException>(() => NormaliserFor(new FeatureConfig(), new ImagingOptions { Margin = 19 }));
        Assert.ThrowsAny<ArgumentException>(() => NormaliserFor(new FeatureConfig(), null, new InputLimits { MaxLineWidth = 39 }));
    }
}
