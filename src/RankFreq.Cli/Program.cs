using RankFreq.Cli;

return await Signals.RunAsync(args, Console.Out, Console.Error);
