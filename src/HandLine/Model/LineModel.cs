using HandLine.Features;
using static TorchSharp.torch;

namespace HandLine.Model;

/// <summary>
/// A loaded or freshly created model: its header, character set and network. The model stage's entry point
/// for inference is <see cref="Run(IReadOnlyList{FeatureSequence})"/>: feature sequences in, posteriors out.
/// </summary>
public sealed class LineModel : IDisposable
{
    internal LineModel(ModelHeader header, CharacterSet charset, LineNetwork network, string id)
    {
        Header = header;
        Charset = charset;
        Network = network;
        Id = id;
    }

    public ModelHeader Header { get; }
    public CharacterSet Charset { get; }
    public FeatureConfig Features => Header.Features;

    /// <summary>First 12 hex digits of the file's SHA-256 ("unsaved" before the first save).</summary>
    public string Id { get; }

    internal LineNetwork Network { get; }

    /// <summary>A new, randomly initialised model (seeded, so the same seed gives the same weights).</summary>
    public static LineModel Create(CharacterSet charset, FeatureConfig features, NetworkConfig network, int seed)
    {
        ArgumentNullException.ThrowIfNull(charset);
        features.Validate();
        network.Validate(features);
        LineNetwork net;
        lock (TorchRuntime.RandomLock)
        {
            TorchRuntime.Seed(seed);
            net = new LineNetwork(features, network, charset.ClassCount);
        }
        var header = new ModelHeader(ModelHeader.CurrentFormatVersion, charset.ToString(), features, network,
            Training: null, ValidationCer: null, CreatedUtc: DateTime.UtcNow.ToString("O"));
        return new LineModel(header, charset, net, "unsaved");
    }

    /// <summary>
    /// A copy of this model that can also write <paramref name="symbols"/>, for fine-tuning on text with symbols
    /// it lacks. The symbols join the end of the character set, so every old class keeps its index (blank stays
    /// 0), and the output layer gains one row per symbol; everything else is copied exactly. The same seed gives
    /// the same new rows. The header keeps its features and network shape; its validation CER is dropped, as it
    /// measured a different model.
    /// </summary>
    public LineModel WithSymbols(IEnumerable<string> symbols, int seed)
    {
        var charset = Charset.Append(symbols);
        if (charset.Count == Charset.Count) throw new ArgumentException("No symbols to add.", nameof(symbols));
        LineNetwork grown;
        lock (TorchRuntime.RandomLock)
        {
            TorchRuntime.Seed(seed);
            grown = new LineNetwork(Features, Header.Network, charset.ClassCount);
        }
        // New rows: a tenth of the usual random initialisation and a bias equal to the lowest old bias, so a new
        // symbol starts with the weakest prior of any known symbol and almost no say from the input. The old
        // posteriors then move only by log(1 - p(new)) per frame (at most 0.01 for the bundled model on the demo
        // lines), and the model reads as before until fine-tuning teaches the new rows. Their gradient (posterior
        // minus target) does not shrink with a small posterior, so they still learn quickly, and the random
        // weights keep several new symbols from starting identical.
        grown.CopyGrowingOutputs(Network, newRowScale: 0.1);
        var header = Header with { Charset = charset.ToString(), ValidationCer = null };
        return new LineModel(header, charset, grown, "unsaved");
    }

    /// <summary>
    /// A warm start of another line height, frame stride or LSTM width from this model, for comparing input sizes
    /// and capacities (see <see cref="LineNetwork.CopyReshaped"/>): same character set, layers and front end;
    /// the header takes the new shape and drops the validation CER and temperature, which measured this model.
    /// </summary>
    /// <exception cref="ArgumentException">The model has no convolutional front end, the LSTM would shrink, or a
    /// setting other than line height, frame stride and width differs.</exception>
    public LineModel Reshaped(FeatureConfig features, NetworkConfig network, int seed)
    {
        ArgumentNullException.ThrowIfNull(features);
        ArgumentNullException.ThrowIfNull(network);
        features.Validate();
        network.Validate(features);
        if (features with { LineHeight = Features.LineHeight, FrameStride = Features.FrameStride } != Features)
            throw new ArgumentException("only the line height and frame stride of the input can change");
        if (network with { Hidden = Header.Network.Hidden } != Header.Network)
            throw new ArgumentException("only the LSTM width can change (layers, dropout and front end stay)");
        if (!network.Convolution) throw new ArgumentException("reshaping needs the convolutional front end");
        if (network.Hidden < Header.Network.Hidden)
            throw new ArgumentException($"the LSTM can only grow ({Header.Network.Hidden} -> {network.Hidden} units)");
        LineNetwork reshaped;
        lock (TorchRuntime.RandomLock)
        {
            TorchRuntime.Seed(seed);
            reshaped = new LineNetwork(features, network, Charset.ClassCount);
        }
        reshaped.CopyReshaped(Network, ColumnConvolution.OutputRows(Features.LineHeight),
            ColumnConvolution.OutputRows(features.LineHeight), Header.Network.Hidden, network.Hidden);
        var header = Header with
        {
            Features = features,
            Network = network,
            ValidationCer = null,
            Temperature = null,
            TemperatureFit = null,
        };
        return new LineModel(header, Charset, reshaped, "unsaved");
    }

