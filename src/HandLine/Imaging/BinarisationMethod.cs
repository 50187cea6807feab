namespace HandLine.Imaging;

/// <summary>Optional global or local thresholding applied after contrast normalisation.</summary>
public enum BinarisationMethod
{
    /// <summary>Keep the grey-level ink image (usually best for a neural recogniser).</summary>
    None,

    /// <summary>One global threshold per line (Otsu 1979).</summary>
    Otsu,

    /// <summary>Local mean/deviation threshold (Sauvola &amp; Pietikäinen 2000); copes with uneven paper.</summary>
    Sauvola,
}
