using System.Text.Json;
using HandLine.Features;
using HandLine.Imaging;

namespace HandLine.Tests.Features;

public sealed class FeatureConfigJsonTests
{
    [Theory]
    [InlineData(BinarisationMethod.None, "none")]
    [InlineData(BinarisationMethod.Otsu, "otsu")]
    [InlineData(BinarisationMethod.Sauvola, "sauvola")]
    public void Binarisation_is_stored_under_the_names_model_files_have_always_held(BinarisationMethod method, string name)
    {
        var json = JsonSerializer.Serialize(new FeatureConfig(Binarisation: method));
        Assert.Contains($"\"binarisation\":\"{name}\"", json);
        Assert.Equal(method, JsonSerializer.Deserialize<FeatureConfig>(json)!.Binarisation);
    }

    [Theory]
    [InlineData("\"bogus\"")]
    [InlineData("2")]
    public void An_unknown_binarisation_is_refused_not_read_as_none(string value)
    {
        Assert.Throws<JsonException>(() => JsonSerializer.Deserialize<FeatureConfig>($"{{\"line_height\":40,\"binarisation\":{value}}}"));
    }
}
