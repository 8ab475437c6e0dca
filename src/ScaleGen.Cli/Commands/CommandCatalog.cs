using System.CommandLine;

namespace ScaleGen.Cli.Commands;

/// <summary>Every command of the tool, in the order `--help` lists them.</summary>
internal static class CommandCatalog
{
    public static IEnumerable<Command> Create(ConsoleIo io)
    {
        yield return CheckCommand.Create(io);
        yield return FmtCommand.Create(io);
        yield return BuildCommand.Create(io);
        yield return EvalCommand.Create(io);
        yield return LoopCommand.Create(io);
        yield return SheetsCommand.Create(io);
        yield return ImportCommand.Create(io);
        yield return DiffCommand.Create(io);
        yield return VerifyCommand.Create(io);
    }
}
