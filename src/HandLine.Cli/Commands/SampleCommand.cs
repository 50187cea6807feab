using System.CommandLine;
using HandLine.Proof;

namespace HandLine.Cli.Commands;

internal static class SampleCommand
{
    public static Command Create()
    {
        var runDir = new Argument<string>("RUN_DIR") { Description = "Folder written by 'transcribe'" };
        var count = new Option<int?>("--count") { Description = "Lines to draw" };
        var fraction = new Option<double?>("--fraction") { Description = "Share of the run's lines to draw (0.02 for 2 %)" };
        var pick = new Option<int?>("--pick") { Description = "Instead of a random draw, the N lines worth correcting first (least sure, spread over the sources, covering the least sure characters): keyed, they teach 'adapt' the most" };
        var seed = new Option<int>("--seed") { Description = "Seed of the draw: same run, same seed, same sample", Required = true };
        var outDir = new Option<string>("--out") { Description = "New folder for the crops, keying.tsv, machine/ and sample.json", Required = true };
        var images = new Option<string>("--images")
        {
            Description = "Folder the run's sources are relative to: the folder given to 'transcribe', or its manifest's folder",
            Required = true,
        };
        var withMachine = new Option<bool>("--with-machine-text") { Description = "Also show the machine's text in keying.tsv (primes the keyers: off by default)" };
        var command = new Command("sample", "Draw a random proof sample of a run's lines, stratified by folder, for keying")
        {
            runDir, count, fraction, pick, seed, outDir, images, withMachine,
        };
        command.SetAction(parse => CommandRunner.Guard(() =>
        {
            var options = new ProofSampleOptions
            {
                Count = parse.GetValue(count),
                Fraction = parse.GetValue(fraction),
                Pick = parse.GetValue(pick),
                Seed = parse.GetValue(seed),
                ImagesRoot = parse.GetValue(images)!,
                WithMachineText = parse.GetValue(withMachine),
            };
            var outPath = parse.GetValue(outDir)!;
            var sample = ProofSampler.Draw(parse.GetValue(runDir)!, outPath, options);
            foreach (var (folder, lines, drawn) in sample.Strata)
                Console.WriteLine($"{drawn,6} of {lines,6} line(s)  {folder}");
            var whole = sample.Lines.Count(l => l.WholeImage);
            Console.WriteLine($"{sample.Lines.Count} line(s) drawn into {outPath}; key them in {Path.Combine(outPath, ProofSampler.KeyingFileName)}" +
                (whole > 0 ? $" ({whole} crop(s) are whole pages: key the line named in column 'line', counted from 0)" : ""));
            return ExitCodes.Ok;
        }));
        return command;
    }
}
