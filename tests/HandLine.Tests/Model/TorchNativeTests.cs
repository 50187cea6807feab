using HandLine.Model;
using static TorchSharp.torch;

namespace HandLine.Tests.Model;

public sealed class TorchNativeTests
{
    [Fact]
    public void NativeLibraryLoadsAndAnLstmStepMatchesTheCellEquations()
    {
        // One LSTM step with one unit, checked against the cell equations as documented for torch.nn.LSTM
        // (i, f, g, o gates; c' = f*c + i*g; h' = o*tanh(c')), Hochreiter & Schmidhuber 1997 with the forget gate
        // of Gers et al. 2000.
        TorchRuntime.Seed(3);
        using var lstm = nn.LSTM(1, 1);
        var weights = new Dictionary<string, float[]>
        {
            ["weight_ih_l0"] = [0.5f, -0.3f, 0.8f, 0.1f], // input -> i, f, g, o
            ["weight_hh_l0"] = [0.2f, 0.4f, -0.6f, 0.7f],
            ["bias_ih_l0"] = [0.1f, 0.2f, 0.0f, -0.1f],
            ["bias_hh_l0"] = [0.0f, 0.1f, 0.05f, 0.3f],
        };
        using (no_grad())
            foreach (var (name, p) in lstm.named_parameters())
                p.copy_(tensor(weights[name]).reshape(p.shape));

        const float x = 0.7f, h0 = -0.2f, c0 = 0.4f;
        var (y, hN, cN) = lstm.call(tensor(new[] { x }).reshape(1, 1, 1),
            (tensor(new[] { h0 }).reshape(1, 1, 1), tensor(new[] { c0 }).reshape(1, 1, 1)));

        static double Sig(double v) => 1 / (1 + Math.Exp(-v));
        double Pre(int k) => weights["weight_ih_l0"][k] * x + weights["bias_ih_l0"][k] + weights["weight_hh_l0"][k] * h0 + weights["bias_hh_l0"][k];
        var i = Sig(Pre(0));
        var f = Sig(Pre(1));
        var g = Math.Tanh(Pre(2));
        var o = Sig(Pre(3));
        var c = f * c0 + i * g;
        var h = o * Math.Tanh(c);

        Assert.Equal(h, y.item<float>(), 5);
        Assert.Equal(h, hN.item<float>(), 5);
        Assert.Equal(c, cN.item<float>(), 5);
    }
}
