using HandLine.Model;

namespace HandLine.Decoding;

/// <summary>The decoding stage for one model: greedy or beam search as the options say.</summary>
public sealed class LineDecoder
{
    private readonly CharacterSet _charset;
    private readonly BeamDecoder? _beam;

    /// <exception cref="InputException">The lexicon has a word the model cannot write.</exception>
    public LineDecoder(CharacterSet charset, DecodingOptions options)
    {
        ArgumentNullException.ThrowIfNull(charset);
        ArgumentNullException.ThrowIfNull(options);
        options.Validate();
        _charset = charset;
        Options = options;
        if (options.UsesBeam) _beam = new BeamDecoder(charset, options);
    }

    public DecodingOptions Options { get; }

    /// <summary>"greedy" or "beam".</summary>
    public string Name => _beam is null ? "greedy" : "beam";

    public Hypothesis Decode(Posteriors posteriors) =>
        _beam is null ? GreedyDecoder.Decode(posteriors, _charset) : _beam.Decode(posteriors);
}
