using HandLine.Imaging;

namespace HandLine.Features;

/// <summary>The features stage: a normalised line becomes a sequence of column frames.</summary>
public static class ColumnFeatures
{
    /// <summary>
    /// Each column contributes its ink values (top to bottom) and optionally its geometric features;
    /// <see cref="FeatureConfig.FrameStride"/> adjacent columns form one frame. The line is padded on the
    /// right with background to a whole number of frames.
    /// </summary>
    public static FeatureSequence Extract(NormalisedLine line, FeatureConfig config)
    {
        ArgumentNullException.ThrowIfNull(line);
        ArgumentNullException.ThrowIfNull(config);
        var image = line.Ink;
        if (image.Height != config.LineHeight)
            throw new ArgumentException(
                $"Line height {image.Height} does not match the feature configuration's {config.LineHeight}.",
                nameof(line));

        var stride = config.FrameStride;
        var frames = Math.Max(1, (image.Width + stride - 1) / stride);
        var width = frames * stride;
        var height = image.Height;
        var ink = PadRight(image, width);
        var colDim = config.ColumnDimension;
        var values = new float[frames * config.FrameDimension];
        float prevUpper = 0.5f, prevLower = 0.5f;
        for (var x = 0; x < width; x++)
        {
            var offset = x * colDim; // a frame is consecutive columns, so column x starts here
            for (var y = 0; y < height; y++)
                values[offset + y] = ink[y * width + x];
            if (config.Geometric)
                GeometricColumnFeatures.Compute(ink, width, height, x,
                    values.AsSpan(offset + height, GeometricColumnFeatures.Count), ref prevUpper, ref prevLower);
        }
        return new FeatureSequence(frames, config.FrameDimension, values);
    }

    private static float[] PadRight(GrayImage image, int width)
    {
        if (width == image.Width) return image.Pixels;
        var padded = new float[width * image.Height];
        for (var y = 0; y < image.Height; y++)
            Array.Copy(image.Pixels, y * image.Width, padded, y * width, image.Width);
        return padded;
    }
}
