using HandLine.Formats;

namespace HandLine.Imaging;

/// <summary>
/// Turns an image by a whole number of quarter turns, exactly (pixels are moved, never resampled). A rotation in
/// HandLine's reports is how far the text in the image is turned clockwise from upright: 90 when its lines run
/// downwards with their tops to the right, 180 upside down, 270 running upwards.
/// </summary>
public static class QuarterTurn
{
    /// <summary>The rotations an image can be read at, upright first.</summary>
    public static readonly IReadOnlyList<int> Rotations = [0, 90, 180, 270];

    /// <summary>Whether <paramref name="degrees"/> is one of <see cref="Rotations"/>.</summary>
    public static bool IsRotation(int degrees) => degrees is 0 or 90 or 180 or 270;

    /// <summary>The image whose text is turned <paramref name="rotation"/> degrees clockwise, turned back upright.</summary>
    public static GrayImage Upright(GrayImage image, int rotation)
    {
        ArgumentNullException.ThrowIfNull(image);
        if (!IsRotation(rotation)) throw new ArgumentOutOfRangeException(nameof(rotation), "must be 0, 90, 180 or 270");
        return Clockwise(image, (360 - rotation) % 360);
    }

    /// <summary>
    /// Where a box of a <paramref name="width"/> × <paramref name="height"/> image lies once the image is turned
    /// <paramref name="degrees"/> clockwise (as <see cref="Clockwise"/> turns it): the box of an upright page's line
    /// mapped back into the image as it was given.
    /// </summary>
    public static LineBox TurnBox(LineBox box, int width, int height, int degrees)
    {
        if (!IsRotation(degrees)) throw new ArgumentOutOfRangeException(nameof(degrees), "must be 0, 90, 180 or 270");
        // Clockwise by 90, pixel (x, y) goes to (height-1-y, x); by 270, to (y, width-1-x).
        return degrees switch
        {
            90 => new LineBox(height - box.Y - box.Height, box.X, box.Height, box.Width),
            180 => new LineBox(width - box.X - box.Width, height - box.Y - box.Height, box.Width, box.Height),
            270 => new LineBox(box.Y, width - box.X - box.Width, box.Height, box.Width),
            _ => box,
        };
    }

    /// <summary>The image turned <paramref name="degrees"/> (0, 90, 180 or 270) clockwise.</summary>
    public static GrayImage Clockwise(GrayImage image, int degrees)
    {
        ArgumentNullException.ThrowIfNull(image);
        if (!IsRotation(degrees)) throw new ArgumentOutOfRangeException(nameof(degrees), "must be 0, 90, 180 or 270");
        if (degrees == 0) return image;
        int w = image.Width, h = image.Height;
        var src = image.Pixels;
        var dst = new float[src.Length];
        if (degrees == 180)
        {
            for (int i = 0, n = src.Length; i < n; i++) dst[n - 1 - i] = src[i];
            return new GrayImage(w, h, dst);
        }
        // A quarter turn: the result is h wide and w high. Clockwise, source row y becomes column h-1-y read
        // downwards; anticlockwise, column y read upwards.
        for (int y = 0; y < h; y++)
        {
            int row = y * w;
            if (degrees == 90)
                for (int x = 0; x < w; x++) dst[x * h + (h - 1 - y)] = src[row + x];
            else
                for (int x = 0; x < w; x++) dst[(w - 1 - x) * h + y] = src[row + x];
        }
        return new GrayImage(h, w, dst);
    }
}
