using System.Text.Json;
using System.Text.Json.Serialization;
using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>
/// Binarisation methods in model files as the lower-case names the files have always held ("none", "otsu",
/// "sauvola"); numbers and unknown names are refused rather than read as some default.
/// </summary>
internal sealed class BinarisationNames() : JsonStringEnumConverter<BinarisationMethod>(JsonNamingPolicy.SnakeCaseLower, allowIntegerValues: false);
