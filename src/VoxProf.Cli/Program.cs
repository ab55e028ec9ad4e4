using VoxProf.Cli;

return Cli.Run(args, Console.Out, Console.Error);
