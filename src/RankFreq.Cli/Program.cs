using RankFreq.Cli;

return await CliApp.RunAsync(args, Console.Out, Console.Error);
