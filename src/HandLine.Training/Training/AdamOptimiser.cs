using TorchSharp;
using TorchSharp.Modules;
using static TorchSharp.torch;

namespace HandLine.Training;

/// <summary>
/// Adam (Kingma &amp; Ba 2015, Algorithm 1, with PyTorch's arrangement of the bias corrections), written here so
/// that every <see cref="Scalar"/> it hands to libtorch is created and disposed explicitly. TorchSharp 0.107's own
/// optimiser passes C# numbers (<c>mul_(beta1)</c>, <c>add_(eps)</c>), which become Scalars that only the
/// finaliser frees; a collection started by another thread during the native call can free one while libtorch
/// reads it ("Unknown scalar type", or a wrong value). Here each Scalar is held by a <c>using</c> variable, which
/// keeps it alive until the step is over.
/// </summary>
internal sealed class AdamOptimiser : IDisposable
{
    private const double Beta1 = 0.9;
    private const double Beta2 = 0.999;
    private const double Epsilon = 1e-8;
    private static readonly byte[] Magic = "HLADAM01"u8.ToArray();

    private readonly Parameter[] _parameters;
    private readonly Tensor[] _firstMoments;
    private readonly Tensor[] _secondMoments;

    public AdamOptimiser(IEnumerable<Parameter> parameters, double learningRate)
    {
        ArgumentNullException.ThrowIfNull(parameters);
        _parameters = parameters.ToArray();
        if (_parameters.Length == 0) throw new ArgumentException("no parameters to optimise", nameof(parameters));
        LearningRate = learningRate;
        _firstMoments = _parameters.Select(p => zeros_like(p).DetachFromDisposeScope()).ToArray();
        _secondMoments = _parameters.Select(p => zeros_like(p).DetachFromDisposeScope()).ToArray();
    }

    public double LearningRate
    {
        get;
        set
        {
            if (!(value > 0) || double.IsInfinity(value)) throw new ArgumentOutOfRangeException(nameof(value), value, "step size must be positive");
            field = value;
        }
    }

    /// <summary>Steps taken so far (t in the paper); drives the bias corrections.</summary>
    public long Steps { get; private set; }

    public void ZeroGrad()
    {
        using var scope = NewDisposeScope(); // the gradients' wrappers
        foreach (var p in _parameters) p.grad?.zero_();
    }

    /// <summary>One update of every parameter that has a gradient.</summary>
    public void Step()
    {
        Steps++;
        var correction1 = 1 - Math.Pow(Beta1, Steps);
        var correction2 = 1 - Math.Pow(Beta2, Steps);
        using var noGrad = no_grad();
        using var scope = NewDisposeScope();
        using var beta1 = Beta1.ToScalar();
        using var oneMinusBeta1 = (1 - Beta1).ToScalar();
        using var beta2 = Beta2.ToScalar();
        using var oneMinusBeta2 = (1 - Beta2).ToScalar();
        using var rootCorrection2 = Math.Sqrt(correction2).ToScalar();
        using var epsilon = Epsilon.ToScalar();
        using var one = 1.ToScalar(); // add_(x) alone would make this 1 from a C# number

        using var step = (-LearningRate / correction1).ToScalar();
        for (var i = 0; i < _parameters.Length; i++)
        {
            var grad = _parameters[i].grad;
            if (grad is null) continue;
            _firstMoments[i].mul_(beta1).add_(grad, oneMinusBeta1);
            _secondMoments[i].mul_(beta2).addcmul_(grad, grad, oneMinusBeta2);
            var denominator = _secondMoments[i].sqrt().div_(rootCorrection2).add_(epsilon, one);
            _parameters[i].addcdiv_(_firstMoments[i], denominator, step);
        }
    }

    public void Save(BinaryWriter writer)
    {
        writer.Write(Magic);
        writer.Write(Steps);
        writer.Write(_parameters.Length);
        for (var i = 0; i < _parameters.Length; i++)
        {
            _firstMoments[i].Save(writer);
            _secondMoments[i].Save(writer);
        }
    }

    /// <exception cref="InvalidOperationException">The state is not this optimiser's, or is for other parameters.</exception>
    public void Load(BinaryReader reader)
    {
        if (!reader.ReadBytes(Magic.Length).AsSpan().SequenceEqual(Magic))
            throw new InvalidOperationException("the optimiser state is missing or from an older HandLine");
        var steps = reader.ReadInt64();
        if (reader.ReadInt32() != _parameters.Length)
            throw new InvalidOperationException("the optimiser state is for a network of another shape");
        try
        {
            for (var i = 0; i < _parameters.Length; i++)
            {
                _firstMoments[i].Load(reader);
                _secondMoments[i].Load(reader);
            }
        }
        catch (ArgumentException e)
        {
            throw new InvalidOperationException($"the optimiser state is for a network of another shape ({e.Message})", e);
        }
        Steps = steps;
    }

    public void Dispose()
    {
        foreach (var t in _firstMoments) t.Dispose();
        foreach (var t in _secondMoments) t.Dispose();
    }
}