    /// <summary>
    /// Saves with an updated header; returns the new model id. The temperature goes back to 1: it was fitted to
    /// the weights before this training.
    /// </summary>
    /// <param name="adaptation">What the model was adapted on (<c>adapt</c>); null keeps the header's.</param>
    public string Save(string path, TrainingRecord? training, double? validationCer, AdaptationRecord? adaptation = null) =>
        ModelFile.Save(path, Header with
        {
            Training = training ?? Header.Training,
            ValidationCer = validationCer,
            CreatedUtc = DateTime.UtcNow.ToString("O"),
            Temperature = null,
            TemperatureFit = null,
            Adaptation = adaptation ?? Header.Adaptation,
        }, Network);

    /// <summary>Saves the same weights with a fitted temperature; returns the new model id.</summary>
    public string SaveWithTemperature(string path, double temperature, TemperatureRecord fit)
    {
        ArgumentNullException.ThrowIfNull(fit);
        if (!(temperature > 0) || double.IsInfinity(temperature))
            throw new ArgumentOutOfRangeException(nameof(temperature), "must be a positive finite number");
        return ModelFile.Save(path, Header with { Temperature = temperature, TemperatureFit = fit }, Network);
    }

    /// <summary>The flag threshold fitted with the temperature (see <see cref="TemperatureRecord"/>), if any.</summary>
    public double? FittedFlagBelow => Header.TemperatureFit?.FlagBelow;

    /// <summary>The temperature the outputs are divided by (see <see cref="Posteriors.Tempered"/>).</summary>
    public double Temperature => Header.Temperature ?? 1.0;

    /// <summary>Posteriors for one line.</summary>
    public Posteriors Run(FeatureSequence line) => Run([line])[0];

    /// <summary>Posteriors for several lines, computed as one padded batch.</summary>
    public IReadOnlyList<Posteriors> Run(IReadOnlyList<FeatureSequence> lines)
    {
        ArgumentNullException.ThrowIfNull(lines);
        if (lines.Count == 0) return [];
        foreach (var l in lines)
            if (l.Dimension != Features.FrameDimension)
                throw new ArgumentException($"Feature dimension {l.Dimension} does not match the model's {Features.FrameDimension}.");

        Network.eval();
        using var noGrad = no_grad();
        using var scope = NewDisposeScope();
        var (frames, lengths) = Batching.Stack(lines);
        var logProbs = Network.call(frames, lengths); // [T, B, C]
        var classes = (int)logProbs.shape[2];
        var result = new Posteriors[lines.Count];
        for (var b = 0; b < lines.Count; b++)
        {
            var t = lines[b].Frames;
            var data = logProbs[..t, b, ..].contiguous().data<float>().ToArray();
            result[b] = new Posteriors(t, classes, data).Tempered(Temperature);
        }
        return result;
    }

    /// <summary>
    /// Posteriors for many lines, run <paramref name="lanes"/> at a time by <see cref="LaneRunner"/>: a line's
    /// result is the same bits whichever lines share its batch (for a given lane count and thread count), so
    /// lines of many images can be batched without changing any report. Agrees with
    /// <see cref="Run(IReadOnlyList{FeatureSequence})"/> to float rounding.
    /// </summary>
    public IReadOnlyList<Posteriors> RunInLanes(IReadOnlyList<FeatureSequence> lines, int lanes)
    {
        ArgumentNullException.ThrowIfNull(lines);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(lanes);
        if (lines.Count == 0) return [];
        foreach (var l in lines)
            if (l.Dimension != Features.FrameDimension)
                throw new ArgumentException($"Feature dimension {l.Dimension} does not match the model's {Features.FrameDimension}.");
        // Made for each call from the current weights (a few stacked copies, small beside one batch), so a model
        // trained further in the same process is never read through stale copies.
        using var runner = new LaneRunner(Network, Header.Network.Hidden, Header.Network.Layers);
        var result = runner.Run(lines, lanes);
        return Temperature == 1.0 ? result : result.Select(p => p.Tempered(Temperature)).ToArray();
    }

    public void Dispose() => Network.Dispose();
}
