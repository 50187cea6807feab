using System.CommandLine;
using HandLine.Decoding;
using HandLine.Language;

namespace HandLine.Cli.Commands;

/// <summary>The decoding options shared by 'transcribe' and 'bench-decode'.</summary>
internal sealed class DecodingArguments
{
    public Option<int> Beam { get; } = new("--beam")
    {
        Description = $"Beam width for CTC prefix beam search; 0 or 1 = greedy decoding (default {DecodingOptions.DefaultBeam})",
        DefaultValueFactory = _ => DecodingOptions.DefaultBeam,
    };

    public Option<int> Alternatives { get; } = new("--alternatives")
    {
        Description = "Best texts to list per line in lines.jsonl (beam search only)",
        DefaultValueFactory = _ => DecodingOptions.DefaultAlternatives,
    };

    public Option<string?> Lexicon { get; } = new("--lexicon")
    {
        Description = "Word list (UTF-8, one word per line, optional tab and count): words are limited to it; numbers, punctuation and spaces stay free",
    };

    public Option<double?> LexiconWeight { get; } = new("--lexicon-weight")
    {
        Description = "Soft lexicon: allow an unlisted word at this cost in log units (0 = no effect). Without it the lexicon is strict",
    };

    public Option<string?> Lm { get; } = new("--lm") { Description = "Character language model built by 'handline lm'" };

    public Option<double> LmWeight { get; } = new("--lm-weight")
    {
        Description = "Weight of the language model's log probability", DefaultValueFactory = _ => new DecodingOptions().LmWeight,
    };

    public Option<double?> CharBonus { get; } = new("--char-bonus")
    {
        Description = $"Score added per character written, offsetting the language model's preference for short text (default {DecodingOptions.DefaultCharBonusWithLm} with --lm, else 0)",
    };

    public IEnumerable<Option> All => [Beam, Alternatives, Lexicon, LexiconWeight, Lm, LmWeight, CharBonus];

    /// <summary>Loads the files named and checks the combination; throws InputException or ArgumentException.</summary>
    public DecodingOptions Build(ParseResult parse)
    {
        var lexiconPath = parse.GetValue(Lexicon);
        var lmPath = parse.GetValue(Lm);
        var options = new DecodingOptions
        {
            Beam = parse.GetValue(Beam),
            Alternatives = parse.GetValue(Alternatives),
            LexiconPenalty = parse.GetValue(LexiconWeight),
            LmWeight = parse.GetValue(LmWeight),
            CharBonus = parse.GetValue(CharBonus) ?? (lmPath is null ? 0 : DecodingOptions.DefaultCharBonusWithLm),
        };
        if (!options.UsesBeam && (lexiconPath is not null || lmPath is not null))
            throw new ArgumentException("--lexicon and --lm need beam search: use --beam 2 or more");
        if (options.LexiconPenalty is not null && lexiconPath is null)
            throw new ArgumentException("--lexicon-weight needs --lexicon");
        options = options with
        {
            Lexicon = lexiconPath is null ? null : Language.Lexicon.Load(lexiconPath),
            LanguageModel = lmPath is null ? null : CharNgramFile.Load(lmPath),
        };
        options.Validate();
        return options;
    }
}
