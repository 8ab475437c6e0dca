namespace ScaleGen.Cli;

public static class Program
{
    public static int Main(string[] args) =>
        ScaleGenCli.Run(args, Console.Out, Console.Error, errorIsTerminal: !Console.IsErrorRedirected);
}
