public class P { [Xunit.Fact] public void T() => Xunit.Assert.True(true); }
