// Benchmarks live here (see docs/performance.md).
//   dotnet run -c Release --project bench/ScaleGen.Bench -- --verify-1k    verify on a 1,000-point plant, timed phase by phase
//   dotnet run -c Release --project bench/ScaleGen.Bench -- [BenchmarkDotNet options]
if (args.Contains("--verify-1k")) return ScaleGen.Bench.VerifyPlant.RunTimed();
BenchmarkDotNet.Running.BenchmarkSwitcher.FromAssembly(typeof(ScaleGen.Bench.VerifyPlant).Assembly).Run(args);
return 0;
