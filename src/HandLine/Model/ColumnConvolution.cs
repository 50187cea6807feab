using TorchSharp.Modules;
using static TorchSharp.torch;

namespace HandLine.Model;

/// <summary>
/// An optional convolutional front end: the frames are put back together as the line image, two 3×3
/// convolutions (16 and 32 channels, ReLU) each followed by a max-pool that halves the height, and the second
/// pool also merges each frame's columns, so the output has one vector per frame again: [T, B, D] in,
/// [T, B, 32·(H/4)] out. Small local filters see stroke shapes that single pixel columns do not, at a moderate
/// cost per frame on the CPU.
/// </summary>
public sealed class ColumnConvolution : nn.Module<Tensor, Tensor, Tensor>
{
    private const int Channels = 32;
    private readonly Conv2d first;
    private readonly Conv2d second;
    private readonly MaxPool2d firstPool;
    private readonly MaxPool2d secondPool;
    private readonly int lineHeight;
    private readonly int frameStride;

    public ColumnConvolution(int lineHeight, int frameStride) : base(nameof(ColumnConvolution))
    {
        if (lineHeight < 4) throw new ArgumentException($"line height {lineHeight} is too small for the convolutional front end");
        this.lineHeight = lineHeight;
        this.frameStride = frameStride;
        first = nn.Conv2d(1, 16, 3, padding: 1);
        firstPool = nn.MaxPool2d((2, 1), (2, 1));
        second = nn.Conv2d(16, Channels, 3, padding: 1);
        secondPool = nn.MaxPool2d((2, frameStride), (2, frameStride));
        RegisterComponents();
    }

    /// <summary>Values per output frame for lines of the given height.</summary>
    public static int OutputSize(int lineHeight) => Channels * OutputRows(lineHeight);

    /// <summary>Rows per output frame (each channel's), after the two height-halving pools.</summary>
    public static int OutputRows(int lineHeight) => lineHeight / 2 / 2;

    /// <param name="frames">[T, B, S·H]: each frame is S columns of H values, top to bottom.</param>
    /// <param name="lengths">[B] int64 frame counts.</param>
    public override Tensor forward(Tensor frames, Tensor lengths)
    {
        var t = frames.shape[0];
        var b = frames.shape[1];
        var width = t * frameStride;
        using var image = frames.reshape(t, b, frameStride, lineHeight).permute(1, 3, 0, 2)
            .reshape(b, 1, lineHeight, width);
        using var a = first.call(image);
        using var a1 = a.relu_();
        // Padding columns hold the first layer's bias, not zero; cleared, the second layer sees past a line's
        // end exactly what its own zero border shows a line alone, so a line reads the same alone or in a batch.
        using var inside = InsideMask(lengths, b, width);
        using var masked = a1.mul(inside);
        using var p = firstPool.call(masked);
        using var c = second.call(p);
        using var c1 = c.relu_();
        using var q = secondPool.call(c1); // [B, C, H/4, T]
        return q.permute(3, 0, 1, 2).reshape(t, b, -1);
    }

    /// <summary>
    /// [B, 1, 1, W] float mask, 1 on each line's own columns. Built on the C# side rather than with
    /// <c>arange(width)</c> and <c>lengths * frameStride</c>: those make TorchSharp Scalars from C# numbers, which
    /// only the finaliser frees, and a collection on another thread could free one while libtorch reads it.
    /// </summary>
    private Tensor InsideMask(Tensor lengths, long batch, long width)
    {
        var frameCounts = lengths.data<long>().ToArray();
        var mask = new float[batch * width];
        for (var i = 0; i < batch; i++)
            Array.Fill(mask, 1f, (int)(i * width), (int)Math.Min(width, frameCounts[i] * frameStride));
        return tensor(mask, [batch, 1, 1, width]);
    }
}
