using System.CommandLine;
using HandLine.Cli.Commands;

var root = CommandTree.Build();
var parse = root.Parse(args);
if (UnknownOptions.Check(parse) is { } unknown)
{
    Console.Error.WriteLine($"error: {unknown}");
    return ExitCodes.Failed;
}
// Ctrl+C or SIGTERM cancels the token; the command then finishes its current item and writes consistent
// outputs. The library's default would give up on it after 2 s and end the process mid-write.
var exit = await parse.InvokeAsync(new InvocationConfiguration { ProcessTerminationTimeout = TimeSpan.FromMinutes(1) });
// Bad arguments are the documented exit code 2 (the parser's own default is 1).
return parse.Errors.Count > 0 ? ExitCodes.Failed : exit;
