using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;
using HandLine.Formats;
using HandLine.Model;

namespace HandLine.Training;

/// <summary>
/// Where a run stands, so an interrupted run can continue exactly where it stopped. <see cref="BestCer"/> and
/// <see cref="BestLoss"/> are the best epoch-end validation CER and CTC loss, which drive the schedule;
/// <see cref="EpochsSinceBest"/> counts epochs that improved neither. <see cref="SavedCer"/> is the CER of the
/// model file at the output path, which may also come from a validation made when a run stopped mid-epoch
/// (null: none yet).
/// </summary>
public sealed record TrainingState(
    [property: JsonPropertyName("epoch")] int Epoch,
    [property: JsonPropertyName("batch")] int Batch,
    [property: JsonPropertyName("lines_seen")] long LinesSeen,
    [property: JsonPropertyName("batches_done")] long BatchesDone,
    [property: JsonPropertyName("minutes")] double Minutes,
    [property: JsonPropertyName("learning_rate")] double LearningRate,
    [property: JsonPropertyName("best_cer")] double BestCer,
    [property: JsonPropertyName("epochs_since_best")] int EpochsSinceBest,
    [property: JsonPropertyName("epoch_loss_sum")] double EpochLossSum,
    [property: JsonPropertyName("saved_cer")] double? SavedCer,
    [property: JsonPropertyName("best_loss")] double? BestLoss = null)
{
    /// <summary>CER of the saved model; checkpoints from before this field saved only at epoch ends.</summary>
    [JsonIgnore]
    public double SavedOrBestCer => SavedCer ?? BestCer;
}

/// <summary>
/// A checkpoint file, a <see cref="ContainerFile"/> of kind "HLCHECK3": its JSON header is the
/// <see cref="TrainingState"/>, its payload the network weights and then the optimiser state. Written atomically,
/// so a run killed while saving keeps the previous checkpoint; checksummed, so a damaged one is refused rather
/// than resumed from. Checkpoints of the earlier layout (HLCHECK2: magic, length-prefixed JSON state, weights,
/// optimiser state, no checksum) are still read, so a run under way continues.
/// </summary>
internal static class Checkpoint
{
    private static readonly ContainerKind Kind = new("HLCHECK3", "checkpoint", "checkpoint", "not a HandLine training checkpoint");

    // HLCHECK1 files held TorchSharp's own optimiser state; since HandLine has its own Adam they cannot resume.
    private static readonly byte[] SecondMagic = "HLCHECK2"u8.ToArray();
    private static readonly byte[] FirstMagic = "HLCHECK1"u8.ToArray();

    // The best CER starts as +Infinity, which plain JSON numbers cannot carry.
    private static readonly JsonSerializerOptions Json = new() { NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals };

    public static string PathFor(string modelPath) => modelPath + ".checkpoint";

    public static void Save(string path, TrainingState state, LineNetwork network, AdamOptimiser optimizer)
    {
        ContainerFile.Write(path, Kind, JsonSerializer.SerializeToUtf8Bytes(state, Json), w =>
        {
            network.save(w);
            optimizer.Save(w);
        });
    }

    public static TrainingState Load(string path, LineNetwork network, AdamOptimiser optimizer)
    {
        try
        {
            var magic = new byte[SecondMagic.Length];
            using (var peek = File.OpenRead(path))
                peek.ReadAtLeast(magic, magic.Length, throwOnEndOfStream: false);
            if (magic.AsSpan().SequenceEqual(FirstMagic))
                throw new InputException(path, "checkpoint", "this checkpoint was written by an older HandLine whose optimiser state cannot be read; delete it to start afresh (or continue from the saved model with --from)");
            if (magic.AsSpan().SequenceEqual(SecondMagic))
                return LoadSecondLayout(path, network, optimizer);
            return ContainerFile.Read(path, Kind, c =>
            {
                var state = JsonSerializer.Deserialize<TrainingState>(c.Header, Json)
                            ?? throw new InputException(path, "checkpoint", "checkpoint state is empty");
                network.load(c.Payload, strict: true);
                optimizer.Load(c.Payload);
                return state;
            });
        }
        catch (InputException)
        {
            throw;
        }
        catch (Exception e) when (e is IOException or JsonException or ArgumentException or InvalidOperationException)
        {
            throw new InputException(path, "checkpoint", $"cannot resume from this checkpoint: {e.Message}", e);
        }
    }

    /// <summary>The HLCHECK2 layout, written before checkpoints became containers.</summary>
    private static TrainingState LoadSecondLayout(string path, LineNetwork network, AdamOptimiser optimizer)
    {
        using var r = new BinaryReader(File.OpenRead(path), Encoding.UTF8);
        r.ReadBytes(SecondMagic.Length);
        var state = JsonSerializer.Deserialize<TrainingState>(r.ReadString(), Json)
                    ?? throw new InputException(path, "checkpoint", "checkpoint state is empty");
        network.load(r, strict: true);
        optimizer.Load(r);
        return state;
    }
}
