using BenchmarkDotNet.Validators;

namespace RankFreq.Benchmarks;

/// <summary>Says before the run, once per benchmark class, that its input file (<see cref="BenchInput"/>) is missing.
/// A warning, not an error: the other selected benchmarks still run.</summary>
internal sealed class InputFileValidator : IValidator
{
    public static readonly InputFileValidator Instance = new();

    public bool TreatsWarningsAsErrors => false;

    public IEnumerable<ValidationError> Validate(ValidationParameters validationParameters)
    {
        foreach (var type in validationParameters.Benchmarks.Select(b => b.Descriptor.Type).Distinct())
            if (BenchInput.Problem(type.Name) is { } problem)
                yield return new ValidationError(false, problem);
    }
}
